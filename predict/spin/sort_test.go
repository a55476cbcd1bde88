package spin

import (
	"cmp"
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// TestSortRaw: sortRaw orders lines by group, then frequency, stably, as a
// plain stable comparison sort does (the reference), on data that exercise
// its paths: small groups, large groups spread over hundreds of Hz,
// frequencies within rounding of each other (the insertion finish), many
// lines at one frequency with low-bit noise (the merge-sort fallback),
// negative frequencies and both zeros.
func TestSortRaw(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(4, 2))
	gen := map[string]func(i int) float64{
		"spread":   func(int) float64 { return 700 + 200*r.Float64() },
		"rounding": func(int) float64 { return 800 + float64(r.IntN(50))*1e-4 + r.Float64()*1e-12 },
		"one line": func(int) float64 { return math.Nextafter(812.5, float64(r.IntN(3)-1)*1e9) },
		"signs":    func(i int) float64 { return []float64{-3, -0.0, 0, 2.5, -1e-300, 1e-300}[i%6] * float64(1+r.IntN(2)) },
	}
	for name, f := range gen {
		for _, n := range []int{5, 63, 64, 1000, 20000} {
			ls := make([]rawLine, n)
			for i := range ls {
				ls[i] = rawLine{hz: f(i), inten: float64(i), eg: r.IntN(3)}
			}
			want := slices.Clone(ls)
			slices.SortStableFunc(want, func(x, y rawLine) int {
				if c := cmp.Compare(x.eg, y.eg); c != 0 {
					return c
				}
				return cmp.Compare(hzKey(x.hz), hzKey(y.hz))
			})
			sortRaw(ls)
			for i := range ls {
				if ls[i] != want[i] {
					t.Fatalf("%s, %d lines: position %d is %+v, want %+v", name, n, i, ls[i], want[i])
				}
			}
		}
	}
}
