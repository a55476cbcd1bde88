package predict

import (
	"fmt"
	"math"
	"slices"
	"strconv"

	"shiftwise/graph"
	"shiftwise/jrules"
	"shiftwise/shiftinc"
)

// envState is one observed environment with its shift and first-order
// partner sets.
type envState struct {
	env      graph.Environment
	shift    float64 // ppm
	sd       float64 // ppm
	low      bool
	rules    []string
	first    int // index of its first proton in system.protons
	partners []partnerSet
}

// partnerSet is one entry of a signal's first-order J list: n partners
// (protons of one environment, or heteronuclei of one symmetry class)
// coupling with mean J.
type partnerSet struct {
	to         string
	n          int
	j          float64 // signed mean of the typical values
	jmin, jmax float64 // range of |J|
	nb         int
	env        int     // partner environment, -1 for a heteronucleus
	deltaHz    float64 // shift difference to the partner at the field (+Inf for heteronuclei)
	hetero     bool
}

// heteroNucleus is a 19F or 31P atom.
type heteroNucleus struct {
	atom    int
	nucleus string // "19F" or "31P"
	class   int    // symmetry class
	label   string // e.g. "F3"
}

// system holds everything the line computations need.
type system struct {
	m        *graph.Mol
	envs     []envState
	protons  []graph.Proton
	envOf    []int
	hetero   []heteroNucleus
	jhh      map[[2]int]jrules.J // by proton index pair, both orders; absent: no coupling
	jhx      []jrules.J          // n×len(hetero)
	warnings []string
}

// newSystem collects environments, shifts and couplings.
func newSystem(m *graph.Mol, opt Options) *system {
	s := &system{m: m}
	exchanged := opt.Solvent == "D2O" || opt.Solvent == "CD3OD"
	est := opt.Rules.Protons(m, opt.Solvent) // shares look-ups across protons
	for _, e := range m.Environments() {
		if e.Exchangeable && exchanged {
			s.warnings = append(s.warnings, fmt.Sprintf(
				"%s (%s, %d H) exchanges with the deuterium of %s and is not observed", e.Label, e.Kind, e.NH, opt.Solvent))
			continue
		}
		st := envState{env: e, first: len(s.protons)}
		st.shift, st.sd, st.low, st.rules = shiftOf(e, est)
		for _, p := range e.Protons {
			s.protons = append(s.protons, p)
			s.envOf = append(s.envOf, len(s.envs))
		}
		s.envs = append(s.envs, st)
	}
	s.noteUnobserved()
	s.findHetero()
	s.couple(opt)
	for i := range s.envs {
		s.envs[i].partners = s.partnerSets(i, opt.FieldMHz)
	}
	return s
}

// noteUnobserved warns when the structure has no 1H signal to predict and
// about protium atoms bonded to no single heavy atom (H2, H+, a bridging H),
// which have no environment and so no signal: an empty prediction must not
// pass for a silent "nothing to see".
func (s *system) noteUnobserved() {
	free := 0
	for a := range s.m.Atoms {
		if at := &s.m.Atoms[a]; at.Element == "H" && at.Isotope <= 1 {
			free++
		}
	}
	if free > 0 {
		s.warnings = append(s.warnings, fmt.Sprintf(
			"%d hydrogen atom(s) not bonded to a single heavy atom (as in [H][H] or [H+]) are not predicted", free))
	}
	if free == 0 && len(s.envs) == 0 && len(s.warnings) == 0 {
		s.warnings = append(s.warnings, "no 1H signals: the structure has no protium (1H) bonded to a heavy atom")
	}
}

// shiftOf averages the increment estimates of an environment's protons:
// the SD combines the mean variance of the estimates with their spread.
func shiftOf(e graph.Environment, ests map[graph.Proton]shiftinc.Estimate) (ppm, sd float64, low bool, rules []string) {
	var sum, sumSq, varSum float64
	have := map[string]int{}
	n := 0
	for i, p := range e.Protons {
		if i > 0 && e.Protons[i-1].Atom == p.Atom {
			continue // protons of one atom in one environment are equivalent
		}
		n++
		est := ests[p]
		sum += est.PPM
		sumSq += est.PPM * est.PPM
		varSum += est.SD * est.SD
		low = low || est.LowConfidence
		// A rule applied k times to one proton (the second and third α-Cl
		// of CHCl3) is listed k times; a rule shared by the protons once.
		mine := map[string]int{}
		for _, r := range est.Rules {
			if mine[r]++; mine[r] > have[r] {
				have[r]++
				rules = append(rules, r)
			}
		}
	}
	if n == 0 {
		return 0, 0, true, nil
	}
	k := float64(n)
	ppm = sum / k
	spread := math.Max(0, sumSq/k-ppm*ppm)
	return ppm, math.Sqrt(varSum/k + spread), low, rules
}

// findHetero lists the 19F and 31P atoms.
func (s *system) findHetero() {
	var cls []int
	for a := range s.m.Atoms {
		nuc := ""
		switch s.m.Atoms[a].Element {
		case "F":
			nuc = "19F"
		case "P":
			nuc = "31P"
		default:
			continue
		}
		if cls == nil {
			cls = s.m.SymmetryClasses()
		}
		s.hetero = append(s.hetero, heteroNucleus{atom: a, nucleus: nuc, class: cls[a],
			label: s.m.Atoms[a].Element + strconv.Itoa(a)})
	}
}

// couple estimates every H–H coupling between protons at most three heavy
// bonds apart, and every H–F/H–P coupling.
func (s *system) couple(opt Options) {
	n := len(s.protons)
	s.jhh = map[[2]int]jrules.J{} // sparse: a dense n×n table took GBs for long chains
	near := s.nearAtoms(3)
	// The coupling depends on the protons' indices only across a C=C
	// (cis/trans); elsewhere one estimate serves every pair of two atoms.
	type cached struct {
		j  jrules.J
		ok bool
	}
	cache := map[[2]int]cached{}
	for i := 0; i < n; i++ {
		for k := i + 1; k < n; k++ {
			p, q := s.protons[i], s.protons[k]
			if !near[p.Atom*len(s.m.Atoms)+q.Atom] {
				continue
			}
			key := [2]int{p.Atom, q.Atom}
			c, hit := cache[key]
			if !hit {
				c.j, c.ok = jrules.BetweenIn(s.m, p, q, opt.Solvent)
				if !s.doubleBonded(p.Atom, q.Atom) {
					cache[key] = c
				}
			}
			if c.ok {
				s.jhh[[2]int{i, k}], s.jhh[[2]int{k, i}] = c.j, c.j
			}
		}
	}
	s.jhx = make([]jrules.J, n*len(s.hetero))
	for i, p := range s.protons {
		for h, x := range s.hetero {
			if j, ok := jrules.ToHetero(s.m, p, x.atom); ok {
				s.jhx[i*len(s.hetero)+h] = j
			}
		}
	}
}

// doubleBonded reports whether atoms a and b are joined by a non-aromatic
// double bond.
func (s *system) doubleBonded(a, b int) bool {
	bi := s.m.BondBetween(a, b)
	return bi >= 0 && s.m.Bonds[bi].Order == 2 && !s.m.Bonds[bi].Aromatic
}

// nearAtoms returns an atoms×atoms matrix: near[a*n+b] is true when b is
// within maxDist bonds of the hydrogen-bearing atom a.
func (s *system) nearAtoms(maxDist int) []bool {
	n := len(s.m.Atoms)
	near := make([]bool, n*n)
	var frontier, next []int
	for i, p := range s.protons {
		if i > 0 && s.protons[i-1].Atom == p.Atom {
			continue
		}
		row := near[p.Atom*n : (p.Atom+1)*n]
		row[p.Atom] = true
		frontier = append(frontier[:0], p.Atom)
		for d := 0; d < maxDist; d++ {
			next = next[:0]
			for _, a := range frontier {
				for _, b := range s.m.Neighbors(a) {
					if !row[b] {
						row[b] = true
						next = append(next, b)
					}
				}
			}
			frontier, next = next, frontier
		}
	}
	return near
}

// jh returns the H–H coupling between proton indices i and k.
func (s *system) jh(i, k int) jrules.J { return s.jhh[[2]int{i, k}] }

// jx returns the coupling between proton i and heteronucleus h.
func (s *system) jx(i, h int) jrules.J { return s.jhx[i*len(s.hetero)+h] }

// partnerSets builds the first-order J list of environment e from its
// first proton: per partner environment, the protons with |J| ≥
// minReportHz and their mean J; per heteronuclear symmetry class likewise.
func (s *system) partnerSets(e int, field float64) []partnerSet {
	st := &s.envs[e]
	rep := st.first
	var out []partnerSet
	for f := range s.envs {
		if f == e {
			continue
		}
		var js []jrules.J
		for k := s.envs[f].first; k < s.envs[f].first+len(s.envs[f].env.Protons); k++ {
			if j := s.jh(rep, k); j.NBonds > 0 && math.Abs(j.Typical) >= minReportHz {
				js = append(js, j)
			}
		}
		for _, c := range clusterJ(js) {
			ps := meanSet(c)
			ps.to, ps.env = s.envs[f].env.Label, f
			ps.deltaHz = (st.shift - s.envs[f].shift) * field
			out = append(out, ps)
		}
	}
	out = append(out, s.heteroSets(rep)...)
	slices.SortStableFunc(out, func(a, b partnerSet) int {
		return cmpFloat(math.Abs(b.j), math.Abs(a.j))
	})
	return out
}

// heteroSets groups the heteronuclear couplings of proton rep by the
// symmetry class of the heteroatom.
func (s *system) heteroSets(rep int) []partnerSet {
	var out []partnerSet
	done := map[int]bool{}
	for h, x := range s.hetero {
		if done[x.class] {
			continue
		}
		done[x.class] = true
		var js []jrules.J
		for h2 := h; h2 < len(s.hetero); h2++ {
			if s.hetero[h2].class != x.class {
				continue
			}
			if j := s.jx(rep, h2); j.NBonds > 0 && math.Abs(j.Typical) >= minReportHz {
				js = append(js, j)
			}
		}
		for _, c := range clusterJ(js) {
			ps := meanSet(c)
			ps.to, ps.env, ps.hetero = x.label, -1, true
			ps.deltaHz = math.Inf(1)
			out = append(out, ps)
		}
	}
	return out
}

// clusterJ splits the couplings from one proton to the members of one
// partner set into clusters of similar value (within 0.5 Hz or 15 %), so
// that e.g. the ortho (8 Hz) and para (0.5 Hz) partners of an AA'XX'
// proton stay separate instead of averaging into a false triplet.
func clusterJ(js []jrules.J) [][]jrules.J {
	slices.SortStableFunc(js, func(a, b jrules.J) int {
		return cmpFloat(math.Abs(b.Typical), math.Abs(a.Typical))
	})
	var out [][]jrules.J
	for _, j := range js {
		if n := len(out); n > 0 {
			ref := math.Abs(out[n-1][0].Typical)
			if ref-math.Abs(j.Typical) <= math.Max(0.5, 0.15*ref) {
				out[n-1] = append(out[n-1], j)
				continue
			}
		}
		out = append(out, []jrules.J{j})
	}
	return out
}

// meanSet averages a list of couplings into one partner set.
func meanSet(js []jrules.J) partnerSet {
	ps := partnerSet{n: len(js), nb: js[0].NBonds, jmin: math.Inf(1), jmax: math.Inf(-1)}
	for _, j := range js {
		ps.j += j.Typical
		ps.jmin = math.Min(ps.jmin, absMin(j))
		ps.jmax = math.Max(ps.jmax, absMax(j))
		ps.nb = min(ps.nb, j.NBonds)
	}
	ps.j /= float64(len(js))
	return ps
}

// absMin and absMax give the range of |J| covered by [Min, Max].
func absMin(j jrules.J) float64 {
	if j.Min <= 0 && j.Max >= 0 {
		return 0
	}
	return math.Min(math.Abs(j.Min), math.Abs(j.Max))
}

func absMax(j jrules.J) float64 { return math.Max(math.Abs(j.Min), math.Abs(j.Max)) }

func cmpFloat(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}
