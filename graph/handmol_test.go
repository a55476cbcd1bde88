package graph

import (
	"strings"
	"testing"
)

// handMol builds a Mol from a small subset of SMILES for the unit tests of
// this package, which cannot import the smiles package (it imports graph).
// It knows organic-subset atoms (aromatic lowercase c, n, o, s), bracket
// atoms of the form [C@@H], [nH], [NH3+] (element, chirality, H count,
// charge sign), bonds - = # / \, branches and one-digit ring closures.
// Implicit H follows the default valences; aromatic atoms take one bond
// order unit for their aromatic bonds. Bond orders of aromatic bonds are left
// at 1 with Aromatic set, which is all the environment code looks at.
func handMol(t testing.TB, s string) *Mol {
	t.Helper()
	m := &Mol{Source: s}
	var stack []int
	prev := -1
	order, dir, arom := 1, DirNone, false
	ring := map[byte][2]int{} // digit -> atom, order
	fixedH := map[int]bool{}
	for i := 0; i < len(s); i++ {
		ch := s[i]
		switch {
		case ch == '(':
			stack = append(stack, prev)
		case ch == ')':
			prev = stack[len(stack)-1]
			stack = stack[:len(stack)-1]
		case ch == '-':
			order = 1
		case ch == '=':
			order = 2
		case ch == '#':
			order = 3
		case ch == '/':
			dir = DirUp
		case ch == '\\':
			dir = DirDown
		case ch >= '0' && ch <= '9':
			if r, ok := ring[ch]; ok {
				o := max(order, r[1])
				m.AddBond(Bond{A: r[0], B: prev, Order: o, Aromatic: o == 1 && m.Atoms[r[0]].Aromatic && m.Atoms[prev].Aromatic, Pos: -1})
				delete(ring, ch)
			} else {
				ring[ch] = [2]int{prev, order}
			}
			order, dir = 1, DirNone
		default:
			var a Atom
			var n int
			a, n, arom = handAtom(t, s[i:])
			i += n - 1
			a.Pos = -1
			idx := m.AddAtom(a)
			if a.Bracket {
				fixedH[idx] = true
			}
			if prev >= 0 {
				m.AddBond(Bond{A: prev, B: idx, Order: order, Dir: dir, Aromatic: order == 1 && arom && m.Atoms[prev].Aromatic, Pos: -1})
			}
			prev = idx
			order, dir = 1, DirNone
		}
	}
	for a := range m.Atoms {
		if !fixedH[a] {
			m.Atoms[a].ImplicitH = handImplicitH(m, a)
		}
	}
	return m
}

func handAtom(t testing.TB, s string) (Atom, int, bool) {
	if s[0] == '[' {
		end := strings.IndexByte(s, ']')
		body := s[1:end]
		a := Atom{Bracket: true}
		k := 1
		if len(body) > 1 && body[1] >= 'a' && body[1] <= 'z' && body[1] != 'H' {
			k = 2
		}
		sym := body[:k]
		a.Aromatic = sym[0] >= 'a'
		a.Element = strings.ToUpper(sym[:1]) + sym[1:]
		rest := body[k:]
		if strings.HasPrefix(rest, "@@") {
			a.Chiral, rest = ChiralCW, rest[2:]
		} else if strings.HasPrefix(rest, "@") {
			a.Chiral, rest = ChiralCCW, rest[1:]
		}
		if strings.HasPrefix(rest, "H") {
			a.ImplicitH, rest = 1, rest[1:]
			if len(rest) > 0 && rest[0] >= '0' && rest[0] <= '9' {
				a.ImplicitH, rest = int(rest[0]-'0'), rest[1:]
			}
		}
		switch rest {
		case "+":
			a.Charge = 1
		case "-":
			a.Charge = -1
		}
		return a, end + 1, a.Aromatic
	}
	for _, two := range []string{"Cl", "Br"} {
		if strings.HasPrefix(s, two) {
			return Atom{Element: two}, 2, false
		}
	}
	c := s[:1]
	if c[0] >= 'a' && c[0] <= 'z' {
		return Atom{Element: strings.ToUpper(c), Aromatic: true}, 1, true
	}
	if !strings.Contains("BCNOPSFI", c) {
		t.Fatalf("handMol: unsupported %q", s)
	}
	return Atom{Element: c}, 1, false
}

func handImplicitH(m *Mol, a int) int {
	val := map[string]int{"B": 3, "C": 4, "N": 3, "O": 2, "P": 3, "S": 2, "F": 1, "Cl": 1, "Br": 1, "I": 1}[m.Atoms[a].Element]
	used := 0
	for _, bi := range m.adj[a] {
		used += m.Bonds[bi].Order
	}
	if m.Atoms[a].Aromatic {
		used++
	}
	return max(0, val-used)
}
