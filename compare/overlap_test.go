package compare

import (
	"fmt"
	"strings"
	"testing"

	"shiftwise/predict"
	"shiftwise/spectrum"
)

// fixedPredictor serves one hand-made prediction for every SMILES, so that
// the matching rules are tested on their own.
func fixedPredictor(p predict.Prediction) Predictor {
	return func(smi string, field float64, solvent string) (*predict.Prediction, error) {
		c := p
		c.Smiles, c.FieldMHz, c.Solvent = smi, field, solvent
		return &c, nil
	}
}

// checkHand runs Check on a hand-made peak list with a fixed prediction and
// returns the measured shift each signal was given (-1 when missing).
func checkHand(t *testing.T, pl *spectrum.PeakList, solvent string, p predict.Prediction) (*Result, map[string]float64) {
	t.Helper()
	res, err := Check(Input{Smiles: "C", Peaks: pl}, Options{Solvent: solvent, Predictor: fixedPredictor(p)})
	if err != nil {
		t.Fatal(err)
	}
	got := map[string]float64{}
	for _, s := range p.Signals {
		got[s.Label] = -1
	}
	for _, a := range res.Assignments {
		got[a.Signal] = a.MeasuredPPM
	}
	return res, got
}

// TestCoupledHydroxylInDMSO: in DMSO-d6 an OH exchanges slowly and shows as
// a sharp doublet coupled to its CH (2-propanol in DMSO-d6: CH3 1.04 d,
// CH 3.78 m, OH 4.34 d J 4.4 Hz; Gottlieb, Kotlyar & Nudelman 1997 Table 1,
// values from memory). The CH is predicted 0.32 ppm too high, as increment
// schemes do for CH–OH in DMSO-d6, so that it lies nearer the OH doublet
// than its own multiplet; a trace doublet (0.02 H) sits near the predicted
// OH. The coupled OH must take its doublet (sharp, full integral term,
// normally seen) and the CH its own multiplet. Before the rule the OH was
// matched like a broad line (SD 1.2 ppm, light integral term, missing for
// 2) and went to the trace while the CH took the OH doublet.
func TestCoupledHydroxylInDMSO(t *testing.T) {
	t.Parallel()
	p := predict.Prediction{MolecularWeight: 60.1, Signals: []predict.Signal{
		{Label: "A", NH: 6, Kind: "CH3", ShiftPPM: 1.10, ShiftSD: 0.1, Multiplicity: "d", Couplings: []predict.Coupling{{To: "B", JHz: 6.1}}},
		{Label: "B", NH: 1, Kind: "CH", ShiftPPM: 4.10, ShiftSD: 0.15, Multiplicity: "m"},
		{Label: "C", NH: 1, Kind: "OH", ShiftPPM: 4.60, ShiftSD: 0.5, Multiplicity: "d", Exchangeable: true,
			Couplings: []predict.Coupling{{To: "B", JHz: 4.5}}},
	}}
	k := 10.0
	pl := &spectrum.PeakList{FieldMHz: 400, Multiplets: []spectrum.Multiplet{
		mp(2.50, 3, 0.1*k, "p", 1.8),
		mp(3.33, 2, 0.3*k, "s"),
		mp(1.04, 6, 6*k, "d", 6.1),
		mp(3.78, 14, 1*k, "m"),
		mp(4.34, 4, 1*k, "d", 4.4),
		mp(4.50, 3, 0.02*k, "d", 4.0),
	}}
	_, got := checkHand(t, pl, "DMSO-d6", p)
	if got["B"] != 3.78 || got["C"] != 4.34 {
		t.Errorf("CH at %.2f (want 3.78), OH at %.2f (want 4.34)", got["B"], got["C"])
	}
}

// TestOverlapEnvelope: three methyl doublets predicted at 0.86 ppm and
// three ring CH at 1.0 ppm, measured as one clean 3 H doublet at 0.73 and
// a 9 H envelope at 0.74–0.91 holding the two other methyls and the three
// CH (the pattern of menthol's methyl region; common practice, no source).
// Overlap in a 9 H envelope is expected, so placing a fourth or fifth
// signal there must not cost as much as doubling up in the clean 3 H
// doublet: exactly one methyl belongs to 0.73.
func TestOverlapEnvelope(t *testing.T) {
	t.Parallel()
	var sig []predict.Signal
	for i, l := range []string{"A", "B", "C"} {
		sig = append(sig, predict.Signal{Label: l, NH: 3, Kind: "CH3", ShiftPPM: 0.86, ShiftSD: 0.18, Multiplicity: "d",
			Couplings: []predict.Coupling{{To: fmt.Sprint("D", i), JHz: 6.8}}})
	}
	for _, l := range []string{"D0", "D1", "D2"} {
		sig = append(sig, predict.Signal{Label: l, NH: 1, Kind: "CH", ShiftPPM: 1.0, ShiftSD: 0.2, Multiplicity: "m"})
	}
	sig = append(sig, predict.Signal{Label: "E", NH: 1, Kind: "CH", ShiftPPM: 1.6, ShiftSD: 0.2, Multiplicity: "m"})
	k := 10.0
	pl := &spectrum.PeakList{FieldMHz: 600, Multiplets: []spectrum.Multiplet{
		mp(7.26, 2, 0.05*k, "s"),
		{PPM: 0.726, FromPPM: 0.710, ToPPM: 0.737, Integral: 3.1 * k, Multiplicity: "d", JHz: []float64{6.9}},
		{PPM: 0.847, FromPPM: 0.737, ToPPM: 0.914, Integral: 9 * k, Multiplicity: "m"},
		mp(1.60, 20, 1*k, "m"),
	}}
	res, got := checkHand(t, pl, "CDCl3", predict.Prediction{MolecularWeight: 156.3, Signals: sig})
	n := 0
	for _, l := range []string{"A", "B", "C"} {
		if got[l] == 0.726 {
			n++
		}
	}
	if n != 1 {
		t.Errorf("%d methyl doublets in the 3 H doublet at 0.73, want 1: %v", n, got)
	}
	if res.Verdict != Consistent {
		t.Errorf("verdict %s %.2f, want consistent: %q", res.Verdict, res.Score, res.Reasons)
	}
}

// TestBaselineHump: butanone's peak list with a 4.8 ppm wide region
// (−4.3 to 0.5 ppm, 3 H-equivalents) as processing reports a rolling
// baseline. No real multiplet is that wide (common practice, no source):
// it must be listed as a baseline hump, not hold compound signals nor be
// named as a table contaminant, and must not count as unexplained
// intensity.
func TestBaselineHump(t *testing.T) {
	t.Parallel()
	pl := butanonePeaks()
	pl.Multiplets = append(pl.Multiplets, spectrum.Multiplet{PPM: 0.1, FromPPM: -4.3, ToPPM: 0.5, Integral: 30, Multiplicity: "m"})
	res, err := Check(Input{Smiles: "CCC(C)=O", Peaks: pl}, Options{Solvent: "CDCl3", Predictor: handPredictor(t)})
	if err != nil {
		t.Fatal(err)
	}
	hump := len(pl.Multiplets) - 1
	for _, a := range res.Assignments {
		if a.Multiplet == hump {
			t.Errorf("signal %s given to the baseline hump", a.Signal)
		}
	}
	for _, f := range res.Found {
		for _, m := range f.Multiplets {
			if m == hump {
				t.Errorf("%s identified at the baseline hump", f.Name)
			}
		}
	}
	var kinds []string
	for _, a := range res.Artifact {
		kinds = append(kinds, a.Kind)
	}
	if !strings.Contains(strings.Join(kinds, ","), "baseline hump") {
		t.Errorf("artifacts %q, want a baseline hump", kinds)
	}
	if res.Verdict != Consistent {
		t.Errorf("verdict %s %.2f, want consistent: %q", res.Verdict, res.Score, res.Reasons)
	}
}

// TestSolventFromLines: butanone's lines in a tube whose file says CDCl3
// but that holds DMSO-d6: no CHCl3 line at 7.26, the DMSO-d5 quintet at
// 2.50 and water at 3.33 (Gottlieb 1997 Table 1, values from memory). The
// check must use DMSO-d6, say so, and take 2.50 as residual solvent. Given
// explicitly (Options.Solvent), the user's solvent stands; with a CHCl3
// line present the header stands.
func TestSolventFromLines(t *testing.T) {
	t.Parallel()
	dmso := func(chcl3 bool) *spectrum.PeakList {
		k := 10.0
		pl := &spectrum.PeakList{FieldMHz: 400, Solvent: "CDCl3", Multiplets: []spectrum.Multiplet{
			mp(2.50, 3, 0.3*k, "quint", 1.8),
			mp(3.33, 3, 0.5*k, "s"),
			mp(2.44, 12, 2*k, "q", 7.3),
			mp(2.08, 2, 3*k, "s"),
			mp(0.91, 8, 3*k, "t", 7.3),
		}}
		if chcl3 {
			pl.Multiplets = append(pl.Multiplets, mp(7.26, 2, 0.2*k, "s"))
		}
		return pl
	}
	cases := []struct {
		name  string
		pl    *spectrum.PeakList
		given string
		want  string
	}{
		{"lines say DMSO-d6", dmso(false), "", "DMSO-d6"},
		{"user says CDCl3", dmso(false), "CDCl3", "CDCl3"},
		{"CHCl3 line present", dmso(true), "", "CDCl3"},
	}
	for _, c := range cases {
		res, err := Check(Input{Smiles: "CCC(C)=O", Peaks: c.pl}, Options{Solvent: c.given, Predictor: handPredictor(t)})
		if err != nil {
			t.Fatal(err)
		}
		warned := strings.Contains(strings.Join(res.Warnings, "|"), "checked as DMSO-d6")
		if res.Solvent != c.want || warned != (c.want == "DMSO-d6") {
			t.Errorf("%s: solvent %s (warned %v), want %s", c.name, res.Solvent, warned, c.want)
		}
		if c.want != "DMSO-d6" {
			continue
		}
		names := ""
		for _, f := range res.Found {
			names += f.Name + ";"
		}
		if !strings.Contains(names, "DMSO-d5") {
			t.Errorf("%s: identified %q, want the DMSO-d5 residual", c.name, names)
		}
		if res.Verdict != Consistent {
			t.Errorf("%s: verdict %s %.2f: %q", c.name, res.Verdict, res.Score, res.Reasons)
		}
	}
}

// TestBlurredPattern: an ethyl group (CH3 t, CH2 q, J 7.1 Hz: spans 14.2
// and 21.3 Hz) measured at low resolution, each pattern one line of 16 and
// 24 Hz that processing labels "s" (as in a heavily apodised or coarsely
// digitised spectrum). A single line as wide as the predicted pattern is
// that pattern unresolved, not a singlet: no multiplicity complaint. The
// same lines at 1 Hz width are true singlets and must still be named
// (common practice, no source).
func TestBlurredPattern(t *testing.T) {
	t.Parallel()
	p := predict.Prediction{MolecularWeight: 88.1, Signals: []predict.Signal{
		{Label: "A", NH: 3, Kind: "CH3", ShiftPPM: 1.25, ShiftSD: 0.1, Multiplicity: "t", Couplings: []predict.Coupling{{To: "B", JHz: 7.1}}},
		{Label: "B", NH: 2, Kind: "CH2", ShiftPPM: 4.10, ShiftSD: 0.1, Multiplicity: "q", Couplings: []predict.Coupling{{To: "A", JHz: 7.1}}},
		{Label: "C", NH: 3, Kind: "CH3", ShiftPPM: 2.05, ShiftSD: 0.1, Multiplicity: "s"},
	}}
	for _, c := range []struct {
		w1, w2 float64
		blur   bool
	}{{16, 24, true}, {1, 1, false}} {
		k := 10.0
		pl := &spectrum.PeakList{FieldMHz: 400, Peaks: []spectrum.Peak{
			{PPM: 1.26, Intensity: 3, SNR: 500, WidthHz: c.w1},
			{PPM: 4.12, Intensity: 2, SNR: 300, WidthHz: c.w2},
			{PPM: 2.04, Intensity: 30, SNR: 5000, WidthHz: 1},
			{PPM: 7.26, Intensity: 1, SNR: 100, WidthHz: 1},
		}, Multiplets: []spectrum.Multiplet{
			{PPM: 1.26, FromPPM: 1.22, ToPPM: 1.30, Integral: 3 * k, Multiplicity: "s", PeakIndex: []int{0}},
			{PPM: 4.12, FromPPM: 4.07, ToPPM: 4.17, Integral: 2 * k, Multiplicity: "s", PeakIndex: []int{1}},
			{PPM: 2.04, FromPPM: 2.03, ToPPM: 2.05, Integral: 3 * k, Multiplicity: "s", PeakIndex: []int{2}},
			{PPM: 7.26, FromPPM: 7.25, ToPPM: 7.27, Integral: 0.05 * k, Multiplicity: "s", PeakIndex: []int{3}},
		}}
		res, _ := checkHand(t, pl, "CDCl3", p)
		named := strings.Contains(strings.Join(res.Reasons, "|"), "predicted as t, measured multiplet at 1.26 is s")
		if named == c.blur {
			t.Errorf("lines %g/%g Hz: multiplicity complaint %v, want %v: %q", c.w1, c.w2, named, !c.blur, res.Reasons)
		}
		if c.blur && res.Verdict != Consistent {
			t.Errorf("lines %g/%g Hz: verdict %s %.2f, want consistent: %q", c.w1, c.w2, res.Verdict, res.Score, res.Reasons)
		}
	}
}

// TestWaterBeforeOneLineContaminant: in DMSO-d6 water (3.33) and ethylene
// glycol (3.34) lie 0.01 ppm apart (Gottlieb 1997 Table 1, values from
// memory). A lone line at 3.35 is water first: every tube holds water;
// the glycol is named as the alternative and counts against no purity.
func TestWaterBeforeOneLineContaminant(t *testing.T) {
	t.Parallel()
	k := 10.0
	pl := &spectrum.PeakList{FieldMHz: 400, Multiplets: []spectrum.Multiplet{
		mp(2.50, 3, 0.3*k, "quint", 1.8),
		mp(3.35, 4, 0.6*k, "s"),
		mp(2.44, 12, 2*k, "q", 7.3),
		mp(2.08, 2, 3*k, "s"),
		mp(0.91, 8, 3*k, "t", 7.3),
	}}
	res, err := Check(Input{Smiles: "CCC(C)=O", Peaks: pl}, Options{Solvent: "DMSO-d6", Predictor: handPredictor(t)})
	if err != nil {
		t.Fatal(err)
	}
	var names []string
	for _, f := range res.Found {
		names = append(names, f.Name)
	}
	if !strings.Contains(strings.Join(names, ";"), "water (or ethylene glycol)") {
		t.Errorf("identified %q, want water (or ethylene glycol)", names)
	}
	if p := res.Purity.MolarPercent; p == nil || *p < 99.99 {
		t.Errorf("molar purity %s, want 100 (water is not counted)", fmtPct(p))
	}
}

func fmtPct(p *float64) string {
	if p == nil {
		return "null"
	}
	return fmt.Sprintf("%.2f %%", *p)
}
