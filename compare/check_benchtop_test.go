package compare

import (
	"fmt"
	"strings"
	"testing"

	"shiftwise/predict/spin"
)

// benchtopRates checks the synthetic reference set (handbook shifts and
// couplings simulated exactly, refset_test.go) at a benchtop field with
// the prediction in the given mode: true structures consistent, wrong
// isomers (as candidates) rejected or ranked lower, and wrong isomers
// given as the intended structure flagged (not consistent).
func benchtopRates(t *testing.T, field float64, mode spin.Mode) (okTrue, okWrong, okFlag int, found benchtopFinds) {
	t.Helper()
	for k, c := range refSet {
		spec, err := refSpectrum(c, field, 32768, uint64(k+1))
		if err != nil {
			t.Fatal(err)
		}
		in := Input{Smiles: c.smiles, Spectrum: spec, Candidates: []string{c.wrong}}
		if c.impurity != "" {
			in.Impurities = []string{c.impurity}
		}
		opt := Options{Mode: mode}
		res, err := Check(in, opt)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		found.count(c, res)
		if res.Verdict == Consistent {
			okTrue++
		} else if mode == spin.Auto {
			t.Logf("%g MHz %s: true structure %s (%.2f): %s", field, c.name, res.Verdict, res.Score, strings.Join(res.Reasons, " | "))
		}
		for _, cd := range res.Candidates {
			if !cd.Main && (cd.Verdict == Inconsistent || cd.Score < res.Score) {
				okWrong++
			}
		}
		wr, err := Check(Input{Smiles: c.wrong, Spectrum: spec, Candidates: []string{c.smiles}}, opt)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if wr.Verdict != Consistent {
			okFlag++
		}
	}
	return okTrue, okWrong, okFlag, found
}

// benchtopFinds counts the table contaminants (≥ 1 mol %) and given
// impurities of the reference set that a check names.
type benchtopFinds struct{ cont, contOK, imp, impOK, wrongCont int }

func (f *benchtopFinds) count(c refCompound, res *Result) {
	for _, id := range res.Found {
		if id.Kind == "contaminant" && (c.contaminant == "" || !strings.HasPrefix(id.Name, c.contaminant)) {
			f.wrongCont++ // a table species that was not added
		}
	}
	if c.contaminant != "" && c.contPct >= 1 {
		f.cont++
		for _, id := range res.Found {
			if strings.HasPrefix(id.Name, c.contaminant) {
				f.contOK++
				break
			}
		}
	}
	if c.impurity != "" {
		f.imp++
		for _, id := range res.Found {
			if id.Kind == "impurity" {
				f.impOK++
				break
			}
		}
	}
}

// TestReferenceSetBenchtop: the reference set at 60 and 90 MHz, where most
// aliphatic and many aromatic patterns are second-order (common practice,
// no source). The spectra are the handbook spin systems (values from
// memory, see refset_test.go) simulated exactly; the check predicts in auto
// mode (exact or fragment simulation of strongly coupled clusters) and, for
// contrast, first-order. Measured 2026-12-02 (true consistent / wrong
// candidate rejected or ranked lower / wrong as intended flagged, of 46):
// 60 MHz auto 46/41/36, first-order 46/40/36; 90 MHz auto 46/43/36,
// first-order 46/42/38. At 300–600 MHz the third figure is 43
// (TestReferenceSetWrongIntended): at benchtop fields ten positional
// isomers (methylanisoles, chlorobenzaldehydes, dimethoxybenzenes, E/Z
// esters …) pass as the intended structure, which the check's benchtop
// caution states. Contaminants (≥ 1 mol %, of 16) and given impurities (of
// 4) named: 60 MHz 8/16 and 1/4, 90 MHz 13/16 and 1/4 (16/16 and 4/4 at
// 300–600 MHz); before the benchtop fixes of this date 1/16 and 0/4, 8/16
// and 1/4 (sharp-line widths in ppm, satellites taken for contaminant
// singlets, ties between neighbouring table lines, a broad water line
// dropped by peak picking). The rest are hidden under compound multiplets
// or merged with them at 60 MHz. Table species named that were not added
// (mostly a lone line of a compound multiplet or a 13C satellite, 1.2 ppm
// from its parent at 60 MHz, at a tabulated singlet): 8 at 60 MHz and 9
// at 90 MHz over the 46 spectra (2 at 400 MHz); before: 5 and 11. The
// levels keep one compound of slack; first-order prediction must not
// confirm more true structures or reject more wrong candidates than auto.
func TestReferenceSetBenchtop(t *testing.T) {
	slowParallel(t, "four passes over the reference set")
	type rates struct{ true, wrong, flag, cont, imp, maxWrongCont int }
	min := map[float64]rates{60: {45, 40, 35, 7, 1, 10}, 90: {45, 42, 35, 12, 1, 11}}
	for _, field := range []float64{60, 90} {
		a, b, c, f := benchtopRates(t, field, spin.Auto)
		fa, fb, fc, _ := benchtopRates(t, field, spin.FirstOrder)
		n := len(refSet)
		t.Logf("%g MHz, auto: true consistent %d/%d, wrong rejected or ranked lower %d/%d, wrong as intended flagged %d/%d, contaminants named %d/%d, impurities %d/%d, species named but not added %d; first-order: %d, %d, %d",
			field, a, n, b, n, c, n, f.contOK, f.cont, f.impOK, f.imp, f.wrongCont, fa, fb, fc)
		m := min[field]
		if f.wrongCont > m.maxWrongCont {
			t.Errorf("%g MHz: %d table species named that were not added, at most %d expected", field, f.wrongCont, m.maxWrongCont)
		}
		if a < m.true || b < m.wrong || c < m.flag || f.contOK < m.cont || f.impOK < m.imp {
			t.Errorf("%g MHz below measured levels: %d/%d/%d/%d/%d, want at least %d/%d/%d/%d/%d",
				field, a, b, c, f.contOK, f.impOK, m.true, m.wrong, m.flag, m.cont, m.imp)
		}
		if fa > a || fb > b {
			t.Errorf("%g MHz: first-order prediction does better than auto: %s", field, fmt.Sprint(fa, fb, " vs ", a, b))
		}
	}
}

// TestGivenImpurityAbsent: a structure given as a possible impurity
// (--impurity) that is not in the tube must not be named (common practice,
// no source: a false identification misstates the composition). Each compound of
// the reference set (its spectrum without contaminant or impurity) is
// checked with every impurity structure of the set and a few common
// ones (acetophenone, benzaldehyde, ethyl acetate, phenol, acetone,
// naphthalene) at 60, 90 and 400 MHz: 454 checks per field. Measured
// 2026-12-02: named wrongly in 11, 13 and 3; before the fixes of that day
// 53, 58 and 55 (the water line at 1.56 ppm was taken for acetone's CH3,
// 0.6 ppm away, at 4.6 mol %; signals 3 SD from their prediction counted).
// Levels: the measured counts plus two.
func TestGivenImpurityAbsent(t *testing.T) {
	slowParallel(t, "1,362 checks")
	imps := []string{"CC(=O)c1ccccc1", "O=Cc1ccccc1", "CCOC(C)=O", "Oc1ccccc1", "CC(C)=O", "c1ccc2ccccc2c1"}
	for _, c := range refSet {
		if c.impurity != "" {
			imps = append(imps, c.impurity)
		}
	}
	max := map[float64]int{60: 16, 90: 16, 400: 5}
	for _, field := range []float64{60, 90, 400} {
		n, bad := 0, 0
		for k, c := range refSet {
			clean := c
			clean.impurity, clean.contaminant = "", ""
			spec, err := refSpectrum(clean, field, 32768, uint64(k+1))
			if err != nil {
				t.Fatal(err)
			}
			for _, imp := range imps {
				if imp == c.smiles {
					continue
				}
				res, err := Check(Input{Smiles: c.smiles, Spectrum: spec, Impurities: []string{imp}}, Options{})
				if err != nil {
					t.Fatalf("%s with %s: %v", c.name, imp, err)
				}
				n++
				for _, id := range res.Found {
					if id.Kind == "impurity" {
						bad++
						t.Logf("%g MHz %s: absent impurity %s named (%.2f mol %%) at %v", field, c.name, imp, id.MolPercent, id.PPM)
					}
				}
			}
		}
		t.Logf("%g MHz: absent impurities named in %d of %d checks", field, bad, n)
		if bad > max[field] {
			t.Errorf("%g MHz: %d absent impurities named, at most %d expected", field, bad, max[field])
		}
	}
}
