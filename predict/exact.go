package predict

import (
	"fmt"
	"math"
	"sort"
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

// Bounds on the number of protons in one coupled cluster: in Auto mode a
// larger strongly coupled cluster is computed first-order (with a warning),
// in Exact mode a larger coupled cluster is refused. Exact simulation cost
// grows about eightfold per added spin; 8 distinct protons (largest block 70
// states) keep a cluster in milliseconds, 10 already take ~0.2 s of CPU
// (see BENCHMARKS.md, spin Cluster10).
const (
	autoMaxNuclei  = 8
	exactMaxNuclei = 14
	strongRatio    = spin.DefaultStrongRatio
	farShiftPPM    = 1000 // where oversized clusters are parked (see exactLines)
)

// exactLines simulates the spin system and merges the lines back by
// signal. The mode of a signal is "exact" when any of its groups was
// simulated exactly. In Auto mode, the groups of a strongly coupled cluster
// with more than autoMaxNuclei protons are moved to distinct, distant
// shifts so that the simulation treats them (and their partners' splitting
// by them) first-order; their own lines are then taken from the
// first-order splitting.
func (s *system) exactLines(opt Options) ([]Line, []string, error) {
	ss := s.buildSpin()
	parked, err := s.checkClusters(&ss, opt)
	if err != nil {
		return nil, nil, err
	}
	res, err := spin.Simulate(ss.sys, spin.Options{FieldMHz: opt.FieldMHz, Mode: opt.Mode})
	if err != nil {
		return nil, nil, err
	}
	modes := s.modes("first-order")
	for g, m := range res.ModeUsed {
		if env := ss.groupEnv[g]; env >= 0 && m == spin.Exact && !parked[env] {
			modes[env] = "exact"
		}
	}
	type key struct {
		env int
		mHz int64
	}
	sum := map[key]float64{}
	for _, l := range res.Lines {
		env := ss.groupEnv[l.Group]
		if env < 0 || parked[env] {
			continue
		}
		sum[key{env, int64(math.Round(l.Hz * 1e3))}] += l.Intensity
	}
	out := make([]Line, 0, len(sum))
	for k, in := range sum {
		if math.Abs(in) < 1e-6 {
			continue
		}
		out = append(out, Line{PPM: round(float64(k.mHz)/1e3/opt.FieldMHz, 1e-5), Intensity: round(in, 1e-6), Signal: s.envs[k.env].env.Label})
	}
	for env := range parked {
		e := &s.envs[env]
		ls := []hzLine{{0, float64(e.env.NH)}}
		for _, ps := range e.partners {
			ls = split(ls, math.Abs(ps.j), ps.n)
		}
		out = append(out, toLines(ls, e.shift, opt.FieldMHz, e.env.Label)...)
	}
	order := map[string]int{}
	for i := range s.envs {
		order[s.envs[i].env.Label] = i
	}
	sort.Slice(out, func(a, b int) bool {
		if out[a].Signal != out[b].Signal {
			return order[out[a].Signal] < order[out[b].Signal]
		}
		return out[a].PPM < out[b].PPM
	})
	return out, modes, nil
}

// checkClusters finds the coupled clusters of proton groups (by strong
// couplings in Auto mode, by any coupling in Exact mode). In Exact mode a
// cluster above exactMaxNuclei is an error wrapping spin.ErrTooLarge; in
// Auto mode a cluster above autoMaxNuclei is parked at distant shifts and
// its environments are returned. A cluster of a single proton group is
// exempt from both bounds.
func (s *system) checkClusters(ss *spinSystem, opt Options) (map[int]bool, error) {
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
		ga, gb := ss.sys.Groups[c.A], ss.sys.Groups[c.B]
		if !ga.IsProton() || !gb.IsProton() {
			continue
		}
		dnu := math.Abs(ga.ShiftPPM-gb.ShiftPPM) * opt.FieldMHz
		if opt.Mode == spin.Exact || dnu < strongRatio*math.Abs(c.JHz) {
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
	parked := map[int]bool{}
	for g, gr := range ss.sys.Groups {
		r := find(g)
		switch {
		case !gr.IsProton():
		case groups[r] == 1:
			// A lone group of equivalent protons (the 12 H of TMS, a
			// tert-butyl) is one composite spin: its size costs the
			// simulation nothing, so it is never parked or refused.
		case opt.Mode == spin.Exact && size[r] > exactMaxNuclei:
			return nil, fmt.Errorf("signal %s is in a coupled cluster of %d protons, more than the %d that exact simulation allows: %w; use --mode auto or first-order",
				gr.Name, size[r], exactMaxNuclei, spin.ErrTooLarge)
		case opt.Mode == spin.Auto && size[r] > autoMaxNuclei:
			parked[ss.groupEnv[g]] = true
			ss.sys.Groups[g].ShiftPPM = farShiftPPM + 10*float64(g)
		}
	}
	if len(parked) > 0 {
		var labels []string
		for env := range parked {
			labels = append(labels, s.envs[env].env.Label)
		}
		sort.Strings(labels)
		s.warnings = append(s.warnings, fmt.Sprintf("signals %s form a strongly coupled cluster too large to simulate exactly; first-order patterns used for them", strings.Join(labels, ", ")))
	}
	return parked, nil
}
