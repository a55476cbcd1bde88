package jrules

import (
	"math"
	"strings"

	"shiftwise/graph"
)

// J is an estimated scalar coupling constant in Hz. Typical is the value to
// simulate with; Min and Max bound what is commonly observed for the same
// structural relation. NBonds is the number of bonds between the coupled
// nuclei and Rule names the rule that gave the value.
type J struct {
	Typical, Min, Max float64
	NBonds            int
	Rule              string
}

// Between returns the coupling between protons p and q in CDCl3 (see
// BetweenIn). ok is false when the protons are the same, more than five
// bonds apart, or when the coupling is averaged away by exchange.
func Between(m *graph.Mol, p, q graph.Proton) (J, bool) {
	return BetweenIn(m, p, q, "CDCl3")
}

// BetweenIn returns the coupling between protons p and q of a perceived
// molecule in the named solvent. The solvent only matters for exchangeable
// protons (see the package documentation); it is matched loosely
// ("DMSO-d6", "dmso", "D2O", "CD3OD", "methanol-d4"). ok is false when the
// protons are the same, more than five bonds apart, or exchange-averaged.
func BetweenIn(m *graph.Mol, p, q graph.Proton, solvent string) (J, bool) {
	if p == q || !validAtom(m, p.Atom) || !validAtom(m, q.Atom) {
		return J{}, false
	}
	sv := solventKind(solvent)
	if !exchangeAllowed(m, p.Atom, sv) || !exchangeAllowed(m, q.Atom, sv) {
		return J{}, false
	}
	if isHetero(m, p.Atom) && isHetero(m, q.Atom) {
		return J{}, false // e.g. NH2 geminal, OH…NH: exchange-averaged
	}
	a, b := p.Atom, q.Atom
	if a == b {
		return geminal(m, a)
	}
	path := shortestPath(m, a, b, 3)
	switch len(path) - 1 {
	case 1:
		return vicinal(m, p, q, path), true
	case 2:
		return fourBond(m, path), true
	case 3:
		return fiveBond(m, path), true
	}
	return J{}, false
}

// Karplus returns the vicinal ³J in Hz for an H–C–C–H dihedral angle of
// phiDeg degrees: J = A cos²φ + B cos φ + C with the coefficients KarplusA,
// KarplusB and KarplusC.
func Karplus(phiDeg float64) float64 {
	c := math.Cos(phiDeg * math.Pi / 180)
	return KarplusA*c*c + KarplusB*c + KarplusC
}

func validAtom(m *graph.Mol, a int) bool { return a >= 0 && a < len(m.Atoms) }

// solvent classes for exchangeable protons.
const (
	solvInert      = iota // CDCl3, C6D6, acetone-d6…: OH/amine NH averaged
	solvSlow              // DMSO-d6: OH and NH couplings resolved
	solvExchanging        // D2O, CD3OD: OH/NH/SH replaced by D
)

func solventKind(s string) int {
	l := strings.ToLower(s)
	switch {
	case strings.Contains(l, "dmso"):
		return solvSlow
	case strings.Contains(l, "d2o"), strings.Contains(l, "cd3od"),
		strings.Contains(l, "methanol"), strings.Contains(l, "meod"):
		return solvExchanging
	}
	return solvInert
}

// isHetero reports whether a is not carbon (its hydrogens are exchangeable
// or at least not C–H).
func isHetero(m *graph.Mol, a int) bool { return m.Atoms[a].Element != "C" }

// exchangeAllowed reports whether a proton on atom a can show a resolved
// coupling in the solvent class sv.
func exchangeAllowed(m *graph.Mol, a int, sv int) bool {
	switch m.Atoms[a].Element {
	case "C":
		return true
	case "O":
		if isAcidOH(m, a) || sv != solvSlow {
			return false
		}
		return true
	case "N":
		if sv == solvExchanging {
			return false
		}
		return sv == solvSlow || isAmideN(m, a)
	case "S":
		return sv != solvExchanging
	}
	return false
}

// isAcidOH reports whether O is the OH of a carboxylic (or other oxo) acid.
func isAcidOH(m *graph.Mol, o int) bool {
	for _, n := range m.Neighbors(o) {
		if hasDoubleTo(m, n, "O") || hasDoubleTo(m, n, "S") {
			return true
		}
	}
	return false
}

// isAmideN reports whether N is bonded to a C(=O) or S(=O).
func isAmideN(m *graph.Mol, nAtom int) bool {
	for _, n := range m.Neighbors(nAtom) {
		if hasDoubleTo(m, n, "O") {
			return true
		}
	}
	return false
}

// hasDoubleTo reports whether atom a has a non-aromatic double bond to an
// atom of element el.
func hasDoubleTo(m *graph.Mol, a int, el string) bool {
	for _, bi := range m.BondsOf(a) {
		b := &m.Bonds[bi]
		if b.Order == 2 && !b.Aromatic && m.Atoms[b.Other(a)].Element == el {
			return true
		}
	}
	return false
}

// hyb returns 1 (sp), 2 (sp2 or aromatic) or 3 (sp3) from the bond orders.
func hyb(m *graph.Mol, a int) int {
	if m.Atoms[a].Aromatic {
		return 2
	}
	doubles := 0
	for _, bi := range m.BondsOf(a) {
		b := &m.Bonds[bi]
		switch {
		case b.Order >= 3:
			return 1
		case b.Order == 2 || b.Aromatic:
			doubles++
		}
	}
	switch {
	case doubles >= 2:
		return 1
	case doubles == 1:
		return 2
	}
	return 3
}

// bondKind classifies the bond between a and b: 'a' aromatic, '1', '2', '3'.
func bondKind(m *graph.Mol, a, b int) byte {
	bi := m.BondBetween(a, b)
	if bi < 0 {
		return 0
	}
	bd := &m.Bonds[bi]
	switch {
	case bd.Aromatic:
		return 'a'
	case bd.Order == 2:
		return '2'
	case bd.Order >= 3:
		return '3'
	}
	return '1'
}

// isCHO reports whether a is an aldehyde (formyl) carbon: C(=O) with H.
func isCHO(m *graph.Mol, a int) bool {
	return m.Atoms[a].Element == "C" && m.Atoms[a].HCount() > 0 && hasDoubleTo(m, a, "O")
}

// shortestPath returns the atoms of a shortest path from a to b (both
// included) of at most maxLen bonds, or nil.
func shortestPath(m *graph.Mol, a, b, maxLen int) []int {
	return pathAvoiding(m, a, b, maxLen, nil, false)
}

// pathAvoiding is a breadth-first search from a to b of at most maxLen
// bonds that never enters the atoms in avoid and, when noDirect is set,
// does not use the bond a–b itself.
func pathAvoiding(m *graph.Mol, a, b, maxLen int, avoid []int, noDirect bool) []int {
	if a == b {
		return []int{a}
	}
	type node struct{ atom, parent, depth int }
	queue := []node{{a, -1, 0}}
	seen := make([]bool, len(m.Atoms))
	seen[a] = true
	for _, x := range avoid {
		seen[x] = true
	}
	for i := 0; i < len(queue); i++ {
		cur := queue[i]
		if cur.depth == maxLen {
			continue
		}
		for _, n := range m.Neighbors(cur.atom) {
			if n == b && !(noDirect && cur.atom == a) {
				path := []int{b}
				for j := i; j >= 0; j = queue[j].parent {
					path = append(path, queue[j].atom)
				}
				reverse(path)
				return path
			}
			if !seen[n] && n != b {
				seen[n] = true
				queue = append(queue, node{n, i, cur.depth + 1})
			}
		}
	}
	return nil
}

func reverse(s []int) {
	for i, j := 0, len(s)-1; i < j; i, j = i+1, j-1 {
		s[i], s[j] = s[j], s[i]
	}
}

// ringThrough returns the atoms of the smallest ring of at most maxSize
// atoms that contains the consecutive atoms of path, in ring order starting
// with path, or nil.
func ringThrough(m *graph.Mol, path []int, maxSize int) []int {
	n := len(path)
	back := maxSize - n + 1 // bonds left to close the ring
	if back < 1 {
		return nil
	}
	ret := pathAvoiding(m, path[n-1], path[0], back, path[1:n-1], n == 2)
	if ret == nil || len(ret) < 2 {
		return nil
	}
	ring := append([]int(nil), path...)
	return append(ring, ret[1:len(ret)-1]...)
}

// electronegativity holds Pauling electronegativities (CRC Handbook of
// Chemistry and Physics, value from memory).
var electronegativity = map[string]float64{
	"H": 2.20, "Li": 0.98, "B": 2.04, "C": 2.55, "N": 3.04, "O": 3.44, "F": 3.98,
	"Si": 1.90, "P": 2.19, "S": 2.58, "Cl": 3.16, "Se": 2.55, "Br": 2.96,
	"Sn": 1.96, "I": 2.66, "Mg": 1.31, "Na": 0.93, "K": 0.82,
}

// deltaChi returns χ(element) − χ(H), 0 for unknown elements.
func deltaChi(el string) float64 {
	if x, ok := electronegativity[el]; ok {
		return x - electronegativity["H"]
	}
	return 0
}

func clamp(x, lo, hi float64) float64 { return math.Max(lo, math.Min(hi, x)) }
