package spectrum

import (
	"math"
)

// Baseline correction.
//
// The baseline is a Whittaker smoother (Eilers 2003, Anal. Chem. 75, 3631):
// the z minimising Σ wᵢ(yᵢ − zᵢ)² + λ Σ (Δ²zᵢ)², found by solving the
// pentadiagonal system (W + λDᵀD) z = W y with a banded LDLᵀ (Cholesky)
// factorisation in O(n). As in asymmetric least squares (Eilers & Boelens
// 2005, "Baseline correction with asymmetric least squares smoothing")
// the weights are re-estimated from the residuals at each pass; instead of
// the soft asymmetric weights p / 1−p we use a hard, noise-scaled rule:
// a point keeps weight 1 while its residual stays below baselineK·σ and gets
// weight 0 (together with its neighbours) when it rises above it. Points
// below the baseline keep full weight, so the baseline runs through the
// middle of the noise rather than along its lower envelope, which would bias
// every integral.
//
// The smoother runs on block means of at most baselineMaxPoints points and
// is interpolated back, which keeps a 262,144-point trace fast; the baseline
// is smooth on a far larger scale than a block.

const (
	baselineMaxPoints = 4096 // decimated length for the smoother
	baselineK         = 2.5  // residual threshold in units of the block noise
	baselineDilate    = 2    // blocks on each side of a signal block also excluded
	baselineIter      = 15   // maximum reweighting passes (stop when ≤ 0.1 % of the weights change)
	// baselinePeriodPPM is the shortest period (ppm) the baseline may follow:
	// the smoother's half-power point, 2π·λ^(1/4) points.
	baselinePeriodPPM = 1.0
)

// whittaker solves (W + λDᵀD) z = W y for the second-difference penalty D
// and writes z into dst, which must have len(y). It returns false when the
// system is singular (fewer than three weighted points, or a numerical
// breakdown).
func whittaker(dst, y, w []float64, lambda float64) bool {
	return newSmoother(len(y), lambda).solve(dst, y, w)
}

// smoother holds the penalty bands and factorisation buffers of a Whittaker
// smoother of fixed length, so that reweighting passes do not allocate.
type smoother struct {
	p0, p1, p2 []float64 // bands of λDᵀD: diagonal, first and second super-diagonal
	d, l1, l2  []float64 // LDLᵀ: D, L[i][i-1], L[i][i-2]
}

func newSmoother(n int, lambda float64) *smoother {
	s := &smoother{
		p0: make([]float64, n), p1: make([]float64, n), p2: make([]float64, n),
		d: make([]float64, n), l1: make([]float64, n), l2: make([]float64, n),
	}
	for i := 0; i < n-2; i++ {
		// Row i of D is (1, -2, 1) at columns i, i+1, i+2; add its outer product.
		s.p0[i] += lambda
		s.p0[i+1] += 4 * lambda
		s.p0[i+2] += lambda
		s.p1[i] -= 2 * lambda
		s.p1[i+1] -= 2 * lambda
		s.p2[i] += lambda
	}
	return s
}

// solve writes the smoothed y with weights w into dst.
func (s *smoother) solve(dst, y, w []float64) bool {
	n := len(y)
	if n < 3 {
		copy(dst, y)
		return true
	}
	weighted := 0
	for _, v := range w {
		if v > 0 {
			weighted++
		}
	}
	if weighted < 3 {
		return false
	}
	d, L1, L2 := s.d, s.l1, s.l2
	for i := 0; i < n; i++ {
		di := s.p0[i] + w[i]
		L1[i], L2[i] = 0, 0
		if i >= 2 {
			L2[i] = s.p2[i-2] / d[i-2]
			di -= L2[i] * L2[i] * d[i-2]
		}
		if i >= 1 {
			c := s.p1[i-1]
			if i >= 2 {
				c -= L2[i] * L1[i-1] * d[i-2]
			}
			L1[i] = c / d[i-1]
			di -= L1[i] * L1[i] * d[i-1]
		}
		if !(di > 1e-300) {
			return false
		}
		d[i] = di
	}
	// Forward substitution L u = W y, then D v = u, then Lᵀ z = v.
	for i := 0; i < n; i++ {
		u := w[i] * y[i]
		if i >= 1 {
			u -= L1[i] * dst[i-1]
		}
		if i >= 2 {
			u -= L2[i] * dst[i-2]
		}
		dst[i] = u
	}
	for i := range dst {
		dst[i] /= d[i]
	}
	for i := n - 1; i >= 0; i-- {
		if i+1 < n {
			dst[i] -= L1[i+1] * dst[i+1]
		}
		if i+2 < n {
			dst[i] -= L2[i+2] * dst[i+2]
		}
	}
	return true
}

func maxInt(a, b int) int {
	if a > b {
		return a
	}
	return b
}

// baselineResult is the estimated baseline and which points of the trace
// were judged signal-free.
type baselineResult struct {
	Z      []float64 // baseline at every point
	Free   []bool    // point lies in a block that ended with weight 1
	Blocks int       // block size used for the smoother
}

// estimateBaseline returns the baseline of y sampled at pointsPerPPM points
// per ppm.
func estimateBaseline(y []float64, pointsPerPPM float64) baselineResult {
	n := len(y)
	b := (n + baselineMaxPoints - 1) / baselineMaxPoints
	if b < 1 {
		b = 1
	}
	m := (n + b - 1) / b
	x := blockMeans(y, b, m)
	s := pointsPerPPM / float64(b) * baselinePeriodPPM / (2 * math.Pi)
	lambda := math.Max(math.Pow(s, 4), 1)
	w := make([]float64, m)
	for i := range w {
		w[i] = 1
	}
	z := make([]float64, m)
	r := make([]float64, m)
	sigma := diffNoise(x)
	sm := newSmoother(m, lambda)
	for it := 0; it < baselineIter; it++ {
		if !sm.solve(z, x, w) {
			// Too few signal-free blocks: fall back to the median level.
			med := median(append([]float64(nil), x...))
			for i := range z {
				z[i] = med
			}
			break
		}
		for i := range r {
			r[i] = x[i] - z[i]
		}
		if it == 1 {
			// The noise of the block means, measured once the first pass
			// has removed most of the baseline.
			if sg := madSigma(r); sg > 0 {
				sigma = sg
			}
		}
		if reweight(w, r, baselineK*sigma) <= m/1000 && it > 1 {
			break
		}
	}
	res := baselineResult{Z: interpolateBlocks(z, b, n), Free: make([]bool, n), Blocks: b}
	for k, wk := range w {
		if wk > 0 {
			free := res.Free[k*b : min((k+1)*b, n)]
			for i := range free {
				free[i] = true
			}
		}
	}
	return res
}

// reweight sets w to 1 where r stays below limit and 0 at and around points
// above it. It returns how many weights changed.
func reweight(w, r []float64, limit float64) int {
	m := len(w)
	nw := make([]float64, m)
	for i := range nw {
		nw[i] = 1
	}
	for i, v := range r {
		if v > limit {
			for j := maxInt(i-baselineDilate, 0); j <= i+baselineDilate && j < m; j++ {
				nw[j] = 0
			}
		}
	}
	changed := 0
	for i := range w {
		if w[i] != nw[i] {
			changed++
		}
		w[i] = nw[i]
	}
	return changed
}

// blockMeans averages y over consecutive blocks of b points.
func blockMeans(y []float64, b, m int) []float64 {
	x := make([]float64, m)
	for k := 0; k < m; k++ {
		lo, hi := k*b, (k+1)*b
		if hi > len(y) {
			hi = len(y)
		}
		var s float64
		for _, v := range y[lo:hi] {
			s += v
		}
		x[k] = s / float64(hi-lo)
	}
	return x
}

// interpolateBlocks expands block values z (block size b) back to n points
// by linear interpolation between block centres.
func interpolateBlocks(z []float64, b, n int) []float64 {
	out := make([]float64, n)
	if b == 1 {
		copy(out, z)
		return out
	}
	m := len(z)
	half := float64(b-1) / 2
	for i := range out {
		t := (float64(i) - half) / float64(b)
		if t < 0 {
			out[i] = z[0]
			continue
		}
		k := int(t) // = ⌊t⌋ for t ≥ 0
		if k >= m-1 {
			out[i] = z[m-1]
			continue
		}
		f := t - float64(k)
		out[i] = z[k]*(1-f) + z[k+1]*f
	}
	return out
}
