package spectrum

import (
	"bytes"
	"errors"
	"strings"
	"testing"
)

// checkReadResult is the fuzz property shared by the readers: an error is a
// *ParseError with a line >= 1; a spectrum has matching, ascending arrays.
func checkReadResult(t *testing.T, s *Spectrum, err error) {
	if err != nil {
		var pe *ParseError
		if !errors.As(err, &pe) {
			t.Fatalf("error without position: %v", err)
		}
		if pe.Line < 1 {
			t.Fatalf("error with line %d: %v", pe.Line, err)
		}
		return
	}
	if len(s.PPM) != len(s.Y) {
		t.Fatalf("%d ppm values, %d intensities", len(s.PPM), len(s.Y))
	}
	for i := 1; i < len(s.PPM); i++ {
		if !(s.PPM[i] >= s.PPM[i-1]) {
			t.Fatalf("ppm not ascending at %d: %g after %g", i, s.PPM[i], s.PPM[i-1])
		}
	}
}

func FuzzReadJCAMP(f *testing.F) {
	f.Add(jdx(smallHeader+"##YFACTOR=2\n", "500 A0JT", "300 A2J", "200 A3j", "100 A2"))
	f.Add(jdx(smallHeader, "500 1 2 3 4 5"))
	f.Add(jdx("##XUNITS=PPM\n##FIRSTX=1\n##LASTX=0\n##NPOINTS=1000000000000\n", "1 1s99999999"))
	f.Add("##TITLE=p\n##XUNITS=HZ\n##.OBSERVE FREQUENCY=400\n##PEAK TABLE=(XYW..XYW)\n800,10,1.5; 400,5,2\n##END=\n")
	f.Add("##TITLE=n\n##NTUPLES=NMR SPECTRUM\n##VAR_NAME=FREQUENCY, SPECTRUM/REAL\n##SYMBOL=X, R\n" +
		"##VAR_DIM=3, 3\n##UNITS=PPM, ARBITRARY UNITS\n##FIRST=3, 1\n##LAST=1, 3\n##FACTOR=1, 1\n" +
		"##PAGE=N=1\n##DATA TABLE=(X++(R..R)), XYDATA\n3 1JJ\n##END NTUPLES=NMR SPECTRUM\n##END=\n")
	f.Add("##TITLE=l\n##DATA TYPE=LINK\n##TITLE=x\n##XUNITS=PPM\n##XYPOINTS=(XY..XY)\n1,2;3,4\n##END=\n##END=\n")
	var buf bytes.Buffer
	if err := WriteJCAMP(&buf, synthetic(200, 400), true); err == nil {
		f.Add(buf.String())
	}
	f.Fuzz(func(t *testing.T, src string) {
		s, err := ReadJCAMP(strings.NewReader(src), "fuzz.jdx")
		checkReadResult(t, s, err)
	})
}

func FuzzReadCSV(f *testing.F) {
	f.Add(traceCSV(40, ",", true))
	f.Add(strings.ReplaceAll(traceCSV(40, ";", true), ".", ","))
	f.Add("ppm\tintensity\twidth\n1.2\t3\t1\n")
	f.Add("# c\n7.26\n1.25\n")
	f.Add("height;shift\n30;1,2\n")
	f.Fuzz(func(t *testing.T, src string) {
		s, err := ReadCSV(strings.NewReader(src), "fuzz.csv")
		checkReadResult(t, s, err)
	})
}
