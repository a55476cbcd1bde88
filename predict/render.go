package predict

import "math"

// exchangeBroadening multiplies the line width of exchangeable protons
// (OH, NH, SH), which are broad in practice (common practice, no source).
const exchangeBroadening = 8

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
	for _, l := range p.Lines {
		w := lineWidthHz
		if broad[l.Signal] {
			w *= exchangeBroadening
		}
		addLorentzian(ppm, y, l.PPM, l.Intensity, w/2/p.FieldMHz, lo, step)
	}
	return ppm, y
}

// addLorentzian adds a unit-area Lorentzian of half width gamma (ppm) at
// x0 scaled by in, over the grid points within 200 half widths.
func addLorentzian(ppm, y []float64, x0, in, gamma, lo, step float64) {
	reach := 200 * gamma
	i0 := max(0, int((x0-reach-lo)/step))
	i1 := min(len(ppm)-1, int((x0+reach-lo)/step)+1)
	if i1 < 0 || i0 >= len(ppm) {
		return
	}
	for i := i0; i <= i1; i++ {
		d := ppm[i] - x0
		y[i] += in * gamma / math.Pi / (d*d + gamma*gamma)
	}
}
