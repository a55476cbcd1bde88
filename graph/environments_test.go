package graph

import (
	"math/rand/v2"
	"slices"
	"testing"
)

// envSizes returns the sizes (NH) of the proton sets, sorted descending.
func envSizes(envs []Environment) []int {
	var out []int
	for _, e := range envs {
		out = append(out, e.NH)
	}
	slices.Sort(out)
	slices.Reverse(out)
	return out
}

// The counts of chemically distinct 1H environments below are textbook
// facts (common practice, no source; the numbers of signals of these
// compounds are standard first-course NMR examples, e.g. Pavia, Lampman,
// Kriz & Vyvyan, Introduction to Spectroscopy, ch. 5 — from memory).
func TestEnvironmentCounts(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name, smi string
		sizes     []int // NH per set, descending
	}{
		{"benzene", "c1ccccc1", []int{6}},
		{"toluene", "Cc1ccccc1", []int{3, 2, 2, 1}},
		{"propene: =CH2 pair split", "C=CC", []int{3, 1, 1, 1}},
		{"2-chlorobutane: diastereotopic CH2", "CC(Cl)CC", []int{3, 3, 1, 1, 1}},
		{"para-xylene", "Cc1ccc(C)cc1", []int{6, 4}},
		{"4-chloroanisole", "COc1ccc(Cl)cc1", []int{3, 2, 2}},
		{"ethyl acetate", "CC(=O)OCC", []int{3, 3, 2}},
		{"ethanol", "CCO", []int{3, 2, 1}},
		{"styrene: =CH2 pair split", "C=Cc1ccccc1", []int{2, 2, 1, 1, 1, 1}},
		{"isobutene: =CH2 not split", "C=C(C)C", []int{6, 2}},
		{"cyclohexane", "C1CCCCC1", []int{12}},
		{"cyclohexanone", "O=C1CCCCC1", []int{4, 4, 2}},
		{"methylcyclohexane: ring CH2 split by faces", "CC1CCCCC1", []int{3, 2, 2, 2, 2, 1, 1, 1}},
		{"diethyl ether", "CCOCC", []int{6, 4}},
		{"acetaldehyde", "CC=O", []int{3, 1}},
		{"acetic acid", "CC(=O)O", []int{3, 1}},
		{"(E)-but-2-enoic acid", "C/C=C/C(=O)O", []int{3, 1, 1, 1}},
		{"(2E,4Z)-hexa-2,4-diene: ends differ", "C/C=C/C=C\\C", []int{3, 3, 1, 1, 1, 1}},
		{"(2E,4E)-hexa-2,4-diene: ends alike", "C/C=C/C=C/C", []int{6, 2, 2}},
		{"pyridine", "c1ccncc1", []int{2, 2, 1}},
		{"pyrrole", "c1cc[nH]c1", []int{2, 2, 1}},
		{"methylammonium", "C[NH3+]", []int{3, 3}},
		// Slow amide C–N rotation: DMF shows two N-CH3 singlets (Gottlieb,
		// Kotlyar & Nudelman, J. Org. Chem. 1997, 62, 7512, Table 1: DMF
		// CH3 at 2.88 and 2.96 ppm in CDCl3, from memory).
		{"DMF: two N-CH3", "CN(C)C=O", []int{3, 3, 1}},
		{"N,N-diethylformamide", "CCN(CC)C=O", []int{3, 3, 2, 2, 1}},
		{"acetamide: two NH", "CC(N)=O", []int{3, 1, 1}},
		{"tetramethylurea: not split", "CN(C)C(=O)N(C)C", []int{12}},
		// Diastereotopic isopropyl CH3 next to a stereocentre: L-valine and
		// L-leucine show two CH3 doublets (common practice, no source).
		{"L-valine", "CC(C)[C@H](N)C(=O)O", []int{3, 3, 2, 1, 1, 1}},
		{"L-leucine", "CC(C)C[C@H](N)C(=O)O", []int{3, 3, 2, 1, 1, 1, 1, 1}},
		{"tert-leucine: t-Bu not split", "CC(C)(C)[C@H](N)C(=O)O", []int{9, 2, 1, 1}},
		{"isobutanol: achiral, CH3 alike", "CC(C)CO", []int{6, 2, 1, 1}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := handMol(t, tc.smi)
			got := envSizes(m.Environments())
			if !slices.Equal(got, tc.sizes) {
				t.Errorf("%s: set sizes %v, want %v", tc.smi, got, tc.sizes)
			}
		})
	}
}

// envByAtom returns the set holding proton (a, i).
func envByAtom(envs []Environment, a, i int) *Environment {
	for k := range envs {
		if slices.Contains(envs[k].Protons, Proton{a, i}) {
			return &envs[k]
		}
	}
	return nil
}

func TestEnvironmentFlags(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name, smi string
		atom      int
		kind      string
		exch, mag bool
	}{
		// AA'BB': the ring H of a para-disubstituted benzene with two
		// different groups are chemically but not magnetically equivalent
		// (common practice, no source; a standard example of second-order
		// spectra, e.g. Pavia et al., ch. 7, from memory).
		{"4-chloroanisole H2/H6", "COc1ccc(Cl)cc1", 3, "ArH", false, false},
		{"4-chloroanisole H3/H5", "COc1ccc(Cl)cc1", 4, "ArH", false, false},
		{"o-dichlorobenzene", "Clc1ccccc1Cl", 2, "ArH", false, false},
		// Benzene's six H and the CH2/CH3 of a freely rotating ethyl group
		// are magnetically equivalent (common practice, no source).
		{"benzene", "c1ccccc1", 0, "ArH", false, true},
		{"ethyl CH2", "CCOC(C)=O", 1, "CH2", false, true},
		{"ethyl CH3", "CCOC(C)=O", 0, "CH3", false, true},
		{"p-xylene ring H", "Cc1ccc(C)cc1", 2, "ArH", false, true},
		{"1,4-difluorobenzene (H-F couplings differ)", "Fc1ccc(F)cc1", 2, "ArH", false, false},
		{"aldehyde", "CC=O", 1, "CHO", false, true},
		{"carboxylic acid", "CC(=O)O", 3, "COOH", true, true},
		{"alcohol", "CCO", 2, "OH", true, true},
		{"amine", "CCN", 2, "NH2", true, true},
		{"ammonium", "C[NH3+]", 1, "NH3+", true, true},
		{"thiol", "CCS", 2, "SH", true, true},
		{"alkyne", "CC#C", 2, "≡CH", false, true},
		{"vinyl", "C=CC", 1, "=CH", false, true},
		{"terminal vinyl", "C=CC", 0, "=CH2", false, true},
		{"pyrrole NH", "c1cc[nH]c1", 3, "NH", true, true},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := handMol(t, tc.smi)
			e := envByAtom(m.Environments(), tc.atom, 0)
			if e == nil {
				t.Fatalf("%s: no set for atom %d", tc.smi, tc.atom)
			}
			if e.Kind != tc.kind || e.Exchangeable != tc.exch || e.MagneticallyEquivalent != tc.mag {
				t.Errorf("%s atom %d: kind %q exch %v mag %v, want %q %v %v",
					tc.smi, tc.atom, e.Kind, e.Exchangeable, e.MagneticallyEquivalent, tc.kind, tc.exch, tc.mag)
			}
		})
	}
}

func TestEnvironmentLabelsAndOrder(t *testing.T) {
	t.Parallel()
	m := handMol(t, "CC(=O)Oc1ccccc1C(=O)O") // aspirin
	envs := m.Environments()
	want := []struct {
		label string
		atoms []int
		kind  string
	}{
		{"A", []int{0}, "CH3"},
		{"B", []int{5}, "ArH"},
		{"C", []int{6}, "ArH"},
		{"D", []int{7}, "ArH"},
		{"E", []int{8}, "ArH"},
		{"F", []int{12}, "COOH"},
	}
	if len(envs) != len(want) {
		t.Fatalf("aspirin: %d sets, want %d: %+v", len(envs), len(want), envs)
	}
	for i, w := range want {
		e := envs[i]
		if e.Label != w.label || !slices.Equal(e.Atoms, w.atoms) || e.Kind != w.kind {
			t.Errorf("set %d = %s %v %s, want %s %v %s", i, e.Label, e.Atoms, e.Kind, w.label, w.atoms, w.kind)
		}
	}
	for k, w := range map[int]string{0: "A", 25: "Z", 26: "AA", 27: "AB", 701: "ZZ", 702: "AAA"} {
		if got := envLabel(k); got != w {
			t.Errorf("envLabel(%d) = %q, want %q", k, got, w)
		}
	}
}

// permuted returns a copy of m with atom i moved to perm[i] (bond order and
// bond directions kept as seen from each atom).
func permuted(m *Mol, perm []int) *Mol {
	out := &Mol{}
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

// envPartition maps each environment to a canonical string of its member
// atoms, so that the partitions of two numberings can be compared.
func envPartition(envs []Environment, perm []int) map[string]int {
	out := map[string]int{}
	for _, e := range envs {
		var atoms []int
		for _, p := range e.Protons {
			atoms = append(atoms, perm[p.Atom])
		}
		slices.Sort(atoms)
		key := e.Kind
		for _, a := range atoms {
			key += "," + string(rune('0'+a))
		}
		out[key]++
	}
	return out
}

// Property: environments (as sets of atoms with their sizes and kinds) do
// not depend on the atom numbering (common practice, no source: a graph
// invariant must be invariant under relabelling).
func TestEnvironmentsRenumbering(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(1, 2))
	for _, smi := range []string{
		"COc1ccc(Cl)cc1", "CC(Cl)CC", "C=Cc1ccccc1", "CCOC(=O)/C=C/c1ccccc1",
		"C/C=C/C=C\\C", "CC1CCCCC1", "CC(=O)Oc1ccccc1C(=O)O", "C[C@H](N)C(=O)O",
	} {
		m := handMol(t, smi)
		n := len(m.Atoms)
		id := make([]int, n)
		for i := range id {
			id[i] = i
		}
		want := envPartition(m.Environments(), id)
		for trial := 0; trial < 20; trial++ {
			perm := rng.Perm(n)
			got := envPartition(permuted(m, perm).Environments(), id)
			wantP := envPartition(m.Environments(), perm)
			if len(got) != len(want) || !mapsEqual(got, wantP) {
				t.Fatalf("%s: environments change under renumbering %v:\n got %v\nwant %v", smi, perm, got, wantP)
			}
		}
	}
}

func mapsEqual(a, b map[string]int) bool {
	if len(a) != len(b) {
		return false
	}
	for k, v := range a {
		if b[k] != v {
			return false
		}
	}
	return true
}
