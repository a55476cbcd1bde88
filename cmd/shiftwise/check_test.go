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
	return butanoneWithJCAMP(t, nil)
}

// specLine is a singlet of a synthetic spectrum: shift and area in H.
type specLine struct{ ppm, area float64 }

// butanoneWithJCAMP is butanoneJCAMP with extra singlets (e.g. an internal
// standard).
func butanoneWithJCAMP(t *testing.T, extra []specLine) string {
	t.Helper()
	const field, n, lo, hi = 400.0, 32768, -0.5, 10.5
	type ln = specLine
	lines := []ln{{0, 0.3}, {7.26, 0.2}, {2.14, 3}}
	lines = append(lines, extra...)
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
	// The cautions and the advisory statement travel with piped output too
	// (a script may be what a reviewer reads).
	if !strings.Contains(out, "\ncaution\tintegrals assume") || !strings.Contains(out, "\nadvisory\t") || !strings.Contains(out, "qualified review") {
		t.Errorf("piped output lacks cautions or the advisory statement:\n%s", out)
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

// TestCheckCommandFlagErrors: bad structures and out-of-range numbers in
// the flags are usage errors (exit 1) naming the flag and, for repeated
// flags, its 1-based position, with the SMILES error and caret; they are
// found before any work (the spectrum path here does not exist, so a later
// check would report the file instead).
func TestCheckCommandFlagErrors(t *testing.T) {
	none := filepath.Join(t.TempDir(), "none.jdx")
	main := []string{"--smiles", "CCOC(=O)c1ccc(OC)cc1", none}
	qnmr := func(std, smass, purity string) []string {
		return append(append([]string{}, main...), "--standard", "COc1cc(OC)cc(OC)c1", "--standard-mass", std, "--sample-mass", smass, "--standard-purity", purity)
	}
	for _, tc := range []struct {
		name string
		args []string
		msg  string
	}{
		{"bad candidate", append(append([]string{}, main...), "--candidate", "C("),
			"check: --candidate 1: smiles: col 2: unbalanced parenthesis: '(' is never closed (SMILES may be truncated)\nC(\n ^"},
		{"second candidate", append(append([]string{}, main...), "--candidate", "CCO", "--candidate", "CC1"), "check: --candidate 2: smiles: col 3: unclosed ring bond 1"},
		{"empty impurity", append(append([]string{}, main...), "--impurity", ""), "check: --impurity 1: empty SMILES"},
		{"blank impurity", append(append([]string{}, main...), "--impurity", "  "), "check: --impurity 1: empty SMILES"},
		{"second impurity", append(append([]string{}, main...), "--impurity", "CCO", "--impurity", "C1CC"),
			"check: --impurity 2: smiles: col 2: unclosed ring bond 1 (SMILES may be truncated)\nC1CC\n ^"},
		{"bad standard", append(qnmr("5", "15", "99.9")[:3:3], "--standard", "c1ccc1X", "--standard-mass", "5", "--sample-mass", "15", "--standard-purity", "99.9"), "check: --standard: smiles: col"},
		{"bad main", []string{"--smiles", "CC(", none}, "check: --smiles: smiles: col 3"},
		{"field zero", append(append([]string{}, main...), "--field", "0"), "--field must be the 1H observe frequency in MHz, between 1 and 10000"},
		{"field NaN", append(append([]string{}, main...), "--field", "NaN"), "--field must be"},
		{"field huge", append(append([]string{}, main...), "--field", "1e9"), "--field must be"},
		{"min-snr NaN", append(append([]string{}, main...), "--min-snr", "NaN"), "--min-snr must be"},
		// Masses must be finite, ≥ 0.001 mg and ≤ 10 g; purity in (0, 100]
		// (compare.MinMassMg, MaxMassMg; common practice, no source).
		{"mass huge", qnmr("1e308", "1e-308", "99"), "--standard-mass must be a weighed mass in mg between 0.001 and 10000, found 1e+308"},
		{"mass swapped", qnmr("1e-308", "1e308", "99"), "--standard-mass must be"},
		{"sample tiny", qnmr("5", "1e-308", "99"), "--sample-mass must be a weighed mass in mg between 0.001 and 10000, found 1e-308"},
		{"sample NaN", qnmr("5", "NaN", "99"), "--sample-mass must be"},
		{"mass Inf", qnmr("+Inf", "15", "99"), "--standard-mass must be"},
		{"mass negative", qnmr("-5", "15", "99"), "--standard-mass must be"},
		{"purity zero", qnmr("5", "15", "0"), "--standard-purity must be a mass % in (0, 100]"},
		{"purity over", qnmr("5", "15", "100.5"), "--standard-purity must be"},
		{"purity NaN", qnmr("5", "15", "NaN"), "--standard-purity must be"},
		{"signal NaN", append(qnmr("5", "15", "99"), "--standard-signal", "NaN"), "--standard-signal must be a shift in ppm"},
		{"signal alone", append(append([]string{}, main...), "--standard-signal", "6.1"), "qNMR needs"},
	} {
		code, out, errOut := runCheckCmd(tc.args, false)
		if code != exitError || !strings.Contains(errOut, tc.msg) {
			t.Errorf("%s: exit %d, stderr %q; want exit 1 with %q", tc.name, code, errOut, tc.msg)
		}
		if out != "" {
			t.Errorf("%s: output on a usage error: %q", tc.name, out)
		}
	}
}

// TestCheckCommandStandardSignalAbsent: --standard-signal at a shift where
// the standard has no signal gives no qNMR result, a review verdict (exit
// 4) and a reason saying so; at the standard's own singlet the assay is
// computed. 1,3,5-Trimethoxybenzene: ArH 6.09 s 3H, OCH3 3.77 s 9H
// (handbook values, value from memory); 0.5 molecule per butanone molecule
// here.
func TestCheckCommandStandardSignalAbsent(t *testing.T) {
	path := butanoneWithJCAMP(t, []specLine{{6.09, 1.5}, {3.77, 4.5}})
	args := func(sig string) []string {
		return []string{"--smiles", "CCC(C)=O", path, "--json", "--standard", "COc1cc(OC)cc(OC)c1",
			"--standard-mass", "10", "--sample-mass", "10", "--standard-purity", "99.9", "--standard-signal", sig}
	}
	type result struct {
		Verdict string   `json:"verdict"`
		Reasons []string `json:"reasons"`
		Purity  struct {
			QNMRMassPercent *float64 `json:"qnmr_mass_percent"`
		} `json:"purity"`
	}
	code, out, errOut := runCheckCmd(args("99"), false)
	var r result
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatalf("exit %d: %v\n%s", code, err, errOut)
	}
	if code != exitReview || r.Verdict != "review" || r.Purity.QNMRMassPercent != nil ||
		!strings.Contains(strings.Join(r.Reasons, "|"), "internal standard signal at 99.00 ppm not found; no qNMR result") {
		t.Errorf("signal 99: exit %d, verdict %s, qNMR %v, reasons %q", code, r.Verdict, r.Purity.QNMRMassPercent, r.Reasons)
	}
	code, out, errOut = runCheckCmd(args("6.09"), false)
	r = result{}
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatalf("exit %d: %v\n%s", code, err, errOut)
	}
	// qNMR equation: n(butanone)/n(standard) = 2, so P = 2·(72.11/168.19)·(10/10)·99.9 = 85.66 %
	// (molar masses from IUPAC standard atomic weights; hand-computed).
	if code != exitOK || r.Purity.QNMRMassPercent == nil || math.Abs(*r.Purity.QNMRMassPercent-85.66) > 1 {
		t.Errorf("signal 6.09: exit %d, verdict %s, qNMR %v, reasons %q", code, r.Verdict, r.Purity.QNMRMassPercent, r.Reasons)
	}
	// A release specification of 90 % (--min-purity) turns the same
	// 85.7 % assay into a review with the reason; an out-of-range value is
	// a usage error.
	code, out, errOut = runCheckCmd(append(args("6.09"), "--min-purity", "90"), false)
	r = result{}
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatalf("exit %d: %v\n%s", code, err, errOut)
	}
	if code != exitReview || !strings.Contains(strings.Join(r.Reasons, "|"), "qNMR mass purity is 85.") {
		t.Errorf("--min-purity 90: exit %d, verdict %s, reasons %q", code, r.Verdict, r.Reasons)
	}
	if code, _, errOut := runCheckCmd(append(args("6.09"), "--min-purity", "150"), false); code != exitError || !strings.Contains(errOut, "--min-purity") {
		t.Errorf("--min-purity 150: exit %d, %s", code, errOut)
	}
}
