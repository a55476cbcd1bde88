package compare

import (
	"strings"
	"testing"

	"shiftwise/internal/synth"
	"shiftwise/predict"
)

// TestHomologsToldApart: a homolog differs only in the number of CH2
// groups under the alkyl envelope, and a chemist reads the chain length
// from that envelope's integral against a clean signal such as OCH3 or
// OCH2 (common practice, no source). The spectra are synthesised from our
// own predictions with shift jitter (invented data): each structure checked
// against its own spectrum must be consistent, against a homolog's not,
// with a reason naming the integrals, at 60 and 400 MHz. Before
// integralConflicts, 10 of these 12 wrong checks passed as consistent: the
// H-weighted scale followed the envelope.
func TestHomologsToldApart(t *testing.T) {
	t.Parallel()
	pairs := [][2]string{
		{"CCCCCCCCCCCCCCCCCC(=O)OC", "CCCCCCCCCCCC(=O)OC"}, // methyl stearate / methyl laurate
		{"CCCCCCCCO", "CCCCCCO"},                           // 1-octanol / 1-hexanol
		{"CCCCCCOC(=O)c1ccccc1", "CCCCOC(=O)c1ccccc1"},     // hexyl / butyl benzoate
	}
	for _, field := range []float64{60, 400} {
		for _, p := range pairs {
			for _, dir := range [][2]string{{p[0], p[1]}, {p[1], p[0]}} {
				r := synth.Recipe{FieldMHz: field, Components: []synth.Component{{Smiles: dir[0], Moles: 1, Jitter: 0.01}},
					Extra: []synth.Singlet{cdcl3Water}, Seed: 7, Satellites: true}
				if res := synthCheck(t, r, Input{Smiles: dir[0]}); res.Verdict != Consistent {
					t.Errorf("%g MHz: %s checked as itself: %s (%.2f): %v", field, dir[0], res.Verdict, res.Score, res.Reasons)
				}
				res := synthCheck(t, r, Input{Smiles: dir[1]})
				if res.Verdict == Consistent {
					t.Errorf("%g MHz: %s checked as its homolog %s passes: %v", field, dir[0], dir[1], res.Reasons)
				} else if !strings.Contains(strings.Join(res.Reasons, " "), " expected") {
					t.Errorf("%g MHz: %s as %s: %s without an integral reason: %v", field, dir[0], dir[1], res.Verdict, res.Reasons)
				}
			}
		}
	}
}

// conflictCase builds an evaluation of hand-made multiplets: each entry is
// (area, H of each signal given to it). Signals are non-exchangeable.
func conflictCase(scale float64, mult [][]float64, ppm []float64) (*evaluation, []mplet) {
	ev := &evaluation{pred: &predict.Prediction{}, scale: scale, ex: &explanation{},
		solv: SolventInfo{Name: "CDCl3", Residual: 7.26}, solvOK: true}
	var ms []mplet
	for j, m := range mult {
		ms = append(ms, mplet{ppm: ppm[j], from: ppm[j] - 0.05, to: ppm[j] + 0.05, area: m[0]})
		for _, h := range m[1:] {
			ev.pred.Signals = append(ev.pred.Signals, predict.Signal{Label: string(rune('A' + len(ev.sigM))), NH: int(h)})
			ev.sigM = append(ev.sigM, j)
		}
	}
	return ev, ms
}

// TestIntegralConflicts checks the rule's branches on hand-made integrals
// (our own rule; the arithmetic is checked, not the chemistry).
func TestIntegralConflicts(t *testing.T) {
	t.Parallel()
	// OCH3 3 H and CH2CO 2 H agree at 1 H per unit; the envelope given
	// 16 H holds 28 units, and sets the H-weighted scale (16/28).
	ev, ms := conflictCase(16.0/28, [][]float64{{3, 3}, {2, 2}, {28, 2, 2, 2, 2, 2, 2, 2, 2}}, []float64{3.67, 2.30, 1.30})
	rs := ev.integralConflicts(ms)
	if len(rs) != 1 || !strings.Contains(rs[0], "the multiplet at 1.30 holds 28.0 H where 16 are expected") ||
		!strings.Contains(rs[0], "multiplets at 3.67, 2.30, which agree") {
		t.Errorf("envelope excess: %q", rs)
	}
	// The same integrals where the scale is right: nothing to say.
	ev, ms = conflictCase(1, [][]float64{{3, 3}, {2, 2}, {16, 2, 2, 2, 2, 2, 2, 2, 2}}, []float64{3.67, 2.30, 1.30})
	if rs := ev.integralConflicts(ms); len(rs) != 0 {
		t.Errorf("consistent integrals: %q", rs)
	}
	// Two multiplets only: a clean OCH2 (one signal, 2 H) against an
	// envelope of five signals 27 % short.
	ev, ms = conflictCase(11.0/8, [][]float64{{2, 2}, {8, 3, 2, 2, 2, 2}}, []float64{3.64, 1.30})
	if rs := ev.integralConflicts(ms); len(rs) != 1 || !strings.HasPrefix(rs[0], "on the scale of the multiplet at 3.64, the multiplet at 1.30 holds 8.0 H where 11 are expected") {
		t.Errorf("two multiplets, envelope short: %q", rs)
	}
	// Without a conflict, an excess of 4 H (67 %) in one multiplet is
	// named; water in it (CDCl3 water at 1.56, table) excuses up to 3 H.
	ev, ms = conflictCase(1, [][]float64{{3, 3}, {2, 2}, {3, 3}, {10, 2, 2, 2}}, []float64{3.67, 2.30, 0.88, 1.30})
	if rs := ev.integralConflicts(ms); len(rs) != 1 || !strings.Contains(rs[0], "the multiplet at 1.30 holds 10.0 H where 6 are expected") {
		t.Errorf("excess on the fitted scale: %q", rs)
	}
	ev, ms = conflictCase(1, [][]float64{{3, 3}, {2, 2}, {3, 3}, {8.5, 2, 2, 2}}, []float64{3.67, 2.30, 0.88, 1.55})
	if rs := ev.integralConflicts(ms); len(rs) != 0 {
		t.Errorf("excess of 2.5 H under the water line: %q", rs)
	}
	// Water excuses at most waterExcuseH (3 H): 4 H more is named.
	ev, ms = conflictCase(1, [][]float64{{3, 3}, {2, 2}, {3, 3}, {10, 2, 2, 2}}, []float64{3.67, 2.30, 0.88, 1.55})
	if rs := ev.integralConflicts(ms); len(rs) != 1 {
		t.Errorf("excess of 4 H under the water line: %q", rs)
	}
	// An excess of 1.5 H stays below offH.
	ev, ms = conflictCase(1, [][]float64{{3, 3}, {2, 2}, {3, 3}, {3.5, 2}}, []float64{3.67, 2.30, 0.88, 1.30})
	if rs := ev.integralConflicts(ms); len(rs) != 0 {
		t.Errorf("small excess: %q", rs)
	}
}
