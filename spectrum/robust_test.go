package spectrum

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// Robustness of the readers and of Process on odd but legal files and on
// edge traces: each case must give a clear error or a sensible result, never
// a panic or a hang (common practice, no source).

// jdxPPM writes an AFFN XYDATA block with X in PPM, one value per line, in
// the order given (descending or ascending).
func jdxPPM(x, y []float64, yfactor float64, eol string, lower, end bool) string {
	var b strings.Builder
	lab := func(s string) string {
		if lower {
			return strings.ToLower(s)
		}
		return s
	}
	fmt.Fprintf(&b, "##%s= t%s##%s= 5.01%s##%s= NMR SPECTRUM%s", lab("TITLE"), eol, lab("JCAMP-DX"), eol, lab("DATA TYPE"), eol)
	fmt.Fprintf(&b, "##%s=\t400.13%s##%s= PPM%s", lab(".OBSERVE FREQUENCY"), eol, lab("XUNITS"), eol)
	fmt.Fprintf(&b, "##%s= %g%s##%s= %g%s##%s= %d%s", lab("FIRSTX"), x[0], eol, lab("LASTX"), x[len(x)-1], eol, lab("NPOINTS"), len(x), eol)
	fmt.Fprintf(&b, "##%s= 1%s##%s= %g%s", lab("XFACTOR"), eol, lab("YFACTOR"), yfactor, eol)
	fmt.Fprintf(&b, "##%s= (X++(Y..Y))%s", lab("XYDATA"), eol)
	for i := range x {
		fmt.Fprintf(&b, "%.6f\t%d%s", x[i], int64(math.Round(y[i]/yfactor)), eol)
	}
	if end {
		fmt.Fprintf(&b, "##%s=%s", lab("END"), eol)
	}
	return b.String()
}

// lorentzTrace is a noisy trace with singlets of the given heights at the
// given ppm, FWHM 1 Hz at 400 MHz, on n points from 0 to 10 ppm.
func lorentzTrace(n int, at, h []float64, noise float64, seed uint64) (x, y []float64) {
	r := rand.New(rand.NewPCG(seed, 3))
	x, y = make([]float64, n), make([]float64, n)
	g := 0.5 / 400.13
	for i := range x {
		x[i] = 10 * float64(i) / float64(n-1)
		y[i] = noise * r.NormFloat64()
		for k := range at {
			d := (x[i] - at[k]) / g
			y[i] += h[k] / (1 + d*d)
		}
	}
	return x, y
}

func reversed(v []float64) []float64 {
	out := make([]float64, len(v))
	for i := range v {
		out[len(v)-1-i] = v[i]
	}
	return out
}

// TestJCAMPOddButLegal reads JCAMP-DX variants the standard allows and
// checks that the singlets come out at their places.
func TestJCAMPOddButLegal(t *testing.T) {
	t.Parallel()
	at, hs := []float64{1.5, 7.0}, []float64{1000, 500}
	x, y := lorentzTrace(8192, at, hs, 1, 1)
	cases := []struct {
		name    string
		src     string
		yfactor float64
	}{
		{"descending ppm, CRLF, lowercase", jdxPPM(reversed(x), reversed(y), 1, "\r\n", true, true), 1},
		{"ascending ppm, no END", jdxPPM(x, y, 1, "\n", false, false), 1},
		{"tiny YFACTOR", jdxPPM(x, y, 1e-9, "\n", false, true), 1e-9},
		{"huge YFACTOR", jdxPPM(x, y, 1e-3, "\n", false, true), 1e-3},
		{"CR only", jdxPPM(x, y, 1, "\r", false, true), 1},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s, err := ReadJCAMP(strings.NewReader(c.src), "odd.jdx")
			if err != nil {
				t.Fatal(err)
			}
			pl, err := Process(s, ProcessOptions{Reference: RefNone})
			if err != nil {
				t.Fatal(err)
			}
			for _, want := range at {
				if m := multipletAt(pl, want); m == nil {
					t.Errorf("no multiplet at %.2f ppm", want)
				}
			}
		})
	}
}

// TestJCAMPLinkBlocks reads a LINK file whose 1H block is second.
func TestJCAMPLinkBlocks(t *testing.T) {
	t.Parallel()
	x, y := lorentzTrace(1024, []float64{3.0}, []float64{100}, 0.5, 2)
	inner := jdxPPM(x, y, 1, "\n", false, true)
	src := "##TITLE= link\n##JCAMP-DX= 5.01\n##BLOCKS= 2\n" +
		"##TITLE= structure\n##JCAMP-DX= 5.01\n##BLOCK_ID= 1\n##JCAMP-CS= 3.7\n##END=\n" +
		strings.Replace(inner, "##TITLE= t\n", "##TITLE= t\n##BLOCK_ID= 2\n", 1) + "##END=\n"
	s, err := ReadJCAMP(strings.NewReader(src), "link.jdx")
	if err != nil {
		t.Fatal(err)
	}
	if len(s.PPM) != 1024 {
		t.Errorf("%d points, want 1024", len(s.PPM))
	}
}

// TestCSVVariants reads CSV forms a user may hand over.
func TestCSVVariants(t *testing.T) {
	t.Parallel()
	x, y := lorentzTrace(512, []float64{2.0}, []float64{100}, 0.5, 3)
	var desc, comma, neg strings.Builder
	for i := len(x) - 1; i >= 0; i-- {
		fmt.Fprintf(&desc, "%.6f,%.4f\n", x[i], y[i])
		fmt.Fprintf(&comma, "%s;%s\n", strings.Replace(fmt.Sprintf("%.6f", x[i]), ".", ",", 1), strings.Replace(fmt.Sprintf("%.4f", y[i]), ".", ",", 1))
		fmt.Fprintf(&neg, "%.6f,%.4f\n", x[i], -y[i])
	}
	cases := []struct {
		name, src string
		wantErr   bool
		wantPeak  bool
	}{
		{"descending ppm", desc.String(), false, true},
		{"decimal comma with semicolon", "ppm;intensity\n" + comma.String(), false, true},
		{"negative intensities", neg.String(), false, false},
		{"header only", "ppm,intensity\n", true, false},
		{"one row", "ppm,intensity\n1.25,100\n", false, false},
		{"duplicate x", "1.0,5\n1.0,6\n2.0,7\n", false, false},
		{"empty", "", true, false},
		{"NaN", "1.0,NaN\n2.0,3\n", true, false},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s, err := ReadCSV(strings.NewReader(c.src), "v.csv")
			if err != nil {
				if !c.wantErr {
					t.Fatalf("unexpected error: %v", err)
				}
				if !strings.Contains(err.Error(), "v.csv") {
					t.Errorf("error does not name the file: %v", err)
				}
				return
			}
			if c.wantErr {
				t.Fatalf("no error for %q", c.name)
			}
			pl, err := Process(s, ProcessOptions{Reference: RefNone})
			if err != nil {
				return // a clear error is acceptable
			}
			if c.wantPeak && multipletAt(pl, 2.0) == nil {
				t.Errorf("no multiplet at 2.0 ppm")
			}
		})
	}
}

// TestProcessEdgeTraces runs Process on degenerate traces.
func TestProcessEdgeTraces(t *testing.T) {
	t.Parallel()
	mk := func(n int, f func(i int) float64) *Spectrum {
		s := &Spectrum{PPM: make([]float64, n), Y: make([]float64, n), FieldMHz: 400, Source: "edge"}
		for i := range n {
			s.PPM[i] = 10 * float64(i) / float64(n-1)
			s.Y[i] = f(i)
		}
		return s
	}
	r := rand.New(rand.NewPCG(5, 5))
	cases := []struct {
		name string
		s    *Spectrum
	}{
		{"all zeros", mk(4096, func(int) float64 { return 0 })},
		{"constant", mk(4096, func(int) float64 { return 7 })},
		{"single huge spike", mk(4096, func(i int) float64 {
			if i == 2000 {
				return 1e300
			}
			return r.NormFloat64()
		})},
		{"huge values", mk(4096, func(i int) float64 { return 1e307 * math.Sin(float64(i)) })},
		{"pure noise", mk(4096, func(int) float64 { return r.NormFloat64() })},
		{"64 points", mk(64, func(i int) float64 { return 1 / (1 + math.Pow(float64(i-30), 2)) })},
		{"alternating", mk(4096, func(i int) float64 { return float64(i%2) * 100 })},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			pl, err := Process(c.s, ProcessOptions{})
			if err != nil {
				if !strings.HasPrefix(err.Error(), "edge: ") {
					t.Errorf("error does not name the source: %v", err)
				}
				if c.name == "huge values" && !strings.Contains(err.Error(), "too large") {
					t.Errorf("huge values: error %v, want 'too large'", err)
				}
				return
			}
			for _, m := range pl.Multiplets {
				if !isFinite(m.PPM) || !isFinite(m.Integral) {
					t.Errorf("non-finite multiplet %+v", m)
				}
			}
			if len(pl.Peaks) > 1000 {
				t.Errorf("%d peaks picked", len(pl.Peaks))
			}
		})
	}
}

// TestJCAMPMissingEnd: a file that ends without ##END= is read when its
// ##NPOINTS= proves the data complete (with a warning), and refused as
// truncated when lines are missing.
func TestJCAMPMissingEnd(t *testing.T) {
	t.Parallel()
	x, y := lorentzTrace(256, []float64{3.0}, []float64{100}, 0.5, 4)
	src := jdxPPM(x, y, 1, "\n", false, false)
	s, err := ReadJCAMP(strings.NewReader(src), "noend.jdx")
	if err != nil {
		t.Fatal(err)
	}
	if len(s.Warnings) != 1 || !strings.Contains(s.Warnings[0], "no ##END=") {
		t.Errorf("warnings %q, want one about the missing ##END=", s.Warnings)
	}
	lines := strings.Split(src, "\n")
	cut := strings.Join(lines[:len(lines)-40], "\n")
	_, err = ReadJCAMP(strings.NewReader(cut), "cut.jdx")
	var pe *ParseError
	if !errors.As(err, &pe) || !strings.Contains(pe.Msg, "missing ##END=") {
		t.Errorf("truncated file: error %v, want a missing ##END= ParseError", err)
	}
}

// TestCSVNonFinite: a NaN in the first row is a bad value on that line, not
// a header.
func TestCSVNonFinite(t *testing.T) {
	t.Parallel()
	for _, src := range []string{"1.0,NaN\n2.0,3\n", "ppm,y\n1.0,3\n2.0,Inf\n"} {
		_, err := ReadCSV(strings.NewReader(src), "nan.csv")
		var pe *ParseError
		if !errors.As(err, &pe) || !strings.Contains(pe.Msg, "not a finite number") {
			t.Errorf("%q: error %v, want 'not a finite number' with its line", src, err)
		}
	}
}

// TestProcessMillionPoints: a 1,048,576-point trace (the largest FFT size in
// common use) processes and finds its lines.
func TestProcessMillionPoints(t *testing.T) {
	if testing.Short() {
		t.Skip("large trace")
	}
	t.Parallel()
	at := []float64{1.2, 3.4, 7.26}
	x, y := lorentzTrace(1<<20, at, []float64{300, 200, 100}, 1, 6)
	pl, err := Process(&Spectrum{PPM: x, Y: y, FieldMHz: 400.13, Source: "big"}, ProcessOptions{})
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range at {
		if multipletAt(pl, want) == nil {
			t.Errorf("no multiplet at %.2f ppm", want)
		}
	}
}

// TestIntegralRefIndexMessage: the index in the error is the 1-based #K the
// user typed (peaks --integral-ref #K=NH), not the 0-based slice index.
func TestIntegralRefIndexMessage(t *testing.T) {
	t.Parallel()
	x, y := lorentzTrace(4096, []float64{2.0}, []float64{100}, 0.5, 8)
	_, err := Process(&Spectrum{PPM: x, Y: y, FieldMHz: 400}, ProcessOptions{IntegralRef: &IntegralRef{PPM: math.NaN(), Index: 98, NH: 3}})
	if err == nil || !strings.Contains(err.Error(), "#99") {
		t.Errorf("error %v, want it to name #99", err)
	}
}
