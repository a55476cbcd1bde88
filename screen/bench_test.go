package screen

import (
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"sync/atomic"
	"testing"
	"time"

	"shiftwise/internal/synth"
)

// BenchmarkScreen checks batches of 100 and 1,000 synthetic samples (ten
// distinct 65,536-point spectra, reused) with reports written, and reports
// samples per second and the peak heap seen while running. A flat peak heap
// from 100 to 1,000 samples shows memory does not grow with the batch.
func BenchmarkScreen(b *testing.B) {
	dir := b.TempDir()
	mols := []string{"CCOC(C)=O", "COc1ccc(C=O)cc1", "CCCOC(=O)c1ccccc1", "CC(=O)NCc1ccccc1", "CC(=O)c1ccc(Br)cc1",
		"CCOC(=O)/C=C/c1ccccc1", "COC(=O)c1ccc([N+](=O)[O-])cc1", "CC(=O)OCCc1ccccc1", "CCOC(=O)c1ccc(OC)cc1", "CC(C)Cc1ccc(cc1)C(C)C(=O)O"}
	for i, smi := range mols {
		s, err := synth.Make(synth.Recipe{Components: []synth.Component{{Smiles: smi, Moles: 1, Jitter: 0.01}}, Seed: uint64(i), Satellites: true})
		if err != nil {
			b.Fatal(err)
		}
		f, _ := os.Create(filepath.Join(dir, fmt.Sprintf("s%d.jdx", i)))
		if err := spectrumWrite(f, s); err != nil {
			b.Fatal(err)
		}
		f.Close()
	}
	for _, n := range []int{100, 1000} {
		b.Run(fmt.Sprintf("samples=%d", n), func(b *testing.B) {
			m := &Manifest{Dir: dir, Path: filepath.Join(dir, "bench.toml"), Solvent: "CDCl3"}
			for i := 0; i < n; i++ {
				m.Samples = append(m.Samples, Sample{ID: fmt.Sprintf("S%04d", i), Spectrum: fmt.Sprintf("s%d.jdx", i%len(mols)), Smiles: mols[i%len(mols)]})
			}
			var peak atomic.Uint64
			stop := make(chan struct{})
			go sampleHeap(&peak, stop)
			start := time.Now()
			for b.Loop() {
				if _, err := Run(m, Options{OutDir: b.TempDir()}); err != nil {
					b.Fatal(err)
				}
			}
			close(stop)
			b.ReportMetric(float64(n*b.N)/time.Since(start).Seconds(), "samples/s")
			b.ReportMetric(float64(peak.Load())/(1<<20), "peak-heap-MiB")
		})
	}
}

func sampleHeap(peak *atomic.Uint64, stop chan struct{}) {
	var ms runtime.MemStats
	for {
		select {
		case <-stop:
			return
		case <-time.After(20 * time.Millisecond):
		}
		runtime.ReadMemStats(&ms)
		if ms.HeapInuse > peak.Load() {
			peak.Store(ms.HeapInuse)
		}
	}
}
