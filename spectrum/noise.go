package spectrum

import (
	"math"
	"sort"
)

// Noise estimation.
//
// The noise level σ is a robust standard deviation: 1.4826 times the median
// absolute deviation (MAD) from the median, which equals σ for Gaussian noise
// and ignores the minority of points that carry signal (Rousseeuw & Croux
// 1993, J. Am. Stat. Assoc. 88, 1273; the constant 1/Φ⁻¹(¾) ≈ 1.4826).
//
// Process measures it on the baseline-corrected trace over the points the
// baseline step judged signal-free (see baseline.go), so that correlated
// noise (zero filling, apodisation) does not bias it. Before a baseline is
// known, diffNoise uses the MAD of the first differences divided by √2,
// which is insensitive to a slowly varying baseline.

// madScale converts a median absolute deviation to σ for Gaussian noise.
const madScale = 1.482602218505602

// median returns the median of v, reordering v. It returns 0 for an empty
// slice.
func median(v []float64) float64 {
	n := len(v)
	if n == 0 {
		return 0
	}
	sort.Float64s(v)
	if n%2 == 1 {
		return v[n/2]
	}
	return (v[n/2-1] + v[n/2]) / 2
}

// madSigma is the MAD estimate of σ for the values of v (v is not changed).
func madSigma(v []float64) float64 {
	if len(v) == 0 {
		return 0
	}
	c := append([]float64(nil), v...)
	med := median(c)
	for i, x := range c {
		c[i] = math.Abs(x - med)
	}
	return madScale * median(c)
}

// diffNoise estimates σ from the first differences of y, which remove a
// constant or slowly varying baseline: Var(yᵢ₊₁−yᵢ) = 2σ² for white noise.
func diffNoise(y []float64) float64 {
	if len(y) < 2 {
		return 0
	}
	d := make([]float64, len(y)-1)
	for i := range d {
		d[i] = y[i+1] - y[i]
	}
	return madSigma(d) / math.Sqrt2
}

// EstimateNoise returns the robust noise level σ of a trace: the MAD of the
// first differences over √2 (see the package notes in noise.go). It is the
// estimate to use on a trace that has not been baseline-corrected.
func EstimateNoise(y []float64) float64 { return diffNoise(y) }

// regionNoise is the MAD σ of y over the points where free is true, or over
// all points when fewer than 64 are free.
func regionNoise(y []float64, free []bool) float64 {
	v := make([]float64, 0, len(y))
	for i, f := range free {
		if f {
			v = append(v, y[i])
		}
	}
	if len(v) < 64 {
		return madSigma(y)
	}
	return madSigma(v)
}
