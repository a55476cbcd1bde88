package compare

import (
	"encoding/json"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"shiftwise/predict"
	"shiftwise/spectrum"
)

// handPredictor serves hand-made predictions, so that compare is tested on
// its own. Shifts are handbook values for butanone and isobutyraldehyde in
// CDCl3 (common practice, no source; values from memory), SDs typical of
// increment predictions.
func handPredictor(t *testing.T) Predictor {
	preds := map[string]*predict.Prediction{
		"CCC(C)=O": {Smiles: "CCC(C)=O", MolecularWeight: 72.11, Signals: []predict.Signal{
			{Label: "A", NH: 3, Kind: "CH3", ShiftPPM: 1.05, ShiftSD: 0.1, Multiplicity: "t", Couplings: []predict.Coupling{{To: "C", JHz: 7.3}}},
			{Label: "B", NH: 3, Kind: "CH3", ShiftPPM: 2.12, ShiftSD: 0.1, Multiplicity: "s"},
			{Label: "C", NH: 2, Kind: "CH2", ShiftPPM: 2.45, ShiftSD: 0.1, Multiplicity: "q", Couplings: []predict.Coupling{{To: "A", JHz: 7.3}}},
		}},
		"CC(C)C=O": {Smiles: "CC(C)C=O", MolecularWeight: 72.11, Signals: []predict.Signal{
			{Label: "A", NH: 6, Kind: "CH3", ShiftPPM: 1.12, ShiftSD: 0.1, Multiplicity: "d"},
			{Label: "B", NH: 1, Kind: "CH", ShiftPPM: 2.42, ShiftSD: 0.15, Multiplicity: "m"},
			{Label: "C", NH: 1, Kind: "CHO", ShiftPPM: 9.62, ShiftSD: 0.1, Multiplicity: "d"},
		}},
		// 1,3,5-trimethoxybenzene as a qNMR standard: 6.09 s 3H, 3.77 s 9H
		// (value from memory).
		"COc1cc(OC)cc(OC)c1": {Smiles: "COc1cc(OC)cc(OC)c1", MolecularWeight: 168.19, Signals: []predict.Signal{
			{Label: "A", NH: 9, Kind: "CH3", ShiftPPM: 3.78, ShiftSD: 0.1, Multiplicity: "s"},
			{Label: "B", NH: 3, Kind: "ArH", ShiftPPM: 6.10, ShiftSD: 0.1, Multiplicity: "s"},
		}},
	}
	return func(smi string, field float64, solvent string) (*predict.Prediction, error) {
		p, ok := preds[smi]
		if !ok {
			return nil, fmt.Errorf("no hand prediction for %s", smi)
		}
		c := *p
		c.FieldMHz, c.Solvent = field, solvent
		return &c, nil
	}
}

func mp(ppm, halfHz, area float64, mult string, j ...float64) spectrum.Multiplet {
	return spectrum.Multiplet{PPM: ppm, FromPPM: ppm - halfHz/400, ToPPM: ppm + halfHz/400, Integral: area, Multiplicity: mult, JHz: j}
}

// butanonePeaks is a hand-made peak list of butanone (measured shifts in
// CDCl3: 1.06 t, 2.14 s, 2.44 q; common practice, value from memory) with
// CHCl3, water and 2 mol% ethyl acetate (per H: 0.02 × {3, 2, 3}), and a
// pair of 13C satellites of the 2.14 singlet (±64 Hz, 0.55 %).
func butanonePeaks() *spectrum.PeakList {
	k := 10.0 // area per H
	return &spectrum.PeakList{FieldMHz: 400, Multiplets: []spectrum.Multiplet{
		mp(7.26, 2, 1.5*k, "s"),
		mp(4.12, 12, 0.02*2*k, "q", 7.1),
		mp(2.44, 12, 2*k, "q", 7.3),
		mp(2.14+64.0/400, 2, 0.0055*3*k, "s"),
		mp(2.14, 2, 3*k, "s"),
		mp(2.14-64.0/400, 2, 0.0055*3*k, "s"),
		mp(2.05, 2, 0.02*3*k, "s"),
		mp(1.56, 4, 0.4*k, "s"),
		mp(1.26, 8, 0.02*3*k, "t", 7.1),
		mp(1.06, 8, 3*k, "t", 7.3),
	}}
}

func TestCheckHandMade(t *testing.T) {
	t.Parallel()
	in := Input{Smiles: "CCC(C)=O", Peaks: butanonePeaks(), Candidates: []string{"CC(C)C=O"}}
	res, err := Check(in, Options{Solvent: "CDCl3", Predictor: handPredictor(t)})
	if err != nil {
		t.Fatal(err)
	}
	if res.Verdict != Consistent {
		t.Errorf("verdict %s (%.2f), want consistent; reasons %q", res.Verdict, res.Score, res.Reasons)
	}
	if len(res.Missing) != 0 || len(res.Assignments) != 3 {
		t.Errorf("missing %v, assignments %+v", res.Missing, res.Assignments)
	}
	// Scale: 10 area units per H by construction.
	if math.Abs(res.HPerArea-0.1) > 1e-9 {
		t.Errorf("H per area %g, want 0.1", res.HPerArea)
	}
	var names []string
	for _, f := range res.Found {
		names = append(names, f.Name)
		if f.Name == "ethyl acetate" {
			// 2 mol% ethyl acetate against 1 butanone: 0.02/1.02 = 1.96 mol%.
			if math.Abs(f.MolPercent-1.96) > 0.05 || f.Signals != 3 {
				t.Errorf("ethyl acetate %+v, want 1.96 mol%% from 3 signals", f)
			}
		}
	}
	joined := strings.Join(names, ",")
	for _, want := range []string{"ethyl acetate", "water", "CHCl3"} {
		if !strings.Contains(joined, want) {
			t.Errorf("identified %q, want %s among them", joined, want)
		}
	}
	if len(res.Artifact) != 2 {
		t.Errorf("artifacts %+v, want the two 13C satellites", res.Artifact)
	}
	if res.Purity.MolarPercent == nil || math.Abs(*res.Purity.MolarPercent-98.04) > 0.05 {
		t.Errorf("molar purity %v, want 98.04", res.Purity.MolarPercent)
	}
	if len(res.Candidates) != 2 || !res.Candidates[0].Main || res.Candidates[1].Verdict == Consistent {
		t.Errorf("candidates %+v: butanone must rank first, isobutyraldehyde not consistent", res.Candidates)
	}
	if len(res.Candidates) == 2 && len(res.Candidates[1].Discriminating) == 0 {
		t.Errorf("no discriminating signals named for the wrong candidate")
	}
	b, err := json.Marshal(res)
	if err != nil {
		t.Fatal(err)
	}
	for _, key := range []string{`"verdict"`, `"score"`, `"reasons"`, `"assignments"`, `"unexplained"`, `"missing"`, `"purity"`, `"candidates"`, `"qnmr_mass_percent":null`, `"advisory"`} {
		if !strings.Contains(string(b), key) {
			t.Errorf("JSON lacks %s", key)
		}
	}
}

func TestCheckWrongStructure(t *testing.T) {
	t.Parallel()
	in := Input{Smiles: "CC(C)C=O", Peaks: butanonePeaks()}
	res, err := Check(in, Options{Solvent: "CDCl3", Predictor: handPredictor(t)})
	if err != nil {
		t.Fatal(err)
	}
	if res.Verdict != Inconsistent {
		t.Errorf("isobutyraldehyde against butanone: verdict %s (%.2f), want inconsistent; reasons %q", res.Verdict, res.Score, res.Reasons)
	}
	if len(res.Missing) == 0 {
		t.Errorf("the aldehyde signal at 9.62 should be missing: %v", res.Missing)
	}
}

func TestCheckQNMR(t *testing.T) {
	t.Parallel()
	pl := butanonePeaks()
	// Standard 1,3,5-trimethoxybenzene: 0.5 molecule per butanone
	// molecule, area per H 10 → 3H at 6.10: 15, 9H at 3.78: 45.
	pl.Multiplets = append(pl.Multiplets, mp(6.10, 2, 15, "s"), mp(3.78, 2, 45, "s"))
	st := &Standard{Smiles: "COc1cc(OC)cc(OC)c1", MassMg: 10, SampleMassMg: 10, PurityPct: 99.5}
	res, err := Check(Input{Smiles: "CCC(C)=O", Peaks: pl, Standard: st}, Options{Solvent: "CDCl3", Predictor: handPredictor(t)})
	if err != nil {
		t.Fatal(err)
	}
	if res.Purity.QNMRMassPercent == nil {
		t.Fatalf("no qNMR result; warnings %q", res.Warnings)
	}
	// By the qNMR equation: moles butanone/moles standard = 2;
	// mass fraction = 2·(72.11/168.19)·(10/10)·99.5 = 85.32 % (hand-computed).
	if got := *res.Purity.QNMRMassPercent; math.Abs(got-85.32) > 0.02 {
		t.Errorf("qNMR purity %.2f, want 85.32; %+v", got, res.Purity.QNMR)
	}
	if res.Purity.UncertaintyPercent == nil || *res.Purity.UncertaintyPercent <= 0 {
		t.Errorf("no qNMR uncertainty")
	}
}

func TestCheckEdgeCases(t *testing.T) {
	t.Parallel()
	noH := func(smi string, field float64, solvent string) (*predict.Prediction, error) {
		return &predict.Prediction{Smiles: smi, MolecularWeight: 153.8}, nil
	}
	for _, tc := range []struct {
		name string
		in   Input
		opt  Options
		want Verdict
	}{
		// CCl4 has no hydrogens: a 1H spectrum cannot confirm it (common
		// practice, no source).
		{"no hydrogens", Input{Smiles: "ClC(Cl)(Cl)Cl", Peaks: butanonePeaks()}, Options{Solvent: "CDCl3", Predictor: noH}, Review},
		{"empty peak list", Input{Smiles: "CCC(C)=O", Peaks: &spectrum.PeakList{FieldMHz: 400}}, Options{Solvent: "CDCl3", Predictor: handPredictor(t)}, Inconsistent},
		{"unknown solvent", Input{Smiles: "CCC(C)=O", Peaks: butanonePeaks()}, Options{Solvent: "unobtainium", Predictor: handPredictor(t)}, ""},
	} {
		res, err := Check(tc.in, tc.opt)
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		if tc.want != "" && res.Verdict != tc.want {
			t.Errorf("%s: verdict %s, want %s; reasons %q", tc.name, res.Verdict, tc.want, res.Reasons)
		}
		if len(res.Reasons) == 0 {
			t.Errorf("%s: no reasons", tc.name)
		}
	}
	if _, err := Check(Input{Smiles: "CCO"}, Options{}); err == nil {
		t.Error("no spectrum: no error")
	}
	if _, err := Check(Input{Peaks: butanonePeaks()}, Options{Predictor: handPredictor(t)}); err == nil {
		t.Error("no structure: no error")
	}
}

// TestCheckConcurrent: screen runs Check in parallel; results must not
// depend on it (run with -race to check for data races).
func TestCheckConcurrent(t *testing.T) {
	t.Parallel()
	want, err := Check(Input{Smiles: "CCC(C)=O", Peaks: butanonePeaks()}, Options{Solvent: "CDCl3", Predictor: handPredictor(t)})
	if err != nil {
		t.Fatal(err)
	}
	errs := make(chan error, 8)
	for k := 0; k < 8; k++ {
		go func() {
			res, err := Check(Input{Smiles: "CCC(C)=O", Peaks: butanonePeaks(), Candidates: []string{"CC(C)C=O"}},
				Options{Solvent: "CDCl3", Predictor: handPredictor(t)})
			if err == nil && (res.Score != want.Score || res.Verdict != want.Verdict) {
				err = fmt.Errorf("concurrent result %s %.3f, want %s %.3f", res.Verdict, res.Score, want.Verdict, want.Score)
			}
			errs <- err
		}()
	}
	for k := 0; k < 8; k++ {
		if err := <-errs; err != nil {
			t.Error(err)
		}
	}
}

// TestCheckConcurrentDefault runs the default pipeline (parse, predict,
// process) from several goroutines on one synthetic spectrum.
func TestCheckConcurrentDefault(t *testing.T) {
	t.Parallel()
	c := refSet[0]
	spec, err := refSpectrum(c, 400, 16384, 1)
	if err != nil {
		t.Fatal(err)
	}
	errs := make(chan error, 4)
	scores := make(chan float64, 4)
	for k := 0; k < 4; k++ {
		go func() {
			res, err := Check(Input{Smiles: c.smiles, Spectrum: spec, Candidates: []string{c.wrong}}, Options{})
			errs <- err
			if err == nil {
				scores <- res.Score
			} else {
				scores <- -1
			}
		}()
	}
	first := -2.0
	for k := 0; k < 4; k++ {
		if err := <-errs; err != nil {
			t.Error(err)
		}
		s := <-scores
		if first == -2 {
			first = s
		} else if s != first {
			t.Errorf("concurrent scores differ: %g vs %g", s, first)
		}
	}
}

// TestCheckRandomPeakLists: whatever processing hands over (odd ranges,
// zero, negative or NaN integrals, stray peak indices), Check must not
// panic and its Result must encode as JSON (no NaN or Inf).
func TestCheckRandomPeakLists(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(5, 9))
	odd := []float64{0, -1, math.NaN(), math.Inf(1), 1e-300, 1e300}
	mults := []string{"s", "d", "t", "q", "m", "dd", "br s", "", "??", "dddddddd"}
	for trial := 0; trial < 300; trial++ {
		pl := &spectrum.PeakList{FieldMHz: []float64{0, 60, 400, 1200}[rng.IntN(4)]}
		for k := rng.IntN(12); k > 0; k-- {
			c := rng.Float64()*14 - 1
			area := rng.Float64() * 10
			if rng.IntN(5) == 0 {
				area = odd[rng.IntN(len(odd))]
			}
			m := spectrum.Multiplet{PPM: c, FromPPM: c + rng.NormFloat64()*0.05, ToPPM: c + rng.NormFloat64()*0.05,
				Integral: area, Multiplicity: mults[rng.IntN(len(mults))], Peaks: rng.IntN(5),
				JHz: []float64{rng.Float64() * 20}, PeakIndex: []int{rng.IntN(7) - 2}}
			pl.Multiplets = append(pl.Multiplets, m)
			pl.Peaks = append(pl.Peaks, spectrum.Peak{PPM: c, Intensity: area, SNR: rng.Float64() * 100, WidthHz: rng.Float64() * 10})
		}
		in := Input{Smiles: "CCC(C)=O", Peaks: pl, Candidates: []string{"CC(C)C=O"}, Impurities: []string{"COc1cc(OC)cc(OC)c1"},
			Standard: &Standard{Smiles: "COc1cc(OC)cc(OC)c1", MassMg: 1, SampleMassMg: 1, PurityPct: 99}}
		res, err := Check(in, Options{Solvent: []string{"CDCl3", "DMSO", "", "xyz"}[rng.IntN(4)], Predictor: handPredictor(t)})
		if err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		if _, err := json.Marshal(res); err != nil {
			t.Fatalf("trial %d: JSON: %v", trial, err)
		}
	}
}

// TestCheckQNMRSignalAbsent: a standard signal asked for where the standard
// has none gives no qNMR result; the structure check stands, but the
// verdict is review with the reason (doc.go, "Scores and verdict").
// Peaks as in TestCheckQNMR.
func TestCheckQNMRSignalAbsent(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name   string
		extra  []spectrum.Multiplet
		signal float64
		reason string
	}{
		{"signal 99", []spectrum.Multiplet{mp(6.10, 2, 15, "s"), mp(3.78, 2, 45, "s")}, 99, "internal standard signal at 99.00 ppm not found; no qNMR result"},
		{"no standard", nil, 0, "internal standard COc1cc(OC)cc(OC)c1 not found in the spectrum; no qNMR result"},
	} {
		pl := butanonePeaks()
		pl.Multiplets = append(pl.Multiplets, tc.extra...)
		st := &Standard{Smiles: "COc1cc(OC)cc(OC)c1", MassMg: 10, SampleMassMg: 10, PurityPct: 99.5, SignalPPM: tc.signal}
		res, err := Check(Input{Smiles: "CCC(C)=O", Peaks: pl, Standard: st, Candidates: []string{"CC(C)C=O"}},
			Options{Solvent: "CDCl3", Predictor: handPredictor(t)})
		if err != nil {
			t.Fatal(err)
		}
		if res.Verdict != Review || res.Purity.QNMRMassPercent != nil || !strings.Contains(strings.Join(res.Reasons, "|"), tc.reason) {
			t.Errorf("%s: verdict %s, qNMR %v, reasons %q; want review with %q", tc.name, res.Verdict, res.Purity.QNMRMassPercent, res.Reasons, tc.reason)
		}
		for _, c := range res.Candidates {
			if c.Main && c.Verdict != res.Verdict {
				t.Errorf("%s: intended structure's candidate row says %s, result %s", tc.name, c.Verdict, res.Verdict)
			}
		}
	}
}

// TestResultJSONOddCases: no NaN or ±Inf reaches a Result, so every Result
// encodes as JSON (encoding/json refuses non-finite numbers). Odd cases: the
// qNMR masses at their bounds both ways, standard and compound integrals
// of extreme size, empty and degenerate peak lists, an absurd field.
func TestResultJSONOddCases(t *testing.T) {
	t.Parallel()
	std := func(m, sm float64) *Standard {
		return &Standard{Smiles: "COc1cc(OC)cc(OC)c1", MassMg: m, SampleMassMg: sm, PurityPct: 100}
	}
	withStd := func(area float64) *spectrum.PeakList {
		pl := butanonePeaks()
		pl.Multiplets = append(pl.Multiplets, mp(6.10, 2, area, "s"), mp(3.78, 2, 3*area, "s"))
		return pl
	}
	cases := []struct {
		name string
		in   Input
		opt  Options
	}{
		{"masses max/min", Input{Peaks: withStd(15), Standard: std(MaxMassMg, MinMassMg)}, Options{}},
		{"masses min/max", Input{Peaks: withStd(15), Standard: std(MinMassMg, MaxMassMg)}, Options{}},
		{"tiny standard", Input{Peaks: withStd(1e-300), Standard: std(MaxMassMg, MinMassMg)}, Options{}},
		{"huge standard", Input{Peaks: withStd(1e300), Standard: std(MinMassMg, MaxMassMg)}, Options{}},
		{"empty peaks", Input{Peaks: &spectrum.PeakList{}, Standard: std(5, 15)}, Options{}},
		{"zero areas", Input{Peaks: &spectrum.PeakList{Multiplets: []spectrum.Multiplet{mp(2.14, 2, 0, "s"), mp(1.06, 2, 0, "t")}}}, Options{}},
		{"negative areas", Input{Peaks: &spectrum.PeakList{Multiplets: []spectrum.Multiplet{mp(2.14, 2, -3, "s"), mp(1.06, 2, -1e300, "t")}}}, Options{}},
		{"huge field", Input{Peaks: butanonePeaks()}, Options{FieldMHz: 1e300}},
		{"NaN file field", Input{Peaks: &spectrum.PeakList{FieldMHz: math.NaN(), Multiplets: butanonePeaks().Multiplets}}, Options{}},
		{"NaN shift", Input{Peaks: &spectrum.PeakList{Multiplets: []spectrum.Multiplet{mp(math.NaN(), 2, 30, "s"), mp(1.06, 2, 30, "t")}}}, Options{}},
	}
	for _, f := range []float64{math.NaN(), math.Inf(1), -400} {
		if _, err := Check(Input{Smiles: "CCC(C)=O", Peaks: butanonePeaks()}, Options{FieldMHz: f, Predictor: handPredictor(t)}); err == nil {
			t.Errorf("field %v accepted", f)
		}
	}
	for _, tc := range cases {
		tc.in.Smiles = "CCC(C)=O"
		tc.in.Candidates = []string{"CC(C)C=O"}
		tc.opt.Solvent, tc.opt.Predictor = "CDCl3", handPredictor(t)
		res, err := Check(tc.in, tc.opt)
		if err != nil {
			continue // refused input is fine; a Result must encode
		}
		if _, err := json.Marshal(res); err != nil {
			t.Errorf("%s: JSON: %v", tc.name, err)
		}
	}
}
