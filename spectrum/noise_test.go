package spectrum

import (
	"math"
	"math/rand/v2"
	"sort"
	"testing"
)

// TestMedianMatchesSort checks quickselect against the sorted middle on
// seeded random data of many sizes (property check; the definition of the
// median is the reference).
func TestMedianMatchesSort(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(1, 1))
	for n := 1; n < 300; n++ {
		v := make([]float64, n)
		for i := range v {
			v[i] = math.Round(r.NormFloat64() * 5) // ties included
		}
		s := append([]float64(nil), v...)
		sort.Float64s(s)
		want := s[n/2]
		if n%2 == 0 {
			want = (s[n/2-1] + s[n/2]) / 2
		}
		if got := median(v); got != want {
			t.Fatalf("n=%d: median %g, want %g", n, got, want)
		}
	}
}

// TestNoiseEstimates checks that both robust estimates recover σ of seeded
// Gaussian noise with 1 % of the points carrying large peaks (2 % of the differences) and a sloping
// baseline (the MAD/Φ⁻¹(¾) consistency constant; Rousseeuw & Croux 1993).
func TestNoiseEstimates(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(2, 3))
	const n, sigma = 20000, 2.5
	y := make([]float64, n)
	for i := range y {
		y[i] = sigma*r.NormFloat64() + 0.001*float64(i)
		if i%100 == 0 {
			y[i] += 1000
		}
	}
	if got := EstimateNoise(y); math.Abs(got-sigma)/sigma > 0.05 {
		t.Errorf("difference estimate %.3f, want %.2f within 5%%", got, sigma)
	}
	flat := make([]float64, n)
	for i := range flat {
		flat[i] = y[i] - 0.001*float64(i)
	}
	if got := madSigma(flat); math.Abs(got-sigma)/sigma > 0.05 {
		t.Errorf("MAD estimate %.3f, want %.2f within 5%%", got, sigma)
	}
}
