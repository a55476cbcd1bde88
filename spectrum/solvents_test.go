package spectrum

import (
	"math"
	"testing"
)

// TestNormalizeSolvent: spellings found in JCAMP-DX ##.SOLVENT NAME records
// (the cheminfo dataset uses CDCl3, DMSO, Acetone, CD2Cl2, D2O; see
// index.tsv) and common variants map to one canonical name.
func TestNormalizeSolvent(t *testing.T) {
	t.Parallel()
	tests := []struct{ in, want string }{
		{"CDCl3", "CDCl3"}, {"CHLOROFORM-D", "CDCl3"}, {"chloroform-d1", "CDCl3"},
		{"DMSO", "DMSO-d6"}, {"DMSO-D6", "DMSO-d6"}, {"dmso_d6", "DMSO-d6"},
		{"METHANOL-D4", "CD3OD"}, {"MeOD", "CD3OD"}, {"CD3OD", "CD3OD"},
		{"D2O", "D2O"}, {"ACETONE-D6", "acetone-d6"}, {"Acetone", "acetone-d6"},
		{"C6D6", "C6D6"}, {"BENZENE-D6", "C6D6"}, {"CD2Cl2", "CD2Cl2"},
		{"CD3CN", "CD3CN"}, {"ACETONITRILE-D3", "CD3CN"}, {"CDCl3 + TMS", "CDCl3"},
	}
	for _, tc := range tests {
		got, ok := NormalizeSolvent(tc.in)
		if !ok || got != tc.want {
			t.Errorf("NormalizeSolvent(%q) = %q, %v; want %q", tc.in, got, ok, tc.want)
		}
	}
	if got, ok := NormalizeSolvent(" unknownium "); ok || got != "unknownium" {
		t.Errorf("unknown solvent: %q %v", got, ok)
	}
}

// TestResidualValues pins the residual 1H shifts to Fulmer et al. 2010,
// Organometallics 29, 2176, Table 1 (values from memory; the same numbers
// appear in Gottlieb, Kotlyar & Nudelman 1997, J. Org. Chem. 62, 7512).
func TestResidualValues(t *testing.T) {
	t.Parallel()
	want := map[string]struct {
		ppm  float64
		mult string
	}{
		"CDCl3": {7.26, "s"}, "DMSO-d6": {2.50, "p"}, "CD3OD": {3.31, "p"}, "D2O": {4.79, "s"},
		"acetone-d6": {2.05, "p"}, "C6D6": {7.16, "s"}, "CD2Cl2": {5.32, "t"}, "CD3CN": {1.94, "p"},
	}
	for name, w := range want {
		s, ok := LookupSolvent(name)
		if !ok || math.Abs(s.ResidualPPM-w.ppm) > 1e-9 || s.Multiplicity != w.mult {
			t.Errorf("%s: %+v, want %.2f %s", name, s, w.ppm, w.mult)
		}
	}
}
