package compare

import (
	"fmt"
	"math"
	"strings"
)

// Review rules beyond the part scores (documented in doc.go, "Scores and
// verdict"); common practice, no source for their form, levels set on the
// synthetic reference set and the real spectra of the tests.
const (
	// reviewUnknownPct and unknownSignalH: unexplained intensity above
	// reviewUnknownPct (% of the measured intensity; artifacts, residual
	// solvent and TMS left out) asks for review when one unexplained
	// multiplet holds at least unknownSignalH H-equivalents (a proton-sized
	// signal, not a scatter of trace peaks); above maxUnknownPct it always
	// does.
	reviewUnknownPct = 5.0
	unknownSignalH   = 0.5
	maxUnknownPct    = 10.0
	// regionOffH and regionOffFrac: a region whose integral falls short of
	// the expected H by at least regionOffH (at the 0.1 H the reason
	// prints) and regionOffFrac of the expected H asks for review when one
	// of its multiplets holds at most hostShortFrac of the H of its
	// signals (a proton missing there; a uniform shortfall of every
	// multiplet is a relaxation or scale effect, an excess is usually
	// overlapped water, exchangeable or impurity and is listed as such).
	regionOffH    = 1.0
	regionOffFrac = 0.20
	hostShortFrac = 0.60
	// candReviewMargin: a candidate scoring this much higher than the
	// intended structure asks for review; candInconsMargin: this much
	// higher while the intended structure has missing or far signals or a
	// region short of a proton makes it inconsistent.
	candReviewMargin = 0.03
	candInconsMargin = 0.05
	// reviewSplitting: a splitting score below this (labels and trace
	// shapes agree poorly over the whole structure) asks for review.
	reviewSplitting = 0.50
	// minExplained: when the structure, residual solvent, water, the
	// given impurities and table contaminants together explain less than
	// this fraction of the measured intensity (residual solvent, TMS and
	// artifacts left out of the total), most of the sample is something
	// else: inconsistent.
	minExplained = 0.60
	// Gross misfits (grossMisfits): a non-exchangeable signal missing, more
	// than poorZ SD from its multiplet, given a multiplet holding at most
	// hostShortFrac of its H in a region short of a proton (regionOff), or
	// of a clearly different multiplicity
	// (cost ≥ clearMultCost) more than misfitZ SD away. maxMisfits such
	// signals, or maxMisfitFrac of the non-exchangeable H, make the
	// structure inconsistent: one bad signal is a review, several are a
	// different compound.
	maxMisfits    = 2
	maxMisfitFrac = 0.30
	misfitZ       = 2.0
	clearMultCost = 1.5
)

// misfit names why non-exchangeable signal i fits grossly badly, or ""
// (the rule of grossMisfits). want is the non-exchangeable H given to each
// multiplet.
func (ev *evaluation) misfit(i int, want map[int]float64) string {
	s := ev.pred.Signals[i]
	j := ev.sigM[i]
	switch {
	case s.Exchangeable:
		return ""
	case j < 0:
		return fmt.Sprintf("%s %.2f %s (%d H) missing", s.Label, s.ShiftPPM, orM(s.Multiplicity), s.NH)
	case ev.z[i] > poorZ:
		return fmt.Sprintf("%s %.2f (%d H) %.1f SD from %.2f", s.Label, s.ShiftPPM, s.NH, ev.z[i], ev.ms[j].ppm)
	case ev.ms[j].area*ev.scale <= hostShortFrac*want[j] && ev.regionShortAt(s.ShiftPPM):
		return fmt.Sprintf("%s %.2f (%d H): %.2f holds %.1f H of %.0f", s.Label, s.ShiftPPM, s.NH, ev.ms[j].ppm, ev.ms[j].area*ev.scale, want[j])
	case ev.mc[i] >= clearMultCost && ev.z[i] > misfitZ:
		return fmt.Sprintf("%s %.2f %s (%d H): measured %.2f %s, %.1f SD", s.Label, s.ShiftPPM, orM(s.Multiplicity), s.NH,
			ev.ms[j].ppm, orM(ev.ms[j].mult), ev.z[i])
	}
	return ""
}

// regionShortAt reports whether the region (regions) of a predicted shift
// integrates short of a proton at the review level (regionOff): a signal
// whose multiplet is short counts as a misfit only then, since in a
// crowded region a short multiplet is more often an assignment slip than
// a missing proton.
func (ev *evaluation) regionShortAt(ppm float64) bool {
	for _, r := range regions {
		if ppm >= r.lo && ppm < r.hi {
			got, exp := ev.regionH(ev.ms, r.lo, r.hi)
			return regionOff(got, exp)
		}
	}
	return false
}

// grossMisfits returns the non-exchangeable signals that fit grossly badly
// (misfit), their H and the reason when they make the structure
// inconsistent (at least maxMisfits signals or maxMisfitFrac of the
// non-exchangeable H), else "".
func (ev *evaluation) grossMisfits(nonExch float64) string {
	want := map[int]float64{}
	for i, s := range ev.pred.Signals {
		if j := ev.sigM[i]; j >= 0 && !s.Exchangeable {
			want[j] += float64(s.NH)
		}
	}
	var names []string
	h := 0.0
	for i, s := range ev.pred.Signals {
		if why := ev.misfit(i, want); why != "" {
			names = append(names, why)
			h += float64(s.NH)
		}
	}
	if len(names) < maxMisfits && !(nonExch > 0 && h >= maxMisfitFrac*nonExch) {
		return ""
	}
	return fmt.Sprintf("%d signals (%.0f of %.0f H) do not fit: %s", len(names), h, nonExch, strings.Join(names, "; "))
}

// tableMultOK reports whether a measured multiplet can be a table signal of
// multiplicity tab: a tabulated singlet cannot be a measured resolved
// splitting (d, t, q, dd, …); an unresolved "m", a broad line or an
// unrecognised label is accepted (overlap, low S/N). Other table
// multiplicities are not checked: small contaminant multiplets are often
// read as "m" or with lines lost in the noise (common practice, no source).
func tableMultOK(tab, meas string) bool {
	if parsePattern(tab).known && len(parsePattern(tab).n) == 0 && !parsePattern(tab).broad {
		p := parsePattern(meas)
		return !(p.known && !p.broad && len(p.n) > 0)
	}
	return true
}

// regionOff reports whether a region integral (got H) is short of the
// expected H (exp) at the review level: by ≥ regionOffH and ≥
// regionOffFrac of exp.
func regionOff(got, exp float64) bool {
	d := math.Round((exp-got)*10) / 10
	return exp > 0 && d >= regionOffH && d >= regionOffFrac*exp
}

// regionsOff returns the regions short of a proton at the review level
// (regionOff) with a multiplet holding at most hostShortFrac of its
// signals' H.
func (ev *evaluation) regionsOff(ms []mplet) []string {
	var out []string
	for _, r := range regions {
		got, exp := ev.regionH(ms, r.lo, r.hi)
		if regionOff(got, exp) && ev.hostShort(ms, r.lo, r.hi) {
			out = append(out, fmt.Sprintf("integral of the %s is %.1f H, %.0f expected", r.name, got, exp))
		}
	}
	return out
}

// hostShort reports whether a multiplet given to non-exchangeable signals
// predicted in [lo, hi) holds at most hostShortFrac of their H.
func (ev *evaluation) hostShort(ms []mplet, lo, hi float64) bool {
	want := map[int]float64{}
	for i, s := range ev.pred.Signals {
		if j := ev.sigM[i]; j >= 0 && !s.Exchangeable && s.ShiftPPM >= lo && s.ShiftPPM < hi {
			want[j] += float64(s.NH)
		}
	}
	for j, w := range want {
		if ms[j].area*ev.scale <= hostShortFrac*w {
			return true
		}
	}
	return false
}

// regionH returns the measured H of the multiplets given to the
// non-exchangeable signals predicted in [lo, hi) and the H expected there.
func (ev *evaluation) regionH(ms []mplet, lo, hi float64) (got, exp float64) {
	hosts := map[int]bool{}
	for i, s := range ev.pred.Signals {
		if s.Exchangeable || s.ShiftPPM < lo || s.ShiftPPM >= hi {
			continue
		}
		exp += float64(s.NH)
		if j := ev.sigM[i]; j >= 0 {
			hosts[j] = true
		}
	}
	for j := range hosts {
		got += ms[j].area * ev.scale
	}
	return got, exp
}

// misfits reports whether the structure has signals that fit badly: missing
// non-exchangeable signals, signals more than poorZ SD away, or a region
// short of a proton (regionsOff). A different multiplicity alone does not
// count: one odd label is common on real spectra.
func (ev *evaluation) misfits() bool {
	for i, s := range ev.pred.Signals {
		if s.Exchangeable {
			continue
		}
		if j := ev.sigM[i]; j < 0 || ev.z[i] > poorZ {
			return true
		}
	}
	return len(ev.regionsOff(ev.ms)) > 0
}

// candidateRule applies the candidate margin to the intended structure's
// result: best is the top-ranked candidate (not the intended structure).
// The reason names the candidate, both scores and the intended
// structure's signals that fit worse.
func candidateRule(res *Result, main, best *evaluation, bestScore float64) {
	margin := bestScore - main.score
	if margin <= 0 {
		return
	}
	why := main.discriminating(main.ms)
	if len(why) > 4 {
		why = append(why[:4], "…")
	}
	r := fmt.Sprintf("candidate %s fits the spectrum better (score %.2f vs %.2f)", best.smiles, bestScore, main.score)
	if len(why) > 0 {
		r += "; the intended structure fits worse at " + strings.Join(why, "; ")
	}
	res.Reasons = append(res.Reasons, r)
	switch {
	case margin >= candInconsMargin && main.misfits():
		res.Verdict = Inconsistent
	case margin >= candReviewMargin && res.Verdict == Consistent:
		res.Verdict = Review
	}
}

// largestUnknown names the largest unexplained multiplet for the reason
// text: "; largest at 7.39 t (1.0 H)".
func (ev *evaluation) largestUnknown() string {
	best := -1
	for k, u := range ev.ex.unexplained {
		if u.Kind == "unknown" && (best < 0 || u.Percent > ev.ex.unexplained[best].Percent) {
			best = k
		}
	}
	if best < 0 {
		return ""
	}
	u := ev.ex.unexplained[best]
	return fmt.Sprintf("; largest at %.2f %s (%.1f H, %.0f %%)", u.PPM, orM(u.Multiplicity), u.IntegralH, u.Percent)
}

// unknownRule reports whether the unexplained intensity u (%) asks for
// review: above maxUnknownPct, or above reviewUnknownPct with a
// proton-sized unexplained multiplet.
func (ev *evaluation) unknownRule(u float64) bool {
	if u > maxUnknownPct {
		return true
	}
	if u <= reviewUnknownPct {
		return false
	}
	for _, x := range ev.ex.unexplained {
		if x.Kind == "unknown" && x.IntegralH >= unknownSignalH {
			return true
		}
	}
	return false
}

// shortSignals names the non-exchangeable signals whose multiplet holds at
// most hostShortFrac of the H of the signals given to it: "D 6.99 d (2 H):
// measured 7.10 dt holds 1.0 H".
func (ev *evaluation) shortSignals(ms []mplet) []string {
	want := map[int]float64{}
	for i, s := range ev.pred.Signals {
		if j := ev.sigM[i]; j >= 0 && !s.Exchangeable {
			want[j] += float64(s.NH)
		}
	}
	var out []string
	for i, s := range ev.pred.Signals {
		j := ev.sigM[i]
		if j < 0 || s.Exchangeable {
			continue
		}
		if got := ms[j].area * ev.scale; got <= hostShortFrac*want[j] {
			out = append(out, fmt.Sprintf("%s %.2f %s (%d H): measured %.2f %s holds %.1f H of %.0f", s.Label, s.ShiftPPM,
				orM(s.Multiplicity), s.NH, ms[j].ppm, orM(ms[j].mult), got, want[j]))
		}
	}
	return out
}
