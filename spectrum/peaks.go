package spectrum

import (
	"math"
)

// Peak picking.
//
// A peak is a local maximum of the baseline-corrected trace that rises at
// least MinSNR·σ above the baseline and stands as much (at least
// pickProminence·σ) above the higher of the two valleys that separate it from taller neighbours
// within pickWindowHz (the topographic prominence, which rejects noise ripples
// on the flanks of a line), and that is at least half as wide as the strong
// lines of the spectrum (which rejects single noise points on line tails;
// see dropNarrow). Its position, height and width come from the
// parabola through the three top points of 1/y: for a Lorentzian line
// y = A/(1+((x−x₀)/γ)²) the reciprocal is exactly a parabola, so the vertex
// gives x₀ and A without the bias that a parabola through y itself has
// (common practice, no source; the reciprocal trick follows from the line
// shape). The full width at half height is measured where the line is
// resolved (walking to half height on the trace averaged over ±0.1 Hz, so
// that on a finely sampled 60 MHz trace the noise of a broad water line
// does not stop the walk) and taken from a Lorentzian through the top and two points on
// either side where it is not; for a broad line, whose top three points
// differ by noise only, those two points lie further out (see topWidth).

const (
	pickProminence = 3.0  // minimum prominence in units of σ
	pickWindowHz   = 30.0 // how far the prominence search looks on each side
	// pickMinWidthFrac and pickStrongSNR: see dropNarrow.
	pickMinWidthFrac = 0.5
	pickStrongSNR    = 4.0
	// pickKeepFrac: a maximum at least this fraction of the tallest line is
	// kept however narrow (no noise point reaches it); see dropNarrow.
	pickKeepFrac = 0.05
	// pickKeepSNR: nor is a maximum this far above the noise (Gaussian
	// noise reaches 100σ with probability far below 10⁻¹⁰⁰; aspirin's
	// 7.55 ppm line, S/N 9,700 but 4.5 % of the methyl singlet, was
	// dropped as narrower than half the median width of the strong lines).
	pickKeepSNR = 100.0
	// refineMaxGain: see refine.
	refineMaxGain = 1.5
	// topDropSNR and topWideSNR: see topWidth.
	topDropSNR = 10.0
	topWideSNR = 40.0
)

// line is a picked peak during processing, in point and Hz coordinates.
type line struct {
	idx      int     // index of the top point in the trace
	pos      float64 // fractional point index of the vertex
	ppm      float64
	height   float64
	widthHz  float64 // full width at half height
	snr      float64
	artifact string
}

// pickLines finds the peaks of y (baseline-corrected, on the ascending axis
// ppm) that reach minSNR·sigma. hzPerPoint converts point spacing to Hz.
func pickLines(ppm, y []float64, sigma, minSNR, hzPerPoint float64) []line {
	n := len(y)
	if n < 3 || sigma <= 0 {
		return nil
	}
	thr := minSNR * sigma
	win := int(math.Ceil(pickWindowHz / hzPerPoint))
	if win < 3 {
		win = 3
	}
	minProm := math.Max(pickProminence, minSNR) * sigma
	var out []line
	for i := 1; i < n-1; i++ {
		v := y[i]
		if v < thr || !(v > y[i-1] && v >= y[i+1]) {
			continue
		}
		if !prominent(y, i, win, minProm) {
			continue
		}
		l := refine(y, i)
		l.ppm = pointToPPM(ppm, l.pos)
		l.widthHz = halfWidth(y, i, l.height, l.pos, sigma, crossSmooth(hzPerPoint)) * hzPerPoint
		l.snr = l.height / sigma
		out = append(out, l)
	}
	return dropNarrow(out)
}

// dropNarrow removes weak maxima much narrower than the lines of the
// spectrum: narrower than pickMinWidthFrac times the median width of the
// strong peaks (S/N at least pickStrongSNR times the weakest picked), and
// lower than pickKeepFrac of the tallest line. In white
// noise a single high point on the tail of a line is a local maximum with
// several σ of prominence; it is a fraction of a line width wide.
func dropNarrow(ls []line) []line {
	if len(ls) < 3 {
		return ls
	}
	minSNR := math.Inf(1)
	for _, l := range ls {
		minSNR = math.Min(minSNR, l.snr)
	}
	var w []float64
	for _, l := range ls {
		if l.snr >= pickStrongSNR*minSNR && l.widthHz > 0 {
			w = append(w, l.widthHz)
		}
	}
	if len(w) < 3 {
		return ls
	}
	floor := pickMinWidthFrac * median(w)
	maxSNR := 0.0
	for _, l := range ls {
		maxSNR = math.Max(maxSNR, l.snr)
	}
	out := ls[:0]
	for _, l := range ls {
		// Only weak maxima can be noise points; a strong sharp line (a
		// singlet beside broader unresolved multiplets) is always kept.
		if l.widthHz >= floor || l.snr >= pickKeepFrac*maxSNR || l.snr >= pickKeepSNR {
			out = append(out, l)
		}
	}
	return out
}

// prominent reports whether y[i] stands at least minProm above the higher
// of the lowest points reached on each side before a taller point (or win
// points) is met: its topographic prominence within the window. Each side's
// scan stops as soon as it has gone deep enough, since going further only
// lowers its minimum; v−max(a,b) ≥ p exactly when v−a ≥ p and v−b ≥ p, as
// floating-point subtraction is monotone.
func prominent(y []float64, i, win int, minProm float64) bool {
	v := y[i]
	lo := max(i-win, 0)
	deep := false
	for j := i - 1; j >= lo && !deep; j-- {
		if y[j] > v {
			break
		}
		deep = v-y[j] >= minProm
	}
	if !deep {
		return false
	}
	hi := min(i+win, len(y)-1)
	for j := i + 1; j <= hi; j++ {
		if y[j] > v {
			return false
		}
		if v-y[j] >= minProm {
			return true
		}
	}
	return false
}

// vertex returns the offset (in points, within ±1) of the extremum of the
// parabola through (−1,a), (0,b), (1,c) and its curvature a−2b+c.
func vertex(a, b, c float64) (float64, float64) {
	den := a - 2*b + c
	if den == 0 {
		return 0, 0
	}
	d := 0.5 * (a - c) / den
	return math.Max(-1, math.Min(1, d)), den
}

// refine places the top of the peak at point i between the points, from the
// parabola through 1/y (exact for a Lorentzian) or, when a neighbour is not
// positive, through y.
func refine(y []float64, i int) line {
	a, b, c := y[i-1], y[i], y[i+1]
	l := line{idx: i, pos: float64(i), height: b}
	if a > 0 && c > 0 && b > 0 {
		d, den := vertex(1/a, 1/b, 1/c)
		if den > 0 {
			g := 1/b - 0.25*(1/a-1/c)*d
			// A Lorentzian whose FWHM spans w points peaks at most
			// 1 + 1/w² times as high as its tallest point (top midway
			// between two points: 1 + (½/γ)² with γ = w/2); refineMaxGain
			// 1.5 allows w ≥ 1.4. A taller vertex means an undersampled or
			// non-Lorentzian line, whose extrapolation is not to be trusted
			// (a 300 MHz file at 0.5 Hz per point gave the two lines of a
			// doublet heights 6.2·10⁶ and 2.3·10⁷ from tops of 3.5·10⁶ and
			// 3.3·10⁶).
			if g > 0 && 1/g <= refineMaxGain*b {
				l.pos, l.height = float64(i)+d, 1/g
				return l
			}
		}
	}
	d, den := vertex(a, b, c)
	if den < 0 {
		l.pos = float64(i) + d
		l.height = b - 0.25*(a-c)*d
	}
	return l
}

// pointToPPM maps a fractional point index onto the ppm axis.
func pointToPPM(ppm []float64, pos float64) float64 {
	n := len(ppm)
	k := int(math.Floor(pos))
	if k < 0 {
		k = 0
	}
	if k >= n-1 {
		k = n - 2
	}
	f := pos - float64(k)
	return ppm[k] + f*(ppm[k+1]-ppm[k])
}

// crossSmoothHz: the walk to half height (crossing) averages the trace over
// ±crossSmoothHz, so that on a finely sampled trace (60 MHz at 32,768
// points: 45 points per Hz) the noise of the many points between the top
// and half height does not pass for an overlapping line. Line widths are
// rarely below 0.3 Hz, so the average hardly changes a line's shape.
const crossSmoothHz = 0.1

// crossSmooth is the half window (points) of that average, at most
// crossSmoothMax (an absurdly fine axis must not make every step of the
// walk long).
func crossSmooth(hzPerPoint float64) int {
	if !(hzPerPoint > 0) {
		return 0
	}
	return int(math.Min(crossSmoothHz/hzPerPoint, crossSmoothMax))
}

const crossSmoothMax = 8

// halfWidth measures the full width at half height (in points) of the peak
// at point i with the given height. A side on which the trace turns up
// again before falling to half height (an overlapping neighbour) is replaced
// by the other side; when both are blocked the width follows from the
// curvature of a Lorentzian through the three top points. The walk averages
// the trace over ±r points (crossSmooth).
func halfWidth(y []float64, i int, height, pos, sigma float64, r int) float64 {
	half := height / 2
	left, okL := crossing(y, i, -1, half, 3*sigma, r)
	right, okR := crossing(y, i, +1, half, 3*sigma, r)
	switch {
	case okL && okR && right > left:
		return right - left
	case okL && pos > left:
		return 2 * (pos - left)
	case okR && right > pos:
		return 2 * (right - pos)
	}
	return topWidth(y, i, height, sigma)
}

// topWidth is the full width at half height (points) of a line whose
// half-height points could not be reached, from its top. Normally the
// Lorentzian curvature of the three top points gives it (y” = −2A/γ²,
// FWHM = 2γ). A strong line (at least topWideSNR·σ) whose top drops by less
// than topDropSNR·σ over ±1 point is broad, and those three points differ
// by noise only: then k doubles until the mean of y[i±k] lies topDropSNR·σ
// (or a quarter of the height) below the top, without passing a point below
// a quarter of the height on either side, and the width comes from the
// reciprocal parabola through the top and y[i±k]: 1/y = (1 + ((x−x₀)/γ)²)/A
// has second difference 2k²/(Aγ²) over ±k, so γ = k·√(2/(A·D)) with
// D = 1/y₋ₖ − 2/A + 1/y₊ₖ (exact for a Lorentzian, from the line shape).
// Weak maxima keep the three-point width, which for a noise point is
// narrow, so that dropNarrow can still remove them.
func topWidth(y []float64, i int, height, sigma float64) float64 {
	n := len(y)
	drop := func(k int) float64 { return height - (y[i-k]+y[i+k])/2 }
	k := 1
	if height >= topWideSNR*sigma && drop(1) < topDropSNR*sigma {
		for 2*k <= i && i+2*k < n {
			m := 2 * k
			if math.Min(y[i-m], y[i+m]) < height/4 {
				break
			}
			k = m
			if drop(k) >= math.Min(topDropSNR*sigma, height/4) {
				break
			}
		}
	}
	{
		a, c := y[i-k], y[i+k]
		if d := 1/a - 2/height + 1/c; a > 0 && c > 0 && d > 0 {
			return 2 * float64(k) * math.Sqrt(2/(height*d))
		}
	}
	curv := y[i-1] - 2*y[i] + y[i+1]
	if curv >= 0 {
		return 2
	}
	return 2 * math.Sqrt(-2*height/curv)
}

// crossing walks from point i in direction dir until y (averaged over ±r
// points) falls below level and returns the interpolated crossing point.
// ok is false when the trace first rises more than slack above the lowest
// value met (an overlapping line; smaller upticks are noise) or ends.
func crossing(y []float64, i, dir int, level, slack float64, r int) (float64, bool) {
	at := func(j int) float64 {
		if r == 0 {
			return y[j]
		}
		lo, hi := max(j-r, 0), min(j+r, len(y)-1)
		var sum float64
		for k := lo; k <= hi; k++ {
			sum += y[k]
		}
		return sum / float64(hi-lo+1)
	}
	prev, low := y[i], y[i]
	for j := i + dir; j >= 0 && j < len(y); j += dir {
		v := at(j)
		if v < level {
			f := (prev - level) / (prev - v)
			return float64(j-dir) + float64(dir)*f, true
		}
		if v > low+slack {
			return 0, false
		}
		low = math.Min(low, v)
		prev = v
	}
	return 0, false
}
