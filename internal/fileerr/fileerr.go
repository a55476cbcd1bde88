// Package fileerr is the positioned error of the project's TOML inputs
// (shift tables, spin-system files): file, line, key and message, printed as
// "file:line: key: msg".
package fileerr

import (
	"fmt"
	"strings"
)

// Error is a problem at a line of an input file. Line is 1-based (0 when
// unknown); Key names the offending key, e.g. "group[2].count" ("" when
// none).
type Error struct {
	File string
	Line int
	Key  string
	Msg  string
}

// Error reads "file:line: key: msg", leaving out what is unknown.
func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		fmt.Fprintf(&b, ":%d", e.Line)
	}
	b.WriteString(": ")
	if e.Key != "" {
		b.WriteString(e.Key + ": ")
	}
	b.WriteString(e.Msg)
	return b.String()
}
