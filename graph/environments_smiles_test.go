package graph_test

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"shiftwise/graph"
	"shiftwise/smiles"
)

func mustParse(t testing.TB, s string) *graph.Mol {
	t.Helper()
	m, err := smiles.Parse(s)
	if err != nil {
		t.Fatalf("%s: %v", s, err)
	}
	return m
}

// signature is a numbering-free description of the environments: one
// "kind/nH/atoms/flags" item per set, sorted.
func signature(envs []graph.Environment) string {
	var s []string
	for _, e := range envs {
		s = append(s, fmt.Sprintf("%s/%d/%d/%v/%v", e.Kind, e.NH, len(e.Atoms), e.Exchangeable, e.MagneticallyEquivalent))
	}
	slices.Sort(s)
	return strings.Join(s, " ")
}

// Textbook environment counts, through the SMILES parser (common practice,
// no source: the numbers of 1H signals of these compounds are standard
// first-course NMR examples, e.g. Pavia, Lampman, Kriz & Vyvyan,
// Introduction to Spectroscopy, ch. 5, from memory).
func TestEnvironmentsTextbook(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name, smi string
		n         int    // number of sets
		sig       string // expected signature, "" to skip
	}{
		{"benzene", "c1ccccc1", 1, "ArH/6/6/false/true"},
		{"toluene", "Cc1ccccc1", 4, ""},
		{"propene (=CH2 pair split)", "C=CC", 4, "=CH/1/1/false/true =CH2/1/1/false/true =CH2/1/1/false/true CH3/3/1/false/true"},
		{"2-chlorobutane (diastereotopic CH2)", "CC(Cl)CC", 5, "CH/1/1/false/true CH2/1/1/false/true CH2/1/1/false/true CH3/3/1/false/true CH3/3/1/false/true"},
		{"para-xylene", "Cc1ccc(C)cc1", 2, "ArH/4/4/false/true CH3/6/2/false/true"},
		// AA'BB': chemically but not magnetically equivalent (common
		// practice, no source).
		{"4-chloroanisole (AA'BB')", "COc1ccc(Cl)cc1", 3, "ArH/2/2/false/false ArH/2/2/false/false CH3/3/1/false/true"},
		{"ethyl acetate", "CCOC(C)=O", 3, "CH2/2/1/false/true CH3/3/1/false/true CH3/3/1/false/true"},
		{"styrene (=CH2 pair split)", "C=Cc1ccccc1", 6, ""},
		{"ethyl cinnamate", "CCOC(=O)/C=C/c1ccccc1", 7, ""},
		{"(E)-but-2-enoic acid", "C/C=C/C(=O)O", 4, ""},
		{"(Z)-but-2-enoic acid", "C/C=C\\C(=O)O", 4, ""},
		{"fluoxetine hydrochloride", "CNCCC(Oc1ccc(cc1)C(F)(F)F)c1ccccc1.Cl", 0, ""},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			envs := mustParse(t, tc.smi).Environments()
			if tc.n > 0 && len(envs) != tc.n {
				t.Errorf("%s: %d sets, want %d: %s", tc.smi, len(envs), tc.n, signature(envs))
			}
			if tc.sig != "" && signature(envs) != tc.sig {
				t.Errorf("%s:\n got %s\nwant %s", tc.smi, signature(envs), tc.sig)
			}
		})
	}
}

// E and Z crotonic acid: the vinyl H are trans (E) or cis (Z) to each
// other; in ethyl cinnamate, written E, the phenyl is cis to the H next to
// the ester (OpenSMILES specification, section 3.5.1, for the reading of /
// and \).
func TestAlkeneGeometryParsed(t *testing.T) {
	t.Parallel()
	e := mustParse(t, "C/C=C/C(=O)O")
	z := mustParse(t, "C/C=C\\C(=O)O")
	h2, h3 := graph.Proton{Atom: 1}, graph.Proton{Atom: 2}
	if r := e.ProtonRelation(h2, h3); r != graph.RelTrans {
		t.Errorf("(E)-but-2-enoic acid: H2/H3 %v, want trans", r)
	}
	if r := z.ProtonRelation(h2, h3); r != graph.RelCis {
		t.Errorf("(Z)-but-2-enoic acid: H2/H3 %v, want cis", r)
	}
	cin := mustParse(t, "CCOC(=O)/C=C/c1ccccc1")
	if v, ok := cin.AlkeneView(graph.Proton{Atom: 5}); !ok || v != (graph.AlkeneView{Gem: 3, Cis: 7, Trans: -1, Known: true}) {
		t.Errorf("ethyl cinnamate H on atom 5: %+v %v", v, ok)
	}
	sty := mustParse(t, "C=Cc1ccccc1")
	if v, ok := sty.AlkeneView(graph.Proton{Atom: 0, Index: 1}); !ok || v.Trans != 2 || v.Cis != -1 {
		t.Errorf("styrene =CH2 H1: %+v %v, want trans to the ring atom 2", v, ok)
	}
	if v, _ := mustParse(t, "CC=CC(=O)O").AlkeneView(h2); v.Known {
		t.Errorf("unwritten geometry reported as known: %+v", v)
	}
}

// Property: the same molecule written in different ways gives the same
// environments (common practice, no source).
func TestEnvironmentsSMILESWriting(t *testing.T) {
	t.Parallel()
	for _, pair := range [][2]string{
		{"CC(=O)Oc1ccccc1C(=O)O", "OC(=O)c1ccccc1OC(C)=O"},
		{"COc1ccc(Cl)cc1", "Clc1ccc(OC)cc1"},
		{"CC(Cl)CC", "CCC(C)Cl"},
		{"C=Cc1ccccc1", "c1ccc(cc1)C=C"},
		{"CCOC(=O)/C=C/c1ccccc1", "c1ccc(cc1)/C=C/C(=O)OCC"},
		{"C/C=C\\C(=O)O", "OC(=O)/C=C\\C"},
		{"CN(C)C=O", "O=CN(C)C"},
		{"CC(C)[C@H](N)C(=O)O", "OC(=O)[C@@H](N)C(C)C"},
		{"CC1CCCCC1", "C1CCC(C)CC1"},
		{"CN(C)C(=O)c1ccc(cc1)C(=O)N(C)C", "O=C(N(C)C)c1ccc(C(=O)N(C)C)cc1"},
	} {
		a, b := signature(mustParse(t, pair[0]).Environments()), signature(mustParse(t, pair[1]).Environments())
		if a != b {
			t.Errorf("%s and %s differ:\n %s\n %s", pair[0], pair[1], a, b)
		}
	}
}

// shuffled returns a copy of m with the atoms in the order perm (atom i
// becomes perm[i]); bonds keep their direction marks as seen from A to B.
func shuffled(m *graph.Mol, perm []int) *graph.Mol {
	out := &graph.Mol{}
	inv := make([]int, len(perm))
	for i, p := range perm {
		inv[p] = i
	}
	for _, old := range inv {
		out.AddAtom(m.Atoms[old])
	}
	for _, b := range m.Bonds {
		b.A, b.B = perm[b.A], perm[b.B]
		out.AddBond(b)
	}
	return out
}

// classPartition describes each environment by its kind, flag and the
// sorted symmetry classes of its atoms (one entry per proton). Class values
// do not depend on atom numbering (TestSymmetryClassesRenumbering), so this
// description must not either. It does not look at which atom of a class
// went to which set: where NMR-distinct groups are related by symmetry (the
// =C(CH3)2 ends of squalene, the amides of a symmetric bis-amide) that
// choice cannot be read from a SMILES and follows atom order.
func classPartition(m *graph.Mol) []string {
	cls := m.SymmetryClasses()
	var out []string
	for _, e := range m.Environments() {
		var c []int
		for _, p := range e.Protons {
			c = append(c, cls[p.Atom])
		}
		slices.Sort(c)
		out = append(out, fmt.Sprintf("%s%v%v", e.Kind, c, e.MagneticallyEquivalent))
	}
	slices.Sort(out)
	return out
}

// Property over the whole corpus: environments do not change when the
// atoms are renumbered at random (common practice, no source: a graph
// invariant).
func TestEnvironmentsRandomOrderCorpus(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(7, 11))
	for _, e := range readCorpus(t) {
		m := mustParse(t, e.smi)
		want := classPartition(m)
		for trial := 0; trial < 2; trial++ {
			got := classPartition(shuffled(m, rng.Perm(len(m.Atoms))))
			if !slices.Equal(got, want) {
				t.Errorf("%s:%d %s: environments change under renumbering\n got %v\nwant %v", corpusPath, e.line, e.smi, got, want)
				break
			}
		}
	}
}

// BenchmarkEnvironments times Environments on atorvastatin (41 heavy atoms),
// parsed once.
func BenchmarkEnvironments(b *testing.B) {
	m := mustParse(b, "CC(C)c1c(C(=O)Nc2ccccc2)c(-c2ccccc2)c(-c2ccc(F)cc2)n1CC[C@@H](O)C[C@@H](O)CC(=O)O")
	for b.Loop() {
		_ = m.Environments()
	}
}
