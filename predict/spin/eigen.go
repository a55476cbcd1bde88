package spin

import (
	"math"
	"runtime"

	"gonum.org/v1/gonum/blas"
	lapackgo "gonum.org/v1/gonum/lapack/gonum"
)

// symEigen diagonalises the symmetric n×n matrix a (row-major, upper
// triangle read) in place: on return column j of a is the eigenvector of
// vals[j]. The eigenvalues are not sorted. It returns false if the QL
// iteration did not converge.
//
// The Householder reduction to tridiagonal form and the formation of its
// orthogonal matrix Q use gonum's LAPACK (Dsytrd, Dorgtr), as mat.EigenSym
// does. The tridiagonal eigenproblem is solved by the implicit QL method
// with shifts (the tql2 algorithm of EISPACK). Unlike gonum's Dsteqr, which
// applies every plane rotation to two columns of the row-major Q (a stride
// of n between elements, one cache line per element), the rotations of
// several QL sweeps are stored and then applied row by row, so each row of
// Q is read once per batch and stays in L1 cache. Every element undergoes
// the same operations in the same order as in the column-wise scheme.
func symEigen(a []float64, n int) (vals []float64, ok bool) {
	d := make([]float64, n)
	if n == 1 {
		d[0] = a[0]
		a[0] = 1
		return d, true
	}
	// Scale entries of extreme size into a safe range, as LAPACK's Dsyev
	// does (user spin files may hold any finite shift or J).
	anrm := 0.0
	for _, v := range a {
		anrm = math.Max(anrm, math.Abs(v))
	}
	sigma := 1.0
	if anrm > 0 && anrm < 0x1p-480 {
		sigma = 0x1p-480 / anrm
	} else if anrm > 0x1p480 {
		sigma = 0x1p480 / anrm
	}
	if sigma != 1 {
		for i := range a {
			a[i] *= sigma
		}
	}
	var impl lapackgo.Implementation
	e := make([]float64, n) // e[n-1] stays 0
	tau := make([]float64, n-1)
	query := []float64{0}
	impl.Dsytrd(blas.Upper, n, a, n, d, e, tau, query, -1)
	lwork := int(query[0])
	impl.Dorgtr(blas.Upper, n, a, n, tau, query, -1)
	lwork = max(lwork, int(query[0]), 1)
	work := make([]float64, lwork)
	impl.Dsytrd(blas.Upper, n, a, n, d, e, tau, work, lwork)
	impl.Dorgtr(blas.Upper, n, a, n, tau, work, lwork)
	e[n-1] = 0
	if !tql(d, e, a, n) {
		return nil, false
	}
	if sigma != 1 {
		for i := range d {
			d[i] /= sigma
		}
	}
	return d, true
}

// rotBatch collects the plane rotations of successive QL sweeps; flush
// applies them to the columns of the row-major n×n matrix z, row by row.
type rotBatch struct {
	c, s   []float64
	sweeps []sweep
}

// sweep is one QL sweep: rotations hi, hi−1, …, lo (rotation i mixes
// columns i and i+1), stored from index off of c and s.
type sweep struct{ hi, lo, off int }

// maxBatch is the number of stored rotations, in units of n, after which
// they are applied to Q.
const maxBatch = 16

func (rb *rotBatch) flush(z []float64, n int) {
	if len(rb.sweeps) == 0 {
		return
	}
	// Rows are independent: large matrices are shared among up to
	// GOMAXPROCS goroutines in runs of rows that are multiples of 4.
	parts := min(runtime.GOMAXPROCS(0), n/minFlushRows)
	if parts <= 1 {
		rb.apply(z, n, 0, n)
	} else {
		per := (n/parts + 3) &^ 3
		parallel(parts, func(p int) {
			rb.apply(z, n, min(p*per, n), min((p+1)*per, n))
		})
	}
	rb.c, rb.s, rb.sweeps = rb.c[:0], rb.s[:0], rb.sweeps[:0]
}

// minFlushRows is the number of rows below which flush does not split its
// work among goroutines.
const minFlushRows = 64

// apply applies the stored rotations to rows lo … hi−1 of z.
func (rb *rotBatch) apply(z []float64, n, lo, hi int) {
	// Rotation j of a sweep (stored at index j, from the bottom) mixes
	// elements lo+j and lo+j+1 of a row; the sweep applies them from the
	// top down. Each takes the value of element j+1 just written by rotation
	// j+1 (h, kept in a register) and element j (x): element j+1 is final,
	// the new element j is carried down. Within one row this is a chain of
	// dependent operations; four rows give four independent chains. The
	// windows w and the rotation slices have lengths the compiler can
	// relate, so the inner loop runs without bounds checks.
	k := lo
	for ; k+4 <= hi; k += 4 {
		r0 := z[k*n : (k+1)*n]
		r1 := z[(k+1)*n : (k+2)*n]
		r2 := z[(k+2)*n : (k+3)*n]
		r3 := z[(k+3)*n : (k+4)*n]
		for _, sw := range rb.sweeps {
			m := sw.hi - sw.lo + 1
			cs := rb.c[sw.off : sw.off+m]
			ss := rb.s[sw.off : sw.off+m]
			w0 := r0[sw.lo : sw.lo+m+1]
			w1 := r1[sw.lo : sw.lo+m+1]
			w2 := r2[sw.lo : sw.lo+m+1]
			w3 := r3[sw.lo : sw.lo+m+1]
			ss = ss[:len(cs)]
			// u = w shifted by one: u[j] is element j+1 of the window.
			u0, u1, u2, u3 := w0[1:], w1[1:], w2[1:], w3[1:]
			u0, u1, u2, u3 = u0[:len(cs)], u1[:len(cs)], u2[:len(cs)], u3[:len(cs)]
			w0, w1, w2, w3 = w0[:len(cs)], w1[:len(cs)], w2[:len(cs)], w3[:len(cs)]
			h0, h1, h2, h3 := u0[m-1], u1[m-1], u2[m-1], u3[m-1]
			for j := len(cs) - 1; j >= 0; j-- {
				c, s := cs[j], ss[j]
				x0, x1, x2, x3 := w0[j], w1[j], w2[j], w3[j]
				u0[j], u1[j], u2[j], u3[j] = s*x0+c*h0, s*x1+c*h1, s*x2+c*h2, s*x3+c*h3
				h0, h1, h2, h3 = c*x0-s*h0, c*x1-s*h1, c*x2-s*h2, c*x3-s*h3
			}
			w0[0], w1[0], w2[0], w3[0] = h0, h1, h2, h3
		}
	}
	for ; k < hi; k++ {
		row := z[k*n : (k+1)*n]
		for _, sw := range rb.sweeps {
			m := sw.hi - sw.lo + 1
			cs := rb.c[sw.off : sw.off+m]
			ss := rb.s[sw.off : sw.off+m]
			ss = ss[:len(cs)]
			w := row[sw.lo : sw.lo+m+1]
			u := w[1:][:len(cs)]
			w = w[:len(cs)]
			h := u[m-1]
			for j := len(cs) - 1; j >= 0; j-- {
				c, s := cs[j], ss[j]
				x := w[j]
				u[j] = s*x + c*h
				h = c*x - s*h
			}
			w[0] = h
		}
	}
}

// tql finds the eigenvalues (into d) and eigenvectors (rotations applied to
// the columns of z, which holds Q on entry) of the symmetric tridiagonal
// matrix with diagonal d and off-diagonal e[0..n-2] (e[n-1] = 0); e is
// destroyed. It returns false after 30 iterations without convergence for
// one eigenvalue.
func tql(d, e, z []float64, n int) bool {
	const eps = 0x1p-52
	rb := &rotBatch{c: make([]float64, 0, maxBatch*n+n), s: make([]float64, 0, maxBatch*n+n)}
	f, tst1 := 0.0, 0.0
	for l := 0; l < n; l++ {
		tst1 = math.Max(tst1, math.Abs(d[l])+math.Abs(e[l]))
		m := l
		for m < n-1 && math.Abs(e[m]) > eps*tst1 {
			m++
		}
		for iter := 0; m > l; iter++ {
			if iter == 30 {
				return false
			}
			// Shift from the leading 2×2 block.
			g := d[l]
			p := (d[l+1] - g) / (2 * e[l])
			r := math.Hypot(p, 1)
			if p < 0 {
				r = -r
			}
			d[l] = e[l] / (p + r)
			d[l+1] = e[l] * (p + r)
			dl1 := d[l+1]
			h := g - d[l]
			for i := l + 2; i < n; i++ {
				d[i] -= h
			}
			f += h
			// Implicit QL sweep from m−1 down to l.
			p = d[m]
			c, c2, c3 := 1.0, 1.0, 1.0
			el1 := e[l+1]
			s, s2 := 0.0, 0.0
			// Rotation i is stored at off + i − l (from the bottom).
			off := len(rb.c)
			rb.c = rb.c[:off+m-l]
			rb.s = rb.s[:off+m-l]
			for i := m - 1; i >= l; i-- {
				c3, c2, s2 = c2, c, s
				g = c * e[i]
				h = c * p
				r = hypot(p, e[i])
				e[i+1] = s * r
				s, c = e[i]/r, p/r
				p = c*d[i] - s*g
				d[i+1] = h + s*(c*g+s*d[i])
				rb.c[off+i-l] = c
				rb.s[off+i-l] = s
			}
			rb.sweeps = append(rb.sweeps, sweep{hi: m - 1, lo: l, off: off})
			if len(rb.c) >= maxBatch*n {
				rb.flush(z, n)
			}
			p = -s * s2 * c3 * el1 * e[l] / dl1
			e[l] = s * p
			d[l] = c * p
			if math.Abs(e[l]) <= eps*tst1 {
				break
			}
		}
		d[l] += f
		e[l] = 0
	}
	rb.flush(z, n)
	return true
}

// hypot is math.Hypot with a fast path: √(p²+q²) directly when neither
// square can overflow or lose precision to underflow (the matrix was scaled
// into a safe range; math.Hypot's scaling remains for the rest).
func hypot(p, q float64) float64 {
	ap, aq := math.Abs(p), math.Abs(q)
	if big := max(ap, aq); big > 0x1p-480 && big < 0x1p480 && min(ap, aq) > 0x1p-480 {
		return math.Sqrt(p*p + q*q)
	}
	return math.Hypot(p, q)
}
