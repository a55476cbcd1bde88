package spin

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// chainBlock returns the largest Mz block of the Hamiltonian of chain(n, step)
// at 400 MHz.
func chainBlock(n int, step float64) *mat.SymDense {
	sys := chain(n, step)
	es := reduce(sys, 400)
	jm := es.j
	spins := make([]cspin, len(es.g))
	for i, g := range es.g {
		spins[i] = cspin{twoF: 1, nu: g.nu, grp: i}
	}
	b := newBasis(spins)
	return b.hamiltonian(n/2, jm)
}

// checkEigen checks symEigen on a against gonum's mat.EigenSym: the same
// sorted eigenvalues, and A·v = λv with orthonormal v (linear algebra
// identities, no source needed).
func checkEigen(t *testing.T, a *mat.SymDense) {
	t.Helper()
	n := a.SymmetricDim()
	var ref mat.EigenSym
	if !ref.Factorize(a, false) {
		t.Fatal("reference did not converge")
	}
	want := ref.Values(nil)
	work := mat.NewSymDense(n, nil)
	work.CopySym(a)
	vals, ok := symEigen(work.RawSymmetric().Data, n)
	if !ok {
		t.Fatal("symEigen did not converge")
	}
	v := mat.NewDense(n, n, work.RawSymmetric().Data)
	norm := mat.Norm(a, math.Inf(1)) + 1
	got := slices.Clone(vals)
	slices.Sort(got)
	for i := range want {
		if math.Abs(got[i]-want[i]) > 1e-12*norm*float64(n) {
			t.Fatalf("n=%d: eigenvalue %d = %v, reference %v", n, i, got[i], want[i])
		}
	}
	var av, vl, vtv mat.Dense
	av.Mul(a, v)
	vl.Scale(1, v)
	for j, l := range vals {
		for i := 0; i < n; i++ {
			vl.Set(i, j, v.At(i, j)*l)
		}
	}
	av.Sub(&av, &vl)
	if r := mat.Norm(&av, math.Inf(1)); r > 1e-11*norm*float64(n) {
		t.Fatalf("n=%d: residual |AV−VΛ| = %g", n, r)
	}
	vtv.Mul(v.T(), v)
	for i := 0; i < n; i++ {
		vtv.Set(i, i, vtv.At(i, i)-1)
	}
	if r := mat.Norm(&vtv, math.Inf(1)); r > 1e-12*float64(n) {
		t.Fatalf("n=%d: |VᵀV−I| = %g", n, r)
	}
}

func TestSymEigen(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{1, 2, 3, 7, 40, 130} {
		a := mat.NewSymDense(n, nil)
		for i := 0; i < n; i++ {
			for j := i; j < n; j++ {
				a.SetSym(i, j, rng.NormFloat64())
			}
		}
		checkEigen(t, a)
	}
	// Degenerate eigenvalues: a diagonal matrix with repeats, and a
	// matrix with a 3-fold eigenvalue (I + u·uᵀ has n−1 eigenvalues 1).
	checkEigen(t, mat.NewSymDense(4, []float64{2, 0, 0, 0, 0, 2, 0, 0, 0, 0, 1, 0, 0, 0, 0, 2}))
	u := []float64{1, 2, 3, 4}
	d := mat.NewSymDense(4, nil)
	for i := range u {
		for j := i; j < 4; j++ {
			x := u[i] * u[j]
			if i == j {
				x++
			}
			d.SetSym(i, j, x)
		}
	}
	checkEigen(t, d)
	// Extreme scales (the solver rescales them).
	// Eigenvalues of f·X are f times those of X (gonum's own EigenSym
	// panics in its scaling step at these sizes, so X is the reference).
	x := mat.NewSymDense(3, []float64{1, 2, 0, 2, 3, 1, 0, 1, -1})
	var ref mat.EigenSym
	ref.Factorize(x, false)
	want := ref.Values(nil)
	for _, f := range []float64{1e-200, 1e250} {
		y := mat.NewSymDense(3, nil)
		y.ScaleSym(f, x)
		vals, ok := symEigen(y.RawSymmetric().Data, 3)
		if !ok {
			t.Fatalf("scale %g: no convergence", f)
		}
		slices.Sort(vals)
		for i := range vals {
			if math.Abs(vals[i]/f-want[i]) > 1e-13 {
				t.Errorf("scale %g: eigenvalue %d = %g·f, want %g·f", f, i, vals[i]/f, want[i])
			}
		}
	}
	// A spin Hamiltonian block (Hz, spread over hundreds of Hz).
	checkEigen(t, chainBlock(8, 0.05))
}

func BenchmarkSymEigen252(b *testing.B) { benchEigen(b, chainBlock(10, 0.05), false) }
func BenchmarkEigenSym252(b *testing.B) { benchEigen(b, chainBlock(10, 0.05), true) }
func BenchmarkSymEigen924(b *testing.B) { benchEigen(b, chainBlock(12, 0.05), false) }
func BenchmarkEigenSym924(b *testing.B) { benchEigen(b, chainBlock(12, 0.05), true) }

func benchEigen(b *testing.B, a *mat.SymDense, gonum bool) {
	n := a.SymmetricDim()
	w := mat.NewSymDense(n, nil)
	c0, k := cpuTime(), 0
	defer func() { b.ReportMetric(float64((cpuTime()-c0).Nanoseconds())/float64(k), "cpu-ns/op") }()
	for b.Loop() {
		k++
		if gonum {
			var es mat.EigenSym
			es.Factorize(a, true)
			continue
		}
		w.CopySym(a)
		symEigen(w.RawSymmetric().Data, n)
	}
}
