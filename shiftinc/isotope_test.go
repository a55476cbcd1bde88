package shiftinc

import (
	"math"
	"strings"
	"testing"
)

// TestDeuteriumIsH: deuterium written as [2H] (or tritium [3H]) stays an
// atom of the graph, but for the shift of a remaining proton it is a
// hydrogen: the isotope effect of D on a neighbouring 1H shift is only about
// -0.01 to -0.02 ppm per D (common practice, no source; value from memory),
// so the residual proton of a partly deuterated group (DMSO-d5's CHD2, the
// CHD2 of CD2HCl) sits where the all-H compound's proton does. Before the
// fix a D was looked up as an unknown "other" substituent (+0.8–1.0 ppm).
func TestDeuteriumIsH(t *testing.T) {
	cases := []struct {
		name       string
		labelled   string
		atom       int // heavy atom carrying the 1H in labelled
		unlabelled string
		ref        int // the same atom in unlabelled
	}{
		{"DMSO-d5 CHD2", "[2H]C([2H])S(=O)C([2H])([2H])[2H]", 1, "CS(C)=O", 0},
		{"CHD2Cl", "[2H]C([2H])Cl", 1, "CCl", 0},
		{"CH2DCH3 CH2D", "C([2H])C", 0, "CC", 0},
		{"CH2TCl", "[3H]CCl", 1, "CCl", 0},
		{"methanol-OD CH3", "[2H]OC", 2, "OC", 1},
		{"ethanol-OD CH2", "[2H]OCC", 2, "OCC", 1},
		{"vinyl-d1 =CH", "[2H]C=C", 1, "C=C", 0},
		{"toluene-3,5-d2 H4", "[2H]c1cc([2H])cc(C)c1", 2, "Cc1ccccc1", 4},
		{"aniline-ND2 ortho H", "[2H]N([2H])c1ccccc1", 4, "Nc1ccccc1", 2},
	}
	for _, tc := range cases {
		got := estimatesAt(t, tc.labelled, tc.atom, "CDCl3")[0]
		want := estimatesAt(t, tc.unlabelled, tc.ref, "CDCl3")[0]
		if math.Abs(got.PPM-want.PPM) > 0.02 {
			t.Errorf("%s: %s atom %d at %.3f ppm (rules %q), want %.3f as in %s",
				tc.name, tc.labelled, tc.atom, got.PPM, got.Rules, want.PPM, tc.unlabelled)
		}
		if got.LowConfidence && !want.LowConfidence {
			t.Errorf("%s: low confidence only because of the D (rules %q)", tc.name, got.Rules)
		}
	}
}

// TestOverrideKeyCase: the decoder fills Row.CH from "CH = …" as from
// "ch = …" (it matches field names without regard to case), and the rule
// listing writes "CH base", "CH3 base"; so an override written "CH = 3.0"
// must change the methine increment. Before the fix it was decoded but not
// applied: the row kept the built-in value, silently.
func TestOverrideKeyCase(t *testing.T) {
	for _, src := range []string{
		"[[alpha]]\nkey = \"Cl\"\nCH = 3.0\n",
		"[[alpha]]\nkey = \"Cl\"\nch = 3.0\n",
		"[[alpha]]\nkey = \"Cl\"\nCh = 3.0\n",
	} {
		tab := Default().Clone()
		if err := tab.Merge(strings.NewReader(src), "case.toml"); err != nil {
			t.Fatalf("%q: %v", src, err)
		}
		r, def := tab.row("alpha", "Cl"), Default().row("alpha", "Cl")
		if r.CH != 3.0 || r.CH3 != def.CH3 || r.CH2 != def.CH2 {
			t.Errorf("%q: row ch3 %.2f ch2 %.2f ch %.2f; want ch 3.00 and the rest unchanged", src, r.CH3, r.CH2, r.CH)
		}
	}
}
