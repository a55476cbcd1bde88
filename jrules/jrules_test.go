package jrules

import (
	"math"
	"testing"

	"shiftwise/graph"
	"shiftwise/smiles"
)

func parse(t *testing.T, s string) *graph.Mol {
	t.Helper()
	m, err := smiles.Parse(s)
	if err != nil {
		t.Fatalf("parse %q: %v", s, err)
	}
	return m
}

// h returns the first proton on atom a.
func h(a int) graph.Proton { return graph.Proton{Atom: a} }

// Marker indices for the proton of a =CH2 that is cis or trans to q.
const (
	idxCis   = -1
	idxTrans = -2
)

func cis(a int) graph.Proton   { return graph.Proton{Atom: a, Index: idxCis} }
func trans(a int) graph.Proton { return graph.Proton{Atom: a, Index: idxTrans} }

// pick resolves a cis/trans marker into the proton of p.Atom that stands in
// that relation to q (by the graph's alkene geometry).
func pick(t *testing.T, m *graph.Mol, p, q graph.Proton) graph.Proton {
	t.Helper()
	if p.Index >= 0 {
		return p
	}
	want := graph.RelCis
	if p.Index == idxTrans {
		want = graph.RelTrans
	}
	for i := 0; i < m.Atoms[p.Atom].HCount(); i++ {
		c := graph.Proton{Atom: p.Atom, Index: i}
		if m.ProtonRelation(c, q) == want {
			return c
		}
	}
	t.Fatalf("no proton on atom %d is %v to %+v", p.Atom, want, q)
	return p
}

func TestCommonRanges(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name            string
		smi             string
		p, q            graph.Proton
		lo, hi          float64 // where Typical must lie
		rangeLo, rangeH float64 // Min ≥ rangeLo, Max ≤ rangeH
		nb              int
	}{
		// Common practice, no source: trans vinyl 12–18 Hz, typically about 16–17.
		{"trans vinyl", `C/C=C/C(=O)OC`, h(1), h(2), 15, 17.5, 11, 19, 3},
		// Common practice, no source: cis vinyl 6–12 Hz, typically about 10.
		{"cis vinyl", `C/C=C\C(=O)OC`, h(1), h(2), 8.5, 11.5, 5, 13, 3},
		// Common practice, no source: freely rotating vicinal about 7 Hz.
		{"vicinal ethyl ester", `CCOC(C)=O`, h(0), h(1), 6.5, 7.5, 5, 9, 3},
		{"vicinal propyl", `CCCC(=O)O`, h(0), h(1), 6.5, 8, 5, 9, 3},
		// Common practice, no source: aromatic ortho 7–9, meta 1–3, para < 1.
		{"ortho", `Clc1ccccc1`, h(2), h(3), 7, 9, 6.5, 9.5, 3},
		{"meta", `Clc1ccccc1`, h(2), h(4), 1, 3, 0.5, 3.5, 4},
		{"para", `Clc1ccccc1`, h(2), h(5), 0, 1, 0, 1.2, 5},
		// Common practice, no source: sp3 geminal −12 to −15 Hz, =CH2 0–3 Hz.
		{"geminal sp3", `CCC`, graph.Proton{Atom: 1, Index: 0}, graph.Proton{Atom: 1, Index: 1}, -15, -12, -16, -10, 2},
		{"geminal =CH2", `C=CC`, graph.Proton{Atom: 0, Index: 0}, graph.Proton{Atom: 0, Index: 1}, 0, 3, -1, 3.5, 2},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := parse(t, tc.smi)
			j, ok := Between(m, tc.p, tc.q)
			if !ok {
				t.Fatalf("no coupling")
			}
			if j.Typical < tc.lo || j.Typical > tc.hi || j.Min < tc.rangeLo || j.Max > tc.rangeH || j.NBonds != tc.nb {
				t.Errorf("J = %+v, want typical in [%g, %g], range within [%g, %g], %d bonds",
					j, tc.lo, tc.hi, tc.rangeLo, tc.rangeH, tc.nb)
			}
			if j.Min > j.Typical || j.Max < j.Typical {
				t.Errorf("typical %g outside its own range [%g, %g]", j.Typical, j.Min, j.Max)
			}
		})
	}
}

// TestHandbookValues compares with measured couplings of specific compounds.
func TestHandbookValues(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name string
		smi  string
		p, q graph.Proton
		want float64 // measured
		tol  float64
	}{
		// Styrene: J(trans) 17.6, J(cis) 10.9, J(gem) 1.0 Hz (Pretsch, 1H
		// coupling tables; value from memory).
		{"styrene trans", `C=Cc1ccccc1`, trans(0), h(1), 17.6, 0.6},
		{"styrene cis", `C=Cc1ccccc1`, cis(0), h(1), 10.9, 0.6},
		// trans-ethyl cinnamate: 16.0 Hz (SDBS-type literature value; value from memory).
		{"ethyl cinnamate", `CCOC(=O)/C=C/c1ccccc1`, h(5), h(6), 16.0, 1.0},
		// Vinyl acetate: cis 6.3, trans 14.0 (Pretsch; value from memory).
		{"vinyl acetate trans", `C=COC(C)=O`, trans(0), h(1), 14.0, 0.6},
		{"vinyl acetate cis", `C=COC(C)=O`, cis(0), h(1), 6.3, 0.6},
		// Pyridine J23 4.9, J34 7.7, J24 1.8 (Pretsch; value from memory).
		{"pyridine J23", `c1ccncc1`, h(2), h(1), 4.9, 0.3},
		{"pyridine J34", `c1ccncc1`, h(1), h(0), 7.7, 0.3},
		{"pyridine J24", `c1ccncc1`, h(2), h(0), 1.8, 0.3},
		// Furan J23 1.8, J34 3.4; thiophene J23 4.9, J34 3.5 (Pretsch; value from memory).
		{"furan J23", `c1ccoc1`, h(4), h(0), 1.8, 0.3},
		{"furan J34", `c1ccoc1`, h(0), h(1), 3.4, 0.3},
		{"thiophene J23", `c1ccsc1`, h(4), h(0), 4.9, 0.3},
		{"thiophene J34", `c1ccsc1`, h(0), h(1), 3.5, 0.3},
		// Acetaldehyde CH3–CHO 2.9 Hz; crotonaldehyde CHO–CH= 7.8 Hz
		// (Pretsch; value from memory).
		{"acetaldehyde", `CC=O`, h(0), h(1), 2.9, 1.0},
		{"crotonaldehyde", `C/C=C/C=O`, h(2), h(3), 7.8, 0.6},
		// Ethanol CH3–CH2 7.0 Hz (common practice, no source).
		{"ethanol", `CCO`, h(0), h(1), 7.0, 0.4},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := parse(t, tc.smi)
			p := pick(t, m, tc.p, tc.q)
			j, ok := Between(m, p, tc.q)
			if !ok {
				t.Fatalf("no coupling")
			}
			if math.Abs(j.Typical-tc.want) > tc.tol {
				t.Errorf("J = %.2f (%s), want %.2f ± %.2f", j.Typical, j.Rule, tc.want, tc.tol)
			}
			if tc.want < j.Min || tc.want > j.Max {
				t.Errorf("measured %.2f outside predicted range [%.2f, %.2f] (%s)", tc.want, j.Min, j.Max, j.Rule)
			}
		})
	}
}

func TestHetero(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name    string
		smi     string
		p       graph.Proton
		atom    int
		want    float64
		tol     float64
		nb      int
		present bool
	}{
		// Fluorobenzene: ortho 9.1, meta 5.7, para 0.2 Hz (Pretsch; value from memory).
		{"PhF ortho", `Fc1ccccc1`, h(2), 0, 9.1, 1.0, 3, true},
		{"PhF meta", `Fc1ccccc1`, h(3), 0, 5.7, 1.0, 4, true},
		{"PhF para", `Fc1ccccc1`, h(4), 0, 0.2, 0.5, 5, true},
		// Fluoromethane-type CH2F ²J about 47 Hz (common practice, no source).
		{"CH2F gem", `FCC`, h(1), 0, 47, 2, 2, true},
		// Dimethyl methylphosphonate ²J(P,H) 17.6 Hz (Pretsch; value from memory).
		{"DMMP P-CH3", `CP(=O)(OC)OC`, h(0), 1, 17.6, 1.5, 2, true},
		// Triethyl phosphate ³J(P,OCH2) about 8 Hz (Pretsch; value from memory).
		{"TEP OCH2", `CCOP(=O)(OCC)OCC`, h(1), 3, 8, 1.0, 3, true},
		{"chlorine is no partner", `ClCC`, h(1), 0, 0, 0, 0, false},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := parse(t, tc.smi)
			j, ok := ToHetero(m, tc.p, tc.atom)
			if ok != tc.present {
				t.Fatalf("ok = %v, want %v", ok, tc.present)
			}
			if !ok {
				return
			}
			if math.Abs(j.Typical-tc.want) > tc.tol || j.NBonds != tc.nb {
				t.Errorf("J = %+v, want %.1f ± %.1f over %d bonds", j, tc.want, tc.tol, tc.nb)
			}
		})
	}
}

func TestExchangeable(t *testing.T) {
	t.Parallel()
	m := parse(t, `CCO`)
	// Common practice, no source: the ethanol OH is a singlet in CDCl3 (fast
	// exchange) but a triplet (~5 Hz) in dry DMSO-d6.
	if _, ok := BetweenIn(m, h(1), h(2), "CDCl3"); ok {
		t.Error("OH coupling reported in CDCl3")
	}
	j, ok := BetweenIn(m, h(1), h(2), "DMSO-d6")
	if !ok || j.Typical < 4 || j.Typical > 6 {
		t.Errorf("DMSO-d6: J = %+v, ok %v; want about 5 Hz", j, ok)
	}
	if _, ok := BetweenIn(m, h(1), h(2), "D2O"); ok {
		t.Error("OD coupling reported in D2O")
	}
	a := parse(t, `CC(=O)NC`)
	// Common practice, no source: an amide NH–CH3 is a doublet (~5 Hz) in CDCl3.
	if _, ok := Between(a, h(3), h(4)); !ok {
		t.Error("amide NH coupling missing in CDCl3")
	}
}

func TestKarplus(t *testing.T) {
	t.Parallel()
	// Karplus curve shape (Karplus, J. Chem. Phys. 30, 11 (1959)):
	// maximum at 180°, a lower maximum at 0°, minimum near 90°.
	if !(Karplus(180) > Karplus(0) && Karplus(0) > Karplus(60) && Karplus(60) > Karplus(90)) {
		t.Errorf("Karplus shape wrong: J(0)=%.2f J(60)=%.2f J(90)=%.2f J(180)=%.2f",
			Karplus(0), Karplus(60), Karplus(90), Karplus(180))
	}
	// Common practice, no source: cyclohexane J(ax,ax) 10–13 Hz, J(ax,eq) 2–5 Hz.
	if aa := Karplus(180); aa < 9.5 || aa > 13 {
		t.Errorf("J(180) = %.2f, want 10–13", aa)
	}
	if ae := Karplus(60); ae < 2 || ae > 5 {
		t.Errorf("J(60) = %.2f, want 2–5", ae)
	}
}

func TestLimits(t *testing.T) {
	t.Parallel()
	m := parse(t, `CCCCCCC`)
	if _, ok := Between(m, h(0), h(0)); ok {
		t.Error("a proton coupled to itself")
	}
	if _, ok := Between(m, h(0), h(5)); ok {
		t.Error("coupling over 7 bonds reported")
	}
	if j, ok := Between(m, h(0), h(3)); !ok || j.NBonds != 5 || math.Abs(j.Typical) > 1 {
		t.Errorf("5J sp3 = %+v, %v; want small, 5 bonds", j, ok)
	}
}
