package compare

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"shiftwise/predict"
	"shiftwise/spectrum"
)

// Artifact detection windows. A 13C satellite sits ½·¹J(CH) from its parent:
// ¹J(CH) is 125–170 Hz for sp3/sp2 C–H and about 209 Hz for CHCl3, so the
// window is 55–110 Hz; each satellite carries ½ × 1.1 % (13C natural
// abundance) ≈ 0.55 % of the parent (common practice, no source; 1.1 % is
// the textbook abundance, value from memory).
const (
	satMinHz, satMaxHz   = 55.0, 110.0
	satMinRat, satMaxRat = 0.0015, 0.015
	sidebandMaxHz        = 50.0 // spinning rates of 20–40 Hz (common practice, no source)
	sidebandMaxRat       = 0.03
	mirrorTolHz          = 2.0
	// A lone satellite (its mirror lost in noise or under other lines) is
	// accepted when it is weak and its share is within a factor 2 of 0.55 %.
	loneSatMinRat, loneSatMaxRat = 0.00275, 0.011
	loneSatMaxSNR                = 15.0
)

// extraSpecies is a structure given by the user (impurity or internal
// standard), predicted like the compound.
type extraSpecies struct {
	name   string
	kind   string // "impurity" or "standard"
	smiles string
	sig    []predict.Signal
	mw     float64
}

// explanation is what the peaks not given to the compound turn out to be.
type explanation struct {
	owner       []string // per ms index: "compound", "solvent", "reference", "water", species name, "artifact", ""
	found       []Identity
	artifacts   []Artifact
	unexplained []Unexplained
	total       float64 // area counted for percentages
	unknownArea float64
	amounts     map[string]float64 // molecules per compound molecule, per found species
	extraHits   map[string][]extraHit
	busy        [][2]float64 // ppm windows where the compound has lines (compoundWindows)
	field       float64      // MHz
	water       float64      // the solvent's water shift (waterOK: known)
	waterOK     bool
}

// extraHit is one matched signal of a user-given species.
type extraHit struct {
	sig predict.Signal
	j   int // index into ms
}

// claimFixed marks the residual protio-solvent and reference (TMS) peaks:
// narrow multiplets at the tabulated shift: regions of at most 0.08 ppm
// (residual) and 0.05 ppm (TMS) at 400 MHz, 32 and 20 Hz at lower fields.
// They take no part in the assignment.
func claimFixed(ms []mplet, solv SolventInfo, solvOK bool, field float64) []string {
	resW, tmsW := 0.08, 0.05
	if field > 0 {
		resW, tmsW = math.Max(resW, 32/field), math.Max(tmsW, 20/field)
	}
	owner := make([]string, len(ms))
	for j, m := range ms {
		w := m.to - m.from
		switch {
		case m.label == spectrum.LabelSolvent:
			owner[j] = "solvent"
		case m.label == spectrum.LabelTMS:
			owner[j] = "reference"
		case solvOK && math.Abs(m.ppm-solv.Residual) <= 0.03 && w <= resW && residualLike(m, solv):
			owner[j] = "solvent"
		case math.Abs(m.ppm) <= 0.03 && w <= tmsW:
			owner[j] = "reference"
		}
	}
	return owner
}

// explain labels every multiplet the compound assignment left over.
func explain(ms []mplet, pre []string, sig []predict.Signal, sigM []int, scale, field float64,
	solv SolventInfo, solvOK bool, extras []extraSpecies, busy [][2]float64, clines []predict.Line) *explanation {
	ex := &explanation{owner: append([]string(nil), pre...), amounts: map[string]float64{}, extraHits: map[string][]extraHit{},
		busy: busy, field: field}
	if solvOK {
		ex.water, ex.waterOK = waterShift(solv.Name)
	}
	{
		for j, o := range pre {
			if o == "solvent" {
				name := solv.ResidualName
				if !solvOK {
					name = "residual solvent"
				}
				ex.found = append(ex.found, Identity{Name: name, Kind: "solvent", PPM: []float64{ms[j].ppm},
					Multiplets: []int{ms[j].idx}, Signals: 1, SignalsWant: 1, Source: "Gottlieb 1997 / Fulmer 2010 (value from memory)"})
			}
			if o == "reference" {
				ex.found = append(ex.found, Identity{Name: "TMS (reference)", Kind: "reference", PPM: []float64{ms[j].ppm},
					Multiplets: []int{ms[j].idx}, Signals: 1, SignalsWant: 1, Source: "reference, 0.00 ppm by definition"})
			}
		}
	}
	expectH := make([]float64, len(ms))
	for j := range ms {
		if ms[j].part {
			ex.owner[j] = "compound"
		}
	}
	for i, j := range sigM {
		if j < 0 {
			continue
		}
		ex.owner[j] = "compound"
		if !sig[i].Exchangeable && pre[j] == "" {
			expectH[j] += float64(sig[i].NH)
		}
	}
	ex.absorbEdgeFragments(ms, field)
	var singlets []float64
	if solvOK {
		singlets = tableSinglets(solv)
	}
	ex.findArtifacts(ms, field, singlets)
	ex.absorbCompoundLines(ms, clines, scale, field)
	ex.findHumps(ms)
	for j, o := range ex.owner {
		if pre[j] == "" && o != "artifact" {
			ex.total += ms[j].area // a part's area is counted with its host
		}
	}
	for _, e := range extras {
		ex.matchExtra(ms, e, scale)
	}
	if solvOK {
		ex.matchTable(ms, solv, scale)
	}
	ex.listLeftovers(ms, expectH, scale, solv, solvOK)
	return ex
}

func (ex *explanation) free(j int) bool { return ex.owner[j] == "" }

// Edge fragments: processing may cut the wings of a broad second-order
// multiplet (common at 60–90 MHz) into a small region of their own that
// touches the compound's multiplet. Such a piece is part of the compound,
// not an impurity.
const (
	edgeGapHz     = 2.0  // regions closer than this touch
	edgeMaxShare  = 0.10 // a fragment holds at most this share of its host's area
	edgeMinToHost = 3    // the host has at least this many peaks (a resolved pattern)
)

// absorbEdgeFragments gives to the compound every free, unlabelled multiplet
// that is not a clean singlet, touches a multiplet owned by the compound and
// holds at most edgeMaxShare of that multiplet's area. A clean singlet is
// left alone: it may be a contaminant sitting next to the compound's lines.
func (ex *explanation) absorbEdgeFragments(ms []mplet, field float64) {
	if field <= 0 {
		return
	}
	gap := edgeGapHz / field
	for u := range ms {
		if !ex.free(u) || ms[u].label != "" || ms[u].mult == "s" || len(ms[u].pk) < 2 {
			continue
		}
		for h := range ms {
			if ex.owner[h] != "compound" || len(ms[h].pk) < edgeMinToHost || ms[u].area > edgeMaxShare*ms[h].area {
				continue
			}
			if math.Abs(ms[u].from-ms[h].to) <= gap || math.Abs(ms[h].from-ms[u].to) <= gap {
				ex.owner[u] = "compound"
				break
			}
		}
	}
}

// absorbCompoundLines gives to the compound every free, unlabelled line of
// one or two peaks where the compound's own predicted lines (clines,
// moved with their multiplets; compoundLines) hold at least half its H
// within max(2 Hz, its width): an outer line of a wide second-order
// pattern that processing grouped apart (at 60 MHz the CH multiplet of an
// isobutyl group spans 0.9 ppm), not a contaminant singlet.
func (ex *explanation) absorbCompoundLines(ms []mplet, clines []predict.Line, scale, field float64) {
	if field <= 0 || scale <= 0 || len(clines) == 0 {
		return
	}
	for u := range ms {
		m := ms[u]
		if !ex.free(u) || m.label != "" || len(m.pk) == 0 || len(m.pk) > 2 {
			continue
		}
		w := 0.0
		for _, p := range m.pk {
			w = math.Max(w, p.WidthHz)
		}
		tol := math.Max(2, w) / field
		got := 0.0
		for _, p := range m.pk {
			got += linesNear(clines, p.PPM, tol)
		}
		if got >= 0.5*m.area*scale {
			ex.owner[u] = "compound"
		}
	}
}

// tableSinglets returns the tabulated singlet shifts of the solvent's table
// species (water and contaminants; not the reference).
func tableSinglets(solv SolventInfo) []float64 {
	var out []float64
	for _, sp := range SpeciesFor(solv.Name) {
		for _, sg := range sp.Signals {
			if sg.Mult == "s" && sp.Kind != "reference" {
				out = append(out, sg.PPM[solv.Name])
			}
		}
	}
	return out
}

// findArtifacts marks unowned small multiplets that sit as 13C satellites
// or as mirrored spinning sidebands of a much larger multiplet (see
// satelliteMirror for the partner a satellite needs; singlets are the
// tabulated singlet shifts of the solvent's table).
func (ex *explanation) findArtifacts(ms []mplet, field float64, singlets []float64) {
	if field <= 0 {
		return
	}
	atSinglet := func(m mplet) bool {
		for _, x := range singlets {
			if math.Abs(m.ppm-x) <= DefaultImpurityTol {
				return true
			}
		}
		return false
	}
	for u := range ms {
		if !ex.free(u) {
			continue
		}
		best, bestDev := -1, math.Inf(1)
		kind := ""
		for p := range ms {
			if p == u || ms[p].area < 20*ms[u].area {
				continue
			}
			off := math.Abs(ms[u].ppm-ms[p].ppm) * field
			rat := ms[u].area / ms[p].area
			if off >= satMinHz && off <= satMaxHz && rat >= satMinRat && rat <= satMaxRat && ex.satelliteMirror(ms, u, p, field, rat, atSinglet(ms[u])) {
				if d := math.Abs(math.Log(rat / 0.0055)); d < bestDev {
					best, bestDev, kind = p, d, "13C satellite"
				}
				continue
			}
			if off >= 5 && off < sidebandMaxHz && rat <= sidebandMaxRat && ex.hasMirror(ms, u, p, field) {
				if d := math.Abs(math.Log(rat / 0.01)); d < bestDev {
					best, bestDev, kind = p, d, "spinning sideband"
				}
			}
		}
		if best >= 0 {
			ex.owner[u] = "artifact"
			ex.artifacts = append(ex.artifacts, Artifact{PPM: ms[u].ppm, Kind: kind, ParentPPM: ms[best].ppm,
				Percent: 100 * ms[u].area / ms[best].area, Multiplet: ms[u].idx})
		}
	}
}

// humpMinWidth: a free region wider than this (ppm) is a baseline hump
// (a rolling or distorted baseline, a background signal of the probe),
// not a line of any species: real multiplets span at most about half a
// ppm, broad exchange lines about one (common practice, no source).
const humpMinWidth = 1.5

// findHumps marks free, unlabelled regions wider than humpMinWidth as
// artifacts ("baseline hump"): no table species or impurity is matched to
// them and they are left out of the intensity total, like other
// artifacts; the artifact list still shows them.
func (ex *explanation) findHumps(ms []mplet) {
	for u := range ms {
		if ex.free(u) && ms[u].label == "" && ms[u].to-ms[u].from > humpMinWidth {
			ex.owner[u] = "artifact"
			ex.artifacts = append(ex.artifacts, Artifact{PPM: ms[u].ppm, Kind: "baseline hump", ParentPPM: ms[u].ppm,
				Multiplet: ms[u].idx})
		}
	}
}

// satelliteMirror reports whether multiplet u, offset from parent p like a
// 13C satellite with area ratio rat, has its partner: the mirror line, a
// larger multiplet covering the mirror position, or, for a weak line near
// 0.55 %, none (loneSatellite). At a tabulated singlet of the solvent's
// table (tableSinglet) only a mirror line will do: at 60 MHz the window is
// nearly two ppm wide and large multiplets cover much of it, so a
// contaminant singlet (CH2Cl2 at 5.30 ppm, 91 Hz from an OCH3 whose
// mirror position lies under a CH3 singlet) is the likelier reading.
func (ex *explanation) satelliteMirror(ms []mplet, u, p int, field, rat float64, tableSinglet bool) bool {
	if tableSinglet {
		return ex.hasMirror(ms, u, p, field)
	}
	return ex.mirrorOrCovered(ms, u, p, field) || loneSatellite(ms[u], rat)
}

// loneSatellite reports whether a multiplet with no mirror partner may still
// be taken as a 13C satellite: weak (S/N known and below loneSatMaxSNR) and
// close to the expected 0.55 % of its parent.
func loneSatellite(m mplet, rat float64) bool {
	return m.snr > 0 && m.snr < loneSatMaxSNR && rat >= loneSatMinRat && rat <= loneSatMaxRat
}

// mirrorOrCovered reports whether the other satellite of the pair is there:
// a multiplet at the mirror position (within 3 Hz, area within a factor 3),
// or a larger multiplet covering that position.
func (ex *explanation) mirrorOrCovered(ms []mplet, u, p int, field float64) bool {
	want := 2*ms[p].ppm - ms[u].ppm
	for k := range ms {
		if k == u || k == p {
			continue
		}
		if math.Abs(ms[k].ppm-want)*field <= 3 && math.Abs(math.Log(ms[k].area/ms[u].area)) < math.Log(3) {
			return true
		}
		if want >= ms[k].from && want <= ms[k].to && ms[k].area > ms[u].area {
			return true
		}
	}
	return false
}

func (ex *explanation) hasMirror(ms []mplet, u, p int, field float64) bool {
	want := 2*ms[p].ppm - ms[u].ppm
	for k := range ms {
		if k != u && k != p && math.Abs(ms[k].ppm-want)*field <= mirrorTolHz &&
			math.Abs(math.Log(ms[k].area/ms[u].area)) < math.Log(3) {
			return true
		}
	}
	return false
}

// matchExtra matches a user-given impurity or standard to free multiplets.
func (ex *explanation) matchExtra(ms []mplet, e extraSpecies, scale float64) {
	var free []int
	for j := range ms {
		if ex.free(j) {
			free = append(free, j)
		}
	}
	var sig []predict.Signal
	for _, s := range e.sig {
		if !s.Exchangeable {
			sig = append(sig, s)
		}
	}
	// The water line is in every tube: it is no evidence for a signal
	// predicted away from it.
	atWater := func(j int, s predict.Signal) bool {
		return ex.waterOK && math.Abs(ms[j].ppm-ex.water) <= waterTol && math.Abs(s.ShiftPPM-ex.water) > waterTol
	}
	if len(sig) == 0 || len(free) == 0 {
		return
	}
	cost := make([][]float64, len(sig))
	for i, s := range sig {
		row := make([]float64, len(free)+len(sig))
		for c, j := range free {
			z := shiftDistance(s.ShiftPPM, ms[j]) / signalSD(s)
			row[c] = shiftCost(z) + 0.5*multCost(s.Multiplicity, ms[j].mult)
			if atWater(j, s) {
				row[c] = forbidden
			}
		}
		for k := range sig {
			row[len(free)+k] = forbidden
		}
		row[len(free)+i] = extraMissCost
		cost[i] = row
	}
	assign, _ := Hungarian(cost)
	for i, c := range assign {
		// A signal further than extraMaxZ SD from its prediction is no
		// evidence for the impurity (the water line, 0.6 ppm from
		// acetone's 2.17, was taken as acetone at 4.6 mol %).
		if c < len(free) && (shiftDistance(sig[i].ShiftPPM, ms[free[c]])/signalSD(sig[i]) > extraMaxZ || atWater(free[c], sig[i])) {
			assign[i] = len(free) + i
		}
	}
	wantH, gotH, area := 0, 0, 0.0
	id := Identity{Name: e.name, Kind: e.kind, SignalsWant: len(sig), Source: "--" + e.kind + " " + e.smiles}
	var used []int
	var hits []extraHit
	for i, c := range assign {
		wantH += sig[i].NH
		if c >= len(free) {
			continue
		}
		j := free[c]
		gotH += sig[i].NH
		area += ms[j].area
		used = append(used, j)
		hits = append(hits, extraHit{sig[i], j})
		id.PPM = append(id.PPM, ms[j].ppm)
		id.Multiplets = append(id.Multiplets, ms[j].idx)
		id.Signals++
	}
	if gotH == 0 || 2*gotH < wantH && !ex.hiddenRest(ms, sig, assign, len(free), hits, gotH, wantH) {
		return
	}
	for _, j := range used {
		ex.owner[j] = e.name
	}
	id.MatchedH = float64(gotH)
	ex.extraHits[e.name] = hits
	if scale > 0 && e.kind == "impurity" {
		ex.amounts[e.name] = extraAmount(ms, hits, scale, ex.busy)
	}
	ex.found = append(ex.found, id)
}

// hiddenRest reports whether a given impurity with fewer than half its H
// found may still be named because the rest lies hidden under the
// compound: the found and the hidden H (unmatched signals predicted inside
// a compound multiplet, ± 0.05 ppm) make at least half, and every found
// signal sits within hiddenFitZ SD of its prediction and hiddenClearPPM
// clear of the compound's multiplets. At 60–90 MHz an
// aromatic impurity's ring H share the compound's aromatic envelope and
// only a clear signal (benzaldehyde's CHO at 10.0 ppm) stands free.
func (ex *explanation) hiddenRest(ms []mplet, sig []predict.Signal, assign []int, nFree int, hits []extraHit, gotH, wantH int) bool {
	hiddenH := 0
	for i, c := range assign {
		if c < nFree {
			continue
		}
		for j := range ms {
			if ex.owner[j] == "compound" && sig[i].ShiftPPM >= ms[j].from-0.05 && sig[i].ShiftPPM <= ms[j].to+0.05 {
				hiddenH += sig[i].NH
				break
			}
		}
	}
	if 2*(gotH+hiddenH) < wantH {
		return false
	}
	for _, h := range hits {
		if shiftDistance(h.sig.ShiftPPM, ms[h.j])/signalSD(h.sig) > hiddenFitZ {
			return false
		}
		// A free line beside a compound multiplet may be a piece of it
		// (at 60 MHz second-order patterns spread and break up).
		for j := range ms {
			if ex.owner[j] == "compound" && ms[h.j].from < ms[j].to+hiddenClearPPM && ms[h.j].to > ms[j].from-hiddenClearPPM {
				return false
			}
		}
	}
	return true
}

// hiddenClearPPM: the found signals of a mostly hidden impurity must lie
// this far from every compound multiplet.
const hiddenClearPPM = 0.3

// extraMissCost and extraMaxZ: a given impurity's signal is matched to a
// free multiplet only within extraMaxZ SD of its predicted shift (cost z²
// plus the multiplicity term, against extraMissCost for leaving it
// unmatched). Set on the reference set (TestGivenImpurityAbsent): absent
// impurities named in 11, 13 and 3 of 454 checks at 60, 90 and 400 MHz
// (53, 58 and 55 with the earlier 3 SD), present ones found as before.
const (
	extraMissCost = 4.0 // z = 2
	extraMaxZ     = 2.0
)

// hiddenFitZ: how close (in SD) the found signals of a mostly hidden
// impurity must lie to their predicted shifts.
const hiddenFitZ = 1.0

type tableHit struct {
	sp      Species
	ms      []int // per species signal: multiplet or -1
	gotH    int
	nSig    int
	hidden  int // signals not found free but lying inside a compound multiplet
	hiddenH int
	dist    float64 // mean shift distance, a multiplet's half width credited
	raw     float64 // mean distance of the multiplet centres (tie-break: at 60 MHz the credit covers neighbouring table lines)
	water   bool
}

// matchTable recognises table impurities among the free multiplets, whole
// sets first (ethyl acetate's three signals before a lone singlet).
func (ex *explanation) matchTable(ms []mplet, solv SolventInfo, scale float64) {
	species := SpeciesFor(solv.Name)
	for {
		var hits []tableHit
		for _, sp := range species {
			if sp.Kind == "reference" || ex.amounts[sp.Name] > 0 || ex.hasFound(sp.Name) {
				continue
			}
			if h, ok := ex.tryTable(ms, sp, solv.Name, scale); ok {
				hits = append(hits, h)
			}
		}
		if len(hits) == 0 {
			return
		}
		// Most signals found first; then the closest match in units of each
		// species' tolerance; then the most signals hidden under the compound.
		sort.Slice(hits, func(a, b int) bool {
			if hits[a].nSig != hits[b].nSig {
				return hits[a].nSig > hits[b].nSig
			}
			if hits[a].water != hits[b].water && hits[a].nSig == 1 && sameMultiplets(hits[a].ms, hits[b].ms) {
				// One line that water or a one-line contaminant could be:
				// every tube holds water (the other is named as the
				// alternative).
				return hits[a].water
			}
			da, db := hits[a].dist/hits[a].sp.Tol, hits[b].dist/hits[b].sp.Tol
			if math.Abs(da-db) > 1e-9 {
				return da < db
			}
			if ra, rb := hits[a].raw/hits[a].sp.Tol, hits[b].raw/hits[b].sp.Tol; math.Abs(ra-rb) > 1e-9 {
				return ra < rb
			}
			return hits[a].hidden > hits[b].hidden
		})
		h := hits[0]
		// Equally good single-signal alternatives on the same multiplet.
		var alt []string
		for _, o := range hits[1:] {
			if o.nSig == h.nSig && o.hidden == h.hidden && sameMultiplets(o.ms, h.ms) {
				alt = append(alt, o.sp.Name)
			}
		}
		ex.claimTable(ms, h, alt, scale)
	}
}

func (ex *explanation) hasFound(name string) bool {
	for _, f := range ex.found {
		if f.Name == name {
			return true
		}
	}
	return false
}

func sameMultiplets(a, b []int) bool {
	x, y := map[int]bool{}, map[int]bool{}
	for _, v := range a {
		if v >= 0 {
			x[v] = true
		}
	}
	for _, v := range b {
		if v >= 0 {
			y[v] = true
		}
	}
	if len(x) != len(y) {
		return false
	}
	for k := range x {
		if !y[k] {
			return false
		}
	}
	return true
}

// minContaminantAmount is the smallest amount (molecules per compound
// molecule, i.e. 0.1 mol %) at which a table contaminant is named; smaller
// matches are coincidences with noise-level peaks more often than not. It
// matches the usual 0.1 % impurity reporting level (ICH Q3A; value from
// memory).
const minContaminantAmount = 0.001

// maxSharpWidth and maxSharpWidthHz bound the region (margins included) of
// a multiplet that can be a sharp contaminant line: s, d, t, q with J ≤ 8
// Hz span ≤ 25 Hz, plus margins: 0.15 ppm at 300 MHz and above, 45 Hz at
// lower fields (0.75 ppm at 60 MHz, where the same pattern is six times
// wider in ppm) (common practice, no source).
const (
	maxSharpWidth   = 0.15
	maxSharpWidthHz = 45.0
)

// resolvedMult is m's multiplicity, or "m" when its splittings are smaller
// than its lines are wide: a broad line (water, 4 Hz) with a noise bump on
// its top reads as a "d" of 1.4 Hz, which is no resolved doublet.
func resolvedMult(m mplet) string {
	w, ok := medianPeakWidth(m)
	if len(m.j) == 0 || !ok {
		return m.mult
	}
	jmax := 0.0
	for _, j := range m.j {
		jmax = math.Max(jmax, j)
	}
	if jmax < w {
		return "m"
	}
	return m.mult
}

// residualLike reports whether multiplet m can be the residual solvent
// signal: no more peaks than its pattern has lines (s 1, t 3, quint 5)
// plus two (a satellite, a noise peak), and one of them within 0.015 ppm
// of the tabulated shift. A compound multiplet beside it (acetanilide's
// meta-H triplet at 7.29, seven peaks, 0.03 ppm from CHCl3) is not.
func residualLike(m mplet, solv SolventInfo) bool {
	lines := map[string]int{"s": 1, "d": 2, "t": 3, "q": 4, "quint": 5, "p": 5}[solv.ResidualMult]
	if lines == 0 {
		lines = 5
	}
	if len(m.pk) > lines+2 {
		return false
	}
	if len(m.pk) == 0 {
		return true // a peak list without peaks: centre only
	}
	for _, p := range m.pk {
		if math.Abs(p.PPM-solv.Residual) <= 0.015 {
			return true
		}
	}
	return false
}

// sharpWidth is the widest sharp-line region (ppm) at field MHz.
func sharpWidth(field float64) float64 {
	if !(field > 0) {
		return maxSharpWidth
	}
	return math.Max(maxSharpWidth, maxSharpWidthHz/field)
}

// minIdentifySNR is the S/N a table contaminant's strongest matched peak
// needs to be named: the quantitation limit S/N 10 of ICH Q2 (value from
// memory).
const minIdentifySNR = 10

func (ex *explanation) tryTable(ms []mplet, sp Species, solvent string, scale float64) (tableHit, bool) {
	h := tableHit{sp: sp, ms: make([]int, len(sp.Signals)), water: sp.Kind == "water"}
	used := map[int]bool{}
	for k, sg := range sp.Signals {
		h.ms[k] = -1
		want := sg.PPM[solvent]
		best, bd := -1, math.Inf(1)
		for j := range ms {
			if !ex.free(j) || used[j] {
				continue
			}
			w := ms[j].to - ms[j].from
			if sp.Kind == "contaminant" && sg.Mult != "m" && w > sharpWidth(ex.field) {
				continue // a broad hump is not a sharp solvent line
			}
			if !tableMultOK(sg.Mult, resolvedMult(ms[j])) {
				continue // a tabulated singlet is not a resolved d, t, q, …
			}
			d := math.Max(0, math.Abs(ms[j].ppm-want)-0.5*w)
			// Equal credited distances (both within half their width):
			// the closer centre wins (a noise bump on a broad water
			// line's flank is grouped apart and sits beside it).
			if d <= sp.Tol && (d < bd || d == bd && math.Abs(ms[j].ppm-want) < math.Abs(ms[best].ppm-want)) {
				best, bd = j, d
			}
		}
		if best >= 0 {
			h.ms[k] = best
			used[best] = true
			h.gotH += sg.H
			h.nSig++
			h.dist += bd
			h.raw += math.Abs(ms[best].ppm - want)
			continue
		}
		for j := range ms {
			if ex.owner[j] == "compound" && want >= ms[j].from-0.01 && want <= ms[j].to+0.01 {
				h.hidden++
				h.hiddenH += sg.H
				break
			}
		}
	}
	if h.nSig == 0 || 2*(h.gotH+h.hiddenH) < speciesH(sp) || 10*h.gotH < 3*speciesH(sp) {
		return h, false
	}
	// Per-molecule amounts of the found signals must agree within a factor
	// of 4 (a set, not a coincidence of shifts).
	if h.nSig > 1 {
		lo, hi := math.Inf(1), 0.0
		for k, j := range h.ms {
			if j >= 0 {
				a := ms[j].area / float64(sp.Signals[k].H)
				lo, hi = math.Min(lo, a), math.Max(hi, a)
			}
		}
		if hi > 4*lo {
			return h, false
		}
	}
	if sp.Kind == "contaminant" {
		area, snr, known := 0.0, 0.0, true
		for _, j := range h.ms {
			if j >= 0 {
				area += ms[j].area
				snr = math.Max(snr, ms[j].snr)
				known = known && ms[j].snr > 0
			}
		}
		if scale > 0 && area*scale/float64(h.gotH) < minContaminantAmount {
			return h, false
		}
		if known && snr < minIdentifySNR {
			return h, false
		}
	}
	h.dist /= float64(h.nSig)
	h.raw /= float64(h.nSig)
	return h, true
}

func (ex *explanation) claimTable(ms []mplet, h tableHit, alt []string, scale float64) {
	name := h.sp.Name
	if len(alt) > 0 {
		name += " (or " + strings.Join(alt, ", ") + ")"
	}
	id := Identity{Name: name, Kind: h.sp.Kind, SignalsWant: len(h.sp.Signals), Signals: h.nSig,
		MatchedH: float64(h.gotH), Source: h.sp.Source}
	area := 0.0
	for _, j := range h.ms {
		if j < 0 {
			continue
		}
		ex.owner[j] = name
		area += ms[j].area
		id.PPM = append(id.PPM, ms[j].ppm)
		id.Multiplets = append(id.Multiplets, ms[j].idx)
	}
	if scale > 0 && h.sp.Kind == "contaminant" {
		ex.amounts[name] = area * scale / float64(h.gotH)
	}
	ex.found = append(ex.found, id)
}

// listLeftovers lists everything still unexplained: identified species
// (as their own rows, with the likely identity), free multiplets, and the
// excess of compound multiplets that hold clearly more H than assigned.
func (ex *explanation) listLeftovers(ms []mplet, expectH []float64, scale float64, solv SolventInfo, solvOK bool) {
	pct := func(a float64) float64 {
		if ex.total <= 0 {
			return 0
		}
		return 100 * a / ex.total
	}
	kindOf := map[string]string{}
	for _, f := range ex.found {
		kindOf[f.Name] = f.Kind
	}
	for j, m := range ms {
		o := ex.owner[j]
		switch o {
		case "compound":
			hm := m.area * scale
			excess := hm - expectH[j]
			if expectH[j] > 0 && excess > math.Max(0.5, 0.3*expectH[j]) {
				a := excess / scale
				like := likelyAt(m, solv, solvOK, false)
				u := Unexplained{PPM: m.ppm, IntegralH: excess, Percent: pct(a), Likely: like, FromPPM: m.from, ToPPM: m.to,
					Multiplicity: m.mult, Kind: "unknown", Multiplet: m.idx}
				if like != "" {
					u.Kind = "overlap"
				} else {
					ex.unknownArea += a
				}
				ex.unexplained = append(ex.unexplained, u)
			}
		case "solvent", "reference", "artifact":
		default:
			u := Unexplained{PPM: m.ppm, IntegralH: m.area * scale, Percent: pct(m.area), Likely: o, FromPPM: m.from, ToPPM: m.to,
				Multiplicity: m.mult, Kind: kindOf[o], Multiplet: m.idx}
			if o == "" {
				u.Kind = "unknown"
				if l := likelyAt(m, solv, solvOK, true); l != "" {
					u.Likely = "possibly " + l
				}
				ex.unknownArea += m.area
			}
			ex.unexplained = append(ex.unexplained, u)
		}
	}
	sort.Slice(ex.unexplained, func(a, b int) bool { return ex.unexplained[a].PPM > ex.unexplained[b].PPM })
}

// likelyAt names table species with a signal inside (or within 0.05 ppm of)
// the multiplet; with checkMult, only signals whose multiplicity the
// multiplet can have (tableMultOK).
func likelyAt(m mplet, solv SolventInfo, solvOK, checkMult bool) string {
	if !solvOK {
		return ""
	}
	var names []string
	for _, sp := range SpeciesFor(solv.Name) {
		if sp.Kind == "reference" {
			continue
		}
		for _, sg := range sp.Signals {
			p := sg.PPM[solv.Name]
			if p >= m.from-0.05 && p <= m.to+0.05 && (!checkMult || tableMultOK(sg.Mult, m.mult)) {
				names = append(names, sp.Name)
				break
			}
		}
	}
	if len(names) > 3 {
		names = append(names[:3], "…")
	}
	return strings.Join(names, " or ")
}

// molar converts the found amounts into a molar composition: compound 1
// molecule per amounts-unit.
func (ex *explanation) molar(compound string) (pct float64, comps []Component) {
	sum := 1.0
	names := make([]string, 0, len(ex.amounts))
	for n, a := range ex.amounts {
		sum += a
		names = append(names, n)
	}
	sort.Strings(names)
	comps = append(comps, Component{Name: compound, MolPercent: 100 / sum})
	for _, n := range names {
		comps = append(comps, Component{Name: n, MolPercent: 100 * ex.amounts[n] / sum})
	}
	return 100 / sum, comps
}

func fmtH(h float64) string { return fmt.Sprintf("%.1f H", h) }

// splitHiddenLines finds sharp table singlets (water, common solvents)
// that processing grouped into a compound multiplet: a peak of the
// multiplet lying outside the predicted extent of the one signal given to it
// (more than 3 Hz beyond its outermost predicted line), below 30 % of the
// multiplet's tallest peak, and within the
// species' tolerance of a tabulated singlet. Such a peak becomes a multiplet
// of its own (area by its share of height × width), appended to a copy of
// ms, and is taken from the host's area. pre is extended to match.
func splitHiddenLines(pred *predict.Prediction, sig []predict.Signal, ms []mplet, pre []string, sigM []int,
	field float64, solv SolventInfo, solvOK bool) ([]mplet, []string) {
	if !solvOK || field <= 0 {
		return ms, pre
	}
	singlets := tableSinglets(solv)
	host := make([]int, len(ms))
	for j := range host {
		host[j] = -1
	}
	for i, j := range sigM {
		if j < 0 {
			continue
		}
		if host[j] == -1 {
			host[j] = i
		} else {
			host[j] = -2 // shared: extent unclear
		}
	}
	out, pre2 := ms, pre
	copied := false
	for j, i := range host {
		if i < 0 || len(ms[j].pk) < 2 {
			continue
		}
		half := lineExtent(pred, sig[i]) + 3/field
		var hw, top float64
		for _, p := range ms[j].pk {
			hw += p.Intensity * math.Max(p.WidthHz, 0.1)
			top = math.Max(top, p.Intensity)
		}
		for _, p := range ms[j].pk {
			// A hidden line is a minor one: the multiplet's own lines are
			// the tall ones.
			if math.Abs(p.PPM-ms[j].ppm) <= half || hw <= 0 || p.Intensity > 0.3*top {
				continue
			}
			near := false
			for _, x := range singlets {
				if math.Abs(p.PPM-x) <= DefaultImpurityTol {
					near = true
				}
			}
			if !near {
				continue
			}
			if !copied {
				out = append([]mplet(nil), ms...)
				pre2 = append([]string(nil), pre...)
				copied = true
			}
			a := ms[j].area * p.Intensity * math.Max(p.WidthHz, 0.1) / hw
			w := math.Max(p.WidthHz, 1) / field
			out[j].area -= a
			out = append(out, mplet{idx: ms[j].idx, ppm: p.PPM, from: p.PPM - 2*w, to: p.PPM + 2*w, area: a, mult: "s",
				snr: p.SNR, pk: []spectrum.Peak{p}})
			pre2 = append(pre2, "")
		}
	}
	return out, pre2
}

// lineExtent is the largest distance (ppm) of a signal's predicted lines
// from its shift, counting lines above 2 % of its tallest.
func lineExtent(pred *predict.Prediction, s predict.Signal) float64 {
	top := 0.0
	for _, l := range pred.Lines {
		if l.Signal == s.Label {
			top = math.Max(top, l.Intensity)
		}
	}
	ext := 0.0
	for _, l := range pred.Lines {
		if l.Signal == s.Label && l.Intensity >= 0.02*top {
			ext = math.Max(ext, math.Abs(l.PPM-s.ShiftPPM))
		}
	}
	return ext
}
