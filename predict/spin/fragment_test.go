package spin

import (
	"errors"
	"math"
	"os"
	"strings"
	"testing"
)

// traceDiff renders both line lists as 1 Hz Lorentzians over a's span and
// returns the largest difference relative to a's tallest point.
func traceDiff(a, b []Line, field float64) float64 {
	lo, hi := Span(a, 0.1)
	_, ya := Render(a, field, lo, hi, 4000, 1.0)
	_, yb := Render(b, field, lo, hi, 4000, 1.0)
	d, top := 0.0, 0.0
	for i := range ya {
		d = math.Max(d, math.Abs(ya[i]-yb[i]))
		top = math.Max(top, ya[i])
	}
	return d / top
}

// TestFragmentApproachesExact: a 10-spin chain (Δν/J ≈ 3 between
// neighbours at 400 MHz) refused for exact simulation by MaxSpins 8 is
// simulated by fragments in Auto mode. Reference: the exact
// diagonalisation of the whole cluster (this package's Exact mode, itself
// checked against the closed-form AB, A2B and ABX analyses in
// closedform_test.go).
//   - Fragments as large as the cluster contain all of it, so the spectrum
//     is the exact one but for the attribution of transitions to groups by
//     weight and the scaling of each group to its count (see
//     fragmentLines): within 1% of the tallest point (measured 0.41%).
//   - Fragments of 8 spins reproduce the rendered spectrum to within 2.5%
//     of its tallest point (measured 0.40%), where first-order splitting is
//     off by more than half of it (measured 69%).
//   - Every group's lines sum to its Count to within 0.1%, none is
//     negative, and the physical lines (Result.Spectrum) sum to the number
//     of nuclei.
func TestFragmentApproachesExact(t *testing.T) {
	t.Parallel()
	sys := chain(10, 0.05)
	ex, err := Simulate(sys, Options{FieldMHz: 400, Mode: Exact})
	if err != nil {
		t.Fatal(err)
	}
	fo, err := Simulate(sys, Options{FieldMHz: 400, Mode: FirstOrder})
	if err != nil {
		t.Fatal(err)
	}
	d := traceDiff(ex.Lines, fo.Lines, 400)
	t.Logf("first-order: largest trace difference %.0f%% of the tallest point", 100*d)
	if d < 0.5 {
		t.Fatalf("first-order differs from exact by only %.3f: the test system is not strongly coupled", d)
	}
	for _, tc := range []struct {
		frag int
		tol  float64
	}{{10, 0.01}, {8, 0.025}} {
		fr, err := Simulate(sys, Options{FieldMHz: 400, Mode: Auto, MaxSpins: 8, FragmentSpins: tc.frag})
		if err != nil {
			t.Fatalf("fragments of %d: %v", tc.frag, err)
		}
		d := traceDiff(ex.Lines, fr.Lines, 400)
		t.Logf("fragments of %d: largest trace difference %.2f%% of the tallest point", tc.frag, 100*d)
		if d > tc.tol {
			t.Errorf("fragments of %d: trace differs from exact by %.3g of its height, want ≤ %g", tc.frag, d, tc.tol)
		}
		sum := make([]float64, len(sys.Groups))
		for _, l := range fr.Lines {
			sum[l.Group] += l.Intensity
		}
		for _, l := range fr.Lines {
			if l.Intensity < 0 {
				t.Fatalf("fragments of %d: negative line %+v", tc.frag, l)
			}
		}
		phys := 0.0
		for _, l := range fr.Spectrum() {
			phys += l.Intensity
		}
		if math.Abs(phys-float64(len(sys.Groups))) > 1e-6 {
			t.Errorf("fragments of %d: physical lines sum to %.6f, want %d", tc.frag, phys, len(sys.Groups))
		}
		for g, s := range sum {
			if math.Abs(s-1) > 1e-3 {
				t.Errorf("fragments of %d: group %d lines sum to %.5f, want 1", tc.frag, g, s)
			}
			if fr.ModeUsed[g] != Fragment {
				t.Errorf("fragments of %d: group %d mode %v, want fragment", tc.frag, g, fr.ModeUsed[g])
			}
		}
	}
	// Exact mode still refuses: fragments are an approximation.
	if _, err := Simulate(sys, Options{FieldMHz: 400, Mode: Exact, MaxSpins: 8}); !errors.Is(err, ErrTooLarge) {
		t.Errorf("Exact mode with MaxSpins 8: error %v, want ErrTooLarge", err)
	}
}

// TestFragmentGrowth: the fragment of a chain's end group takes its
// neighbours in order along the chain (strongest path first) and stops at
// the work of the given number of spins. This checks our own growth rule
// (fragment.go), not an outside result; its effect on the spectrum is
// checked against exact simulation above.
func TestFragmentGrowth(t *testing.T) {
	t.Parallel()
	es := reduce(chain(10, 0.05), 400)
	c := make([]int, len(es.g))
	for i := range c {
		c[i] = i
	}
	f := es.fragment(0, c, 4)
	want := []int{0, 1, 2, 3}
	if len(f) != len(want) {
		t.Fatalf("fragment %v, want %v", f, want)
	}
	for i := range f {
		if f[i] != want[i] {
			t.Fatalf("fragment %v, want %v", f, want)
		}
	}
	mid := es.fragment(5, c, 3)
	if len(mid) != 3 || mid[0] != 5 || !(mid[1] == 4 || mid[1] == 6) || !(mid[2] == 4 || mid[2] == 6) || mid[1] == mid[2] {
		t.Errorf("fragment of the middle group %v, want 5 with its two neighbours", mid)
	}
}

// TestFragment14Accuracy measures the fragment approximation on the
// 14-spin chain of BenchmarkCluster14 against its exact simulation, which
// takes about a minute and 1 GB, so it runs only with SHIFTWISE_SLOW=1.
// Reference: exact diagonalisation, as in TestFragmentApproachesExact.
func TestFragment14Accuracy(t *testing.T) {
	if os.Getenv("SHIFTWISE_SLOW") == "" {
		t.Skip("set SHIFTWISE_SLOW=1 to compare fragments with the exact 14-spin simulation (about a minute, 1 GB)")
	}
	sys := chain(14, 0.05)
	ex, err := Simulate(sys, Options{FieldMHz: 400, Mode: Exact, MaxSpins: 14})
	if err != nil {
		t.Fatal(err)
	}
	for _, frag := range []int{6, 7, 8, 9, 10} {
		fr, err := Simulate(sys, Options{FieldMHz: 400, Mode: Auto, FragmentSpins: frag})
		if err != nil {
			t.Fatal(err)
		}
		d := traceDiff(ex.Lines, fr.Lines, 400)
		t.Logf("fragments of %2d spins: %6d lines (exact %d), largest trace difference %.2f%% of the tallest point", frag, len(fr.Lines), len(ex.Lines), 100*d)
		if d > 0.025 && frag >= DefaultFragmentSpins {
			t.Errorf("fragments of %d: trace differs from exact by %.4f, want ≤ 0.025", frag, d)
		}
	}
}

// TestFragmentNotesAndLimit: Auto mode says where it approximated. A
// 14-spin chain is simulated by fragments with a note; a 40-spin chain,
// more groups than MaxFragmentGroups, falls back to first-order with a
// note, and its end group is then the first-order doublet of doublets of
// its two partners (J = 7 and 1.5 Hz; Pascal's triangle).
func TestFragmentNotesAndLimit(t *testing.T) {
	t.Parallel()
	// Group "x" is magnetically equivalent to the end group "a" (same shift,
	// same couplings) and merged with it; the note names it too.
	sys := chain(14, 0.05)
	sys.Groups = append(sys.Groups, Group{Name: "x", ShiftPPM: sys.Groups[0].ShiftPPM, Count: 1})
	sys.Couplings = append(sys.Couplings, Coupling{14, 1, 7}, Coupling{14, 2, 1.5})
	res, err := Simulate(sys, Options{FieldMHz: 400})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Notes) != 1 || !strings.Contains(res.Notes[0], "fragments") || !strings.Contains(res.Notes[0], "a, x, b") {
		t.Errorf("14 spins: notes %q, want one about fragments naming a, x, b, …", res.Notes)
	}
	res, err = Simulate(chain(40, 0.01), Options{FieldMHz: 400})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Notes) != 1 || !strings.Contains(res.Notes[0], "first-order") {
		t.Errorf("40 spins: notes %q, want one about first-order", res.Notes)
	}
	var end []Line
	for _, l := range res.Lines {
		if l.Group == 0 {
			end = append(end, l)
		}
	}
	if res.ModeUsed[0] != FirstOrder || len(end) != 4 {
		t.Fatalf("40 spins: end group mode %v with %d lines, want first-order dd", res.ModeUsed[0], len(end))
	}
	if d := end[3].Hz - end[0].Hz; math.Abs(d-8.5) > 1e-9 {
		t.Errorf("dd spans %.4f Hz, want 7 + 1.5", d)
	}
}
