package compare

import (
	"strings"
	"testing"

	"shiftwise/internal/synth"
)

// At benchtop fields the phenyl multiplet of a monosubstituted benzene is a
// broad second-order pattern (common practice, no source); processing may
// cut its wing into a small region of its own, and the weak 13C satellite
// (0.55 %, ½·¹J(CH) ≈ 72 Hz away; common practice, no source) may appear
// without its mirror partner. Neither is an impurity: the spectrum holds the
// compound only (by construction), so nothing may be named but water.
func TestBenchtopPhenylWingsAndLoneSatellite(t *testing.T) {
	s, err := synth.Make(synth.Recipe{FieldMHz: 80, Seed: 17, Satellites: true, TMS: 0.05,
		Components: []synth.Component{{Smiles: "CC(=O)OCCc1ccccc1", Moles: 1, Jitter: 0.015}},
		Extra:      []synth.Singlet{{PPM: 1.56, H: 0.05, WidthHz: 2.5}}})
	if err != nil {
		t.Fatal(err)
	}
	r, err := Check(Input{Smiles: "CC(=O)OCCc1ccccc1", Spectrum: s}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if r.Verdict != Consistent {
		t.Errorf("verdict %s, want consistent: %v", r.Verdict, r.Reasons)
	}
	for _, u := range r.Unexplained {
		if u.Kind != "water" {
			t.Errorf("unexplained %.3f ppm (%.2f H) %q: the tube holds only the compound and water", u.PPM, u.IntegralH, u.Likely)
		}
	}
	for _, f := range r.Found {
		if strings.Contains(f.Name, "benzene") {
			t.Errorf("benzene named at %v", f.PPM)
		}
	}
}
