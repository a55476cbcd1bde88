package spectrum

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// yFullScale is the largest integer the writer uses for Y: the trace is
// scaled so that its largest magnitude becomes 10^9, which keeps a relative
// precision of 10^-9 of the maximum (the quantisation of the round trip).
const yFullScale = 1e9

// maxLineLen is the longest data line the writer produces (JCAMP-DX asks
// for at most 80 characters).
const maxLineLen = 80

// WriteJCAMP writes s as a JCAMP-DX 5.01 "NMR SPECTRUM" block with
// ##XYDATA=(X++(Y..Y)): AFFN when compressed is false, DIFDUP (with Y-check
// values) when true. X is in HZ when s.FieldMHz is known, else in PPM, and
// runs from high to low frequency. Y is written as integers times YFACTOR
// (see yFullScale). A spectrum with only a PeakTable is written as
// ##PEAK TABLE=(XYW..XYW). The trace must be evenly spaced.
func WriteJCAMP(w io.Writer, s *Spectrum, compressed bool) error {
	if s == nil {
		return errors.New("spectrum: WriteJCAMP of a nil spectrum")
	}
	bw := bufio.NewWriter(w)
	writeHeader(bw, s)
	var err error
	if len(s.PPM) > 0 {
		err = writeTrace(bw, s, compressed)
	} else {
		err = writePeakTable(bw, s)
	}
	if err != nil {
		return err
	}
	fmt.Fprintf(bw, "##END=\n")
	return bw.Flush()
}

// writeHeader writes the descriptive records.
func writeHeader(w *bufio.Writer, s *Spectrum) {
	title := strings.ReplaceAll(s.Title, "\n", " ")
	if title == "" {
		title = "1H spectrum"
	}
	fmt.Fprintf(w, "##TITLE=%s\n##JCAMP-DX=5.01\n##DATA TYPE=NMR SPECTRUM\n", title)
	class := "XYDATA"
	if len(s.PPM) == 0 {
		class = "PEAK TABLE"
	}
	fmt.Fprintf(w, "##DATA CLASS=%s\n##ORIGIN=shiftwise\n##OWNER=\n", class)
	if s.FieldMHz > 0 {
		fmt.Fprintf(w, "##.OBSERVE FREQUENCY=%s\n", fmtNum(s.FieldMHz))
	}
	nuc := s.Nucleus
	if nuc == "" {
		nuc = "1H"
	}
	fmt.Fprintf(w, "##.OBSERVE NUCLEUS=^%s\n", nuc)
	if s.Solvent != "" {
		fmt.Fprintf(w, "##.SOLVENT NAME=%s\n", strings.ReplaceAll(s.Solvent, "\n", " "))
	}
}

// xScale returns the unit name and the factor from ppm to file X.
func xScale(s *Spectrum) (string, float64) {
	if s.FieldMHz > 0 {
		return "HZ", s.FieldMHz
	}
	return "PPM", 1
}

// checkTrace verifies that the trace can be written as XYDATA.
func checkTrace(s *Spectrum) error {
	n := len(s.PPM)
	if len(s.Y) != n {
		return fmt.Errorf("spectrum: WriteJCAMP: %d ppm values but %d intensities", n, len(s.Y))
	}
	if n < 2 {
		return nil
	}
	step := (s.PPM[n-1] - s.PPM[0]) / float64(n-1)
	for i, p := range s.PPM {
		if math.IsNaN(p) || math.IsNaN(s.Y[i]) || math.IsInf(s.Y[i], 0) {
			return fmt.Errorf("spectrum: WriteJCAMP: point %d is not finite", i)
		}
		if math.Abs(p-(s.PPM[0]+float64(i)*step)) > 1e-3*math.Abs(step) {
			return fmt.Errorf("spectrum: WriteJCAMP: the ppm axis is not evenly spaced at point %d", i)
		}
	}
	return nil
}

// writeTrace writes the axis records and the XYDATA lines.
func writeTrace(w *bufio.Writer, s *Spectrum, compressed bool) error {
	if err := checkTrace(s); err != nil {
		return err
	}
	n := len(s.PPM)
	units, f := xScale(s)
	// File order: high to low frequency.
	xAt := func(i int) float64 { return s.PPM[n-1-i] * f }
	maxAbs := 0.0
	for _, y := range s.Y {
		maxAbs = math.Max(maxAbs, math.Abs(y))
	}
	yf := 1.0
	if maxAbs > 0 {
		yf = maxAbs / yFullScale
	}
	ys := make([]int64, n)
	for i := range ys {
		ys[i] = int64(math.Round(s.Y[n-1-i] / yf))
	}
	delta := 0.0
	if n > 1 {
		delta = (xAt(n-1) - xAt(0)) / float64(n-1)
	}
	fmt.Fprintf(w, "##XUNITS=%s\n##YUNITS=ARBITRARY UNITS\n##XFACTOR=1\n##YFACTOR=%s\n", units, fmtNum(yf))
	fmt.Fprintf(w, "##FIRSTX=%s\n##LASTX=%s\n##DELTAX=%s\n##NPOINTS=%d\n##FIRSTY=%s\n",
		fmtNum(xAt(0)), fmtNum(xAt(n-1)), fmtNum(delta), n, fmtNum(float64(ys[0])*yf))
	fmt.Fprintf(w, "##XYDATA=(X++(Y..Y))\n")
	xs := func(i int) string { return strconv.FormatFloat(xAt(i), 'g', 12, 64) }
	if compressed {
		writeDIFDUP(w, ys, xs)
	} else {
		writeAFFN(w, ys, xs)
	}
	return nil
}

// writeAFFN writes "X y y y ..." lines of at most maxLineLen characters.
func writeAFFN(w *bufio.Writer, ys []int64, xs func(int) string) {
	var line []byte
	for i := 0; i < len(ys); {
		line = append(line[:0], xs(i)...)
		for j := 0; i < len(ys); j++ {
			tok := strconv.AppendInt([]byte{' '}, ys[i], 10)
			if j > 0 && len(line)+len(tok) > maxLineLen {
				break
			}
			line = append(line, tok...)
			i++
		}
		w.Write(line)
		w.WriteByte('\n')
	}
}

// writeDIFDUP writes DIFDUP lines. Each line starts with an SQZ value and
// continues with DIF values (runs folded with DUP); the next line starts
// with the last value again as its Y-check, so consecutive lines share a
// point. A final line holds only the last value's check.
func writeDIFDUP(w *bufio.Writer, ys []int64, xs func(int) string) {
	var line, tok []byte
	i := 0
	for {
		line = append(line[:0], xs(i)...)
		line = appendASDF(line, ys[i], sqzDigits)
		j := i + 1
		for j < len(ys) {
			d := ys[j] - ys[j-1]
			run := 1
			for j+run < len(ys) && ys[j+run]-ys[j+run-1] == d {
				run++
			}
			tok = appendASDF(tok[:0], d, difDigits)
			if run > 1 {
				tok = appendASDF(tok, int64(run), dupDigits)
			}
			if len(line)+len(tok) > maxLineLen && j > i+1 {
				break
			}
			line = append(line, tok...)
			j += run
		}
		w.Write(line)
		w.WriteByte('\n')
		if j >= len(ys) {
			if j > i+1 { // the line ended with a DIF value: close with its check
				line = append(line[:0], xs(len(ys)-1)...)
				line = appendASDF(line, ys[len(ys)-1], sqzDigits)
				w.Write(line)
				w.WriteByte('\n')
			}
			return
		}
		i = j - 1
	}
}

// Pseudo-digit alphabets (McDonald & Wilks 1988, Table VII): index 0..9
// for positive first digits, 10..19 for negative ones.
const (
	sqzDigits = "@ABCDEFGHI@abcdefghi"
	difDigits = "%JKLMNOPQR%jklmnopqr"
	dupDigits = "0STUVWXYZs"
)

// appendASDF appends v with its first digit replaced by a pseudo-digit.
func appendASDF(b []byte, v int64, alpha string) []byte {
	neg := v < 0
	if neg {
		v = -v
	}
	start := len(b)
	b = strconv.AppendInt(b, v, 10)
	k := int(b[start] - '0')
	if neg && len(alpha) == 20 {
		k += 10
	}
	b[start] = alpha[k]
	return b
}

// writePeakTable writes ##PEAK TABLE=(XYW..XYW), one peak a line.
func writePeakTable(w *bufio.Writer, s *Spectrum) error {
	units, f := xScale(s)
	fmt.Fprintf(w, "##XUNITS=%s\n##YUNITS=ARBITRARY UNITS\n##NPOINTS=%d\n##PEAK TABLE=(XYW..XYW)\n", units, len(s.PeakTable))
	for i := len(s.PeakTable) - 1; i >= 0; i-- {
		p := s.PeakTable[i]
		width := p.WidthHz
		if units == "PPM" {
			width = 0 // the width is in Hz and cannot be placed on a ppm axis without the field
		}
		fmt.Fprintf(w, "%s, %s, %s\n", fmtNum(p.PPM*f), fmtNum(p.Intensity), fmtNum(width))
	}
	return nil
}
