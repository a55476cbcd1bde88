package compare

import (
	"testing"

	"shiftwise/internal/synth"
)

// TestLongChainEnvelope: methyl stearate's fourteen CH2 signals all fall in
// one 28 H aliphatic envelope near 1.3 ppm (common practice, no source:
// long-chain esters show a single broad hump there). The spectrum is
// synthesised from our own prediction with shift jitter (invented data; it
// checks the matcher's capacity, not the chemistry): the true structure
// must be consistent at 60 and 400 MHz; it was "inconsistent" while a
// multiplet could take at most 8 signals. (Homologs: TestHomologsToldApart.)
func TestLongChainEnvelope(t *testing.T) {
	const stearate = "CCCCCCCCCCCCCCCCCC(=O)OC"
	for _, field := range []float64{60, 400} {
		r := synth.Recipe{FieldMHz: field, Components: []synth.Component{{Smiles: stearate, Moles: 1, Jitter: 0.01}},
			Extra: []synth.Singlet{cdcl3Water}, Seed: 7, Satellites: true}
		if res := synthCheck(t, r, Input{Smiles: stearate}); res.Verdict != Consistent {
			t.Errorf("%g MHz: true structure %s (%.2f): %v", field, res.Verdict, res.Score, res.Reasons)
		}
	}
}
