package screen

import (
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"shiftwise/compare"
	"shiftwise/internal/synth"
	"shiftwise/spectrum"
)

// writeSpectrum synthesises a spectrum of the given components and writes it
// as JCAMP-DX into dir.
func writeSpectrum(t testing.TB, dir, name string, seed uint64, comps ...synth.Component) {
	t.Helper()
	s, err := synth.Make(synth.Recipe{Components: comps, Seed: seed, Points: 32768, Satellites: true})
	if err != nil {
		t.Fatal(err)
	}
	f, err := os.Create(filepath.Join(dir, name))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if err := spectrum.WriteJCAMP(f, s, true); err != nil {
		t.Fatal(err)
	}
}

const (
	ethylAcetate   = "CCOC(C)=O"
	anisaldehyde   = "COc1ccc(C=O)cc1"
	propylBenzoate = "CCCOC(=O)c1ccccc1"
	isoPropyl      = "CC(C)OC(=O)c1ccccc1"
)

// mixedManifest has two good samples, a right structure against a wrong
// spectrum (n-propyl vs isopropyl benzoate: a classic isomer pair, common
// practice), a missing file, a bad SMILES and a corrupt spectrum.
func mixedManifest(t *testing.T) string {
	dir := t.TempDir()
	writeSpectrum(t, dir, "good1.jdx", 1, synth.Component{Smiles: ethylAcetate, Moles: 1})
	writeSpectrum(t, dir, "good2.jdx", 2, synth.Component{Smiles: anisaldehyde, Moles: 1})
	writeSpectrum(t, dir, "iso.jdx", 3, synth.Component{Smiles: isoPropyl, Moles: 1})
	os.WriteFile(filepath.Join(dir, "corrupt.jdx"), []byte("##TITLE=broken\n##JCAMP-DX=5.01\n##DATA TYPE=NMR SPECTRUM\n##XYDATA=(X++(Y..Y))\n1 2 3 x@#\n"), 0o644)
	man := fmt.Sprintf(`title = "mixed"
solvent = "CDCl3"
[[sample]]
id = "GOOD-1"
spectrum = "good1.jdx"
smiles = %q
[[sample]]
id = "GOOD-2"
spectrum = "good2.jdx"
smiles = %q
[[sample]]
id = "WRONG"
spectrum = "iso.jdx"
smiles = %q
[[sample]]
id = "NOFILE"
spectrum = "missing.jdx"
smiles = %q
[[sample]]
id = "BADSMILES"
spectrum = "good1.jdx"
smiles = "CC(=O"
[[sample]]
id = "CORRUPT"
spectrum = "corrupt.jdx"
smiles = %q
`, ethylAcetate, anisaldehyde, propylBenzoate, ethylAcetate, ethylAcetate)
	p := filepath.Join(dir, "batch.toml")
	os.WriteFile(p, []byte(man), 0o644)
	return p
}

func TestMixedBatch(t *testing.T) {
	m, err := Load(mixedManifest(t))
	if err != nil {
		t.Fatal(err)
	}
	out := t.TempDir()
	sum, err := Run(m, Options{OutDir: out, Jobs: 2})
	if err != nil {
		t.Fatal(err)
	}
	byID := map[string]Row{}
	for _, r := range sum.Rows {
		byID[r.ID] = r
	}
	for _, id := range []string{"GOOD-1", "GOOD-2"} {
		r := byID[id]
		if r.Error != "" || r.Verdict != string(compare.Consistent) || r.Report == "" {
			t.Errorf("%s: want consistent with report, got %+v", id, r)
		}
		if _, err := os.Stat(filepath.Join(out, r.Report)); err != nil {
			t.Errorf("%s: report missing: %v", id, err)
		}
	}
	if r := byID["WRONG"]; r.Error != "" || r.Verdict == string(compare.Consistent) {
		t.Errorf("n-propyl structure against isopropyl spectrum: want not consistent, got %+v", r)
	}
	wantErr := map[string]string{"NOFILE": "missing.jdx", "BADSMILES": "col", "CORRUPT": "corrupt.jdx"}
	for id, frag := range wantErr {
		r := byID[id]
		if r.Error == "" || !strings.Contains(r.Error, frag) || r.Verdict != "" {
			t.Errorf("%s: want an error row mentioning %q, got %+v", id, frag, r)
		}
	}
	if got := sum.Status(); got != StatusInputError {
		t.Errorf("status %d, want %d (input errors outrank verdicts)", got, StatusInputError)
	}
	for _, f := range []string{"summary.csv", "summary.json", "index.html"} {
		if _, err := os.Stat(filepath.Join(out, f)); err != nil {
			t.Errorf("missing %s", f)
		}
	}
	var js struct{ Samples []Row }
	b, _ := os.ReadFile(filepath.Join(out, "summary.json"))
	if err := json.Unmarshal(b, &js); err != nil || len(js.Samples) != len(m.Samples) {
		t.Errorf("summary.json: %v, %d rows", err, len(js.Samples))
	}
	ents, _ := os.ReadDir(out)
	for _, e := range ents {
		if strings.Contains(e.Name(), ".tmp-") {
			t.Errorf("temporary file left behind: %s", e.Name())
		}
	}
}

func TestStatus(t *testing.T) {
	for _, tc := range []struct {
		name  string
		rows  []Row
		state int
	}{
		{"all consistent", []Row{{Verdict: "consistent"}, {Verdict: "consistent"}}, StatusOK},
		{"review", []Row{{Verdict: "consistent"}, {Verdict: "review"}}, StatusReview},
		{"inconsistent beats review", []Row{{Verdict: "review"}, {Verdict: "inconsistent"}}, StatusInconsistent},
		{"error beats all", []Row{{Verdict: "inconsistent"}, {Error: "x"}}, StatusInputError},
	} {
		if got := (&Summary{Rows: tc.rows}).Status(); got != tc.state {
			t.Errorf("%s: status %d, want %d", tc.name, got, tc.state)
		}
	}
}

func TestManifestErrors(t *testing.T) {
	for _, tc := range []struct{ text, want string }{
		{"solvent = \"CDCl3\"\n", "no [[sample]]"},
		{"[[sample]]\nid = \"a\"\nspectrm = \"x\"\n", "b.toml:3: unknown key"},
		{"[[sample]]\nid = \"a\n", "b.toml:2:"},
	} {
		_, err := Parse(tc.text, "b.toml")
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%q: want error containing %q, got %v", tc.text, tc.want, err)
		}
	}
}

// A panic inside one sample's check must become that sample's error row and
// leave the others alone.
func TestPanicIsContained(t *testing.T) {
	m := &Manifest{Path: "m.toml", Samples: []Sample{
		{ID: "a", Spectrum: "a.jdx", Smiles: "C"}, {ID: "b", Spectrum: "b.jdx", Smiles: "C"}}}
	check := func(in compare.Input, _ compare.Options) (*compare.Result, error) {
		if strings.HasSuffix(in.SpectrumPath, "a.jdx") {
			panic("boom")
		}
		return &compare.Result{Verdict: compare.Consistent, Score: 1}, nil
	}
	sum, err := Run(m, Options{Check: check})
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(sum.Rows[0].Error, "boom") || sum.Rows[1].Verdict != "consistent" {
		t.Fatalf("got %+v", sum.Rows)
	}
}

func spectrumWrite(f *os.File, s *spectrum.Spectrum) error { return spectrum.WriteJCAMP(f, s, true) }

func TestFoundSummary(t *testing.T) {
	res := &compare.Result{
		Found: []compare.Identity{
			{Name: "CHCl3 (residual solvent)", Kind: "solvent"},
			{Name: "TMS (reference)", Kind: "contaminant"},
			{Name: "ethyl acetate", Kind: "contaminant", MolPercent: 7.14},
			{Name: "water", Kind: "water"},
		},
		Unexplained: []compare.Unexplained{{Kind: "water", IntegralH: 2.456}},
	}
	if got, want := foundSummary(res), "ethyl acetate 7.1 mol%; water 2.46 H-eq"; got != want {
		t.Fatalf("got %q, want %q", got, want)
	}
}
