package spectrum

import (
	"math"
	"sort"
	"strings"

	"gonum.org/v1/gonum/mat"
)

// Multiplets: grouping and first-order analysis.
//
// Grouping. Peaks are taken in ppm order; two neighbours belong to the same
// multiplet when their distance is at most JMaxHz (default 20 Hz, above
// nearly all 2J and 3J H–H couplings; common practice, no source), or when
// the trace between them never falls below a quarter of the smaller of the
// new peak and the tallest peak of the multiplet so far (the two signals
// overlap so much that no integral boundary can be drawn between them; a
// weak broad hump, an NH or OH, must not chain two multiplets through its
// own low height), with 3σ as a floor — in both cases only when the new peak and the
// tallest peak of the multiplet so far differ by less than groupMaxRatio
// (the outer line of a septet is 1/20 of its centre, Pascal's triangle), so
// that small signals on the foot of a strong line stay separate. Across a
// gap wider than baseGapHz where the trace returns to the baseline, the
// distance joins only peaks within baseGapRatio of each other (at 60–90
// MHz neighbouring multiplets lie within JMaxHz). Peaks
// flagged as artifacts (13C satellites, spinning sidebands, line-shape
// skirts) are left out. A multiplet's centre is the midpoint of a
// first-order pattern, else the height-weighted mean of its peaks.
//
// First-order analysis follows Hoye, Hanson & Vyvyan 1994 (J. Org. Chem. 59,
// 4096, "A practical guide to first-order multiplet analysis in 1H NMR
// spectroscopy"): the pattern must be symmetric about its centre in
// positions and (within roofing) intensities; line intensities are
// expressed in units of an outer line and must be near whole numbers
// summing to a power of two; the component lines are then peeled one
// coupling at a time, the smallest coupling being the distance between the
// first two components. When the whole group fails, the analysis is retried
// without its weakest lines (below 4, then 10 % of the tallest, keeping
// at least 90 % of the summed height), and once more on the line
// amplitudes with the overlap of neighbouring Lorentzian lines removed
// (unmixLorentz). Equal couplings are merged into t, q, p, … and the
// name lists the couplings from the largest down ("dt": large doublet of
// small triplets). A pattern that fails any step is "m".

const (
	// roofTolerance is the largest relative difference between mirror lines
	// still taken as first-order (roofing of weakly coupled pairs).
	roofTolerance = 0.4
	// unitTolerance is how far a line may lie from a whole number of units.
	unitTolerance = 0.3
	maxComponents = 256 // 8 couplings
	maxLetters    = 4   // "dddd" is the longest name given
	groupMaxRatio = 30  // largest height ratio of neighbours joined by distance
	baseGapRatio  = 3   // ... across a wide gap where the trace returns to the baseline
	baseGapHz     = 10  // a gap wider than this is "wide"
	trimKeep      = 0.9
)

// trimLevels are the fractions of the tallest line below which lines are
// dropped, in turn, when a multiplet is not first-order as a whole.
var trimLevels = []float64{0.04, 0.1}

// multipletNames names a group of c equal couplings (c+1 lines of Pascal's
// triangle).
var multipletNames = []string{"", "d", "t", "q", "p", "sext", "sept", "oct"}

// group is a multiplet during processing.
type group struct {
	lines        []int // indices into the line slice, ascending ppm
	centerPPM    float64
	from, to     float64 // integration region
	raw          float64 // area before scaling
	multiplicity string
	j            []float64
	label        string
	// residual marks the solvent residual pattern found by splitResidual,
	// centred on the line at residualPPM.
	residual    bool
	residualPPM float64
	// water marks a singlet at the solvent's water shift (markWater); it
	// is not a candidate for the integral unit.
	water bool
}

// groupLines partitions the non-artifact lines (ascending ppm) into
// multiplets. valley(i, j) returns the lowest trace value between lines i
// and j, or +Inf when there is no trace.
func groupLines(ls []line, fieldMHz, jMaxHz, sigma float64, valley func(a, b int) float64) []group {
	var out []group
	var cur []int
	gmax := 0.0 // tallest line of cur
	for i := range ls {
		if ls[i].artifact != "" {
			continue
		}
		if len(cur) > 0 {
			p := cur[len(cur)-1]
			gap := (ls[i].ppm - ls[p].ppm) * fieldMHz
			floor := math.Max(3*sigma, 0.25*math.Min(ls[i].height, gmax))
			hi, lo := math.Max(ls[i].height, gmax), math.Min(ls[i].height, gmax)
			v := valley(p, i)
			// A wide gap (over baseGapHz) where the trace returns to the
			// baseline joins only lines of similar height: across a
			// large coupling the pattern repeats (d, dd), whereas Pascal
			// ratios up to 1:7 sit a small J apart. At 60–90 MHz
			// neighbouring multiplets lie within JMaxHz of each other and
			// would otherwise chain into one.
			baseGap := sigma > 0 && v <= 3*sigma && gap > baseGapHz
			byDist := gap <= jMaxHz && (!baseGap || hi <= baseGapRatio*lo)
			join := hi <= groupMaxRatio*lo && (byDist || v > floor)
			if !join {
				out = append(out, group{lines: cur})
				cur, gmax = nil, 0
			}
		}
		cur = append(cur, i)
		gmax = math.Max(gmax, ls[i].height)
	}
	if len(cur) > 0 {
		out = append(out, group{lines: cur})
	}
	return out
}

// analyze sets the multiplicity, couplings and centre of g.
func (g *group) analyze(ls []line, fieldMHz float64) {
	n := len(g.lines)
	hz := make([]float64, n)
	h := make([]float64, n)
	var widths []float64
	for k, i := range g.lines {
		hz[k] = ls[i].ppm * fieldMHz
		h[k] = ls[i].height
		if ls[i].widthHz > 0 {
			widths = append(widths, ls[i].widthHz)
		}
	}
	tol := 0.25
	var mw float64
	if len(widths) > 0 {
		mw = median(append([]float64(nil), widths...))
		tol = math.Max(tol, 0.3*mw)
	}
	mult, js, center, ok := firstOrderTrimmed(hz, h, tol)
	if !ok && mw > 0 && n <= maxDeconvolveLines {
		// Partly overlapping lines lend each other height; their separated
		// amplitudes show the binomial ratios.
		if a, solved := unmixLorentz(hz, h, mw/2); solved {
			mult, js, center, ok = firstOrderTrimmed(hz, a, tol)
		}
	}
	if ok {
		g.multiplicity, g.j, g.centerPPM = mult, js, center/fieldMHz
		return
	}
	g.multiplicity, g.j = "m", nil
	var sw, s float64
	for k := range hz {
		sw += h[k]
		s += h[k] * hz[k]
	}
	g.centerPPM = s / sw / fieldMHz
	if !(sw > 0) {
		g.centerPPM = (hz[0] + hz[n-1]) / 2 / fieldMHz
	}
}

// firstOrderTrimmed runs firstOrder on all lines and, when that fails, on
// the lines above trimLevels of the tallest: weak lines of an impurity, a
// skirt or a neighbour inside the region should not hide a clear pattern.
// A trimmed pattern must keep trimKeep of the summed height.
func firstOrderTrimmed(hz, h []float64, tol float64) (string, []float64, float64, bool) {
	if name, js, c, ok := firstOrder(hz, h, tol); ok {
		return name, js, c, true
	}
	hmax, total := 0.0, 0.0
	for _, v := range h {
		hmax = math.Max(hmax, v)
		total += v
	}
	prev := len(h)
	for _, f := range trimLevels {
		var sh, sz []float64
		kept := 0.0
		for i, v := range h {
			if v >= f*hmax {
				sz, sh = append(sz, hz[i]), append(sh, v)
				kept += v
			}
		}
		if len(sh) == prev || len(sh) == 0 {
			continue
		}
		prev = len(sh)
		if kept < trimKeep*total {
			break
		}
		if name, js, c, ok := firstOrder(sz, sh, tol); ok {
			return name, js, c, true
		}
	}
	return "", nil, 0, false
}

// firstOrder analyses lines at positions hz (ascending, Hz) with heights h.
// It returns the multiplicity name, the couplings from the largest down (one
// value per group of equal couplings), the centre in Hz, and ok=false when
// the pattern is not first-order.
func firstOrder(hz, h []float64, tol float64) (string, []float64, float64, bool) {
	n := len(hz)
	if n == 0 {
		return "", nil, 0, false
	}
	center := (hz[0] + hz[n-1]) / 2
	if n == 1 {
		return "s", []float64{}, center, true
	}
	// Symmetry in positions and intensities; then symmetrise.
	p := make([]float64, n)
	u := make([]float64, n)
	for i := 0; i < n; i++ {
		k := n - 1 - i
		if math.Abs((hz[i]-center)+(hz[k]-center)) > tol {
			return "", nil, center, false
		}
		mx := math.Max(h[i], h[k])
		if !(mx > 0) || math.Abs(h[i]-h[k]) > roofTolerance*mx {
			return "", nil, center, false
		}
		p[i] = (hz[i] - hz[k]) / 2
		u[i] = (h[i] + h[k]) / 2
	}
	units, ok := wholeUnits(u)
	if !ok {
		return "", nil, center, false
	}
	comp := make([]float64, 0, maxComponents)
	for i, r := range units {
		for c := 0; c < r; c++ {
			comp = append(comp, p[i])
		}
	}
	js, ok := peelCouplings(comp, tol)
	if !ok {
		return "", nil, center, false
	}
	name, vals, ok := nameCouplings(js, tol)
	if !ok {
		return "", nil, center, false
	}
	return name, vals, center, true
}

// wholeUnits expresses intensities in units of the outer line and checks that
// they are near whole numbers summing to a power of two.
func wholeUnits(u []float64) ([]int, bool) {
	unit := u[0]
	if !(unit > 0) {
		return nil, false
	}
	r := make([]int, len(u))
	total := 0
	for i, v := range u {
		x := v / unit
		k := int(math.Round(x))
		if k < 1 || math.Abs(x-float64(k)) > math.Max(unitTolerance, 0.15*float64(k)) {
			return nil, false
		}
		r[i] = k
		total += k
		if total > maxComponents {
			return nil, false
		}
	}
	if total < 2 || total&(total-1) != 0 {
		return nil, false
	}
	return r, true
}

// peelCouplings removes one doublet splitting at a time from the component
// positions comp (ascending) and returns the couplings in the order found
// (smallest first).
func peelCouplings(comp []float64, tol float64) ([]float64, bool) {
	var js []float64
	for len(comp) > 1 {
		sort.Float64s(comp)
		j := comp[1] - comp[0]
		if j < tol {
			return nil, false
		}
		used := make([]bool, len(comp))
		next := make([]float64, 0, len(comp)/2)
		for a := range comp {
			if used[a] {
				continue
			}
			used[a] = true
			best, bestD := -1, tol
			for b := a + 1; b < len(comp); b++ {
				if used[b] {
					continue
				}
				d := math.Abs(comp[b] - comp[a] - j)
				if d <= bestD {
					best, bestD = b, d
				}
				if comp[b]-comp[a] > j+tol {
					break
				}
			}
			if best < 0 {
				return nil, false
			}
			used[best] = true
			next = append(next, (comp[a]+comp[best])/2)
		}
		// Refine J as the mean distance of the pairs is implicit in the
		// midpoints; record the first estimate.
		js = append(js, j)
		comp = next
	}
	return js, true
}

// nameCouplings merges equal couplings (within tol) and names the pattern
// from the largest coupling down. Each merged value is the mean of its
// members, which for n equal couplings is the outer-line distance / n.
func nameCouplings(js []float64, tol float64) (string, []float64, bool) {
	sort.Sort(sort.Reverse(sort.Float64Slice(js)))
	var name strings.Builder
	var vals []float64
	letters := 0
	for i := 0; i < len(js); {
		k := i + 1
		sum := js[i]
		for k < len(js) && js[i]-js[k] <= tol {
			sum += js[k]
			k++
		}
		c := k - i
		if c >= len(multipletNames) {
			return "", nil, false
		}
		name.WriteString(multipletNames[c])
		vals = append(vals, sum/float64(c))
		letters++
		i = k
	}
	if letters > maxLetters {
		return "", nil, false
	}
	return name.String(), vals, true
}

// splitMultiplicity splits a first-order name into its groups of equal
// couplings: "dt" → [1 2], "sept" → [6]. ok is false for "m" or an unknown
// name.
func splitMultiplicity(name string) ([]int, bool) {
	var out []int
	for name != "" {
		found := false
		for c := len(multipletNames) - 1; c >= 1; c-- {
			if p := multipletNames[c]; strings.HasPrefix(name, p) {
				out = append(out, c)
				name = name[len(p):]
				found = true
				break
			}
		}
		if !found {
			return nil, false
		}
	}
	return out, len(out) > 0
}

// unmixLorentz returns the amplitudes A of Lorentzian lines of half width
// gamma (Hz) at positions hz whose sum has the heights h at the line
// positions: Σⱼ Aⱼ/(1+((hzᵢ−hzⱼ)/γ)²) = hᵢ. ok is false when the system is
// singular or an amplitude comes out non-positive.
func unmixLorentz(hz, h []float64, gamma float64) ([]float64, bool) {
	n := len(hz)
	a := mat.NewDense(n, n, nil)
	for r := range n {
		for c := range n {
			d := (hz[r] - hz[c]) / gamma
			a.Set(r, c, 1/(1+d*d))
		}
	}
	var x mat.VecDense
	if err := x.SolveVec(a, mat.NewVecDense(n, append([]float64(nil), h...))); err != nil {
		return nil, false
	}
	out := make([]float64, n)
	for i := range out {
		out[i] = x.AtVec(i)
		if !(out[i] > 0) {
			return nil, false
		}
	}
	return out, true
}
