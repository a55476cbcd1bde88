package jrules

import "shiftwise/graph"

// geminal returns ²J between two protons on atom a.
func geminal(m *graph.Mol, a int) (J, bool) {
	if m.Atoms[a].Element != "C" {
		return J{}, false // NH2 and the like: exchange-averaged
	}
	switch hyb(m, a) {
	case 2:
		return gemSP2.j(2), true
	case 1:
		return J{}, false
	}
	if r := ringThrough3(m, a); r {
		return gemSP3Ring3.j(2), true
	}
	for _, n := range m.Neighbors(a) {
		if hyb(m, n) < 3 {
			return gemSP3Pi.j(2), true
		}
	}
	return gemSP3.j(2), true
}

// ringThrough3 reports whether atom a is in a three-membered ring.
func ringThrough3(m *graph.Mol, a int) bool {
	nb := m.Neighbors(a)
	for i := range nb {
		for j := i + 1; j < len(nb); j++ {
			if m.BondBetween(nb[i], nb[j]) >= 0 {
				return true
			}
		}
	}
	return false
}

// vicinal returns ³J for protons on the bonded atoms path[0], path[1].
func vicinal(m *graph.Mol, p, q graph.Proton, path []int) J {
	a, b := path[0], path[1]
	if isHetero(m, a) || isHetero(m, b) {
		return vicinalHetero(m, a, b)
	}
	switch bondKind(m, a, b) {
	case 'a':
		return aromaticPair(m, path)
	case '2':
		return vinyl(m, p, q, a, b)
	}
	ha, hb := hyb(m, a), hyb(m, b)
	switch {
	case isCHO(m, a) || isCHO(m, b):
		other := b
		if isCHO(m, b) {
			other = a
		}
		if hyb(m, other) == 3 {
			return vicCHOsp3.j(3)
		}
		return vicCHOsp2.j(3)
	case ha == 3 && hb == 3:
		return vicinalSP3(m, path)
	case ha == 3 && hb == 2 || ha == 2 && hb == 3:
		if r := ringThrough(m, path, 6); r != nil {
			return vicAllylRng.j(3)
		}
		return vicAllylic.j(3)
	case ha == 2 && hb == 2:
		return vicDiene.j(3)
	}
	return vicOther.j(3)
}

// vicinalHetero returns ³J for H–X–C–H with X = O, N or S.
func vicinalHetero(m *graph.Mol, a, b int) J {
	x, c := a, b
	if !isHetero(m, a) {
		x, c = b, a
	}
	switch m.Atoms[x].Element {
	case "O":
		return vicOH.j(3)
	case "S":
		return vicSH.j(3)
	case "N":
		switch {
		case hyb(m, c) == 2 && !isAmideN(m, x):
			return vicNHarom.j(3)
		case isAmideN(m, x):
			return vicNHamide.j(3)
		}
		return vicNH.j(3)
	}
	return vicNH2NH.j(3)
}

// vicinalSP3 returns ³J between protons on two bonded sp3 carbons: ring
// values in small rings, the Karplus chair average in six-membered rings,
// and the electronegativity-corrected rotamer average in open chains.
func vicinalSP3(m *graph.Mol, path []int) J {
	if r := ringThrough(m, path, 6); r != nil {
		switch len(r) {
		case 3:
			return vicRing3.j(3)
		case 4:
			return vicRing4.j(3)
		case 5:
			return vicRing5.j(3)
		case 6:
			return chairAverage()
		}
	}
	a, b := path[0], path[1]
	sum := 0.0
	for _, n := range m.Neighbors(a) {
		if n != b {
			sum += deltaChi(m.Atoms[n].Element)
		}
	}
	for _, n := range m.Neighbors(b) {
		if n != a {
			sum += deltaChi(m.Atoms[n].Element)
		}
	}
	t := clamp(vicEthane-vicSlope*sum, 5.5, 9.0)
	return J{Typical: t, Min: t - vicSpread, Max: t + vicSpread, NBonds: 3,
		Rule: "3J vicinal sp3, freely rotating, electronegativity-corrected"}
}

// chairAverage returns the vicinal ³J between CH2/CH protons of a rapidly
// flipping six-membered ring whose relative configuration is not known:
// trans pairs average J(180°) and J(60°), cis pairs J(60°) twice, and the
// two are equally likely.
func chairAverage() J {
	aa, g := Karplus(180), Karplus(60)
	t := (aa + 3*g) / 4
	return J{Typical: t, Min: g - 0.5, Max: aa + 2, NBonds: 3,
		Rule: "3J six-membered ring, Karplus chair average"}
}

// vinyl returns ³J across the C=C bond a=b.
func vinyl(m *graph.Mol, p, q graph.Proton, a, b int) J {
	if r := ringThrough(m, []int{a, b}, 7); r != nil {
		return vinylRingCis[len(r)].j(3)
	}
	var inc vinylIncrement
	for _, end := range [2][2]int{{a, b}, {b, a}} {
		for _, n := range m.Neighbors(end[0]) {
			if n == end[1] {
				continue
			}
			v := vinylIncrements[substituentClass(m, n, end[0])]
			inc.cis += v.cis
			inc.trans += v.trans
		}
	}
	cis := clamp(vinylCis0+inc.cis, 4, 12.5)
	trans := clamp(vinylTrans0+inc.trans, 11, 19.1)
	var j J
	switch m.ProtonRelation(p, q) {
	case graph.RelCis:
		j = J{cis, cis - vinylSpread, cis + vinylSpread, 3, "3J vinyl cis, substituent-corrected"}
	case graph.RelTrans:
		j = J{trans, trans - vinylSpread, trans + vinylSpread, 3, "3J vinyl trans, substituent-corrected"}
	default:
		return vinylUnknown.j(3)
	}
	if v, ok := m.AlkeneView(p); ok && !v.Known {
		// The geometry was assumed (no / \ marks): the range covers both.
		j.Min, j.Max = cis-vinylSpread, trans+vinylSpread
		j.Rule += " (geometry not written, E assumed)"
	}
	return j
}

// substituentClass names the kind of substituent atom n on alkene carbon c
// for the vinyl increments.
func substituentClass(m *graph.Mol, n, c int) string {
	switch el := m.Atoms[n].Element; el {
	case "C":
		switch {
		case m.Atoms[n].Aromatic:
			return "aryl"
		case hasDoubleTo(m, n, "O") || hasDoubleTo(m, n, "S") || hasDoubleTo(m, n, "N"):
			return "carbonyl"
		case hyb(m, n) == 1:
			return "nitrile"
		case hyb(m, n) == 2:
			return "vinyl"
		}
		return "alkyl"
	case "O":
		for _, x := range m.Neighbors(n) {
			if x != c && hasDoubleTo(m, x, "O") {
				return "OC(=O)"
			}
		}
		return "O"
	case "N", "S", "F", "Cl", "Br", "I":
		return el
	}
	return "other"
}

// aromaticPair returns the ortho (path of 2 atoms), meta (3) or para (4)
// coupling within one aromatic ring (ortho only in a seven-membered one),
// or an unresolved long-range value when the path does not lie in one
// five-, six- or seven-membered ring.
func aromaticPair(m *graph.Mol, path []int) J {
	n := len(path) + 1 // number of bonds between the protons
	ring := ringThrough(m, path, 6)
	if ring == nil && len(path) == 2 {
		if r7 := ringThrough(m, path, 7); len(r7) == 7 {
			return ar7Ortho.j(n) // azulene, tropylium, tropolone
		}
	}
	if ring == nil || len(ring) < 5 {
		return unresolved(n)
	}
	het := ringHeteroatoms(m, ring)
	if len(ring) == 5 {
		return fiveRingPair(m, path, het)
	}
	if len(het) == 0 {
		return [...]rule{arOrtho, arMeta, arPara}[len(path)-2].j(n)
	}
	nextToN := adjacentToAny(m, path[0], het) || adjacentToAny(m, path[len(path)-1], het)
	switch len(path) {
	case 2:
		if nextToN {
			return pyJ23.j(n)
		}
		return pyJ34.j(n)
	case 3:
		switch {
		case isIn(path[1], het):
			return pyJ26.j(n)
		case nextToN:
			return pyJ24.j(n)
		}
		return pyJ35.j(n)
	}
	return pyJ25.j(n)
}

// fiveRingPair returns ortho (J23/J34) and 1,3 (J24/J25) couplings in a
// five-membered aromatic ring with heteroatoms het.
func fiveRingPair(m *graph.Mol, path []int, het []int) J {
	n := len(path) + 1
	fr, ok := fiveRing{}, false
	if len(het) == 1 {
		el := m.Atoms[het[0]].Element
		if el == "Se" {
			el = "S"
		}
		fr, ok = fiveRings[el]
	}
	switch {
	case !ok && len(path) == 2:
		return azoleOrtho.j(n)
	case !ok && len(path) == 3:
		return azoleMeta.j(n)
	case len(path) == 2:
		if adjacentToAny(m, path[0], het) || adjacentToAny(m, path[1], het) {
			return fr.j23.j(n)
		}
		return fr.j34.j(n)
	case len(path) == 3:
		if isIn(path[1], het) {
			return fr.j25.j(n)
		}
		return fr.j24.j(n)
	}
	return unresolved(n)
}

func ringHeteroatoms(m *graph.Mol, ring []int) []int {
	var het []int
	for _, a := range ring {
		if m.Atoms[a].Element != "C" {
			het = append(het, a)
		}
	}
	return het
}

func adjacentToAny(m *graph.Mol, a int, set []int) bool {
	for _, x := range set {
		if m.BondBetween(a, x) >= 0 {
			return true
		}
	}
	return false
}

func isIn(a int, set []int) bool {
	for _, x := range set {
		if x == a {
			return true
		}
	}
	return false
}

func unresolved(nBonds int) J {
	if nBonds == 4 {
		return lr4Unres.j(4)
	}
	return lr5Unres.j(nBonds)
}

// fourBond returns ⁴J for protons on path[0] and path[2].
func fourBond(m *graph.Mol, path []int) J {
	a, x, b := path[0], path[1], path[2]
	k1, k2 := bondKind(m, a, x), bondKind(m, x, b)
	if isHetero(m, a) || isHetero(m, b) {
		return lr4Unres.j(4)
	}
	if k1 == 'a' && k2 == 'a' {
		return aromaticPair(m, path) // also across a ring heteroatom (J26, J25)
	}
	if isHetero(m, x) {
		return lr4Unres.j(4)
	}
	ha, hb := hyb(m, a), hyb(m, b)
	switch {
	case ha == 3 && hb == 3 && hyb(m, x) == 3:
		if r := ringThrough(m, path, 4); r != nil && len(r) == 4 {
			return lrW.j(4)
		}
	case k1 == 'a' && hb == 3, k2 == 'a' && ha == 3:
		return lrBenzylic.j(4)
	case k1 == '2' && hb == 3, k2 == '2' && ha == 3:
		return lrAllylic.j(4)
	case k1 == '3' && hb == 3, k2 == '3' && ha == 3:
		return lrPropargyl.j(4)
	case isCHO(m, a) && k2 == '2', isCHO(m, b) && k1 == '2':
		return lrCHOAllylic.j(4)
	}
	return lr4Unres.j(4)
}

// fiveBond returns ⁵J for protons on path[0] and path[3].
func fiveBond(m *graph.Mol, path []int) J {
	a, x, y, b := path[0], path[1], path[2], path[3]
	if isHetero(m, a) || isHetero(m, b) {
		return lr5Unres.j(5)
	}
	k1, k2, k3 := bondKind(m, a, x), bondKind(m, x, y), bondKind(m, y, b)
	sp3Ends := hyb(m, a) == 3 && hyb(m, b) == 3
	switch {
	case k1 == 'a' && k2 == 'a' && k3 == 'a':
		return aromaticPair(m, path)
	case k2 == '2' && sp3Ends:
		return lrHomoallyl.j(5)
	case k2 == '3' && sp3Ends:
		return lrHomoprop.j(5)
	}
	return lr5Unres.j(5)
}
