package main

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"
)

// runDescribeArgs runs the command line with in-memory streams.
func runDescribeArgs(t *testing.T, tty bool, args ...string) (code int, stdout, stderr string) {
	t.Helper()
	var out, errb bytes.Buffer
	f := &Factory{In: strings.NewReader(""), Out: &out, Err: &errb, IsTTY: tty}
	code = Main(append([]string{"describe"}, args...), f)
	return code, out.String(), errb.String()
}

func TestDescribeJSON(t *testing.T) {
	code, out, errs := runDescribeArgs(t, false, "CC(=O)Oc1ccccc1C(=O)O", "--json")
	if code != 0 {
		t.Fatalf("exit %d, stderr %s", code, errs)
	}
	var r struct {
		Smiles           string   `json:"smiles"`
		Formula          string   `json:"formula"`
		MolecularWeight  *float64 `json:"molecular_weight"`
		MonoisotopicMass *float64 `json:"monoisotopic_mass"`
		Environments     []struct {
			Label string `json:"label"`
			Atoms []int  `json:"atoms"`
			NH    int    `json:"n_h"`
			Kind  string `json:"kind"`
		} `json:"environments"`
	}
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatalf("output is not JSON: %v\n%s", err, out)
	}
	// Aspirin, C9H8O4: molecular weight 180.16 g/mol and monoisotopic mass
	// 180.0423 u (PubChem CID 2244 computed properties, value from memory).
	if r.Smiles != "CC(=O)Oc1ccccc1C(=O)O" || r.Formula != "C9H8O4" {
		t.Errorf("smiles %q formula %q", r.Smiles, r.Formula)
	}
	if r.MolecularWeight == nil || *r.MolecularWeight != 180.16 {
		t.Errorf("molecular_weight %v, want 180.16", r.MolecularWeight)
	}
	if r.MonoisotopicMass == nil || *r.MonoisotopicMass != 180.0423 {
		t.Errorf("monoisotopic_mass %v, want 180.0423", r.MonoisotopicMass)
	}
	// Acetyl CH3, four distinct ring H and the acid OH (common practice,
	// no source: aspirin's 1H spectrum shows these six signals).
	if len(r.Environments) != 6 {
		t.Fatalf("%d environments, want 6: %s", len(r.Environments), out)
	}
	first := r.Environments[0]
	if first.Label != "A" || len(first.Atoms) != 1 || first.Atoms[0] != 0 || first.NH != 3 || first.Kind != "CH3" {
		t.Errorf("first environment %+v, want A [0] 3 CH3", first)
	}
	if last := r.Environments[5]; last.Kind != "COOH" || last.Atoms[0] != 12 {
		t.Errorf("last environment %+v, want COOH on atom 12", last)
	}
	for _, key := range []string{`"smiles"`, `"formula"`, `"molecular_weight"`, `"monoisotopic_mass"`, `"environments"`, `"n_h"`, `"kind"`, `"atoms"`, `"label"`} {
		if !strings.Contains(out, key) {
			t.Errorf("JSON lacks key %s", key)
		}
	}
}

func TestDescribeTable(t *testing.T) {
	code, out, _ := runDescribeArgs(t, true, "COc1ccc(Cl)cc1")
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
	// 4-chloroanisole, C7H7ClO: 7×12.011 + 7×1.008 + 35.45 + 15.999 =
	// 142.58 g/mol (IUPAC standard atomic weights, conventional values);
	// its ring H form an AA'BB' system (common practice, no source).
	for _, want := range []string{"C7H7ClO", "142.58 g/mol", "LABEL", "ArH", "not magnetically equivalent", "3,8"} {
		if !strings.Contains(out, want) {
			t.Errorf("table lacks %q:\n%s", want, out)
		}
	}
}

func TestDescribeTSV(t *testing.T) {
	code, out, _ := runDescribeArgs(t, false, "CCO")
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
	// Ethanol C2H6O, 46.07 g/mol, monoisotopic 46.0419 u (PubChem CID 702,
	// values from memory); CH3, CH2 and OH (common practice).
	want := "smiles\tCCO\nformula\tC2H6O\nmolecular_weight\t46.07\nmonoisotopic_mass\t46.0419\n" +
		"environment\tA\t0\t3\tCH3\tfalse\ttrue\n" +
		"environment\tB\t1\t2\tCH2\tfalse\ttrue\n" +
		"environment\tC\t2\t1\tOH\ttrue\ttrue\n"
	if out != want {
		t.Errorf("TSV output:\n%s\nwant:\n%s", out, want)
	}
}

func TestDescribeBadSmiles(t *testing.T) {
	tests := []struct {
		smi, col, caret string
	}{
		{"CC(C", "col 3", "  CC(C\n    ^"},
		{"C1CC", "col 2", "  C1CC\n   ^"},
		{"CC[Xx]", "col", "CC[Xx]"},
	}
	for _, tc := range tests {
		code, out, errs := runDescribeArgs(t, false, tc.smi)
		if code != 1 {
			t.Errorf("%s: exit %d, want 1", tc.smi, code)
		}
		if out != "" {
			t.Errorf("%s: stdout %q, want nothing", tc.smi, out)
		}
		if !strings.Contains(errs, tc.col) || !strings.Contains(errs, tc.caret) {
			t.Errorf("%s: stderr %q lacks %q and caret %q", tc.smi, errs, tc.col, tc.caret)
		}
	}
	if code, _, _ := runDescribeArgs(t, false); code != 1 {
		t.Errorf("no argument: exit %d, want 1", code)
	}
}
