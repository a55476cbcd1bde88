package smiles

import "shiftwise/graph"

// build turns the parsed atoms and bonds into a graph.Mol, folding [H]
// atoms bonded to exactly one heavy atom into that atom's ExplicitH, and
// keeping each atom's neighbours in written order (ring bonds where their
// digit stood), which tetrahedral marks refer to.
func (p *parser) build() *graph.Mol {
	fold := p.foldableH()
	m := &graph.Mol{Source: p.src, Atoms: make([]graph.Atom, 0, len(p.atoms)), Bonds: make([]graph.Bond, 0, len(p.bonds))}
	newIdx := make([]int, len(p.atoms))
	for i, a := range p.atoms {
		newIdx[i] = -1
		if !fold[i] {
			newIdx[i] = m.AddAtom(a)
		}
	}
	bondIdx := make([]int, len(p.bonds))
	var hdirs []hDir
	for bi, b := range p.bonds {
		bondIdx[bi] = -1
		switch {
		case fold[b.a]:
			p.foldInto(m, newIdx[b.b], b.b, bi)
			if b.dir != graph.DirNone {
				hdirs = append(hdirs, hDir{newIdx[b.b], flipDir(b.dir)})
			}
		case fold[b.b]:
			p.foldInto(m, newIdx[b.a], b.a, bi)
			if b.dir != graph.DirNone {
				hdirs = append(hdirs, hDir{newIdx[b.a], b.dir})
			}
		default:
			bondIdx[bi] = m.AddBond(graph.Bond{A: newIdx[b.a], B: newIdx[b.b], Order: b.order,
				Aromatic: b.arom, Dir: b.dir, Pos: b.pos})
		}
	}
	var order []int
	for i := range p.atoms {
		if fold[i] || len(p.nbrs[i]) < 2 || !p.needsReorder(i) {
			continue
		}
		order = order[:0]
		for _, bi := range p.nbrs[i] {
			if bi >= 0 && bondIdx[bi] >= 0 {
				order = append(order, bondIdx[bi])
			}
		}
		m.ReorderBonds(newIdx[i], order)
	}
	for _, hd := range hdirs {
		transferHDir(m, hd)
	}
	return m
}

// hDir is the '/' or '\' mark of a folded [H], as seen from its heavy atom.
type hDir struct {
	atom int
	dir  graph.BondDir
}

func flipDir(d graph.BondDir) graph.BondDir {
	switch d {
	case graph.DirUp:
		return graph.DirDown
	case graph.DirDown:
		return graph.DirUp
	}
	return d
}

// transferHDir keeps the double-bond geometry that a folded [H] carried
// ([H]/C(F)=C/F): the other single bond at that end of the double bond,
// if unmarked, gets the opposite mark, which says the same thing.
func transferHDir(m *graph.Mol, hd hDir) {
	var other []int
	hasDouble := false
	for _, bi := range m.BondsOf(hd.atom) {
		switch b := &m.Bonds[bi]; {
		case b.Order == 2 && !b.Aromatic:
			hasDouble = true
		case b.Order == 1 && !b.Aromatic:
			other = append(other, bi)
		}
	}
	if !hasDouble || len(other) != 1 || m.Bonds[other[0]].Dir != graph.DirNone {
		return
	}
	b := &m.Bonds[other[0]]
	if b.A == hd.atom {
		b.Dir = flipDir(hd.dir)
	} else {
		b.Dir = hd.dir
	}
}

// foldableH marks [H] atoms (isotope 0 or 1, no charge, no H count) with a
// single single bond to a heavy atom.
func (p *parser) foldableH() []bool {
	fold := make([]bool, len(p.atoms))
	for i, a := range p.atoms {
		if a.Element != "H" || !a.Bracket || a.Charge != 0 || a.ImplicitH != 0 ||
			(a.Isotope != 0 && a.Isotope != 1) || len(p.nbrs[i]) != 1 {
			continue
		}
		b := p.bonds[p.nbrs[i][0]]
		if b.order != 1 || b.arom {
			continue
		}
		o := b.a
		if o == i {
			o = b.b
		}
		if p.atoms[o].Element != "H" {
			fold[i] = true
		}
	}
	return fold
}

// foldInto adds one explicit hydrogen to heavy atom h (parser index old),
// whose bond pb led to the folded [H]. When h carries a tetrahedral mark,
// the mark is rewritten for the hydrogen's standard place in the neighbour
// order (OpenSMILES 3.9.1: right after the preceding atom, or first when
// there is none), flipping @/@@ for an odd number of moves.
func (p *parser) foldInto(m *graph.Mol, h, old, pb int) {
	at := &m.Atoms[h]
	at.ExplicitH++
	if at.Chiral == graph.ChiralNone || at.ImplicitH != 0 || at.ExplicitH != 1 {
		return
	}
	k := -1
	for i, bi := range p.nbrs[old] {
		if bi == pb {
			k = i
		}
	}
	want := 0
	if p.hasFrom[old] {
		want = 1
		if p.isFoldedFrom(old) {
			want = 0
		}
	}
	if d := k - want; d%2 != 0 {
		if at.Chiral == graph.ChiralCW {
			at.Chiral = graph.ChiralCCW
		} else {
			at.Chiral = graph.ChiralCW
		}
	}
}

// isFoldedFrom reports whether the atom that precedes old is itself a
// folded [H] (as in [H][C@](F)(Cl)Br), so old is effectively first.
func (p *parser) isFoldedFrom(old int) bool {
	b := p.bonds[p.nbrs[old][0]]
	o := b.a
	if o == old {
		o = b.b
	}
	a := p.atoms[o]
	return a.Element == "H" && len(p.nbrs[o]) == 1
}

// needsReorder reports whether atom i's written neighbour order differs from
// the order its bonds were created in (a ring bond opened here, or a folded
// hydrogen).
func (p *parser) needsReorder(i int) bool {
	last := -1
	for _, bi := range p.nbrs[i] {
		if bi < last {
			return true
		}
		last = bi
	}
	return false
}
