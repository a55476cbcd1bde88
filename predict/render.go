package predict

import (
	"math"

	"gonum.org/v1/gonum/dsp/fourier"
)

// exchangeBroadening multiplies the line width of exchangeable protons
// (OH, NH, SH), which are broad in practice (common practice, no source).
const exchangeBroadening = 8

// lorentzReach truncates each Lorentzian at this many half widths from its
// centre (the tails beyond hold 0.3 % of its area).
const lorentzReach = 200

// binFineness: the binned renderer is used only where the grid step is at
// most 1/binFineness of the half width; its error is then below
// ¼·(step/γ)² ≈ 0.4 % of the local peak height (usually far less).
const binFineness = 8

// Render draws the prediction as a sum of Lorentzian lines of full width at
// half maximum lineWidthHz (exchangeable signals broader) on points
// equally spaced points from the lower to the higher of fromPPM and toPPM.
// Each line has unit-area shape times its intensity (area in ppm), so the
// integral of a signal is proportional to its number of protons. ppm is
// ascending. It returns nil slices when points < 2 or the width is not
// positive.
func Render(p *Prediction, fromPPM, toPPM float64, points int, lineWidthHz float64) (ppm, y []float64) {
	if p == nil || points < 2 || !(lineWidthHz > 0) || !(p.FieldMHz > 0) {
		return nil, nil
	}
	lo, hi := math.Min(fromPPM, toPPM), math.Max(fromPPM, toPPM)
	ppm = make([]float64, points)
	y = make([]float64, points)
	step := (hi - lo) / float64(points-1)
	for i := range ppm {
		ppm[i] = lo + float64(i)*step
	}
	broad := map[string]bool{}
	for _, s := range p.Signals {
		broad[s.Label] = s.Exchangeable
	}
	var sharp, wide []Line
	for _, l := range p.Lines {
		if broad[l.Signal] {
			wide = append(wide, l)
		} else {
			sharp = append(sharp, l)
		}
	}
	gamma := lineWidthHz / 2 / p.FieldMHz
	AddLorentzians(y, lo, step, sharp, 0, gamma)
	AddLorentzians(y, lo, step, wide, 0, gamma*exchangeBroadening)
	return ppm, y
}

// AddLorentzians adds to y, sampled at lo + k·step (k < len(y), step > 0),
// each line's intensity times a unit-area Lorentzian of half width at half
// maximum gamma (ppm) centred at its PPM + shift, truncated at 200 half
// widths. Many lines on a fine grid (step ≤ gamma/8) are binned onto the
// grid (linear weights, which keep each line's area and centre) and
// convolved with the Lorentzian by FFT; otherwise each line is added
// point by point. The two agree within ¼·(step/gamma)² of the local peak
// height (TestAddLorentziansBinnedMatchesDirect).
func AddLorentzians(y []float64, lo, step float64, lines []Line, shift, gamma float64) {
	if len(y) == 0 || len(lines) == 0 || !(gamma > 0) || !(step > 0) {
		return
	}
	if m, k, ok := binnedPlan(len(y), len(lines), step, gamma); ok {
		addBinned(y, lo, step, lines, shift, gamma, m, k)
		return
	}
	addDirect(y, lo, step, lines, shift, gamma)
}

// binnedPlan decides between the two renderers: binned when the grid is
// fine enough and its FFTs (size m, the next power of two ≥ n + 2k, k the
// reach in points) cost less than the lines' points.
func binnedPlan(n, nLines int, step, gamma float64) (m, k int, ok bool) {
	if step > gamma/binFineness {
		return 0, 0, false
	}
	k = int(math.Ceil(lorentzReach * gamma / step))
	direct := float64(nLines) * float64(min(n, 2*k+1))
	m = 1
	for m < n+2*k {
		m <<= 1
	}
	fft := 3 * 6 * float64(m) * math.Log2(float64(m)) // three transforms, a few flops per point and level
	return m, k, direct > fft+float64(nLines)
}

// addDirect adds each line over the grid points within its reach.
func addDirect(y []float64, lo, step float64, lines []Line, shift, gamma float64) {
	reach := lorentzReach * gamma
	n := len(y)
	for _, l := range lines {
		x0 := l.PPM + shift
		i0 := max(0, int(math.Floor((x0-reach-lo)/step)))
		i1 := min(n-1, int(math.Ceil((x0+reach-lo)/step)))
		c := l.Intensity * gamma / math.Pi
		for i := i0; i <= i1; i++ {
			d := lo + float64(i)*step - x0
			y[i] += c / (d*d + gamma*gamma)
		}
	}
}

// addBinned bins the lines onto the grid extended by k points on each side
// and convolves the bins with the Lorentzian (circular convolution of
// length m ≥ n + 2k: no output point wraps around).
func addBinned(y []float64, lo, step float64, lines []Line, shift, gamma float64, m, k int) {
	n := len(y)
	h := make([]float64, m)
	for _, l := range lines {
		pos := (l.PPM+shift-lo)/step + float64(k)
		if !(pos >= 0) || pos >= float64(n+2*k-1) {
			continue // beyond the reach of every grid point (or NaN)
		}
		i := int(pos)
		f := pos - float64(i)
		h[i] += l.Intensity * (1 - f)
		h[i+1] += l.Intensity * f
	}
	g := make([]float64, m)
	c := gamma / math.Pi
	for j := 0; j <= k; j++ {
		d := float64(j) * step
		v := c / (d*d + gamma*gamma)
		g[j] = v
		if j > 0 {
			g[m-j] = v
		}
	}
	t := fourier.NewFFT(m)
	hc := t.Coefficients(nil, h)
	gc := t.Coefficients(nil, g)
	for i := range hc {
		hc[i] *= gc[i]
	}
	r := t.Sequence(h, hc)
	inv := 1 / float64(m)
	for i := range y {
		y[i] += r[i+k] * inv
	}
}
