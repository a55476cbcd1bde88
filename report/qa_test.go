package report

import (
	"testing"
)

// TestPPMTickLabels: tick labels of a plot window must differ from each
// other and read as the tick positions, however narrow the window (an
// enlarged multiplet spans 0.06 ppm; the default labels read "1.4 1.4
// 1.4"), and stay plain integers on the full 0–10 ppm axis (common
// practice for spectrum axes, no source).
func TestPPMTickLabels(t *testing.T) {
	for _, w := range [][2]float64{{1.37, 1.43}, {3.78, 3.83}, {7.08, 7.13}, {4.33, 4.42}, {-0.5, 10.5}, {7.2, 7.2004}} {
		ts := ppmTicks{}.Ticks(w[0], w[1])
		seen := map[string]bool{}
		n := 0
		for _, tk := range ts {
			if tk.Label == "" {
				continue
			}
			n++
			if seen[tk.Label] {
				t.Errorf("window %v: label %q repeated in %+v", w, tk.Label, ts)
			}
			seen[tk.Label] = true
		}
		if n < 2 {
			t.Errorf("window %v: %d labelled ticks", w, n)
		}
	}
	for _, tk := range (ppmTicks{}).Ticks(-0.5, 10.5) {
		if tk.Label != "" && tk.Label != "0" && tk.Label != "5" && tk.Label != "10" {
			t.Errorf("full axis label %q, want integers", tk.Label)
		}
	}
}
