package spectrum

import (
	"fmt"
	"math"
)

// Referencing.
//
// The ppm axis is moved so that a known signal lands on its tabulated
// shift: TMS at 0 (the IUPAC primary reference for 1H; Harris et al. 2001,
// Pure Appl. Chem. 73, 1795, from memory) or the residual signal of the
// solvent (Fulmer et al. 2010, Table 1; see solvents.go). The axis is moved
// only when the expected signal is found within referenceWindowPPM of its
// tabulated place; otherwise it is left alone and a warning says so.
//
// Reference modes: "auto" uses TMS when a singlet sits near 0 ppm and agrees
// with the solvent residual (when that is found too) within
// referenceAgreePPM; otherwise the solvent residual. "tms" and "solvent"
// force one; "none" keeps the file's axis. The solvent and TMS multiplets are
// labelled in every mode so that later stages do not take them for the
// compound.

// Reference modes for ProcessOptions.Reference.
const (
	RefAuto    = "auto"
	RefTMS     = "tms"
	RefSolvent = "solvent"
	RefNone    = "none"
)

// Multiplet labels set on Multiplet.Label.
const (
	LabelSolvent = "solvent"
	LabelTMS     = "TMS"
)

const (
	referenceWindowPPM = 0.15
	referenceAgreePPM  = 0.03
)

// refOutcome is what referencing decided.
type refOutcome struct {
	shift    float64 // ppm added to every position
	used     string  // RefTMS, RefSolvent or RefNone
	warnings []string
}

// findTMS returns the index of the tallest singlet multiplet within the
// window around 0 ppm, or -1.
func findTMS(gs []group, ls []line) int {
	best, bh := -1, 0.0
	for k, g := range gs {
		if len(g.lines) != 1 {
			continue
		}
		l := ls[g.lines[0]]
		if math.Abs(l.ppm) <= referenceWindowPPM && l.height > bh {
			best, bh = k, l.height
		}
	}
	return best
}

// findSolvent returns the group and observed shift of the solvent residual:
// a group whose pattern matches the solvent's (s, t or p with J near the
// H–D coupling) nearest the tabulated shift, else the line nearest to it.
// k is -1 when nothing lies within the window; the group index is -1 when
// only a line (inside a larger multiplet) was found.
func findSolvent(gs []group, ls []line, sol Solvent, fieldMHz float64) (k int, obs float64, ok bool) {
	best := math.Inf(1)
	k = -1
	for i, g := range gs {
		d := math.Abs(g.centerPPM - sol.ResidualPPM)
		if d > referenceWindowPPM || d >= best || !solventPattern(g, sol) {
			continue
		}
		best, k, obs, ok = d, i, g.centerPPM, true
	}
	if ok {
		return k, obs, true
	}
	for _, l := range ls {
		d := math.Abs(l.ppm - sol.ResidualPPM)
		if l.artifact == "" && d <= referenceWindowPPM && d < best {
			best, obs, ok = d, l.ppm, true
		}
	}
	return -1, obs, ok
}

// solventPattern reports whether g looks like the residual signal of sol.
func solventPattern(g group, sol Solvent) bool {
	switch sol.Multiplicity {
	case "s":
		return len(g.lines) == 1
	case "t":
		// CHD: 1:1:1 triplet, not binomial; a single line when unresolved.
		return len(g.lines) == 1 || len(g.lines) == 3
	default:
		if len(g.lines) == 1 {
			return true
		}
		return g.multiplicity == sol.Multiplicity && len(g.j) == 1 && math.Abs(g.j[0]-sol.JHDHz) < 0.8
	}
}

// reference decides the axis shift and labels the solvent and TMS groups.
func reference(gs []group, ls []line, sol Solvent, haveSol bool, mode string, fieldMHz float64) refOutcome {
	var out refOutcome
	tk := findTMS(gs, ls)
	sk, sobs, sok := -1, 0.0, false
	if haveSol {
		sk, sobs, sok = findSolvent(gs, ls, sol, fieldMHz)
	}
	if tk >= 0 {
		gs[tk].label = LabelTMS
	}
	if sk >= 0 && sk != tk {
		gs[sk].label = LabelSolvent
	}
	tShift := 0.0
	if tk >= 0 {
		tShift = -gs[tk].centerPPM
	}
	sShift := sol.ResidualPPM - sobs
	switch mode {
	case RefNone:
		out.used = RefNone
	case RefTMS:
		if tk < 0 {
			out.used = RefNone
			out.warnings = append(out.warnings, fmt.Sprintf("no TMS singlet within ±%.2f ppm of 0; axis left as in the file", referenceWindowPPM))
			return out
		}
		out.shift, out.used = tShift, RefTMS
	case RefSolvent:
		out = solventRef(sok, sShift, sol, haveSol)
	default: // auto
		switch {
		case tk >= 0 && (!sok || math.Abs(tShift-sShift) <= referenceAgreePPM):
			out.shift, out.used = tShift, RefTMS
		case sok:
			out = solventRef(true, sShift, sol, haveSol)
			if tk >= 0 {
				gs[tk].label = ""
				out.warnings = append(out.warnings, fmt.Sprintf("singlet at %.3f ppm not taken as TMS: it disagrees with the %s residual by %.3f ppm", gs[tk].centerPPM, sol.Name, math.Abs(tShift-sShift)))
			}
		default:
			out = solventRef(false, 0, sol, haveSol)
		}
	}
	return out
}

// solventRef is the outcome of referencing to the solvent residual.
func solventRef(found bool, shift float64, sol Solvent, haveSol bool) refOutcome {
	switch {
	case !haveSol:
		return refOutcome{used: RefNone, warnings: []string{"solvent unknown: no residual signal to reference to; axis left as in the file"}}
	case !found:
		return refOutcome{used: RefNone, warnings: []string{fmt.Sprintf("no %s residual signal within ±%.2f ppm of %.2f ppm; axis left as in the file", sol.Name, referenceWindowPPM, sol.ResidualPPM)}}
	}
	return refOutcome{shift: shift, used: RefSolvent}
}
