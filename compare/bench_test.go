package compare

import (
	"math/rand/v2"
	"testing"

	"shiftwise/predict"
	"shiftwise/smiles"
	"shiftwise/spectrum"
)

// benchSmiles has 30 heavy atoms (RDKit GetNumHeavyAtoms = 30).
const benchSmiles = "CC(C)Cc1ccc(cc1)C(C)C(=O)OCCOC(=O)c1ccc(OC)c(OC)c1"

// benchSpectrum renders the molecule's own prediction on 65,536 points at
// 400 MHz with seeded noise, residual CHCl3 and water.
func benchSpectrum(b *testing.B) *spectrum.Spectrum {
	m, err := smiles.Parse(benchSmiles)
	if err != nil {
		b.Fatal(err)
	}
	p, err := predict.Predict(m, benchSmiles, predict.Options{FieldMHz: 400, Solvent: "CDCl3"})
	if err != nil {
		b.Fatal(err)
	}
	p.Lines = append(p.Lines, predict.Line{PPM: 7.26, Intensity: 0.2}, predict.Line{PPM: 1.56, Intensity: 0.5})
	ppm, y := predict.Render(p, -0.5, 11, 65536, 1.0)
	rng := rand.New(rand.NewPCG(3, 3))
	top := 0.0
	for _, v := range y {
		top = max(top, v)
	}
	for i := range y {
		y[i] += rng.NormFloat64() * top / 2000
	}
	return &spectrum.Spectrum{PPM: ppm, Y: y, FieldMHz: 400, Nucleus: "1H", Solvent: "CDCl3", Source: "bench"}
}

// BenchmarkCheck is one full check (prediction, processing of a
// 65,536-point trace, assignment, explanation, purity) of a 30-heavy-atom
// molecule. Target: under 50 ms.
func BenchmarkCheck(b *testing.B) {
	spec := benchSpectrum(b)
	in := Input{Smiles: benchSmiles, Spectrum: spec}
	b.ReportAllocs()
	c0, n := cpuTime(), 0
	for b.Loop() {
		res, err := Check(in, Options{})
		if err != nil {
			b.Fatal(err)
		}
		if res.Verdict == "" {
			b.Fatal("no verdict")
		}
		n++
	}
	b.ReportMetric(float64((cpuTime()-c0).Nanoseconds())/float64(n), "cpu-ns/op")
}

// BenchmarkCheckMatchOnly is the compare part alone (processed peak list and
// prediction given).
func BenchmarkCheckMatchOnly(b *testing.B) {
	spec := benchSpectrum(b)
	pl, err := spectrum.Process(spec, spectrum.ProcessOptions{})
	if err != nil {
		b.Fatal(err)
	}
	m, _ := smiles.Parse(benchSmiles)
	p, _ := predict.Predict(m, benchSmiles, predict.Options{FieldMHz: 400, Solvent: "CDCl3"})
	in := Input{Smiles: benchSmiles, Peaks: pl, Prediction: p}
	b.ReportAllocs()
	c0, n := cpuTime(), 0
	for b.Loop() {
		if _, err := Check(in, Options{Solvent: "CDCl3"}); err != nil {
			b.Fatal(err)
		}
		n++
	}
	b.ReportMetric(float64((cpuTime()-c0).Nanoseconds())/float64(n), "cpu-ns/op")
}
