package compare

import (
	"math"
	"sort"

	"shiftwise/predict"
	"shiftwise/spectrum"
)

// shapeScore compares the shape of each compound multiplet with the lines
// predicted for the signals given to it: the lines are moved together so
// that their H-weighted centre sits at the multiplet's centre, rendered as
// Lorentzians of the measured line width on the trace's points, and
// correlated (Pearson) with the measured trace over the multiplet's region.
// It returns the H-weighted mean of max(0, r) and ok=false when there is no
// trace to compare with.
func (ev *evaluation) shapeScore(ms []mplet, trace *spectrum.Spectrum, field float64) (float64, bool) {
	if trace == nil || len(trace.PPM) < 16 || field <= 0 {
		return 0, false
	}
	hosted := map[int][]int{}
	for i, j := range ev.sigM {
		if j >= 0 && !ev.pred.Signals[i].Exchangeable {
			hosted[j] = append(hosted[j], i)
		}
	}
	var sum, wsum float64
	for j, sigs := range hosted {
		r, ok := ev.multipletShape(ms[j], sigs, trace, field)
		if !ok {
			continue
		}
		w := 0.0
		for _, i := range sigs {
			w += float64(ev.pred.Signals[i].NH)
		}
		sum += w * math.Max(0, r)
		wsum += w
	}
	if wsum == 0 {
		return 0, false
	}
	return sum / wsum, true
}

func (ev *evaluation) multipletShape(m mplet, sigs []int, trace *spectrum.Spectrum, field float64) (float64, bool) {
	lo := sort.SearchFloat64s(trace.PPM, m.from)
	hi := sort.SearchFloat64s(trace.PPM, m.to)
	if hi-lo < 8 {
		return 0, false
	}
	labels := map[string]bool{}
	var centre, nh float64
	for _, i := range sigs {
		s := ev.pred.Signals[i]
		labels[s.Label] = true
		centre += float64(s.NH) * s.ShiftPPM
		nh += float64(s.NH)
	}
	centre /= nh
	delta := m.ppm - centre
	width := 1.0 // Hz, FWHM
	if w, ok := medianPeakWidth(m); ok {
		width = math.Max(0.3, w)
	}
	g := width / 2 / field // half width at half height, ppm
	n := hi - lo
	var ls []predict.Line
	for _, l := range ev.pred.Lines {
		if labels[l.Signal] {
			ls = append(ls, l)
		}
	}
	model := make([]float64, n)
	if step, ok := uniformStep(trace.PPM[lo:hi]); ok {
		// Thousands of lines (second-order patterns at low field) are
		// binned and convolved rather than drawn one by one.
		predict.AddLorentzians(model, trace.PPM[lo], step, ls, delta, g)
	} else {
		for _, l := range ls {
			x0 := l.PPM + delta
			for k := 0; k < n; k++ {
				d := (trace.PPM[lo+k] - x0) / g
				model[k] += l.Intensity / (1 + d*d)
			}
		}
	}
	return pearson(model, trace.Y[lo:hi]), true
}

// medianPeakWidth is the median full width at half height (Hz) of m's
// peaks that report one; ok is false when none does.
func medianPeakWidth(m mplet) (float64, bool) {
	ws := make([]float64, 0, len(m.pk))
	for _, p := range m.pk {
		if p.WidthHz > 0 {
			ws = append(ws, p.WidthHz)
		}
	}
	if len(ws) == 0 {
		return 0, false
	}
	sort.Float64s(ws)
	return ws[len(ws)/2], true
}

// uniformStep returns the step of x when its points are equally spaced
// (within 0.1 % of a step) and ascending.
func uniformStep(x []float64) (float64, bool) {
	n := len(x)
	if n < 2 {
		return 0, false
	}
	step := (x[n-1] - x[0]) / float64(n-1)
	if !(step > 0) {
		return 0, false
	}
	for k, v := range x {
		if math.Abs(v-(x[0]+float64(k)*step)) > 1e-3*step {
			return 0, false
		}
	}
	return step, true
}

// pearson is the correlation coefficient of a and b (0 when either is flat).
func pearson(a, b []float64) float64 {
	n := float64(len(a))
	var ma, mb float64
	for k := range a {
		ma += a[k]
		mb += b[k]
	}
	ma /= n
	mb /= n
	var sab, saa, sbb float64
	for k := range a {
		da, db := a[k]-ma, b[k]-mb
		sab += da * db
		saa += da * da
		sbb += db * db
	}
	if saa == 0 || sbb == 0 {
		return 0
	}
	return sab / math.Sqrt(saa*sbb)
}
