package compare

import (
	"math"
	"testing"
)

func TestParsePattern(t *testing.T) {
	t.Parallel()
	// Multiplicity abbreviations: common practice, no source.
	for _, tc := range []struct {
		in    string
		lines int
		known bool
		broad bool
	}{
		{"s", 1, true, false}, {"d", 2, true, false}, {"t", 3, true, false}, {"q", 4, true, false},
		{"quint", 5, true, false}, {"sept", 7, true, false}, {"dd", 4, true, false}, {"dt", 6, true, false},
		{"ddd", 8, true, false}, {"br s", 1, true, true}, {"bs", 1, true, true}, {"m", 1, false, false},
		{"", 1, false, false}, {"xyz", 1, false, false},
	} {
		p := parsePattern(tc.in)
		if p.lines() != tc.lines || p.known != tc.known || p.broad != tc.broad {
			t.Errorf("parsePattern(%q) = %+v (%d lines), want %d lines known=%v broad=%v", tc.in, p, p.lines(), tc.lines, tc.known, tc.broad)
		}
	}
	for _, tc := range []struct {
		pred, meas string
		lo, hi     float64
	}{
		{"t", "t", 0, 0}, {"m", "q", 0.3, 0.3}, {"dd", "q", 0.3, 0.3}, {"tt", "t", 0.4, 0.4},
		{"s", "q", 2, 3}, {"d", "t", 0.5, 1},
	} {
		if c := multCost(tc.pred, tc.meas); c < tc.lo || c > tc.hi {
			t.Errorf("multCost(%q, %q) = %.2f, want in [%.2f, %.2f]", tc.pred, tc.meas, c, tc.lo, tc.hi)
		}
	}
}

// FuzzMultCost: multiplicity labels come from files and processing; any
// string must give a finite cost in [0, 3] without panicking.
func FuzzMultCost(f *testing.F) {
	for _, s := range []string{"s", "dd", "br s", "m", "dddddd", "quint", "sept", "", "ｄ", "br."} {
		f.Add(s, "t")
	}
	f.Fuzz(func(t *testing.T, a, b string) {
		c := multCost(a, b)
		if math.IsNaN(c) || c < 0 || c > 3 {
			t.Fatalf("multCost(%q, %q) = %g", a, b, c)
		}
	})
}
