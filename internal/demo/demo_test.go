package demo

import (
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"

	"shiftwise/compare"
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
	// Keep each sample's full result (keyed by spectrum file name) for the
	// checks below that need more than the summary row.
	var mu sync.Mutex
	full := map[string]*compare.Result{}
	check := func(in compare.Input, opt compare.Options) (*compare.Result, error) {
		res, err := compare.Check(in, opt)
		if err == nil {
			mu.Lock()
			full[strings.TrimSuffix(filepath.Base(in.SpectrumPath), filepath.Ext(in.SpectrumPath))] = res
			mu.Unlock()
		}
		return res, err
	}
	sum, err := screen.Run(m, screen.Options{OutDir: out, Check: check})
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
	// Wrong regioisomer: the tube holds the 3-methoxy ester, the 4-methoxy
	// one was asked for (scenario.toml); a pass would be wrong.
	if r := rows["LCC-2611-02"]; r.Verdict == "consistent" || r.Verdict == "" {
		t.Errorf("wrong regioisomer: %+v, want review or inconsistent", r)
	}
	if res := full["LCC-2611-02"]; res == nil {
		t.Errorf("wrong regioisomer: no result")
	} else {
		for _, f := range res.Found {
			// Benzene is a singlet (Gottlieb 1997 Table 1): the 3-isomer's
			// H5 triplet is not benzene.
			if strings.HasPrefix(f.Name, "benzene") {
				t.Errorf("wrong regioisomer: compound triplet named %s", f.Name)
			}
		}
	}
	// 0.06 mol benzaldehyde per mol ester: 100/106 = 94.3 mol %.
	if r := rows["LCC-2611-05"]; r.PurityPercent == nil || *r.PurityPercent < 92.3 || *r.PurityPercent > 96.3 {
		t.Errorf("residual benzaldehyde: purity %v, want 94.3 ± 2", r.PurityPercent)
	}
	// Wet sample: 2.5 H-equivalents of water at 1.56 ppm in CDCl3
	// (Gottlieb 1997 Table 1, value from memory) must be named.
	if res := full["LCC-2611-03"]; res == nil {
		t.Errorf("wet sample: no result")
	} else {
		named := false
		for _, f := range res.Found {
			named = named || f.Kind == "water"
		}
		for _, u := range res.Unexplained {
			named = named || u.Kind == "water"
		}
		if !named {
			t.Errorf("wet sample: water not named; found %+v", res.Found)
		}
	}
	// qNMR: the tube holds 0.3942 mol standard per mol analyte, which with
	// the weighed masses means 91.0 % (scenario.toml shows the arithmetic).
	if r := rows["LCC-2611-06"]; r.PurityMethod != "qNMR" || *r.PurityPercent < 89 || *r.PurityPercent > 93 {
		t.Errorf("qNMR assay: %+v, want about 91 %%", r)
	}
}
