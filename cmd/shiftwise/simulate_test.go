package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func simRun(args []string, tty bool) (code int, out, errOut string) {
	var o, e bytes.Buffer
	f := &Factory{In: strings.NewReader(""), Out: &o, Err: &e, IsTTY: tty}
	code = Main(args, f)
	return code, o.String(), e.String()
}

// TestSimulateAB reproduces the AB quartet formula through the command:
// lines at ν0 ± D/2 ± J/2, D = √(Δν² + J²), intensities (1 ∓ J/D)/2
// (Pople, Schneider & Bernstein 1959; any standard NMR text).
func TestSimulateAB(t *testing.T) {
	code, out, errOut := simRun([]string{"simulate", "../../testdata/spins/ab.toml", "--json"}, false)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var r simulateJSON
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatal(err)
	}
	const field, a, b, j = 400.0, 5.80, 5.75, 17.0
	nu0, dnu := (a+b)/2*field, (a-b)*field
	d := math.Hypot(dnu, j)
	want := [][2]float64{
		{nu0 - (d+j)/2, (1 - j/d) / 2}, {nu0 - (d-j)/2, (1 + j/d) / 2},
		{nu0 + (d-j)/2, (1 + j/d) / 2}, {nu0 + (d+j)/2, (1 - j/d) / 2},
	}
	if r.FieldMHz != field || len(r.Lines) != 4 {
		t.Fatalf("got %+v", r)
	}
	for i, w := range want {
		l := r.Lines[i]
		if math.Abs(l.Hz-w[0]) > 0.01 || math.Abs(l.Intensity-w[1]) > 0.01*w[1] || math.Abs(l.PPM*field-l.Hz) > 0.01 {
			t.Errorf("line %d = %+v, want %.3f Hz, %.4f", i, l, w[0], w[1])
		}
	}
}

// TestSimulateStyreneField: the vinyl file at 60 MHz differs clearly between
// exact and first-order; at 600 MHz they nearly agree (common practice, no
// source: second-order effects scale as J/Δν).
func TestSimulateStyreneField(t *testing.T) {
	maxDiff := func(field string) float64 {
		var lines [2][]simulateLine
		for k, mode := range []string{"exact", "first-order"} {
			code, out, errOut := simRun([]string{"simulate", "../../testdata/spins/vinyl.toml", "--json", "--field", field, "--mode", mode}, false)
			if code != 0 {
				t.Fatalf("exit %d: %s", code, errOut)
			}
			var r simulateJSON
			if err := json.Unmarshal([]byte(out), &r); err != nil {
				t.Fatal(err)
			}
			lines[k] = r.Lines
		}
		// Largest distance from a first-order line to the nearest exact
		// line with at least 5% of the intensity.
		worst := 0.0
		for _, f := range lines[1] {
			best := math.Inf(1)
			for _, e := range lines[0] {
				if e.Intensity > 0.05 {
					best = math.Min(best, math.Abs(e.Hz-f.Hz))
				}
			}
			worst = math.Max(worst, best)
		}
		return worst
	}
	d60, d600 := maxDiff("60"), maxDiff("600")
	if d60 < 1 || d600 > 0.3 {
		t.Errorf("max first-order displacement: %.2f Hz at 60 MHz, %.2f Hz at 600 MHz", d60, d600)
	}
}

func TestSimulateOutputs(t *testing.T) {
	dir := t.TempDir()
	csv := filepath.Join(dir, "trace.csv")
	code, out, errOut := simRun([]string{"simulate", "../../testdata/spins/fluoroethyl.toml", "--out", csv}, true)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, "group") || !strings.Contains(out, "CH2F") || strings.Contains(out, "\tF\t") {
		t.Errorf("table:\n%s", out)
	}
	data, err := os.ReadFile(csv)
	if err != nil {
		t.Fatal(err)
	}
	rows := strings.Split(strings.TrimSpace(string(data)), "\n")
	if rows[0] != "ppm,intensity" || len(rows) != simTracePoints+1 {
		t.Errorf("csv has %d rows, header %q", len(rows), rows[0])
	}
	svg := filepath.Join(dir, "trace.svg")
	if code, _, errOut := simRun([]string{"simulate", "../../testdata/spins/vinyl.toml", "--field", "60", "--out", svg}, false); code != 0 {
		t.Fatalf("svg: exit %d: %s", code, errOut)
	}
	if data, err := os.ReadFile(svg); err != nil || !bytes.Contains(data, []byte("<svg")) {
		t.Errorf("svg output: %v, %d bytes", err, len(data))
	}
	// Piped: tab-separated, no header.
	_, out, _ = simRun([]string{"simulate", "../../testdata/spins/ab.toml"}, false)
	if strings.Contains(out, "group") || strings.Count(out, "\n") != 4 || strings.Count(out, "\t") != 16 {
		t.Errorf("tsv:\n%s", out)
	}
}

func TestSimulateErrors(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.toml")
	os.WriteFile(bad, []byte("[[group]]\nname = \"a\"\nshift_ppm = 1\n[[coupling]]\nbetween = [\"a\", \"z\"]\nj_hz = 7\n"), 0o644)
	bad2 := filepath.Join(dir, "bad2.toml")
	os.WriteFile(bad2, []byte("[[group]]\nname = \"a\"\ncount = 0\n"), 0o644)
	// Values out of bounds (predict/spin/spinfile.go): refused with
	// file:line: key, not simulated (common practice, no source).
	huge := filepath.Join(dir, "huge.toml")
	os.WriteFile(huge, []byte("[[group]]\nname = \"a\"\nshift_ppm = 1e300\n[[group]]\nname = \"b\"\nshift_ppm = 2\n[[coupling]]\nbetween = [\"a\", \"b\"]\nj_hz = 1e300\n"), 0o644)
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"simulate"}, "expected one spin-system file"},
		{[]string{"simulate", huge}, huge + ":3: group[1].shift_ppm: shift must be within ±1000 ppm, found 1e+300\n" + huge + ":9: coupling[1].j_hz: J must be within ±1000 Hz"},
		{[]string{"simulate", "../../testdata/spins/ab.toml", "--field", "0"}, "--field must be the 1H observe frequency in MHz, between 1 and 10000"},
		{[]string{"simulate", "../../testdata/spins/ab.toml", "--field", "1e9"}, "--field must be the 1H observe frequency"},
		{[]string{"simulate", bad}, bad + `:5: coupling[1].between: unknown group "z"`},
		{[]string{"simulate", "../../testdata/spins/ab.toml", "--mode", "fast"}, `unknown mode "fast"`},
		{[]string{"simulate", "../../testdata/spins/ab.toml", "--field", "-3"}, "--field must be"},
		{[]string{"simulate", "../../testdata/spins/ab.toml", "--out", "x.txt"}, "expected a .csv, .svg"},
		{[]string{"simulate", filepath.Join(dir, "missing.toml")}, "no such file"},
		{[]string{"simulate", bad2}, "bad2.toml:1: group[1].shift_ppm: missing shift\n" + bad2 + ":3: group[1].count"},
	} {
		code, _, errOut := simRun(tc.args, false)
		if code != exitError || !strings.Contains(errOut, tc.want) {
			t.Errorf("%v: exit %d, stderr %q; want 1 and %q", tc.args, code, errOut, tc.want)
		}
	}
}
