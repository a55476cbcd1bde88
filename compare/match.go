package compare

import (
	"math"
	"sort"

	"shiftwise/predict"
	"shiftwise/spectrum"
)

// Assignment cost terms. Costs are dimensionless, like squared z-scores, so
// that "missing" can be weighed against "far away". Values were tuned on the
// synthetic reference set (see check_ref_test.go); their form is common
// practice, no source.
const (
	minShiftSD   = 0.08 // ppm: floor of the shift uncertainty used in z
	exchShiftSD  = 1.2  // ppm: exchangeable protons move with concentration and water
	missCost     = 20   // a non-exchangeable signal left without counterpart
	missCostExch = 2    // an exchangeable signal not observed (broad/exchanged)
	// An exchangeable proton (OH, NH, COOH) wanders further than its SD when
	// it shows as a broad line: its window doubles for broad multiplets
	// (common practice, no source: OH/NH shifts depend on concentration,
	// water and temperature, and exchange broadens them).
	exchBroadSDFactor = 2.0
	broadLineHz       = 5.0 // a single line at least this wide counts as broad (sharp lines are about 1 Hz)
	// coupledExchSD: an exchangeable proton predicted with a resolved
	// coupling (OH/NH in DMSO-d6 and other slow-exchange solvents, where
	// the prediction gives a d, t or q) is a sharp line whose shift varies
	// less than in fast exchange: the prediction's own SD is used, at least
	// this much (common practice, no source: OH shifts in DMSO-d6 stay
	// within about ±0.5 ppm of their class values).
	coupledExchSD = 0.5
	// missCostCoupled: such a sharp exchangeable is normally seen (slow
	// exchange is why it is coupled), so leaving it unassigned costs more
	// than for a broad one, though less than a C–H signal (a wet or acidic
	// sample still collapses it; common practice, no source).
	missCostCoupled = 6
	shareCost       = 1.5 // one more signal placed in an already used multiplet
	// maxShared bounds the signals one multiplet can take: an aliphatic
	// envelope of a long chain holds a dozen or more CH2 signals (methyl
	// stearate: 14 in a 28 H hump), so the bound is set by the
	// multiplet's integral, up to this many.
	maxShared       = 32
	multWeight      = 1.5 // weight of the multiplicity term
	overWeight      = 4.0 // signal larger than the multiplet (log-ratio²)
	underWeight     = 1.5 // multiplet larger than the signal (log-ratio²)
	forbidden       = 1e6 // cost of an impossible pairing
	solventCost     = 4   // a compound signal placed under the residual solvent peak
	scaleIterations = 3
)

// mplet is a measured multiplet prepared for matching.
type mplet struct {
	idx      int // index into PeakList.Multiplets
	ppm      float64
	from, to float64
	area     float64
	mult     string
	j        []float64
	label    string // processing's label: spectrum.LabelSolvent, spectrum.LabelTMS or ""
	part     bool   // absorbed into multiplet host as a second part of its signal
	host     int
	snr      float64 // largest S/N of its peaks; 0 when unknown
	pk       []spectrum.Peak
}

func prepMultiplets(pl *spectrum.PeakList) []mplet {
	out := make([]mplet, 0, len(pl.Multiplets))
	for i, m := range pl.Multiplets {
		a := m.Integral
		if a <= 0 {
			a = m.RawArea
		}
		if a <= 0 || math.IsNaN(a) || math.IsInf(a, 0) || !finite(m.PPM) {
			continue // no position or no area: nothing to match
		}
		from, to := m.FromPPM, m.ToPPM
		if !finite(from) || !finite(to) {
			from, to = 0, 0
		}
		if from > to {
			from, to = to, from
		}
		if from == 0 && to == 0 {
			from, to = m.PPM, m.PPM
		}
		out = append(out, mplet{idx: i, ppm: m.PPM, from: from, to: to, area: a, mult: cleanMultiplicity(pl, m), j: m.JHz, label: m.Label, snr: peakSNR(pl, m), pk: multipletPeaks(pl, m)})
	}
	return out
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// multipletPeaks returns the peaks of a multiplet (stray indices skipped).
func multipletPeaks(pl *spectrum.PeakList, m spectrum.Multiplet) []spectrum.Peak {
	var out []spectrum.Peak
	for _, k := range m.PeakIndex {
		if k >= 0 && k < len(pl.Peaks) {
			out = append(out, pl.Peaks[k])
		}
	}
	return out
}

// peakSNR returns the largest S/N among the multiplet's peaks (0 if none
// known).
func peakSNR(pl *spectrum.PeakList, m spectrum.Multiplet) float64 {
	best := 0.0
	for _, k := range m.PeakIndex {
		if k >= 0 && k < len(pl.Peaks) {
			best = math.Max(best, pl.Peaks[k].SNR)
		}
	}
	return best
}

// cleanMultiplicity reads a multiplet labelled "m" whose peaks are one tall
// line plus tiny bumps (below 5 % of it: noise on the line's tail) as a
// singlet (common practice, no source).
func cleanMultiplicity(pl *spectrum.PeakList, m spectrum.Multiplet) string {
	if m.Multiplicity != "m" || len(m.PeakIndex) < 2 {
		return m.Multiplicity
	}
	top := 0.0
	for _, k := range m.PeakIndex {
		if k >= 0 && k < len(pl.Peaks) {
			top = math.Max(top, pl.Peaks[k].Intensity)
		}
	}
	n := 0
	for _, k := range m.PeakIndex {
		if k >= 0 && k < len(pl.Peaks) && pl.Peaks[k].Intensity >= 0.05*top {
			n++
		}
	}
	if n == 1 {
		return "s"
	}
	return m.Multiplicity
}

// signalSD returns the shift uncertainty used for a signal.
func signalSD(s predict.Signal) float64 {
	if s.Exchangeable && coupledExch(s) {
		return math.Max(s.ShiftSD, coupledExchSD)
	}
	if s.Exchangeable {
		return math.Max(s.ShiftSD, exchShiftSD)
	}
	sd := math.Hypot(s.ShiftSD, 0.02)
	if s.LowConfidence {
		sd *= 1.5
	}
	return math.Max(sd, minShiftSD)
}

// bigMultipletH: a measured multiplet of at least this many H is an
// envelope of several protons (an aliphatic hump, an aromatic cluster),
// where overlap is expected rather than a coincidence.
const bigMultipletH = 4.0

// shareCostAt is the cost of the k-th further signal placed in a multiplet
// of hMeas H (0 when the scale is unknown): k·shareCost, reduced by
// bigMultipletH/hMeas for a multiplet of at least bigMultipletH H (common
// practice, no source: a 9 H envelope at 0.8–0.9 ppm holds two methyl
// doublets and several ring CH by overlap).
func shareCostAt(k int, hMeas float64) float64 {
	c := float64(k) * shareCost
	if hMeas >= bigMultipletH {
		c *= bigMultipletH / hMeas
	}
	return c
}

// coupledExch reports whether an exchangeable signal is predicted with a
// resolved splitting (d, t, q, …): slow exchange, as for OH and NH in
// DMSO-d6.
func coupledExch(s predict.Signal) bool {
	p := parsePattern(s.Multiplicity)
	return s.Exchangeable && p.known && !p.broad && len(p.n) > 0
}

// exchMultCost is the multiplicity term of a coupled exchangeable signal
// (coupledExch) in multiplet m: the predicted pattern costs nothing, a
// singlet, broad line or unresolved "m" costs 0.3 (exchange with water or
// acid traces can collapse the coupling), anything else is multCost.
func exchMultCost(s predict.Signal, m mplet) float64 {
	b := parsePattern(m.mult)
	if broadLine(m) || !b.known || b.broad || len(b.n) == 0 {
		return 0.3
	}
	return multCost(s.Multiplicity, m.mult)
}

// broadLine reports whether a multiplet is one broad line (a singlet whose
// width is at least broadLineHz).
func broadLine(m mplet) bool {
	if len(m.pk) != 1 {
		return false
	}
	return m.pk[0].WidthHz >= broadLineHz
}

// maxWidthCredit caps the width credit of shiftDistance: the widest real
// multiplets (second-order patterns at 60–90 MHz, aliphatic envelopes)
// span about half a ppm; a wider region is a baseline hump or a broad
// exchange line and does not bring far signals closer (common practice, no
// source).
const maxWidthCredit = 0.25

// shiftDistance is how far the predicted shift lies from a multiplet: the
// distance to its centre less 40 % of its width (a wide multiplet holds
// signals spread across it), at most maxWidthCredit.
func shiftDistance(pred float64, m mplet) float64 {
	return math.Max(0, math.Abs(pred-m.ppm)-math.Min(0.4*(m.to-m.from), maxWidthCredit))
}

// shiftCost is z² up to z = 3, then grows linearly, so that a far but
// otherwise fitting multiplet stays possible while "missing" wins beyond
// about 5.7 SD.
func shiftCost(z float64) float64 {
	if z <= 3 {
		return z * z
	}
	return 9 + 4*(z-3)
}

// intCost compares the H of a signal with the H of the multiplet (copy k:
// the multiplet already holds k other signals).
func intCost(nh int, hMeas float64, k int, exch bool) float64 {
	w := 1.0
	if exch {
		w = 0.2
	}
	if k == 0 {
		r := math.Log((hMeas + 0.25) / (float64(nh) + 0.25))
		if r < 0 {
			return w * overWeight * r * r
		}
		return w * underWeight * r * r
	}
	r := math.Log((float64(nh+k) + 0.25) / (hMeas + 0.25))
	if r <= 0 {
		return 0
	}
	return w * overWeight * r * r
}

// assignSignals solves the assignment of signals to multiplets (avail marks
// the multiplets that may be used) with the scale hPerArea (0: no integral
// term). It returns, per signal, the index into ms or -1.
//
// avail[j] false excludes a multiplet; penalty[j] (may be nil) is added to
// every pairing with multiplet j (the residual solvent peak).
func assignSignals(sig []predict.Signal, ms []mplet, avail []bool, penalty []float64, hPerArea, field float64) []int {
	n := len(sig)
	out := make([]int, n)
	if n == 0 {
		return out
	}
	type col struct{ m, k int }
	var cols []col
	for j, m := range ms {
		if !avail[j] {
			continue
		}
		copies := 3
		if hPerArea > 0 {
			copies = int(m.area*hPerArea + 0.5)
		}
		copies = max(1, min(copies, n, maxShared))
		for k := 0; k < copies; k++ {
			cols = append(cols, col{j, k})
		}
	}
	mw := multWeight
	if field > 0 && field < 250 {
		mw *= 0.5 // second-order distortions are common at low field
	}
	width := len(cols) + n
	nhOf := make(map[string]int, n)
	for _, s := range sig {
		nhOf[s.Label] = s.NH
	}
	cost := make([][]float64, n)
	for i, s := range sig {
		row := make([]float64, width)
		sd := signalSD(s)
		pj := distinctJ(s)
		for c, cl := range cols {
			m := ms[cl.m]
			z := shiftDistance(s.ShiftPPM, m) / sd
			if s.Exchangeable && broadLine(m) {
				z /= exchBroadSDFactor // a broad line is the mark of an exchanging proton
			}
			v := shiftCost(z) + shareCostAt(cl.k, m.area*hPerArea)
			if penalty != nil {
				v += penalty[cl.m]
			}
			if !s.Exchangeable {
				mc := signalMultCost(s, seenMult(s, m, nhOf), nhOf)
				if cl.k > 0 || secondOrder(s) {
					mc *= 0.3 // overlapped or strongly coupled: the shape is not its own
				}
				if cl.k > 0 && cleanPattern(m.mult) {
					mc += sharedCleanCost // a clean s, d, t, q shared: accidental equivalence only
				}
				v += mw*mc + jCost(pj, m.j)
			} else if coupledExch(s) {
				v += mw * exchMultCost(s, m)
			}
			if hPerArea > 0 && (penalty == nil || penalty[cl.m] == 0) {
				v += intCost(s.NH, m.area*hPerArea, cl.k, s.Exchangeable && !coupledExch(s))
			} else if h := m.area * hPerArea; hPerArea > 0 && h < float64(s.NH) {
				// Under the residual peak the solvent adds area, so only a
				// shortfall counts: a 2 H signal cannot hide in a 0.08 H
				// CHCl3 line (benzyl alcohol's aromatic H went there).
				v += intCost(s.NH, h, cl.k, s.Exchangeable && !coupledExch(s))
			}
			row[c] = v
		}
		for k := 0; k < n; k++ {
			row[len(cols)+k] = forbidden
		}
		if coupledExch(s) {
			row[len(cols)+i] = missCostCoupled
		} else if s.Exchangeable {
			row[len(cols)+i] = missCostExch
		} else {
			row[len(cols)+i] = missCost
		}
		cost[i] = row
	}
	assign, _ := Hungarian(cost)
	for i, c := range assign {
		if c < len(cols) {
			out[i] = cols[c].m
		} else {
			out[i] = -1
		}
	}
	return out
}

// fitScale returns the H per unit area as the weighted median of the ratio
// (assigned non-exchangeable H)/(area) over the multiplets used, weighted by
// their H: robust to one overlapped or contaminated multiplet.
func fitScale(sig []predict.Signal, ms []mplet, sigM []int, penalty []float64) (scale, relSpread float64) {
	hAt := map[int]float64{}
	for i, j := range sigM {
		if j >= 0 && !sig[i].Exchangeable && (penalty == nil || penalty[j] == 0) {
			hAt[j] += float64(sig[i].NH)
		}
	}
	var rs []weighted
	total := 0.0
	for j, h := range hAt {
		rs = append(rs, weighted{h / ms[j].area, h})
		total += h
	}
	if len(rs) == 0 {
		return 0, 0
	}
	scale = weightedMedian(rs)
	// Robust relative spread: weighted mean absolute log deviation.
	dev := 0.0
	for _, x := range rs {
		dev += x.w * math.Abs(math.Log(x.v/scale))
	}
	return scale, 1.2533 * dev / total // MAD→SD factor √(π/2) for the mean absolute deviation
}

// weighted is a value with its weight (> 0), for weightedMedian.
type weighted struct{ v, w float64 }

// weightedMedian returns the smallest value at which the cumulative weight
// passes half the total: at an exact half-weight tie, the upper of the two
// middle values. Weights are whole H counts, so ties are common, and the
// lower value let multiplets inflated by another species set the integral
// scale (ethyl crotonate with diethyl succinate) and a stray line decide an
// impurity's amount. xs is sorted in place; 0 for none.
func weightedMedian(xs []weighted) float64 {
	if len(xs) == 0 {
		return 0
	}
	sort.Slice(xs, func(a, b int) bool { return xs[a].v < xs[b].v })
	total := 0.0
	for _, x := range xs {
		total += x.w
	}
	acc := 0.0
	for _, x := range xs {
		acc += x.w
		if acc > total/2 {
			return x.v
		}
	}
	return xs[len(xs)-1].v
}

// initialScale divides the non-exchangeable H by the area of the available
// multiplets, those at the water line left out: exact for a pure dry
// sample, a start for the iteration otherwise. (Counted in, 1.5 H of water
// at 60 MHz made 2-nitrotoluene's 4 H aromatic envelope look like 3 H, and
// the assignment settled with one ring proton missing.)
func initialScale(sig []predict.Signal, ms []mplet, avail []bool, penalty []float64, water []bool) float64 {
	nh := 0
	for _, s := range sig {
		if !s.Exchangeable {
			nh += s.NH
		}
	}
	area := 0.0
	for j, m := range ms {
		if avail[j] && (penalty == nil || penalty[j] == 0) && (water == nil || !water[j]) {
			area += m.area
		}
	}
	if area <= 0 || nh == 0 {
		return 0
	}
	return float64(nh) / area
}

// matchStructure assigns the signals of one prediction and fits the scale
// by alternating assignment and scale fitting.
func matchStructure(sig []predict.Signal, ms []mplet, avail []bool, penalty []float64, water []bool, field float64) (sigM []int, scale, spread float64) {
	scale = initialScale(sig, ms, avail, penalty, water)
	sigM = assignSignals(sig, ms, avail, penalty, scale, field)
	for it := 0; it < scaleIterations; it++ {
		s, sp := fitScale(sig, ms, sigM, penalty)
		if s <= 0 {
			break
		}
		converged := math.Abs(s-scale) < 1e-3*scale
		scale, spread = s, sp
		if converged {
			break
		}
		sigM = assignSignals(sig, ms, avail, penalty, scale, field)
	}
	if s, sp := fitScale(sig, ms, sigM, penalty); s > 0 {
		scale, spread = s, sp
	}
	return sigM, scale, spread
}

// absorbParts handles a signal measured as two multiplets (amide rotamers,
// diastereotopic CH2 predicted as one signal, a multiplet cut in two by
// processing): a free multiplet within 3 SD of a signal whose multiplet is
// clearly short of H, and no larger than that shortfall, becomes a second
// part of it. It returns a copy of ms with the part's area moved to the
// host (the part keeps zero area and part=true).
func absorbParts(sig []predict.Signal, ms []mplet, avail []bool, sigM []int, scale float64) []mplet {
	out := append([]mplet(nil), ms...)
	if scale <= 0 {
		return out
	}
	used := make([]bool, len(ms))
	expect := make([]float64, len(ms))
	for i, j := range sigM {
		if j >= 0 {
			used[j] = true
			if !sig[i].Exchangeable {
				expect[j] += float64(sig[i].NH)
			}
		}
	}
	for i, j := range sigM {
		s := sig[i]
		// Only sp3 CH2/CH3 groups: rotamers and diastereotopic protons split
		// them; an aromatic or vinyl signal in two places is a misfit.
		if j < 0 || s.Exchangeable || s.NH < 2 || (s.Kind != "CH2" && s.Kind != "CH3") {
			continue
		}
		deficit := expect[j] - out[j].area*scale
		if deficit < math.Max(0.7, 0.3*expect[j]) {
			continue
		}
		best, bz := -1, 3.0
		for u := range ms {
			if used[u] || !avail[u] || ms[u].label != "" {
				continue
			}
			h := ms[u].area * scale
			if h < 0.3*deficit || h > 1.5*deficit+0.3 {
				continue
			}
			if z := shiftDistance(s.ShiftPPM, ms[u]) / signalSD(s); z <= bz {
				best, bz = u, z
			}
		}
		if best < 0 {
			continue
		}
		used[best] = true
		out[j].area += ms[best].area
		out[j].from = math.Min(out[j].from, ms[best].from)
		out[j].to = math.Max(out[j].to, ms[best].to)
		out[best].area = 0
		out[best].part, out[best].host = true, j
	}
	return out
}

// secondOrder reports whether the signal's pattern was simulated with
// strong coupling (exactly or by fragments): its shape need not read as a
// first-order multiplet.
func secondOrder(s predict.Signal) bool { return s.Mode == "exact" || s.Mode == "fragment" }
