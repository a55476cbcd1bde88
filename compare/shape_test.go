package compare

import (
	"math"
	"testing"

	"shiftwise/predict"
	"shiftwise/spectrum"
)

func TestPearson(t *testing.T) {
	t.Parallel()
	// r(a, a) = 1, r(a, −a) = −1, r(a, 2a+3) = 1 (definition of the
	// correlation coefficient; mathematical identity).
	a := []float64{1, 3, 2, 5, 4}
	neg := make([]float64, len(a))
	lin := make([]float64, len(a))
	for k, x := range a {
		neg[k], lin[k] = -x, 2*x+3
	}
	for _, tc := range []struct {
		b    []float64
		want float64
	}{{a, 1}, {neg, -1}, {lin, 1}, {[]float64{2, 2, 2, 2, 2}, 0}} {
		if got := pearson(a, tc.b); math.Abs(got-tc.want) > 1e-12 {
			t.Errorf("pearson(%v, %v) = %g, want %g", a, tc.b, got, tc.want)
		}
	}
}

// TestShapeTelling: a measured 1:2:1 triplet (J 7 Hz, Pascal's triangle;
// common practice, no source) correlates better with a predicted triplet
// than with a predicted doublet of the same J.
func TestShapeTelling(t *testing.T) {
	t.Parallel()
	const field = 400.0
	tr := &spectrum.Spectrum{}
	for k := 0; k < 2000; k++ {
		x := 1.0 + float64(k)*0.0001
		y := 0.0
		for n, w := range []float64{1, 2, 1} {
			d := (x - (1.1 + float64(n-1)*7/field)) / (0.5 / field)
			y += w / (1 + d*d)
		}
		tr.PPM = append(tr.PPM, x)
		tr.Y = append(tr.Y, y)
	}
	m := mplet{ppm: 1.1, from: 1.05, to: 1.15}
	score := func(lines []predict.Line) float64 {
		ev := &evaluation{pred: &predict.Prediction{Signals: []predict.Signal{{Label: "A", NH: 2, ShiftPPM: 1.0}}, Lines: lines}, sigM: []int{0}}
		r, ok := ev.multipletShape(m, []int{0}, tr, field)
		if !ok {
			t.Fatal("no shape")
		}
		return r
	}
	triplet := []predict.Line{{PPM: 1.0 - 7/field, Intensity: 0.5, Signal: "A"}, {PPM: 1.0, Intensity: 1, Signal: "A"}, {PPM: 1.0 + 7/field, Intensity: 0.5, Signal: "A"}}
	doublet := []predict.Line{{PPM: 1.0 - 3.5/field, Intensity: 1, Signal: "A"}, {PPM: 1.0 + 3.5/field, Intensity: 1, Signal: "A"}}
	rt, rd := score(triplet), score(doublet)
	if rt < 0.99 || rd >= rt-0.2 {
		t.Errorf("triplet r = %.3f (want ≥ 0.99), doublet r = %.3f (want clearly lower)", rt, rd)
	}
}
