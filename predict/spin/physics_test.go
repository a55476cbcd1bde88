package spin

import (
	"errors"
	"math"
	"math/rand/v2"
	"sort"
	"strings"
	"testing"
)

// productBasis simulates sys exactly in the full product basis of count-1
// groups, without merging equivalent groups or composite particles, and
// with the couplings given (including any inside an equivalent set).
func productBasis(t *testing.T, sys System, field float64) []peak {
	t.Helper()
	es := &esys{}
	all := make([]int, len(sys.Groups))
	for i, g := range sys.Groups {
		if g.Count != 1 {
			t.Fatalf("productBasis needs count-1 groups")
		}
		es.g = append(es.g, egroup{nu: g.ShiftPPM * field, n: 1, proton: true, members: []int{i}})
		all[i] = i
	}
	es.j = make([][]float64, len(sys.Groups))
	for i := range es.j {
		es.j[i] = make([]float64, len(sys.Groups))
	}
	for _, c := range sys.Couplings {
		es.j[c.A][c.B], es.j[c.B][c.A] = c.JHz, c.JHz
	}
	raw, _, err := es.exactLines(all, nil, false)
	if err != nil {
		t.Fatal(err)
	}
	r := &Result{Lines: es.distribute(sys, mergeRaw(raw), field)}
	return spectrum(r, 1e-9)
}

// expand replaces every group of count n by n count-1 groups with the same
// couplings, and couples the members of one set to each other by jIntra.
func expand(sys System, jIntra float64) System {
	var out System
	idx := make([][]int, len(sys.Groups))
	for i, g := range sys.Groups {
		for k := 0; k < g.Count; k++ {
			idx[i] = append(idx[i], len(out.Groups))
			out.Groups = append(out.Groups, Group{Name: g.Name, ShiftPPM: g.ShiftPPM, Count: 1, Nucleus: g.Nucleus})
		}
		for a := 0; a < len(idx[i]); a++ {
			for b := a + 1; b < len(idx[i]); b++ {
				out.Couplings = append(out.Couplings, Coupling{idx[i][a], idx[i][b], jIntra})
			}
		}
	}
	for _, c := range sys.Couplings {
		for _, a := range idx[c.A] {
			for _, b := range idx[c.B] {
				out.Couplings = append(out.Couplings, Coupling{a, b, c.JHz})
			}
		}
	}
	return out
}

// TestCompositeEqualsProductBasis: the composite-particle reduction of
// magnetically equivalent groups is an identity of angular-momentum algebra
// (physical law), so it must reproduce the full product-basis spectrum, and
// couplings inside an equivalent set must leave no trace.
func TestCompositeEqualsProductBasis(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name string
		sys  System
	}{
		{"A3B", System{Groups: []Group{{Name: "A", ShiftPPM: 1.20, Count: 3}, {Name: "B", ShiftPPM: 1.30, Count: 1}}, Couplings: []Coupling{{0, 1, 7}}}},
		{"A2B2", System{Groups: []Group{{Name: "A", ShiftPPM: 3.00, Count: 2}, {Name: "B", ShiftPPM: 3.05, Count: 2}}, Couplings: []Coupling{{0, 1, 6.5}}}},
		{"A3B2C", System{Groups: []Group{{Name: "A", ShiftPPM: 1.0, Count: 3}, {Name: "B", ShiftPPM: 1.1, Count: 2}, {Name: "C", ShiftPPM: 1.25, Count: 1}},
			Couplings: []Coupling{{0, 1, 7.2}, {1, 2, 6.1}, {0, 2, -0.5}}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			want := productBasis(t, expand(tc.sys, -12.4), 100)
			got := spectrum(mustSim(t, tc.sys, Options{FieldMHz: 100, Mode: Exact}), 1e-9)
			comparePeaks(t, got, want, 1e-3, 1e-4)
		})
	}
}

// TestEquivalentSinglet: with all shifts equal, couplings inside an
// equivalent group leave no trace — a CH3 is one line (common practice, no
// source; follows from [H, F−] commuting parts).
func TestEquivalentSinglet(t *testing.T) {
	t.Parallel()
	sys := expand(System{Groups: []Group{{Name: "CH3", ShiftPPM: 2.17, Count: 3}}}, -12.4)
	got := productBasis(t, sys, 400)
	want := []peak{{2.17 * 400, 3}}
	comparePeaks(t, got, want, 1e-6, 1e-9)
	// The same through Simulate, where the three members are merged.
	got = spectrum(mustSim(t, sys, Options{FieldMHz: 400, Mode: Exact}), 1e-9)
	comparePeaks(t, got, want, 1e-6, 1e-9)
}

// TestFirstOrderPascal checks successive splitting: n equivalent partners
// give n+1 lines with binomial intensities (Pascal's triangle, common
// practice, no source).
func TestFirstOrderPascal(t *testing.T) {
	t.Parallel()
	// Ethyl: CH2 (3.6 ppm) quartet, CH3 (1.2 ppm) triplet, J = 7 Hz.
	sys := System{
		Groups:    []Group{{Name: "CH2", ShiftPPM: 3.6, Count: 2}, {Name: "CH3", ShiftPPM: 1.2, Count: 3}},
		Couplings: []Coupling{{0, 1, 7}},
	}
	r := mustSim(t, sys, Options{FieldMHz: 400, Mode: FirstOrder})
	var ch2, ch3 []peak
	for _, l := range r.Lines {
		p := peak{l.Hz, l.Intensity}
		if l.Group == 0 {
			ch2 = append(ch2, p)
		} else {
			ch3 = append(ch3, p)
		}
	}
	c2, c3 := 3.6*400, 1.2*400
	comparePeaks(t, ch2, []peak{{c2 - 10.5, 2.0 / 8}, {c2 - 3.5, 6.0 / 8}, {c2 + 3.5, 6.0 / 8}, {c2 + 10.5, 2.0 / 8}}, 1e-9, 1e-9)
	comparePeaks(t, ch3, []peak{{c3 - 7, 0.75}, {c3, 1.5}, {c3 + 7, 0.75}}, 1e-9, 1e-9)
	for g, m := range r.ModeUsed {
		if m != FirstOrder {
			t.Errorf("ModeUsed[%d] = %v", g, m)
		}
	}
	// dd with 17 and 10 Hz, and a 19F doublet of 47 Hz on top: 8 lines.
	sys = System{
		Groups: []Group{{Name: "a", ShiftPPM: 5.8, Count: 1}, {Name: "b", ShiftPPM: 5.2, Count: 1},
			{Name: "c", ShiftPPM: 5.0, Count: 1}, {Name: "F", ShiftPPM: -200, Count: 1, Nucleus: "19F"}},
		Couplings: []Coupling{{0, 1, 17}, {0, 2, 10}, {0, 3, 47}},
	}
	r = mustSim(t, sys, Options{FieldMHz: 400, Mode: FirstOrder})
	n := 0
	for _, l := range r.Lines {
		if l.Group == 0 {
			n++
			if math.Abs(l.Intensity-0.125) > 1e-12 {
				t.Errorf("ddd line intensity %v, want 1/8", l.Intensity)
			}
		}
		if l.Group == 3 {
			t.Errorf("19F line in a 1H spectrum: %+v", l)
		}
	}
	if n != 8 {
		t.Errorf("ddd has %d lines, want 8", n)
	}
}

// TestWeakLimit: for Δν ≫ J the exact spectrum converges to the first-order
// pattern (common practice, no source; the perturbation is of order J²/Δν).
func TestWeakLimit(t *testing.T) {
	t.Parallel()
	sys := System{
		Groups: []Group{{Name: "CH2", ShiftPPM: 3.6, Count: 2}, {Name: "CH3", ShiftPPM: 1.2, Count: 3},
			{Name: "CH", ShiftPPM: 7.3, Count: 1}},
		Couplings: []Coupling{{0, 1, 7}, {0, 2, 1.5}},
	}
	opt := Options{FieldMHz: 5000} // Δν/J ≈ 1700
	opt.Mode = Exact
	// Lines that first order puts together split by ~J²/Δν ≈ 0.004 Hz;
	// gather them within 0.01 Hz before comparing.
	ex := coarse(spectrum(mustSim(t, sys, opt), 0), 0.01, 1e-4)
	opt.Mode = FirstOrder
	fo := spectrum(mustSim(t, sys, opt), 1e-4)
	comparePeaks(t, ex, fo, 0.01, 0.01)
}

// coarse merges sorted peaks closer than tol (intensity-weighted position)
// and drops those weaker than minI.
func coarse(ps []peak, tol, minI float64) []peak {
	var out []peak
	for _, p := range ps {
		if n := len(out); n > 0 && p.hz-out[n-1].hz < tol {
			q := &out[n-1]
			q.hz = (q.hz*q.inten + p.hz*p.inten) / (q.inten + p.inten)
			q.inten += p.inten
			continue
		}
		out = append(out, p)
	}
	kept := out[:0]
	for _, p := range out {
		if p.inten > minI {
			kept = append(kept, p)
		}
	}
	return kept
}

// vinyl is a styrene-like vinyl ABC: shifts 6.7/5.7/5.2 ppm, J trans 17.6,
// cis 10.9, geminal 1.0 Hz (typical values, common practice, no source).
var vinyl = System{
	Groups:    []Group{{Name: "Ha", ShiftPPM: 6.7, Count: 1}, {Name: "Htrans", ShiftPPM: 5.7, Count: 1}, {Name: "Hcis", ShiftPPM: 5.2, Count: 1}},
	Couplings: []Coupling{{0, 1, 17.6}, {0, 2, 10.9}, {1, 2, 1.0}},
}

// displacement returns the largest shift in Hz and in intensity between the
// 12 strongest exact lines and the 12 first-order lines, both sorted.
func displacement(t *testing.T, field float64) (dHz, dI float64) {
	ex := spectrum(mustSim(t, vinyl, Options{FieldMHz: field, Mode: Exact}), 0)
	fo := spectrum(mustSim(t, vinyl, Options{FieldMHz: field, Mode: FirstOrder}), 0)
	sort.Slice(ex, func(i, k int) bool { return ex[i].inten > ex[k].inten })
	ex = ex[:len(fo)]
	sort.Slice(ex, func(i, k int) bool { return ex[i].hz < ex[k].hz })
	for i := range fo {
		dHz = math.Max(dHz, math.Abs(ex[i].hz-fo[i].hz))
		dI = math.Max(dI, math.Abs(ex[i].inten-fo[i].inten))
	}
	return dHz, dI
}

// TestFieldDependence: the vinyl ABC at 60 MHz (Δν/J ≈ 3.4) shows roofed,
// displaced lines against first order; at 600 MHz it is nearly first-order
// (common practice, no source: second-order effects scale as J/Δν).
func TestFieldDependence(t *testing.T) {
	t.Parallel()
	d60, i60 := displacement(t, 60)
	d600, i600 := displacement(t, 600)
	t.Logf("max displacement: 60 MHz %.2f Hz, %.3f intensity; 600 MHz %.3f Hz, %.4f intensity", d60, i60, d600, i600)
	if d60 < 1 || i60 < 0.03 {
		t.Errorf("60 MHz: displacement %.3f Hz, intensity %.3f; want clear second-order distortion", d60, i60)
	}
	if d600 > 0.5 || i600 > 0.03 || d600 > d60/5 {
		t.Errorf("600 MHz: displacement %.3f Hz, intensity %.3f; want near first-order", d600, i600)
	}
}

// groupTol is the relative tolerance of a group's sum: shares below 1e-4 of
// a line are given to the line's main group.
const groupTol = 1e-3

// TestSumRuleRandom: for random systems in every mode, the spectrum (with
// the dropped weak lines) sums to the number of 1H nuclei and each group's
// lines to its count, up to the dropped intensity (physical law of the
// normalisation, Tr(F+_g F−)); renumbering the groups does not change the
// spectrum.
func TestSumRuleRandom(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(1, 1))
	for it := 0; it < 40; it++ {
		sys := randomSystem(rng)
		for _, mode := range []Mode{Auto, FirstOrder, Exact} {
			r := mustSim(t, sys, Options{FieldMHz: 60 + 540*rng.Float64(), Mode: mode})
			var n float64
			for _, g := range sys.Groups {
				if g.IsProton() {
					n += float64(g.Count)
				}
			}
			if got := total(r); math.Abs(got-n) > sumTol*n {
				t.Fatalf("it %d %v: total %v (with %.2g dropped), want %v", it, mode, got, r.Dropped, n)
			}
			per := make([]float64, len(sys.Groups))
			for _, l := range r.Lines {
				per[l.Group] += l.Intensity
			}
			for g, grp := range sys.Groups {
				want := float64(grp.Count)
				if !grp.IsProton() {
					want = 0
				}
				if math.Abs(per[g]-want) > r.Dropped+groupTol*math.Max(want, 1) {
					t.Fatalf("it %d %v: group %d sums to %v, want %v (%+v)", it, mode, g, per[g], want, sys)
				}
			}
		}
		perm := rng.Perm(len(sys.Groups))
		psys := permute(sys, perm)
		a := spectrum(mustSim(t, sys, Options{FieldMHz: 100, Mode: Exact}), 1e-9)
		b := spectrum(mustSim(t, psys, Options{FieldMHz: 100, Mode: Exact}), 1e-9)
		comparePeaks(t, b, a, 1e-3, 1e-4)
	}
}

func randomSystem(rng *rand.Rand) System {
	n := 2 + rng.IntN(4)
	var s System
	for i := 0; i < n; i++ {
		g := Group{Name: string(rune('a' + i)), ShiftPPM: 1 + 0.3*rng.Float64(), Count: 1 + rng.IntN(3)}
		if rng.IntN(6) == 0 {
			g.Nucleus, g.ShiftPPM = "19F", -100
		}
		s.Groups = append(s.Groups, g)
	}
	for a := 0; a < n; a++ {
		for b := a + 1; b < n; b++ {
			if rng.IntN(3) > 0 {
				s.Couplings = append(s.Couplings, Coupling{a, b, 20*rng.Float64() - 5})
			}
		}
	}
	return s
}

func permute(sys System, perm []int) System {
	out := System{Groups: make([]Group, len(sys.Groups))}
	for i, g := range sys.Groups {
		out.Groups[perm[i]] = g
	}
	for _, c := range sys.Couplings {
		out.Couplings = append(out.Couplings, Coupling{perm[c.A], perm[c.B], c.JHz})
	}
	return out
}

// TestValidate checks that bad input gives a clear error, not a panic.
func TestValidate(t *testing.T) {
	t.Parallel()
	ok := []Group{{Name: "a", ShiftPPM: 1, Count: 1}, {Name: "b", ShiftPPM: 2, Count: 1}}
	for _, tc := range []struct {
		name string
		sys  System
		opt  Options
		want string
	}{
		{"no groups", System{}, Options{FieldMHz: 400}, "no groups"},
		{"zero field", System{Groups: ok}, Options{}, "field must be"},
		{"NaN field", System{Groups: ok}, Options{FieldMHz: math.NaN()}, "field must be"},
		{"zero count", System{Groups: []Group{{Name: "a", Count: 0}}}, Options{FieldMHz: 400}, `group 0 ("a"): count must be at least 1`},
		{"huge count", System{Groups: []Group{{Name: "a", Count: 1000}}}, Options{FieldMHz: 400}, "above the limit"},
		{"inf shift", System{Groups: []Group{{Name: "a", Count: 1, ShiftPPM: math.Inf(1)}}}, Options{FieldMHz: 400}, "shift must be"},
		{"nucleus", System{Groups: []Group{{Name: "a", Count: 1, Nucleus: "13C"}}}, Options{FieldMHz: 400}, `unknown nucleus "13C"`},
		{"index", System{Groups: ok, Couplings: []Coupling{{0, 2, 7}}}, Options{FieldMHz: 400}, "coupling 0: group index out of range"},
		{"self", System{Groups: ok, Couplings: []Coupling{{1, 1, 7}}}, Options{FieldMHz: 400}, "to itself"},
		{"NaN J", System{Groups: ok, Couplings: []Coupling{{0, 1, math.NaN()}}}, Options{FieldMHz: 400}, "J must be"},
		{"duplicate", System{Groups: ok, Couplings: []Coupling{{0, 1, 7}, {1, 0, 7}}}, Options{FieldMHz: 400}, "already coupled"},
		{"mode", System{Groups: ok}, Options{FieldMHz: 400, Mode: 7}, "unknown mode"},
		{"ratio", System{Groups: ok}, Options{FieldMHz: 400, StrongRatio: -1}, "ratio"},
		{"maxspins", System{Groups: ok}, Options{FieldMHz: 400, MaxSpins: 99}, "MaxSpins"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Simulate(tc.sys, tc.opt)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %v, want it to contain %q", err, tc.want)
			}
		})
	}
}

// TestRefuseLarge: a cluster above the bound is refused with ErrTooLarge and
// a hint to use first-order mode, which then succeeds.
func TestRefuseLarge(t *testing.T) {
	t.Parallel()
	sys := chain(12, 0.02)
	_, err := Simulate(sys, Options{FieldMHz: 400, Mode: Exact, MaxSpins: 10})
	if !errors.Is(err, ErrTooLarge) || !strings.Contains(err.Error(), "first-order") {
		t.Fatalf("error %v, want ErrTooLarge suggesting first-order", err)
	}
	if _, err := Simulate(sys, Options{FieldMHz: 400, Mode: FirstOrder}); err != nil {
		t.Fatal(err)
	}
}

// TestRefuseManyLines: first-order splitting by many large partner groups
// with distinct couplings is refused rather than exhausting memory.
func TestRefuseManyLines(t *testing.T) {
	t.Parallel()
	sys := System{Groups: []Group{{Name: "x", ShiftPPM: 5, Count: 1}}}
	for i := 1; i <= 6; i++ {
		sys.Groups = append(sys.Groups, Group{Name: string(rune('a' + i)), ShiftPPM: float64(i), Count: 60})
		sys.Couplings = append(sys.Couplings, Coupling{0, i, 1 + 0.731*math.Sqrt(float64(i)+0.5)})
	}
	_, err := Simulate(sys, Options{FieldMHz: 400, Mode: FirstOrder})
	if !errors.Is(err, ErrTooLarge) {
		t.Fatalf("error %v, want ErrTooLarge", err)
	}
}

// chain returns n distinct count-1 protons step ppm apart, each coupled to
// its neighbours (7 Hz) and next-neighbours (1.5 Hz): one strongly coupled
// cluster at 400 MHz for small steps.
func chain(n int, step float64) System {
	var s System
	for i := 0; i < n; i++ {
		s.Groups = append(s.Groups, Group{Name: string(rune('a' + i)), ShiftPPM: 2 + step*float64(i), Count: 1})
		if i > 0 {
			s.Couplings = append(s.Couplings, Coupling{i - 1, i, 7})
		}
		if i > 1 {
			s.Couplings = append(s.Couplings, Coupling{i - 2, i, 1.5})
		}
	}
	return s
}
