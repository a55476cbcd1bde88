package spectrum

import (
	"bytes"
	"math"
	"sort"
	"strconv"
	"strings"
)

// CSV input holds either a trace (ppm, intensity) or a peak list
// (ppm[, intensity][, width in Hz]). Rules:
//
//   - '#' starts a comment line; blank lines are skipped;
//   - the separator is the first of tab, ';', ',' found in the first data
//     line, else blanks; with ';' a decimal comma is accepted;
//   - a first line with a field that is not a number is a header; its
//     names may reorder the columns (ppm/shift, intensity/height, width);
//   - two columns with at least minTraceRows rows whose ppm steps are
//     (nearly all) equal form a trace; a row that breaks an otherwise even
//     spacing is an error; anything else is a peak list.

// minTraceRows is the fewest rows read as a trace in CSVAuto mode.
const minTraceRows = 32

// csvRow is one data row with its line number.
type csvRow struct {
	line int
	v    [3]float64
}

// csvTable is a parsed CSV file before interpretation.
type csvTable struct {
	file     string
	sep      byte // 0 for blanks
	cols     int
	header   []string
	rows     []csvRow
	decimals int // most decimals written in the ppm column
	order    [3]int
}

func readCSVBytes(data []byte, name string, opt ReadOptions) (*Spectrum, error) {
	data = normalizeEOL(data)
	t := &csvTable{file: name, order: [3]int{0, 1, 2}}
	if err := t.parse(data); err != nil {
		return nil, err
	}
	s := &Spectrum{Nucleus: "1H", Source: name, FieldMHz: opt.FieldMHz}
	kind := opt.CSV
	if kind == CSVAuto {
		k, err := t.detect()
		if err != nil {
			return nil, err
		}
		kind = k
	}
	if kind == CSVTrace {
		return s, t.trace(s)
	}
	t.peaks(s)
	return s, nil
}

// parse splits the lines into fields and numbers.
func (t *csvTable) parse(data []byte) error {
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	num, lastLine := 0, 1
	for len(data) > 0 {
		num++
		line := data
		if i := bytes.IndexByte(data, '\n'); i >= 0 {
			line, data = data[:i], data[i+1:]
		} else {
			data = nil
		}
		text := strings.TrimSpace(string(line))
		if text == "" || text[0] == '#' {
			continue
		}
		lastLine = num
		if err := t.addLine(num, text); err != nil {
			return err
		}
	}
	if len(t.rows) == 0 {
		return errorf(t.file, lastLine, "no data rows")
	}
	return nil
}

// addLine handles one non-comment line.
func (t *csvTable) addLine(num int, text string) error {
	if t.cols == 0 && t.header == nil {
		t.sep = pickSep(text)
	}
	fields := t.split(text)
	if t.cols == 0 && t.header == nil && !t.allNumeric(fields) && !t.anyNonFinite(fields) {
		t.header = fields
		t.mapHeader()
		return nil
	}
	if t.cols == 0 {
		t.cols = len(fields)
		if t.cols > 3 {
			return errorf(t.file, num, "%d columns; expected ppm[, intensity][, width]", t.cols)
		}
	}
	if len(fields) != t.cols {
		return errorf(t.file, num, "%d columns, but the first data row has %d", len(fields), t.cols)
	}
	if len(t.rows) >= maxPoints {
		return errorf(t.file, num, "more than %d rows", maxPoints)
	}
	r := csvRow{line: num}
	for i, f := range fields {
		v, err := t.number(f)
		if err == strconv.ErrRange {
			return errorf(t.file, num, "column %d: %q is not a finite number", i+1, clip(f))
		}
		if err != nil {
			return errorf(t.file, num, "column %d: expected a number, found %q", i+1, clip(f))
		}
		r.v[i] = v
	}
	if k := t.order[0]; k < len(fields) {
		t.decimals = max(t.decimals, decimals(fields[k]))
	}
	t.rows = append(t.rows, r)
	return nil
}

// pickSep chooses the field separator from the first line.
func pickSep(line string) byte {
	for _, c := range []byte{'\t', ';', ','} {
		if strings.IndexByte(line, c) >= 0 {
			return c
		}
	}
	return 0
}

// split splits a line into trimmed fields, dropping one trailing empty
// field (a trailing separator).
func (t *csvTable) split(text string) []string {
	var f []string
	if t.sep == 0 {
		f = strings.Fields(text)
	} else {
		f = strings.Split(text, string(t.sep))
	}
	for i := range f {
		f[i] = strings.Trim(strings.TrimSpace(f[i]), `"`)
	}
	if len(f) > 1 && f[len(f)-1] == "" {
		f = f[:len(f)-1]
	}
	return f
}

// number parses one field; with ';' separators a decimal comma is allowed.
func (t *csvTable) number(f string) (float64, error) {
	if t.sep == ';' {
		f = strings.Replace(f, ",", ".", 1)
	}
	v, err := strconv.ParseFloat(f, 64)
	if err == nil && (math.IsNaN(v) || math.IsInf(v, 0)) {
		err = strconv.ErrRange
	}
	return v, err
}

// allNumeric reports whether every field is a number (else the first line
// is a header).
func (t *csvTable) allNumeric(fields []string) bool {
	for _, f := range fields {
		if _, err := t.number(f); err != nil {
			return false
		}
	}
	return true
}

// anyNonFinite reports whether a field reads as NaN or ±Inf: such a line is
// data with a bad value, not a header.
func (t *csvTable) anyNonFinite(fields []string) bool {
	for _, f := range fields {
		if _, err := t.number(f); err == strconv.ErrRange {
			return true
		}
	}
	return false
}

// decimals counts the digits after the decimal point (or comma).
func decimals(f string) int {
	i := strings.IndexAny(f, ".,")
	if i < 0 {
		return 0
	}
	n := 0
	for _, c := range []byte(f[i+1:]) {
		if !isDigit(c) {
			break
		}
		n++
	}
	return n
}

// mapHeader reorders columns by header names when they are recognised.
func (t *csvTable) mapHeader() {
	idx := [3]int{-1, -1, -1}
	for i, h := range t.header {
		h = strings.ToLower(h)
		k := -1
		switch {
		case strings.Contains(h, "ppm") || strings.Contains(h, "shift") || strings.Contains(h, "delta"):
			k = 0
		case strings.Contains(h, "int") || strings.Contains(h, "height") || strings.Contains(h, "amp"):
			k = 1
		case strings.Contains(h, "width") || strings.Contains(h, "fwhm"):
			k = 2
		}
		if k < 0 || idx[k] >= 0 || i > 2 {
			return // unknown or repeated name: keep the positional order
		}
		idx[k] = i
	}
	if idx[0] < 0 {
		return
	}
	next := len(t.header)
	for k := range idx {
		if idx[k] < 0 {
			idx[k] = next // absent column
			next++
		}
	}
	t.order = idx
}

// col returns column k (0 ppm, 1 intensity, 2 width) of a row, and whether
// the file has it.
func (t *csvTable) col(r csvRow, k int) (float64, bool) {
	i := t.order[k]
	if i >= t.cols {
		return 0, false
	}
	return r.v[i], true
}

// detect decides between trace and peak list (see the rules above).
func (t *csvTable) detect() (CSVKind, error) {
	if t.cols != 2 || len(t.rows) < minTraceRows || t.headerHasWidth() {
		return CSVPeaks, nil
	}
	steps := make([]float64, len(t.rows)-1)
	for i := range steps {
		a, _ := t.col(t.rows[i], 0)
		b, _ := t.col(t.rows[i+1], 0)
		steps[i] = b - a
	}
	med := csvMedian(steps)
	if med == 0 {
		return CSVPeaks, nil
	}
	tol := 0.02*math.Abs(med) + 2*math.Pow(10, -float64(t.decimals))
	bad := -1
	nbad := 0
	for i, s := range steps {
		if math.Abs(s-med) > tol {
			if bad < 0 {
				bad = i
			}
			nbad++
		}
	}
	switch {
	case nbad == 0:
		return CSVTrace, nil
	case nbad*10 <= len(steps):
		r := t.rows[bad+1]
		return 0, errorf(t.file, r.line, "ppm step %s breaks the even spacing %s of the other rows: a broken trace or an ambiguous peak list (choose the kind explicitly)",
			fmtNum(steps[bad]), fmtNum(med))
	}
	return CSVPeaks, nil
}

func (t *csvTable) headerHasWidth() bool {
	for _, h := range t.header {
		h = strings.ToLower(h)
		if strings.Contains(h, "width") || strings.Contains(h, "fwhm") {
			return true
		}
	}
	return false
}

func csvMedian(v []float64) float64 {
	c := append([]float64(nil), v...)
	sort.Float64s(c)
	return c[len(c)/2]
}

// trace stores the rows as an ascending-ppm trace; the ppm column must be
// strictly monotonic in file order.
func (t *csvTable) trace(s *Spectrum) error {
	if t.cols < 2 {
		return errorf(t.file, t.rows[0].line, "a trace needs two columns (ppm, intensity)")
	}
	n := len(t.rows)
	s.PPM = make([]float64, n)
	s.Y = make([]float64, n)
	for i, r := range t.rows {
		s.PPM[i], _ = t.col(r, 0)
		s.Y[i], _ = t.col(r, 1)
	}
	if n > 1 {
		up := s.PPM[1] > s.PPM[0]
		for i := 1; i < n; i++ {
			if d := s.PPM[i] - s.PPM[i-1]; d == 0 || (d > 0) != up {
				return errorf(t.file, t.rows[i].line, "trace ppm values are not strictly monotonic")
			}
		}
		if !up {
			reverseFloats(s.PPM)
			reverseFloats(s.Y)
		}
	}
	return nil
}

// peaks stores the rows as a peak list sorted by ppm; a missing intensity
// column gives intensity 1.
func (t *csvTable) peaks(s *Spectrum) {
	s.PeakTable = make([]Peak, len(t.rows))
	for i, r := range t.rows {
		p := Peak{Intensity: 1}
		p.PPM, _ = t.col(r, 0)
		if v, ok := t.col(r, 1); ok {
			p.Intensity = v
		}
		if v, ok := t.col(r, 2); ok {
			p.WidthHz = v
		}
		s.PeakTable[i] = p
	}
	sort.SliceStable(s.PeakTable, func(i, j int) bool { return s.PeakTable[i].PPM < s.PeakTable[j].PPM })
}
