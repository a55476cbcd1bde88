package demo

import (
	"os"
	"path/filepath"
	"testing"

	"shiftwise/screen"
)

// TestDemoBatch runs the whole demo. The spectra are synthesised with known
// contents, so what each sample should show is known by construction: the
// intended structure, the species added to the tube and their amounts.
func TestDemoBatch(t *testing.T) {
	dir := t.TempDir()
	manifest, stories, err := Write(dir)
	if err != nil {
		t.Fatal(err)
	}
	m, err := screen.Load(manifest)
	if err != nil {
		t.Fatal(err)
	}
	if len(stories) != len(m.Samples) || len(m.Samples) < 6 {
		t.Fatalf("%d stories, %d samples", len(stories), len(m.Samples))
	}
	out := filepath.Join(dir, "reports")
	sum, err := screen.Run(m, screen.Options{OutDir: out})
	if err != nil {
		t.Fatal(err)
	}
	rows := map[string]screen.Row{}
	for _, r := range sum.Rows {
		if r.Error != "" {
			t.Errorf("%s: %s", r.ID, r.Error)
		}
		rows[r.ID] = r
	}
	if _, err := os.Stat(filepath.Join(out, "index.html")); err != nil {
		t.Fatal(err)
	}
	// Clean pass: the intended compound only (plus water and solvent).
	if r := rows["LCC-2611-01"]; r.Verdict != "consistent" {
		t.Errorf("clean sample: %+v", r)
	}
	// 8 mol of ethyl acetate per 100 of product: 100/108 = 92.6 mol %.
	if r := rows["LCC-2611-04"]; r.PurityPercent == nil || *r.PurityPercent < 90.6 || *r.PurityPercent > 94.6 {
		t.Errorf("residual ethyl acetate: purity %v, want 92.6 ± 2", r.PurityPercent)
	}
	// qNMR: the tube holds 0.3942 mol standard per mol analyte, which with
	// the weighed masses means 91.0 % (scenario.toml shows the arithmetic).
	if r := rows["LCC-2611-06"]; r.PurityMethod != "qNMR" || *r.PurityPercent < 89 || *r.PurityPercent > 93 {
		t.Errorf("qNMR assay: %+v, want about 91 %%", r)
	}
}
