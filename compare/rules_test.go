package compare

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"shiftwise/internal/synth"
)

// Water in CDCl3 at 1.56 ppm (Gottlieb 1997 Table 1, value from memory).
var cdcl3Water = synth.Singlet{PPM: 1.56, H: 0.05, WidthHz: 2}

// slowParallel skips a long sweep under -short (saying how many checks it
// runs) and lets it run in parallel otherwise.
func slowParallel(t *testing.T, what string) {
	t.Helper()
	if testing.Short() {
		t.Skip(what)
	}
	t.Parallel()
}

func synthCheck(t *testing.T, r synth.Recipe, in Input) *Result {
	t.Helper()
	spec, err := synth.Make(r)
	if err != nil {
		t.Fatal(err)
	}
	in.Spectrum = spec
	res, err := Check(in, Options{})
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// TestWrongRegioisomerNotConsistent: the tube holds ethyl 3-methoxybenzoate
// (known by construction), the check is asked about the 4-isomer. The
// 3-isomer's H5 triplet is left over and the 4-isomer's AA'BB' pattern
// cannot hold the four aromatic H; the verdict must not be consistent and
// the reasons must name the better candidate. The same spectrum checked as
// the 3-isomer must pass (control).
func TestWrongRegioisomerNotConsistent(t *testing.T) {
	const meta, para, ortho = "CCOC(=O)c1cccc(OC)c1", "CCOC(=O)c1ccc(OC)cc1", "CCOC(=O)c1ccccc1OC"
	for _, seed := range []uint64{12, 21, 33} {
		r := synth.Recipe{Components: []synth.Component{{Smiles: meta, Moles: 1, Jitter: 0.015}},
			Extra: []synth.Singlet{cdcl3Water}, Seed: seed, Satellites: true}
		res := synthCheck(t, r, Input{Smiles: para, Candidates: []string{meta, ortho}})
		if res.Verdict == Consistent {
			t.Errorf("seed %d: wrong regioisomer passes: %v", seed, res.Reasons)
		}
		if !strings.Contains(strings.Join(res.Reasons, " "), "candidate "+meta) {
			t.Errorf("seed %d: reasons do not name the better candidate: %v", seed, res.Reasons)
		}
		// Benzene is a singlet (Gottlieb 1997 Table 1): a resolved triplet
		// cannot be it.
		for _, f := range res.Found {
			if strings.HasPrefix(f.Name, "benzene") {
				t.Errorf("seed %d: compound triplet named %s at %v", seed, f.Name, f.PPM)
			}
		}
		ok := synthCheck(t, r, Input{Smiles: meta, Candidates: []string{para, ortho}})
		if ok.Verdict != Consistent {
			t.Errorf("seed %d: true structure %s: %v", seed, ok.Verdict, ok.Reasons)
		}
	}
}

// TestTableSingletStillFound: benzene added as a sharp singlet at 7.36
// (Gottlieb 1997 Table 1, value from memory) at 2 mol % to butyl acetate
// is still identified after the multiplicity rule.
func TestTableSingletStillFound(t *testing.T) {
	r := synth.Recipe{Components: []synth.Component{{Smiles: "CCCCOC(C)=O", Moles: 1, Jitter: 0.01}},
		Extra: []synth.Singlet{cdcl3Water, {PPM: 7.36, H: 6 * 0.02, WidthHz: 0.9}}, Seed: 5, Satellites: true}
	res := synthCheck(t, r, Input{Smiles: "CCCCOC(C)=O"})
	found := false
	for _, f := range res.Found {
		found = found || strings.HasPrefix(f.Name, "benzene")
	}
	if !found {
		t.Errorf("benzene singlet not identified: %v", names(res.Found))
	}
}

func TestTableMultOK(t *testing.T) {
	// A singlet has no resolved splitting; "m" and broad lines may hide
	// one (common practice, no source).
	cases := []struct {
		tab, meas string
		want      bool
	}{
		{"s", "s", true}, {"s", "m", true}, {"s", "br s", true}, {"s", "", true},
		{"s", "d", false}, {"s", "t", false}, {"s", "dt", false}, {"s", "q", false},
		{"t", "s", true}, {"q", "m", true}, {"m", "t", true},
	}
	for _, c := range cases {
		if got := tableMultOK(c.tab, c.meas); got != c.want {
			t.Errorf("tableMultOK(%q, %q) = %v, want %v", c.tab, c.meas, got, c.want)
		}
	}
}

func TestRegionOff(t *testing.T) {
	// Review level: short by ≥ 1 H (at 0.1 H) and ≥ 20 % (doc.go).
	cases := []struct {
		got, exp float64
		want     bool
	}{
		{3.0, 4, true}, {3.04, 4, true}, {3.1, 4, false}, {4.0, 5, true}, {4.1, 5, false},
		{8.9, 7, false}, // an excess is listed, not a review reason
		{9, 10, false},  // 10 %
		{0, 0, false},
	}
	for _, c := range cases {
		if got := regionOff(c.got, c.exp); got != c.want {
			t.Errorf("regionOff(%v, %v) = %v, want %v", c.got, c.exp, got, c.want)
		}
	}
}

// TestImpurityAmountFromCleanSignals: ethyl (E)-cinnamate with 0.06 mol
// benzaldehyde per mol (known by construction): molar purity 100/106 =
// 94.3 %. Benzaldehyde's aromatic signals overlap the ester's; its amount
// must come from the clean ones (CHO near 10 ppm, ortho H near 7.9).
func TestImpurityAmountFromCleanSignals(t *testing.T) {
	for _, c := range []struct {
		moles float64
		seed  uint64
	}{{0.06, 15}, {0.06, 4}, {0.03, 9}} {
		r := synth.Recipe{Components: []synth.Component{
			{Smiles: "CCOC(=O)/C=C/c1ccccc1", Moles: 1, Jitter: 0.015},
			{Smiles: "O=Cc1ccccc1", Moles: c.moles}},
			Extra: []synth.Singlet{cdcl3Water}, Seed: c.seed, Satellites: true}
		res := synthCheck(t, r, Input{Smiles: "CCOC(=O)/C=C/c1ccccc1", Impurities: []string{"O=Cc1ccccc1"}})
		want := 100 / (1 + c.moles)
		if res.Purity.MolarPercent == nil || math.Abs(*res.Purity.MolarPercent-want) > 1.5 {
			t.Errorf("%.2f mol benzaldehyde, seed %d: molar purity %s, want %.1f ± 1.5", c.moles, c.seed, pctString(res.Purity.MolarPercent), want)
		}
	}
}

func pctString(p *float64) string {
	if p == nil {
		return "none"
	}
	return strconv.FormatFloat(*p, 'f', 2, 64)
}
