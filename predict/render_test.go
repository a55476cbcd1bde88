package predict

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/integrate"

	"shiftwise/predict/spin"
	"shiftwise/smiles"
)

// TestRenderArea: each line is a unit-area Lorentzian times its intensity,
// so the trace integrates to the number of observed H (the area of a
// Lorentzian γ/π/(x²+γ²) over ±200γ is 1 − (2/π)·atan(1/200) ≈ 0.9968;
// textbook calculus).
func TestRenderArea(t *testing.T) {
	t.Parallel()
	p := mustPredict(t, `CCOC(=O)/C=C/c1ccccc1`, Options{})
	x, y := Render(p, 12, -1, 1<<16, 1.0)
	if !floats.Equal(x, sortedCopy(x)) || x[0] != -1 || x[len(x)-1] != 12 {
		t.Fatalf("ppm axis not ascending from -1 to 12")
	}
	area := integrate.Trapezoidal(x, y)
	nh := 0
	for _, s := range p.Signals {
		nh += s.NH
	}
	if math.Abs(area-float64(nh)) > 0.01*float64(nh) {
		t.Errorf("area %.4f, want %d ± 1 %%", area, nh)
	}
}

// TestRenderBroadExchangeable: an exchangeable signal is drawn broader, so
// its peak is lower than that of a sharp signal of the same intensity.
func TestRenderBroadExchangeable(t *testing.T) {
	t.Parallel()
	p := &Prediction{FieldMHz: 400,
		Signals: []Signal{{Label: "A", NH: 1}, {Label: "B", NH: 1, Exchangeable: true}},
		Lines:   []Line{{PPM: 2, Intensity: 1, Signal: "A"}, {PPM: 4, Intensity: 1, Signal: "B"}}}
	x, y := Render(p, 0, 6, 60001, 1)
	peak := func(at float64) float64 {
		best := 0.0
		for i := range x {
			if math.Abs(x[i]-at) < 0.05 {
				best = math.Max(best, y[i])
			}
		}
		return best
	}
	// Lorentzian peak height is 1/(πγ): the ratio equals the width ratio.
	if r := peak(2) / peak(4); math.Abs(r-exchangeBroadening) > 0.05*exchangeBroadening {
		t.Errorf("sharp/broad height ratio %.2f, want %d", r, exchangeBroadening)
	}
	if x, y := Render(p, 0, 6, 1, 1); x != nil || y != nil {
		t.Error("Render with 1 point should return nil")
	}
}

// TestAddLorentziansBinnedMatchesDirect: the binned FFT renderer against
// the point-by-point sum of the closed-form Lorentzian L(d) = γ/π/(d² + γ²)
// (textbook) for many random lines, some just outside the grid. Linear
// binning moves a line's shape by the second-order Taylor term, at most
// step²/8·|L”|, and |L”(d)| ≤ 2·L(d)/γ² (calculus on the formula above; our
// derivation, not from a source), so each point may differ by about
// ¼·(step/γ)²·(the same lines drawn with |intensity|), plus a truncation
// edge term (one line's tail at 200 γ, peak/40,000) and rounding.
func TestAddLorentziansBinnedMatchesDirect(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(3, 4))
	const n, lo = 20000, 0.5
	for _, c := range []struct{ step, gamma float64 }{{0.0001, 0.0008}, {0.0001, 0.004}, {0.00005, 0.0025}} {
		lines := make([]Line, 3000)
		abs := make([]Line, len(lines))
		for i := range lines {
			lines[i] = Line{PPM: lo - 0.2 + rng.Float64()*(float64(n)*c.step+0.4), Intensity: rng.Float64() - 0.1}
			abs[i] = Line{PPM: lines[i].PPM, Intensity: math.Abs(lines[i].Intensity)}
		}
		m, k, ok := binnedPlan(n, len(lines), c.step, c.gamma)
		if !ok {
			t.Fatalf("step %g, γ %g: binned renderer not chosen for %d lines", c.step, c.gamma, len(lines))
		}
		direct := make([]float64, n)
		binned := make([]float64, n)
		size := make([]float64, n)
		addDirect(direct, lo, c.step, lines, 0.01, c.gamma)
		addBinned(binned, lo, c.step, lines, 0.01, c.gamma, m, k)
		addDirect(size, lo, c.step, abs, 0.01, c.gamma)
		peak := 1 / (math.Pi * c.gamma) // unit-area Lorentzian height
		r2 := (c.step / c.gamma) * (c.step / c.gamma)
		var worst, used float64
		for i := range direct {
			tol := 0.3*r2*size[i] + 1e-4*peak
			if d := math.Abs(direct[i] - binned[i]); d/tol > used {
				worst, used = d, d/tol
			}
		}
		if used > 1 {
			t.Errorf("step %g, γ %g: binned differs from direct by %.3g, %.1f× the bound", c.step, c.gamma, worst, used)
		}
	}
	// A coarse grid is never binned.
	if _, _, ok := binnedPlan(1000, 1e6, 0.001, 0.004); ok {
		t.Error("binned renderer chosen for a grid step of γ/4")
	}
}

// TestAddLorentziansShape: one line rendered through AddLorentzians (both
// renderers) peaks at its shifted centre with height I/(πγ) and is half as
// high one half width away (definition of the Lorentzian's half width).
func TestAddLorentziansShape(t *testing.T) {
	t.Parallel()
	const lo, step, gamma = 0.0, 0.0001, 0.002
	for _, many := range []int{1, 4000} {
		lines := make([]Line, many)
		for i := range lines {
			lines[i] = Line{PPM: 1.0, Intensity: 2.0 / float64(many)}
		}
		y := make([]float64, 20001)
		AddLorentzians(y, lo, step, lines, 0.25, gamma)
		top := 2 / (math.Pi * gamma)
		at := func(ppm float64) float64 { return y[int(math.Round((ppm-lo)/step))] }
		if v := at(1.25); math.Abs(v-top) > 1e-3*top {
			t.Errorf("%d lines: height %.6g at the centre, want %.6g", many, v, top)
		}
		if v := at(1.25 + gamma); math.Abs(v-top/2) > 1e-3*top {
			t.Errorf("%d lines: height %.6g one half width out, want %.6g", many, v, top/2)
		}
	}
}

func sortedCopy(x []float64) []float64 {
	c := append([]float64(nil), x...)
	for i := 1; i < len(c); i++ {
		if c[i] < c[i-1] {
			return nil
		}
	}
	return c
}

// ExamplePredict shows the signals of ethyl acetate.
func ExamplePredict() {
	m, err := smiles.Parse(`CCOC(C)=O`)
	if err != nil {
		panic(err)
	}
	p, err := Predict(m, `CCOC(C)=O`, Options{Mode: spin.FirstOrder})
	if err != nil {
		panic(err)
	}
	for _, s := range p.Signals {
		fmt.Printf("%s %-3s %d H %s\n", s.Label, s.Kind, s.NH, s.Multiplicity)
	}
	// Output:
	// A CH3 3 H t
	// B CH2 2 H q
	// C CH3 3 H s
}
