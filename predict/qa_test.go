package predict

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"shiftwise/predict/spin"
	"shiftwise/smiles"
)

// TestLoneEquivalentGroup: a set of equivalent protons that couples to no
// other proton (TMS, hexamethylethane, the tert-butyl of tert-butylbenzene)
// is a singlet; its size must neither trigger the "cluster too large"
// warning in Auto mode nor make Exact mode refuse the molecule.
func TestLoneEquivalentGroup(t *testing.T) {
	cases := []struct {
		smi  string
		nH   int // protons of the lone group
		mode spin.Mode
	}{
		// TMS: one 12 H singlet, the 0 ppm reference (common practice, no source).
		{"C[Si](C)(C)C", 12, spin.Auto},
		{"C[Si](C)(C)C", 12, spin.Exact},
		// Hexamethylethane: 18 equivalent H, a singlet (common practice, no source).
		{"CC(C)(C)C(C)(C)C", 18, spin.Auto},
		{"CC(C)(C)C(C)(C)C", 18, spin.Exact},
		// tert-Butylbenzene: the 9 H tert-butyl singlet (common practice, no source).
		{"CC(C)(C)c1ccccc1", 9, spin.Auto},
	}
	for _, tc := range cases {
		p := mustPredict(t, tc.smi, Options{Mode: tc.mode})
		if len(p.Warnings) != 0 {
			t.Errorf("%s (%v): warnings %q, want none", tc.smi, tc.mode, p.Warnings)
		}
		var lone *Signal
		for i := range p.Signals {
			if p.Signals[i].NH == tc.nH {
				lone = &p.Signals[i]
			}
		}
		if lone == nil || lone.Multiplicity != "s" {
			t.Errorf("%s (%v): signals %+v, want a %d H singlet", tc.smi, tc.mode, p.Signals, tc.nH)
		}
	}
}

// TestRulesAddUp: the rules shown with a signal are its reasons, so for a
// signal of one heavy atom they must add up to its shift (the additive
// scheme: δ = base + Σ increments, Pretsch 4th ed., 1H alkanes). Before the
// fix, an increment applied twice to one proton (the second and third α-Cl
// of CHCl3, both "α-Cl (×0.8) +2.06") was listed once, so the listed rules
// summed to 6.13 for a shift of 8.18.
func TestRulesAddUp(t *testing.T) {
	for _, smi := range []string{"ClC(Cl)Cl", "BrC(Br)Br", "ClCCl", "ClC(Cl)C(Cl)Cl", "COC(OC)OC", "CC(C)O", "CCOC(C)=O"} {
		p := mustPredict(t, smi, Options{})
		for _, s := range p.Signals {
			if s.Exchangeable {
				continue
			}
			sum := 0.0
			for _, r := range s.Rules {
				f := strings.Fields(r)
				if v, err := strconv.ParseFloat(f[len(f)-1], 64); err == nil {
					sum += v
				}
			}
			if math.Abs(sum-s.ShiftPPM) > 0.02 {
				t.Errorf("%s signal %s: rules %q sum to %.3f, shift %.3f", smi, s.Label, s.Rules, sum, s.ShiftPPM)
			}
		}
	}
}

// TestEmptyPredictionSaysWhy: a prediction without signals carries a
// warning, so an empty result is never silent. CCl4, CD3Cl and NaCl have no
// protium on a heavy atom; H2 and H+ have protons that this scheme (protons
// on heavy atoms) cannot place (H2 appears near 4.6 ppm in CDCl3, Fulmer
// et al. 2010; value from memory). Ethanol gets no such warning.
func TestEmptyPredictionSaysWhy(t *testing.T) {
	for _, smi := range []string{"ClC(Cl)(Cl)Cl", "[2H]C([2H])([2H])Cl", "[Na+].[Cl-]", "[H][H]", "[H+]"} {
		p := mustPredict(t, smi, Options{})
		if len(p.Signals) != 0 || len(p.Warnings) == 0 {
			t.Errorf("%s: %d signals, warnings %q; want none and a warning", smi, len(p.Signals), p.Warnings)
		}
	}
	if p := mustPredict(t, "CCO", Options{}); len(p.Warnings) != 0 {
		t.Errorf("ethanol: warnings %q", p.Warnings)
	}
}

// BenchmarkPredictLongChain: a 600-carbon chain (1202 protons). Memory
// should grow with the number of coupled pairs, not with protons squared:
// the H–H coupling table was a dense n×n array of jrules.J (about 80 MB
// here; GBs for a few thousand atoms) and is now sparse.
func BenchmarkPredictLongChain(b *testing.B) {
	smi := strings.Repeat("C", 600)
	m, err := smiles.Parse(smi)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Predict(m, smi, Options{}); err != nil {
			b.Fatal(err)
		}
	}
}
