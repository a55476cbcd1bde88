package shiftinc

import "shiftwise/graph"

// view wraps a molecule with the small queries the rules need. It caches
// the aromatic rings, so one view serves all protons of a call.
type view struct {
	m     *graph.Mol
	arom  [][]int // SSSR rings whose atoms are all aromatic
	rings [][]int
	nb    [][]int // neighbours of each atom, filled on first use
}

// nbrs returns the non-hydrogen neighbours of a (cached; must not be
// modified). Hydrogen atoms kept in the graph (isotopes written as [2H] or
// [3H]) are left out: for the increments they are hydrogens, counted by h.
func (v *view) nbrs(a int) []int {
	if v.nb[a] == nil {
		nb := []int{}
		for _, x := range v.m.Neighbors(a) {
			if !v.isH(x) {
				nb = append(nb, x)
			}
		}
		v.nb[a] = nb
	}
	return v.nb[a]
}

// isH reports whether atom a is a hydrogen kept as an atom (deuterium,
// tritium).
func (v *view) isH(a int) bool { return a >= 0 && v.m.Atoms[a].Element == "H" }

func newView(m *graph.Mol) *view {
	v := &view{m: m, rings: m.Rings(), nb: make([][]int, len(m.Atoms))}
	for _, r := range v.rings {
		all := true
		for _, a := range r {
			if !m.Atoms[a].Aromatic {
				all = false
				break
			}
		}
		if all {
			v.arom = append(v.arom, r)
		}
	}
	return v
}

func (v *view) el(a int) string { return v.m.Atoms[a].Element }

// h counts the hydrogens on a: implicit and bracket H plus hydrogen atoms
// (deuterium, tritium) bonded to it, which shift a proton like H does.
func (v *view) h(a int) int {
	n := v.m.Atoms[a].HCount()
	for _, bi := range v.m.BondsOf(a) {
		if v.isH(v.m.Bonds[bi].Other(a)) {
			n++
		}
	}
	return n
}
func (v *view) arom1(a int) bool {
	return v.m.Atoms[a].Aromatic
}

// order returns the Kekulé order of the bond a–b (0 when not bonded).
func (v *view) order(a, b int) int {
	bi := v.m.BondBetween(a, b)
	if bi < 0 {
		return 0
	}
	return v.m.Bonds[bi].Order
}

// doubleTo returns the first neighbour of a joined by a double bond whose
// element is one of els (any element when els is empty), or -1.
func (v *view) doubleTo(a int, els ...string) int {
	for _, bi := range v.m.BondsOf(a) {
		b := &v.m.Bonds[bi]
		if b.Order != 2 || b.Aromatic {
			continue
		}
		x := b.Other(a)
		if len(els) == 0 {
			return x
		}
		for _, e := range els {
			if v.el(x) == e {
				return x
			}
		}
	}
	return -1
}

// tripleTo returns the neighbour of a across a triple bond, or -1.
func (v *view) tripleTo(a int) int {
	for _, bi := range v.m.BondsOf(a) {
		if v.m.Bonds[bi].Order == 3 {
			return v.m.Bonds[bi].Other(a)
		}
	}
	return -1
}

// carbonyl reports whether a is a carbon with a double bond to O or S
// (outside aromatic rings counts too: c=o of pyridones).
func (v *view) carbonyl(a int) bool {
	if v.el(a) != "C" {
		return false
	}
	for _, bi := range v.m.BondsOf(a) {
		b := &v.m.Bonds[bi]
		x := b.Other(a)
		if b.Order == 2 && (v.el(x) == "O" || v.el(x) == "S") && !v.arom1(x) {
			return true
		}
	}
	return false
}

// sulfonyl reports whether a is S or P with at least one double bond to O.
func (v *view) sulfonyl(a int) bool {
	return (v.el(a) == "S" || v.el(a) == "P") && v.doubleTo(a, "O") >= 0
}

// aromRing returns the smallest all-aromatic ring containing a, or nil.
func (v *view) aromRing(a int) []int {
	var best []int
	for _, r := range v.arom {
		for _, x := range r {
			if x == a && (best == nil || len(r) < len(best)) {
				best = r
			}
		}
	}
	return best
}

// shareAromRing reports whether a and b lie on one aromatic ring.
func (v *view) shareAromRing(a, b int) bool {
	for _, r := range v.arom {
		ia, ib := false, false
		for _, x := range r {
			ia = ia || x == a
			ib = ib || x == b
		}
		if ia && ib {
			return true
		}
	}
	return false
}

// shareRing reports whether all the given atoms lie on one SSSR ring.
func (v *view) shareRing(atoms ...int) bool {
	for _, r := range v.rings {
		n := 0
		for _, a := range atoms {
			for _, x := range r {
				if x == a {
					n++
					break
				}
			}
		}
		if n == len(atoms) {
			return true
		}
	}
	return false
}

func heteroRing(v *view, r []int) bool {
	for _, a := range r {
		if v.el(a) != "C" {
			return true
		}
	}
	return false
}

// classify names the substituent that starts at atom x, seen from atom
// from, as a chain of table keys from the most specific to the most
// generic; lookups take the first key present in a section. The chain
// always ends in "other".
func (v *view) classify(from, x int) []string {
	keys := v.classifyAtom(from, x)
	return append(keys, "other")
}

func (v *view) classifyAtom(from, x int) []string {
	switch v.el(x) {
	case "C":
		return v.classifyCarbon(from, x)
	case "N":
		return v.classifyN(from, x)
	case "O":
		return v.classifyO(from, x)
	case "S":
		return v.classifyS(from, x)
	case "F", "Cl", "Br", "I", "P", "Si", "B", "Sn":
		return []string{v.el(x)}
	}
	return []string{v.el(x)}
}

func (v *view) classifyCarbon(from, x int) []string {
	if v.arom1(x) {
		if r := v.aromRing(x); r != nil && heteroRing(v, r) {
			return []string{"heteroaryl", "aryl"}
		}
		return []string{"aryl"}
	}
	if y := v.tripleTo(x); y >= 0 {
		if v.el(y) == "N" {
			return []string{"CN"}
		}
		return []string{"C≡C"}
	}
	if v.carbonyl(x) {
		return v.classifyCarbonyl(from, x)
	}
	if y := v.doubleTo(x); y >= 0 {
		switch v.el(y) {
		case "C":
			return []string{"C=C"}
		case "N":
			return []string{"C=N"}
		}
		return []string{"C=" + v.el(y)}
	}
	return v.classifySp3(from, x)
}

func (v *view) classifyCarbonyl(from, x int) []string {
	if v.doubleTo(x, "S") >= 0 && v.doubleTo(x, "O") < 0 {
		return []string{"C=S"}
	}
	o := v.doubleTo(x, "O")
	var keys []string
	others := 0
	for _, y := range v.nbrs(x) {
		if y == from || y == o {
			continue
		}
		others++
		switch v.el(y) {
		case "O":
			switch {
			case v.m.Atoms[y].Charge < 0:
				keys = append(keys, "COO-")
			case v.h(y) > 0:
				keys = append(keys, "COOH")
			default:
				keys = append(keys, "COOR")
			}
		case "N":
			keys = append(keys, "CONR2")
		case "Cl", "Br", "F", "I":
			keys = append(keys, "COCl")
		case "S":
			keys = append(keys, "COSR")
		case "C":
			if v.arom1(y) {
				keys = append(keys, "COAr", "COR")
			} else {
				keys = append(keys, "COR")
			}
		}
	}
	if others == 0 {
		return []string{"CHO"}
	}
	if len(keys) == 0 {
		return []string{"COR"}
	}
	return keys
}

// classifySp3 names an sp3 carbon substituent. "alkyl" ends every chain.
func (v *view) classifySp3(from, x int) []string {
	var nF, nHal, nI, nO, nN, nS, nCO, nAr int
	for _, y := range v.nbrs(x) {
		if y == from {
			continue
		}
		switch v.el(y) {
		case "F":
			nF++
		case "Cl", "Br":
			nHal++
		case "I":
			nI++
		case "O":
			nO++
		case "N":
			nN++
		case "S":
			nS++
		case "C":
			switch {
			case v.arom1(y):
				nAr++
			case v.carbonyl(y) || v.tripleTo(y) >= 0 && v.el(v.tripleTo(y)) == "N":
				nCO++
			}
		}
	}
	var keys []string
	switch {
	case nF >= 2:
		keys = append(keys, "CF3")
	case nHal+nF >= 2:
		keys = append(keys, "CX3")
	}
	switch {
	case nO > 0:
		keys = append(keys, "CH2O")
	case nN > 0:
		keys = append(keys, "CH2N")
	case nS > 0:
		keys = append(keys, "CH2S")
	case nHal > 0 || nF > 0:
		keys = append(keys, "CH2Hal")
	case nI > 0:
		keys = append(keys, "CH2I")
	case nCO > 0:
		keys = append(keys, "CH2C=O")
	case nAr > 0:
		keys = append(keys, "CH2Ar")
	}
	if v.h(x) == 3 {
		keys = append(keys, "CH3")
	}
	return append(keys, "alkyl")
}

func (v *view) classifyN(from, x int) []string {
	a := &v.m.Atoms[x]
	if a.Aromatic {
		return []string{"N-heteroaryl", "amine"}
	}
	if a.Charge > 0 {
		nO := 0
		for _, y := range v.nbrs(x) {
			if v.el(y) == "O" {
				nO++
			}
		}
		if nO >= 2 {
			return []string{"NO2"}
		}
		if y := v.doubleTo(x, "N"); y >= 0 {
			return []string{"N3"}
		}
		return []string{"N+"}
	}
	if y := v.doubleTo(x); y >= 0 {
		switch v.el(y) {
		case "C":
			return []string{"N=C"}
		case "N":
			if v.m.Atoms[y].Charge > 0 {
				return []string{"N3"}
			}
			return []string{"N=N"}
		case "O":
			return []string{"N=O"}
		}
	}
	arom, hetArom, amidine, enamine := false, false, false, false
	var hetero []string
	for _, y := range v.nbrs(x) {
		if y == from {
			continue
		}
		switch v.el(y) {
		case "N":
			if v.doubleTo(y) >= 0 || v.m.Atoms[y].Charge > 0 {
				hetero = append(hetero, "N-N=")
			}
			hetero = append(hetero, "N-N")
		case "O":
			hetero = append(hetero, "N-O")
		case "P":
			hetero = append(hetero, "N-P")
		}
		if v.carbonyl(y) {
			return []string{"NC(=O)"}
		}
		if v.sulfonyl(y) {
			return []string{"NSO2", "NC(=O)"}
		}
		switch {
		case v.arom1(y):
			arom = true
			if r := v.aromRing(y); r != nil && heteroRing(v, r) {
				hetArom = true
			}
		case v.el(y) == "C" && v.doubleTo(y, "N") >= 0:
			amidine = true
		case v.el(y) == "C" && v.doubleTo(y, "C") >= 0:
			enamine = true
		}
	}
	keys := hetero
	switch {
	case amidine:
		keys = append(keys, "N-C=N")
	case hetArom:
		keys = append(keys, "NHetAr", "NAr")
	case arom:
		keys = append(keys, "NAr")
	case enamine:
		keys = append(keys, "N-C=C")
	}
	switch v.h(x) {
	case 2:
		keys = append(keys, "NH2")
	case 1:
		keys = append(keys, "NHR")
	default:
		keys = append(keys, "NR2")
	}
	return append(keys, "amine")
}

func (v *view) classifyO(from, x int) []string {
	if v.m.Atoms[x].Charge < 0 {
		return []string{"O-"}
	}
	if v.h(x) > 0 {
		return []string{"OH"}
	}
	for _, y := range v.nbrs(x) {
		if y == from {
			continue
		}
		switch {
		case v.carbonyl(y):
			for _, z := range v.nbrs(y) {
				if z != x && v.arom1(z) {
					return []string{"OC(=O)Ar", "OC(=O)R"}
				}
			}
			return []string{"OC(=O)R"}
		case v.sulfonyl(y):
			return []string{"OSO2", "OR"}
		case v.arom1(y):
			return []string{"OAr", "OR"}
		case v.el(y) == "C" && v.doubleTo(y, "C") >= 0:
			return []string{"OR-conj", "OR"}
		case v.el(y) == "C" && v.h(y) == 3:
			return []string{"OCH3", "OR"}
		}
	}
	return []string{"OR"}
}

func (v *view) classifyS(from, x int) []string {
	nDO := 0
	for _, bi := range v.m.BondsOf(x) {
		b := &v.m.Bonds[bi]
		if b.Order == 2 && v.el(b.Other(x)) == "O" {
			nDO++
		}
	}
	if v.arom1(x) {
		return []string{"heteroaryl"}
	}
	switch {
	case nDO >= 2:
		for _, y := range v.nbrs(x) {
			if y == from || v.order(x, y) == 2 {
				continue
			}
			switch v.el(y) {
			case "N":
				return []string{"SO2N", "SO2R"}
			case "O":
				return []string{"SO3R", "SO2R"}
			case "Cl", "F":
				return []string{"SO2Cl", "SO2R"}
			}
		}
		return []string{"SO2R"}
	case nDO == 1:
		return []string{"S(=O)R"}
	case v.h(x) > 0:
		return []string{"SH"}
	}
	for _, y := range v.nbrs(x) {
		if y != from && v.arom1(y) {
			return []string{"SAr", "SR"}
		}
	}
	return []string{"SR"}
}

// conjugating reports whether substituent atom x (on alkene carbon from)
// is a π group that conjugates with the double bond.
func (v *view) conjugating(from, x int) bool {
	if v.arom1(x) || v.carbonyl(x) || v.tripleTo(x) >= 0 {
		return true
	}
	return v.el(x) == "C" && v.doubleTo(x) >= 0
}
