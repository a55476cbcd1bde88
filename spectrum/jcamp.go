package spectrum

import (
	"errors"
	"io"
	"math"
	"strconv"
	"strings"
)

// maxPoints caps how many points one table may hold (4,194,304, far above
// any 1D 1H spectrum), whatever ##NPOINTS claims; preallocation is capped
// lower still (see preallocPoints) so that a false claim costs little.
const (
	maxPoints   = 1 << 22
	maxPrealloc = 1 << 20
)

// ReadJCAMPAll reads every spectrum block of a JCAMP-DX file: XYDATA,
// XYPOINTS, PEAK TABLE and NTUPLES (real part) blocks. Blocks without
// spectral data (LINK headers, structures, peak assignments) are skipped.
func ReadJCAMPAll(r io.Reader, name string) ([]*Spectrum, error) {
	return ReadJCAMPAllWith(r, name, ReadOptions{})
}

// ReadJCAMPAllWith is ReadJCAMPAll with options.
func ReadJCAMPAllWith(r io.Reader, name string, opt ReadOptions) ([]*Spectrum, error) {
	data, err := readAll(r, name)
	if err != nil {
		return nil, err
	}
	return readJCAMPAllBytes(data, name, opt)
}

func readJCAMPAllBytes(data []byte, file string, opt ReadOptions) ([]*Spectrum, error) {
	recs, last, err := scanRecords(normalizeEOL(data), file)
	if err != nil {
		return nil, err
	}
	blocks, err := splitBlocks(recs, last, file)
	var noEnd errMissingEnd
	if errors.As(err, &noEnd) {
		if !completeWithoutEnd(blocks) {
			return nil, noEnd.ParseError
		}
		err = nil // the open block's data must prove complete below
	}
	if err != nil {
		return nil, err
	}
	var out []*Spectrum
	for _, b := range blocks {
		s, err := readBlock(b, file, opt)
		if err != nil {
			if !b.ended {
				return nil, noEnd.ParseError // truncated: say so
			}
			return nil, err
		}
		if s == nil {
			continue
		}
		if !b.ended {
			s.Warnings = append(s.Warnings, errorf(file, noEnd.Line, "no ##END= at the end of the file; the data are complete (##NPOINTS= matched)").Error())
		}
		out = append(out, s)
	}
	if len(out) == 0 {
		return nil, errorf(file, blocks[0].line, "no spectrum in the file (expected ##XYDATA=, ##XYPOINTS=, ##PEAK TABLE= or ##NTUPLES=)")
	}
	return out, nil
}

// readJCAMPBytes picks one spectrum: the first 1H trace, else the first
// trace, else the first peak table. A trace without its own peak table gets
// the peak table of another block for the same nucleus (LINK files).
func readJCAMPBytes(data []byte, file string, opt ReadOptions) (*Spectrum, error) {
	all, err := readJCAMPAllBytes(data, file, opt)
	if err != nil {
		return nil, err
	}
	pick := -1
	for i, s := range all {
		if len(s.PPM) > 0 && s.Nucleus == "1H" {
			pick = i
			break
		}
	}
	for i, s := range all {
		if pick < 0 && len(s.PPM) > 0 {
			pick = i
		}
	}
	if pick < 0 {
		return all[0], nil
	}
	s := all[pick]
	if len(s.PeakTable) == 0 {
		for _, o := range all {
			if len(o.PPM) == 0 && len(o.PeakTable) > 0 && o.Nucleus == s.Nucleus {
				s.PeakTable = o.PeakTable
				break
			}
		}
	}
	return s, nil
}

// blockReader interprets the records of one block.
type blockReader struct {
	b    *block
	file string
	opt  ReadOptions
	s    *Spectrum
}

// readBlock returns the spectrum of one block, or nil for a block without
// spectral data.
func readBlock(b *block, file string, opt ReadOptions) (*Spectrum, error) {
	br := &blockReader{b: b, file: file, opt: opt}
	if err := br.meta(); err != nil {
		return nil, err
	}
	var err error
	switch {
	case b.find("NTUPLES") != nil:
		err = br.ntuples()
	case b.find("XYDATA") != nil:
		err = br.xydata()
	case b.find("XYPOINTS") != nil:
		err = br.xypoints()
	case b.find("PEAKTABLE") != nil:
		err = br.peakTable()
	default:
		return nil, nil
	}
	if err != nil {
		return nil, err
	}
	return br.s, nil
}

// meta reads title, nucleus, field and solvent, and refuses time-domain
// and multidimensional data.
func (br *blockReader) meta() error {
	s := &Spectrum{Nucleus: "1H", Source: br.file}
	br.s = s
	if r := br.b.find("TITLE"); r != nil {
		s.Title = strings.ReplaceAll(r.fullValue(), "\n", " ")
	}
	if r := br.b.find("DATATYPE"); r != nil {
		dt := strings.ToUpper(r.value)
		if strings.Contains(dt, "FID") {
			return errorf(br.file, r.line, "time-domain data is not supported yet (##%s=%s)", r.label, r.value)
		}
		if strings.HasPrefix(dt, "ND ") || strings.Contains(dt, "2D") {
			return errorf(br.file, r.line, "multidimensional NMR data is not supported (##%s=%s)", r.label, r.value)
		}
	}
	if r := br.b.find(".OBSERVENUCLEUS"); r != nil {
		if n := strings.TrimSpace(strings.TrimLeft(r.value, "^")); n != "" {
			s.Nucleus = n
		}
	}
	if r := br.b.find(".SOLVENTNAME"); r != nil {
		s.Solvent = r.value
	}
	if r := br.b.find(".OBSERVEFREQUENCY"); r != nil {
		f, err := parseNum(r.value)
		if err != nil || f <= 0 {
			return errorf(br.file, r.line, "##%s: expected a positive frequency in MHz, found %q", r.label, clip(r.value))
		}
		s.FieldMHz = f
	}
	return nil
}

// parseNum parses an AFFN number, tolerating surrounding blanks.
func parseNum(s string) (float64, error) {
	f, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err == nil && (math.IsNaN(f) || math.IsInf(f, 0)) {
		err = strconv.ErrRange
	}
	return f, err
}

// optNum reads an optional numeric record: ok is false when absent.
func (br *blockReader) optNum(name string) (v float64, ok bool, line int, err error) {
	r := br.b.find(name)
	if r == nil {
		return 0, false, 0, nil
	}
	v, e := parseNum(r.value)
	if e != nil {
		return 0, false, r.line, errorf(br.file, r.line, "##%s: expected a number, found %q", r.label, clip(r.value))
	}
	return v, true, r.line, nil
}

// warnf records a tolerated inconsistency as "file:line: msg".
func (br *blockReader) warnf(line int, format string, args ...any) {
	br.s.Warnings = append(br.s.Warnings, errorf(br.file, line, format, args...).Error())
}

// isTimeUnit reports whether an X unit is a time (FID data).
func isTimeUnit(u string) bool {
	switch normLabel(u) {
	case "SECONDS", "SECOND", "SEC", "S", "MS", "MILLISECONDS", "MICROSECONDS", "US", "TIME":
		return true
	}
	return false
}
