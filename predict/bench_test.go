package predict

import (
	"fmt"
	"syscall"
	"testing"
	"time"

	"shiftwise/graph"
	"shiftwise/predict/spin"
	"shiftwise/smiles"
)

// Benchmark molecules: losartan (C22H23ClN6O, 30 heavy atoms) and lapatinib
// (C29H26ClFN4O4S, 40 heavy atoms), SMILES written from their structures.
const (
	losartan  = `CCCCc1nc(Cl)c(CO)n1Cc1ccc(cc1)-c1ccccc1-c1nn[nH]n1`
	lapatinib = `CS(=O)(=O)CCNCc1ccc(o1)-c1ccc2ncnc(Nc3ccc(OCc4cccc(F)c4)c(Cl)c3)c2c1`
)

func benchPredict(b *testing.B, smi string, heavy int, mode spin.Mode) {
	m, err := smiles.Parse(smi)
	if err != nil {
		b.Fatal(err)
	}
	if len(m.Atoms) != heavy {
		b.Fatalf("%d heavy atoms, want %d", len(m.Atoms), heavy)
	}
	b.ReportAllocs()
	c0 := cpuTime()
	for b.Loop() {
		m, err := smiles.Parse(smi)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := Predict(m, smi, Options{Mode: mode}); err != nil {
			b.Fatal(err)
		}
	}
	if c := cpuTime() - c0; c > 0 {
		b.ReportMetric(float64(c.Nanoseconds())/float64(b.N), "cpu-ns/op")
	}
}

// cpuTime returns the user+system CPU time of the process: on a loaded
// machine it is a steadier measure than the wall clock (run with
// GOMAXPROCS=1 so that it counts one thread's work plus the GC's).
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// BenchmarkPredict30 predicts a 30-heavy-atom molecule end to end (parse +
// predict). Target: under 1 ms in first-order mode.
func BenchmarkPredict30(b *testing.B) {
	b.Run("first-order", func(b *testing.B) { benchPredict(b, losartan, 30, spin.FirstOrder) })
	b.Run("auto", func(b *testing.B) { benchPredict(b, losartan, 30, spin.Auto) })
}

// BenchmarkPredict40 predicts a 40-heavy-atom drug-like molecule end to end
// in auto mode. Target: under 50 ms.
func BenchmarkPredict40(b *testing.B) {
	b.Run("auto", func(b *testing.B) { benchPredict(b, lapatinib, 40, spin.Auto) })
	b.Run("first-order", func(b *testing.B) { benchPredict(b, lapatinib, 40, spin.FirstOrder) })
}

// benchAtFields runs body as a sub-benchmark per field ("60MHz") with smi
// parsed once.
func benchAtFields(b *testing.B, smi string, fields []float64, body func(b *testing.B, m *graph.Mol, field float64)) {
	m, err := smiles.Parse(smi)
	if err != nil {
		b.Fatal(err)
	}
	for _, field := range fields {
		b.Run(fmt.Sprintf("%gMHz", field), func(b *testing.B) {
			b.ReportAllocs()
			body(b, m, field)
		})
	}
}

// BenchmarkPredictAlkyl predicts methyl stearate (21 heavy atoms) in auto
// mode at 400 and 60 MHz: its CH2 groups form one strongly coupled
// cluster, simulated by fragments.
func BenchmarkPredictAlkyl(b *testing.B) {
	const smi = "CCCCCCCCCCCCCCCCCC(=O)OC"
	benchAtFields(b, smi, []float64{400, 60}, func(b *testing.B, m *graph.Mol, field float64) {
		for b.Loop() {
			if _, err := Predict(m, smi, Options{FieldMHz: field}); err != nil {
				b.Fatal(err)
			}
		}
	})
}

// BenchmarkRender draws 1-hexanol's predicted spectrum (about 77,000 exact
// lines at 60 MHz, a few hundred at 400 MHz) on 65,536 points from -1 to
// 11 ppm, the synthetic-spectrum and plot setting. The binned renderer
// serves 60 MHz; 400 MHz (grid step γ/6) is drawn line by line.
func BenchmarkRender(b *testing.B) {
	const smi = "CCCCCCO"
	benchAtFields(b, smi, []float64{60, 400}, func(b *testing.B, m *graph.Mol, field float64) {
		p, err := Predict(m, smi, Options{FieldMHz: field})
		if err != nil {
			b.Fatal(err)
		}
		b.ReportMetric(float64(len(p.Lines)), "lines")
		for b.Loop() {
			Render(p, -1, 11, 1<<16, 0.9)
		}
	})
}
