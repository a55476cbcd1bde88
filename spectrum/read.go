package spectrum

import (
	"bytes"
	"fmt"
	"io"
	"os"
)

// ParseError is an error in a spectrum file, positioned by file name and
// 1-based line number. It prints as "file:line: msg".
type ParseError struct {
	File string // name given to the reader, e.g. the path
	Line int    // 1-based line number; always >= 1
	Msg  string
}

// Error implements error.
func (e *ParseError) Error() string {
	name := e.File
	if name == "" {
		name = "<input>"
	}
	return fmt.Sprintf("%s:%d: %s", name, e.Line, e.Msg)
}

// errorf returns a *ParseError; line values below 1 are raised to 1 so that
// every error names a line.
func errorf(file string, line int, format string, args ...any) *ParseError {
	if line < 1 {
		line = 1
	}
	return &ParseError{File: file, Line: line, Msg: fmt.Sprintf(format, args...)}
}

// CSVKind tells ReadCSV what a CSV file holds.
type CSVKind int

const (
	// CSVAuto detects a trace or a peak list from the content.
	CSVAuto CSVKind = iota
	// CSVTrace reads (ppm, intensity) rows as a trace.
	CSVTrace
	// CSVPeaks reads (ppm[, intensity][, width Hz]) rows as a peak list.
	CSVPeaks
)

// ReadOptions adjust the readers. The zero value is ready to use.
type ReadOptions struct {
	// FieldMHz is the 1H observe frequency to use when the file does not
	// state one (a JCAMP-DX file with X in HZ but no ##.OBSERVE FREQUENCY,
	// or a CSV file). It never overrides a frequency given in the file.
	FieldMHz float64
	// CSV forces the CSV interpretation; CSVAuto detects it.
	CSV CSVKind
}

// maxFileBytes bounds what the readers take in (1 GiB); real 1H spectra are
// a few MB at most.
const maxFileBytes = 1 << 30

// ReadFile reads a spectrum from path, detecting JCAMP-DX or CSV from the
// content. See ReadFileWith.
func ReadFile(path string) (*Spectrum, error) {
	return ReadFileWith(path, ReadOptions{})
}

// ReadFileWith reads a spectrum from path with options. A file whose first
// non-blank line starts with "##" is JCAMP-DX; anything else is read as CSV.
// Errors from the parsers are *ParseError values naming path and line.
func ReadFileWith(path string, opt ReadOptions) (*Spectrum, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return readBytes(data, path, opt)
}

func readBytes(data []byte, name string, opt ReadOptions) (*Spectrum, error) {
	data = normalizeEOL(data)
	if IsJCAMP(data) {
		return readJCAMPBytes(data, name, opt)
	}
	return readCSVBytes(data, name, opt)
}

// IsJCAMP reports whether data looks like JCAMP-DX: its first line that is
// neither blank nor a "$$" comment starts with "##".
func IsJCAMP(data []byte) bool {
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	for len(data) > 0 {
		line := data
		if i := bytes.IndexByte(data, '\n'); i >= 0 {
			line, data = data[:i], data[i+1:]
		} else {
			data = nil
		}
		line = bytes.TrimSpace(line)
		if len(line) == 0 || bytes.HasPrefix(line, []byte("$$")) {
			continue
		}
		return bytes.HasPrefix(line, []byte("##"))
	}
	return false
}

// normalizeEOL turns the lone carriage returns of a file with classic Mac
// line ends (CR only, no LF anywhere) into line feeds; other files are
// returned unchanged (CRLF is handled line by line).
func normalizeEOL(data []byte) []byte {
	if bytes.IndexByte(data, '\n') >= 0 || bytes.IndexByte(data, '\r') < 0 {
		return data
	}
	return bytes.ReplaceAll(data, []byte{'\r'}, []byte{'\n'})
}

// readAll reads r up to maxFileBytes.
func readAll(r io.Reader, name string) ([]byte, error) {
	data, err := io.ReadAll(io.LimitReader(r, maxFileBytes+1))
	if err != nil {
		return nil, err
	}
	if len(data) > maxFileBytes {
		return nil, fmt.Errorf("%s: file larger than %d bytes", name, maxFileBytes)
	}
	return data, nil
}

// ReadJCAMP reads the 1H spectrum of a JCAMP-DX file (see ReadJCAMPAll for
// how the block is chosen). name labels errors.
func ReadJCAMP(r io.Reader, name string) (*Spectrum, error) {
	return ReadJCAMPWith(r, name, ReadOptions{})
}

// ReadJCAMPWith is ReadJCAMP with options.
func ReadJCAMPWith(r io.Reader, name string, opt ReadOptions) (*Spectrum, error) {
	data, err := readAll(r, name)
	if err != nil {
		return nil, err
	}
	return readJCAMPBytes(data, name, opt)
}

// ReadCSV reads a trace or a peak list from CSV text; name labels errors.
func ReadCSV(r io.Reader, name string) (*Spectrum, error) {
	return ReadCSVWith(r, name, ReadOptions{})
}

// ReadCSVWith is ReadCSV with options.
func ReadCSVWith(r io.Reader, name string, opt ReadOptions) (*Spectrum, error) {
	data, err := readAll(r, name)
	if err != nil {
		return nil, err
	}
	return readCSVBytes(data, name, opt)
}
