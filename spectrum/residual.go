package spectrum

import (
	"math"
	"sort"
)

// Residual solvent multiplets.
//
// The residual signal of a CD3 solvent is its CHD2 isotopomer: one proton
// coupled to two deuterons (spin 1), a 1:2:3:2:1 quintet with the H–D
// coupling (about 2 Hz; acetone-d6 2.05, DMSO-d6 2.50, CD3OD 3.31 ppm,
// Fulmer et al. 2010, Table 1, values from memory); CD2Cl2 gives the 1:1:1
// triplet of CHDCl2. The residual often sits beside other lines (the d4
// isotopomer, water, a compound signal) that fall within JMaxHz, and the
// distance rule then puts all of them in one group, which neither has the
// residual's pattern nor is the compound's. splitResidual finds the pattern
// among the lines near the tabulated shift and gives it a group of its own,
// marked so that referencing labels it.
//
// A candidate centre line needs lines at ±J_HD (within residualTolHz, or
// 0.35·J when larger) whose heights are between residualInnerMin and
// residualInnerMax of it and agree with each other within a factor of 2;
// for the quintet at least one outer line at ±2J between residualOuterMin
// and residualOuterMax of the centre, or else inner lines that are tall and
// wide enough to hold the unresolved outer ones (residualShoulderMin,
// residualShoulderWidth). The ranges are wide because lines 2 Hz
// apart overlap and lend each other height (our judgement; the ideal ratios
// are 2/3 and 1/3 from the deuterium multiplicity, common practice, no
// source).

const (
	residualTolHz    = 0.4
	residualInnerMin = 0.35
	residualInnerMax = 1.05
	residualOuterMin = 0.08
	residualOuterMax = 0.8
	// residualShoulderMin and residualShoulderWidth: a quintet whose outer
	// lines are not picked still counts when its inner lines reach this
	// fraction of the centre (a 1:2:1 triplet: 0.5) and are this much wider
	// than the centre line (the unresolved outer lines sit in their flanks;
	// cheminfo 492-62-6 and 57946-61-9, DMSO-d6: 0.72–0.80 and 1.4–1.9×).
	residualShoulderMin   = 0.6
	residualShoulderWidth = 1.2
	// residualTripletMin/Max bound the side lines of the 1:1:1 triplet.
	residualTripletMin = 0.5
	residualTripletMax = 1.6
)

// residualMatch is a found residual pattern: its centre line and the
// lowest and highest line index it covers.
type residualMatch struct {
	centre, lo, hi int
}

// findResidual looks for the residual pattern of sol among the
// non-artifact lines within referenceWindowPPM of its tabulated shift and
// returns the one with the tallest centre.
func findResidual(ls []line, sol Solvent, fieldMHz float64) (residualMatch, bool) {
	if sol.Multiplicity != "p" && sol.Multiplicity != "t" || !(sol.JHDHz > 0) || !(fieldMHz > 0) {
		return residualMatch{}, false
	}
	j := sol.JHDHz / fieldMHz
	tol := math.Max(residualTolHz, 0.35*sol.JHDHz) / fieldMHz
	best, bh := residualMatch{}, 0.0
	for c := range ls {
		l := ls[c]
		if l.artifact != "" || math.Abs(l.ppm-sol.ResidualPPM) > referenceWindowPPM || !(l.height > bh) {
			continue
		}
		m, ok := matchResidual(ls, c, j, tol, sol.Multiplicity)
		if ok {
			best, bh = m, l.height
		}
	}
	return best, bh > 0
}

// matchResidual checks the pattern around centre line c (spacing j ppm).
func matchResidual(ls []line, c int, j, tol float64, mult string) (residualMatch, bool) {
	h := ls[c].height
	at := func(x float64) int { return nearestLine(ls, x, tol) }
	lo, hi := at(ls[c].ppm-j), at(ls[c].ppm+j)
	if lo < 0 || hi < 0 {
		return residualMatch{}, false
	}
	hl, hh := ls[lo].height/h, ls[hi].height/h
	if math.Max(hl, hh) > 2*math.Min(hl, hh) {
		return residualMatch{}, false
	}
	if mult == "t" {
		in := func(r float64) bool { return r >= residualTripletMin && r <= residualTripletMax }
		return residualMatch{c, lo, hi}, in(hl) && in(hh)
	}
	in := func(r float64) bool { return r >= residualInnerMin && r <= residualInnerMax }
	if !in(hl) || !in(hh) {
		return residualMatch{}, false
	}
	m := residualMatch{c, lo, hi}
	outer := 0
	for _, k := range []int{at(ls[c].ppm - 2*j), at(ls[c].ppm + 2*j)} {
		if k < 0 {
			continue
		}
		if r := ls[k].height / h; r >= residualOuterMin && r <= residualOuterMax {
			outer++
			m.lo, m.hi = min(m.lo, k), max(m.hi, k)
		}
	}
	if outer > 0 {
		return m, true
	}
	// Outer lines unresolved: they broaden the inner ones, which then stand
	// taller and wider than the side lines of a 1:2:1 triplet would.
	wc := ls[c].widthHz
	wide := wc > 0 && ls[lo].widthHz >= residualShoulderWidth*wc && ls[hi].widthHz >= residualShoulderWidth*wc
	return m, wide && math.Min(hl, hh) >= residualShoulderMin
}

// nearestLine is the index of the non-artifact line nearest x within tol
// ppm, or -1. ls is in ascending ppm.
func nearestLine(ls []line, x, tol float64) int {
	k := sort.Search(len(ls), func(i int) bool { return ls[i].ppm >= x-tol })
	best, bd := -1, tol
	for ; k < len(ls) && ls[k].ppm <= x+tol; k++ {
		if d := math.Abs(ls[k].ppm - x); ls[k].artifact == "" && d <= bd {
			best, bd = k, d
		}
	}
	return best
}

// splitResidual gives the residual pattern found by findResidual a group of
// its own: every line from the pattern's lowest to its highest leaves its
// group (the groups keep the lines before and after it), and the pattern's
// group, marked residual, takes its place in ppm order.
func splitResidual(gs []group, ls []line, sol Solvent, fieldMHz float64) []group {
	if sol.Multiplicity == "s" {
		return splitSinglet(gs, ls, sol, fieldMHz)
	}
	m, ok := findResidual(ls, sol, fieldMHz)
	if !ok {
		return gs
	}
	out := make([]group, 0, len(gs)+2)
	var mid []int
	done := false
	flush := func() {
		if !done && len(mid) > 0 {
			out = append(out, group{lines: mid, residual: true, residualPPM: ls[m.centre].ppm})
			done = true
		}
	}
	for _, g := range gs {
		var before, after []int
		for _, i := range g.lines {
			switch {
			case i < m.lo:
				before = append(before, i)
			case i > m.hi:
				after = append(after, i)
			default:
				mid = append(mid, i)
			}
		}
		if len(before) == len(g.lines) || len(after) == len(g.lines) {
			if len(after) > 0 {
				flush()
			}
			out = append(out, g)
			continue
		}
		if len(before) > 0 {
			out = append(out, group{lines: before})
		}
		if len(after) > 0 {
			flush()
			out = append(out, group{lines: after})
		}
	}
	flush()
	return out
}

// splitSinglet handles a singlet residual (CHCl3 in CDCl3, C6D5H, …) that
// the distance rule put at the edge of a compound multiplet (CHCl3 7.26
// beside an aromatic triplet less than JMaxHz away). The line nearest the
// tabulated shift, within residualSpreadPPM, leaves its group when it is the
// group's first or last line, the group is not first-order with it and is
// first-order without it (at least two lines left): the residual is then
// what spoiled the pattern. A lone line of a doublet or the edge of a
// binomial multiplet never qualifies, since what remains is one line or an
// unsymmetric pattern.
func splitSinglet(gs []group, ls []line, sol Solvent, fieldMHz float64) []group {
	li, bd := -1, residualSpreadPPM
	for i, l := range ls {
		if d := math.Abs(l.ppm - sol.ResidualPPM); l.artifact == "" && d <= bd {
			li, bd = i, d
		}
	}
	if li < 0 {
		return gs
	}
	k := groupOf(gs, li)
	if k < 0 {
		return gs
	}
	g := gs[k].lines
	if len(g) < 3 || (g[0] != li && g[len(g)-1] != li) {
		return gs
	}
	whole := group{lines: g}
	whole.analyze(ls, fieldMHz)
	rest := group{lines: g[1:]}
	if g[0] != li {
		rest.lines = g[:len(g)-1]
	}
	rest.lines = append([]int(nil), rest.lines...)
	rest.analyze(ls, fieldMHz)
	if whole.multiplicity != "m" || rest.multiplicity == "m" {
		return gs
	}
	res := group{lines: []int{li}, residual: true, residualPPM: ls[li].ppm}
	out := append([]group(nil), gs[:k]...)
	if g[0] == li {
		out = append(out, res, group{lines: rest.lines})
	} else {
		out = append(out, group{lines: rest.lines}, res)
	}
	return append(out, gs[k+1:]...)
}
