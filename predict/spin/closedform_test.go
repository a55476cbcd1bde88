package spin

import (
	"math"
	"sort"
	"testing"
)

// peak is a line of the whole spectrum (all groups summed).
type peak struct{ hz, inten float64 }

// spectrum sums the shares of all groups at each frequency (within the
// package's 1e-3 Hz resolution) and drops lines weaker than minI.
func spectrum(r *Result, minI float64) []peak {
	ls := append([]Line(nil), r.Lines...)
	sort.Slice(ls, func(i, k int) bool { return ls[i].Hz < ls[k].Hz })
	var ps []peak
	start := 0.0
	for _, l := range ls {
		if n := len(ps); n > 0 && l.Hz-start <= mergeTolHz {
			q := &ps[n-1]
			if q.inten*l.Intensity > 0 {
				q.hz = (q.hz*q.inten + l.Hz*l.Intensity) / (q.inten + l.Intensity)
			}
			q.inten += l.Intensity
			continue
		}
		start = l.Hz
		ps = append(ps, peak{l.Hz, l.Intensity})
	}
	out := ps[:0]
	for _, p := range ps {
		if p.inten > minI {
			out = append(out, p)
		}
	}
	return out
}

// sumTol is the relative tolerance of sum-rule checks (rounding only: the
// intensity of unlisted weak lines is in Result.Dropped).
const sumTol = 1e-6

// total is the intensity of all lines plus the dropped weak ones.
func total(r *Result) float64 {
	s := r.Dropped
	for _, l := range r.Lines {
		s += l.Intensity
	}
	return s
}

func mustSim(t testing.TB, sys System, opt Options) *Result {
	t.Helper()
	r, err := Simulate(sys, opt)
	if err != nil {
		t.Fatalf("Simulate: %v", err)
	}
	return r
}

// comparePeaks checks positions to tolHz and intensities to relI.
func comparePeaks(t *testing.T, got, want []peak, tolHz, relI float64) {
	t.Helper()
	if len(got) != len(want) {
		t.Fatalf("got %d lines %v, want %d %v", len(got), got, len(want), want)
	}
	for i := range want {
		if math.Abs(got[i].hz-want[i].hz) > tolHz {
			t.Errorf("line %d at %.5f Hz, want %.5f", i, got[i].hz, want[i].hz)
		}
		if math.Abs(got[i].inten-want[i].inten) > relI*math.Abs(want[i].inten) {
			t.Errorf("line %d intensity %.6f, want %.6f", i, got[i].inten, want[i].inten)
		}
	}
}

// TestAB checks the AB quartet against its closed form (Pople, Schneider &
// Bernstein 1959, ch. 6; any standard NMR text): lines at ν0 ± D/2 ± J/2 with
// D = √(Δν² + J²); inner lines ∝ 1 + sin2θ, outer ∝ 1 − sin2θ, sin2θ = J/D.
func TestAB(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name           string
		a, b, j, field float64
	}{
		{"close", 5.80, 5.75, 17, 400},
		{"medium", 7.20, 6.90, 8, 60},
		{"negative J", 3.10, 3.00, -14, 100},
		{"far", 7.0, 2.0, 7, 600},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sys := System{
				Groups:    []Group{{Name: "a", ShiftPPM: tc.a, Count: 1}, {Name: "b", ShiftPPM: tc.b, Count: 1}},
				Couplings: []Coupling{{0, 1, tc.j}},
			}
			r := mustSim(t, sys, Options{FieldMHz: tc.field, Mode: Exact})
			nu0 := (tc.a + tc.b) / 2 * tc.field
			dnu := (tc.a - tc.b) * tc.field
			j := math.Abs(tc.j)
			d := math.Hypot(dnu, j)
			s := j / d
			want := []peak{
				{nu0 - (d+j)/2, (1 - s) / 2}, {nu0 - (d-j)/2, (1 + s) / 2},
				{nu0 + (d-j)/2, (1 + s) / 2}, {nu0 + (d+j)/2, (1 - s) / 2},
			}
			comparePeaks(t, spectrum(r, 1e-9), want, 0.01, 0.01)
			// Sum rule: total intensity = number of spins (physical law of
			// the normalisation, Tr(F+F−)).
			if got := total(r); math.Abs(got-2) > sumTol*2 {
				t.Errorf("total intensity %v, want 2", got)
			}
		})
	}
}

// TestAB2 checks the AB2 (A2B) pattern against the classic analysis rules
// (Pople, Schneider & Bernstein 1959; H. Günther, NMR Spectroscopy, ch. on
// AB2 systems; rules from memory): numbering the eight main lines from the A
// side, νA = ν3, νB = (ν5 + ν7)/2 and J = (ν1 − ν4 + ν6 − ν8)/3. The ninth,
// combination line is the weakest and is dropped before numbering.
func TestAB2(t *testing.T) {
	t.Parallel()
	const field, j = 100.0, 10.0
	for _, ratio := range []float64{1.5, 3, 8} {
		nuA, nuB := 200+ratio*j, 200.0
		sys := System{
			Groups:    []Group{{Name: "A", ShiftPPM: nuA / field, Count: 1}, {Name: "B", ShiftPPM: nuB / field, Count: 2}},
			Couplings: []Coupling{{0, 1, j}},
		}
		r := mustSim(t, sys, Options{FieldMHz: field, Mode: Exact})
		ps := spectrum(r, 1e-9)
		if len(ps) == 9 {
			weak := 0
			for i := range ps {
				if ps[i].inten < ps[weak].inten {
					weak = i
				}
			}
			ps = append(ps[:weak], ps[weak+1:]...)
		}
		if len(ps) != 8 {
			t.Fatalf("Δν/J=%v: %d lines %v, want 8 (+1 combination)", ratio, len(ps), ps)
		}
		nu := func(k int) float64 { return ps[8-k].hz } // 1 = highest frequency
		if got := nu(3); math.Abs(got-nuA) > 0.01 {
			t.Errorf("Δν/J=%v: ν3 = %.4f, want νA = %.4f", ratio, got, nuA)
		}
		if got := (nu(5) + nu(7)) / 2; math.Abs(got-nuB) > 0.01 {
			t.Errorf("Δν/J=%v: (ν5+ν7)/2 = %.4f, want νB = %.4f", ratio, got, nuB)
		}
		if got := (nu(1) - nu(4) + nu(6) - nu(8)) / 3; math.Abs(got-j) > 0.01 {
			t.Errorf("Δν/J=%v: (ν1−ν4+ν6−ν8)/3 = %.4f, want J = %v", ratio, got, j)
		}
		if got := total(r); math.Abs(got-3) > sumTol*3 {
			t.Errorf("Δν/J=%v: total %v, want 3 (sum rule)", ratio, got)
		}
	}
}

// abxParams returns the closed-form quantities of the ABX analysis
// (Pople, Schneider & Bernstein 1959, ch. 6; any standard NMR text; formulas
// from memory): Δ± = (νA − νB) ± (JAX − JBX)/2, D± = √(Δ±² + JAB²),
// sin 2θ± = JAB/D±, cos 2θ± = Δ±/D±.
func abxParams(nuA, nuB, jab, jax, jbx float64) (dp, dm, thp, thm float64) {
	deltaP := nuA - nuB + (jax-jbx)/2
	deltaM := nuA - nuB - (jax-jbx)/2
	dp, dm = math.Hypot(deltaP, jab), math.Hypot(deltaM, jab)
	thp, thm = math.Atan2(jab, deltaP)/2, math.Atan2(jab, deltaM)/2
	return
}

// TestABXPart checks the AB part of an ABX system against the closed form:
// two AB quartets, one per X spin state, centred at ν̄AB ± (JAX + JBX)/4 with
// effective separations D±; each carries half the AB intensity. X is 19F, so
// the X approximation the closed form rests on holds exactly.
func TestABXPart(t *testing.T) {
	t.Parallel()
	const field = 300.0
	nuA, nuB := 2.10*field, 2.00*field
	jab, jax, jbx := 12.0, 8.0, 3.0
	sys := System{
		Groups: []Group{
			{Name: "A", ShiftPPM: nuA / field, Count: 1}, {Name: "B", ShiftPPM: nuB / field, Count: 1},
			{Name: "X", ShiftPPM: -120, Count: 1, Nucleus: "19F"},
		},
		Couplings: []Coupling{{0, 1, jab}, {0, 2, jax}, {1, 2, jbx}},
	}
	dp, dm, _, _ := abxParams(nuA, nuB, jab, jax, jbx)
	var want []peak
	for _, q := range []struct{ sign, d float64 }{{+1, dp}, {-1, dm}} {
		c := (nuA+nuB)/2 + q.sign*(jax+jbx)/4
		s := jab / q.d
		want = append(want,
			peak{c - (q.d+jab)/2, (1 - s) / 4}, peak{c - (q.d-jab)/2, (1 + s) / 4},
			peak{c + (q.d-jab)/2, (1 + s) / 4}, peak{c + (q.d+jab)/2, (1 - s) / 4})
	}
	sort.Slice(want, func(i, k int) bool { return want[i].hz < want[k].hz })
	for _, mode := range []Mode{Exact, Auto} {
		r := mustSim(t, sys, Options{FieldMHz: field, Mode: mode})
		comparePeaks(t, spectrum(r, 1e-9), want, 0.01, 0.01)
	}
}

// TestABXXPart checks the X part of an ABX system (X a distant 1H, simulated
// in the full three-spin basis) against the closed form: six lines
// νX ± (JAX + JBX)/2 (¼ each), νX ± (D+ − D−)/2 (cos²(θ+ − θ−)/4 each) and
// the combination lines νX ± (D+ + D−)/2 (sin²(θ+ − θ−)/4 each).
func TestABXXPart(t *testing.T) {
	t.Parallel()
	const field = 300.0
	nuA, nuB, nuX := 2.10*field, 2.04*field, 2000.0*field // X far away: X limit
	jab, jax, jbx := 15.0, 9.0, 2.0
	sys := System{
		Groups: []Group{
			{Name: "A", ShiftPPM: nuA / field, Count: 1}, {Name: "B", ShiftPPM: nuB / field, Count: 1},
			{Name: "X", ShiftPPM: nuX / field, Count: 1},
		},
		Couplings: []Coupling{{0, 1, jab}, {0, 2, jax}, {1, 2, jbx}},
	}
	r := mustSim(t, sys, Options{FieldMHz: field, Mode: Exact})
	var got []peak
	for _, p := range spectrum(r, 1e-9) {
		if p.hz > nuX-1000 {
			got = append(got, p)
		}
	}
	dp, dm, thp, thm := abxParams(nuA, nuB, jab, jax, jbx)
	c2 := math.Pow(math.Cos(thp-thm), 2) / 4
	s2 := math.Pow(math.Sin(thp-thm), 2) / 4
	want := []peak{
		{nuX - (dp+dm)/2, s2}, {nuX - (jax+jbx)/2, 0.25}, {nuX - (dp-dm)/2, c2},
		{nuX + (dp-dm)/2, c2}, {nuX + (jax+jbx)/2, 0.25}, {nuX + (dp+dm)/2, s2},
	}
	sort.Slice(want, func(i, k int) bool { return want[i].hz < want[k].hz })
	comparePeaks(t, got, want, 0.01, 0.01)
}

// TestAABB checks the AA'BB' pattern of a para-disubstituted benzene
// (Pople, Schneider & Bernstein 1959, AA'BB' analysis; typical J: ortho
// 8.5, meta 2.0, para 0.3 Hz, common practice): the spectrum is symmetric
// about (νA+νB)/2, each half has at most 12 lines, and it is not the two
// first-order doublets: more than 2 lines per half carry intensity, and the
// lines are roofed towards the centre.
func TestAABB(t *testing.T) {
	t.Parallel()
	const field = 400.0
	nuA, nuB := 7.30*field, 7.10*field // Δν = 80 Hz, Δν/J ≈ 9.4
	sys := System{
		Groups: []Group{{Name: "A", ShiftPPM: nuA / field, Count: 1}, {Name: "A'", ShiftPPM: nuA / field, Count: 1},
			{Name: "B", ShiftPPM: nuB / field, Count: 1}, {Name: "B'", ShiftPPM: nuB / field, Count: 1}},
		Couplings: []Coupling{{0, 2, 8.5}, {1, 3, 8.5}, {0, 3, 0.3}, {1, 2, 0.3}, {0, 1, 2.0}, {2, 3, 2.0}},
	}
	ps := spectrum(mustSim(t, sys, Options{FieldMHz: field, Mode: Auto}), 1e-4)
	mid := (nuA + nuB) / 2
	var hi, lo []peak
	for _, p := range ps {
		if p.hz > mid {
			hi = append(hi, p)
		} else {
			lo = append(lo, p)
		}
	}
	if len(hi) != len(lo) || len(hi) > 12 || len(hi) <= 2 {
		t.Fatalf("halves have %d and %d lines, want equal, 3…12", len(hi), len(lo))
	}
	for i := range hi {
		m := lo[len(lo)-1-i]
		if math.Abs((hi[i].hz-mid)-(mid-m.hz)) > 0.01 || math.Abs(hi[i].inten-m.inten) > 0.01*hi[i].inten {
			t.Errorf("line %v has mirror %v, want symmetric about %.2f", hi[i], m, mid)
		}
	}
	var a, wHi, wLo float64 // a: intensity-weighted distance of the A half from the centre
	for _, p := range hi {
		a += p.inten * (p.hz - mid)
		wHi += p.inten
	}
	for _, p := range lo {
		wLo += p.inten
	}
	if math.Abs(wHi-2) > 0.01 || math.Abs(wLo-2) > 0.01 {
		t.Errorf("half intensities %.4f and %.4f, want 2 each", wHi, wLo)
	}
	// Roofing: each half's inner lines are stronger, so the intensity
	// centre lies inside the shift (common practice, no source).
	if a/wHi >= nuA-mid {
		t.Errorf("A half centred %.3f Hz from the middle, want < %.1f (roofing)", a/wHi, nuA-mid)
	}
	t.Logf("AA'BB' at %g MHz: %d lines per half", field, len(hi))
}
