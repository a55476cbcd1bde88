package spectrum

import (
	"fmt"
	"math"
	"sort"
)

// Integration.
//
// Each multiplet is integrated with the trapezoid rule over its region on
// the baseline-corrected trace: from its first to its last line, widened on
// each side by a margin of integrateMarginWidths times the width of its
// widest line (at most marginWidthCap times their median width; at least
// integrateMarginHz), and never past the midpoint to the neighbouring
// multiplet. Lorentzian lines have long tails (a line keeps 6 % of its area
// beyond ±10 half-widths), so the region sum is corrected with the line
// model of the picked peaks: the area of the multiplet's own lines outside
// the region is added and the area that other lines put inside it is taken
// away, each line being A·γ·[atan((b−x₀)/γ) − atan((a−x₀)/γ)] over [a,b] for
// amplitude A (the picked heights with the neighbours' overlap removed, see
// lineAmplitudes) and half width γ (the median of its multiplet's lines).
// The correction is exact for Lorentzian lines and
// a small second-order term otherwise; real lines fall off faster than a
// Lorentzian far out, so the correction is capped at tailCorrectionCap of the
// region sum (it is meant for tails, not for separating overlapping signals).
//
// Relative integrals: the well-resolved multiplets (first-order, not the
// solvent, the reference or a water singlet, at least minResolvedFrac of the largest
// multiplet) are scaled so that the smallest of them is a
// whole number n of protons, n being the smallest of 1…4 for which all of
// them come out near whole numbers (mean distance ≤ 0.12); with no such n,
// n = 1. An IntegralRef replaces this rule. For a peak list without a trace,
// the integral of a multiplet is the sum of its intensities (times the line
// widths when the list gives them).

const (
	integrateMarginWidths = 5.0 // region margin in line widths (FWHM)
	integrateMarginHz     = 3.0 // smallest region margin
	marginWidthCap        = 3.0 // widest line counted for the margin, in median widths
	wholeTolerance        = 0.12
	voteTolerance         = 0.15 // per multiplet, see voteUnit
	maxWholeN             = 4
	tailCorrectionCap     = 0.15
	maxDeconvolveLines    = 64 // larger multiplets keep their picked heights
	// minResolvedFrac: multiplets smaller than this fraction of the largest
	// are impurities or artifacts, not candidates for the integral unit
	// (1/16 still admits a 1H signal beside a 16H one).
	minResolvedFrac = 1.0 / 16
)

// IntegralRef fixes the scale of the relative integrals: the multiplet at
// PPM (the one whose region contains it, else the nearest) or, when PPM is
// NaN, the multiplet with index Index, integrates to NH protons.
type IntegralRef struct {
	PPM   float64
	Index int
	NH    float64
}

// setRegions gives every group its integration region (ppm).
func setRegions(gs []group, ls []line, fieldMHz float64) {
	for k := range gs {
		g := &gs[k]
		first, last := ls[g.lines[0]], ls[g.lines[len(g.lines)-1]]
		ws := make([]float64, 0, len(g.lines))
		for _, i := range g.lines {
			ws = append(ws, ls[i].widthHz)
		}
		sort.Float64s(ws)
		// The widest line, but at most marginWidthCap × the median: one
		// broad fitted line (a shoulder, an unresolved cluster) must not
		// widen the region by a whole ppm at 60 MHz (5 × 15 Hz); the
		// tails beyond are corrected below.
		w := math.Min(ws[len(ws)-1], marginWidthCap*ws[len(ws)/2])
		margin := math.Max(integrateMarginHz, integrateMarginWidths*w) / fieldMHz
		g.from, g.to = first.ppm-margin, last.ppm+margin
		if k > 0 {
			prev := ls[gs[k-1].lines[len(gs[k-1].lines)-1]].ppm
			g.from = math.Max(g.from, (prev+first.ppm)/2)
		}
		if k+1 < len(gs) {
			next := ls[gs[k+1].lines[0]].ppm
			g.to = math.Min(g.to, (last.ppm+next)/2)
		}
	}
}

// integrateTrace sets the raw area of every group from the corrected trace
// y on the ascending axis ppm, in intensity·ppm.
func integrateTrace(gs []group, ls []line, ppm, y []float64, fieldMHz float64) {
	width := groupWidths(gs, ls)
	amp := lineAmplitudes(gs, ls, width, fieldMHz)
	for k := range gs {
		g := &gs[k]
		area := trapezoid(ppm, y, g.from, g.to)
		var corr float64
		own := make(map[int]bool, len(g.lines))
		for _, i := range g.lines {
			own[i] = true
		}
		for i, l := range ls {
			gamma := width[i] / 2 / fieldMHz
			if !(gamma > 0) || !(amp[i] > 0) {
				continue
			}
			inside := lorentzArea(amp[i], l.ppm, gamma, g.from, g.to)
			if own[i] {
				corr += amp[i]*gamma*math.Pi - inside
			} else {
				corr -= inside
			}
		}
		lim := tailCorrectionCap * math.Abs(area)
		g.raw = area + math.Max(-lim, math.Min(lim, corr))
	}
}

// groupWidths gives every line the median width of its multiplet (the
// lines of one multiplet share their natural width, and the median is far
// less noisy than one line's width at low S/N); lines outside multiplets
// keep their own.
func groupWidths(gs []group, ls []line) []float64 {
	w := make([]float64, len(ls))
	for i, l := range ls {
		w[i] = l.widthHz
	}
	for _, g := range gs {
		var v []float64
		for _, i := range g.lines {
			if ls[i].widthHz > 0 {
				v = append(v, ls[i].widthHz)
			}
		}
		if len(v) == 0 {
			continue
		}
		m := median(v)
		for _, i := range g.lines {
			w[i] = m
		}
	}
	return w
}

// lineAmplitudes separates the heights of overlapping lines: the picked
// height of a line includes the tails of its neighbours, so within each
// multiplet the amplitudes A solve Σⱼ Aⱼ·L(xᵢ−xⱼ; γⱼ) = hᵢ at the line
// positions (L the unit Lorentzian). Where the system is singular or gives a
// non-positive amplitude, the picked heights are kept.
func lineAmplitudes(gs []group, ls []line, width []float64, fieldMHz float64) []float64 {
	amp := make([]float64, len(ls))
	for i, l := range ls {
		amp[i] = l.height
	}
	for _, g := range gs {
		n := len(g.lines)
		if n < 2 || n > maxDeconvolveLines || !(width[g.lines[0]] > 0) {
			continue
		}
		hz, h := make([]float64, n), make([]float64, n)
		for k, i := range g.lines {
			hz[k], h[k] = ls[i].ppm*fieldMHz, ls[i].height
		}
		if a, ok := unmixLorentz(hz, h, width[g.lines[0]]/2); ok {
			for k, i := range g.lines {
				amp[i] = a[k]
			}
		}
	}
	return amp
}

// lorentzArea is the area of a Lorentzian of height a, centre x0 and half
// width gamma between lo and hi.
func lorentzArea(a, x0, gamma, lo, hi float64) float64 {
	return a * gamma * (math.Atan((hi-x0)/gamma) - math.Atan((lo-x0)/gamma))
}

// trapezoid integrates y over [lo, hi] on the ascending axis x, with the
// end pieces interpolated.
func trapezoid(x, y []float64, lo, hi float64) float64 {
	n := len(x)
	if n < 2 || hi <= lo {
		return 0
	}
	i0 := sort.SearchFloat64s(x, lo)
	i1 := sort.SearchFloat64s(x, hi)
	at := func(t float64) float64 {
		k := sort.SearchFloat64s(x, t)
		switch {
		case k <= 0:
			return y[0]
		case k >= n:
			return y[n-1]
		}
		f := (t - x[k-1]) / (x[k] - x[k-1])
		return y[k-1] + f*(y[k]-y[k-1])
	}
	if i0 >= i1 {
		return (hi - lo) * (at(lo) + at(hi)) / 2
	}
	s := (x[i0] - lo) * (at(lo) + y[i0]) / 2
	for i := i0; i+1 < i1; i++ {
		s += (x[i+1] - x[i]) * (y[i] + y[i+1]) / 2
	}
	s += (hi - x[i1-1]) * (y[i1-1] + at(hi)) / 2
	return s
}

// integrateTable sets the raw area of every group from its peak intensities
// (times widths when every line has one).
func integrateTable(gs []group, ls []line) {
	for k := range gs {
		g := &gs[k]
		withWidth := true
		for _, i := range g.lines {
			if !(ls[i].widthHz > 0) {
				withWidth = false
			}
		}
		var a float64
		for _, i := range g.lines {
			if withWidth {
				a += ls[i].height * ls[i].widthHz
			} else {
				a += ls[i].height
			}
		}
		g.raw = a
	}
}

// waterWindowPPM: dissolved water moves with temperature and
// concentration by about a tenth of a ppm (Gottlieb et al. 1997, caveat;
// the size is our judgement).
const waterWindowPPM = 0.1

// markWater marks the singlets within waterWindowPPM of the solvent's water
// shift (Fulmer et al. 2010, see solvents.go) on the referenced axis (shift
// added to the groups' ppm). Water's size says nothing about the compound,
// so it must not set the integral unit: in DMSO-d6 a water singlet smaller
// than the compound's 2H signals made them 3H (cheminfo 57946-61-9).
func markWater(gs []group, sol Solvent, shift float64) {
	for k := range gs {
		g := &gs[k]
		if g.label == "" && len(g.lines) == 1 && math.Abs(g.centerPPM+shift-sol.WaterPPM) <= waterWindowPPM {
			g.water = true
		}
	}
}

// scaleIntegrals returns the factor that turns raw areas into proton counts.
func scaleIntegrals(gs []group, ref *IntegralRef) (float64, error) {
	if ref != nil {
		return scaleByRef(gs, ref)
	}
	largest := 0.0
	for _, g := range gs {
		if g.label == "" {
			largest = math.Max(largest, g.raw)
		}
	}
	floor := minResolvedFrac * largest
	var resolved []float64
	for _, g := range gs {
		if g.label == "" && !g.water && g.multiplicity != "m" && g.raw > 0 && g.raw >= floor {
			resolved = append(resolved, g.raw)
		}
	}
	if len(resolved) == 0 {
		for _, g := range gs {
			if g.label == "" && g.raw > 0 && g.raw >= floor {
				resolved = append(resolved, g.raw)
			}
		}
	}
	if len(resolved) == 0 {
		return 1, nil
	}
	smallest := resolved[0]
	for _, a := range resolved {
		smallest = math.Min(smallest, a)
	}
	for n := 1; n <= maxWholeN; n++ {
		f := float64(n) / smallest
		var dev float64
		for _, a := range resolved {
			x := a * f
			dev += math.Abs(x - math.Round(x))
		}
		if dev/float64(len(resolved)) <= wholeTolerance {
			return f, nil
		}
	}
	var voters []float64
	for _, g := range gs {
		if g.label == "" && !g.water && g.raw > 0 && g.raw >= floor {
			voters = append(voters, g.raw)
		}
	}
	if f, ok := voteUnit(resolved, voters); ok {
		return f, nil
	}
	return 1 / smallest, nil
}

// voteUnit is the fallback when no n makes every resolved multiplet whole:
// one impurity or a saturated line spoils the mean, and scaling to the
// smallest area (often that impurity) then puts every count off by the same
// factor. Each resolved area a and n = 1…maxWholeN propose the unit a/n; a
// voter (every unlabelled multiplet of at least the size floor, first-order
// or not) agrees when it comes out within voteTolerance of a whole number of
// at least 1. The largest unit with which at least half the voters (and at
// least two) agree wins: a smaller unit always finds more agreement by
// chance, as its whole numbers lie closer together.
func voteUnit(areas, voters []float64) (float64, bool) {
	need := max(2, (len(voters)+1)/2)
	bestU := 0.0
	for _, a := range areas {
		for n := 1; n <= maxWholeN; n++ {
			u := a / float64(n)
			if u <= bestU {
				continue
			}
			hits := 0
			for _, b := range voters {
				x := b / u
				if x >= 0.8 && math.Abs(x-math.Round(x)) <= voteTolerance {
					hits++
				}
			}
			if hits >= need {
				bestU = u
			}
		}
	}
	return 1 / bestU, bestU > 0
}

// scaleByRef scales so that the referenced multiplet integrates to ref.NH.
func scaleByRef(gs []group, ref *IntegralRef) (float64, error) {
	if !(ref.NH > 0) {
		return 0, fmt.Errorf("integral reference: proton count must be positive, found %g", ref.NH)
	}
	k := -1
	if math.IsNaN(ref.PPM) {
		if ref.Index < 0 || ref.Index >= len(gs) {
			return 0, fmt.Errorf("integral reference: no multiplet #%d (there are %d, numbered from 1)", ref.Index+1, len(gs))
		}
		k = ref.Index
	} else {
		best := math.Inf(1)
		for i, g := range gs {
			d := math.Abs(g.centerPPM - ref.PPM)
			if ref.PPM >= g.from && ref.PPM <= g.to {
				d = 0
			}
			if d < best {
				best, k = d, i
			}
		}
		if k < 0 || best > 0.1 {
			return 0, fmt.Errorf("integral reference: no multiplet at %.3f ppm", ref.PPM)
		}
	}
	if !(gs[k].raw > 0) {
		return 0, fmt.Errorf("integral reference: multiplet at %.3f ppm has no positive area", gs[k].centerPPM)
	}
	return ref.NH / gs[k].raw, nil
}
