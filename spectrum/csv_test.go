package spectrum

import (
	"errors"
	"fmt"
	"strings"
	"testing"
)

// traceCSV makes an n-row evenly spaced trace with the given separator.
func traceCSV(n int, sep string, header bool) string {
	var b strings.Builder
	if header {
		fmt.Fprintf(&b, "ppm%sintensity\n", sep)
	}
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, "%.4f%s%d\n", 10-float64(i)*0.0025, sep, i%7)
	}
	return b.String()
}

func TestReadCSVTrace(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name string
		src  string
	}{
		{"comma with header", traceCSV(100, ",", true)},
		{"tab without header", "# exported trace\n" + traceCSV(100, "\t", false)},
		{"semicolon", traceCSV(100, ";", true)},
		{"semicolon decimal comma", strings.ReplaceAll(traceCSV(100, ";", true), ".", ",")},
		{"blanks", traceCSV(100, " ", false)},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s, err := ReadCSV(strings.NewReader(tc.src), "t.csv")
			if err != nil {
				t.Fatal(err)
			}
			// Rows run 10 down to 9.7525 ppm; the reader sorts ascending.
			if len(s.PPM) != 100 || s.PPM[0] != 9.7525 || s.PPM[99] != 10 || s.Y[99] != 0 || s.Y[0] != float64(99%7) {
				t.Errorf("%d points %v..%v, y %v..%v", len(s.PPM), s.PPM[0], s.PPM[len(s.PPM)-1], s.Y[0], s.Y[len(s.Y)-1])
			}
		})
	}
}

func TestReadCSVPeaks(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name string
		src  string
		want []Peak
	}{
		{"ppm only", "7.26\n1.25\n", []Peak{{PPM: 1.25, Intensity: 1}, {PPM: 7.26, Intensity: 1}}},
		{"ppm,intensity", "ppm,intensity\n3.5,10\n1.2,30\n", []Peak{{PPM: 1.2, Intensity: 30}, {PPM: 3.5, Intensity: 10}}},
		{"three columns", "1.2\t30\t1.1\n3.5\t10\t0.9\n", []Peak{{PPM: 1.2, Intensity: 30, WidthHz: 1.1}, {PPM: 3.5, Intensity: 10, WidthHz: 0.9}}},
		{"reordered header", "height;shift\n30;1,2\n", []Peak{{PPM: 1.2, Intensity: 30}}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s, err := ReadCSV(strings.NewReader(tc.src), "p.csv")
			if err != nil {
				t.Fatal(err)
			}
			if len(s.PPM) != 0 || len(s.PeakTable) != len(tc.want) {
				t.Fatalf("trace %d, peaks %+v", len(s.PPM), s.PeakTable)
			}
			for i := range tc.want {
				if s.PeakTable[i] != tc.want[i] {
					t.Errorf("peak %d = %+v, want %+v", i, s.PeakTable[i], tc.want[i])
				}
			}
		})
	}
	// Many unevenly spaced rows: a peak list.
	var b strings.Builder
	for i := 0; i < 40; i++ {
		fmt.Fprintf(&b, "%g,%d\n", float64(i*i)*0.01, i)
	}
	s, err := ReadCSV(strings.NewReader(b.String()), "many.csv")
	if err != nil || len(s.PeakTable) != 40 {
		t.Errorf("40 uneven rows: %v, %d peaks", err, len(s.PeakTable))
	}
}

func TestReadCSVErrors(t *testing.T) {
	t.Parallel()
	broken := strings.Split(traceCSV(100, ",", true), "\n")
	broken[50] = "9.8775,abc" // line 51
	gap := strings.Split(traceCSV(100, ",", true), "\n")
	gap = append(gap[:60], gap[61:]...) // row 61 missing: the step at line 61 doubles
	tests := []struct {
		name string
		src  string
		line int
		msg  string
	}{
		{"not a number", strings.Join(broken, "\n"), 51, "column 2: expected a number, found \"abc\""},
		{"broken spacing", strings.Join(gap, "\n"), 61, "breaks the even spacing"},
		{"column count", "1,2\n3,4,5\n", 2, "3 columns, but the first data row has 2"},
		{"too many columns", "# c\n1,2,3,4\n", 2, "4 columns"},
		{"empty", "# nothing\n\n", 1, "no data rows"},
		{"header only", "ppm,intensity\n", 1, "no data rows"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := ReadCSV(strings.NewReader(tc.src), "bad.csv")
			var pe *ParseError
			if !errors.As(err, &pe) || pe.Line != tc.line || !strings.Contains(pe.Msg, tc.msg) {
				t.Errorf("error %v, want bad.csv:%d: ...%s...", err, tc.line, tc.msg)
			}
		})
	}
	// Forced trace with a non-monotonic row.
	_, err := ReadCSVWith(strings.NewReader("1,1\n2,1\n1.5,1\n"), "f.csv", ReadOptions{CSV: CSVTrace})
	var pe *ParseError
	if !errors.As(err, &pe) || pe.Line != 3 {
		t.Errorf("forced trace: %v, want line 3", err)
	}
}

func TestReadFileDetects(t *testing.T) {
	t.Parallel()
	if !IsJCAMP([]byte("\n$$ c\n  ##TITLE=x\n")) || IsJCAMP([]byte("# c\n1,2\n")) {
		t.Error("IsJCAMP misdetects")
	}
}

func TestReadCSVHeaderStartingWithDigit(t *testing.T) {
	t.Parallel()
	s, err := ReadCSV(strings.NewReader("1H shift (ppm),height\n1.2,3\n"), "h.csv")
	if err != nil || len(s.PeakTable) != 1 || s.PeakTable[0] != (Peak{PPM: 1.2, Intensity: 3}) {
		t.Errorf("%v %+v", err, s)
	}
}
