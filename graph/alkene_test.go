package graph

import "testing"

// Geometry of protons on C=C bonds. Which groups are cis and trans follows
// from the OpenSMILES reading of / and \ (OpenSMILES specification, section
// 3.5.1 "Cis/Trans configuration of double bonds": F/C=C/F is trans,
// F/C=C\F is cis, C(\F)=C/F is trans) and, for rings, from the fact that a
// double bond in a ring of up to 7 atoms can only be cis (common practice,
// no source).
func TestAlkeneView(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name, smi string
		p         Proton
		want      AlkeneView
	}{
		{"(E)-but-2-enoic acid H2", "C/C=C/C(=O)O", Proton{1, 0}, AlkeneView{Gem: 0, Cis: 3, Trans: -1, Known: true}},
		{"(E)-but-2-enoic acid H3", "C/C=C/C(=O)O", Proton{2, 0}, AlkeneView{Gem: 3, Cis: 0, Trans: -1, Known: true}},
		{"(Z)-but-2-enoic acid H2", "C/C=C\\C(=O)O", Proton{1, 0}, AlkeneView{Gem: 0, Cis: -1, Trans: 3, Known: true}},
		{"but-2-enoic acid, unwritten: E assumed", "CC=CC(=O)O", Proton{1, 0}, AlkeneView{Gem: 0, Cis: 3, Trans: -1, Known: false}},
		{"ethyl cinnamate (E)", "CCOC(=O)/C=C/c1ccccc1", Proton{5, 0}, AlkeneView{Gem: 3, Cis: 7, Trans: -1, Known: true}},
		{"(E)-cinnamate written backwards", "c1ccccc1/C=C/C(=O)OCC", Proton{6, 0}, AlkeneView{Gem: 5, Cis: 8, Trans: -1, Known: true}},
		{"styrene =CH2, H cis to phenyl", "C=Cc1ccccc1", Proton{0, 0}, AlkeneView{Gem: -1, Cis: 2, Trans: -1, Known: true}},
		{"styrene =CH2, H trans to phenyl", "C=Cc1ccccc1", Proton{0, 1}, AlkeneView{Gem: -1, Cis: -1, Trans: 2, Known: true}},
		{"styrene =CH", "C=Cc1ccccc1", Proton{1, 0}, AlkeneView{Gem: 2, Cis: -1, Trans: -1, Known: true}},
		{"(E)-1,2-dichloroethene", "Cl/C=C/Cl", Proton{1, 0}, AlkeneView{Gem: 0, Cis: 3, Trans: -1, Known: true}},
		{"(E)-1,2-dichloroethene, mark before the atom", "C(\\Cl)=C/Cl", Proton{0, 0}, AlkeneView{Gem: 1, Cis: 3, Trans: -1, Known: true}},
		{"(Z)-1,2-dichloroethene, mark before the atom", "C(/Cl)=C/Cl", Proton{0, 0}, AlkeneView{Gem: 1, Cis: -1, Trans: 3, Known: true}},
		{"cyclohexene: ring forces cis", "C1=CCCCC1", Proton{0, 0}, AlkeneView{Gem: 5, Cis: -1, Trans: 2, Known: true}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := handMol(t, tc.smi)
			got, ok := m.AlkeneView(tc.p)
			if !ok || got != tc.want {
				t.Errorf("%s AlkeneView(%v) = %+v, %v; want %+v", tc.smi, tc.p, got, ok, tc.want)
			}
		})
	}
}

func TestAlkeneViewNotAlkene(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		smi string
		p   Proton
	}{
		{"C=CC", Proton{2, 0}},     // CH3 of propene
		{"c1ccccc1", Proton{0, 0}}, // aromatic
		{"CC=O", Proton{1, 0}},     // aldehyde: C=O, not C=C
		{"C=C=C", Proton{0, 0}},    // allene: left out
		{"C=CC", Proton{0, 5}},     // no such proton
		{"CC#C", Proton{2, 0}},     // alkyne
	} {
		if v, ok := handMol(t, tc.smi).AlkeneView(tc.p); ok {
			t.Errorf("%s AlkeneView(%v) = %+v, true; want not ok", tc.smi, tc.p, v)
		}
	}
}

func TestProtonRelation(t *testing.T) {
	t.Parallel()
	// Styrene's vinyl group: Hcis and Htrans (to the ring) on C1 are
	// geminal; H on C2 is trans to the H that is cis to the ring (common
	// practice, no source).
	sty := handMol(t, "C=Cc1ccccc1")
	crot := handMol(t, "C/C=C\\C(=O)O") // (Z)-but-2-enoic acid
	tests := []struct {
		name string
		m    *Mol
		p, q Proton
		want Relation
	}{
		{"geminal", sty, Proton{0, 0}, Proton{0, 1}, RelGeminal},
		{"trans", sty, Proton{0, 0}, Proton{1, 0}, RelTrans},
		{"cis", sty, Proton{0, 1}, Proton{1, 0}, RelCis},
		{"cis, symmetric call", sty, Proton{1, 0}, Proton{0, 1}, RelCis},
		{"same proton", sty, Proton{0, 1}, Proton{0, 1}, RelNone},
		{"aromatic", sty, Proton{3, 0}, Proton{4, 0}, RelNone},
		{"Z vinyl H are cis", crot, Proton{1, 0}, Proton{2, 0}, RelCis},
		{"vinyl to CH3", crot, Proton{1, 0}, Proton{0, 0}, RelNone},
		{"no such proton", sty, Proton{0, 0}, Proton{0, 2}, RelNone},
		{"no such atom", sty, Proton{-1, 0}, Proton{40, 0}, RelNone},
	}
	for _, tc := range tests {
		if got := tc.m.ProtonRelation(tc.p, tc.q); got != tc.want {
			t.Errorf("%s: ProtonRelation(%v, %v) = %v, want %v", tc.name, tc.p, tc.q, got, tc.want)
		}
	}
}
