package spectrum

import (
	"math"
	"math/rand/v2"
	"sort"
	"testing"
)

// TestSelectKthLarge checks selection on ranges long enough for the sampling
// step against the definition (the k-th value of the sorted slice) and the
// partition property median relies on: nothing larger before position k,
// nothing smaller after it. Data with many ties and sorted and reversed
// runs are included.
func TestSelectKthLarge(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(7, 11))
	gens := map[string]func(i, n int) float64{
		"gauss":    func(int, int) float64 { return r.NormFloat64() },
		"ties":     func(int, int) float64 { return math.Round(r.NormFloat64() * 3) },
		"sorted":   func(i, _ int) float64 { return float64(i) },
		"reversed": func(i, n int) float64 { return float64(n - i) },
		"constant": func(int, int) float64 { return 2 },
	}
	for name, gen := range gens {
		for _, n := range []int{601, 602, 1000, 4097, 20000, 65536} {
			v := make([]float64, n)
			for i := range v {
				v[i] = gen(i, n)
			}
			s := append([]float64(nil), v...)
			sort.Float64s(s)
			for _, k := range []int{0, 1, n / 3, n / 2, n/2 - 1, n - 2, n - 1} {
				w := append([]float64(nil), v...)
				if got := selectKth(w, k); got != s[k] {
					t.Fatalf("%s n=%d k=%d: got %g, want %g", name, n, k, got, s[k])
				}
				for i := range w {
					if (i < k && w[i] > w[k]) || (i > k && w[i] < w[k]) {
						t.Fatalf("%s n=%d k=%d: v[%d]=%g on the wrong side of %g", name, n, k, i, w[i], w[k])
					}
				}
			}
			w := append([]float64(nil), v...)
			want := (s[n/2-1] + s[n/2]) / 2
			if n%2 == 1 {
				want = s[n/2]
			}
			if got := median(w); got != want {
				t.Fatalf("%s n=%d: median %g, want %g", name, n, got, want)
			}
		}
	}
}

// TestSampledMedianUsed checks that the one-pass sampled median succeeds on
// ordinary noise (so that TestSelectKthLarge exercises it rather than the
// fallback) and agrees with the sorted middle, for odd and even lengths.
func TestSampledMedianUsed(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(3, 5))
	for _, n := range []int{4096, 4097, 50001, 262144} {
		v := make([]float64, n)
		for i := range v {
			v[i] = r.NormFloat64()
		}
		s := append([]float64(nil), v...)
		sort.Float64s(s)
		want := (s[n/2-1] + s[n/2]) / 2
		if n%2 == 1 {
			want = s[n/2]
		}
		var sel selector
		got, ok := sel.sampledMedian(v)
		if !ok || got != want {
			t.Fatalf("n=%d: sampled median %g (ok=%v), want %g", n, got, ok, want)
		}
	}
}
