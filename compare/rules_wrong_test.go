package compare

import (
	"strings"
	"testing"

	"shiftwise/internal/synth"
	"shiftwise/predict"
)

// TestClearlyWrongCompound: the tube holds ethyl 4-methoxybenzoate (as the
// demo's sample LCC-2611-01: synthesised from shiftwise's own prediction
// with small random offsets, water 0.05 H), the check is asked about a
// clearly different compound. Ethanol explains half of the intensity at
// most (the whole aromatic AA'BB' pair and the OCH3 are foreign to it);
// N-benzylacetamide has five aromatic H where two are, and a CH3CO singlet
// where only a triplet is (handbook shifts: ethanol 1.22 t / 3.69 q,
// N-benzylacetamide 2.02 s, 4.4 d, 7.3 m; common practice, no source). Both
// must be inconsistent, not review (rules.go: minExplained, grossMisfits),
// while the true structure stays consistent. A tabulated singlet never
// names a resolved doublet (tableMultOK): no aromatic doublet is called
// N,N-dimethylformamide (8.02 s in CDCl3, Gottlieb 1997; value from memory).
func TestClearlyWrongCompound(t *testing.T) {
	t.Parallel()
	for _, field := range []float64{400, 600} {
		for _, seed := range []uint64{11, 12} {
			s, err := synth.Make(synth.Recipe{FieldMHz: field, Seed: seed, Extra: []synth.Singlet{{PPM: 1.56, H: 0.05, WidthHz: 2.5}},
				Components: []synth.Component{{Smiles: "CCOC(=O)c1ccc(OC)cc1", Moles: 1, Jitter: 0.015}}})
			if err != nil {
				t.Fatal(err)
			}
			for _, tc := range []struct {
				smiles string
				want   Verdict
			}{
				{"CCOC(=O)c1ccc(OC)cc1", Consistent},
				{"CCO", Inconsistent},
				{"CC(=O)NCc1ccccc1", Inconsistent},
			} {
				r, err := Check(Input{Smiles: tc.smiles, Spectrum: s}, Options{})
				if err != nil {
					t.Fatal(err)
				}
				if r.Verdict != tc.want {
					t.Errorf("%g MHz seed %d, %s: %s (%.2f), want %s: %s", field, seed, tc.smiles, r.Verdict, r.Score, tc.want, strings.Join(r.Reasons, " | "))
				}
				for _, u := range r.Unexplained {
					if strings.Contains(u.Likely, "dimethylformamide") && u.Multiplicity == "d" {
						t.Errorf("%g MHz seed %d, %s: doublet at %.2f called %q", field, seed, tc.smiles, u.PPM, u.Likely)
					}
				}
			}
		}
	}
}

// TestGrossMisfitRule pins the counting of grossMisfits on a hand-made
// evaluation of four non-exchangeable signals (10 H) and one OH: a missing
// signal, one more than 3 SD away, one of a clearly different multiplicity
// more than 2 SD away, and a short multiplet count; one misfit alone (unless
// ≥ 30 % of the H) is no reason, two are; exchangeable signals never count;
// a short multiplet counts only in a region short of a proton (rule of
// rules.go; common practice, no source).
func TestGrossMisfitRule(t *testing.T) {
	t.Parallel()
	sig := []predict.Signal{
		{Label: "A", NH: 3, ShiftPPM: 1.2, ShiftSD: 0.1, Multiplicity: "t"},
		{Label: "B", NH: 2, ShiftPPM: 2.4, ShiftSD: 0.1, Multiplicity: "q"},
		{Label: "C", NH: 3, ShiftPPM: 3.8, ShiftSD: 0.1, Multiplicity: "s"},
		{Label: "D", NH: 2, ShiftPPM: 7.2, ShiftSD: 0.1, Multiplicity: "d"},
		{Label: "E", NH: 1, ShiftPPM: 2.0, ShiftSD: 1.2, Multiplicity: "br s", Exchangeable: true},
	}
	ms := []mplet{{ppm: 1.2, area: 3, mult: "t"}, {ppm: 2.4, area: 2, mult: "q"}, {ppm: 3.8, area: 3, mult: "s"},
		{ppm: 7.2, area: 2, mult: "d"}, {ppm: 7.0, area: 0.5, mult: "d"}}
	mk := func(sigM []int, z, mc []float64) *evaluation {
		return &evaluation{pred: &predict.Prediction{Signals: sig}, sigM: sigM, z: z, mc: mc, ms: ms, scale: 1}
	}
	good := func() ([]int, []float64, []float64) {
		return []int{0, 1, 2, 3, -1}, []float64{0, 0, 0, 0, 0}, []float64{0, 0, 0, 0, 0}
	}
	for _, tc := range []struct {
		name string
		mod  func(sigM []int, z, mc []float64)
		want string // "" no reason, else a part of it
	}{
		{"all fit", func([]int, []float64, []float64) {}, ""},
		{"exchangeable far", func(_ []int, z, mc []float64) { z[4], mc[4] = 9, 3 }, ""},
		{"one far (2 H)", func(_ []int, z, _ []float64) { z[1] = 3.5 }, ""},
		{"one missing (3 H, 30 %)", func(sigM []int, _, _ []float64) { sigM[2] = -1 }, "1 signals (3 of 10 H) do not fit: C 3.80 s (3 H) missing"},
		{"far and wrong multiplicity", func(_ []int, z, mc []float64) { z[1], z[3], mc[3] = 3.5, 2.5, 2 }, "2 signals (4 of 10 H) do not fit"},
		{"wrong multiplicity near", func(_ []int, z, mc []float64) { z[1], z[3], mc[3] = 3.5, 1.5, 2 }, ""},
		{"short host, region short", func(sigM []int, z, _ []float64) { sigM[3], z[1] = 4, 3.5 }, "D 7.20 (2 H): 7.00 holds 0.5 H of 2"},
	} {
		sigM, z, mc := good()
		tc.mod(sigM, z, mc)
		got := mk(sigM, z, mc).grossMisfits(10)
		if (tc.want == "") != (got == "") || !strings.Contains(got, tc.want) {
			t.Errorf("%s: %q, want %q", tc.name, got, tc.want)
		}
	}
	// A short multiplet in a region that is not short (the region's other
	// multiplet carries the H): an assignment slip, not counted.
	ms2 := append([]mplet{}, ms...)
	ms2[3].area = 4 // 7.2 holds 4 H: the aromatic region has 4.5 H for 4 expected
	sig2 := append([]predict.Signal{}, sig...)
	sig2 = append(sig2, predict.Signal{Label: "F", NH: 2, ShiftPPM: 7.0, ShiftSD: 0.1, Multiplicity: "d"})
	ev := &evaluation{pred: &predict.Prediction{Signals: sig2}, sigM: []int{0, 1, 2, 3, -1, 4}, z: make([]float64, 6), mc: make([]float64, 6), ms: ms2, scale: 1}
	ev.z[1] = 3.5
	if got := ev.grossMisfits(12); got != "" {
		t.Errorf("short multiplet in a full region counted: %q", got)
	}
}
