package spectrum

import (
	"math"
	"math/rand/v2"
	"testing"
)

// A tall sharp singlet beside broader (unresolved fine-structure) doublets
// must be kept: only weak narrow maxima can be noise. Regression: the
// 0.9 Hz OCH3 and CHO singlets of 4-methoxybenzaldehyde were dropped when
// the aromatic lines were about 1.9 Hz wide. Line widths and areas are
// physical constructions (Lorentzian lines), not data.
func TestSharpSingletBesideBroadLinesKept(t *testing.T) {
	const field = 400.0
	n := 32768
	ppm := make([]float64, n)
	y := make([]float64, n)
	for i := range ppm {
		ppm[i] = -1 + 12*float64(i)/float64(n-1)
	}
	add := func(x0, area, wHz float64) {
		g := wHz / 2 / field
		for i, x := range ppm {
			d := x - x0
			y[i] += area * g / math.Pi / (d*d + g*g)
		}
	}
	add(3.80, 3, 0.9)
	add(9.95, 1, 0.9)
	for _, c := range []float64{7.09, 7.11, 7.82, 7.84} {
		add(c, 1, 1.9)
	}
	rng := rand.New(rand.NewPCG(3, 4))
	for i := range y {
		y[i] += 0.4 * rng.NormFloat64()
	}
	pl, err := Process(&Spectrum{PPM: ppm, Y: y, FieldMHz: field}, ProcessOptions{Solvent: "CDCl3"})
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []float64{3.80, 9.95} {
		found := false
		for _, p := range pl.Peaks {
			found = found || math.Abs(p.PPM-want) < 0.001
		}
		if !found {
			t.Errorf("singlet at %.2f ppm not picked", want)
		}
	}
}
