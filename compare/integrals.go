package compare

import (
	"fmt"
	"math"
	"sort"
	"strings"
)

// Integral consistency (integralConflicts): levels set on the homolog
// tests of integrals_test.go, the synthetic reference set and the real
// spectra; common practice, no source for their form.
const (
	// agreeFrac: multiplets whose H per unit area lies within this
	// fraction of the consensus agree with it (small multiplets at 60 MHz
	// integrate within about 20 %).
	agreeFrac = 0.25
	// misfitFrac: in a conflict, the contradicted multiplets are named when
	// short or long together by this fraction of their H (and offH).
	misfitFrac = 0.20
	// conflictFrac: the H-weighted scale and the consensus of the
	// multiplets (each one vote) differ by at least this fraction: one
	// large multiplet sets the scale against the others.
	conflictFrac = 0.25
	// offH: the least misfit reported, in H. In a conflict, multiplets
	// off by offH and misfitFrac of their H together are reported;
	// without one, a multiplet holding offH and excessFrac more H than
	// its signals.
	offH       = 2.0
	excessFrac = 0.40
)

// integralConflicts returns reasons for compound multiplets whose integrals
// contradict the others by whole protons: what a chemist sees when the
// chain of a homolog is longer or shorter than drawn.
//
// The integral scale is the H-weighted median (fitScale), so a large
// envelope (a long alkyl chain's CH2 groups) can set it alone; every other
// multiplet then looks short or long by the same factor and nothing stands
// out. A chemist calibrates on a clean, isolated multiplet instead. Here
// each multiplet votes with weight min(H, 3)/(signals in it): a clean CH3
// or OCH2 counts fully, an envelope of several signals little. When that
// consensus differs from the fitted scale by conflictFrac and is backed by
// at least two agreeing multiplets of 3 H or more together (or, with only
// two multiplets, by one clean multiplet of at least 2 H holding one
// signal), the multiplets it contradicts are summed, short ones and long
// ones apart: off by offH and misfitFrac of their H together, they are
// named. A multiplet holding the water line, the residual solvent or an
// identified species (excessExplained) votes on neither side of the
// consensus but may be contradicted. Without such a conflict, on the fitted scale, a compound
// multiplet holding offH and excessFrac more H than its signals is named
// unless water, the residual solvent or an identified species lies in it.
// Either way the excess is a homolog's extra CH2 groups, water or an
// impurity under the multiplet, or a miscalibrated integral, and needs a
// look (review).
func (ev *evaluation) integralConflicts(ms []mplet) []string {
	exp := map[int]float64{} // non-exchangeable H per multiplet
	all := map[int]float64{} // with exchangeables
	nsig := map[int]int{}
	for i, s := range ev.pred.Signals {
		j := ev.sigM[i]
		if j < 0 {
			continue
		}
		all[j] += float64(s.NH)
		nsig[j]++
		if !s.Exchangeable {
			exp[j] += float64(s.NH)
		}
	}
	type vote struct {
		j       int
		r, w    float64
		tainted bool
	}
	var vs []vote
	for j, e := range exp {
		if e > 0 && ms[j].area > 0 {
			// A multiplet holding the water line, the residual solvent or
			// an identified species has area that is not the compound's:
			// it may be contradicted but does not set the consensus (at
			// 60 MHz DMSO's water at 3.33 merges with a CH2Br at 3.42).
			vs = append(vs, vote{j, e / ms[j].area, math.Min(e, 3) / float64(nsig[j]), ev.excessExplained(ms[j])})
		}
	}
	if len(vs) < 2 || !(ev.scale > 0) {
		return nil
	}
	sort.Slice(vs, func(a, b int) bool { return vs[a].r < vs[b].r || vs[a].r == vs[b].r && vs[a].j < vs[b].j })
	var untainted []weighted
	for _, v := range vs {
		if !v.tainted {
			untainted = append(untainted, weighted{v.r, v.w})
		}
	}
	cons := weightedMedian(untainted)
	if !(cons > 0) {
		return nil
	}
	agree := map[int]bool{}
	var agreeJ []int
	agreeH := 0.0
	for _, v := range vs {
		if !v.tainted && math.Abs(math.Log(v.r/cons)) <= math.Log1p(agreeFrac) {
			agree[v.j] = true
			agreeJ = append(agreeJ, v.j)
			agreeH += exp[v.j]
		}
	}
	backed := len(agreeJ) >= 2 && agreeH >= 3 ||
		len(vs) == 2 && len(agreeJ) == 1 && nsig[agreeJ[0]] == 1 && agreeH >= 2
	if backed && math.Abs(math.Log(ev.scale/cons)) >= math.Log1p(conflictFrac) {
		return conflictReasons(ms, agreeJ, agree, exp, all, cons)
	}
	var out []string
	for _, v := range vs {
		j := v.j
		got := ms[j].area * ev.scale
		excess := got - all[j]
		excused := false
		switch ev.foreignIn(ms[j]) {
		case foreignSpecies:
			excused = true
		case foreignSolvent:
			excused = excess <= waterExcuseH
		}
		if excess >= offH && excess >= excessFrac*all[j] && !excused {
			out = append(out, fmt.Sprintf("the multiplet at %.2f holds %.1f H where %.0f are expected (a longer chain, or an impurity under it?)",
				ms[j].ppm, got, all[j]))
		}
	}
	return out
}

// conflictReasons sums the multiplets outside the agreeing set on the
// consensus scale cons, short ones and long ones apart.
func conflictReasons(ms []mplet, agreeJ []int, agree map[int]bool, exp, all map[int]float64, cons float64) []string {
	var shortJ, longJ []int
	var shortGot, shortExp, longGot, longAll float64
	for j, e := range exp {
		if agree[j] || !(ms[j].area > 0) {
			continue
		}
		got := ms[j].area * cons
		switch {
		case got < e:
			shortJ = append(shortJ, j)
			shortGot += got
			shortExp += e
		case got > all[j]:
			longJ = append(longJ, j)
			longGot += got
			longAll += all[j]
		}
	}
	on := fmt.Sprintf("on the scale of the multiplet at %s,", ppmList(ms, agreeJ))
	if len(agreeJ) > 1 {
		on = fmt.Sprintf("on the scale of the multiplets at %s, which agree,", ppmList(ms, agreeJ))
	}
	var out []string
	if d := shortExp - shortGot; d >= offH && d >= misfitFrac*shortExp {
		out = append(out, fmt.Sprintf("%s the %s at %s %s %.1f H where %.0f are expected (a shorter chain, or another compound?)",
			on, plural(len(shortJ), "multiplet"), ppmList(ms, shortJ), holds(len(shortJ)), shortGot, shortExp))
	}
	if d := longGot - longAll; d >= offH && d >= misfitFrac*longAll {
		out = append(out, fmt.Sprintf("%s the %s at %s %s %.1f H where %.0f are expected (a longer chain, or water or an impurity under it?)",
			on, plural(len(longJ), "multiplet"), ppmList(ms, longJ), holds(len(longJ)), longGot, longAll))
	}
	return out
}

func plural(n int, w string) string {
	if n == 1 {
		return w
	}
	return w + "s"
}

func holds(n int) string {
	if n == 1 {
		return "holds"
	}
	return "hold"
}

// excessExplained reports whether water, the residual solvent or a species
// identified in the sample has a tabulated line in multiplet m (± 0.05
// ppm): extra area there has a known source.
func (ev *evaluation) excessExplained(m mplet) bool {
	return ev.foreignIn(m) != foreignNone
}

// Kinds of foreign line in a multiplet (foreignIn).
const (
	foreignNone    = iota
	foreignSolvent // the water line or the residual solvent
	foreignSpecies // a species identified in the sample
)

// foreignIn reports what foreign line lies in multiplet m (± 0.05 ppm):
// an identified species' tabulated line, or the water line or residual
// solvent, or none.
func (ev *evaluation) foreignIn(m mplet) int {
	if !ev.solvOK {
		return foreignNone
	}
	in := func(p float64) bool { return p >= m.from-0.05 && p <= m.to+0.05 }
	found := map[string]bool{}
	for _, f := range ev.ex.found {
		found[f.Name] = true
	}
	kind := foreignNone
	if in(ev.solv.Residual) {
		kind = foreignSolvent
	}
	for _, sp := range SpeciesFor(ev.solv.Name) {
		if sp.Kind != "water" && !found[sp.Name] {
			continue
		}
		for _, sg := range sp.Signals {
			if !in(sg.PPM[ev.solv.Name]) {
				continue
			}
			if sp.Kind == "water" {
				kind = max(kind, foreignSolvent)
			} else {
				return foreignSpecies
			}
		}
	}
	return kind
}

// waterExcuseH: an excess of at most this many H in a multiplet holding
// the water line or the residual solvent is put down to them; more is
// not (at 60 MHz CDCl3's water at 1.56 lies inside every alkyl envelope,
// and a homolog's extra CH2 groups hid behind it). A wet sample's water
// rarely exceeds this against one molecule (common practice, no source).
const waterExcuseH = 3.0

// ppmList names multiplets by position, high ppm first ("3.67, 2.30").
func ppmList(ms []mplet, js []int) string {
	ps := make([]float64, len(js))
	for k, j := range js {
		ps[k] = ms[j].ppm
	}
	sort.Sort(sort.Reverse(sort.Float64Slice(ps)))
	s := make([]string, len(ps))
	for k, p := range ps {
		s[k] = fmt.Sprintf("%.2f", p)
	}
	return strings.Join(s, ", ")
}
