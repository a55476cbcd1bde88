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
	// Rotation i takes the value of element i+1 just written by rotation
	// i+1 (h, kept in a register) and element i (x): element i+1 is final,
	// the new element i is carried to rotation i−1. Within one row this is
	// a chain of dependent operations; four rows give four independent
	// chains.
	k := lo
	for ; k+4 <= hi; k += 4 {
		r0 := z[k*n : (k+1)*n]
		r1 := z[(k+1)*n : (k+2)*n]
		r2 := z[(k+2)*n : (k+3)*n]
		r3 := z[(k+3)*n : (k+4)*n]
		for _, sw := range rb.sweeps {
			cs := rb.c[sw.off : sw.off+sw.hi-sw.lo+1]
			ss := rb.s[sw.off : sw.off+sw.hi-sw.lo+1]
			ss = ss[:len(cs)]
			hi := sw.hi
			h0, h1, h2, h3 := r0[hi+1], r1[hi+1], r2[hi+1], r3[hi+1]
			for t, c := range cs {
				s := ss[t]
				i := hi - t
				x0, x1, x2, x3 := r0[i], r1[i], r2[i], r3[i]
				r0[i+1], r1[i+1], r2[i+1], r3[i+1] = s*x0+c*h0, s*x1+c*h1, s*x2+c*h2, s*x3+c*h3
				h0, h1, h2, h3 = c*x0-s*h0, c*x1-s*h1, c*x2-s*h2, c*x3-s*h3
			}
			lo := sw.lo
			r0[lo], r1[lo], r2[lo], r3[lo] = h0, h1, h2, h3
		}
	}
	for ; k < hi; k++ {
		row := z[k*n : (k+1)*n]
		for _, sw := range rb.sweeps {
			cs := rb.c[sw.off : sw.off+sw.hi-sw.lo+1]
			ss := rb.s[sw.off : sw.off+sw.hi-sw.lo+1]
			h := row[sw.hi+1]
			for t, c := range cs {
				s := ss[t]
				i := sw.hi - t
				x := row[i]
				row[i+1] = s*x + c*h
				h = c*x - s*h
			}
			row[sw.lo] = h
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
			off := len(rb.c)
			for i := m - 1; i >= l; i-- {
				c3, c2, s2 = c2, c, s
				g = c * e[i]
				h = c * p
				r = math.Hypot(p, e[i])
				e[i+1] = s * r
				s, c = e[i]/r, p/r
				p = c*d[i] - s*g
				d[i+1] = h + s*(c*g+s*d[i])
				rb.c = append(rb.c, c)
				rb.s = append(rb.s, s)
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
