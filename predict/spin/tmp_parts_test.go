package spin

import (
	"testing"
	"time"

	"gonum.org/v1/gonum/blas"
	lapackgo "gonum.org/v1/gonum/lapack/gonum"
)

func TestTmpParts(t *testing.T) {
	for _, nn := range []int{10, 12} {
		h := chainBlock(nn, 0.05)
		n := h.SymmetricDim()
		a := append([]float64(nil), h.RawSymmetric().Data...)
		var impl lapackgo.Implementation
		d := make([]float64, n)
		e := make([]float64, n)
		tau := make([]float64, n)
		work := make([]float64, 64*n)
		t0 := time.Now()
		impl.Dsytrd(blas.Upper, n, a, n, d, e, tau, work, len(work))
		t1 := time.Now()
		d2 := append([]float64(nil), d...)
		e2 := append([]float64(nil), e...)
		impl.Dorgtr(blas.Upper, n, a, n, tau, work, len(work))
		t2 := time.Now()
		e[n-1] = 0
		tql(d, e, a, n)
		t3 := time.Now()
		impl.Dsterf(n, d2, e2)
		t4 := time.Now()
		t.Logf("n=%d sytrd %v orgtr %v tql %v sterf %v", n, t1.Sub(t0), t2.Sub(t1), t3.Sub(t2), t4.Sub(t3))
	}
}
