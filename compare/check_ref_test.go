package compare

import (
	"strings"
	"testing"
)

// Measured levels of the synthetic reference set (see refset_test.go for
// the sources of the data), less one compound of slack each so that a
// single-case drift of the shared predictor does not fail the build. Measured
// on 2026-12-02: true consistent 46/46, wrong rejected or ranked lower 45/46,
// contaminants (≥ 1 mol %) identified 16/16, given impurity 1/1.
const (
	minTrueConsistent = 45.0 / 46
	minWrongRejected  = 44.0 / 46
	minContaminant    = 15.0 / 16
)

func TestReferenceSet(t *testing.T) {
	const field = 400.0
	const points = 32768
	nTrue, nWrong, nCont, nImp := 0, 0, 0, 0
	okTrue, okWrong, okCont, okImp := 0, 0, 0, 0
	for k, c := range refSet {
		spec, err := refSpectrum(c, field, points, uint64(k+1))
		if err != nil {
			t.Fatal(err)
		}
		in := Input{Smiles: c.smiles, Spectrum: spec, Candidates: []string{c.wrong}}
		if c.impurity != "" {
			in.Impurities = []string{c.impurity}
		}
		res, err := Check(in, Options{})
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		nTrue++
		if res.Verdict == Consistent {
			okTrue++
		} else {
			t.Logf("%s: true structure %s (%.2f): %s", c.name, res.Verdict, res.Score, strings.Join(res.Reasons, " | "))
		}
		nWrong++
		var wrong *Candidate
		for i := range res.Candidates {
			if !res.Candidates[i].Main {
				wrong = &res.Candidates[i]
			}
		}
		if wrong != nil && (wrong.Verdict == Inconsistent || wrong.Score < res.Score) {
			okWrong++
		} else if wrong != nil {
			t.Logf("%s: wrong structure %s not rejected: %s %.2f vs true %.2f", c.name, c.wrong, wrong.Verdict, wrong.Score, res.Score)
		}
		if c.contaminant != "" && c.contPct >= 1 {
			nCont++
			found := false
			for _, f := range res.Found {
				if strings.HasPrefix(f.Name, c.contaminant) {
					found = true
				}
			}
			if found {
				okCont++
			} else {
				t.Logf("%s: contaminant %s (%.1f mol%%) not identified; found %v", c.name, c.contaminant, c.contPct, names(res.Found))
			}
		}
		if c.impurity != "" {
			nImp++
			for _, f := range res.Found {
				if f.Kind == "impurity" {
					okImp++
					break
				}
			}
		}
	}
	rt, rw, rc := frac(okTrue, nTrue), frac(okWrong, nWrong), frac(okCont, nCont)
	t.Logf("reference set: %d compounds; true consistent %d/%d (%.0f %%), wrong rejected or ranked lower %d/%d (%.0f %%), contaminants identified %d/%d (%.0f %%), impurities %d/%d",
		len(refSet), okTrue, nTrue, 100*rt, okWrong, nWrong, 100*rw, okCont, nCont, 100*rc, okImp, nImp)
	if rt < minTrueConsistent || rw < minWrongRejected || rc < minContaminant {
		t.Errorf("below measured levels: true %.2f (min %.2f), wrong %.2f (min %.2f), contaminants %.2f (min %.2f)",
			rt, minTrueConsistent, rw, minWrongRejected, rc, minContaminant)
	}
}

func frac(a, b int) float64 {
	if b == 0 {
		return 0
	}
	return float64(a) / float64(b)
}

func names(ids []Identity) []string {
	var out []string
	for _, f := range ids {
		out = append(out, f.Name)
	}
	return out
}
