package graph

import "slices"

// bondCode is the bond label used by the symmetry refinement: the Kekulé
// order for ordinary bonds and a separate code for aromatic bonds, so that
// the Kekulé structure chosen by perception cannot break ring symmetry.
func bondCode(b *Bond) int {
	if b.Aromatic {
		return 5
	}
	return b.Order
}

// SymmetryClasses returns one class number per atom such that two atoms have
// the same number exactly when iterative refinement of their invariants cannot
// tell them apart (topological equivalence). No ties are broken.
//
// The starting invariant of an atom is its element, isotope, formal charge,
// hydrogen count, degree, aromatic flag, ring membership and the sorted list
// of its bond codes (aromatic bonds count as one kind, whatever their Kekulé
// order). Each round then appends the sorted (class, bond code) pairs of the
// neighbours and re-ranks, in the manner of Morgan's and Weininger's
// canonical ranking, until the number of classes stops growing.
//
// Class numbers are dense (0 … k-1) and are ranks of the invariants, not of
// the atom indices, so that they do not change when the atoms are renumbered.
// Written stereo marks (@, @@, /, \) are not used.
//
// Perceive computes the classes once; later calls return a copy of them, so
// the many callers (environments, alkene geometry, shift rules) pay nothing.
func (m *Mol) SymmetryClasses() []int {
	if m.symClasses != nil && len(m.symClasses) == len(m.Atoms) {
		return slices.Clone(m.symClasses)
	}
	return m.computeSymmetryClasses()
}

func (m *Mol) computeSymmetryClasses() []int {
	n := len(m.Atoms)
	if n == 0 {
		return []int{}
	}
	ring := m.symRingAtoms()
	elem := m.symElementRanks()
	init := make([][]int, n)
	for a := range m.Atoms {
		at := &m.Atoms[a]
		v := []int{elem[a], at.Isotope, at.Charge, at.HCount(), m.Degree(a), b2i(at.Aromatic), b2i(ring[a])}
		codes := make([]int, 0, m.Degree(a))
		for _, bi := range m.adj[a] {
			codes = append(codes, bondCode(&m.Bonds[bi]))
		}
		slices.Sort(codes)
		init[a] = append(v, codes...)
	}
	return m.symRefine(init)
}

func b2i(b bool) int {
	if b {
		return 1
	}
	return 0
}

// symElementRanks ranks element symbols alphabetically so that they can take
// part in integer invariants independently of atom order.
func (m *Mol) symElementRanks() []int {
	syms := make([]string, 0, 8)
	for _, a := range m.Atoms {
		syms = append(syms, a.Element)
	}
	slices.Sort(syms)
	syms = slices.Compact(syms)
	out := make([]int, len(m.Atoms))
	for i, a := range m.Atoms {
		out[i], _ = slices.BinarySearch(syms, a.Element)
	}
	return out
}

// symRank gives each atom the dense rank of its invariant vector.
func symRank(inv [][]int) ([]int, int) {
	n := len(inv)
	order := make([]int, n)
	for i := range order {
		order[i] = i
	}
	slices.SortFunc(order, func(x, y int) int { return slices.Compare(inv[x], inv[y]) })
	rank := make([]int, n)
	k := 0
	for i, a := range order {
		if i > 0 && slices.Compare(inv[order[i-1]], inv[a]) != 0 {
			k++
		}
		rank[a] = k
	}
	return rank, k + 1
}

// symRefine ranks the starting invariants and refines the ranks by the
// neighbour lists until the partition is stable.
func (m *Mol) symRefine(init [][]int) []int {
	rank, k := symRank(init)
	n := len(m.Atoms)
	inv := make([][]int, n)
	for {
		for a := 0; a < n; a++ {
			v := inv[a][:0]
			v = append(v, rank[a])
			start := len(v)
			for _, bi := range m.adj[a] {
				b := &m.Bonds[bi]
				v = append(v, rank[b.Other(a)]*8+bondCode(b))
			}
			slices.Sort(v[start:])
			inv[a] = v
		}
		next, nk := symRank(inv)
		if nk == k {
			return rank
		}
		rank, k = next, nk
	}
}

// symRingAtoms marks the atoms that lie on a cycle: atoms with at least one
// bond that is not a bridge. It needs no ring perception (only the bridge
// search of rings.go).
func (m *Mol) symRingAtoms() []bool {
	onCycle := m.bridgesComplement()
	out := make([]bool, len(m.Atoms))
	for bi, b := range m.Bonds {
		if onCycle[bi] {
			out[b.A], out[b.B] = true, true
		}
	}
	return out
}

// symDistances returns the bond-path distances from atom a to every atom
// (-1 when unreachable), by breadth-first search.
func (m *Mol) symDistances(a int) []int {
	d := make([]int, len(m.Atoms))
	for i := range d {
		d[i] = -1
	}
	d[a] = 0
	queue := []int{a}
	for len(queue) > 0 {
		x := queue[0]
		queue = queue[1:]
		for _, bi := range m.adj[x] {
			o := m.Bonds[bi].Other(x)
			if d[o] < 0 {
				d[o] = d[x] + 1
				queue = append(queue, o)
			}
		}
	}
	return d
}
