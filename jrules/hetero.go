package jrules

import "shiftwise/graph"

// ToHetero returns the coupling between proton p and the fluorine or
// phosphorus atom atom. ok is false for any other element, for protons more
// than five bonds away, and for exchangeable protons (OH, NH, SH), whose
// heteronuclear couplings are averaged by exchange.
func ToHetero(m *graph.Mol, p graph.Proton, atom int) (J, bool) {
	if !validAtom(m, p.Atom) || !validAtom(m, atom) {
		return J{}, false
	}
	el := m.Atoms[atom].Element
	if el != "F" && el != "P" {
		return J{}, false
	}
	if p.Atom == atom && el == "P" {
		if phosphorusV(m, atom) {
			return hp1V.j(1), true
		}
		return hp1III.j(1), true
	}
	if isHetero(m, p.Atom) {
		return J{}, false
	}
	path := shortestPath(m, p.Atom, atom, 4)
	if len(path) < 2 {
		return J{}, false
	}
	if el == "F" {
		return toFluorine(m, p, path), true
	}
	return toPhosphorus(m, path), true
}

// toFluorine returns J(H,F) for the proton on path[0] and F at the end.
func toFluorine(m *graph.Mol, p graph.Proton, path []int) J {
	n := len(path) // bonds between H and F
	c := path[0]
	switch n {
	case 2:
		if hyb(m, c) == 2 {
			return hf2sp2.j(2)
		}
		switch countNeighbors(m, c, "F") {
		case 2:
			return hf2CF2.j(2)
		case 3:
			return hf2CF3.j(2)
		}
		return hf2sp3.j(2)
	case 3:
		return hf3(m, p, path)
	case 4:
		if allAromatic(m, path[:3]) {
			return hf4Meta.j(4)
		}
		return hf4.j(4)
	}
	if allAromatic(m, path[:4]) {
		return hf5Para.j(5)
	}
	return hf5.j(5)
}

// hf3 returns ³J(H,F) for H–C–X–F.
func hf3(m *graph.Mol, p graph.Proton, path []int) J {
	c, x, f := path[0], path[1], path[2]
	switch bondKind(m, c, x) {
	case 'a':
		return hf3Ortho.j(3)
	case '2':
		if v, ok := m.AlkeneView(p); ok {
			switch f {
			case v.Trans:
				return hf3Trans.j(3)
			case v.Cis:
				return hf3Cis.j(3)
			}
		}
		return hf3Vinyl.j(3)
	}
	if m.Atoms[x].Element != "C" || hyb(m, x) != 3 {
		return hf3Other.j(3)
	}
	switch countNeighbors(m, x, "F") {
	case 1:
		return hf3CF.j(3)
	case 2:
		return hf3CF2.j(3)
	}
	return hf3CF3.j(3)
}

// toPhosphorus returns J(H,P) for the proton on path[0] and P at the end.
func toPhosphorus(m *graph.Mol, path []int) J {
	n := len(path)
	pAtom := path[n-1]
	v := phosphorusV(m, pAtom)
	switch n {
	case 2:
		if v {
			return hp2V.j(2)
		}
		return hp2III.j(2)
	case 3:
		c, x := path[0], path[1]
		switch {
		case m.Atoms[x].Element == "O":
			return hp3O.j(3)
		case bondKind(m, c, x) == 'a' && v:
			return hp3OrthoV.j(3)
		case bondKind(m, c, x) == 'a':
			return hp3OrthoI.j(3)
		case bondKind(m, c, x) == '2':
			return hp3Vinyl.j(3)
		case v:
			return hp3V.j(3)
		}
		return hp3III.j(3)
	case 4:
		if allAromatic(m, path[:3]) {
			return hp4Meta.j(4)
		}
		return hp4.j(4)
	}
	if allAromatic(m, path[:4]) {
		return hp5Para.j(5)
	}
	return hp5.j(5)
}

// phosphorusV reports whether P is pentavalent/phosphonium-like: a double
// bond to O, S or N, or four or more neighbours.
func phosphorusV(m *graph.Mol, p int) bool {
	if hasDoubleTo(m, p, "O") || hasDoubleTo(m, p, "S") || hasDoubleTo(m, p, "N") {
		return true
	}
	return m.Degree(p)+m.Atoms[p].HCount() >= 4
}

func countNeighbors(m *graph.Mol, a int, el string) int {
	k := 0
	for _, n := range m.Neighbors(a) {
		if m.Atoms[n].Element == el {
			k++
		}
	}
	return k
}

// allAromatic reports whether consecutive atoms of path are joined by
// aromatic bonds.
func allAromatic(m *graph.Mol, path []int) bool {
	for i := 1; i < len(path); i++ {
		if bondKind(m, path[i-1], path[i]) != 'a' {
			return false
		}
	}
	return true
}
