package compare

import (
	"math"
	"sort"

	"shiftwise/predict"
)

// busyMarginHz widens a compound signal's window by the line width and
// digital resolution (common practice, no source).
const busyMarginHz = 3.0

// compoundWindows returns the ppm windows where the compound has lines: for
// each assigned non-exchangeable signal, its predicted lines around the
// predicted shift and around the measured multiplet, and the measured
// multiplet itself.
func compoundWindows(pred *predict.Prediction, sig []predict.Signal, sigM []int, ms []mplet, field float64) [][2]float64 {
	margin := 0.01
	if field > 0 {
		margin = busyMarginHz / field
	}
	var out [][2]float64
	for i, s := range sig {
		j := sigM[i]
		if j < 0 {
			continue
		}
		ext := lineExtent(pred, s) + margin
		out = append(out, [2]float64{s.ShiftPPM - ext, s.ShiftPPM + ext},
			[2]float64{ms[j].ppm - ext, ms[j].ppm + ext}, [2]float64{ms[j].from, ms[j].to})
	}
	return out
}

// compoundLines returns the predicted lines of the assigned
// non-exchangeable signals, moved with their multiplets (by the measured
// centre less the H-weighted mean predicted shift of the signals given to
// it) and sorted by ppm; intensities in H.
func compoundLines(pred *predict.Prediction, sig []predict.Signal, sigM []int, ms []mplet) []predict.Line {
	sumH := map[int]float64{}
	sumS := map[int]float64{}
	host := map[string]int{}
	for i, s := range sig {
		if j := sigM[i]; j >= 0 && !s.Exchangeable {
			sumH[j] += float64(s.NH)
			sumS[j] += float64(s.NH) * s.ShiftPPM
			host[s.Label] = j
		}
	}
	var out []predict.Line
	for _, l := range pred.Lines {
		j, ok := host[l.Signal]
		if !ok || sumH[j] == 0 {
			continue
		}
		out = append(out, predict.Line{PPM: l.PPM + ms[j].ppm - sumS[j]/sumH[j], Intensity: l.Intensity, Signal: l.Signal})
	}
	sort.Slice(out, func(a, b int) bool { return out[a].PPM < out[b].PPM })
	return out
}

// linesNear sums the intensities of the sorted lines within tol of x.
func linesNear(ls []predict.Line, x, tol float64) float64 {
	k := sort.Search(len(ls), func(i int) bool { return ls[i].PPM >= x-tol })
	sum := 0.0
	for ; k < len(ls) && ls[k].PPM <= x+tol; k++ {
		sum += ls[k].Intensity
	}
	return sum
}

// overlapped reports whether multiplet m touches one of the windows.
func overlapped(m mplet, win [][2]float64) bool {
	for _, w := range win {
		if m.to >= w[0] && m.from <= w[1] {
			return true
		}
	}
	return false
}

// extraAmount estimates the molecules of a user-given impurity per
// compound molecule from its matched signals: the H-weighted median of the
// per-proton amounts (area × scale / H) over the signals clear of the
// compound's lines (compoundWindows); when every signal overlaps the
// compound, the smallest per-proton amount (an overlapped signal can only
// gain area). One signal picking up compound intensity (a line of the
// compound's multiplet grouped apart by processing, an aromatic
// multiplet shared with the compound) thus no longer inflates the amount.
func extraAmount(ms []mplet, hits []extraHit, scale float64, win [][2]float64) float64 {
	var clean []weighted
	lo := math.Inf(1)
	for _, h := range hits {
		if h.sig.NH <= 0 {
			continue
		}
		a := ms[h.j].area * scale / float64(h.sig.NH)
		lo = math.Min(lo, a)
		if !overlapped(ms[h.j], win) {
			clean = append(clean, weighted{a, float64(h.sig.NH)})
		}
	}
	if math.IsInf(lo, 1) {
		return 0
	}
	if len(clean) == 0 {
		return lo
	}
	// The weighted (upper) median: with the lower one a signal matched to
	// a stray line (a 13C satellite of a compound line) decided at a tie
	// (1-propanol with 5 mol % methyl phenylacetate read as 0.08 %).
	return weightedMedian(clean)
}
