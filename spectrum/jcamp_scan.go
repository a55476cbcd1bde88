package spectrum

import (
	"bytes"
	"strings"
)

// dataLine is one physical line that follows a labelled data record, with
// its "$$" comment removed.
type dataLine struct {
	num  int // 1-based line number
	text []byte
}

// ldr is one labelled data record: "##NAME= value" plus the lines that
// follow it up to the next record.
type ldr struct {
	name  string     // normalised: upper case, no spaces, dashes, slashes or underscores
	label string     // as written, trimmed, for messages
	value string     // text after '=' on the record's first line, trimmed
	line  int        // line of the "##"
	more  []dataLine // continuation lines (data lines for tables)
}

// fullValue returns the value joined with its continuation lines.
func (r *ldr) fullValue() string {
	if len(r.more) == 0 {
		return r.value
	}
	var b strings.Builder
	b.WriteString(r.value)
	for _, l := range r.more {
		t := bytes.TrimSpace(l.text)
		if len(t) == 0 {
			continue
		}
		b.WriteByte('\n')
		b.Write(t)
	}
	return b.String()
}

// lastLine returns the number of the record's last line.
func (r *ldr) lastLine() int {
	if n := len(r.more); n > 0 {
		return r.more[n-1].num
	}
	return r.line
}

// block is one ##TITLE= ... ##END= block. Nested blocks (LINK files) are
// listed separately, each with its own records.
type block struct {
	recs  []*ldr
	line  int // line of ##TITLE=
	ended bool
}

// find returns the first record named name (normalised), or nil.
func (b *block) find(name string) *ldr {
	for _, r := range b.recs {
		if r.name == name {
			return r
		}
	}
	return nil
}

// normLabel normalises a label name the JCAMP-DX way: letters upper case,
// spaces, dashes, slashes and underscores dropped.
func normLabel(s string) string {
	var b strings.Builder
	b.Grow(len(s))
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == ' ' || c == '-' || c == '/' || c == '_' || c == '\t':
		case c >= 'a' && c <= 'z':
			b.WriteByte(c - 'a' + 'A')
		default:
			b.WriteByte(c)
		}
	}
	return b.String()
}

// stripComment removes a "$$" comment and a trailing carriage return.
func stripComment(line []byte) []byte {
	if i := bytes.Index(line, []byte("$$")); i >= 0 {
		line = line[:i]
	}
	return bytes.TrimRight(line, "\r")
}

// scanRecords splits data into labelled data records. Lines before the
// first record that are not blank are reported as an error.
func scanRecords(data []byte, file string) ([]*ldr, int, error) {
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	// All continuation lines share one slice, sized by a line count, so
	// that large tables cost one allocation.
	pool := make([]dataLine, 0, bytes.Count(data, []byte{'\n'})+1)
	var recs []*ldr
	var starts []int
	num := 0
	for len(data) > 0 {
		num++
		line := data
		if i := bytes.IndexByte(data, '\n'); i >= 0 {
			line, data = data[:i], data[i+1:]
		} else {
			data = nil
		}
		if bytes.HasPrefix(bytes.TrimLeft(line, " \t"), []byte("##")) {
			r, err := parseLabel(line, num, file)
			if err != nil {
				return nil, num, err
			}
			recs = append(recs, r)
			starts = append(starts, len(pool))
			continue
		}
		line = stripComment(line)
		if len(recs) == 0 {
			if len(bytes.TrimSpace(line)) != 0 {
				return nil, num, errorf(file, num, "expected a ##LABEL= record, found %q", clip(string(line)))
			}
			continue
		}
		pool = append(pool, dataLine{num: num, text: line})
	}
	for i, r := range recs {
		end := len(pool)
		if i+1 < len(starts) {
			end = starts[i+1]
		}
		if end > starts[i] {
			r.more = pool[starts[i]:end:end]
		}
	}
	return recs, num, nil
}

// parseLabel parses the first line of a record: "##NAME= value".
func parseLabel(line []byte, num int, file string) (*ldr, error) {
	line = stripComment(bytes.TrimLeft(line, " \t"))
	body := line[2:]
	eq := bytes.IndexByte(body, '=')
	if eq < 0 {
		return nil, errorf(file, num, "record %q has no '='", clip(string(line)))
	}
	label := strings.TrimSpace(string(body[:eq]))
	return &ldr{
		name:  normLabel(label),
		label: label,
		value: strings.TrimSpace(string(body[eq+1:])),
		line:  num,
	}, nil
}

// clip shortens s for messages.
func clip(s string) string {
	s = strings.TrimSpace(s)
	if len(s) > 40 {
		return s[:40] + "..."
	}
	return s
}

// splitBlocks groups records into blocks: ##TITLE= opens a block (nested
// when another is open, as in LINK files) and ##END= closes the innermost.
func splitBlocks(recs []*ldr, lastLine int, file string) ([]*block, error) {
	var all, stack []*block
	for _, r := range recs {
		switch r.name {
		case "TITLE":
			b := &block{line: r.line}
			all = append(all, b)
			stack = append(stack, b)
		case "END":
			if len(stack) == 0 {
				return nil, errorf(file, r.line, "##END= without an open block")
			}
			stack[len(stack)-1].ended = true
			stack = stack[:len(stack)-1]
			continue
		}
		if len(stack) == 0 {
			return nil, errorf(file, r.line, "expected ##TITLE= to open a block, found ##%s=", r.label)
		}
		top := stack[len(stack)-1]
		top.recs = append(top.recs, r)
	}
	if len(all) == 0 {
		return nil, errorf(file, 1, "no ##TITLE= record: not a JCAMP-DX file")
	}
	if len(stack) > 0 {
		// Left open at the end of the file: readJCAMPAllBytes accepts the
		// block only when its data prove complete (see missingEnd).
		return all, missingEnd(file, lastLine, stack[len(stack)-1].line)
	}
	return all, nil
}

// errMissingEnd marks the error of a file whose last block has no ##END=.
type errMissingEnd struct{ *ParseError }

func missingEnd(file string, lastLine, open int) error {
	return errMissingEnd{errorf(file, lastLine, "missing ##END= for the block opened at line %d (file truncated?)", open)}
}

// completeWithoutEnd reports whether an unterminated block still proves its
// data complete: a single XYDATA trace whose ##NPOINTS= the reader checks
// (a truncated trace then fails that check instead).
func completeWithoutEnd(blocks []*block) bool {
	open := 0
	for _, b := range blocks {
		if !b.ended {
			open++
			if b.find("XYDATA") == nil || b.find("NPOINTS") == nil {
				return false
			}
		}
	}
	return open == 1
}
