package predict

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/integrate"

	"shiftwise/predict/spin"
	"shiftwise/smiles"
)

// TestRenderArea: each line is a unit-area Lorentzian times its intensity,
// so the trace integrates to the number of observed H (the area of a
// Lorentzian γ/π/(x²+γ²) over ±200γ is 1 − (2/π)·atan(1/200) ≈ 0.9968;
// textbook calculus).
func TestRenderArea(t *testing.T) {
	t.Parallel()
	p := mustPredict(t, `CCOC(=O)/C=C/c1ccccc1`, Options{})
	x, y := Render(p, 12, -1, 1<<16, 1.0)
	if !floats.Equal(x, sortedCopy(x)) || x[0] != -1 || x[len(x)-1] != 12 {
		t.Fatalf("ppm axis not ascending from -1 to 12")
	}
	area := integrate.Trapezoidal(x, y)
	nh := 0
	for _, s := range p.Signals {
		nh += s.NH
	}
	if math.Abs(area-float64(nh)) > 0.01*float64(nh) {
		t.Errorf("area %.4f, want %d ± 1 %%", area, nh)
	}
}

// TestRenderBroadExchangeable: an exchangeable signal is drawn broader, so
// its peak is lower than that of a sharp signal of the same intensity.
func TestRenderBroadExchangeable(t *testing.T) {
	t.Parallel()
	p := &Prediction{FieldMHz: 400,
		Signals: []Signal{{Label: "A", NH: 1}, {Label: "B", NH: 1, Exchangeable: true}},
		Lines:   []Line{{PPM: 2, Intensity: 1, Signal: "A"}, {PPM: 4, Intensity: 1, Signal: "B"}}}
	x, y := Render(p, 0, 6, 60001, 1)
	peak := func(at float64) float64 {
		best := 0.0
		for i := range x {
			if math.Abs(x[i]-at) < 0.05 {
				best = math.Max(best, y[i])
			}
		}
		return best
	}
	// Lorentzian peak height is 1/(πγ): the ratio equals the width ratio.
	if r := peak(2) / peak(4); math.Abs(r-exchangeBroadening) > 0.05*exchangeBroadening {
		t.Errorf("sharp/broad height ratio %.2f, want %d", r, exchangeBroadening)
	}
	if x, y := Render(p, 0, 6, 1, 1); x != nil || y != nil {
		t.Error("Render with 1 point should return nil")
	}
}

func sortedCopy(x []float64) []float64 {
	c := append([]float64(nil), x...)
	for i := 1; i < len(c); i++ {
		if c[i] < c[i-1] {
			return nil
		}
	}
	return c
}

// ExamplePredict shows the signals of ethyl acetate.
func ExamplePredict() {
	m, err := smiles.Parse(`CCOC(C)=O`)
	if err != nil {
		panic(err)
	}
	p, err := Predict(m, `CCOC(C)=O`, Options{Mode: spin.FirstOrder})
	if err != nil {
		panic(err)
	}
	for _, s := range p.Signals {
		fmt.Printf("%s %-3s %d H %s\n", s.Label, s.Kind, s.NH, s.Multiplicity)
	}
	// Output:
	// A CH3 3 H t
	// B CH2 2 H q
	// C CH3 3 H s
}
