package spin

import (
	"fmt"
	"math"
	"strings"
)

// composite is one total-spin choice for a group of n equivalent spin-1/2
// nuclei: spin F = TwoF/2, occurring Mult times.
type composite struct {
	twoF int
	mult float64
}

// composites decomposes n spin-1/2 nuclei into total spins F = n/2, n/2−1,
// … ≥ 0 with multiplicities C(n,k) − C(n,k−1) (angular-momentum addition;
// e.g. n=3: F=3/2 once, F=1/2 twice).
func composites(n int) []composite {
	var out []composite
	prev := 0.0
	c := 1.0 // C(n,k)
	for k := 0; 2*k <= n; k++ {
		if k > 0 {
			c = c * float64(n-k+1) / float64(k)
		}
		out = append(out, composite{twoF: n - 2*k, mult: c - prev})
		prev = c
	}
	return out
}

// combos calls fn for every choice of one composite per group of ns, with
// the product of multiplicities.
func combos(ns []int, fn func(twoF []int, mult float64) error) error {
	choices := make([][]composite, len(ns))
	for i, n := range ns {
		choices[i] = composites(n)
	}
	cur := make([]int, len(ns))
	var rec func(i int, mult float64) error
	rec = func(i int, mult float64) error {
		if i == len(ns) {
			return fn(cur, mult)
		}
		for _, c := range choices[i] {
			cur[i] = c.twoF
			if err := rec(i+1, mult*c.mult); err != nil {
				return err
			}
		}
		return nil
	}
	return rec(0, 1)
}

// blockSizes returns the number of product states for each total 2M, from
// the largest M down, for spins with the given 2F values.
func blockSizes(twoF []int) []float64 {
	sizes := []float64{1}
	for _, f := range twoF {
		next := make([]float64, len(sizes)+f)
		for i, s := range sizes {
			for k := 0; k <= f; k++ {
				next[i+k] += s
			}
		}
		sizes = next
	}
	return sizes
}

// maxBlock returns the size of the largest Mz block of n distinct spin-1/2.
func maxBlock(n int) float64 {
	c := 1.0
	for k := 1; k <= n/2; k++ {
		c = c * float64(n-k+1) / float64(k)
	}
	return c
}

// workBudget is the diagonalisation work (Σ d³ over blocks) of maxSpins
// distinct spin-1/2 nuclei.
func workBudget(maxSpins int) float64 {
	w := 0.0
	for _, d := range blockSizes(make1s(maxSpins)) {
		w += d * d * d
	}
	return w
}

func make1s(n int) []int {
	s := make([]int, n)
	for i := range s {
		s[i] = 1
	}
	return s
}

// exactCost estimates the work of simulating cluster c once and returns an
// error wrapping ErrTooLarge when it exceeds the bound set by maxSpins.
func (es *esys) exactCost(c []int, maxSpins int) (float64, error) {
	ns := make([]int, len(c))
	nuclei := 0
	for i, g := range c {
		ns[i] = es.g[g].n
		nuclei += ns[i]
	}
	limit, budget := maxBlock(maxSpins), workBudget(maxSpins)
	cost, biggest := 0.0, 0.0
	ncombo := 1.0
	for _, n := range ns {
		ncombo *= float64(len(composites(n)))
	}
	add := func(twoF []int) {
		for _, d := range blockSizes(twoF) {
			cost += d * d * d
			biggest = math.Max(biggest, d)
		}
	}
	// The combination of the largest composite spins has the largest
	// blocks: check it alone first, and stop the enumeration (exponential in
	// the number of groups) as soon as the budget is exceeded.
	add(ns)
	if biggest <= limit && cost <= budget {
		cost = 0
		_ = combos(ns, func(twoF []int, _ float64) error {
			add(twoF)
			if cost > budget {
				return ErrTooLarge
			}
			return nil
		})
	}
	if biggest > limit || cost > budget {
		names := make([]string, len(c))
		for i, g := range c {
			names[i] = fmt.Sprintf("%q", es.g[g].name)
		}
		return 0, fmt.Errorf("spin: cluster of groups %s (%d nuclei, %.0f composite-spin choices, largest Mz block %.0f states) exceeds the exact-simulation limit of %d spins (block %.0f states): %w; use first-order mode (--mode first-order)",
			strings.Join(names, ", "), nuclei, ncombo, biggest, maxSpins, limit, ErrTooLarge)
	}
	return cost, nil
}

// exactLines simulates cluster c exactly, treating the partners xs in the X
// approximation (one sub-spectrum per spin configuration of the partners).
// It also returns the intensity of the transitions too weak to report.
// weighted chooses the non-negative attribution of transitions to groups
// (sink.weighted).
func (es *esys) exactLines(c []int, xs []int, weighted bool) ([]rawLine, float64, error) {
	ns := make([]int, len(c))
	nuclei := 0
	for i, g := range c {
		ns[i] = es.g[g].n
		nuclei += ns[i]
	}
	jm := make([][]float64, len(c))
	for i, a := range c {
		jm[i] = make([]float64, len(c))
		for k, b := range c {
			jm[i][k] = es.j[a][b]
		}
	}
	norm := math.Pow(2, float64(nuclei-1)) // Tr(F+_g F−_g) = n_g·2^(N−1)
	dst := &sink{eg: c, weighted: weighted}
	err := configs(es, xs, func(m []float64, w float64) error {
		nu := make([]float64, len(c))
		for i, g := range c {
			nu[i] = es.g[g].nu
			for k, p := range xs {
				nu[i] += es.j[g][p] * m[k]
			}
		}
		return combos(ns, func(twoF []int, mult float64) error {
			var spins []cspin
			for i, f := range twoF {
				if f > 0 {
					spins = append(spins, cspin{twoF: f, nu: nu[i], grp: i})
				}
			}
			dst.scale = w * mult / norm
			return transitions(spins, jm, dst)
		})
	})
	return dst.all(), dst.dropped, err
}

// configs calls fn for every spin configuration of the partner groups xs:
// m[k] is the total Mz of partner k (n/2 − j for j of its n spins down),
// with its binomial population w.
func configs(es *esys, xs []int, fn func(m []float64, w float64) error) error {
	m := make([]float64, len(xs))
	var rec func(i int, w float64) error
	rec = func(i int, w float64) error {
		if i == len(xs) {
			return fn(m, w)
		}
		n := es.g[xs[i]].n
		for k, wk := range binomialWeights(n) {
			m[i] = float64(n)/2 - float64(k)
			if err := rec(i+1, w*wk); err != nil {
				return err
			}
		}
		return nil
	}
	return rec(0, 1)
}
