package main

import (
	"bytes"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"shiftwise/predict"
	"shiftwise/smiles"
)

// qaRun runs the command line args and returns the exit code and streams.
func qaRun(args ...string) (code int, out, errOut string) {
	var o, e bytes.Buffer
	f := &Factory{In: strings.NewReader(""), Out: &o, Err: &e}
	code = Main(args, f)
	return code, o.String(), e.String()
}

// TestFieldFlagRange: an explicit --field that is not a 1H frequency in MHz
// (zero, negative, NaN, a value in Hz or GHz) is a usage error, exit 1, that
// names the flag. Before, --field 0 silently meant 400 MHz and --field 1e9
// (Hz typed for MHz) was accepted. 1H observe frequencies run from about
// 40 MHz (benchtop) to about 1.2 GHz (common practice, no source).
func TestFieldFlagRange(t *testing.T) {
	spins := "../../testdata/spins/ab.toml"
	for _, v := range []string{"0", "-400", "NaN", "+Inf", "1e9", "400e6", "0.4"} {
		for _, args := range [][]string{
			{"predict", "CCO", "--field", v},
			{"simulate", spins, "--field", v},
		} {
			code, out, errOut := qaRun(args...)
			if code != exitError || out != "" || !strings.Contains(errOut, "--field") {
				t.Errorf("%q: exit %d, out %q, err %q; want exit 1 naming --field", args, code, out, errOut)
			}
		}
	}
	for _, v := range []string{"43", "60", "400", "1200"} {
		for _, args := range [][]string{
			{"predict", "CCO", "--field", v},
			{"simulate", spins, "--field", v},
		} {
			if code, _, errOut := qaRun(args...); code != exitOK {
				t.Errorf("%q: exit %d: %s", args, code, errOut)
			}
		}
	}
}

// TestSimulateAutoFragments: in auto mode a strongly coupled cluster too
// large for exact simulation (here 16 protons 4 Hz apart with J = 7 Hz,
// |Δν| < 10·J) is simulated by fragments with a note, not refused; exact
// mode still refuses it (exit 1). The end group, coupled to one neighbour
// only 4 Hz away, is far from its first-order doublet (Pascal's triangle):
// strong coupling gives it more lines.
func TestSimulateAutoFragments(t *testing.T) {
	var b strings.Builder
	for i := 0; i < 16; i++ {
		fmt.Fprintf(&b, "[[group]]\nname = \"g%d\"\nshift_ppm = %.2f\n", i, 1+0.01*float64(i))
	}
	for i := 0; i+1 < 16; i++ {
		fmt.Fprintf(&b, "[[coupling]]\nbetween = [\"g%d\", \"g%d\"]\nj_hz = 7\n", i, i+1)
	}
	path := filepath.Join(t.TempDir(), "chain.toml")
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, errOut := qaRun("simulate", path)
	if code != exitOK || !strings.Contains(errOut, "fragments") {
		t.Fatalf("auto: exit %d, stderr %q; want 0 and a note", code, errOut)
	}
	g0 := 0
	for _, line := range strings.Split(strings.TrimSpace(out), "\n") {
		if strings.HasPrefix(line, "g0\t") {
			g0++
			if !strings.HasSuffix(line, "\tfragment") {
				t.Errorf("line %q: want fragment", line)
			}
		}
	}
	if g0 <= 2 {
		t.Errorf("g0 has %d lines, want more than a first-order doublet:\n%s", g0, out)
	}
	if code, _, errOut := qaRun("simulate", path, "--mode", "exact"); code != exitError || !strings.Contains(errOut, "too large") {
		t.Errorf("exact: exit %d, stderr %q; want 1 and the size error", code, errOut)
	}
}

// TestDescribeNoEnvironments: H2 has hydrogens (its formula says H2) but
// no proton environment on a heavy atom; the table must not claim "no
// hydrogens" beside a formula with H in it (common practice, no source).
func TestDescribeNoEnvironments(t *testing.T) {
	for _, smi := range []string{"[H][H]", "[2H]C([2H])([2H])Cl", "ClC(Cl)(Cl)Cl"} {
		var o, e bytes.Buffer
		code := Main([]string{"describe", smi}, &Factory{In: strings.NewReader(""), Out: &o, Err: &e, IsTTY: true})
		if code != exitOK || strings.Contains(o.String(), "no hydrogens") || !strings.Contains(o.String(), "no proton environments") {
			t.Errorf("%s: exit %d, output:\n%s", smi, code, o.String())
		}
	}
}

// TestVersionFlag: --version prints the version the reports record, so a
// reviewer can match a report to the binary that wrote it (common practice
// for validated lab software, no source).
func TestVersionFlag(t *testing.T) {
	code, out, errOut := qaRun("--version")
	if code != exitOK || !strings.Contains(out, version) {
		t.Errorf("exit %d, out %q, err %q; want the version %q", code, out, errOut, version)
	}
}

// TestSimulateNoProtonsAndOut: a spin file with no 1H group says so instead of an
// empty answer, and --out goes through the atomic writer like the other
// commands: a missing directory is an error naming it, and no temporary
// file is left beside a written trace.
func TestSimulateNoProtonsAndOut(t *testing.T) {
	dir := t.TempDir()
	f19 := filepath.Join(dir, "f.toml")
	if err := os.WriteFile(f19, []byte("[[group]]\nname = \"f\"\nshift_ppm = -120\nnucleus = \"19F\"\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if code, _, errOut := qaRun("simulate", f19); code != exitOK || !strings.Contains(errOut, "no 1H group") {
		t.Errorf("19F only: exit %d, stderr %q; want 0 and a note", code, errOut)
	}
	spins := "../../testdata/spins/ab.toml"
	missing := filepath.Join(dir, "no", "ab.csv")
	if code, _, errOut := qaRun("simulate", spins, "--out", missing); code != exitError || !strings.Contains(errOut, "does not exist") {
		t.Errorf("missing dir: exit %d, stderr %q", code, errOut)
	}
	for _, name := range []string{"ab.csv", "ab.svg"} {
		if code, _, errOut := qaRun("simulate", spins, "--out", filepath.Join(dir, name)); code != exitOK {
			t.Fatalf("%s: exit %d: %s", name, code, errOut)
		}
	}
	ents, _ := os.ReadDir(dir)
	for _, e := range ents {
		if strings.Contains(e.Name(), ".tmp-") {
			t.Errorf("temporary file %s left behind", e.Name())
		}
	}
}

// TestPredictLabelsAboveMultiplet: at 60 MHz the ethyl acetate CH2 quartet
// (J 7.1 Hz) spans 0.36 ppm with a valley at its centre; its label must
// sit above the quartet's tallest line, not in the valley between the
// inner lines (Pascal's triangle 1:3:3:1, so the inner lines are tallest).
func TestPredictLabelsAboveMultiplet(t *testing.T) {
	m, err := smiles.Parse("CCOC(C)=O")
	if err != nil {
		t.Fatal(err)
	}
	p, err := predict.Predict(m, "CCOC(C)=O", predict.Options{FieldMHz: 60})
	if err != nil {
		t.Fatal(err)
	}
	s := predictTrace(p)
	top := 0.0
	for _, y := range s.Y {
		top = math.Max(top, y)
	}
	lb, err := predictLabels(p, s, top)
	if err != nil {
		t.Fatal(err)
	}
	for k, sig := range p.Signals {
		tallest := 0.0
		for _, l := range p.Lines {
			if l.Signal != sig.Label {
				continue
			}
			for i, x := range s.PPM {
				if math.Abs(x-l.PPM) < 0.002 {
					tallest = math.Max(tallest, s.Y[i])
				}
			}
		}
		if y := lb.XYs[k].Y; y < tallest {
			t.Errorf("signal %s: label at %.1f, below its tallest line %.1f", sig.Label, y, tallest)
		}
	}
}

// TestPredictAllSmilesErrors: predict shows every SMILES error with its
// own caret, as describe does, instead of the first one and "(and 1 more
// errors)" with no way to see the second (common practice, no source).
func TestPredictAllSmilesErrors(t *testing.T) {
	code, _, errOut := qaRun("predict", "Xx")
	if code != exitError || strings.Contains(errOut, "more error") ||
		!strings.Contains(errOut, "col 1: unexpected character 'X'\nXx\n^\n") ||
		!strings.Contains(errOut, "col 2: unexpected character 'x'\nXx\n ^") {
		t.Errorf("exit %d, stderr:\n%s", code, errOut)
	}
}
