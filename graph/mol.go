package graph

import "fmt"

// Chirality is the tetrahedral mark written on an atom.
type Chirality int8

// Tetrahedral marks: none, '@' (anticlockwise) and '@@' (clockwise), as
// seen from the first neighbour in written order (OpenSMILES 3.9).
const (
	ChiralNone Chirality = iota
	ChiralCCW
	ChiralCW
)

// BondDir is the directional mark written on a single bond: '/' or '\'.
// It is stored as seen going from Bond.A to Bond.B.
type BondDir int8

// Directional marks.
const (
	DirNone BondDir = iota
	DirUp           // '/'
	DirDown         // '\'
)

// Atom is one atom of a molecule. Hydrogens written as bracket atoms ([H])
// bonded to one heavy atom are folded into that atom's ExplicitH and do not
// appear as atoms, so atom indices count heavy atoms in written order.
type Atom struct {
	Element   string    // capitalised symbol: "C", "Cl", "Se"; "*" for the wildcard
	Isotope   int       // mass number; 0 when not given
	Charge    int       // formal charge
	Aromatic  bool      // aromatic after perception (as written before it)
	Bracket   bool      // written as a bracket atom
	ImplicitH int       // hydrogens from the default valence or the bracket count
	ExplicitH int       // hydrogens written as separate [H] atoms, folded in
	Chiral    Chirality // tetrahedral mark as written
	Class     int       // atom class (":n" in a bracket atom)
	Pos       int       // byte offset in the source string; -1 when built in code
}

// HCount returns the number of hydrogens bonded to the atom.
func (a *Atom) HCount() int { return a.ImplicitH + a.ExplicitH }

// Bond joins two atoms. Order is the Kekulé order (1, 2, 3 or 4) once the
// molecule is kekulized; aromatic bonds keep Aromatic set as well.
type Bond struct {
	A, B     int
	Order    int
	Aromatic bool
	Dir      BondDir // '/' or '\' as seen from A to B
	Pos      int     // byte offset of the bond symbol (or of atom B when implicit); -1 in code
}

// Other returns the atom at the other end of the bond from a.
func (b *Bond) Other(a int) int {
	if b.A == a {
		return b.B
	}
	return b.A
}

// Mol is a molecular graph with int-indexed atoms and bonds.
// The zero value is an empty molecule ready for AddAtom and AddBond.
type Mol struct {
	Atoms  []Atom
	Bonds  []Bond
	Source string // the text the molecule was read from, if any

	adj     [][]int // bond indices per atom
	adjPool []int   // backing store for adj, handed out four slots at a time

	// Set by Perceive.
	perceived bool
	rings     [][]int // SSSR, atom indices in ring order
	ringBonds [][]int // bond indices of each ring, parallel to rings

	extraRings, extraRingBonds [][]int // symmetrizing rings beyond the SSSR
	ringBond                   []bool  // per bond: in some ring
	atomRings                  [][]int // per atom: indices into rings
	kekulized                  bool
	pi                         []bool // per atom: takes a double bond in the Kekulé form of a written aromatic system
	symClasses                 []int  // SymmetryClasses, computed once by Perceive; nil when stale
}

// AddAtom appends an atom and returns its index.
func (m *Mol) AddAtom(a Atom) int {
	m.symClasses = nil
	m.Atoms = append(m.Atoms, a)
	if cap(m.adjPool)-len(m.adjPool) < 4 {
		m.adjPool = make([]int, 0, 256)
	}
	n := len(m.adjPool)
	m.adj = append(m.adj, m.adjPool[n:n:n+4])
	m.adjPool = m.adjPool[:n+4]
	return len(m.Atoms) - 1
}

// AddBond appends a bond and returns its index. It panics if an index is out
// of range or the atoms are the same (misuse by the caller, not user input).
func (m *Mol) AddBond(b Bond) int {
	if b.A < 0 || b.B < 0 || b.A >= len(m.Atoms) || b.B >= len(m.Atoms) {
		panic(fmt.Sprintf("graph: bond %d-%d out of range", b.A, b.B))
	}
	if b.A == b.B {
		panic("graph: self bond")
	}
	m.symClasses = nil
	m.Bonds = append(m.Bonds, b)
	i := len(m.Bonds) - 1
	m.adj[b.A] = append(m.adj[b.A], i)
	m.adj[b.B] = append(m.adj[b.B], i)
	return i
}

// ReorderBonds sets the order in which BondsOf lists the bonds of atom a
// (the SMILES parser uses it to keep the written neighbour order that
// tetrahedral marks refer to). It panics unless order is a permutation of
// BondsOf(a).
func (m *Mol) ReorderBonds(a int, order []int) {
	cur := m.adj[a]
	if len(order) != len(cur) {
		panic("graph: ReorderBonds: not a permutation")
	}
	for _, bi := range order {
		found := false
		for _, c := range cur {
			if c == bi {
				found = true
				break
			}
		}
		if !found {
			panic("graph: ReorderBonds: not a permutation")
		}
	}
	copy(cur, order)
}

// BondsOf returns the indices of the bonds at atom a, in the order they were
// added. The slice must not be modified.
func (m *Mol) BondsOf(a int) []int { return m.adj[a] }

// Neighbors returns the atoms bonded to a, in bond order.
func (m *Mol) Neighbors(a int) []int {
	out := make([]int, 0, len(m.adj[a]))
	for _, bi := range m.adj[a] {
		out = append(out, m.Bonds[bi].Other(a))
	}
	return out
}

// Degree returns the number of heavy-atom neighbours of a.
func (m *Mol) Degree(a int) int { return len(m.adj[a]) }

// BondBetween returns the index of the bond joining a and b, or -1.
func (m *Mol) BondBetween(a, b int) int {
	for _, bi := range m.adj[a] {
		if m.Bonds[bi].Other(a) == b {
			return bi
		}
	}
	return -1
}

// AtomError is a chemistry error found by Perceive, tied to an atom so that
// a parser can point at the place in the source where the atom was written.
type AtomError struct {
	Atom int    // atom index
	Pos  int    // the atom's source offset (Atom.Pos); -1 when built in code
	Msg  string // problem, plus a likely cause where one is known
}

// Error returns "graph: atom N: msg".
func (e *AtomError) Error() string { return fmt.Sprintf("graph: atom %d: %s", e.Atom, e.Msg) }
