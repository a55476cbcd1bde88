package spectrum

import (
	"math"
	"sort"
)

// Artifact flags.
//
// 13C satellites: 1.1 % of the molecules carry 13C at a given carbon, so
// every C–H signal has two satellites of about 0.55 % of its height each,
// split by the one-bond coupling ¹J(CH) ≈ 125–250 Hz, i.e. at ±½·¹J around
// the parent, shifted slightly upfield by the 13C isotope effect (common
// practice, no source; natural abundance 1.07 % from the IUPAC isotopic
// composition tables, value from memory). A pair of small lines (0.1–2 % of
// the parent) at distances within satelliteMinHz…satelliteMaxHz on the two
// sides, centred on the parent within ±satelliteAsymHz/2 or upfield of it by
// up to the isotope shift satelliteIsoPPM more, is flagged; so is a single one whose
// mirror position is covered by a taller signal.
//
// Spinning sidebands: sample spinning modulates the field and puts weak
// copies of strong lines at exactly ± the spinning rate (typically 10–40 Hz;
// common practice, no source). A symmetric pair (distances equal within
// sidebandAsymHz, heights within 30 % of each other, each below 2 % of the
// parent) within sidebandMinHz…sidebandMaxHz is flagged.

// Line-shape skirts: an imperfect field homogeneity or a truncated FID
// leaves humps and wiggles at the foot of every strong line, typically
// 0.1–1 % of its height within a few tens of Hz (common practice, no
// source). On a spectrum with an S/N of 10⁴–10⁵ they rise far above the noise.
// A peak below skirtMaxRel of a line within skirtHz is flagged; the price is
// that a genuine signal that small and that close to a strong line is
// not reported as a signal.

// Artifact kinds set on Peak.Artifact.
const (
	Artifact13C      = "13C satellite"
	ArtifactSideband = "spinning sideband"
	ArtifactSkirt    = "line-shape skirt"
)

const (
	satelliteMinHz  = 55.0
	satelliteMaxHz  = 130.0
	satelliteAsymHz = 3.0
	// satelliteIsoPPM: the one-bond 13C isotope shift of a 1H signal is
	// upfield, about 0.001–0.003 ppm (value from memory), which at 700 MHz
	// is already 2 Hz and puts the pair's centre beside the parent.
	satelliteIsoPPM = 0.003
	satelliteMinRel = 0.001
	satelliteMaxRel = 0.02
	sidebandMinHz   = 5.0
	sidebandMaxHz   = 60.0
	sidebandAsymHz  = 0.5
	sidebandMaxRel  = 0.02
	skirtHz         = 50.0
	skirtMaxRel     = 0.005
)

// flagArtifacts marks satellites and sidebands among ls (ascending ppm).
// cover(ppm) returns the trace height at a position (0 without a trace).
func flagArtifacts(ls []line, fieldMHz float64, cover func(ppm float64) float64) {
	order := make([]int, len(ls))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool { return ls[order[a]].height > ls[order[b]].height })
	for _, p := range order {
		if ls[p].artifact != "" {
			continue
		}
		flagSidebands(ls, p, fieldMHz)
		flagSatellites(ls, p, fieldMHz, cover)
	}
	for _, p := range order {
		if ls[p].artifact == "" {
			for _, i := range linesWithin(ls, p, fieldMHz, -skirtHz, skirtHz, 0, skirtMaxRel) {
				ls[i].artifact = ArtifactSkirt
			}
		}
	}
}

// linesWithin returns the indices of unflagged lines whose distance from
// line p (in Hz, signed: negative = lower ppm) lies in [lo, hi] and whose
// height relative to p lies in [relLo, relHi].
func linesWithin(ls []line, p int, fieldMHz, lo, hi, relLo, relHi float64) []int {
	var out []int
	x0 := ls[p].ppm
	a := sort.Search(len(ls), func(i int) bool { return ls[i].ppm >= x0+lo/fieldMHz })
	for i := a; i < len(ls) && ls[i].ppm <= x0+hi/fieldMHz; i++ {
		if i == p || ls[i].artifact != "" {
			continue
		}
		r := ls[i].height / ls[p].height
		if r >= relLo && r <= relHi {
			out = append(out, i)
		}
	}
	return out
}

// flagSatellites marks the 13C satellites of line p.
func flagSatellites(ls []line, p int, fieldMHz float64, cover func(float64) float64) {
	left := linesWithin(ls, p, fieldMHz, -satelliteMaxHz, -satelliteMinHz, satelliteMinRel, satelliteMaxRel)
	right := linesWithin(ls, p, fieldMHz, satelliteMinHz, satelliteMaxHz, satelliteMinRel, satelliteMaxRel)
	x0 := ls[p].ppm
	paired := false
	for _, l := range left {
		for _, r := range right {
			// The pair's centre sits upfield of the parent by the 13C
			// isotope shift (up to satelliteIsoPPM), give or take half the
			// asymmetry tolerance.
			off := ((ls[l].ppm+ls[r].ppm)/2 - x0) * fieldMHz
			hr := ls[l].height / ls[r].height
			if off >= -satelliteAsymHz/2-satelliteIsoPPM*fieldMHz && off <= satelliteAsymHz/2 && hr > 0.5 && hr < 2 {
				ls[l].artifact, ls[r].artifact = Artifact13C, Artifact13C
				paired = true
			}
		}
	}
	if paired || cover == nil {
		return
	}
	// One-sided: the mirror satellite hides under a taller signal.
	for _, side := range [][]int{left, right} {
		for _, c := range side {
			mirror := 2*x0 - ls[c].ppm
			if cover(mirror) > 2*ls[c].height && ls[c].height < 0.01*ls[p].height {
				ls[c].artifact = Artifact13C
			}
		}
	}
}

// flagSidebands marks the spinning sidebands of line p.
func flagSidebands(ls []line, p int, fieldMHz float64) {
	left := linesWithin(ls, p, fieldMHz, -sidebandMaxHz, -sidebandMinHz, 0, sidebandMaxRel)
	right := linesWithin(ls, p, fieldMHz, sidebandMinHz, sidebandMaxHz, 0, sidebandMaxRel)
	x0 := ls[p].ppm
	for _, l := range left {
		for _, r := range right {
			dl := (x0 - ls[l].ppm) * fieldMHz
			dr := (ls[r].ppm - x0) * fieldMHz
			hr := ls[l].height / ls[r].height
			if math.Abs(dl-dr) <= sidebandAsymHz && hr > 1/1.3 && hr < 1.3 {
				ls[l].artifact, ls[r].artifact = ArtifactSideband, ArtifactSideband
			}
		}
	}
}
