package smiles

import (
	"errors"
	"strings"
	"testing"
)

// Error positions and messages, in the manner of go/scanner's error table
// (common practice, no source). The caret column shows where Pos points.
func TestErrors(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		src   string
		caret string // "^" under the expected offset
		msg   string
	}{
		{"C1CCC", " ^", "unclosed ring bond 1 (SMILES may be truncated)"},
		{"CC(C", "  ^", "unbalanced parenthesis: '(' is never closed"},
		{"CC)C", "  ^", "unbalanced parenthesis: ')' without a matching '('"},
		{"C()C", " ^", "empty branch"},
		{"C((C))", "  ^", "expected atom or bond after '(', found '('"},
		{"(C)C", "^", "expected atom before '('"},
		{"C=", "  ^", "expected atom after bond '=', found end of SMILES"},
		{"C=#C", "  ^", "expected atom after bond '=', found bond '#'"},
		{"C=(C)C", "  ^", "bond goes inside the branch"},
		{"=C", "^", "expected atom before bond '='"},
		{"C..C", "  ^", "empty component"},
		{"C.", "  ^", "expected atom after '.', found end of SMILES"},
		{".C", "^", "expected atom before '.'"},
		{"1CC1", "^", "expected atom before ring-bond number 1"},
		{"C-1CCCCC=1", "        ^", "mismatched ring-bond orders for ring 1"},
		{"C11", "  ^", "closes on the atom that opened it"},
		{"C12CCCCC12", "         ^", "duplicates the bond"},
		{"C%1CC", " ^", "expected two digits after '%'"},
		{"CNaC", "  ^", "element Na is not in the organic subset: write it in brackets, [Na]"},
		{"CHC", " ^", "hydrogen outside brackets must be written [H]"},
		{"Xe", "^", "element Xe is not in the organic subset"},
		{"C?C", " ^", "unexpected character '?'"},
		{"CC C", "  ^", "unexpected space"},
		{"C[NH4+", "      ^", "expected ']' to close the bracket atom opened at col 2"},
		{"C[NH4+C", "       ^", "expected ']' to close the bracket atom opened at col 2"},
		{"C[Xx]", "  ^", "unknown element symbol 'Xx'"},
		{"C[]", "  ^", "expected element symbol, found ']'"},
		{"[C@X]", "   ^", "expected ']', found 'X' (bracket atom grammar: [ <isotope>? <symbol> <chiral>? <hcount>? <charge>? <class>? ])"},
		{"[NH4+:]", "      ^", "expected atom class number after ':'"},
		{"[C+16]", "  ^", "charge +16 out of range"},
		{"[C@TH3]", "     ^", "expected a number 1–2 after '@TH'"},
		{"C]", " ^", "unexpected ']' without a matching '['"},
		{"", "^", "empty SMILES"},
		// Chemistry found by perception, positioned at the atom.
		{"CN(C)(C)C", " ^", "impossible valence for N (4 bonds)"},
		{"CC(C)(C)(C)C", " ^", "impossible valence for C (5 bonds)"},
		{"CO(C)C", " ^", "impossible valence for O (3 bonds)"},
		{"C=Cl", "  ^", "impossible valence for Cl (2 bonds)"},
		{"[CH5]", "^", "impossible valence for C (5 bonds including 5 H)"},
		{"Ccc", " ^", "aromatic atom outside a ring"},
		{"[Cl-].Co", "       ^", "for the element Co write [Co]"},
		{"c1cccn1", "     ^", "cannot kekulize aromatic system"},
		{"c1cccn1", "     ^", "did you mean [nH]?"},
		{"c1ccccc1c1cccc1", "        ^", "cannot kekulize aromatic system"},
		{"[Na]c1", "     ^", "unclosed ring bond 1"},
	} {
		_, err := Parse(tc.src)
		if err == nil {
			t.Errorf("Parse(%q): no error, want %q", tc.src, tc.msg)
			continue
		}
		var l ErrorList
		if !errors.As(err, &l) || len(l) == 0 {
			t.Errorf("Parse(%q): error %T is not a non-empty ErrorList", tc.src, err)
			continue
		}
		pos := strings.Index(tc.caret, "^")
		found := false
		for _, e := range l {
			if e.Pos == pos && strings.Contains(e.Msg, tc.msg) {
				found = true
			}
		}
		if !found {
			t.Errorf("Parse(%q) = %v\nwant at col %d: %q\n%s", tc.src, err, pos+1, tc.msg, Caret(tc.src, l[0].Pos))
		}
	}
}

func TestErrorListFormat(t *testing.T) {
	t.Parallel()
	_, err := Parse("C1CC(C")
	l, ok := AsList(err)
	if !ok || len(l) != 2 {
		t.Fatalf("got %v, want two errors", err)
	}
	want := "smiles: col 2: unclosed ring bond 1 (SMILES may be truncated) (and 1 more errors)"
	if err.Error() != want {
		t.Errorf("Error() = %q\nwant      %q", err.Error(), want)
	}
	if (ErrorList{}).Err() != nil {
		t.Error("empty ErrorList.Err() != nil")
	}
	if l[0].Pos > l[1].Pos {
		t.Error("errors not sorted by position")
	}
}

// Several independent errors are all reported, up to the cap.
func TestErrorsCollected(t *testing.T) {
	t.Parallel()
	_, err := Parse("C?C?C?C")
	l, _ := AsList(err)
	if len(l) != 3 {
		t.Errorf("got %d errors (%v), want 3", len(l), err)
	}
	// Chemistry errors are collected too, each at its atom.
	_, err = Parse("CN(C)(C)C.CO(C)C.C=Cl")
	l, _ = AsList(err)
	if len(l) != 3 || l[0].Pos != 1 || l[1].Pos != 11 || l[2].Pos != 19 {
		t.Errorf("got %v, want valence errors at cols 2, 12 and 20", err)
	}
	_, err = Parse(strings.Repeat("?", 50))
	l, _ = AsList(err)
	if len(l) > maxErrors {
		t.Errorf("got %d errors, want at most %d", len(l), maxErrors)
	}
}

func TestCaret(t *testing.T) {
	t.Parallel()
	if got, want := Caret("C1CCC", 1), "C1CCC\n ^"; got != want {
		t.Errorf("Caret = %q, want %q", got, want)
	}
	long := strings.Repeat("C", 150) + "?" + strings.Repeat("C", 150)
	got := Caret(long, 150)
	lines := strings.Split(got, "\n")
	if len(lines) != 2 || !strings.HasPrefix(lines[0], "...") || !strings.HasSuffix(lines[0], "...") {
		t.Fatalf("Caret of a long string = %q, want a window with ... on both sides", got)
	}
	col := strings.Index(lines[1], "^")
	if lines[0][col] != '?' {
		t.Errorf("caret points at %q, want '?'", lines[0][col])
	}
	if len(lines[0]) > caretWindow+6 {
		t.Errorf("window is %d characters, want about %d", len(lines[0]), caretWindow)
	}
}

// One-line lists of valid and invalid strings, as go/parser's short_test
// (common practice, no source).
var valids = []string{
	"C", "CC", "C=C", "C#C", "C$C", "C:C", "C-C", "C/C=C\\C", "[C@@H](F)(Cl)Br", "c1ccccc1",
	"C1CC1", "C%10CC%10", "C%(123)CC%(123)", "[13CH3]C", "[nH]1cccc1", "[se]1cccc1",
	"[asH]1cccc1", "[NH4+].[Cl-]", "[Fe+3]", "[O-2]", "[C@TH1](F)(Cl)(Br)I", "[Fe@OH1](C)(C)(C)(C)(C)C",
	"CC(C)(C)C", "C(=O)O", "OC(=O)C(N)C", "[*]", "*C", "CC*", "[2H]", "[H]", "[H][H]", "[H+]",
	"F[P-](F)(F)(F)(F)F", "O=[Xe](=O)(=O)=O", "C1.C1", "c1cc2ccccc2cc1", "C12(CCCCC1)CCCCC2",
	"CC(C)CC ", " C",
}

var invalids = []string{
	"C(", "C)", "C1", "C=", "[C", "C]", "C[", "C((C))", "()", "C.", ".", "..", "C..C", "1", "%", "%1",
	"C%1", "[Zz]", "[C+20]", "C=1CC-1", "C11", "Q", "c", "cc", "c1ccc1c", "N1=CC=CC=C1=C",
	"[HH]", "C(C)(C)(C)(C)C", "[C@OH]", "C C",
}

func TestValids(t *testing.T) {
	t.Parallel()
	for _, s := range valids {
		if _, err := Parse(s); err != nil {
			t.Errorf("Parse(%q): %v", s, err)
		}
	}
}

func TestInvalids(t *testing.T) {
	t.Parallel()
	for _, s := range invalids {
		_, err := Parse(s)
		if err == nil {
			t.Errorf("Parse(%q): no error", s)
			continue
		}
		l, _ := AsList(err)
		for _, e := range l {
			if e.Pos < 0 || e.Pos > len(s) {
				t.Errorf("Parse(%q): error position %d outside [0, %d]", s, e.Pos, len(s))
			}
		}
	}
}
