package smiles

import (
	"errors"
	"fmt"
	"strconv"
	"strings"

	"shiftwise/graph"
)

// maxErrors caps the number of errors collected from one string.
const maxErrors = 10

// Options control ParseWithOptions.
type Options struct {
	// NoPerceive returns the molecule as written, without implicit
	// hydrogens, kekulization, rings or aromaticity (no chemistry errors).
	NoPerceive bool
}

// Parse reads an OpenSMILES string and returns the perceived molecule
// (implicit hydrogens, Kekulé form, rings, aromaticity). On error the
// molecule is nil and the error is an ErrorList of *Error, sorted by
// position. Parse never panics.
func Parse(s string) (*graph.Mol, error) {
	m, _, err := ParseWithOptions(s, Options{})
	return m, err
}

// ParseWithOptions is Parse with options; it also returns warnings about
// constructs that were accepted but ignored (extended chirality classes).
func ParseWithOptions(s string, opt Options) (*graph.Mol, []Warning, error) {
	var p parser
	p.init(s)
	p.parse()
	if len(p.errs) > 0 {
		p.errs.RemoveMultiples()
		return nil, p.warns, p.errs
	}
	m := p.build()
	p.checkBondDirs(m)
	if !opt.NoPerceive {
		for _, e := range m.PerceiveAll() {
			pos := e.Pos
			if pos < 0 || pos > len(s) {
				pos = 0
			}
			p.errs.Add(pos, e.Msg+p.elementHint(pos, e.Msg))
		}
	}
	if len(p.errs) > 0 {
		p.errs.RemoveMultiples()
		return nil, p.warns, p.errs
	}
	return m, p.warns, nil
}

// AsList returns err as an ErrorList when it is one (or wraps one).
func AsList(err error) (ErrorList, bool) {
	var l ErrorList
	ok := errors.As(err, &l)
	return l, ok
}

// pendingBond is a bond symbol waiting for the atom or ring number after it.
type pendingBond struct {
	sym byte // 0 when none
	pos int
}

// pbond is a bond as parsed, before [H] atoms are folded.
type pbond struct {
	a, b  int
	sym   byte // bond symbol, 0 when implicit
	pos   int
	order int
	arom  bool
	dir   graph.BondDir
}

type ringOpen struct {
	atom, pos, slot int
	bond            pendingBond
}

type branchOpen struct{ atom, pos, natoms int }

// parser builds the molecule in one pass over the tokens.
type parser struct {
	sc    scanner
	src   string
	errs  ErrorList
	warns []Warning

	pos     int
	tok     token
	lit     string
	lastTok token

	atoms    []graph.Atom
	hasFrom  []bool  // atom was bonded to a preceding atom when written
	nbrs     [][]int // per atom: bond indices in written order; -1 = open ring
	nbrPool  []int   // backing store for nbrs
	bonds    []pbond
	prev     int
	bond     pendingBond
	branches []branchOpen
	rings    map[int]*ringOpen
}

func (p *parser) init(src string) {
	p.src = src
	p.atoms = make([]graph.Atom, 0, len(src)/2+1)
	p.bonds = make([]pbond, 0, len(src)/2+1)
	p.nbrs = make([][]int, 0, len(src)/2+1)
	p.hasFrom = make([]bool, 0, len(src)/2+1)
	p.sc.init(src, p.error)
	p.prev = -1
	p.rings = map[int]*ringOpen{}
	p.lastTok = tEOF
	p.next()
}

func (p *parser) error(pos int, msg string) { p.errs.Add(pos, msg) }

func (p *parser) warn(pos int, msg string) { p.warns = append(p.warns, Warning{pos, msg}) }

// next moves to the next token. Illegal tokens (already reported by the
// scanner) do not count as the previous token, and trailing spaces are
// skipped.
func (p *parser) next() {
	if p.tok != tILLEGAL {
		p.lastTok = p.tok
	}
	for {
		p.pos, p.tok, p.lit = p.sc.scan()
		if p.tok != tILLEGAL || strings.TrimSpace(p.lit) != "" {
			return
		}
	}
}

// describe names the current token for "found ..." messages.
func (p *parser) describe() string {
	switch p.tok {
	case tEOF:
		return "end of SMILES"
	case tBOND:
		return fmt.Sprintf("bond '%s'", p.lit)
	case tRING:
		return fmt.Sprintf("ring-bond number %s", p.lit)
	case tATOM, tBRACKET:
		return fmt.Sprintf("atom %s", p.lit)
	}
	return fmt.Sprintf("'%s'", p.lit)
}

// parse reads
//
//	smiles ::= chain ( '.' chain )*
//	chain  ::= atom ( bond? ( atom | ring_number ) | '(' bond? chain ')' )*
//
// collecting errors and carrying on after each.
func (p *parser) parse() {
	if strings.TrimSpace(p.src) == "" {
		p.error(0, "empty SMILES")
		return
	}
	for p.tok != tEOF && len(p.errs) < maxErrors {
		p.step()
		p.next()
	}
	p.finish()
}

// step handles the current token.
func (p *parser) step() {
	switch p.tok {
	case tATOM:
		p.addAtom(organicAtom(p.lit, p.pos))
	case tBRACKET:
		a, _ := p.parseBracket(p.lit, p.pos)
		if a.Element == "" {
			a.Element = "*"
		}
		p.addAtom(a)
	case tBOND:
		p.bondSymbol()
	case tLPAREN:
		p.openBranch()
	case tRPAREN:
		p.closeBranch()
	case tRING:
		p.ringNumber()
	case tDOT:
		p.dot()
	}
}

func organicAtom(lit string, pos int) graph.Atom {
	a := graph.Atom{Element: lit, Pos: pos}
	if c := lit[0]; c >= 'a' && c <= 'z' {
		a.Element = strings.ToUpper(lit[:1]) + lit[1:]
		a.Aromatic = true
	}
	return a
}

func (p *parser) addAtom(a graph.Atom) {
	i := len(p.atoms)
	p.atoms = append(p.atoms, a)
	if cap(p.nbrPool)-len(p.nbrPool) < 4 {
		p.nbrPool = make([]int, 0, 256)
	}
	n := len(p.nbrPool)
	p.nbrs = append(p.nbrs, p.nbrPool[n:n:n+4])
	p.nbrPool = p.nbrPool[:n+4]
	p.hasFrom = append(p.hasFrom, p.prev >= 0)
	if p.prev >= 0 {
		p.addBond(p.prev, i, p.bond, a.Pos)
	}
	p.bond = pendingBond{}
	p.prev = i
}

// addBond joins a and b with the pending bond (or an implicit one).
func (p *parser) addBond(a, b int, pb pendingBond, pos int) int {
	bd := pbond{a: a, b: b, sym: pb.sym, pos: pos, order: 1}
	if pb.sym != 0 {
		bd.pos = pb.pos
	}
	switch pb.sym {
	case 0:
		// Between aromatic atoms, or an aromatic atom and a wildcard
		// (c1cc*cc1), an implicit bond is aromatic if it lies in a ring.
		wa, wb := p.atoms[a].Element == "*", p.atoms[b].Element == "*"
		bd.arom = (p.atoms[a].Aromatic || wa) && (p.atoms[b].Aromatic || wb) && !(wa && wb)
	case '=':
		bd.order = 2
	case '#':
		bd.order = 3
	case '$':
		bd.order = 4
	case ':':
		bd.arom = true
	case '/':
		bd.dir = graph.DirUp
	case '\\':
		bd.dir = graph.DirDown
	}
	p.bonds = append(p.bonds, bd)
	bi := len(p.bonds) - 1
	p.nbrs[a] = append(p.nbrs[a], bi)
	p.nbrs[b] = append(p.nbrs[b], bi)
	return bi
}

func (p *parser) bondSymbol() {
	switch {
	case p.bond.sym != 0:
		p.error(p.pos, fmt.Sprintf("expected atom after bond '%c', found %s", p.bond.sym, p.describe()))
	case p.prev < 0:
		p.error(p.pos, fmt.Sprintf("expected atom before bond '%s'", p.lit))
	}
	p.bond = pendingBond{sym: p.lit[0], pos: p.pos}
}

func (p *parser) openBranch() {
	switch {
	case p.lastTok == tLPAREN:
		p.error(p.pos, "expected atom or bond after '(', found '('")
	case p.prev < 0:
		p.error(p.pos, "expected atom before '(' (a branch must follow an atom)")
	case p.bond.sym != 0:
		p.error(p.pos, fmt.Sprintf("expected atom after bond '%c', found '(' (the bond goes inside the branch: C(=O))", p.bond.sym))
		p.bond = pendingBond{}
	}
	p.branches = append(p.branches, branchOpen{atom: p.prev, pos: p.pos, natoms: len(p.atoms)})
}

func (p *parser) closeBranch() {
	if len(p.branches) == 0 {
		p.error(p.pos, "unbalanced parenthesis: ')' without a matching '('")
		return
	}
	br := p.branches[len(p.branches)-1]
	p.branches = p.branches[:len(p.branches)-1]
	switch {
	case p.bond.sym != 0:
		p.error(p.pos, fmt.Sprintf("expected atom after bond '%c', found ')'", p.bond.sym))
	case len(p.atoms) == br.natoms && p.lastTok == tLPAREN:
		p.error(br.pos, "empty branch '()'")
	}
	p.bond = pendingBond{}
	p.prev = br.atom
}

func (p *parser) dot() {
	switch {
	case p.bond.sym != 0:
		p.error(p.pos, fmt.Sprintf("expected atom after bond '%c', found '.'", p.bond.sym))
	case p.prev < 0 || p.lastTok == tDOT:
		p.error(p.pos, "expected atom before '.' (empty component)")
	}
	p.bond = pendingBond{}
	p.prev = -1
}

// ringNumber opens or closes a ring bond.
func (p *parser) ringNumber() {
	n := ringNum(p.lit)
	if p.prev < 0 {
		p.error(p.pos, fmt.Sprintf("expected atom before ring-bond number %d", n))
		p.bond = pendingBond{}
		return
	}
	if p.lastTok == tLPAREN {
		p.error(p.pos, fmt.Sprintf("expected atom or bond after '(', found ring-bond number %d (ring numbers go before the branch: C1(...))", n))
	}
	r, open := p.rings[n]
	if !open {
		p.rings[n] = &ringOpen{atom: p.prev, pos: p.pos, slot: len(p.nbrs[p.prev]), bond: p.bond}
		p.nbrs[p.prev] = append(p.nbrs[p.prev], -1)
		p.bond = pendingBond{}
		return
	}
	delete(p.rings, n)
	p.closeRing(n, r)
	p.bond = pendingBond{}
}

func (p *parser) closeRing(n int, r *ringOpen) {
	a, b := r.atom, p.prev
	switch {
	case a == b:
		p.error(p.pos, fmt.Sprintf("ring bond %d closes on the atom that opened it", n))
		return
	case p.bonded(a, b):
		p.error(p.pos, fmt.Sprintf("ring bond %d duplicates the bond between these two atoms", n))
		return
	}
	pb := r.bond
	if p.bond.sym != 0 {
		if pb.sym != 0 && !compatible(pb.sym, p.bond.sym) {
			p.error(p.bond.pos, fmt.Sprintf("mismatched ring-bond orders for ring %d: '%c' at col %d and '%c' here", n, pb.sym, pb.pos+1, p.bond.sym))
			return
		}
		if pb.sym == 0 || isDir(p.bond.sym) {
			pb = p.bond
			a, b = b, a // a directional mark is read from the atom it follows
		}
	}
	bi := p.addBond(a, b, pb, p.pos)
	// addBond appended bi to both lists; move it into the opener's slot.
	opener := r.atom
	p.nbrs[opener] = p.nbrs[opener][:len(p.nbrs[opener])-1]
	p.nbrs[opener][r.slot] = bi
}

func (p *parser) bonded(a, b int) bool {
	for _, bi := range p.nbrs[a] {
		if bi >= 0 && (p.bonds[bi].a == b || p.bonds[bi].b == b) {
			return true
		}
	}
	return false
}

func isDir(c byte) bool { return c == '/' || c == '\\' }

func compatible(x, y byte) bool {
	return x == y || (isDir(x) && isDir(y)) || (isDir(x) && y == '-') || (x == '-' && isDir(y))
}

func ringNum(lit string) int {
	s := strings.Trim(lit, "%()")
	n, _ := strconv.Atoi(s)
	return n
}

// finish reports what is still open at the end of the string.
func (p *parser) finish() {
	if len(p.errs) >= maxErrors {
		return
	}
	if p.bond.sym != 0 {
		p.error(len(p.src), fmt.Sprintf("expected atom after bond '%c', found end of SMILES", p.bond.sym))
	}
	if p.lastTok == tDOT {
		p.error(len(p.src), "expected atom after '.', found end of SMILES")
	}
	for _, br := range p.branches {
		p.error(br.pos, "unbalanced parenthesis: '(' is never closed (SMILES may be truncated)")
	}
	for n, r := range p.rings {
		p.error(r.pos, fmt.Sprintf("unclosed ring bond %d (SMILES may be truncated)", n))
	}
}

// elementHint adds a likely cause to "aromatic atom outside a ring" when the
// lower-case letter completes an element symbol with the letter before it
// ("Co" written for cobalt reads as C bonded to an aromatic o).
func (p *parser) elementHint(pos int, msg string) string {
	if !strings.HasPrefix(msg, "aromatic atom outside a ring") || pos < 1 || pos >= len(p.src) {
		return ""
	}
	sym := p.src[pos-1 : pos+1]
	if isUpper(sym[0]) && graph.IsElement(sym) {
		return fmt.Sprintf("; for the element %s write [%s]", sym, sym)
	}
	return ""
}
