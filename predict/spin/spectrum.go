package spin

import (
	"cmp"
	"math"
	"slices"
)

// Spectrum returns the physical lines of r: the shares of all groups at one
// frequency (within 0.001 Hz) summed, each line attributed to the group with
// the largest share, sorted by frequency. Lines whose total is not positive
// (cancelled shares) are dropped. The total intensity equals that of
// r.Lines.
func (r *Result) Spectrum() []Line {
	ls := append([]Line(nil), r.Lines...)
	slices.SortFunc(ls, func(x, y Line) int {
		if c := cmp.Compare(x.Hz, y.Hz); c != 0 {
			return c
		}
		return cmp.Compare(x.Group, y.Group)
	})
	var out []Line
	var best []float64 // largest share of the current output line
	start := 0.0
	for _, l := range ls {
		n := len(out)
		if n == 0 || l.Hz-start > mergeTolHz {
			start = l.Hz
			out = append(out, l)
			best = append(best, l.Intensity)
			continue
		}
		q := &out[n-1]
		if t := q.Intensity + l.Intensity; q.Intensity*l.Intensity > 0 && t != 0 {
			q.Hz = (q.Hz*q.Intensity + l.Hz*l.Intensity) / t
			q.PPM = (q.PPM*q.Intensity + l.PPM*l.Intensity) / t
		}
		q.Intensity += l.Intensity
		if l.Intensity > best[n-1] {
			best[n-1], q.Group = l.Intensity, l.Group
		}
	}
	kept := out[:0]
	for _, l := range out {
		if l.Intensity > minIntensity && !math.IsNaN(l.Intensity) {
			kept = append(kept, l)
		}
	}
	return kept
}
