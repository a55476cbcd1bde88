package predict

import (
	"math"
	"testing"

	"shiftwise/predict/spin"
	"shiftwise/smiles"
)

// FuzzPredict: any SMILES the parser accepts predicts without panic in
// first-order and auto mode, and the lines sum to the observed H.
func FuzzPredict(f *testing.F) {
	for _, s := range testSet {
		f.Add(s)
	}
	for _, s := range []string{`FC(F)(F)c1ccc(F)cc1`, `CP(C)C`, `C1CC1`, `C1=CC1`, `[2H]C`, `C#C`, `O`, `[H][H]`, `c1ccoc1C=O`} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		if len(s) > 60 {
			return // keep runs short: exact simulation grows fast
		}
		m, err := smiles.Parse(s)
		if err != nil {
			return
		}
		for _, mode := range []spin.Mode{spin.FirstOrder, spin.Auto} {
			p, err := Predict(m, s, Options{Mode: mode})
			if err != nil {
				t.Fatalf("%q %v: %v", s, mode, err)
			}
			nh, total := 0, 0.0
			for _, sg := range p.Signals {
				nh += sg.NH
			}
			for _, l := range p.Lines {
				total += l.Intensity
			}
			if math.Abs(total-float64(nh)) > 1e-3*math.Max(1, float64(nh)) {
				t.Fatalf("%q %v: lines sum to %v, want %d", s, mode, total, nh)
			}
		}
	})
}
