package predict

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"

	"shiftwise/predict/spin"
)

// Shifts given to heteronuclear groups: irrelevant to the 1H lines but
// required by the spin system; distinct per symmetry class so that only
// equivalent heteroatoms merge.
const (
	fluorineShiftPPM   = -120
	phosphorusShiftPPM = 0
)

// spinSystem is the spin.System of a prediction with the map back from
// groups to environments.
type spinSystem struct {
	sys      spin.System
	groupEnv []int // environment of each proton group; -1 for heteronuclei
	rep      []int // representative proton (system.protons index) or hetero index
}

// buildSpin makes one group per magnetically equivalent environment, one
// group per proton of an environment that is only chemically equivalent,
// and one group per 19F/31P atom.
func (s *system) buildSpin() spinSystem {
	var ss spinSystem
	for i := range s.envs {
		e := &s.envs[i]
		if e.env.MagneticallyEquivalent || len(e.env.Protons) == 1 {
			ss.add(spin.Group{Name: e.env.Label, ShiftPPM: e.shift, Count: e.env.NH}, i, e.first)
			continue
		}
		for k := range e.env.Protons {
			ss.add(spin.Group{Name: e.env.Label, ShiftPPM: e.shift, Count: 1}, i, e.first+k)
		}
	}
	nH := len(ss.sys.Groups)
	for h, x := range s.hetero {
		shift := float64(fluorineShiftPPM)
		if x.nucleus == "31P" {
			shift = phosphorusShiftPPM
		}
		ss.add(spin.Group{Name: x.label, ShiftPPM: shift + 0.5*float64(x.class), Count: 1, Nucleus: x.nucleus}, -1, h)
	}
	for a := 0; a < len(ss.sys.Groups); a++ {
		for b := a + 1; b < len(ss.sys.Groups); b++ {
			if j := s.groupJ(ss, a, b, nH); math.Abs(j) >= minSpinHz {
				ss.sys.Couplings = append(ss.sys.Couplings, spin.Coupling{A: a, B: b, JHz: j})
			}
		}
	}
	return ss
}

func (ss *spinSystem) add(g spin.Group, env, rep int) {
	ss.sys.Groups = append(ss.sys.Groups, g)
	ss.groupEnv = append(ss.groupEnv, env)
	ss.rep = append(ss.rep, rep)
}

// groupJ is the coupling between groups a < b (proton groups come first).
func (s *system) groupJ(ss spinSystem, a, b, nH int) float64 {
	switch {
	case b < nH:
		if ss.groupEnv[a] == ss.groupEnv[b] && s.envs[ss.groupEnv[a]].env.MagneticallyEquivalent {
			return 0
		}
		return s.jh(ss.rep[a], ss.rep[b]).Typical
	case a < nH:
		return s.jx(ss.rep[a], ss.rep[b]).Typical
	}
	return 0 // F–F and F–P couplings do not change the 1H lines to first order
}

// Bounds on coupled clusters. In Auto mode a strongly coupled cluster whose
// exact simulation costs more than that of autoMaxSpins distinct protons
// (largest block 126 states: a few ms) is simulated by fragments of the
// same size (spin.Options.FragmentSpins), and its signals' mode is "fragment"; in Exact mode a cluster of more
// than exactMaxNuclei protons is refused. Exact cost grows about eightfold
// per added spin: 10 distinct protons take tens of ms (see BENCHMARKS.md,
// spin Cluster10).
const (
	autoMaxSpins   = spin.DefaultFragmentSpins
	exactMaxNuclei = 14
)

// exactLines simulates the spin system and merges the lines back by
// signal. The mode of a signal is "exact" when any of its groups was
// simulated exactly, "fragment" when by fragments.
func (s *system) exactLines(opt Options) ([]Line, []string, error) {
	ss := s.buildSpin()
	if err := s.checkClusters(&ss, opt); err != nil {
		return nil, nil, err
	}
	so := spin.Options{FieldMHz: opt.FieldMHz, Mode: opt.Mode}
	if opt.Mode == spin.Auto {
		so.MaxSpins, so.FragmentSpins = autoMaxSpins, autoMaxSpins
	}
	res, err := spin.Simulate(ss.sys, so)
	if err != nil {
		return nil, nil, err
	}
	modes := s.modes("first-order")
	for g, m := range res.ModeUsed {
		env := ss.groupEnv[g]
		switch {
		case env < 0:
		case m == spin.Fragment:
			modes[env] = "fragment"
		case m == spin.Exact && modes[env] != "fragment":
			modes[env] = "exact"
		}
	}
	// The spin groups are named after their signals.
	for _, n := range res.Notes {
		s.warnings = append(s.warnings, strings.Replace(n, "groups ", "signals ", 1))
	}
	type key struct {
		env int
		mHz int64
	}
	sum := map[key]float64{}
	for _, l := range res.Lines {
		env := ss.groupEnv[l.Group]
		if env < 0 {
			continue
		}
		sum[key{env, int64(math.Round(l.Hz * 1e3))}] += l.Intensity
	}
	// Sorted by signal (in environment order) and frequency; the keys are
	// integers, so the order does not depend on the map's.
	keys := make([]key, 0, len(sum))
	for k, in := range sum {
		if math.Abs(in) >= 1e-6 {
			keys = append(keys, k)
		}
	}
	slices.SortFunc(keys, func(a, b key) int {
		if c := cmp.Compare(a.env, b.env); c != 0 {
			return c
		}
		return cmp.Compare(a.mHz, b.mHz)
	})
	out := make([]Line, len(keys))
	for i, k := range keys {
		out[i] = Line{PPM: round(float64(k.mHz)/1e3/opt.FieldMHz, 1e-5), Intensity: round(sum[k], 1e-6), Signal: s.envs[k.env].env.Label}
	}
	return out, modes, nil
}

// checkClusters refuses, in Exact mode, a coupled cluster of more than
// exactMaxNuclei protons with an error wrapping spin.ErrTooLarge. A cluster
// of a single proton group (the 12 H of TMS, a tert-butyl) is one
// composite spin and is exempt. (Auto mode needs no check: spin.Simulate
// simulates an oversized strongly coupled cluster by fragments.)
func (s *system) checkClusters(ss *spinSystem, opt Options) error {
	if opt.Mode != spin.Exact {
		return nil
	}
	n := len(ss.sys.Groups)
	parent := make([]int, n)
	for i := range parent {
		parent[i] = i
	}
	find := func(x int) int {
		for parent[x] != x {
			parent[x] = parent[parent[x]]
			x = parent[x]
		}
		return x
	}
	for _, c := range ss.sys.Couplings {
		if ss.sys.Groups[c.A].IsProton() && ss.sys.Groups[c.B].IsProton() {
			parent[find(c.A)] = find(c.B)
		}
	}
	size, groups := map[int]int{}, map[int]int{}
	for g, gr := range ss.sys.Groups {
		if gr.IsProton() {
			size[find(g)] += gr.Count
			groups[find(g)]++
		}
	}
	for g, gr := range ss.sys.Groups {
		if r := find(g); gr.IsProton() && groups[r] > 1 && size[r] > exactMaxNuclei {
			return fmt.Errorf("signal %s is in a coupled cluster of %d protons, more than the %d that exact simulation allows: %w; use --mode auto or first-order",
				gr.Name, size[r], exactMaxNuclei, spin.ErrTooLarge)
		}
	}
	return nil
}
