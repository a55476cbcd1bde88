package spin

import (
	"math"
	"testing"
)

// TestRender: a Lorentzian of full width w at half height is I at its
// centre and I/2 at ±w/2 (definition of the line width, common practice, no
// source).
func TestRender(t *testing.T) {
	t.Parallel()
	const field, w = 400.0, 2.0
	lines := []Line{{Hz: 1000, PPM: 2.5, Intensity: 3}}
	// Points exactly at the centre and at ±w/2: step w/2 Hz around 2.5 ppm.
	from, to := 2.5-w/field, 2.5+w/field
	ppm, y := Render(lines, field, from, to, 5, w)
	want := []float64{3.0 / 5, 1.5, 3, 1.5, 3.0 / 5} // I·γ²/(d²+γ²), γ = 1, d = 2, 1, 0, 1, 2
	for i := range want {
		if math.Abs(y[i]-want[i]) > 1e-9 {
			t.Errorf("y(%.5f ppm) = %v, want %v", ppm[i], y[i], want[i])
		}
	}
	if p, y := Render(lines, field, 0, 1, 1, w); p != nil || y != nil {
		t.Error("n < 2 must give nil")
	}
	if lo, hi := Span(lines, 0.1); math.Abs(lo-2.4) > 1e-12 || math.Abs(hi-2.6) > 1e-12 {
		t.Errorf("Span = %v, %v", lo, hi)
	}
}
