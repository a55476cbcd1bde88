package smiles

import (
	"fmt"
	"strconv"
	"unicode/utf8"

	"shiftwise/graph"
)

// bracketGrammar is quoted in bracket-atom error messages.
const bracketGrammar = "bracket atom grammar: [ <isotope>? <symbol> <chiral>? <hcount>? <charge>? <class>? ]"

// bracketScanner walks the text of one bracket atom.
type bracketScanner struct {
	p   *parser
	lit string // "[...]" including both brackets
	pos int    // offset of '[' in the SMILES string
	i   int    // offset within lit
}

func (b *bracketScanner) peek() byte {
	if b.i < len(b.lit) {
		return b.lit[b.i]
	}
	return 0
}

func (b *bracketScanner) errorf(format string, args ...any) {
	b.p.error(b.pos+b.i, fmt.Sprintf(format, args...))
}

func (b *bracketScanner) found() string {
	c := b.peek()
	if c == ']' {
		return "']'"
	}
	if c == 0 {
		return "end of bracket atom"
	}
	r, _ := utf8.DecodeRuneInString(b.lit[b.i:])
	return fmt.Sprintf("%q", r)
}

// digits reads up to max decimal digits; ok is false when there are none.
func (b *bracketScanner) digits(max int) (n int, ok bool) {
	start := b.i
	for b.i < len(b.lit) && isDigit(b.lit[b.i]) && b.i-start < max {
		b.i++
	}
	if b.i == start {
		return 0, false
	}
	n, _ = strconv.Atoi(b.lit[start:b.i])
	return n, true
}

// parseBracket parses
//
//	bracket_atom ::= '[' isotope? symbol chiral? hcount? charge? class? ']'
//
// and returns the atom; ok is false when it reported an error.
func (p *parser) parseBracket(lit string, pos int) (graph.Atom, bool) {
	b := &bracketScanner{p: p, lit: lit, pos: pos, i: 1}
	a := graph.Atom{Bracket: true, Pos: pos}
	errs := len(p.errs)
	a.Isotope, _ = b.digits(4)
	if !b.symbol(&a) {
		return a, false
	}
	b.chiral(&a)
	if b.peek() == 'H' {
		if a.Element == "H" {
			b.errorf("a hydrogen atom cannot carry a hydrogen count (write H2 as [H][H])")
		}
		b.i++
		a.ImplicitH = 1
		if n, ok := b.digits(1); ok {
			a.ImplicitH = n
		}
	}
	b.charge(&a)
	if b.peek() == ':' {
		b.i++
		n, ok := b.digits(8)
		if !ok {
			b.errorf("expected atom class number after ':', found %s", b.found())
			return a, false
		}
		a.Class = n
	}
	if b.peek() != ']' {
		b.errorf("expected ']', found %s (%s)", b.found(), bracketGrammar)
		return a, false
	}
	return a, len(p.errs) == errs
}

// symbol reads an element symbol, aromatic symbol or '*'.
func (b *bracketScanner) symbol(a *graph.Atom) bool {
	c := b.peek()
	rest := b.lit[b.i:]
	switch {
	case c == '*':
		a.Element = "*"
		b.i++
		return true
	case len(rest) >= 2 && (rest[:2] == "se" || rest[:2] == "as" || rest[:2] == "te"):
		a.Element = string(rest[0]-'a'+'A') + rest[1:2]
		a.Aromatic = true
		b.i += 2
		return true
	case c == 'b' || c == 'c' || c == 'n' || c == 'o' || c == 'p' || c == 's':
		a.Element = string(c - 'a' + 'A')
		a.Aromatic = true
		b.i++
		return true
	case isUpper(c):
		if len(rest) >= 2 && isLower(rest[1]) && graph.IsElement(rest[:2]) {
			a.Element = rest[:2]
			b.i += 2
			return true
		}
		if graph.IsElement(rest[:1]) {
			a.Element = rest[:1]
			b.i++
			return true
		}
		n := 1
		if len(rest) >= 2 && isLower(rest[1]) {
			n = 2
		}
		b.errorf("unknown element symbol '%s'", rest[:n])
		return false
	}
	b.errorf("expected element symbol, found %s (%s)", b.found(), bracketGrammar)
	return false
}

// chiral reads '@', '@@' or an extended class such as @TH1, @SP2, @OH12.
func (b *bracketScanner) chiral(a *graph.Atom) {
	if b.peek() != '@' {
		return
	}
	start := b.i
	b.i++
	if b.peek() == '@' {
		b.i++
		a.Chiral = graph.ChiralCW
		return
	}
	a.Chiral = graph.ChiralCCW
	rest := b.lit[b.i:]
	if len(rest) < 2 || !isUpper(rest[0]) || !isUpper(rest[1]) {
		return
	}
	class := rest[:2]
	limits := map[string]int{"TH": 2, "AL": 2, "SP": 3, "TB": 20, "OH": 30}
	lim, known := limits[class]
	if !known {
		return // e.g. [C@H]: '@' followed by the H count
	}
	b.i += 2
	at := b.i
	n, ok := b.digits(2)
	if !ok || n < 1 || n > lim {
		b.i = at
		b.errorf("expected a number 1–%d after '@%s', found %s", lim, class, b.found())
		b.digits(2)
		a.Chiral = graph.ChiralNone
		return
	}
	switch {
	case class == "TH" && n == 1:
		a.Chiral = graph.ChiralCCW
	case class == "TH" && n == 2:
		a.Chiral = graph.ChiralCW
	default:
		a.Chiral = graph.ChiralNone
		b.p.warn(b.pos+start, fmt.Sprintf("chirality @%s%d is not supported and was ignored", class, n))
	}
}

// charge reads +, -, +n, -n, ++, --.
func (b *bracketScanner) charge(a *graph.Atom) {
	c := b.peek()
	if c != '+' && c != '-' {
		return
	}
	sign := 1
	if c == '-' {
		sign = -1
	}
	start := b.i
	b.i++
	if n, ok := b.digits(2); ok {
		if n > 15 {
			b.i = start
			b.errorf("charge %c%d out of range (at most 15)", c, n)
			return
		}
		a.Charge = sign * n
		return
	}
	n := 1
	for b.peek() == c {
		b.i++
		n++
	}
	a.Charge = sign * n
}
