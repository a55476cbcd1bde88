package compare

import (
	"math"
	"testing"
)

func TestImpurityTable(t *testing.T) {
	t.Parallel()
	if _, err := loadTable(); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		in, want string
		residual float64
	}{
		// Residual protio-solvent shifts: Gottlieb, Kotlyar & Nudelman 1997,
		// Table 1 (values from memory; also common practice).
		{"CDCl3", "CDCl3", 7.26},
		{"DMSO", "DMSO-d6", 2.50},
		{"Acetone", "acetone-d6", 2.05},
		{"METHANOL-D4", "CD3OD", 3.31},
		{"D2O", "D2O", 4.79},
		{"CD2Cl2", "CD2Cl2", 5.32}, // Fulmer et al. 2010 (value from memory)
	} {
		s, ok := LookupSolvent(tc.in)
		if !ok || s.Name != tc.want || math.Abs(s.Residual-tc.residual) > 1e-9 {
			t.Errorf("LookupSolvent(%q) = %+v %v, want %s at %.2f", tc.in, s, ok, tc.want, tc.residual)
		}
	}
	if _, ok := LookupSolvent("unobtainium"); ok {
		t.Error("unknown solvent accepted")
	}
	// Water shifts per solvent (Gottlieb 1997 Table 1, values from memory,
	// as listed in the brief): CDCl3 1.56, DMSO-d6 3.33, CD3OD 4.87,
	// acetone-d6 2.84, C6D6 0.40.
	water := map[string]float64{"CDCl3": 1.56, "DMSO-d6": 3.33, "CD3OD": 4.87, "acetone-d6": 2.84, "C6D6": 0.40}
	for solv, want := range water {
		found := false
		for _, sp := range SpeciesFor(solv) {
			if sp.Kind == "water" {
				found = true
				if got := sp.Signals[0].PPM[solv]; math.Abs(got-want) > 1e-9 {
					t.Errorf("water in %s at %.2f, want %.2f", solv, got, want)
				}
			}
		}
		if !found {
			t.Errorf("no water entry for %s", solv)
		}
	}
	// Ethyl acetate in CDCl3: 2.05 s (3H), 4.12 q (2H), 1.26 t (3H)
	// (Gottlieb 1997 Table 1; value from memory, as in the brief).
	for _, sp := range SpeciesFor("CDCl3") {
		if sp.Name == "ethyl acetate" {
			if len(sp.Signals) != 3 || speciesH(sp) != 8 || sp.Signals[1].PPM["CDCl3"] != 4.12 {
				t.Errorf("ethyl acetate entry %+v", sp)
			}
		}
	}
}
