package solvent

import "testing"

// Spellings as they occur in JCAMP-DX headers (.SOLVENT NAME), in the
// NMRShiftDB2 records of ../shared/data and on the command line (common
// practice, no source).
func TestNormalize(t *testing.T) {
	for _, tc := range []struct {
		in, want string
		ok       bool
	}{
		{"CDCl3", CDCl3, true},
		{"CHLOROFORM-D", CDCl3, true},
		{"Chloroform-D1 (CDCl3)", CDCl3, true},
		{"CDCl3 + TMS", CDCl3, true},
		{"DMSO", DMSO, true},
		{"d6-DMSO", DMSO, true},
		{"DMSO-D6 (99.9%)", DMSO, true},
		{"Methanol-D4 (CD3OD)", CD3OD, true},
		{"MeOD", CD3OD, true},
		{"D2O", D2O, true},
		{"acetone-d6", Acetone, true},
		{"Benzene-D6 (C6D6)", C6D6, true},
		{"CD2Cl2", CD2Cl2, true},
		{"THF-d8", THF, true},
		{"", "", false},
		{"  ", "", false},
		{"unobtainium-d7", "unobtainium-d7", false},
	} {
		got, ok := Normalize(tc.in)
		if got != tc.want || ok != tc.ok {
			t.Errorf("Normalize(%q) = %q, %v; want %q, %v", tc.in, got, ok, tc.want, tc.ok)
		}
	}
}

// Every canonical name normalises to itself.
func TestCanonicalFixedPoint(t *testing.T) {
	for _, n := range Names() {
		if got, ok := Normalize(n); !ok || got != n {
			t.Errorf("Normalize(%q) = %q, %v", n, got, ok)
		}
	}
}
