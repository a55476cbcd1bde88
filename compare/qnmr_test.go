package compare

import (
	"math"
	"testing"
)

// No published worked example with all stated numbers could be retrieved
// for this project (searched: qNMR guideline worked examples, BIPM ISRD
// reports); this is an arithmetic check of the qNMR equation with numbers
// computed by hand, said honestly. The equation itself is the standard
// internal-standard qNMR equation (e.g. BIPM ISRD reports, §1; form recalled
// from memory).
func TestQNMRHandComputed(t *testing.T) {
	t.Parallel()
	// Analyte: 4-bromobenzaldehyde-like M_a = 185.02 g/mol, 1 H integrated;
	// standard: maleic acid M = 116.07 g/mol, 2 H (value from memory).
	// I_a/I_std = 0.5000, N_std/N_a = 2, M_a/M_std = 185.02/116.07,
	// m_std/m_a = 5.00/10.00, P_std = 99.90 %.
	// By hand: 0.5·2 = 1; 185.02/116.07 = 1.594038...; ·0.5 = 0.797019...;
	// ·99.90 = 79.6222... %.
	q := QNMR{IntegralAnalyte: 0.5, IntegralStandard: 1, NAnalyte: 1, NStandard: 2,
		MAnalyte: 185.02, MStandard: 116.07, MassAnalyteMg: 10, MassStandardMg: 5, PurityStandard: 99.9}
	p, err := QNMRPurity(q)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(p-79.6222) > 5e-4 {
		t.Errorf("purity %.4f, want 79.6222 (hand-computed)", p)
	}
	// Uncertainty by hand: relative terms 0.01, 0.01, 0.01/10 = 0.001,
	// 0.01/5 = 0.002, 0.1/99.9 = 0.001001; sum of squares
	// 1e-4+1e-4+1e-6+4e-6+1.002e-6 = 2.06002e-4; sqrt = 0.0143528;
	// ×79.6222 = 1.14280.
	u, err := QNMRUncertainty(q, 0.01, 0.01, 0.01, 0.1)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(u-1.1428) > 5e-4 {
		t.Errorf("uncertainty %.4f, want 1.1428 (hand-computed)", u)
	}
	// Invariance: doubling both masses leaves the purity unchanged (the
	// equation depends on their ratio; mathematical identity).
	q2 := q
	q2.MassAnalyteMg, q2.MassStandardMg = 20, 10
	if p2, _ := QNMRPurity(q2); math.Abs(p2-p) > 1e-12 {
		t.Errorf("mass scaling changed purity: %g vs %g", p2, p)
	}
	for _, bad := range []func(*QNMR){
		func(q *QNMR) { q.NAnalyte = 0 },
		func(q *QNMR) { q.MassAnalyteMg = -1 },
		func(q *QNMR) { q.IntegralStandard = 0 },
		func(q *QNMR) { q.MAnalyte = math.NaN() },
	} {
		qq := q
		bad(&qq)
		if _, err := QNMRPurity(qq); err == nil {
			t.Errorf("no error for %+v", qq)
		}
	}
}
