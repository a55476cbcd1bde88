package spin

import (
	"testing"
)

// benchSim runs Simulate on sys b.N times.
func benchSim(b *testing.B, sys System, opt Options) {
	b.Helper()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Simulate(sys, opt); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkCluster10 is a strongly coupled cluster of 10 distinct protons
// (largest Mz block 252 states). Target: under 20 ms (issue 4).
func BenchmarkCluster10(b *testing.B) {
	benchSim(b, chain(10, 0.01), Options{FieldMHz: 400, Mode: Exact})
}

// BenchmarkCluster12 is 12 distinct strongly coupled protons (block 924).
func BenchmarkCluster12(b *testing.B) {
	benchSim(b, chain(12, 0.01), Options{FieldMHz: 400, Mode: Exact, MaxSpins: 12})
}

// BenchmarkCluster14 is 14 distinct strongly coupled protons (block 3432).
// Target: under 1 s (issue 4).
func BenchmarkCluster14(b *testing.B) {
	benchSim(b, chain(14, 0.01), Options{FieldMHz: 400, Mode: Exact, MaxSpins: 14})
}
