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
// slice. It runs in linear expected time.
func median(v []float64) float64 {
	var sel selector
	return sel.median(v)
}

// selector computes medians, keeping its scratch buffer between calls.
type selector struct {
	buf []float64
}

// median is the median of v (see the function median), reordering v.
func (sel *selector) median(v []float64) float64 {
	n := len(v)
	if n == 0 {
		return 0
	}
	if n >= sampledMinLen {
		if m, ok := sel.sampledMedian(v); ok {
			return m
		}
	}
	hi := selectKth(v, n/2)
	if n%2 == 1 {
		return hi
	}
	return (maxOf(v[:n/2]) + hi) / 2
}

// maxOf is the largest value of a non-empty slice.
func maxOf(v []float64) float64 {
	m := v[0]
	for _, x := range v[1:] {
		if x > m {
			m = x
		}
	}
	return m
}

// sampledMinLen is the length from which median first narrows the values
// down with a sample (see sampledMedian).
const sampledMinLen = 4096

// sampledMedian finds the median of a long slice in one pass over it: the
// values of a regular sample of about n^⅔ points just below and above the
// sample's median bracket the true median with near certainty (the idea of
// Floyd & Rivest 1975, Commun. ACM 18, 165); one pass counts the values below
// the bracket and copies those inside it, and a selection among the few
// copied values finishes. The counting is branch-free, so the pass does not
// pay for unpredictable comparisons. ok is false, and v is unchanged, when
// the bracket misses the median or holds too many values (heavy ties); the
// result is then left to the caller's full selection. The result is exact
// either way.
func (sel *selector) sampledMedian(v []float64) (float64, bool) {
	n := len(v)
	k := n / 2
	needLower := n%2 == 0 // the (k−1)-th value is needed too
	// A sample of s points taken every stride; the median's rank in it has
	// a standard deviation of about √s/2, and the bracket spans ±2√s ranks
	// (±4 standard deviations: it misses about once in 10⁴ calls).
	s := int(math.Cbrt(float64(n) * float64(n)))
	stride := n / s
	smp := sel.scratch(s)
	for i := range smp {
		smp[i] = v[i*stride]
	}
	r := k / stride
	d := 2 * int(math.Sqrt(float64(s)))
	if r-d < 0 || r+d >= s {
		return 0, false
	}
	loV := selectKth(smp, r-d)
	hiV := selectKth(smp[r-d:], 2*d)
	// Values in [loV, hiV] expected: about 2d·stride; allow twice that. The
	// sample is no longer needed and its memory is reused.
	buf := sel.scratch(4*d*stride + 64)
	below, m := 0, 0
	last := len(buf) - 1
	for _, x := range v {
		below += b2i(x < loV)
		buf[m] = x
		m += b2i(x >= loV) & b2i(x <= hiV)
		if m == last {
			return 0, false
		}
	}
	first := below
	if needLower {
		first++
	}
	if first > k || k >= below+m {
		return 0, false
	}
	in := buf[:m]
	hi := selectKth(in, k-below)
	if !needLower {
		return hi, true
	}
	return (maxOf(in[:k-below]) + hi) / 2, true
}

// scratch returns the selector's buffer with length n, grown if needed.
func (sel *selector) scratch(n int) []float64 {
	if cap(sel.buf) < n {
		sel.buf = make([]float64, n)
	}
	return sel.buf[:n]
}

// b2i is 1 for true and 0 for false (compiled without a branch).
func b2i(b bool) int {
	if b {
		return 1
	}
	return 0
}

// selectKth reorders v so that v[k] holds the value it would have if v were
// sorted, with no larger value before it and no smaller one after it, and
// returns v[k]. The values must not be NaN.
//
// It is the Floyd–Rivest selection (Floyd & Rivest 1975, Commun. ACM 18,
// 173, Algorithm 489): on a long range it first selects, recursively, from a
// small sample around position k, so that the partitioning element lies
// very close to the target and each pass removes nearly all the range;
// about n + min(k, n−k) comparisons against about 3n for quickselect.
func selectKth(v []float64, k int) float64 {
	floydRivest(v, 0, len(v)-1, k)
	return v[k]
}

// floydRivest narrows v[left..right] around position k (see selectKth).
func floydRivest(v []float64, left, right, k int) {
	for right > left {
		if right-left < 16 {
			insertionSort(v[left : right+1])
			return
		}
		if right-left > 600 {
			// Select from a sample of size s around k, placed so that the
			// k-th value lies in it with high probability.
			n := float64(right - left + 1)
			i := float64(k - left + 1)
			z := math.Log(n)
			s := 0.5 * math.Exp(2*z/3)
			sd := 0.5 * math.Sqrt(z*s*(n-s)/n)
			if i < n/2 {
				sd = -sd
			}
			lo := max(left, int(float64(k)-i*s/n+sd))
			hi := min(right, int(float64(k)+(n-i)*s/n+sd))
			floydRivest(v, lo, hi, k)
		}
		// Partition v[left..right] around t = v[k].
		t := v[k]
		i, j := left, right
		v[left], v[k] = v[k], v[left]
		if v[right] > t {
			v[right], v[left] = v[left], v[right]
		}
		for i < j {
			v[i], v[j] = v[j], v[i]
			i++
			j--
			for v[i] < t {
				i++
			}
			for v[j] > t {
				j--
			}
		}
		if v[left] == t {
			v[left], v[j] = v[j], v[left]
		} else {
			j++
			v[j], v[right] = v[right], v[j]
		}
		// Now v[j] = t, nothing larger before it and nothing smaller after.
		if j <= k {
			left = j + 1
		}
		if k <= j {
			right = j - 1
		}
	}
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
	var sel selector
	med := sel.median(c)
	for i, x := range c {
		c[i] = math.Abs(x - med)
	}
	return madScale * sel.median(c)
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
