package graph_test

import (
	"errors"
	"math"
	"slices"
	"testing"

	"shiftwise/graph"
	"shiftwise/smiles"
)

func parsePerceived(t *testing.T, s string) *graph.Mol {
	t.Helper()
	m, err := smiles.Parse(s)
	if err != nil {
		t.Fatalf("Parse(%q): %v", s, err)
	}
	return m
}

// Molecular weights from the IUPAC 2021 abridged standard atomic weights
// (C 12.011, H 1.008, N 14.007, O 15.999, Na 22.990, Cl 35.45), summed by
// hand; monoisotopic masses from the AME2020 masses of 1H 1.00782503207,
// 12C 12, 14N 14.00307400443, 16O 15.99491461957, 23Na 22.9897692820,
// 35Cl 34.968852682, 13C 13.00335483507 (see elements.go).
func TestMasses(t *testing.T) {
	t.Parallel()
	const tolAvg, tolMono = 1e-3, 1e-6
	for _, tc := range []struct {
		name, smiles, formula string
		avg, mono             float64
	}{
		// 9×12.011 + 8×1.008 + 4×15.999 = 108.099 + 8.064 + 63.996 = 180.159 (listed 180.16)
		// 9×12 + 8×1.00782503207 + 4×15.99491461957 = 180.04225873
		{"aspirin", "CC(=O)Oc1ccccc1C(=O)O", "C9H8O4", 180.159, 180.04225873},
		// 8×12.011 + 10×1.008 + 4×14.007 + 2×15.999 = 96.088 + 10.080 + 56.028 + 31.998 = 194.194
		// 96 + 10.0782503207 + 56.01229601772 + 31.98982923914 = 194.08037558
		{"caffeine", "Cn1cnc2c1c(=O)n(C)c(=O)n2C", "C8H10N4O2", 194.194, 194.08037558},
		// 22.990 + 35.45 = 58.440; 22.9897692820 + 34.968852682 = 57.958621964
		{"sodium chloride", "[Na+].[Cl-]", "ClNa", 58.440, 57.958621964},
		// 2×12.011 + 3×1.008 + 22.990 + 2×15.999 = 24.022 + 3.024 + 22.990 + 31.998 = 82.034
		// 24 + 3.02347509621 + 22.9897692820 + 31.98982923914 = 82.00307362
		{"sodium acetate", "CC(=O)[O-].[Na+]", "C2H3NaO2", 82.034, 82.00307362},
		// 6×12.011 + 16×1.008 + 35.45 + 14.007 = 72.066 + 16.128 + 35.45 + 14.007 = 137.651
		// 72 + 16.12520051312 + 34.968852682 + 14.00307400443 = 137.09712720
		{"triethylamine hydrochloride", "CCN(CC)CC.Cl", "C6H16ClN", 137.651, 137.09712720},
		// 2×1.008 + 15.999 = 18.015; 2.01565006414 + 15.99491461957 = 18.01056468
		{"water", "O", "H2O", 18.015, 18.01056468},
		// labelled: 13.00335483507 + 4×1.008 = 17.03535484; + 4×1.00782503207 = 17.03465496
		{"13C-methane", "[13CH4]", "CH4", 17.03535484, 17.03465496},
	} {
		m := parsePerceived(t, tc.smiles)
		if got := m.Formula(); got != tc.formula {
			t.Errorf("%s: formula %s, want %s", tc.name, got, tc.formula)
		}
		if got := m.AverageMass(); math.Abs(got-tc.avg) > tolAvg {
			t.Errorf("%s: average mass %.4f, want %.4f", tc.name, got, tc.avg)
		}
		if got := m.MonoisotopicMass(); math.Abs(got-tc.mono) > tolMono {
			t.Errorf("%s: monoisotopic mass %.8f, want %.8f", tc.name, got, tc.mono)
		}
	}
}

// Ions: the monoisotopic mass of an ion is short of (or beyond) the neutral
// sum by the electron mass, 0.000548579909 u (CODATA 2018).
func TestMonoisotopicMassIon(t *testing.T) {
	t.Parallel()
	ion := parsePerceived(t, "[NH4+]").MonoisotopicMass()
	// 14.00307400443 + 4×1.00782503207 − 0.000548579909 = 18.03382555280
	if want := 18.0338255528; math.Abs(ion-want) > 1e-8 {
		t.Errorf("NH4+ monoisotopic mass %.10f, want %.10f", ion, want)
	}
}

// Hydrogens per heavy atom. Expected values are the textbook structures
// (common practice, no source) and agree with RDKit 2022.09
// Chem.MolFromSmiles + GetTotalNumHs, run by hand.
func TestHydrogenCounts(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		smiles string
		h      []int
	}{
		{"c1cc[nH]c1", []int{1, 1, 1, 1, 1}},                   // pyrrole
		{"c1ccncc1", []int{1, 1, 1, 0, 1, 1}},                  // pyridine
		{"c1ccoc1", []int{1, 1, 1, 0, 1}},                      // furan
		{"c1ccsc1", []int{1, 1, 1, 0, 1}},                      // thiophene
		{"c1cnc[nH]1", []int{1, 1, 0, 1, 1}},                   // imidazole
		{"Cn1ccnc1", []int{3, 0, 1, 1, 0, 1}},                  // 1-methylimidazole
		{"c1ccc2[nH]ccc2c1", []int{1, 1, 1, 0, 1, 1, 1, 0, 1}}, // indole
		{"c1cc[nH+]cc1", []int{1, 1, 1, 1, 1, 1}},              // pyridinium
		{"[O-][n+]1ccccc1", []int{0, 0, 1, 1, 1, 1, 1}},        // pyridine N-oxide
		{"O=c1cccc[nH]1", []int{0, 0, 1, 1, 1, 1, 1}},          // 2-pyridone
		{"[cH-]1cccc1", []int{1, 1, 1, 1, 1}},                  // cyclopentadienide
		{"c1cc[se]c1", []int{1, 1, 1, 0, 1}},                   // selenophene
		{"C=C", []int{2, 2}},
		{"C#N", []int{1, 0}},
		{"CN(=O)=O", []int{3, 0, 0, 0}},       // nitromethane written with N(V)
		{"CS(C)(=O)=O", []int{3, 0, 3, 0, 0}}, // dimethyl sulfone
		{"CP(C)C", []int{3, 0, 3, 3}},
		{"[NH4+]", []int{4}},
		{"[H]OC([H])([H])[H]", []int{1, 3}}, // methanol, hydrogens folded
		{"[2H]C", []int{0, 3}},              // [2H] stays an atom
		{"[H][H]", []int{0, 0}},
		{"[CH3]", []int{3}}, // methyl radical: bracket count as written
	} {
		m := parsePerceived(t, tc.smiles)
		got := make([]int, len(m.Atoms))
		for i := range m.Atoms {
			got[i] = m.Atoms[i].HCount()
		}
		if !slices.Equal(got, tc.h) {
			t.Errorf("%s: H per atom %v, want %v", tc.smiles, got, tc.h)
		}
	}
}

// Aromaticity on the Kekulé form ("a" aromatic, "-" not). Expected flags are
// Hückel's 4n+2 rule applied to each structure (common practice, no
// source) and agree with RDKit 2022.09's default model, run by hand.
func TestAromaticity(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct{ name, smiles, want string }{
		{"benzene, Kekulé", "C1=CC=CC=C1", "aaaaaa"},
		{"pyridine, Kekulé", "C1=CC=NC=C1", "aaaaaa"},
		{"pyrrole, Kekulé", "C1=CNC=C1", "aaaaa"},
		{"furan, Kekulé", "C1=COC=C1", "aaaaa"},
		{"thiazole, Kekulé", "C1=CSC=N1", "aaaaa"},
		{"cyclooctatetraene (8 π)", "C1=CC=CC=CC=C1", "--------"},
		{"cyclobutadiene (4 π)", "C1=CC=C1", "----"},
		{"cyclopentadiene (sp3 CH2)", "C1=CC=CC1", "-----"},
		{"tropylium (6 π)", "[CH+]1C=CC=CC=C1", "aaaaaaa"},
		{"cyclopentadienide (6 π)", "[CH-]1C=CC=C1", "aaaaa"},
		{"azulene (10 π over both rings)", "C1=CC2=CC=CC=CC2=C1", "aaaaaaaaaa"},
		{"naphthalene", "c1ccc2ccccc2c1", "aaaaaaaaaa"},
		{"2-pyridone (C=O gives 0 π)", "O=C1C=CC=CN1", "-aaaaaa"},
		{"p-benzoquinone (4 π)", "O=C1C=CC(=O)C=C1", "--------"},
		{"fulvene (exocyclic C=C)", "C=C1C=CC=C1", "------"},
		{"indane", "c1ccc2CCCc2c1", "aaaa---aa"},
		{"thiophene S,S-dioxide", "O=S1(=O)C=CC=C1", "-------"},
		{"biphenyl link not aromatic", "c1ccccc1-c1ccccc1", "aaaaaaaaaaaa"},
		{"pyrylium", "c1cc[o+]cc1", "aaaaaa"},
		// OpenSMILES 3.1.6: a wildcard may stand in an aromatic ring.
		{"wildcard in benzene", "c1cc*cc1", "aaaaaa"},
		{"wildcard in naphthalene", "c1ccc2c(c1)*ccc2", "aaaaaaaaaa"},
	} {
		m := parsePerceived(t, tc.smiles)
		got := make([]byte, len(m.Atoms))
		for i := range m.Atoms {
			got[i] = '-'
			if m.Atoms[i].Aromatic {
				got[i] = 'a'
			}
		}
		if string(got) != tc.want {
			t.Errorf("%s %s: aromatic %s, want %s", tc.name, tc.smiles, got, tc.want)
		}
	}
}

// Every atom written aromatic that needs a double bond gets exactly one in
// the Kekulé form, and implicit H follow from it (common practice).
func TestKekulize(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		smiles  string
		doubles int
	}{
		{"c1ccccc1", 3},
		{"c1ccc2ccccc2c1", 5},
		{"c1ccc2cccc2cc1", 5}, // azulene: odd rings need the blossom step
		{"c1cc[nH]c1", 2},
		{"Cn1cnc2c1c(=O)n(C)c(=O)n2C", 4}, // caffeine: 2 ring C=C/C=N + 2 C=O
		{"c1ccc2c(c1)ccc1ccccc12", 7},     // phenanthrene
	} {
		m := parsePerceived(t, tc.smiles)
		n := 0
		for _, b := range m.Bonds {
			if b.Order == 2 {
				n++
			}
		}
		if n != tc.doubles {
			t.Errorf("%s: %d double bonds, want %d", tc.smiles, n, tc.doubles)
		}
	}
}

// Ring perception. The SSSR has bonds − atoms + components rings (the
// cyclomatic number; common fact of graph theory) and the sizes are those of
// the structures (common practice, no source); for the cages this is
// RDKit's Chem.GetSSSR count, not its symmetrized ring information.
func TestRings(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name, smiles string
		sizes        []int
	}{
		{"cyclohexane", "C1CCCCC1", []int{6}},
		{"naphthalene", "c1ccc2ccccc2c1", []int{6, 6}},
		{"spiro[5.5]undecane", "C12(CCCCC1)CCCCC2", []int{6, 6}},
		{"norbornane", "C1CC2CCC1C2", []int{5, 5}},
		{"bicyclo[2.2.2]octane", "C1CC2CCC1CC2", []int{6, 6}},
		{"adamantane", "C1C2CC3CC1CC(C2)C3", []int{6, 6, 6}},
		{"cubane", "C12C3C4C1C5C2C3C45", []int{4, 4, 4, 4, 4}},
		{"biphenyl", "c1ccccc1-c1ccccc1", []int{6, 6}},
		{"hexane", "CCCCCC", nil},
	} {
		m := parsePerceived(t, tc.smiles)
		var sizes []int
		for _, r := range m.Rings() {
			sizes = append(sizes, len(r))
		}
		slices.Sort(sizes)
		if !slices.Equal(sizes, tc.sizes) {
			t.Errorf("%s: ring sizes %v, want %v", tc.name, sizes, tc.sizes)
		}
	}
	m := parsePerceived(t, "c1ccc2ccccc2c1CC")
	if got := m.RingSizes(3); !slices.Equal(got, []int{6, 6}) {
		t.Errorf("naphthalene fusion atom ring sizes %v, want [6 6]", got)
	}
	if m.InRing(10) || !m.InRing(0) {
		t.Error("InRing wrong for the ethyl group or the ring atom")
	}
	bp := parsePerceived(t, "c1ccccc1-c1ccccc1")
	if link := bp.BondBetween(5, 6); bp.BondInRing(link) || bp.Bonds[link].Aromatic {
		t.Error("biphenyl link is in a ring or aromatic")
	}
}

// Hybridization from the bonds (common practice, no source).
func TestHybridization(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		smiles string
		want   []int
	}{
		{"CC#N", []int{3, 1, 1}},
		{"C=C=C", []int{2, 1, 2}},
		{"CC=O", []int{3, 2, 2}},
		{"c1ccccc1C", []int{2, 2, 2, 2, 2, 2, 3}},
	} {
		m := parsePerceived(t, tc.smiles)
		for a, w := range tc.want {
			if got := m.Hybridization(a); got != w {
				t.Errorf("%s atom %d: sp%d, want sp%d", tc.smiles, a, got, w)
			}
		}
	}
}

func TestComponents(t *testing.T) {
	t.Parallel()
	m := parsePerceived(t, "CC(=O)[O-].[Na+].O")
	got := m.Components()
	want := [][]int{{0, 1, 2, 3}, {4}, {5}}
	if len(got) != len(want) {
		t.Fatalf("components %v, want %v", got, want)
	}
	for i := range want {
		if !slices.Equal(got[i], want[i]) {
			t.Errorf("components %v, want %v", got, want)
		}
	}
}

// Perceive on a molecule built in code, and its errors.
func TestPerceiveHandBuilt(t *testing.T) {
	t.Parallel()
	var m graph.Mol
	for range 6 {
		m.AddAtom(graph.Atom{Element: "C", Aromatic: true, Pos: -1})
	}
	for i := range 6 {
		m.AddBond(graph.Bond{A: i, B: (i + 1) % 6, Order: 1, Aromatic: true, Pos: -1})
	}
	if err := m.Perceive(); err != nil {
		t.Fatal(err)
	}
	if m.Formula() != "C6H6" {
		t.Errorf("formula %s, want C6H6", m.Formula())
	}
	var bad graph.Mol
	n := bad.AddAtom(graph.Atom{Element: "N", Pos: 7})
	for range 4 {
		c := bad.AddAtom(graph.Atom{Element: "C", Pos: -1})
		bad.AddBond(graph.Bond{A: n, B: c, Order: 1, Pos: -1})
	}
	err := bad.Perceive()
	var ae *graph.AtomError
	if !errors.As(err, &ae) || ae.Atom != 0 || ae.Pos != 7 {
		t.Fatalf("Perceive = %v, want an AtomError at atom 0, pos 7", err)
	}
}

// Perceive may run again on a perceived molecule (after the caller changes
// it); on an unchanged one it must give the same hydrogens, aromaticity
// and rings (common practice, no source).
func TestPerceiveTwice(t *testing.T) {
	t.Parallel()
	for _, s := range []string{
		"Cn1cnc2c1c(=O)n(C)c(=O)n2C", "C1=CC2=CC=CC=CC2=C1", "O=c1cccc[nH]1", "[CH+]1C=CC=CC=C1",
		"c1ccc2c(c1)[nH]c1ccccc12", "C[n+]1ccccc1", "c1ccccc1-c1ccccc1", "C12C3C4C1C5C2C3C45",
	} {
		m := parsePerceived(t, s)
		type snap struct {
			h    int
			arom bool
		}
		before := make([]snap, len(m.Atoms))
		for i, a := range m.Atoms {
			before[i] = snap{a.HCount(), a.Aromatic}
		}
		nr := len(m.Rings())
		if err := m.Perceive(); err != nil {
			t.Errorf("%s: second Perceive: %v", s, err)
			continue
		}
		for i, a := range m.Atoms {
			if (snap{a.HCount(), a.Aromatic}) != before[i] {
				t.Errorf("%s atom %d: H/aromatic %v after second Perceive, was %v", s, i, snap{a.HCount(), a.Aromatic}, before[i])
			}
		}
		if len(m.Rings()) != nr {
			t.Errorf("%s: %d rings after second Perceive, was %d", s, len(m.Rings()), nr)
		}
	}
}

// An aromatic N written with a double bond to O is the N-oxide, charge
// separated as RDKit's clean-up does (O=n1ccccc1 gives [O-][n+]1ccccc1).
func TestNOxideWrittenNeutral(t *testing.T) {
	t.Parallel()
	m := parsePerceived(t, "O=n1ccccc1")
	if m.Atoms[0].Charge != -1 || m.Atoms[1].Charge != 1 || !m.Atoms[1].Aromatic {
		t.Errorf("charges O %d, N %d, N aromatic %v; want -1, +1, true", m.Atoms[0].Charge, m.Atoms[1].Charge, m.Atoms[1].Aromatic)
	}
	if m.Formula() != "C5H5NO" {
		t.Errorf("formula %s, want C5H5NO", m.Formula())
	}
}
