package smiles

import (
	"strings"
	"unicode/utf8"
)

// caretWindow is the widest piece of input Caret shows.
const caretWindow = 100

// Caret returns src (windowed to about 100 characters around pos, with
// "..." where it is cut) on one line and a caret under byte offset pos on
// the next, for printing under an error message. A pos at len(src) puts the
// caret just past the end.
func Caret(src string, pos int) string {
	pos = max(0, min(pos, len(src)))
	start, end := 0, len(src)
	if len(src) > caretWindow {
		start = max(0, pos-caretWindow/2)
		end = min(len(src), start+caretWindow)
		if end-start < caretWindow {
			start = max(0, end-caretWindow)
		}
	}
	for start > 0 && !utf8.RuneStart(src[start]) {
		start--
	}
	for end < len(src) && !utf8.RuneStart(src[end]) {
		end++
	}
	line := src[start:end]
	pre := ""
	if start > 0 {
		pre = "..."
	}
	suf := ""
	if end < len(src) {
		suf = "..."
	}
	col := len(pre) + utf8.RuneCountInString(src[start:pos])
	line = strings.Map(func(r rune) rune {
		if r == '\t' || r == '\n' || r == '\r' {
			return ' '
		}
		return r
	}, line)
	return pre + line + suf + "\n" + strings.Repeat(" ", col) + "^"
}
