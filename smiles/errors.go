package smiles

import (
	"fmt"
	"sort"
)

// Error is one problem in a SMILES string.
type Error struct {
	Pos int    // 0-based byte offset into the SMILES string
	Msg string // "expected X, found Y", or a problem plus its likely cause
}

// Error returns "smiles: col N: msg" with the 1-based column N = Pos+1.
func (e *Error) Error() string { return fmt.Sprintf("smiles: col %d: %s", e.Pos+1, e.Msg) }

// ErrorList is a list of *Error, in the manner of go/scanner.ErrorList.
// The zero value is an empty list ready to use.
type ErrorList []*Error

// Add appends an error at pos.
func (l *ErrorList) Add(pos int, msg string) { *l = append(*l, &Error{Pos: pos, Msg: msg}) }

// Len, Swap and Less implement sort.Interface: by position, then message.
func (l ErrorList) Len() int      { return len(l) }
func (l ErrorList) Swap(i, j int) { l[i], l[j] = l[j], l[i] }
func (l ErrorList) Less(i, j int) bool {
	if l[i].Pos != l[j].Pos {
		return l[i].Pos < l[j].Pos
	}
	return l[i].Msg < l[j].Msg
}

// Sort sorts the list by position, then message.
func (l ErrorList) Sort() { sort.Stable(l) }

// RemoveMultiples sorts the list and keeps the first error at each position.
func (l *ErrorList) RemoveMultiples() {
	l.Sort()
	var out ErrorList
	for i, e := range *l {
		if i == 0 || e.Pos != (*l)[i-1].Pos {
			out = append(out, e)
		}
	}
	*l = out
}

// Error summarises the list: the first error, and how many more there are.
func (l ErrorList) Error() string {
	switch len(l) {
	case 0:
		return "no errors"
	case 1:
		return l[0].Error()
	}
	return fmt.Sprintf("%s (and %d more errors)", l[0], len(l)-1)
}

// Err returns nil when the list is empty and the list otherwise.
func (l ErrorList) Err() error {
	if len(l) == 0 {
		return nil
	}
	return l
}

// Warning is a construct that was accepted but not fully understood, such
// as an extended chirality class, positioned like Error.
type Warning struct {
	Pos int
	Msg string
}

// String returns "col N: msg".
func (w Warning) String() string { return fmt.Sprintf("col %d: %s", w.Pos+1, w.Msg) }
