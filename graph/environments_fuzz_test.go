package graph_test

import (
	"slices"
	"testing"

	"shiftwise/graph"
	"shiftwise/smiles"
)

// checkEnvironmentInvariants verifies what every result of Environments
// must satisfy, whatever the molecule (common practice, no source: these
// follow from the contract in DEVELOPERS.md).
func checkEnvironmentInvariants(t *testing.T, src string, m *graph.Mol) {
	t.Helper()
	envs := m.Environments()
	total := 0
	for _, a := range m.Atoms {
		total += a.HCount()
	}
	seen := map[graph.Proton]bool{}
	var vinyl []graph.Proton
	sum := 0
	var prev graph.Proton
	for k, e := range envs {
		if e.NH != len(e.Protons) || e.NH == 0 {
			t.Fatalf("%q set %s: NH %d with %d protons", src, e.Label, e.NH, len(e.Protons))
		}
		if !slices.IsSorted(e.Atoms) || e.Kind == "" {
			t.Fatalf("%q set %s: atoms %v kind %q", src, e.Label, e.Atoms, e.Kind)
		}
		first := e.Protons[0]
		if k > 0 && (first.Atom < prev.Atom || (first.Atom == prev.Atom && first.Index <= prev.Index)) {
			t.Fatalf("%q: set %s not in order of first proton", src, e.Label)
		}
		prev = first
		for _, p := range e.Protons {
			if p.Atom < 0 || p.Atom >= len(m.Atoms) || p.Index < 0 || p.Index >= m.Atoms[p.Atom].HCount() || seen[p] {
				t.Fatalf("%q set %s: bad or repeated proton %+v", src, e.Label, p)
			}
			if !slices.Contains(e.Atoms, p.Atom) {
				t.Fatalf("%q set %s: proton %+v not on a listed atom", src, e.Label, p)
			}
			seen[p] = true
			if v, ok := m.AlkeneView(p); ok {
				if v.Gem >= len(m.Atoms) || v.Cis >= len(m.Atoms) || v.Trans >= len(m.Atoms) {
					t.Fatalf("%q: AlkeneView(%+v) = %+v out of range", src, p, v)
				}
				vinyl = append(vinyl, p)
			}
		}
		sum += e.NH
	}
	if sum != total {
		t.Fatalf("%q: sets hold %d H, molecule has %d", src, sum, total)
	}
	for _, p := range vinyl {
		for _, q := range vinyl {
			if r1, r2 := m.ProtonRelation(p, q), m.ProtonRelation(q, p); r1 != r2 {
				t.Fatalf("%q: ProtonRelation not symmetric for %+v, %+v: %v, %v", src, p, q, r1, r2)
			}
		}
	}
}

// Invariants over the whole corpus.
func TestEnvironmentInvariantsCorpus(t *testing.T) {
	t.Parallel()
	for _, e := range readCorpus(t) {
		checkEnvironmentInvariants(t, e.smi, mustParse(t, e.smi))
	}
}

// FuzzEnvironments feeds whatever the SMILES parser accepts to the
// environment code: it must not panic and must keep its invariants.
func FuzzEnvironments(f *testing.F) {
	for _, s := range []string{
		"CC(=O)Oc1ccccc1C(=O)O", "C=Cc1ccccc1", "C/C=C/C=C\\C", "CC(C)[C@H](N)C(=O)O",
		"CN(C)C=O", "CC1(C)CCCC(C)C1", "[H][H]", "*C=C*", "C=C=C", "[CH2]=[CH2]",
		"C1=CC=CC=CC=C1", "F/C=C/F", "C(/F)=C/F", "[2H]C=C", "CC(=O)[O-].[Na+]",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		m, err := smiles.Parse(s)
		if err != nil || len(m.Atoms) > 200 {
			return
		}
		_ = m.SymmetryClasses()
		checkEnvironmentInvariants(t, s, m)
	})
}
