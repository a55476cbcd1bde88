package compare

import (
	"math"
	"strings"
	"testing"

	"shiftwise/internal/synth"
)

// TestQNMRAcrossFields: the qNMR equation (purity = (I_x/I_std)·(N_std/N_x)
// ·(M_x/M_std)·(m_std/m_sample)·P_std; the usual internal-standard form,
// common practice, no source) applied to synthetic spectra of methyl
// 4-nitrobenzoate with 1,3,5-trimethoxybenzene as internal standard
// (invented data: 0.40 mol of standard per mol of compound, 12.0 mg sample
// of which 10.0 mg compound, so the true purity is 83.33 %). At 400 and at
// 60 MHz the assay must come out within 1.5 percentage points, and at 60
// MHz the standard's singlets (6.10, 3.78 ppm) must still be told from
// the compound's OCH3 (3.94 ppm, 10 Hz away).
func TestQNMRAcrossFields(t *testing.T) {
	t.Parallel()
	const compound, std = "COC(=O)c1ccc(cc1)[N+](=O)[O-]", "COc1cc(OC)cc(OC)c1"
	const mx, mstd = 181.147, 168.192 // g/mol (standard atomic weights)
	const nx = 10.0 / mx              // mmol of compound in 10.0 mg
	stdMg := 0.40 * nx * mstd         // mg of standard for 0.40 mol per mol
	for _, field := range []float64{400, 60} {
		r := synth.Recipe{FieldMHz: field, Seed: 5, Satellites: true, Extra: []synth.Singlet{cdcl3Water},
			Components: []synth.Component{{Smiles: compound, Moles: 1, Jitter: 0.01}, {Smiles: std, Moles: 0.40}}}
		spec, err := synth.Make(r)
		if err != nil {
			t.Fatal(err)
		}
		res, err := Check(Input{Smiles: compound, Spectrum: spec,
			Standard: &Standard{Smiles: std, MassMg: stdMg, SampleMassMg: 12.0, PurityPct: 100}}, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if res.Purity.QNMRMassPercent == nil {
			t.Errorf("%g MHz: no qNMR result: %v", field, res.Reasons)
			continue
		}
		got := *res.Purity.QNMRMassPercent
		t.Logf("%g MHz: qNMR %.2f %% (true 83.33 %%), verdict %s", field, got, res.Verdict)
		if math.Abs(got-83.33) > 1.5 {
			t.Errorf("%g MHz: qNMR purity %.2f %%, want 83.33 ± 1.5", field, got)
		}
	}
}

// TestQNMROver100: a standard mass entered 2.5 times too high gives a mass
// purity far above 100 %, which cannot be (a mass fraction, by
// definition): the verdict is at least review and the reason says so.
func TestQNMROver100(t *testing.T) {
	t.Parallel()
	r, stdMg := nitrobenzoateAssay()
	spec, err := synth.Make(r)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		mg     float64
		review bool
	}{{stdMg, false}, {2.5 * stdMg, true}} {
		res, err := Check(Input{Smiles: assayCompound, Spectrum: spec,
			Standard: &Standard{Smiles: assayStandard, MassMg: c.mg, SampleMassMg: 12.0, PurityPct: 100}}, Options{})
		if err != nil {
			t.Fatal(err)
		}
		over := strings.Contains(strings.Join(res.Reasons, " "), "exceeds 100 %")
		if over != c.review || c.review && res.Verdict == Consistent {
			t.Errorf("standard %.2f mg: verdict %s, reasons %q", c.mg, res.Verdict, res.Reasons)
		}
	}
}

// TestLowPurityReview: a qNMR mass purity or a molar purity below 80 %
// asks for review with the reason, whatever the structure's fit (our own
// rule; a sample that is mostly something else is not released on a
// structure match). The same spectrum with the sample mass entered 2.5
// times too high (33.3 % by qNMR) and with 0.7 mol of 1,3,5-trimethoxy-
// benzene per mol of compound counted as an impurity (molar purity 58.8 %).
func TestLowPurityReview(t *testing.T) {
	t.Parallel()
	r, stdMg := nitrobenzoateAssay()
	compound, std := assayCompound, assayStandard
	res := synthCheck(t, r, Input{Smiles: compound, Standard: &Standard{Smiles: std, MassMg: stdMg, SampleMassMg: 30.0, PurityPct: 100}})
	if res.Verdict == Consistent || !strings.Contains(strings.Join(res.Reasons, " "), "qNMR mass purity is 33") {
		t.Errorf("qNMR 33 %%: verdict %s, reasons %q", res.Verdict, res.Reasons)
	}
	r.Components[1].Moles = 0.70
	res = synthCheck(t, r, Input{Smiles: compound, Impurities: []string{std}})
	if res.Verdict == Consistent || !strings.Contains(strings.Join(res.Reasons, " "), "molar purity by integrals is") {
		t.Errorf("molar 58.8 %%: verdict %s, purity %v, reasons %q", res.Verdict, res.Purity.MolarPercent, res.Reasons)
	}
}

// The assay scenario of the qNMR tests (invented data): methyl
// 4-nitrobenzoate with 0.40 mol of 1,3,5-trimethoxybenzene per mol, at
// 400 MHz; stdMg is the standard's mass for 10.0 mg of compound (molar
// masses from standard atomic weights).
const assayCompound, assayStandard = "COC(=O)c1ccc(cc1)[N+](=O)[O-]", "COc1cc(OC)cc(OC)c1"

func nitrobenzoateAssay() (synth.Recipe, float64) {
	const mx, mstd = 181.147, 168.192
	r := synth.Recipe{FieldMHz: 400, Seed: 5, Satellites: true, Extra: []synth.Singlet{cdcl3Water},
		Components: []synth.Component{{Smiles: assayCompound, Moles: 1, Jitter: 0.01}, {Smiles: assayStandard, Moles: 0.40}}}
	return r, 0.40 * (10.0 / mx) * mstd
}
