package spin

import (
	"errors"
	"math"
	"strings"
)

// Fragments. A strongly coupled cluster too large to diagonalise (in Auto
// mode) is simulated piece by piece: for each group g of the cluster a
// fragment is grown around g from the groups most strongly coupled to it,
// up to the work of Options.FragmentSpins distinct spin-1/2 nuclei; the
// fragment is simulated exactly, its outside partners (the rest of the
// cluster included) split its lines first-order, and only g's part of the
// lines is kept (by weight, see fragmentLines). Every group thus gets its lines from a fragment centred on
// itself, and each group's lines still sum to its Count. The result is an
// approximation: couplings from the fragment to the rest of the cluster
// are treated as weak. It converges to the exact spectrum as the fragment
// grows, and second-order effects fade along a chain of couplings, so the
// nearest strongly coupled neighbours matter most. (Simulating each spin
// with its strongly coupled neighbourhood and keeping only its own lines is
// a published idea, e.g. Castillo, Patiny & Wist, J. Magn. Reson. 2011;
// reference from memory. The growth rule below is our own.)

// DefaultFragmentSpins bounds a fragment when Options.FragmentSpins is 0:
// the work of 9 distinct spin-1/2 nuclei (largest Mz block 126 states).
// Measured against exact simulation (rendered with 1 Hz lines, largest
// difference relative to the tallest point): the 14-spin chain of
// BenchmarkCluster14 0.72% (8 spins: 0.93%); heptanal at 60 MHz, whose
// nearly coincident CH2 groups need the whole core in one fragment, 5.8%
// (with 8 spins and the signed shares used before: 48%, hardly better
// than first-order's 65%).
const DefaultFragmentSpins = 9

// MaxFragmentGroups bounds the clusters simulated by fragments (one
// fragment per group, each taking milliseconds to tens of ms): a larger
// strongly coupled cluster, such as the CH2 groups of a long alkyl chain, is
// computed first-order in Auto mode, with a note.
const MaxFragmentGroups = 32

// fragmentConfigs bounds the X-approximation configurations of a fragment:
// 1, i.e. partners outside the fragment only split its lines first-order.
// Measured (TestFragmentApproachesExact's measure, heptanal at 60 MHz,
// fragments of 9, with the signed shares used then): 4.1% from exact in
// 44 ms, against 1.3% in 175 ms with up to 16 configurations as for whole
// clusters; the 14-spin chain was not affected (0.7%). Many configurations
// of strongly coupled partners also break the near-equivalence of long CH2
// runs into tens of thousands of lines (decane at 400 MHz, measured then:
// 43,536 lines and 0.2 s with configurations, 10 lines and 35 ms without).
const fragmentConfigs = 1

func fragSpins(opt Options) int {
	if opt.FragmentSpins == 0 {
		return DefaultFragmentSpins
	}
	return opt.FragmentSpins
}

// firstOrderLines splits each group of c first-order by all its partners
// (simulateCluster's path for a single group, in Auto mode).
func (es *esys) firstOrderLines(c []int, opt Options) ([]rawLine, float64, error) {
	opt.Mode = Auto
	var out []rawLine
	for _, g := range c {
		lines, _, err := es.simulateCluster([]int{g}, opt)
		if err != nil {
			return nil, 0, err
		}
		out = append(out, lines...)
	}
	sortRaw(out)
	return out, 0, nil
}

// names lists the names of the member groups of c for notes, each once.
func (es *esys) names(c []int) string {
	var s []string
	seen := map[string]bool{}
	for _, g := range c {
		for _, n := range es.g[g].names {
			if !seen[n] {
				seen[n] = true
				s = append(s, n)
			}
		}
	}
	if len(s) > 12 {
		s = append(s[:12], "…")
	}
	return strings.Join(s, ", ")
}

// fragment grows the fragment of cluster c centred on group g: repeatedly
// add the group h of c with the largest path strength p(h) = max over
// fragment members k of p(k)·min(1, |J_kh|/|Δν_kh|), with p(g) = 1, as long
// as the fragment's exact cost stays within the work of maxSpins spins.
// Groups that would exceed it are skipped (a smaller one may still fit).
// g is first in the result.
func (es *esys) fragment(g int, c []int, maxSpins int) []int {
	f := []int{g}
	p := map[int]float64{g: 1}
	in := map[int]bool{g: true}
	skip := map[int]bool{}
	relax := func(k int) {
		for _, h := range c {
			if in[h] || skip[h] {
				continue
			}
			j := math.Abs(es.j[k][h])
			if j == 0 {
				continue
			}
			s := 1.0
			if dnu := math.Abs(es.g[k].nu - es.g[h].nu); dnu > j {
				s = j / dnu
			}
			p[h] = math.Max(p[h], p[k]*s)
		}
	}
	relax(g)
	for {
		best := -1
		for _, h := range c {
			if in[h] || skip[h] || p[h] == 0 {
				continue
			}
			if best < 0 || p[h] > p[best] {
				best = h
			}
		}
		if best < 0 {
			return f
		}
		if _, err := es.exactCost(append(f[:len(f):len(f)], best), maxSpins); err != nil {
			skip[best] = true
			continue
		}
		f = append(f, best)
		in[best] = true
		relax(best)
	}
}

// fragmentLines simulates cluster c by fragments (see above). Within a
// fragment each transition is attributed to the groups in proportion to
// |A_g|² (sink.weighted), not as the signed shares A_g·A of exact mode: a
// negative share is cancelled by another group's share of the same
// transition, but that group's lines come from its own fragment, at a
// slightly different frequency, so signed shares would leave negative
// lines. The centre's lines are then scaled to sum to its count (the
// weights make its total differ by a few per cent, and the transitions
// too weak to list are spread over the others): Dropped is 0.
func (es *esys) fragmentLines(c []int, opt Options) ([]rawLine, float64, error) {
	fs := fragSpins(opt)
	fopt := opt
	fopt.MaxSpins = fs
	// Fragments are independent: they run on up to GOMAXPROCS goroutines,
	// each writing its own slot, and are joined in order.
	own := make([][]rawLine, len(c))
	errs := make([]error, len(c))
	parallel(len(c), func(i int) {
		g := c[i]
		lines, _, err := es.simulateGroups(es.fragment(g, c, fs), fopt, g)
		if err != nil {
			errs[i] = err
			return
		}
		kept := 0.0
		for _, l := range lines {
			if l.eg == g {
				own[i] = append(own[i], l)
				kept += l.inten
			}
		}
		// Scale to the group's count (see fragmentLines).
		if kept > 0 {
			f := float64(es.g[g].n) / kept
			for k := range own[i] {
				own[i][k].inten *= f
			}
		}
	})
	if err := errors.Join(errs...); err != nil {
		return nil, 0, err
	}
	var out []rawLine
	for i := range c {
		out = append(out, own[i]...)
	}
	sortRaw(out) // groups differ between fragments: nothing to merge
	return out, 0, nil
}
