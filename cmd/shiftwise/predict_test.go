package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"shiftwise/predict"
	"shiftwise/spectrum"
)

func predictRun(args []string, tty bool) (code int, out, errOut string) {
	var o, e bytes.Buffer
	f := &Factory{In: strings.NewReader(""), Out: &o, Err: &e, IsTTY: tty}
	code = Main(append([]string{"predict"}, args...), f)
	return code, o.String(), e.String()
}

// TestPredictFlags captures the parsed options.
func TestPredictFlags(t *testing.T) {
	tests := []struct {
		args []string
		want predictOptions
	}{
		{[]string{"CCO"}, predictOptions{Smiles: "CCO", Field: 400, Solvent: "CDCl3", Mode: "auto"}},
		{[]string{"CCO", "--field", "60", "--solvent", "DMSO-d6", "--mode", "exact", "--json", "--out", "x.png", "--rules", "r.toml"},
			predictOptions{Smiles: "CCO", Field: 60, Solvent: "DMSO-d6", Mode: "exact", JSON: true, Out: "x.png", Rules: "r.toml"}},
	}
	for _, tc := range tests {
		var got *predictOptions
		f := &Factory{In: strings.NewReader(""), Out: &bytes.Buffer{}, Err: &bytes.Buffer{}}
		cmd := newPredictCmdWith(f, func(_ *Factory, o *predictOptions) error { got = o; return nil })
		cmd.SetArgs(tc.args)
		if err := cmd.Execute(); err != nil {
			t.Fatalf("%v: %v", tc.args, err)
		}
		if *got != tc.want {
			t.Errorf("%v: %+v, want %+v", tc.args, *got, tc.want)
		}
	}
}

// TestPredictDoneWhen is the done-when check of issue 3 through the
// command: trans-ethyl cinnamate gives a trans vinyl pair with J 15–17 Hz
// (literature 16.0 Hz, value from memory), a quartet and a triplet for the
// ethyl group and five aromatic H (common practice, no source).
func TestPredictDoneWhen(t *testing.T) {
	code, out, errOut := predictRun([]string{"CCOC(=O)/C=C/c1ccccc1", "--json"}, false)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var p predict.Prediction
	if err := json.Unmarshal([]byte(out), &p); err != nil {
		t.Fatal(err)
	}
	if p.Formula != "C11H12O2" || p.FieldMHz != 400 || p.Solvent != "CDCl3" {
		t.Errorf("header %q %v %q", p.Formula, p.FieldMHz, p.Solvent)
	}
	mult := map[string]string{}
	vinylOK, ar := 0, 0
	for _, s := range p.Signals {
		mult[s.Kind] += s.Multiplicity
		switch s.Kind {
		case "=CH":
			if s.Multiplicity == "d" && s.Couplings[0].JHz >= 15 && s.Couplings[0].JHz <= 17 {
				vinylOK++
			}
		case "ArH":
			ar += s.NH
		}
	}
	if vinylOK != 2 || mult["CH3"] != "t" || mult["CH2"] != "q" || ar != 5 {
		t.Errorf("vinyl doublets %d, CH3 %q, CH2 %q, ArH %d; want 2, t, q, 5\n%s", vinylOK, mult["CH3"], mult["CH2"], ar, out)
	}
	// The fixed JSON keys.
	for _, k := range []string{`"smiles"`, `"formula"`, `"molecular_weight"`, `"field_mhz"`, `"solvent"`, `"signals"`,
		`"label"`, `"atoms"`, `"n_h"`, `"shift_ppm"`, `"shift_sd"`, `"multiplicity"`, `"exchangeable"`, `"low_confidence"`,
		`"couplings"`, `"to"`, `"j_hz"`, `"j_min"`, `"j_max"`, `"n_bonds"`, `"lines"`, `"ppm"`, `"intensity"`, `"signal"`} {
		if !strings.Contains(out, k) {
			t.Errorf("JSON lacks %s", k)
		}
	}
}

func TestPredictTableAndTSV(t *testing.T) {
	code, out, _ := predictRun([]string{"CCO"}, true)
	if code != 0 || !strings.Contains(out, "±") || !strings.Contains(out, "br s") || !strings.Contains(out, "C2H6O") {
		t.Errorf("TTY table (exit %d):\n%s", code, out)
	}
	code, out, _ = predictRun([]string{"CCO"}, false)
	lines := strings.Split(strings.TrimSpace(out), "\n")
	if code != 0 || len(lines) != 4 || !strings.HasPrefix(lines[0], "label\tshift_ppm\t") || strings.Count(lines[1], "\t") != 7 {
		t.Errorf("TSV (exit %d):\n%s", code, out)
	}
}

// TestPredictBadSmiles: a bad SMILES exits 1 with the column and a caret.
func TestPredictBadSmiles(t *testing.T) {
	code, _, errOut := predictRun([]string{"CC(C"}, false)
	if code != 1 || !strings.Contains(errOut, "col 3") || !strings.Contains(errOut, "CC(C\n  ^") {
		t.Errorf("exit %d, stderr:\n%s", code, errOut)
	}
	for _, args := range [][]string{{"CC", "--mode", "fast"}, {"CC", "--field", "-5"}, {"CC", "--solvent", "tea"}, {"CC", "--out", "x.txt"}} {
		if code, _, errOut := predictRun(args, false); code != 1 || errOut == "" {
			t.Errorf("%v: exit %d, stderr %q", args, code, errOut)
		}
	}
}

// TestPredictOut writes each output type; the CSV and JCAMP-DX traces read
// back with the spectrum readers and peak near the predicted shifts.
func TestPredictOut(t *testing.T) {
	dir := t.TempDir()
	for _, ext := range []string{".csv", ".jdx", ".svg", ".png"} {
		path := filepath.Join(dir, "styrene"+ext)
		if code, _, errOut := predictRun([]string{"C=Cc1ccccc1", "--out", path}, false); code != 0 {
			t.Fatalf("%s: exit %d: %s", ext, code, errOut)
		}
		st, err := os.Stat(path)
		if err != nil || st.Size() == 0 {
			t.Fatalf("%s: %v", ext, err)
		}
		if ext != ".csv" && ext != ".jdx" {
			continue
		}
		s, err := spectrum.ReadFile(path)
		if err != nil {
			t.Fatalf("%s: read back: %v", ext, err)
		}
		best, at := 0.0, 0.0
		for i, y := range s.Y {
			if y > best {
				best, at = y, s.PPM[i]
			}
		}
		// The tallest peak is aromatic (5 H near 7.2–7.4 ppm; common practice).
		if at < 6.8 || at > 7.8 {
			t.Errorf("%s: tallest point at %.2f ppm, want the aromatic region", ext, at)
		}
	}
}

// TestPredictBadRules: a malformed rules file exits 1 naming file and line.
func TestPredictBadRules(t *testing.T) {
	path := filepath.Join(t.TempDir(), "bad.toml")
	if err := os.WriteFile(path, []byte("this is = not [valid\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	code, _, errOut := predictRun([]string{"CC", "--rules", path}, false)
	if code != 1 || !strings.Contains(errOut, path+":1:") {
		t.Errorf("exit %d, stderr %q; want 1 and %s:1:", code, errOut, path)
	}
}
