package smiles

import (
	"fmt"
	"strings"
	"unicode/utf8"

	"shiftwise/graph"
)

// token is the kind of a lexical token.
type token int

const (
	tILLEGAL token = iota
	tEOF
	tATOM    // organic-subset atom: B C N O P S F Cl Br I * b c n o p s
	tBRACKET // a whole bracket atom "[...]"; parsed by parseBracket
	tBOND    // - = # $ : / \
	tLPAREN  // (
	tRPAREN  // )
	tRING    // ring-bond number: a digit, %nn or %(n…)
	tDOT     // .
)

var tokenNames = [...]string{
	tILLEGAL: "illegal character", tEOF: "end of SMILES", tATOM: "atom", tBRACKET: "bracket atom",
	tBOND: "bond", tLPAREN: "'('", tRPAREN: "')'", tRING: "ring-bond number", tDOT: "'.'",
}

func (t token) String() string { return tokenNames[t] }

// errorHandler receives scanner errors.
type errorHandler func(pos int, msg string)

// scanner splits a SMILES string into tokens. Scan never fails: a bad
// character becomes a tILLEGAL token, reported through the handler, and
// scanning moves on.
type scanner struct {
	src        string
	off        int
	err        errorHandler
	ErrorCount int
}

func (s *scanner) init(src string, err errorHandler) {
	s.src, s.off, s.err, s.ErrorCount = src, 0, err, 0
}

func (s *scanner) error(pos int, msg string) {
	if s.err != nil {
		s.err(pos, msg)
	}
	s.ErrorCount++
}

func (s *scanner) peek(k int) byte {
	if s.off+k < len(s.src) {
		return s.src[s.off+k]
	}
	return 0
}

// scan returns the next token, its offset and its text.
func (s *scanner) scan() (pos int, tok token, lit string) {
	pos = s.off
	if s.off >= len(s.src) {
		return pos, tEOF, ""
	}
	c := s.src[s.off]
	switch {
	case c == 'C' && s.peek(1) == 'l', c == 'B' && s.peek(1) == 'r':
		s.off += 2
		return pos, tATOM, s.src[pos:s.off]
	case strings.IndexByte("BCNOPSFI*bcnops", c) >= 0:
		s.off++
		return pos, tATOM, s.src[pos:s.off]
	case strings.IndexByte("-=#$:/\\", c) >= 0:
		s.off++
		return pos, tBOND, s.src[pos:s.off]
	case c == '(':
		s.off++
		return pos, tLPAREN, "("
	case c == ')':
		s.off++
		return pos, tRPAREN, ")"
	case c == '.':
		s.off++
		return pos, tDOT, "."
	case c >= '0' && c <= '9':
		s.off++
		return pos, tRING, s.src[pos:s.off]
	case c == '%':
		return s.scanPercent()
	case c == '[':
		return s.scanBracket()
	}
	return s.scanIllegal()
}

// scanPercent scans %nn or %(n…).
func (s *scanner) scanPercent() (int, token, string) {
	pos := s.off
	if isDigit(s.peek(1)) && isDigit(s.peek(2)) {
		s.off += 3
		return pos, tRING, s.src[pos:s.off]
	}
	if s.peek(1) == '(' {
		end := s.off + 2
		for end < len(s.src) && isDigit(s.src[end]) {
			end++
		}
		if end > s.off+2 && end < len(s.src) && s.src[end] == ')' && end-s.off-2 <= 5 {
			s.off = end + 1
			return pos, tRING, s.src[pos:s.off]
		}
	}
	s.off++
	s.error(pos, fmt.Sprintf("expected two digits after '%%', found %s", s.describeAt(s.off)))
	return pos, tILLEGAL, "%"
}

// scanBracket scans "[...]" as one token.
func (s *scanner) scanBracket() (int, token, string) {
	pos := s.off
	for i := s.off + 1; i < len(s.src); i++ {
		switch s.src[i] {
		case ']':
			s.off = i + 1
			return pos, tBRACKET, s.src[pos:s.off]
		case '[', ' ', '\t', '\n', '\r', '(', ')', '.':
			s.off = i
			s.error(i, fmt.Sprintf("expected ']' to close the bracket atom opened at col %d, found %s", pos+1, s.describeAt(i)))
			return pos, tILLEGAL, s.src[pos:i]
		}
	}
	s.off = len(s.src)
	s.error(len(s.src), fmt.Sprintf("expected ']' to close the bracket atom opened at col %d, found end of SMILES (SMILES may be truncated)", pos+1))
	return pos, tILLEGAL, s.src[pos:]
}

func (s *scanner) scanIllegal() (int, token, string) {
	pos := s.off
	c := s.src[pos]
	if isSpace(c) {
		for s.off < len(s.src) && isSpace(s.src[s.off]) {
			s.off++
		}
		if pos > 0 && s.off < len(s.src) {
			s.error(pos, "unexpected space (a SMILES string cannot contain spaces)")
		}
		return pos, tILLEGAL, s.src[pos:s.off]
	}
	if c >= 0x80 {
		r, n := utf8.DecodeRuneInString(s.src[pos:])
		s.off += n
		if r == utf8.RuneError {
			s.error(pos, fmt.Sprintf("unexpected byte %#x (not UTF-8 text)", s.src[pos]))
		} else {
			s.error(pos, fmt.Sprintf("unexpected character %q", r))
		}
		return pos, tILLEGAL, s.src[pos:s.off]
	}
	s.off++
	s.error(pos, s.illegalMsg(pos))
	return pos, tILLEGAL, s.src[pos:s.off]
}

// illegalMsg explains a character that cannot start a token.
func (s *scanner) illegalMsg(pos int) string {
	c := s.src[pos]
	switch {
	case c == 'H':
		return "unexpected 'H' (hydrogen outside brackets must be written [H], or as a count inside a bracket atom: [NH4+])"
	case c == ']':
		return "unexpected ']' without a matching '['"
	case isUpper(c):
		sym := string(c)
		if pos+1 < len(s.src) && isLower(s.src[pos+1]) && graph.IsElement(s.src[pos:pos+2]) {
			sym = s.src[pos : pos+2]
		}
		if graph.IsElement(sym) {
			return fmt.Sprintf("unexpected '%c' (element %s is not in the organic subset: write it in brackets, [%s])", c, sym, sym)
		}
	case isLower(c) && pos > 0 && isUpper(s.src[pos-1]) && graph.IsElement(s.src[pos-1:pos+1]):
		sym := s.src[pos-1 : pos+1]
		return fmt.Sprintf("unexpected '%c' (element %s is not in the organic subset: write it in brackets, [%s])", c, sym, sym)
	}
	return fmt.Sprintf("unexpected character %q", rune(c))
}

// describeAt names what is at offset i, for "found ..." messages.
func (s *scanner) describeAt(i int) string {
	if i >= len(s.src) {
		return "end of SMILES"
	}
	if isSpace(s.src[i]) {
		return "space"
	}
	r, _ := utf8.DecodeRuneInString(s.src[i:])
	return fmt.Sprintf("%q", r)
}

func isDigit(c byte) bool { return c >= '0' && c <= '9' }
func isUpper(c byte) bool { return c >= 'A' && c <= 'Z' }
func isLower(c byte) bool { return c >= 'a' && c <= 'z' }
func isSpace(c byte) bool { return c == ' ' || c == '\t' || c == '\n' || c == '\r' }
