package compare

import (
	"math"
	"testing"

	"shiftwise/internal/synth"
)

// TestGivenImpurityAmounts: each reference compound with 5 mol % of
// another compound of the set (both synthesised from our own prediction
// with shift jitter; invented data), checked with that compound given as
// --impurity. The impurity must be named and its amount come out within
// 1.5 percentage points of 5 mol % (the molar composition counts H per
// molecule, common practice, no source). Measured 2026-12-02: named
// 42/46 and within 1.5 points 41 at 400 MHz, 34/46 and 28 at 60 MHz (the
// rest overlap the compound at 60 MHz); before the upper weighted median
// of that day one 400 MHz amount was 0.08 % (a 13C satellite taken for
// an impurity singlet decided the median). Every sample stays consistent.
// Levels: the measured counts less one.
func TestGivenImpurityAmounts(t *testing.T) {
	slowParallel(t, "92 checks")
	type level struct{ found, close int }
	min := map[float64]level{400: {41, 40}, 60: {33, 27}}
	for _, field := range []float64{400, 60} {
		found, close, cons := 0, 0, 0
		for k, c := range refSet {
			o := refSet[(k+5)%len(refSet)]
			r := synth.Recipe{FieldMHz: field, Seed: uint64(k + 9), Satellites: true, Extra: []synth.Singlet{cdcl3Water},
				Components: []synth.Component{{Smiles: c.smiles, Moles: 1, Jitter: 0.01}, {Smiles: o.smiles, Moles: 0.05 / 0.95, Jitter: 0.01}}}
			res := synthCheck(t, r, Input{Smiles: c.smiles, Impurities: []string{o.smiles}})
			if res.Verdict == Consistent {
				cons++
			}
			for _, id := range res.Found {
				if id.Kind != "impurity" {
					continue
				}
				found++
				if math.Abs(id.MolPercent-5) <= 1.5 {
					close++
				} else {
					t.Logf("%g MHz %s + 5 mol %% %s: %.2f mol %%", field, c.name, o.name, id.MolPercent)
				}
			}
		}
		t.Logf("%g MHz: impurity named %d/46, within 1.5 points %d; consistent %d/46", field, found, close, cons)
		if m := min[field]; found < m.found || close < m.close || cons < len(refSet) {
			t.Errorf("%g MHz: named %d, close %d, consistent %d; want at least %d, %d, %d", field, found, close, cons, m.found, m.close, len(refSet))
		}
	}
}
