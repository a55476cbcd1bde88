package smiles

import (
	"testing"

	"shiftwise/graph"
)

// checkInvariants is a graph conformance check in the style of gonum's
// testgraph: symmetric adjacency, degree sum equal to twice the bond count,
// non-negative hydrogens, Kekulé orders 1–4, aromatic bonds only between
// aromatic atoms, atom positions inside the source (common practice, no
// source).
func checkInvariants(t *testing.T, src string, m *graph.Mol) {
	t.Helper()
	deg := 0
	for a := range m.Atoms {
		at := &m.Atoms[a]
		if at.ImplicitH < 0 || at.ExplicitH < 0 {
			t.Fatalf("%q: atom %d has negative H", src, a)
		}
		if at.Pos < 0 || at.Pos >= len(src) {
			t.Fatalf("%q: atom %d position %d outside the string", src, a, at.Pos)
		}
		deg += m.Degree(a)
		for _, nb := range m.Neighbors(a) {
			if m.BondBetween(nb, a) < 0 {
				t.Fatalf("%q: adjacency not symmetric at %d-%d", src, a, nb)
			}
		}
	}
	if deg != 2*len(m.Bonds) {
		t.Fatalf("%q: degree sum %d, bonds %d", src, deg, len(m.Bonds))
	}
	for bi, b := range m.Bonds {
		if b.Order < 1 || b.Order > 4 {
			t.Fatalf("%q: bond %d order %d", src, bi, b.Order)
		}
		if b.Aromatic && (!m.Atoms[b.A].Aromatic || !m.Atoms[b.B].Aromatic) {
			t.Fatalf("%q: aromatic bond %d between non-aromatic atoms", src, bi)
		}
		if b.Aromatic && !m.BondInRing(bi) {
			t.Fatalf("%q: aromatic bond %d not in a ring", src, bi)
		}
	}
	for _, r := range m.Rings() {
		for i, a := range r {
			if m.BondBetween(a, r[(i+1)%len(r)]) < 0 {
				t.Fatalf("%q: ring %v is not a cycle", src, r)
			}
		}
	}
}

// Property: the invariants hold for every valid example.
func TestInvariants(t *testing.T) {
	t.Parallel()
	all := append([]string{atorvastatin, imatinib}, valids...)
	for _, tc := range specValid {
		all = append(all, tc.smiles)
	}
	for _, s := range all {
		m, err := Parse(s)
		if err != nil {
			t.Errorf("Parse(%q): %v", s, err)
			continue
		}
		checkInvariants(t, s, m)
	}
}
