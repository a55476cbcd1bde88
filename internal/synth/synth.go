// Package synth makes synthetic 1H spectra for the demo, tests and
// benchmarks: the predicted lines of one or more compounds in given molar
// amounts, optionally moved by seeded random shift offsets, plus the residual
// solvent multiplet, water, TMS, 13C satellites and noise.
//
// Synthetic spectra are invented data. They exercise the pipeline; they are
// not evidence about real samples.
package synth

import (
	"fmt"
	"math"
	"math/rand/v2"

	"shiftwise/predict"
	"shiftwise/smiles"
	"shiftwise/spectrum"
)

// Component is one species in the tube.
type Component struct {
	Smiles string
	Moles  float64 // relative molar amount
	// Jitter is the standard deviation (ppm) of a random offset applied to
	// each of the component's signals, to imitate the difference between a
	// prediction and a real measurement.
	Jitter float64
	// Shifts moves named signals (by label) by a fixed amount in ppm.
	Shifts map[string]float64
}

// Singlet is an extra line, e.g. water: position, H-equivalents (in units of
// the moles above) and width.
type Singlet struct {
	PPM, H, WidthHz float64
}

// Recipe describes a spectrum.
type Recipe struct {
	FieldMHz    float64 // default 400
	Solvent     string  // default CDCl3; its residual multiplet is added
	Residual    float64 // H-equivalents of residual solvent (default 0.02)
	TMS         float64 // H-equivalents of TMS at 0 ppm (0: none)
	Components  []Component
	Extra       []Singlet
	Satellites  bool    // add 13C satellites (0.55 % each at ±½·145 Hz) around every line
	Noise       float64 // noise SD relative to the tallest point (default 0.0005)
	LineWidthHz float64 // default 0.9
	Points      int     // default 65536
	FromPPM     float64 // default -1
	ToPPM       float64 // default 11
	Seed        uint64
}

// Make builds the spectrum. An unparsable SMILES is an error naming it.
func Make(r Recipe) (*spectrum.Spectrum, error) {
	r = r.defaults()
	rng := rand.New(rand.NewPCG(r.Seed, 0x5eed))
	all := &predict.Prediction{FieldMHz: r.FieldMHz}
	for ci, c := range r.Components {
		sigs, ls, err := componentLines(ci, c, r, rng)
		if err != nil {
			return nil, err
		}
		all.Signals = append(all.Signals, sigs...)
		all.Lines = append(all.Lines, ls...)
	}
	all.Lines = append(all.Lines, solventLines(r)...)
	if r.Satellites {
		all.Lines = addSatellites(all.Lines, r.FieldMHz)
	}
	x, y := predict.Render(all, r.FromPPM, r.ToPPM, r.Points, r.LineWidthHz)
	if x == nil {
		return nil, fmt.Errorf("synth: nothing to render")
	}
	for _, s := range r.Extra {
		addBroad(x, y, s, r.FieldMHz)
	}
	top := 0.0
	for _, v := range y {
		top = math.Max(top, v)
	}
	for i := range y {
		y[i] += r.Noise * top * rng.NormFloat64()
	}
	return &spectrum.Spectrum{PPM: x, Y: y, FieldMHz: r.FieldMHz, Nucleus: "1H", Solvent: r.Solvent, Title: "synthetic spectrum (invented data)"}, nil
}

func (r Recipe) defaults() Recipe {
	if r.FieldMHz <= 0 {
		r.FieldMHz = 400
	}
	if r.Solvent == "" {
		r.Solvent = "CDCl3"
	}
	if r.Residual == 0 {
		r.Residual = 0.02
	}
	if r.Noise == 0 {
		r.Noise = 0.0005
	}
	if r.LineWidthHz <= 0 {
		r.LineWidthHz = 0.9
	}
	if r.Points <= 0 {
		r.Points = 65536
	}
	if r.FromPPM == 0 && r.ToPPM == 0 {
		r.FromPPM, r.ToPPM = -1, 11
	}
	return r
}

// componentLines predicts component number ci and scales and moves its
// lines. Signal labels get the component's number ("0:A") so that the
// signals of several components stay apart; exchangeable signals keep
// their flag, so Render draws them broad as exchange does.
func componentLines(ci int, c Component, r Recipe, rng *rand.Rand) ([]predict.Signal, []predict.Line, error) {
	m, err := smiles.Parse(c.Smiles)
	if err != nil {
		return nil, nil, fmt.Errorf("synth: %q: %w", c.Smiles, err)
	}
	p, err := predict.Predict(m, c.Smiles, predict.Options{FieldMHz: r.FieldMHz, Solvent: r.Solvent})
	if err != nil {
		return nil, nil, fmt.Errorf("synth: %q: %w", c.Smiles, err)
	}
	tag := func(label string) string { return fmt.Sprintf("%d:%s", ci, label) }
	sigs := make([]predict.Signal, len(p.Signals))
	for i, sg := range p.Signals {
		sg.Label = tag(sg.Label)
		sigs[i] = sg
	}
	move := map[string]float64{}
	for _, s := range p.Signals {
		move[s.Label] = c.Shifts[s.Label]
		if c.Jitter > 0 {
			move[s.Label] += c.Jitter * rng.NormFloat64()
		}
	}
	out := make([]predict.Line, 0, len(p.Lines))
	for _, l := range p.Lines {
		l.PPM += move[l.Signal]
		l.Intensity *= c.Moles
		l.Signal = tag(l.Signal)
		out = append(out, l)
	}
	return sigs, out, nil
}

// solventLines returns the residual solvent multiplet (the isotopomer pattern:
// a singlet, the 1:1:1 triplet of CHD or the 1:2:3:2:1 quintet of CHD2) and
// TMS.
func solventLines(r Recipe) []predict.Line {
	var out []predict.Line
	if sol, ok := spectrum.LookupSolvent(r.Solvent); ok {
		var w []float64
		switch sol.Multiplicity {
		case "t":
			w = []float64{1, 1, 1}
		case "p":
			w = []float64{1, 2, 3, 2, 1}
		default:
			w = []float64{1}
		}
		sum := 0.0
		for _, v := range w {
			sum += v
		}
		n := float64(len(w) - 1)
		for k, v := range w {
			hz := (float64(k) - n/2) * sol.JHDHz
			out = append(out, predict.Line{PPM: sol.ResidualPPM + hz/r.FieldMHz, Intensity: r.Residual * v / sum, Signal: "solvent"})
		}
	}
	if r.TMS > 0 {
		out = append(out, predict.Line{PPM: 0, Intensity: r.TMS, Signal: "TMS"})
	}
	return out
}

// addSatellites adds the two 13C satellites of every carbon-bound line:
// 0.55 % each (half of the 1.1 % natural abundance of 13C) at ±½·¹J(CH),
// with ¹J(CH) = 145 Hz (common practice, no source).
func addSatellites(ls []predict.Line, field float64) []predict.Line {
	const frac, jch = 0.0055, 145.0
	out := ls
	for _, l := range ls {
		if l.Signal == "solvent" {
			continue
		}
		d := jch / 2 / field
		out = append(out,
			predict.Line{PPM: l.PPM - d, Intensity: frac * l.Intensity, Signal: l.Signal + "13C"},
			predict.Line{PPM: l.PPM + d, Intensity: frac * l.Intensity, Signal: l.Signal + "13C"})
	}
	return out
}

// addBroad adds a Lorentzian singlet of the given width and area (H).
func addBroad(x, y []float64, s Singlet, field float64) {
	g := s.WidthHz / 2 / field
	for i, v := range x {
		d := v - s.PPM
		y[i] += s.H * g / math.Pi / (d*d + g*g)
	}
}
