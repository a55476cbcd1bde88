package jrules

import (
	"strings"
	"testing"

	"shiftwise/graph"
)

// TestRulesByTopology checks that each structural relation selects its rule
// and that the value lies in the range the handbooks give for it.
func TestRulesByTopology(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name   string
		smi    string
		p, q   graph.Proton
		rule   string
		lo, hi float64
	}{
		// Pretsch (value from memory): cyclohexene ³J(cis, ring) 8.8–11.
		{"cyclohexene vinyl", `C1=CCCCC1`, h(0), h(1), "cyclohexene", 8.8, 11},
		// Pretsch (value from memory): cyclopentene 5.1–7.0.
		{"cyclopentene vinyl", `C1=CCCC1`, h(0), h(1), "cyclopentene", 5, 7},
		// Common practice, no source: cyclopropane cis 7–10, trans 4–7, so
		// the stereo-blind value lies between.
		{"cyclopropane", `CC1CC1`, h(1), h(2), "cyclopropane", 5, 9},
		// Common practice, no source: allylic ⁴J −1 to −3 Hz.
		{"allylic", `CC=C`, h(0), h(2), "allylic", -3, -1},
		// Pretsch (value from memory): propyne ⁴J −2.9 Hz.
		{"propargylic", `CC#C`, h(0), h(2), "propargylic", -3.5, -2},
		// Pretsch (value from memory): 2-butene ⁵J(CH3,CH3) 1–2 Hz.
		{"homoallylic", `CC=CCC`, h(0), h(3), "homoallylic", 0.5, 3},
		// Pretsch (value from memory): cyclobutane ⁴J 1,3 (W-type) about 1 Hz.
		{"W cyclobutane", `C1CCC1`, h(0), h(2), "W-type", 0, 3},
		// Karplus chair average: between J(60°) and J(180°).
		{"cyclohexane", `C1CCCCC1`, h(0), h(1), "Karplus", 3, 8},
		// Pretsch (value from memory): 1,3-butadiene ³J(H2,H3) 10.4 Hz.
		{"diene single bond", `C=CC=C`, h(1), h(2), "single bond", 9.5, 11.5},
		// Pyridine J26 ≈ 0 (Pretsch; value from memory).
		{"pyridine J26", `c1ccncc1`, h(2), h(4), "J26", -0.5, 0.5},
		// Thiophene J25 2.8 (Pretsch; value from memory).
		{"thiophene J25", `c1ccsc1`, h(2), h(4), "thiophene J25", 2.5, 3.3},
		// Thiol SH–CH ~7.5 Hz, resolved in CDCl3 (ethanethiol; common practice).
		{"thiol", `CCS`, h(1), h(2), "H-C-S-H", 6, 9},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := parse(t, tc.smi)
			j, ok := Between(m, tc.p, tc.q)
			if !ok {
				t.Fatal("no coupling")
			}
			if !strings.Contains(j.Rule, tc.rule) || j.Typical < tc.lo || j.Typical > tc.hi {
				t.Errorf("J = %+v, want rule containing %q with typical in [%g, %g]", j, tc.rule, tc.lo, tc.hi)
			}
		})
	}
}

// TestVinylFluorine: ³J(H,F) across a C=C is about 50 Hz trans and 20 Hz
// cis (vinyl fluoride 52 / 20 Hz, Pretsch; value from memory); ²J(H,F) on
// an sp2 carbon about 80 Hz (vinyl fluoride 85 Hz).
func TestVinylFluorine(t *testing.T) {
	t.Parallel()
	m := parse(t, `C=CF`)
	var cisJ, transJ float64
	for i := 0; i < 2; i++ {
		p := graph.Proton{Atom: 0, Index: i}
		v, ok := m.AlkeneView(p)
		if !ok {
			t.Fatal("no alkene view")
		}
		j, _ := ToHetero(m, p, 2)
		switch 2 {
		case v.Cis:
			cisJ = j.Typical
		case v.Trans:
			transJ = j.Typical
		}
	}
	if cisJ < 12 || cisJ > 25 || transJ < 40 || transJ > 55 {
		t.Errorf("cis %.1f, trans %.1f; want ~20 and ~50", cisJ, transJ)
	}
	if j, ok := ToHetero(m, h(1), 2); !ok || j.Typical < 70 || j.NBonds != 2 {
		t.Errorf("geminal H-F = %+v, want ~80 Hz over 2 bonds", j)
	}
}

// TestVinylGeometryAssumed: without / \ marks the cis/trans relation is
// assumed, and the range must cover both the cis (~10 Hz) and the trans
// (~16 Hz) value of a 1,2-disubstituted alkene (common practice, no source).
func TestVinylGeometryAssumed(t *testing.T) {
	t.Parallel()
	m := parse(t, `CC=CC(=O)OC`)
	j, ok := Between(m, h(1), h(2))
	if !ok || j.Min > 10 || j.Max < 16 || !strings.Contains(j.Rule, "assumed") {
		t.Errorf("J = %+v, want a range covering 10–16 Hz marked as assumed", j)
	}
	m = parse(t, `C/C=C/C(=O)OC`)
	if j, _ := Between(m, h(1), h(2)); j.Min < 12 {
		t.Errorf("written E geometry: J = %+v, want a trans-only range", j)
	}
}
