package spectrum

import (
	"bytes"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"shiftwise/internal/extdata"
)

// synthetic returns an n-point trace from -1 to 11 ppm: three Lorentzian
// lines, a flat zero stretch (exercises DUP) and seeded noise.
func synthetic(n int, mhz float64) *Spectrum {
	rng := rand.New(rand.NewPCG(1, 1))
	s := &Spectrum{PPM: make([]float64, n), Y: make([]float64, n), FieldMHz: mhz, Nucleus: "1H", Solvent: "CDCl3", Title: "synthetic"}
	for i := range s.PPM {
		p := -1 + 12*float64(i)/float64(n-1)
		s.PPM[i] = p
		if p > 9 && p < 10 {
			continue // exact zeros
		}
		y := rng.NormFloat64() * 50
		for _, l := range [][2]float64{{1.25, 1e6}, {3.6, 4e5}, {7.26, 2e5}} {
			d := (p - l[0]) / 0.002
			y += l[1] / (1 + d*d)
		}
		s.Y[i] = y
	}
	return s
}

// roundTrip writes s and reads it back.
func roundTrip(t *testing.T, s *Spectrum, compressed bool) (*Spectrum, string) {
	t.Helper()
	var buf bytes.Buffer
	if err := WriteJCAMP(&buf, s, compressed); err != nil {
		t.Fatal(err)
	}
	out := buf.String()
	back, err := ReadJCAMP(strings.NewReader(out), "roundtrip.jdx")
	if err != nil {
		t.Fatalf("reading back: %v\n%s", err, out[:min(len(out), 2000)])
	}
	return back, out
}

// checkSame compares two traces: ppm within 1e-9 (relative to the span) and
// Y within the writer's quantisation (max|Y| / 1e9, half a step plus
// rounding of YFACTOR).
func checkSame(t *testing.T, got, want *Spectrum) {
	t.Helper()
	if len(got.PPM) != len(want.PPM) {
		t.Fatalf("%d points, want %d", len(got.PPM), len(want.PPM))
	}
	maxAbs := 0.0
	for _, y := range want.Y {
		maxAbs = math.Max(maxAbs, math.Abs(y))
	}
	tolY := maxAbs / yFullScale
	for i := range want.PPM {
		if math.Abs(got.PPM[i]-want.PPM[i]) > 1e-9*math.Max(1, math.Abs(want.PPM[i])) {
			t.Fatalf("ppm[%d] = %.12g, want %.12g", i, got.PPM[i], want.PPM[i])
		}
		if math.Abs(got.Y[i]-want.Y[i]) > tolY {
			t.Fatalf("y[%d] = %.12g, want %.12g (tolerance %g)", i, got.Y[i], want.Y[i], tolY)
		}
	}
	if got.FieldMHz != want.FieldMHz || got.Solvent != want.Solvent || got.Nucleus != want.Nucleus {
		t.Errorf("metadata %g %q %q, want %g %q %q", got.FieldMHz, got.Solvent, got.Nucleus, want.FieldMHz, want.Solvent, want.Nucleus)
	}
}

func TestWriteJCAMPRoundTrip(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name       string
		mhz        float64
		compressed bool
	}{
		{"DIFDUP Hz", 400.13, true},
		{"AFFN Hz", 400.13, false},
		{"DIFDUP ppm", 0, true},
		{"AFFN ppm", 0, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s := synthetic(3001, tc.mhz)
			back, out := roundTrip(t, s, tc.compressed)
			checkSame(t, back, s)
			if len(back.Warnings) != 0 {
				t.Errorf("warnings: %v", back.Warnings[:min(3, len(back.Warnings))])
			}
			// JCAMP-DX lines are at most 80 characters (McDonald & Wilks 1988 §4).
			for i, l := range strings.Split(out, "\n") {
				if len(l) > maxLineLen {
					t.Fatalf("line %d has %d characters", i+1, len(l))
				}
			}
			if tc.compressed && !strings.ContainsAny(out[strings.Index(out, "XYDATA"):], "STUVWXYZs") {
				t.Error("compressed output uses no DUP")
			}
		})
	}
}

// TestWriteRealRoundTrip re-encodes the IUPAC o-dichlorobenzene test
// spectrum (o02, DIFDUP) and reads it back.
func TestWriteRealRoundTrip(t *testing.T) {
	t.Parallel()
	s, err := ReadFile(extdata.Path(t, odcbPrefix+"o02.jdx"))
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []bool{true, false} {
		back, _ := roundTrip(t, s, c)
		checkSame(t, back, s)
	}
}

func TestWritePeakTableRoundTrip(t *testing.T) {
	t.Parallel()
	s := &Spectrum{FieldMHz: 500, Nucleus: "1H", PeakTable: []Peak{{PPM: 1.25, Intensity: 3, WidthHz: 1.2}, {PPM: 7.26, Intensity: 1, WidthHz: 0.8}}}
	back, _ := roundTrip(t, s, false)
	if len(back.PeakTable) != 2 {
		t.Fatalf("peaks %+v", back.PeakTable)
	}
	for i, p := range s.PeakTable {
		q := back.PeakTable[i]
		if math.Abs(q.PPM-p.PPM) > 1e-12 || q.Intensity != p.Intensity || math.Abs(q.WidthHz-p.WidthHz) > 1e-12 {
			t.Errorf("peak %d = %+v, want %+v", i, q, p)
		}
	}
}

func TestWriteCSVRoundTrip(t *testing.T) {
	t.Parallel()
	s := synthetic(500, 0)
	var buf bytes.Buffer
	if err := WriteCSV(&buf, s); err != nil {
		t.Fatal(err)
	}
	back, err := ReadCSV(&buf, "rt.csv")
	if err != nil {
		t.Fatal(err)
	}
	if !equalFloats(back.PPM, s.PPM) || !equalFloats(back.Y, s.Y) {
		t.Error("CSV trace round trip differs")
	}
	p := &Spectrum{PeakTable: []Peak{{PPM: 1.25, Intensity: 3, WidthHz: 1.2}}}
	buf.Reset()
	if err := WriteCSV(&buf, p); err != nil {
		t.Fatal(err)
	}
	back, err = ReadCSV(&buf, "rt.csv")
	if err != nil || len(back.PeakTable) != 1 || back.PeakTable[0] != p.PeakTable[0] {
		t.Errorf("CSV peak round trip: %v %+v", err, back)
	}
}

func TestWriteJCAMPRejects(t *testing.T) {
	t.Parallel()
	uneven := &Spectrum{PPM: []float64{1, 2, 4}, Y: []float64{1, 2, 3}}
	if err := WriteJCAMP(&bytes.Buffer{}, uneven, true); err == nil {
		t.Error("uneven axis accepted")
	}
	if err := WriteJCAMP(&bytes.Buffer{}, &Spectrum{PPM: []float64{1, 2}, Y: []float64{1}}, true); err == nil {
		t.Error("length mismatch accepted")
	}
}

// TestAppendASDF checks the encoder against Table VII pseudo-digits
// (McDonald & Wilks 1988) and the §5.10 DIFDUP example 1JT%jX.
func TestAppendASDF(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		v     int64
		alpha string
		want  string
	}{
		{0, sqzDigits, "@"}, {15, sqzDigits, "A5"}, {-15, sqzDigits, "a5"}, {-9, difDigits, "r"},
		{0, difDigits, "%"}, {2, dupDigits, "T"}, {6, dupDigits, "X"}, {9, dupDigits, "s"}, {10, dupDigits, "S0"},
	} {
		if got := string(appendASDF(nil, tc.v, tc.alpha)); got != tc.want {
			t.Errorf("appendASDF(%d) = %q, want %q", tc.v, got, tc.want)
		}
	}
}
