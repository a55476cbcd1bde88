package spectrum

import (
	"math"
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
// slice. It runs in linear expected time (quickselect).
func median(v []float64) float64 {
	n := len(v)
	if n == 0 {
		return 0
	}
	hi := selectKth(v, n/2)
	if n%2 == 1 {
		return hi
	}
	// The lower middle is the largest value left of position n/2.
	lo := v[0]
	for _, x := range v[1 : n/2] {
		if x > lo {
			lo = x
		}
	}
	return (lo + hi) / 2
}

// selectKth reorders v so that v[k] holds the value it would have if v were
// sorted, with no larger value before it and no smaller one after it, and
// returns v[k] (Hoare's quickselect with a median-of-three pivot). The
// values must not be NaN.
func selectKth(v []float64, k int) float64 {
	lo, hi := 0, len(v)-1
	for hi > lo {
		if hi-lo < 16 {
			insertionSort(v[lo : hi+1])
			return v[k]
		}
		p := median3(v[lo], v[lo+(hi-lo)/2], v[hi])
		i, j := lo, hi
		for i <= j {
			for v[i] < p {
				i++
			}
			for v[j] > p {
				j--
			}
			if i <= j {
				v[i], v[j] = v[j], v[i]
				i++
				j--
			}
		}
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return v[k]
		}
	}
	return v[k]
}

// median3 is the middle one of a, b and c.
func median3(a, b, c float64) float64 {
	if a > b {
		a, b = b, a
	}
	// Now a ≤ b: the middle is b unless c lies below it.
	if c < b {
		if c > a {
			return c
		}
		return a
	}
	return b
}

// insertionSort sorts a short slice in place.
func insertionSort(v []float64) {
	for i := 1; i < len(v); i++ {
		x := v[i]
		j := i
		for ; j > 0 && v[j-1] > x; j-- {
			v[j] = v[j-1]
		}
		v[j] = x
	}
}

// madSigma is the MAD estimate of σ for the values of v (v is not changed).
func madSigma(v []float64) float64 {
	return madSigmaInPlace(append([]float64(nil), v...))
}

// madSigmaInPlace is madSigma for a scratch slice, which it overwrites with
// the absolute deviations: one buffer serves both quickselects.
func madSigmaInPlace(c []float64) float64 {
	if len(c) == 0 {
		return 0
	}
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
	return madSigmaInPlace(d) / math.Sqrt2
}

// EstimateNoise returns the robust noise level σ of a trace: the MAD of the
// first differences over √2 (see the package notes in noise.go). It is the
// estimate to use on a trace that has not been baseline-corrected.
func EstimateNoise(y []float64) float64 { return diffNoise(y) }

// regionNoise is the MAD σ of y over the points where free is true, or over
// all points when fewer than 64 are free.
func regionNoise(y []float64, free []bool) float64 {
	nfree := 0
	for _, f := range free {
		if f {
			nfree++
		}
	}
	if nfree < 64 {
		return madSigma(y)
	}
	v := make([]float64, 0, nfree)
	for i, f := range free {
		if f {
			v = append(v, y[i])
		}
	}
	return madSigmaInPlace(v)
}
