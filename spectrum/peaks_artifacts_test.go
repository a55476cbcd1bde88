package spectrum

import (
	"math"
	"testing"
)

// TestSatellitesAndSidebands adds 13C satellites (0.55 % each at ±½·¹J,
// ¹J(CH) = 126 Hz for a methyl, slightly upfield-shifted by the isotope
// effect; common practice, no source; the values from memory) and a pair of
// spinning sidebands (0.5 % each at ±20 Hz) to a strong singlet, and
// requires them flagged and kept out of the multiplets.
func TestSatellitesAndSidebands(t *testing.T) {
	t.Parallel()
	const field = 400.13
	sig := []synthSignal{
		{ppm: 0, nH: 0.3, mult: "s"},
		{ppm: 2.10, nH: 300, mult: "s"},
		{ppm: 2.10 - 0.0025 - 63.0/field, nH: 300 * 0.0055, mult: "s"},
		{ppm: 2.10 - 0.0025 + 63.0/field, nH: 300 * 0.0055, mult: "s"},
		{ppm: 2.10 - 20.0/field, nH: 300 * 0.005, mult: "s"},
		{ppm: 2.10 + 20.0/field, nH: 300 * 0.005, mult: "s"},
		{ppm: 7.26, nH: 0.4, mult: "s"},
	}
	s := synthTrace(sig, field, -1, 11, 65536, 0.8, 300, 11)
	pl, err := Process(s, ProcessOptions{})
	if err != nil {
		t.Fatal(err)
	}
	want := map[float64]string{
		sig[2].ppm: Artifact13C, sig[3].ppm: Artifact13C,
		sig[4].ppm: ArtifactSideband, sig[5].ppm: ArtifactSideband,
	}
	for x, kind := range want {
		found := false
		for _, p := range pl.Peaks {
			if math.Abs(p.PPM-x) < 0.001 {
				found = true
				if p.Artifact != kind {
					t.Errorf("peak at %.4f: artifact %q, want %q", p.PPM, p.Artifact, kind)
				}
			}
		}
		if !found {
			t.Errorf("no peak at %.4f", x)
		}
	}
	for _, m := range pl.Multiplets {
		if m.PPM > 1.9 && m.PPM < 2.3 && math.Abs(m.PPM-2.10) > 0.001 {
			t.Errorf("artifact became a multiplet at %.4f", m.PPM)
		}
	}
}

// TestPeakTableOnly processes a peak list without a trace: a triplet and a
// quartet (J 7.1 Hz at 400 MHz, binomial intensities) group into
// multiplets whose integrals are the summed intensities (3:2).
func TestPeakTableOnly(t *testing.T) {
	t.Parallel()
	const field = 400.0
	var pk []Peak
	for k, w := range []float64{1, 2, 1} {
		pk = append(pk, Peak{PPM: 1.20 + (float64(k)-1)*7.1/field, Intensity: 3 * w / 4})
	}
	for k, w := range []float64{1, 3, 3, 1} {
		pk = append(pk, Peak{PPM: 4.10 + (float64(k)-1.5)*7.1/field, Intensity: 2 * w / 8})
	}
	pl, err := Process(&Spectrum{PeakTable: pk, FieldMHz: field, Solvent: "CDCl3"}, ProcessOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(pl.Multiplets) != 2 {
		t.Fatalf("%d multiplets, want 2: %+v", len(pl.Multiplets), pl.Multiplets)
	}
	for i, w := range []struct {
		mult string
		nH   float64
	}{{"t", 3}, {"q", 2}} {
		m := pl.Multiplets[i]
		if m.Multiplicity != w.mult || len(m.JHz) != 1 || math.Abs(m.JHz[0]-7.1) > 0.01 || math.Abs(m.Integral-w.nH) > 0.01 {
			t.Errorf("multiplet %d: %s %v %.3f, want %s 7.1 %g", i, m.Multiplicity, m.JHz, m.Integral, w.mult, w.nH)
		}
	}
	if pl.Trace != nil {
		t.Error("peak list produced a trace")
	}
}

// TestProcessBadInput: malformed spectra give errors, not panics.
func TestProcessBadInput(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name string
		s    *Spectrum
		opt  ProcessOptions
	}{
		{"nil", nil, ProcessOptions{}},
		{"empty", &Spectrum{}, ProcessOptions{}},
		{"length mismatch", &Spectrum{PPM: make([]float64, 20), Y: make([]float64, 19)}, ProcessOptions{}},
		{"too short", &Spectrum{PPM: []float64{1, 2}, Y: []float64{1, 2}}, ProcessOptions{}},
		{"not ascending", &Spectrum{PPM: make([]float64, 20), Y: make([]float64, 20)}, ProcessOptions{}},
		{"NaN", &Spectrum{PPM: ramp(20), Y: append(make([]float64, 19), math.NaN())}, ProcessOptions{}},
		{"flat", &Spectrum{PPM: ramp(20), Y: make([]float64, 20)}, ProcessOptions{}},
		{"bad reference", &Spectrum{PPM: ramp(20), Y: ramp(20)}, ProcessOptions{Reference: "lock"}},
		{"bad solvent", &Spectrum{PPM: ramp(20), Y: ramp(20)}, ProcessOptions{Solvent: "xyz"}},
		{"negative snr", &Spectrum{PPM: ramp(20), Y: ramp(20)}, ProcessOptions{MinSNR: -1}},
		{"bad peak", &Spectrum{PeakTable: []Peak{{PPM: math.Inf(1)}}}, ProcessOptions{}},
	}
	for _, tc := range tests {
		if _, err := Process(tc.s, tc.opt); err == nil {
			t.Errorf("%s: no error", tc.name)
		}
	}
}

func ramp(n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = float64(i) / 10
	}
	return v
}

// FuzzProcess feeds arbitrary traces to Process: it must not panic.
func FuzzProcess(f *testing.F) {
	f.Add([]byte{1, 2, 3, 200, 3, 2, 1, 0, 0, 0, 0, 0, 0, 0, 9, 0, 0, 0, 0, 0}, 400.0)
	f.Add(make([]byte, 64), 0.0)
	f.Fuzz(func(t *testing.T, data []byte, field float64) {
		s := &Spectrum{FieldMHz: field}
		for i, b := range data {
			s.PPM = append(s.PPM, float64(i)*0.01)
			s.Y = append(s.Y, float64(b)*float64(b%7+1))
		}
		if len(data)%3 == 0 && len(data) > 0 {
			s.PeakTable = []Peak{{PPM: float64(data[0]) / 10, Intensity: float64(len(data))}}
			s.PPM, s.Y = nil, nil
		}
		_, _ = Process(s, ProcessOptions{})
	})
}
