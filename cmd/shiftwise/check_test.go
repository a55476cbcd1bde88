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

// butanoneJCAMP writes a synthetic 400 MHz CDCl3 spectrum of butanone:
// CH3 triplet 1.06, CH3CO singlet 2.14, CH2 quartet 2.44, J = 7.3 Hz
// (handbook values, value from memory; binomial first-order intensities,
// Pascal's triangle), residual CHCl3 7.26 (Gottlieb 1997, value from
// memory), TMS 0, Lorentzian lines of 1 Hz, seeded noise.
func butanoneJCAMP(t *testing.T) string {
	t.Helper()
	const field, n, lo, hi = 400.0, 32768, -0.5, 10.5
	type ln struct{ ppm, area float64 }
	lines := []ln{{0, 0.3}, {7.26, 0.2}, {2.14, 3}}
	for k, w := range []float64{1, 2, 1} {
		lines = append(lines, ln{1.06 + (float64(k)-1)*7.3/field, 3 * w / 4})
	}
	for k, w := range []float64{1, 3, 3, 1} {
		lines = append(lines, ln{2.44 + (float64(k)-1.5)*7.3/field, 2 * w / 8})
	}
	s := &spectrum.Spectrum{PPM: make([]float64, n), Y: make([]float64, n), FieldMHz: field, Solvent: "CDCl3", Nucleus: "1H", Title: "butanone"}
	r := rand.New(rand.NewPCG(11, 13))
	g := 0.5 / field
	for i := range s.PPM {
		x := lo + (hi-lo)*float64(i)/float64(n-1)
		s.PPM[i] = x
		y := r.NormFloat64()
		for _, l := range lines {
			d := (x - l.ppm) / g
			y += 2000 * l.area / (1 + d*d)
		}
		s.Y[i] = y
	}
	var b bytes.Buffer
	if err := spectrum.WriteJCAMP(&b, s, true); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "butanone.jdx")
	if err := os.WriteFile(path, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

func runCheckCmd(args []string, tty bool) (int, string, string) {
	var o, e bytes.Buffer
	f := &Factory{In: strings.NewReader(""), Out: &o, Err: &e, IsTTY: tty}
	code := Main(append([]string{"check"}, args...), f)
	return code, o.String(), e.String()
}

func TestCheckCommandVerdicts(t *testing.T) {
	path := butanoneJCAMP(t)
	code, out, errOut := runCheckCmd([]string{"--smiles", "CCC(C)=O", path, "--json", "--candidate", "CC(C)C=O"}, false)
	if code != exitOK {
		t.Fatalf("butanone: exit %d (want 0, consistent): %s\n%s", code, errOut, out)
	}
	var res map[string]any
	if err := json.Unmarshal([]byte(out), &res); err != nil {
		t.Fatalf("JSON: %v\n%s", err, out)
	}
	for _, k := range []string{"verdict", "score", "reasons", "assignments", "unexplained", "missing", "purity", "candidates", "advisory"} {
		if _, ok := res[k]; !ok {
			t.Errorf("JSON lacks %q", k)
		}
	}
	if c, _ := res["candidates"].([]any); len(c) != 2 {
		t.Errorf("candidates %v, want 2 ranked", res["candidates"])
	}
	// Isobutyraldehyde has a CHO proton near 9.6 ppm that butanone lacks
	// (common practice, no source): inconsistent, exit 3.
	code, _, errOut = runCheckCmd([]string{"--smiles", "CC(C)C=O", path}, false)
	if code != exitInconsistent {
		t.Errorf("isobutyraldehyde: exit %d, want %d; %s", code, exitInconsistent, errOut)
	}
}

func TestCheckCommandOutputs(t *testing.T) {
	path := butanoneJCAMP(t)
	_, out, _ := runCheckCmd([]string{"--smiles", "CCC(C)=O", path}, true)
	for _, want := range []string{"Verdict:", "SIGNAL", "Purity:", "advisory"} {
		if !strings.Contains(out, want) {
			t.Errorf("table output lacks %q:\n%s", want, out)
		}
	}
	_, out, _ = runCheckCmd([]string{"--smiles", "CCC(C)=O", path}, false)
	if !strings.HasPrefix(out, "verdict\t") || !strings.Contains(out, "\nassignment\t") {
		t.Errorf("piped output not tab-separated records:\n%s", out)
	}
	rep := filepath.Join(t.TempDir(), "r.html")
	if code, _, e := runCheckCmd([]string{"--smiles", "CCC(C)=O", path, "--report", rep}, false); code != 0 {
		t.Fatalf("report: exit %d %s", code, e)
	}
	if b, err := os.ReadFile(rep); err != nil || !strings.Contains(string(b), "<html") {
		t.Errorf("report not written: %v", err)
	}
}

func TestCheckCommandErrors(t *testing.T) {
	path := butanoneJCAMP(t)
	for _, tc := range []struct {
		name string
		args []string
		msg  string
	}{
		{"no smiles", []string{path}, "--smiles is required"},
		{"no spectrum", []string{"--smiles", "CCO"}, "expected one spectrum file"},
		{"bad smiles", []string{"--smiles", "C1CC", path}, "smiles"},
		{"missing file", []string{"--smiles", "CCO", filepath.Join(t.TempDir(), "none.jdx")}, "none.jdx"},
		{"qnmr incomplete", []string{"--smiles", "CCO", path, "--standard", "OC(=O)/C=C\\C(=O)O"}, "qNMR needs"},
		{"bad flag", []string{"--smiles", "CCO", path, "--field", "abc"}, "field"},
	} {
		code, _, errOut := runCheckCmd(tc.args, false)
		if code != exitError || !strings.Contains(errOut, tc.msg) {
			t.Errorf("%s: exit %d, stderr %q; want exit 1 mentioning %q", tc.name, code, errOut, tc.msg)
		}
	}
}

func TestCheckCommandQNMR(t *testing.T) {
	path := butanoneJCAMP(t)
	// Standard given but its signals are absent: the check still runs, qNMR
	// is null and a warning says why.
	code, out, errOut := runCheckCmd([]string{"--smiles", "CCC(C)=O", path, "--json", "--standard", "COc1cc(OC)cc(OC)c1",
		"--standard-mass", "10", "--sample-mass", "20", "--standard-purity", "99.9"}, false)
	if code == exitError {
		t.Fatalf("exit 1: %s", errOut)
	}
	var res struct {
		Purity struct {
			QNMRMassPercent *float64 `json:"qnmr_mass_percent"`
		} `json:"purity"`
		Warnings []string `json:"warnings"`
	}
	if err := json.Unmarshal([]byte(out), &res); err != nil {
		t.Fatal(err)
	}
	if res.Purity.QNMRMassPercent != nil && !math.IsNaN(*res.Purity.QNMRMassPercent) {
		t.Errorf("qNMR %v without the standard's signals", *res.Purity.QNMRMassPercent)
	}
	if !strings.Contains(strings.Join(res.Warnings, " "), "qNMR") {
		t.Errorf("no qNMR warning: %v", res.Warnings)
	}
}
