package compare

import (
	"fmt"
	"strings"
	"testing"

	"shiftwise/predict/spin"
)

// benchtopRates checks the synthetic reference set (handbook shifts and
// couplings simulated exactly, refset_test.go) at a benchtop field with
// the prediction in the given mode: true structures consistent, wrong
// isomers (as candidates) rejected or ranked lower, and wrong isomers
// given as the intended structure flagged (not consistent).
func benchtopRates(t *testing.T, field float64, mode spin.Mode) (okTrue, okWrong, okFlag int) {
	t.Helper()
	for k, c := range refSet {
		spec, err := refSpectrum(c, field, 32768, uint64(k+1))
		if err != nil {
			t.Fatal(err)
		}
		in := Input{Smiles: c.smiles, Spectrum: spec, Candidates: []string{c.wrong}}
		if c.impurity != "" {
			in.Impurities = []string{c.impurity}
		}
		opt := Options{Mode: mode}
		res, err := Check(in, opt)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if res.Verdict == Consistent {
			okTrue++
		} else if mode == spin.Auto {
			t.Logf("%g MHz %s: true structure %s (%.2f): %s", field, c.name, res.Verdict, res.Score, strings.Join(res.Reasons, " | "))
		}
		for _, cd := range res.Candidates {
			if !cd.Main && (cd.Verdict == Inconsistent || cd.Score < res.Score) {
				okWrong++
			}
		}
		wr, err := Check(Input{Smiles: c.wrong, Spectrum: spec, Candidates: []string{c.smiles}}, opt)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if wr.Verdict != Consistent {
			okFlag++
		}
	}
	return okTrue, okWrong, okFlag
}

// TestReferenceSetBenchtop: the reference set at 60 and 90 MHz, where most
// aliphatic and many aromatic patterns are second-order (common practice,
// no source). The spectra are the handbook spin systems (values from
// memory, see refset_test.go) simulated exactly; the check predicts in auto
// mode (exact or fragment simulation of strongly coupled clusters) and, for
// contrast, first-order. Measured 2026-12-02 after the benchtop grouping
// fix in spectrum (true consistent / wrong rejected or ranked lower / wrong
// as intended flagged, of 46): 60 MHz auto 46/42/36, first-order 46/39/36;
// 90 MHz auto 46/43/36, first-order 46/42/38. At 300–600 MHz the third
// figure is 43 (TestReferenceSetWrongIntended): at benchtop fields ten
// positional isomers (methylanisoles, chlorobenzaldehydes,
// dimethoxybenzenes, E/Z esters …) pass as the intended structure, which
// the check's benchtop caution states. The levels keep one compound of
// slack; first-order prediction must not confirm more true structures or
// reject more wrong candidates than auto. Before the grouping fix
// butanal's aliphatic region (0.8–2.6 ppm) was one 60 MHz multiplet and
// its true structure was inconsistent.
func TestReferenceSetBenchtop(t *testing.T) {
	if testing.Short() {
		t.Skip("four passes over the reference set")
	}
	t.Parallel()
	type rates struct{ true, wrong, flag int }
	min := map[float64]rates{60: {45, 41, 35}, 90: {45, 42, 35}}
	for _, field := range []float64{60, 90} {
		a, b, c := benchtopRates(t, field, spin.Auto)
		fa, fb, fc := benchtopRates(t, field, spin.FirstOrder)
		n := len(refSet)
		t.Logf("%g MHz, auto: true consistent %d/%d, wrong rejected or ranked lower %d/%d, wrong as intended flagged %d/%d; first-order: %d, %d, %d",
			field, a, n, b, n, c, n, fa, fb, fc)
		m := min[field]
		if a < m.true || b < m.wrong || c < m.flag {
			t.Errorf("%g MHz below measured levels: %d/%d/%d, want at least %d/%d/%d", field, a, b, c, m.true, m.wrong, m.flag)
		}
		if fa > a || fb > b {
			t.Errorf("%g MHz: first-order prediction does better than auto: %s", field, fmt.Sprint(fa, fb, " vs ", a, b))
		}
	}
}
