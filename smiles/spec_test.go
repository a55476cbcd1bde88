package smiles

import (
	"testing"

	"shiftwise/graph"
)

// Examples of the OpenSMILES specification (opensmiles.org, "OpenSMILES
// specification" v1.0, as kept in the timvdm/OpenSMILES repository,
// opensmiles.asciidoc), by section. The formulas are those of the named
// compounds (common practice, no source), except the nested-branch example
// whose formula C22H46 the specification gives itself.
var specValid = []struct {
	section, smiles, formula string
}{
	{"3.1.1 atomic symbol", "[U]", "U"},
	{"3.1.1 atomic symbol", "[Pb]", "Pb"},
	{"3.1.1 atomic symbol", "[He]", "He"},
	{"3.1.1 atomic symbol", "[*]", "*"},
	{"3.1.2 hydrogens", "[CH4]", "CH4"},
	{"3.1.2 hydrogens", "[ClH]", "ClH"},
	{"3.1.2 hydrogens", "[ClH1]", "ClH"},
	{"3.1.3 charge", "[Cl-]", "Cl-"},
	{"3.1.3 charge", "[OH1-]", "HO-"},
	{"3.1.3 charge", "[OH-1]", "HO-"},
	{"3.1.3 charge", "[Cu+2]", "Cu2+"},
	{"3.1.3 charge", "[Cu++]", "Cu2+"},
	{"3.1.4 isotopes", "[13CH4]", "CH4"},
	{"3.1.4 isotopes", "[2H+]", "H+"},
	{"3.1.4 isotopes", "[238U]", "U"},
	{"3.1.5 organic subset", "C", "CH4"},
	{"3.1.5 organic subset", "N", "H3N"},
	{"3.1.5 organic subset", "Cl", "ClH"},
	{"3.1.6 wildcard", "Oc1c(*)cccc1", "C6H5*O"},
	{"3.1.7 atom class", "[CH4:2]", "CH4"},
	{"3.1.7 atom class", "[NH4+:005]", "H4N+"},
	{"3.2 bonds", "CC", "C2H6"},
	{"3.2 bonds", "CCO", "C2H6O"},
	{"3.2 bonds", "NCCCC", "C4H11N"},
	{"3.2 bonds", "CCCCN", "C4H11N"},
	{"3.2 bonds", "C=C", "C2H4"},
	{"3.2 bonds", "C#N", "CHN"},
	{"3.2 bonds", "CC#CC", "C4H6"},
	{"3.2 bonds", "CCC=O", "C3H6O"},
	{"3.2 bonds", "[Rh-](Cl)(Cl)(Cl)(Cl)$[Rh-](Cl)(Cl)(Cl)Cl", "Cl8Rh22-"}, // Cl8Rh2 with charge 2-
	{"3.2 bonds", "C-C-C=C-C", "C5H10"},
	{"3.3 branches", "CCC(CC)CO", "C6H14O"},
	{"3.3 branches", "CC(C)C(=O)C(C)C", "C7H14O"},
	{"3.3 branches", "OCC(CCC)C(C(C)C)CCC", "C12H26O"},
	{"3.3 branches", "OS(=O)(=S)O", "H2O3S2"},
	{"3.3 branches", "C(C(C(C(C(C(C(C(C(C(C(C(C(C(C(C(C(C(C(C(C))))))))))))))))))))C", "C22H46"},
	{"3.4 rings", "C1CCCCC1", "C6H12"},
	{"3.4 rings", "N1CC2CCCC2CC1", "C8H15N"},
	{"3.4 rings", "C=1CCCCC=1", "C6H10"},
	{"3.4 rings", "C=1CCCCC1", "C6H10"},
	{"3.4 rings", "C1CCCCC=1", "C6H10"},
	{"3.4 rings", "C1CCCCC1C1CCCCC1", "C12H22"},
	{"3.4 rings", "C1CCCCC1C2CCCCC2", "C12H22"},
	{"3.4 rings", "C0CCCCC0", "C6H12"},
	{"3.4 rings", "C%25CCCCC%25", "C6H12"},
	{"3.4 rings", "C1CCCCC%01", "C6H12"},
	{"3.4 rings", "C%00CCCCC%00", "C6H12"},
	{"3.4 rings", "C12(CCCCC1)CCCCC2", "C11H20"},
	{"3.5 aromaticity", "c1ccccc1", "C6H6"},
	{"3.5 aromaticity", "C1=CC=CC=C1", "C6H6"},
	{"3.5 aromaticity", "c1ccc2CCCc2c1", "C9H10"},
	{"3.5 aromaticity", "C1=CC=CC(CCC2)=C12", "C9H10"},
	{"3.5 aromaticity", "c1occc1", "C4H4O"},
	{"3.5 aromaticity", "c1ccc1", "C4H4"},
	{"3.5 aromaticity", "C1=CC=C1", "C4H4"},
	{"3.5 aromaticity", "c1ccccc1-c2ccccc2", "C12H10"},
	{"3.6 more about hydrogen", "[H]C([H])([H])[H]", "CH4"},
	{"3.6 more about hydrogen", "[H][CH2][H]", "CH4"},
	{"3.6 more about hydrogen", "[2H][CH2]C", "C2H6"},
	{"3.6 more about hydrogen", "[H][H]", "H2"},
	{"3.7 disconnected structures", "[Na+].[Cl-]", "ClNa"},
	{"3.7 disconnected structures", "Oc1ccccc1.NCCO", "C8H13NO2"},
	{"3.7 disconnected structures", "[NH4+].[NH4+].[O-]S(=O)(=O)[S-]", "H8N2O3S2"},
	{"3.7 disconnected structures", "c1cc(O.NCCO)ccc1", "C8H13NO2"},
	{"3.7 disconnected structures", "Oc1cc(.NCCO)ccc1", "C8H13NO2"},
	{"3.7.1 ring numbers and dot", "C1.C1", "C2H6"},
	{"3.7.1 ring numbers and dot", "C1.C12.C2", "C3H8"},
	{"3.7.1 ring numbers and dot", "c1c2c3c4cc1.Br2.Cl3.Cl4", "C6H3BrCl2"},
	{"3.8 tetrahedral centres", "N[C@](Br)(O)C", "C2H6BrNO"},
	{"3.8 tetrahedral centres", "N[C@@](Br)(C)O", "C2H6BrNO"},
	{"3.8 tetrahedral centres", "N[C@H](O)C", "C2H7NO"},
	{"3.9 cis/trans", "F/C=C/F", "C2H2F2"},
	{"3.9 cis/trans", "C(\\F)=C/F", "C2H2F2"},
	{"3.9 cis/trans", "F/C(CC)=C/F", "C4H6F2"},
	{"3.9 cis/trans", "F/C=C=C=C/F", "C4H2F2"},
	{"3.9 allene-like", "NC(Br)=[C@]=C(O)C", "C4H6BrNO"},
}

func TestSpecExamples(t *testing.T) {
	t.Parallel()
	for _, tc := range specValid {
		t.Run(tc.section+"/"+tc.smiles, func(t *testing.T) {
			m, err := Parse(tc.smiles)
			if err != nil {
				t.Fatalf("Parse(%q): %v", tc.smiles, err)
			}
			if got := m.Formula(); got != tc.formula {
				t.Errorf("Parse(%q).Formula() = %s, want %s", tc.smiles, got, tc.formula)
			}
		})
	}
}

// Strings the specification calls invalid, with the reason it gives.
func TestSpecInvalid(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct{ smiles, msg string }{
		{"C-1CCCCC=1", "mismatched ring-bond orders"},            // 3.4: both bond symbols must agree
		{"C1CCC", "unclosed ring bond 1"},                        // 3.4: ring closures come in pairs
		{"C12CCCCC12", "duplicates the bond"},                    // 3.4: two bonds between one pair of atoms
		{"C12C2CCC1", "duplicates the bond"},                     // 3.4: same
		{"C11", "closes on the atom that opened it"},             // 3.4: atom bonded to itself
		{"C.1CCCCC.1", "expected atom before ring-bond number"},  // 3.7: no dot before a ring number
		{"[HH1]", "hydrogen atom cannot carry a hydrogen count"}, // 3.1.2
		{"CccccC", "aromatic atom outside a ring"},               // 3.5: lower case is not "sp2 anywhere"
	} {
		_, err := Parse(tc.smiles)
		if err == nil {
			t.Errorf("Parse(%q): no error, want %q", tc.smiles, tc.msg)
			continue
		}
		if !contains(err.Error(), tc.msg) {
			t.Errorf("Parse(%q) = %v, want message containing %q", tc.smiles, err, tc.msg)
		}
	}
}

// Ring bonds: the bond symbol may be written at either end (spec 3.4).
func TestSpecRingBondOrder(t *testing.T) {
	t.Parallel()
	for _, s := range []string{"C=1CCCCC=1", "C=1CCCCC1", "C1CCCCC=1"} {
		m, err := Parse(s)
		if err != nil {
			t.Fatal(err)
		}
		b := m.BondBetween(0, 5)
		if b < 0 || m.Bonds[b].Order != 2 {
			t.Errorf("%s: bond 0-5 is not double", s)
		}
	}
}

// Tetrahedral marks (spec 3.8): the neighbour order is the written order,
// with the ring bond where its digit stands and a bracket H right after
// the preceding atom; folding a written [H] must keep the configuration.
func TestChiralNeighbourOrder(t *testing.T) {
	t.Parallel()
	// N[C@H](O)C and N[C@]([H])(O)C describe the same centre; so does
	// [H][C@](N)(C)O read from the hydrogen (anticlockwise N, C, O seen
	// from H equals, seen from N: H, O, C anticlockwise).
	for _, s := range []string{"N[C@H](O)C", "N[C@]([H])(O)C", "N[C@@](O)([H])C"} {
		m, err := Parse(s)
		if err != nil {
			t.Fatal(err)
		}
		if m.Atoms[1].Chiral != graph.ChiralCCW || m.Atoms[1].HCount() != 1 {
			t.Errorf("%s: chiral %v H %d, want @ with one H (as N[C@H](O)C)", s, m.Atoms[1].Chiral, m.Atoms[1].HCount())
		}
	}
	// C[C@]1(F)CCCC1: ring-bond digit 1 comes before the branch F.
	m, err := Parse("C[C@]1(F)CCCC1")
	if err != nil {
		t.Fatal(err)
	}
	nb := m.Neighbors(1)
	if want := []int{0, 6, 2, 3}; !equalInts(nb, want) {
		t.Errorf("neighbour order of the chiral atom = %v, want %v", nb, want)
	}
}

func equalInts(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// Conflicting up/down marks (spec 3.9.3: C/C(\F)=C/F is invalid) drop the
// geometry with a warning, as RDKit does; consistent marks stay.
func TestConflictingBondDirs(t *testing.T) {
	t.Parallel()
	m, warns, err := ParseWithOptions(`C/C(\F)=C/F`, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(warns) != 1 || !contains(warns[0].Msg, "conflicting") {
		t.Errorf("warnings %v, want one about conflicting marks", warns)
	}
	for _, b := range m.Bonds {
		if b.Dir != graph.DirNone {
			t.Errorf("bond %d-%d keeps mark %v", b.A, b.B, b.Dir)
		}
	}
	for _, s := range []string{`F/C=C/F`, `C(\F)=C/F`, `F/C(CC)=C/F`, `C/C(/F)=C/F`} {
		m, warns, err := ParseWithOptions(s, Options{})
		if err != nil || len(warns) != 0 {
			t.Errorf("%s: err %v, warnings %v", s, err, warns)
			continue
		}
		marked := 0
		for _, b := range m.Bonds {
			if b.Dir != graph.DirNone {
				marked++
			}
		}
		if marked < 2 {
			t.Errorf("%s: %d marked bonds left, want at least 2", s, marked)
		}
	}
}

// Extended chirality classes (spec 3.9.5 grammar: @TH1, @AL1, @SP1, @TB1,
// @OH1 …): @TH1/@TH2 are @/@@, the others are accepted and ignored with a
// warning.
func TestExtendedChirality(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		smiles string
		want   graph.Chirality
		warn   bool
	}{
		{"F[C@TH1](Cl)(Br)I", graph.ChiralCCW, false},
		{"F[C@TH2](Cl)(Br)I", graph.ChiralCW, false},
		{"F[Pt@SP1](Cl)(Br)I", graph.ChiralNone, true},
		{"F[As@TB1](Cl)(Br)(I)C", graph.ChiralNone, true},
		{"C[Co@OH25](C)(C)(C)(C)C", graph.ChiralNone, true},
	} {
		m, warns, err := ParseWithOptions(tc.smiles, Options{})
		if err != nil {
			t.Errorf("%s: %v", tc.smiles, err)
			continue
		}
		if m.Atoms[1].Chiral != tc.want || (len(warns) > 0) != tc.warn {
			t.Errorf("%s: chirality %v, warnings %v; want %v, warning %v", tc.smiles, m.Atoms[1].Chiral, warns, tc.want, tc.warn)
		}
		if at := 2 + len(m.Atoms[1].Element); tc.warn && warns[0].Pos != at { // the '@'
			t.Errorf("%s: warning at col %d, want col %d", tc.smiles, warns[0].Pos+1, at+1)
		}
	}
}

// NoPerceive returns the molecule as written: no implicit hydrogens and no
// chemistry errors.
func TestNoPerceive(t *testing.T) {
	t.Parallel()
	m, _, err := ParseWithOptions("N(C)(C)(C)C", Options{NoPerceive: true})
	if err != nil || len(m.Atoms) != 5 || m.Atoms[1].ImplicitH != 0 {
		t.Errorf("NoPerceive: %v, %v", m, err)
	}
}

// A '/' or '\' on a folded [H] keeps its meaning: [H]/C(F)=C/F (H trans to
// the far F) is C(/F)=C/F, the cis-difluoro isomer of spec 3.9.3.
func TestFoldedHydrogenBondDir(t *testing.T) {
	t.Parallel()
	a, err := Parse(`[H]/C(F)=C/F`)
	if err != nil {
		t.Fatal(err)
	}
	b, err := Parse(`C(/F)=C/F`)
	if err != nil {
		t.Fatal(err)
	}
	da := dirFrom(&a.Bonds[a.BondBetween(0, 1)], 0)
	db := dirFrom(&b.Bonds[b.BondBetween(0, 1)], 0)
	if da != db || da == graph.DirNone {
		t.Errorf("C–F mark seen from C: %v, want %v as in C(/F)=C/F", da, db)
	}
}
