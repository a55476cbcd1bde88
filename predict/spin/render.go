package spin

import "math"

// Render draws lines as Lorentzians of full width at half height widthHz on
// n points from fromPPM to toPPM (either order; n ≥ 2), at the 1H frequency
// fieldMHz. A line of intensity I alone peaks at height I. It returns the
// ppm axis and the trace; nil slices when n < 2 or widthHz ≤ 0.
func Render(lines []Line, fieldMHz, fromPPM, toPPM float64, n int, widthHz float64) (ppm, y []float64) {
	if n < 2 || !(widthHz > 0) || !(fieldMHz > 0) {
		return nil, nil
	}
	ppm, y = make([]float64, n), make([]float64, n)
	g2 := widthHz * widthHz / 4
	step := (toPPM - fromPPM) / float64(n-1)
	for i := range ppm {
		ppm[i] = fromPPM + step*float64(i)
	}
	// Lines further than 1000 widths contribute < 1e-6 of their height.
	cut := 1000 * widthHz
	for _, l := range lines {
		for i, p := range ppm {
			d := p*fieldMHz - l.Hz
			if math.Abs(d) < cut {
				y[i] += l.Intensity * g2 / (d*d + g2)
			}
		}
	}
	return ppm, y
}

// Span returns the ppm range covered by lines, widened by pad ppm on each
// side; (0, 0) for no lines.
func Span(lines []Line, pad float64) (lo, hi float64) {
	if len(lines) == 0 {
		return 0, 0
	}
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, l := range lines {
		lo, hi = math.Min(lo, l.PPM), math.Max(hi, l.PPM)
	}
	return lo - pad, hi + pad
}
