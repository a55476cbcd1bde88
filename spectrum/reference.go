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
// Reference modes: "auto" uses TMS when its line (the tallest within
// tmsAutoWindowPPM of 0, at least tmsMinSNR strong) is there: TMS does not
// move with the sample. Otherwise it looks for a convincing solvent residual
// (the line nearest its tabulated shift, with the residual's pattern or
// needing at most referenceNearPPM): found within residualSpreadPPM of its
// tabulated shift it confirms the file's axis (no shift: residuals move with
// concentration and temperature); further off, the axis is moved onto it.
// With neither the axis is kept and a warning says so. "tms" and "solvent"
// always move the axis onto the named signal when it is found. "tms" and "solvent"
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
	// referenceNearPPM: a residual candidate without the expected pattern is
	// still trusted for a correction this small.
	referenceNearPPM = 0.02
	// tmsAutoWindowPPM: in auto mode, only a line this close to 0 is taken
	// for TMS (silicone grease sits at 0.07 ppm in CDCl3; Fulmer et al. 2010,
	// value from memory).
	tmsAutoWindowPPM = 0.05
	// tmsMinSNR: in auto mode a TMS line must be at least this strong (an
	// added standard, not a trace).
	tmsMinSNR = 20.0
	// tmsMaxLines: the TMS multiplet is labelled only when it is a singlet,
	// possibly with two unflagged 29Si satellites or skirt lines; a larger
	// group holds other signals too.
	tmsMaxLines = 3
	// residualSpreadPPM: residual signals move with concentration and
	// temperature by a few hundredths of a ppm (the caveat of Gottlieb et
	// al. 1997 and Fulmer et al. 2010; the size is our judgement). In auto
	// mode a residual found this close to its tabulated shift confirms the
	// file's axis instead of moving it. Raised from 0.04: in the cheminfo
	// nmr-dataset1 spectra whose assigned shifts fit the file's axis, CHCl3
	// sits at 7.285–7.288 (+0.025–0.028) and the acetone-d6 quintet of
	// 86-55-5 at 2.091 (+0.041).
	residualSpreadPPM = 0.05
)

// refOutcome is what referencing decided.
type refOutcome struct {
	shift    float64 // ppm added to every position
	used     string  // RefTMS, RefSolvent or RefNone
	warnings []string
}

// findTMS returns the index of the tallest line within the window around
// 0 ppm, or -1.
func findTMS(ls []line) int {
	best, bh := -1, 0.0
	for i, l := range ls {
		if l.artifact == "" && math.Abs(l.ppm) <= referenceWindowPPM && l.height > bh {
			best, bh = i, l.height
		}
	}
	return best
}

// groupOf returns the group holding line i, or -1.
func groupOf(gs []group, i int) int {
	for k, g := range gs {
		for _, j := range g.lines {
			if j == i {
				return k
			}
		}
	}
	return -1
}

// findSolvent returns the observed shift of the solvent residual: the line
// nearest its tabulated shift within the window (flagged lines included: a
// weak residual beside a strong line can look like a 13C satellite), or the
// centre of that line's multiplet when the multiplet has the residual's
// pattern. k is that multiplet, or -1.
func findSolvent(gs []group, ls []line, sol Solvent) (k int, obs float64, ok bool) {
	for k := range gs {
		if gs[k].residual {
			if gs[k].multiplicity == "m" {
				gs[k].centerPPM = gs[k].residualPPM
			}
			return k, gs[k].centerPPM, true
		}
	}
	best, li := referenceWindowPPM, -1
	for i, l := range ls {
		if d := math.Abs(l.ppm - sol.ResidualPPM); d <= best {
			best, li = d, i
		}
	}
	if li < 0 {
		return -1, 0, false
	}
	k = groupOf(gs, li)
	if k >= 0 && solventPattern(gs[k], sol) {
		return k, gs[k].centerPPM, true
	}
	return -1, ls[li].ppm, true
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
	tl := findTMS(ls)
	tk := -1
	if tl >= 0 {
		tk = groupOf(gs, tl)
	}
	sk, sobs, sok := -1, 0.0, false
	if haveSol {
		sk, sobs, sok = findSolvent(gs, ls, sol)
	}
	if tk >= 0 && len(gs[tk].lines) <= tmsMaxLines {
		gs[tk].label = LabelTMS
	}
	if sk >= 0 && sk != tk {
		gs[sk].label = LabelSolvent
	}
	tShift := 0.0
	if tl >= 0 {
		tShift = -ls[tl].ppm
	}
	sShift := sol.ResidualPPM - sobs
	// A solvent candidate is convincing when it has the residual's pattern
	// or needs only a small correction.
	sGood := sok && (sk >= 0 || math.Abs(sShift) <= referenceNearPPM)
	tGood := tl >= 0 && math.Abs(tShift) <= tmsAutoWindowPPM
	switch mode {
	case RefNone:
		return refOutcome{used: RefNone}
	case RefTMS:
		if tl < 0 {
			return refOutcome{used: RefNone, warnings: []string{fmt.Sprintf("no TMS peak within ±%.2f ppm of 0; axis left as in the file", referenceWindowPPM)}}
		}
		return refOutcome{shift: tShift, used: RefTMS}
	case RefSolvent:
		out := solventRef(sok, sShift, sol, haveSol)
		if sok && !sGood {
			out.warnings = append(out.warnings, fmt.Sprintf("the line taken as the %s residual (%.3f ppm) lacks its pattern", sol.Name, sobs))
		}
		return out
	}
	// auto
	tSharp := tGood && ls[tl].snr >= tmsMinSNR
	switch {
	case tSharp:
		out := refOutcome{shift: tShift, used: RefTMS}
		if sGood && math.Abs(tShift-sShift) > referenceAgreePPM {
			out.warnings = append(out.warnings, fmt.Sprintf("the %s residual sits %.3f ppm from its tabulated shift after referencing to TMS", sol.Name, math.Abs(tShift-sShift)))
		}
		return out
	case sGood && math.Abs(sShift) <= residualSpreadPPM:
		// The residual is where it should be, within its natural spread:
		// the file is referenced; keep the axis.
		if tk >= 0 {
			gs[tk].label = ""
		}
		return refOutcome{used: RefSolvent}
	case sGood:
		if tk >= 0 {
			gs[tk].label = ""
		}
		return solventRef(true, sShift, sol, haveSol)
	}
	if tk >= 0 {
		gs[tk].label = ""
	}
	out := solventRef(false, 0, sol, haveSol)
	if sok {
		out.warnings = []string{fmt.Sprintf("no convincing %s residual signal (nearest line %.3f ppm, without its pattern) and no TMS; axis left as in the file", sol.Name, sobs)}
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
