package spectrum

import (
	"math"
	"testing"
)

// TestReferenceModes shifts a synthetic spectrum (synthSignals: TMS at 0,
// CHCl3 at 7.26) by a known offset and checks each mode moves it back, or
// not, as documented in reference.go. Ground truth: the offset applied.
func TestReferenceModes(t *testing.T) {
	t.Parallel()
	const field, off = 400.13, 0.08
	base := synthTrace(synthSignals(), field, -1, 11, 32768, 0.8, 300, 9)
	moved := *base
	moved.PPM = make([]float64, len(base.PPM))
	for i, x := range base.PPM {
		moved.PPM[i] = x + off
	}
	tests := []struct {
		mode      string
		used      string
		shift     float64
		tolerance float64
	}{
		{RefAuto, RefSolvent, -off, 0.001}, // TMS now at 0.08: outside the auto TMS window; residual 0.08 off
		{RefTMS, RefTMS, -off, 0.001},
		{RefSolvent, RefSolvent, -off, 0.001},
		{RefNone, RefNone, 0, 0},
	}
	for _, tc := range tests {
		pl, err := Process(&moved, ProcessOptions{Reference: tc.mode})
		if err != nil {
			t.Fatal(err)
		}
		if pl.Reference != tc.used || math.Abs(pl.ReferencePPM-tc.shift) > tc.tolerance+1e-12 {
			t.Errorf("%s: used %q shift %+.4f, want %q %+.4f", tc.mode, pl.Reference, pl.ReferencePPM, tc.used, tc.shift)
		}
	}
	// In place: auto keeps TMS at 0 and labels TMS and solvent.
	pl, err := Process(base, ProcessOptions{})
	if err != nil {
		t.Fatal(err)
	}
	labels := map[string]float64{}
	for _, m := range pl.Multiplets {
		if m.Label != "" {
			labels[m.Label] = m.PPM
		}
	}
	if math.Abs(labels[LabelTMS]) > 0.001 || math.Abs(labels[LabelSolvent]-7.26) > 0.001 || len(labels) != 2 {
		t.Errorf("labels %v, want TMS at 0 and solvent at 7.26", labels)
	}
}

// TestReferenceNotFound: without the residual line the axis stays and a
// warning says so.
func TestReferenceNotFound(t *testing.T) {
	t.Parallel()
	var sig []synthSignal
	for _, s := range synthSignals() {
		if s.ppm != 0 && s.ppm != 7.26 {
			sig = append(sig, s)
		}
	}
	s := synthTrace(sig, 400.13, -1, 11, 32768, 0.8, 300, 5)
	pl, err := Process(s, ProcessOptions{Solvent: "DMSO-d6"})
	if err != nil {
		t.Fatal(err)
	}
	if pl.ReferencePPM != 0 || pl.Reference != RefNone || len(pl.Warnings) == 0 {
		t.Errorf("reference %q %+.4f warnings %v; want none, 0 and a warning", pl.Reference, pl.ReferencePPM, pl.Warnings)
	}
}
