package main

import (
	"bytes"
	"encoding/json"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"shiftwise/spectrum"
)

// ethylTrace is a synthetic 400.13 MHz trace of an ethyl group: a CH3
// triplet at 1.20 ppm and a CH2 quartet at 4.10 ppm (J = 7.1 Hz, first-order
// binomial intensities, Pascal's triangle; common practice, no source), TMS
// at 0, Lorentzian lines of 0.8 Hz, seeded Gaussian noise of σ = 1.
func ethylTrace() *spectrum.Spectrum {
	const field, n, lo, hi = 400.13, 32768, -0.5, 10.5
	s := &spectrum.Spectrum{PPM: make([]float64, n), Y: make([]float64, n), FieldMHz: field, Solvent: "CDCl3", Nucleus: "1H", Title: "ethyl test"}
	r := rand.New(rand.NewPCG(3, 5))
	g := 0.4 / field
	type ln struct{ ppm, area float64 }
	var lines []ln
	lines = append(lines, ln{0, 0.5})
	for k, w := range []float64{1, 2, 1} {
		lines = append(lines, ln{1.20 + (float64(k)-1)*7.1/field, 3 * w / 4})
	}
	for k, w := range []float64{1, 3, 3, 1} {
		lines = append(lines, ln{4.10 + (float64(k)-1.5)*7.1/field, 2 * w / 8})
	}
	for i := range s.PPM {
		x := lo + (hi-lo)*float64(i)/float64(n-1)
		s.PPM[i] = x
		y := 5 + 2*x + r.NormFloat64()
		for _, l := range lines {
			d := (x - l.ppm) / g
			y += 600 * l.area / (1 + d*d)
		}
		s.Y[i] = y
	}
	return s
}

func writeTestJCAMP(t *testing.T, s *spectrum.Spectrum) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "ethyl.jdx")
	var b bytes.Buffer
	if err := spectrum.WriteJCAMP(&b, s, true); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

func runCmd(args []string, tty bool) (code int, out, errOut string) {
	var o, e bytes.Buffer
	f := &Factory{In: strings.NewReader(""), Out: &o, Err: &e, IsTTY: tty}
	code = Main(args, f)
	return code, o.String(), e.String()
}

func TestPeaksJSON(t *testing.T) {
	path := writeTestJCAMP(t, ethylTrace())
	code, out, errOut := runCmd([]string{"peaks", path, "--json"}, false)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var res struct {
		FieldMHz   float64 `json:"field_mhz"`
		Points     int     `json:"points"`
		Peaks      []struct{ PPM, Intensity, SNR float64 }
		Multiplets []struct {
			PPM          float64   `json:"ppm"`
			FromPPM      float64   `json:"from_ppm"`
			ToPPM        float64   `json:"to_ppm"`
			Integral     float64   `json:"integral"`
			Multiplicity string    `json:"multiplicity"`
			JHz          []float64 `json:"j_hz"`
			Peaks        int       `json:"peaks"`
		}
	}
	if err := json.Unmarshal([]byte(out), &res); err != nil {
		t.Fatalf("JSON: %v\n%s", err, out)
	}
	if math.Abs(res.FieldMHz-400.13) > 1e-6 || res.Points != 32768 {
		t.Errorf("field %g points %d, want 400.13 and 32768", res.FieldMHz, res.Points)
	}
	want := []struct {
		ppm  float64
		mult string
		nH   float64
	}{
		// Ground truth: the lines the trace was built from (ethylTrace).
		{1.20, "t", 3},
		{4.10, "q", 2},
	}
	for _, w := range want {
		found := false
		for _, m := range res.Multiplets {
			if math.Abs(m.PPM-w.ppm) > 0.001 {
				continue
			}
			found = true
			if m.Multiplicity != w.mult || len(m.JHz) != 1 || math.Abs(m.JHz[0]-7.1) > 0.2 {
				t.Errorf("%.2f ppm: %s %v, want %s J 7.1", w.ppm, m.Multiplicity, m.JHz, w.mult)
			}
			if math.Abs(m.Integral-w.nH)/w.nH > 0.02 {
				t.Errorf("%.2f ppm: integral %.3f, want %g within 2%%", w.ppm, m.Integral, w.nH)
			}
		}
		if !found {
			t.Errorf("no multiplet at %.2f ppm in %s", w.ppm, out)
		}
	}
}

func TestPeaksTableAndTSV(t *testing.T) {
	path := writeTestJCAMP(t, ethylTrace())
	code, out, errOut := runCmd([]string{"peaks", path}, true)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, s := range []string{"MULT", "J (Hz)", "INTEGRAL", "400.13 MHz", "TMS"} {
		if !strings.Contains(out, s) {
			t.Errorf("table lacks %q:\n%s", s, out)
		}
	}
	code, out, _ = runCmd([]string{"peaks", path}, false)
	if code != 0 {
		t.Fatal("exit", code)
	}
	if !strings.Contains(out, "multiplet\t1.2000\t") || !strings.Contains(out, "\tt\t7.1\t3\t") {
		t.Errorf("TSV lacks the triplet line:\n%s", out)
	}
}

func TestPeaksIntegralRef(t *testing.T) {
	path := writeTestJCAMP(t, ethylTrace())
	code, out, errOut := runCmd([]string{"peaks", path, "--json", "--integral-ref", "4.10=4"}, false)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var res struct {
		Multiplets []struct {
			PPM      float64 `json:"ppm"`
			Integral float64 `json:"integral"`
		}
	}
	if err := json.Unmarshal([]byte(out), &res); err != nil {
		t.Fatal(err)
	}
	for _, m := range res.Multiplets {
		// Quartet set to 4 H, so the triplet must read 6 H (3:2 ratio).
		if math.Abs(m.PPM-1.20) < 0.001 && math.Abs(m.Integral-6) > 0.12 {
			t.Errorf("triplet integral %.3f, want 6 within 2%%", m.Integral)
		}
	}
}

func TestPeaksErrors(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.jdx")
	if err := os.WriteFile(bad, []byte("##TITLE=x\n##JCAMP-DX=5.01\n##XYDATA=(X++(Y..Y))\n1 2 3 x?\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	good := writeTestJCAMP(t, ethylTrace())
	tests := []struct {
		name string
		args []string
		msg  string
	}{
		{"corrupt file", []string{"peaks", bad}, bad + ":"},
		{"missing file", []string{"peaks", filepath.Join(dir, "none.jdx")}, "none.jdx"},
		{"no file", []string{"peaks"}, "expected one spectrum file"},
		{"bad reference", []string{"peaks", good, "--reference", "lock"}, "--reference must be"},
		{"bad snr", []string{"peaks", good, "--min-snr", "0"}, "--min-snr must be positive"},
		{"bad solvent", []string{"peaks", good, "--solvent", "xyz"}, "unknown solvent"},
		{"bad integral ref", []string{"peaks", good, "--integral-ref", "4.1"}, "missing '='"},
		{"bad integral count", []string{"peaks", good, "--integral-ref", "4.1=-2"}, "positive number"},
		{"bad index", []string{"peaks", good, "--integral-ref", "#0=2"}, "whole number from 1"},
		{"far integral ref", []string{"peaks", good, "--integral-ref", "8.5=1"}, "no multiplet at 8.500"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, _, errOut := runCmd(tc.args, false)
			if code != exitError {
				t.Errorf("exit %d, want %d", code, exitError)
			}
			if !strings.Contains(errOut, tc.msg) {
				t.Errorf("stderr %q lacks %q", errOut, tc.msg)
			}
		})
	}
}

func TestParseIntegralRef(t *testing.T) {
	tests := []struct {
		in    string
		ppm   float64
		index int
		nh    float64
	}{
		{"3.71=2", 3.71, 0, 2},
		{" 1.2 = 3 ", 1.2, 0, 3},
		{"#3=1", math.NaN(), 2, 1},
	}
	for _, tc := range tests {
		r, err := parseIntegralRef(tc.in)
		if err != nil {
			t.Errorf("%q: %v", tc.in, err)
			continue
		}
		if r.NH != tc.nh || r.Index != tc.index || !(r.PPM == tc.ppm || math.IsNaN(r.PPM) && math.IsNaN(tc.ppm)) {
			t.Errorf("%q: got %+v", tc.in, *r)
		}
	}
}

// FuzzParseIntegralRef: any --integral-ref text gives a reference or an
// error, never a panic, and an accepted one has a positive proton count.
func FuzzParseIntegralRef(f *testing.F) {
	for _, s := range []string{"3.71=2", "#3=1", "=", "#=", "1e400=1", "NaN=1", "2=NaN"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		r, err := parseIntegralRef(s)
		if err == nil && !(r.NH > 0) {
			t.Errorf("%q accepted with NH %g", s, r.NH)
		}
	})
}
