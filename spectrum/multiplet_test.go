package spectrum

import (
	"math"
	"testing"
)

// TestFirstOrderNames builds first-order patterns from their couplings
// (every coupling splits each line into two of half intensity; coincident
// lines add — the first-order rule behind Pascal's triangle, common
// practice, no source) and requires the analysis to return the name and
// couplings (Hoye, Hanson & Vyvyan 1994 naming: largest coupling first).
func TestFirstOrderNames(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name string
		js   []float64
		want string
		wj   []float64
	}{
		{"singlet", nil, "s", nil},
		{"doublet", []float64{8.1}, "d", []float64{8.1}},
		{"triplet", []float64{7.2, 7.2}, "t", []float64{7.2}},
		{"quartet", []float64{7.0, 7.0, 7.0}, "q", []float64{7.0}},
		{"quintet", []float64{6.8, 6.8, 6.8, 6.8}, "p", []float64{6.8}},
		{"septet", []float64{6.9, 6.9, 6.9, 6.9, 6.9, 6.9}, "sept", []float64{6.9}},
		{"dd", []float64{17.3, 10.5}, "dd", []float64{17.3, 10.5}},
		{"dd order", []float64{2.1, 8.4}, "dd", []float64{8.4, 2.1}},
		{"dt", []float64{10.2, 6.5, 6.5}, "dt", []float64{10.2, 6.5}},
		{"td", []float64{7.8, 7.8, 1.4}, "td", []float64{7.8, 1.4}},
		{"ddd", []float64{11.0, 5.2, 2.1}, "ddd", []float64{11.0, 5.2, 2.1}},
		{"ddd equal spacing", []float64{12, 6, 3}, "ddd", []float64{12, 6, 3}},
		{"dq", []float64{6.8, 1.6, 1.6, 1.6}, "dq", []float64{6.8, 1.6}},
		{"qd", []float64{7.1, 7.1, 7.1, 2.0}, "qd", []float64{7.1, 2.0}},
		{"dd with J1 = 2 J2", []float64{8.0, 4.0}, "dd", []float64{8.0, 4.0}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			hz, h := patternLines(tc.js, 0.05)
			name, js, center, ok := firstOrder(hz, h, 0.25)
			if !ok || name != tc.want {
				t.Fatalf("got %q ok=%v, want %q", name, ok, tc.want)
			}
			if math.Abs(center-1000) > 1e-9 {
				t.Errorf("centre %g, want 1000", center)
			}
			if len(js) != len(tc.wj) {
				t.Fatalf("J %v, want %v", js, tc.wj)
			}
			for i := range js {
				if math.Abs(js[i]-tc.wj[i]) > 1e-9 {
					t.Errorf("J %v, want %v", js, tc.wj)
				}
			}
		})
	}
}

// patternLines returns the distinct line positions (Hz, centred on 1000)
// and summed intensities of a first-order pattern; lines closer than merge
// Hz coincide.
func patternLines(js []float64, merge float64) (hz, h []float64) {
	pos, w := firstOrderLines(js)
	hz0 := uniqueSorted(pos, merge)
	h = make([]float64, len(hz0))
	for k, p := range pos {
		for i, x := range hz0 {
			if math.Abs(p-x) <= merge {
				h[i] += w[k]
				break
			}
		}
	}
	for i := range hz0 {
		hz0[i] += 1000
	}
	return hz0, h
}

// TestFirstOrderRejects: patterns that are not first-order are "m".
func TestFirstOrderRejects(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name  string
		hz, h []float64
	}{
		{"asymmetric spacing", []float64{0, 7, 10}, []float64{1, 2, 1}},
		{"strong roofing", []float64{0, 8}, []float64{1, 2.2}},
		{"non-binomial", []float64{0, 7, 14}, []float64{1, 1, 1}},
		{"three units", []float64{0, 5, 10}, []float64{1, 1, 1}},
		{"inconsistent", []float64{0, 3, 9, 12}, []float64{1, 2, 2, 1}},
	}
	for _, tc := range tests {
		if name, _, _, ok := firstOrder(tc.hz, tc.h, 0.25); ok {
			t.Errorf("%s: accepted as %q", tc.name, name)
		}
	}
}

func TestSplitMultiplicity(t *testing.T) {
	t.Parallel()
	tests := []struct {
		in   string
		want []int
	}{
		{"d", []int{1}}, {"dt", []int{1, 2}}, {"sept", []int{6}}, {"sextd", []int{5, 1}}, {"ddd", []int{1, 1, 1}}, {"qd", []int{3, 1}},
	}
	for _, tc := range tests {
		got, ok := splitMultiplicity(tc.in)
		if !ok || len(got) != len(tc.want) {
			t.Errorf("%q: %v %v", tc.in, got, ok)
			continue
		}
		for i := range got {
			if got[i] != tc.want[i] {
				t.Errorf("%q: %v, want %v", tc.in, got, tc.want)
			}
		}
	}
	if _, ok := splitMultiplicity("m"); ok {
		t.Error(`"m" split`)
	}
}
