package screen

import (
	"errors"
	"runtime"
	"strings"
	"sync/atomic"
	"testing"

	"shiftwise/compare"
)

// TestSampleStructuresChecked: a typo in any structure of a sample (the
// product, a candidate, an expected impurity, the qNMR standard) makes that
// sample an error row naming the manifest line and the field, and the check
// is not run. Before, a bad candidate was silently ranked last with score 0
// and a bad impurity silently dropped, and the sample could pass.
func TestSampleStructuresChecked(t *testing.T) {
	text := `[[sample]]
id = "cand"
spectrum = "a.jdx"
smiles = "CCO"
candidates = ["OCC", "C1CC"]
[[sample]]
id = "imp"
spectrum = "a.jdx"
smiles = "CCO"
impurities = [""]
[[sample]]
id = "std"
spectrum = "a.jdx"
smiles = "CCO"
[sample.standard]
smiles = "c1ccc"
mass_mg = 5
purity_percent = 99
sample_mass_mg = 10
[[sample]]
id = "good"
spectrum = "a.jdx"
smiles = "CCO"
candidates = ["OCC"]
`
	m, err := Parse(text, "m.toml")
	if err != nil {
		t.Fatal(err)
	}
	m.Path = "m.toml"
	ran := map[string]bool{}
	check := func(in compare.Input, _ compare.Options) (*compare.Result, error) {
		ran[in.Smiles+in.SpectrumPath] = true
		return &compare.Result{Verdict: compare.Consistent, Score: 1}, nil
	}
	sum, err := Run(m, Options{Check: check, Jobs: 1})
	if err != nil {
		t.Fatal(err)
	}
	want := []string{
		`m.toml:1: sample 1 (cand): candidates[2] "C1CC": smiles: col 2`,
		`m.toml:6: sample 2 (imp): impurities[1] "": smiles: col 1: empty SMILES`,
		`m.toml:11: sample 3 (std): standard.smiles "c1ccc"`,
	}
	for i, w := range want {
		if r := sum.Rows[i]; !strings.HasPrefix(r.Error, w) || r.Verdict != "" {
			t.Errorf("row %d: %+v, want error starting %q", i, r, w)
		}
	}
	if r := sum.Rows[3]; r.Error != "" || r.Verdict != "consistent" {
		t.Errorf("good sample: %+v", r)
	}
	if len(ran) != 1 {
		t.Errorf("check ran %d times, want once (the good sample)", len(ran))
	}
}

// TestCheckErrorNamesSample: an error from the check itself (an unknown
// solvent, an unreadable spectrum) is prefixed with the manifest line and
// sample, so a batch of hundreds can be fixed without guessing.
func TestCheckErrorNamesSample(t *testing.T) {
	m, err := Parse("[[sample]]\nid = \"a\"\nspectrum = \"a.jdx\"\nsmiles = \"C\"\nsolvent = \"banana\"\n", "m.toml")
	if err != nil {
		t.Fatal(err)
	}
	m.Path = "m.toml"
	check := func(compare.Input, compare.Options) (*compare.Result, error) {
		return nil, errors.New(`process: unknown solvent "banana"`)
	}
	sum, err := Run(m, Options{Check: check, Jobs: 1})
	if err != nil {
		t.Fatal(err)
	}
	if got, want := sum.Rows[0].Error, `m.toml:1: sample 1 (a): process: unknown solvent "banana"`; got != want {
		t.Errorf("error %q, want %q", got, want)
	}
}

// TestManifestField: a manifest field_mhz that is not a 1H frequency in MHz
// is an error with its line; before, -5 was silently ignored (read from
// each file instead). 1H observe frequencies run from about 40 to 1200 MHz
// (common practice, no source).
func TestManifestField(t *testing.T) {
	body := "[[sample]]\nid = \"a\"\nspectrum = \"a.jdx\"\nsmiles = \"C\"\n"
	for _, v := range []string{"-5", "0.4", "4e8", "nan"} {
		_, err := Parse("title = \"t\"\nfield_mhz = "+v+"\n"+body, "m.toml")
		if err == nil || !strings.Contains(err.Error(), "m.toml:2: field_mhz") {
			t.Errorf("field_mhz = %s: error %v, want one at m.toml:2", v, err)
		}
	}
	for _, v := range []string{"0", "60", "400"} {
		if _, err := Parse("field_mhz = "+v+"\n"+body, "m.toml"); err != nil {
			t.Errorf("field_mhz = %s: %v", v, err)
		}
	}
}

// TestJobsCapped: a --jobs far above the number of samples starts no idle
// workers (each idle goroutine still costs a stack); 2 samples need at most
// 2 workers whatever the flag says.
func TestJobsCapped(t *testing.T) {
	m := &Manifest{Path: "m.toml", Samples: []Sample{
		{ID: "a", Spectrum: "a.jdx", Smiles: "C"}, {ID: "b", Spectrum: "b.jdx", Smiles: "C"}}}
	var peak atomic.Int64
	check := func(compare.Input, compare.Options) (*compare.Result, error) {
		if n := int64(runtime.NumGoroutine()); n > peak.Load() {
			peak.Store(n)
		}
		return &compare.Result{Verdict: compare.Consistent, Score: 1}, nil
	}
	if _, err := Run(m, Options{Check: check, Jobs: 20000}); err != nil {
		t.Fatal(err)
	}
	if p := peak.Load(); p > 100 {
		t.Errorf("%d goroutines while checking 2 samples", p)
	}
}

// TestIDControlCharacters: a sample id is a row key in the tab-separated
// output and a file name; a tab or newline in it (a TOML "\t" or "\n"
// escape) would split the row, so it is an error row naming the line.
func TestIDControlCharacters(t *testing.T) {
	m, err := Parse("[[sample]]\nid = \"a\\tb\\nc\"\nspectrum = \"a.jdx\"\nsmiles = \"C\"\n[[sample]]\nid = \"ok\"\nspectrum = \"a.jdx\"\nsmiles = \"C\"\n", "m.toml")
	if err != nil {
		t.Fatal(err)
	}
	m.Path = "m.toml"
	check := func(compare.Input, compare.Options) (*compare.Result, error) {
		return &compare.Result{Verdict: compare.Consistent, Score: 1}, nil
	}
	sum, err := Run(m, Options{Check: check, Jobs: 1})
	if err != nil {
		t.Fatal(err)
	}
	if r := sum.Rows[0]; !strings.HasPrefix(r.Error, "m.toml:1: sample 1: id") || !strings.Contains(r.Error, "control character") ||
		strings.ContainsAny(r.ID+r.Error, "\t\n") {
		t.Errorf("row 0: %+v", r)
	}
	if r := sum.Rows[1]; r.Error != "" {
		t.Errorf("row 1: %+v", r)
	}
}

// FuzzManifestParse: any manifest text gives a manifest or an error that
// names the file, never a panic; validating the samples never panics either.
func FuzzManifestParse(f *testing.F) {
	f.Add("[[sample]]\nid = \"a\"\nspectrum = \"a.jdx\"\nsmiles = \"CCO\"\ncandidates = [\"C1CC\"]\n")
	f.Add("field_mhz = -5\n[[sample]]\nid = \"a\\tb\"\nspectrum = \"\"\nsmiles = \"\"\n")
	f.Add("[[sample]]\nid = \"s\"\nspectrum = \"x\"\nsmiles = \"C\"\n[sample.standard]\nsmiles = \"c1ccc\"\nmass_mg = 5\n")
	f.Add("title = \"t\"\nsolvnt = 1\n")
	f.Fuzz(func(t *testing.T, text string) {
		m, err := Parse(text, "fz.toml")
		if err != nil {
			if !strings.HasPrefix(err.Error(), "fz.toml") {
				t.Errorf("error without the file name: %v", err)
			}
			return
		}
		m.Path = "fz.toml"
		seen := map[string]int{}
		for i := range m.Samples {
			m.validate(i, seen)
			seen[m.Samples[i].ID] = i + 1
		}
	})
}
