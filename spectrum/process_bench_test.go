package spectrum

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"

	"shiftwise/internal/extdata"
)

// benchReadProcess reads and processes the file at path b.N times.
func benchReadProcess(b *testing.B, path string) {
	b.Helper()
	st, err := os.Stat(path)
	if err != nil {
		b.Fatal(err)
	}
	b.SetBytes(st.Size())
	b.ReportAllocs()
	c0, n := processCPUTime(), 0
	for b.Loop() {
		s, err := ReadFile(path)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := Process(s, ProcessOptions{}); err != nil {
			b.Fatal(err)
		}
		n++
	}
	b.ReportMetric(float64((processCPUTime()-c0).Nanoseconds())/float64(n), "cpu-ns/op")
}

// BenchmarkReadProcess65kReal reads and processes a measured 65,536-point
// DIFDUP-compressed XYDATA spectrum (ethyl crotonate, 600 MHz; cheminfo
// nmr-dataset1).
func BenchmarkReadProcess65kReal(b *testing.B) {
	benchReadProcess(b, extdata.Path(b, "spectra/cheminfo_nmr_dataset1/623-70-1/1h.dx"))
}

// BenchmarkReadProcess65kNtuples is the same for a 65,536-point NTUPLES
// file (cytisine, 600 MHz, real and imaginary pages).
func BenchmarkReadProcess65kNtuples(b *testing.B) {
	benchReadProcess(b, extdata.Path(b, "spectra/cheminfo_nmr_dataset1/485-35-8/1h_ntuples.dx"))
}

// synthFile writes the synthetic test spectrum with n points as a compressed
// JCAMP-DX file and returns its path.
func synthFile(b *testing.B, n int) string {
	b.Helper()
	s := synthTrace(synthSignals(), 400.13, -1, 11, n, 0.8, 300, 1)
	var buf bytes.Buffer
	if err := WriteJCAMP(&buf, s, true); err != nil {
		b.Fatal(err)
	}
	path := filepath.Join(b.TempDir(), "synth.jdx")
	if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
		b.Fatal(err)
	}
	return path
}

// BenchmarkReadProcess65kSynthetic reads and processes a synthetic
// 65,536-point compressed JCAMP-DX spectrum.
func BenchmarkReadProcess65kSynthetic(b *testing.B) { benchReadProcess(b, synthFile(b, 65536)) }

// BenchmarkReadProcess262kSynthetic reads and processes a synthetic
// 262,144-point compressed JCAMP-DX spectrum (no measured file of that size
// is in the shared data).
func BenchmarkReadProcess262kSynthetic(b *testing.B) { benchReadProcess(b, synthFile(b, 262144)) }

// BenchmarkProcess262k is processing alone on a 262,144-point trace.
func BenchmarkProcess262k(b *testing.B) {
	s := synthTrace(synthSignals(), 400.13, -1, 11, 262144, 0.8, 300, 1)
	b.ReportAllocs()
	c0, n := processCPUTime(), 0
	for b.Loop() {
		if _, err := Process(s, ProcessOptions{}); err != nil {
			b.Fatal(err)
		}
		n++
	}
	b.ReportMetric(float64((processCPUTime()-c0).Nanoseconds())/float64(n), "cpu-ns/op")
}

// BenchmarkProcess65kReal is processing alone on the measured 65,536-point
// spectrum of BenchmarkReadProcess65kReal.
func BenchmarkProcess65kReal(b *testing.B) {
	s, err := ReadFile(extdata.Path(b, "spectra/cheminfo_nmr_dataset1/623-70-1/1h.dx"))
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	c0, n := processCPUTime(), 0
	for b.Loop() {
		if _, err := Process(s, ProcessOptions{}); err != nil {
			b.Fatal(err)
		}
		n++
	}
	b.ReportMetric(float64((processCPUTime()-c0).Nanoseconds())/float64(n), "cpu-ns/op")
}

// BenchmarkReadBytes65kReal is os.ReadFile of the same file, the floor any
// reader is measured against.
func BenchmarkReadBytes65kReal(b *testing.B) {
	path := extdata.Path(b, "spectra/cheminfo_nmr_dataset1/623-70-1/1h.dx")
	c0, n := processCPUTime(), 0
	for b.Loop() {
		if _, err := os.ReadFile(path); err != nil {
			b.Fatal(err)
		}
		n++
	}
	b.ReportMetric(float64((processCPUTime()-c0).Nanoseconds())/float64(n), "cpu-ns/op")
}

// BenchmarkWhittaker65k is one pentadiagonal smoother solve on 65,536 points.
func BenchmarkWhittaker65k(b *testing.B) {
	const n = 65536
	y, w, z := make([]float64, n), make([]float64, n), make([]float64, n)
	for i := range y {
		y[i], w[i] = float64(i%97), 1
	}
	b.ReportAllocs()
	for b.Loop() {
		whittaker(z, y, w, 1e6)
	}
}
