package spectrum

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestWhittakerMatchesDense solves (W + λDᵀD) z = W y with the banded LDLᵀ
// and with gonum's dense solver; the two must agree (the definition of the
// Whittaker smoother, Eilers 2003, is the reference).
func TestWhittakerMatchesDense(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(1, 1))
	for _, n := range []int{3, 4, 5, 17, 60} {
		for _, lambda := range []float64{0.5, 10, 1e4} {
			y, w := make([]float64, n), make([]float64, n)
			for i := range y {
				y[i] = r.NormFloat64()
				if r.Float64() < 0.7 {
					w[i] = 1
				}
			}
			w[0], w[n-1], w[n/2] = 1, 1, 1
			got := make([]float64, n)
			if !whittaker(got, y, w, lambda) {
				t.Fatalf("n=%d λ=%g: solver reported failure", n, lambda)
			}
			a := mat.NewDense(n, n, nil)
			for i := 0; i+2 < n; i++ {
				row := []float64{1, -2, 1}
				for p := 0; p < 3; p++ {
					for q := 0; q < 3; q++ {
						a.Set(i+p, i+q, a.At(i+p, i+q)+lambda*row[p]*row[q])
					}
				}
			}
			b := mat.NewVecDense(n, nil)
			for i := 0; i < n; i++ {
				a.Set(i, i, a.At(i, i)+w[i])
				b.SetVec(i, w[i]*y[i])
			}
			var want mat.VecDense
			if err := want.SolveVec(a, b); err != nil {
				t.Fatalf("dense solve: %v", err)
			}
			for i := range got {
				if math.Abs(got[i]-want.AtVec(i)) > 1e-8*(1+math.Abs(want.AtVec(i))) {
					t.Fatalf("n=%d λ=%g: z[%d] = %g, dense %g", n, lambda, i, got[i], want.AtVec(i))
				}
			}
		}
	}
}

// TestWhittakerSingular: fewer than three weighted points leave the
// straight-line null space of the penalty undetermined.
func TestWhittakerSingular(t *testing.T) {
	t.Parallel()
	y, w, z := make([]float64, 10), make([]float64, 10), make([]float64, 10)
	w[3], w[7] = 1, 1
	if whittaker(z, y, w, 100) {
		t.Error("solver accepted two weighted points")
	}
}

// TestBaselineRecovery: a sloping, curved baseline under sharp lines and
// seeded noise is recovered to within a fraction of the noise away from the
// lines (the generated baseline is the ground truth).
func TestBaselineRecovery(t *testing.T) {
	t.Parallel()
	const n = 65536
	r := rand.New(rand.NewPCG(4, 4))
	y, truth := make([]float64, n), make([]float64, n)
	for i := range y {
		x := -1 + 12*float64(i)/float64(n-1)
		truth[i] = 40 + 12*x - 2.5*(x-5)*(x-5) + 8*math.Sin(x/2)
		y[i] = truth[i] + r.NormFloat64()
		for _, c := range []float64{1.2, 3.7, 3.72, 7.26, 8.1} {
			d := (x - c) / 0.001
			y[i] += 500 / (1 + d*d)
		}
	}
	bl := estimateBaseline(y, float64(n-1)/12)
	var worst float64
	for i := range y {
		x := -1 + 12*float64(i)/float64(n-1)
		near := false
		for _, c := range []float64{1.2, 3.7, 3.72, 7.26, 8.1} {
			if math.Abs(x-c) < 0.1 {
				near = true
			}
		}
		if !near {
			worst = math.Max(worst, math.Abs(bl.Z[i]-truth[i]))
		}
	}
	t.Logf("worst baseline error away from the lines: %.3f (σ = 1)", worst)
	// σ = 1; the block means average 16 points, so 0.5σ is generous.
	if worst > 0.5 {
		t.Errorf("baseline off by up to %.3f away from the lines (σ = 1)", worst)
	}
}
