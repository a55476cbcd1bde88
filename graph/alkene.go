package graph

import (
	"cmp"
	"slices"
)

// AlkeneView describes the surroundings of a proton on a carbon–carbon
// double bond: the substituent geminal to it on the same carbon and the two
// substituents cis and trans to it on the other carbon. Each field is a heavy
// atom index, or -1 for a hydrogen.
type AlkeneView struct {
	Gem, Cis, Trans int
	// Known is false when the geometry was not written (no / \ marks, no
	// small ring) and was assumed: E, the larger groups trans to each other.
	Known bool
}

// Relation is the geometric relation of two protons on a C=C unit.
type Relation int

// Relations returned by ProtonRelation.
const (
	RelNone    Relation = iota // not on the same C=C unit (or the same proton)
	RelGeminal                 // both on the same sp2 carbon of a C=C
	RelCis                     // on the two carbons, same side
	RelTrans                   // on the two carbons, opposite sides
)

// String returns "none", "geminal", "cis" or "trans".
func (r Relation) String() string {
	switch r {
	case RelGeminal:
		return "geminal"
	case RelCis:
		return "cis"
	case RelTrans:
		return "trans"
	}
	return "none"
}

// alkSlot is one of the two positions on an sp2 carbon besides the double
// bond: a heavy atom (atom >= 0) or the hydrogen with index h (atom == -1).
type alkSlot struct{ atom, h int }

// alkBond is a non-aromatic C=C with its geometry: sa[i] is cis to sb[i].
type alkBond struct {
	a, b   int
	sa, sb [2]alkSlot
	known  bool
}

// alkBonds finds the non-aromatic C=C bonds whose carbons carry exactly two
// further positions each (substituents plus hydrogens) and settles their
// geometry: from symmetry (an end with two equal positions needs none), from
// a ring of up to 7 atoms (ring members are cis), from / \ marks, or, when
// none applies, by assuming E for the larger groups (known = false).
// cls are the symmetry classes used to rank substituents.
func (m *Mol) alkBonds(cls []int) []alkBond {
	var out []alkBond
	for bi := range m.Bonds {
		if ab, ok := m.alkBondAt(bi, cls); ok {
			out = append(out, ab)
		}
	}
	return out
}

// alkBondAt returns bond bi with its geometry when it is a C=C that
// alkBonds keeps.
func (m *Mol) alkBondAt(bi int, cls []int) (alkBond, bool) {
	b := &m.Bonds[bi]
	if b.Order != 2 || b.Aromatic || !m.alkCarbon(b.A) || !m.alkCarbon(b.B) {
		return alkBond{}, false
	}
	sa, okA := m.alkSlots(b.A, b.B, cls)
	sb, okB := m.alkSlots(b.B, b.A, cls)
	if !okA || !okB {
		return alkBond{}, false
	}
	j0, known := m.alkGeometry(b.A, b.B, sa, sb, cls)
	return alkBond{a: b.A, b: b.B, sa: sa, sb: [2]alkSlot{sb[j0], sb[1-j0]}, known: known}, true
}

// alkBondsOf returns, as a one-element list, the C=C holding proton p (nil
// when there is none), computing the symmetry classes only when needed.
func (m *Mol) alkBondsOf(p Proton) []alkBond {
	if p.Atom < 0 || p.Atom >= len(m.Atoms) || p.Index < 0 || p.Index >= m.Atoms[p.Atom].HCount() || !m.alkCarbon(p.Atom) {
		return nil
	}
	for _, bi := range m.adj[p.Atom] {
		if m.Bonds[bi].Order == 2 {
			if ab, ok := m.alkBondAt(bi, m.SymmetryClasses()); ok {
				return []alkBond{ab}
			}
		}
	}
	return nil
}

// alkCarbon reports whether a is a non-aromatic carbon with exactly one
// double bond and no triple bond (allenes and cumulenes are left out).
func (m *Mol) alkCarbon(a int) bool {
	at := &m.Atoms[a]
	if at.Element != "C" || at.Aromatic {
		return false
	}
	doubles := 0
	for _, bi := range m.adj[a] {
		switch o := m.Bonds[bi].Order; {
		case m.Bonds[bi].Aromatic:
			return false
		case o == 2:
			doubles++
		case o > 2:
			return false
		}
	}
	return doubles == 1
}

// alkSlots lists the two positions on carbon c other than its partner p,
// larger substituent first and hydrogens last.
func (m *Mol) alkSlots(c, p int, cls []int) ([2]alkSlot, bool) {
	var subs []int
	for _, o := range m.Neighbors(c) {
		if o != p {
			subs = append(subs, o)
		}
	}
	h := m.Atoms[c].HCount()
	if len(subs)+h != 2 {
		return [2]alkSlot{}, false
	}
	size := make(map[int]int, len(subs))
	for _, s := range subs {
		size[s] = m.alkBranchSize(s, c)
	}
	slices.SortFunc(subs, func(x, y int) int {
		return cmp.Or(
			cmp.Compare(size[y], size[x]),
			cmp.Compare(m.Atoms[y].Element, m.Atoms[x].Element),
			cmp.Compare(cls[y], cls[x]),
			cmp.Compare(x, y))
	})
	var s [2]alkSlot
	k := 0
	for _, o := range subs {
		s[k] = alkSlot{atom: o}
		k++
	}
	for i := 0; i < h; i++ {
		s[k] = alkSlot{atom: -1, h: i}
		k++
	}
	return s, true
}

// alkBranchSize counts the heavy atoms reachable from s without passing
// through c: the size of the substituent, used to decide which group is the
// larger one when the geometry has to be assumed.
func (m *Mol) alkBranchSize(s, c int) int {
	seen := map[int]bool{c: true, s: true}
	queue := []int{s}
	for len(queue) > 0 {
		x := queue[0]
		queue = queue[1:]
		for _, o := range m.Neighbors(x) {
			if !seen[o] {
				seen[o] = true
				queue = append(queue, o)
			}
		}
	}
	return len(seen) - 1
}

// alkSymmetricEnd reports whether both positions of an end are alike
// (two hydrogens or two substituents of one class), so that geometry does
// not matter.
func alkSymmetricEnd(s [2]alkSlot, cls []int) bool {
	if s[0].atom < 0 && s[1].atom < 0 {
		return true
	}
	return s[0].atom >= 0 && s[1].atom >= 0 && cls[s[0].atom] == cls[s[1].atom]
}

// alkGeometry returns the index j of the slot of b that is cis to sa[0], and
// whether the geometry is known rather than assumed.
func (m *Mol) alkGeometry(a, b int, sa, sb [2]alkSlot, cls []int) (int, bool) {
	if alkSymmetricEnd(sa, cls) || alkSymmetricEnd(sb, cls) {
		return 0, true
	}
	// A ring of up to 7 atoms forces its two members cis.
	for i, x := range sa {
		for j, y := range sb {
			if x.atom >= 0 && y.atom >= 0 && m.alkSmallRing(x.atom, y.atom, a, b) {
				return j ^ i, true
			}
		}
	}
	// Directional marks: equal directions, seen from each carbon outwards,
	// put the two substituents on the same side (F/C=C\F is Z).
	i, da := m.alkMark(a, sa)
	j, db := m.alkMark(b, sb)
	if da != DirNone && db != DirNone {
		if da == db {
			return j ^ i, true
		}
		return 1 - (j ^ i), true
	}
	// Unwritten: assume E, the larger groups trans.
	return 1, false
}

// alkMark finds a substituent of carbon c whose bond carries a / or \ mark
// and returns its slot and the mark as seen from c towards it.
func (m *Mol) alkMark(c int, s [2]alkSlot) (int, BondDir) {
	for i, x := range s {
		if x.atom < 0 {
			continue
		}
		bond := &m.Bonds[m.BondBetween(c, x.atom)]
		d := bond.Dir
		if d == DirNone {
			continue
		}
		if bond.A != c {
			d = 3 - d // flip: DirUp (1) <-> DirDown (2)
		}
		return i, d
	}
	return 0, DirNone
}

// alkSmallRing reports whether x and y are joined by a path of at most 4
// bonds avoiding a and b (or are the same atom), i.e. whether they close a
// ring of at most 7 atoms with the double bond a=b.
func (m *Mol) alkSmallRing(x, y, a, b int) bool {
	if x == y {
		return true
	}
	depth := map[int]int{x: 0}
	queue := []int{x}
	for len(queue) > 0 {
		v := queue[0]
		queue = queue[1:]
		if depth[v] == 4 {
			continue
		}
		for _, o := range m.Neighbors(v) {
			if o == a || o == b {
				continue
			}
			if _, ok := depth[o]; ok {
				continue
			}
			if o == y {
				return true
			}
			depth[o] = depth[v] + 1
			queue = append(queue, o)
		}
	}
	return false
}

// alkFind returns the C=C holding proton p, and p's slot index on the side
// reported by onA (true: p is on ab.a).
func alkFind(bonds []alkBond, p Proton) (ab *alkBond, slot int, onA bool, ok bool) {
	for k := range bonds {
		x := &bonds[k]
		for side, c := range []int{x.a, x.b} {
			if c != p.Atom {
				continue
			}
			s := x.sa
			if side == 1 {
				s = x.sb
			}
			for i, sl := range s {
				if sl.atom < 0 && sl.h == p.Index {
					return x, i, side == 0, true
				}
			}
		}
	}
	return nil, 0, false, false
}

// AlkeneView reports, for a proton on a carbon of a non-aromatic C=C, the
// atoms geminal, cis and trans to it (-1 for hydrogens). ok is false for any
// other proton, and for double bonds whose carbons do not carry exactly two
// further positions each (allenes, odd valences).
//
// For a =CH2 group, the proton with Index 0 is the one cis to the larger
// substituent of the other carbon (ranked by number of heavy atoms in the
// branch, then element, then symmetry class).
func (m *Mol) AlkeneView(p Proton) (AlkeneView, bool) {
	ab, i, onA, ok := alkFind(m.alkBondsOf(p), p)
	if !ok {
		return AlkeneView{}, false
	}
	own, other := ab.sa, ab.sb
	if !onA {
		own, other = ab.sb, ab.sa
	}
	return AlkeneView{
		Gem:   own[1-i].atom,
		Cis:   other[i].atom,
		Trans: other[1-i].atom,
		Known: ab.known,
	}, true
}

// ProtonRelation returns the geometric relation of two protons on one C=C
// unit: RelGeminal for the two hydrogens of one sp2 carbon (=CH2), RelCis or
// RelTrans for hydrogens on the two carbons, RelNone otherwise (including
// hydrogens on sp3 carbons and p == q).
func (m *Mol) ProtonRelation(p, q Proton) Relation {
	valid := func(x Proton) bool {
		return x.Atom >= 0 && x.Atom < len(m.Atoms) && x.Index >= 0 && x.Index < m.Atoms[x.Atom].HCount()
	}
	if p == q || !valid(p) || !valid(q) || (q.Atom != p.Atom && m.BondBetween(p.Atom, q.Atom) < 0) {
		return RelNone
	}
	return m.protonRelation(m.alkBondsOf(p), p, q)
}

func (m *Mol) protonRelation(bonds []alkBond, p, q Proton) Relation {
	if p == q {
		return RelNone
	}
	ab, i, onA, ok := alkFind(bonds, p)
	if !ok {
		return RelNone
	}
	if q.Atom == p.Atom {
		return RelGeminal
	}
	other, other2 := ab.b, ab.sb
	if !onA {
		other, other2 = ab.a, ab.sa
	}
	if q.Atom != other {
		return RelNone
	}
	for j, sl := range other2 {
		if sl.atom < 0 && sl.h == q.Index {
			if j == i {
				return RelCis
			}
			return RelTrans
		}
	}
	return RelNone
}
