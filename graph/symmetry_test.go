package graph

import (
	"math/rand/v2"
	"testing"
)

// samePartition reports whether two class vectors induce the same partition.
func samePartition(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	ab, ba := map[int]int{}, map[int]int{}
	for i := range a {
		if x, ok := ab[a[i]]; ok && x != b[i] {
			return false
		}
		if y, ok := ba[b[i]]; ok && y != a[i] {
			return false
		}
		ab[a[i]], ba[b[i]] = b[i], a[i]
	}
	return true
}

// Partitions into topologically equivalent atoms, worked out by hand from
// the structures (common practice, no source).
func TestSymmetryClasses(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name, smi string
		want      []int // any labels; only the partition counts
	}{
		{"benzene", "c1ccccc1", []int{0, 0, 0, 0, 0, 0}},
		{"toluene", "Cc1ccccc1", []int{0, 1, 2, 3, 4, 3, 2}},
		{"p-xylene", "Cc1ccc(C)cc1", []int{0, 1, 2, 2, 1, 0, 2, 2}},
		{"isobutane", "CC(C)C", []int{0, 1, 0, 0}},
		{"ethyl acetate", "CC(=O)OCC", []int{0, 1, 2, 3, 4, 5}},
		{"1,4-dioxane", "C1COCCO1", []int{0, 0, 1, 0, 0, 1}},
		{"pyridine", "c1ccncc1", []int{0, 1, 2, 3, 2, 1}},
		{"acetone", "CC(=O)C", []int{0, 1, 2, 0}},
		{"(E)-but-2-ene: stereo ignored", "C/C=C/C", []int{0, 1, 1, 0}},
		{"2-chlorobutane", "CC(Cl)CC", []int{0, 1, 2, 3, 4}},
		{"propylcyclopropane", "C1CC1CCC", []int{0, 0, 1, 2, 3, 4}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got := handMol(t, tc.smi).SymmetryClasses()
			if !samePartition(got, tc.want) {
				t.Errorf("%s: classes %v, want the partition of %v", tc.smi, got, tc.want)
			}
		})
	}
}

// The classes of a Kekulé-written aromatic ring do not depend on which
// Kekulé structure was chosen, because aromatic bonds share one code.
func TestSymmetryClassesKekuleIndependent(t *testing.T) {
	t.Parallel()
	m := handMol(t, "c1ccccc1")
	for i := range m.Bonds {
		m.Bonds[i].Order = 1 + i%2
	}
	if c := m.SymmetryClasses(); !samePartition(c, []int{0, 0, 0, 0, 0, 0}) {
		t.Errorf("benzene with Kekulé orders: %v", c)
	}
}

// Property: the class values themselves (not only the partition) are the
// same under any renumbering of the atoms (common practice, no source).
func TestSymmetryClassesRenumbering(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(3, 4))
	for _, smi := range []string{"CC(=O)Oc1ccccc1C(=O)O", "COc1ccc(Cl)cc1", "C1CC1CCC", "CC(C)(C)c1ccncc1"} {
		m := handMol(t, smi)
		want := m.SymmetryClasses()
		for trial := 0; trial < 20; trial++ {
			perm := rng.Perm(len(m.Atoms))
			got := permuted(m, perm).SymmetryClasses()
			for i := range want {
				if got[perm[i]] != want[i] {
					t.Fatalf("%s: class of atom %d is %d, %d after renumbering %v", smi, i, want[i], got[perm[i]], perm)
				}
			}
		}
	}
}

func TestSymmetryClassesEmpty(t *testing.T) {
	t.Parallel()
	if c := (&Mol{}).SymmetryClasses(); len(c) != 0 {
		t.Errorf("empty molecule: %v", c)
	}
}

// BenchmarkSymmetryAndEnvironments times symmetry classes plus proton
// environments of a drug-like molecule (atorvastatin skeleton, 41 heavy atoms).
func BenchmarkSymmetryAndEnvironments(b *testing.B) {
	m := handMol(b, "CC(C)c1c(C(=O)Nc2ccccc2)c(c2ccccc2)c(c2ccc(F)cc2)n1CC[C@@H](O)C[C@@H](O)CC(=O)O")
	for b.Loop() {
		_ = m.Environments()
	}
}
