package shiftinc

import (
	"testing"

	"shiftwise/graph"
	"shiftwise/smiles"
)

// benchSmiles has 30 heavy atoms (checked in the benchmark).
const benchSmiles = "CCOC(=O)/C=C/c1ccc(OC)cc1C(=O)N2CCC(CC2)c3ccncc3Cl"

// BenchmarkProton30 estimates every proton of a 30-heavy-atom molecule,
// one Proton call each (as predict does). Besides ns/op (wall clock) it
// reports cpu-ns/op, steadier on a loaded machine.
func BenchmarkProton30(b *testing.B) {
	m, err := smiles.Parse(benchSmiles)
	if err != nil {
		b.Fatal(err)
	}
	if len(m.Atoms) != 30 {
		b.Fatalf("%d heavy atoms, want 30", len(m.Atoms))
	}
	var ps []graph.Proton
	for a := range m.Atoms {
		for i := 0; i < m.Atoms[a].HCount(); i++ {
			ps = append(ps, graph.Proton{Atom: a, Index: i})
		}
	}
	tab := Default()
	b.ReportAllocs()
	c0 := cpuTime()
	for b.Loop() {
		for _, p := range ps {
			tab.Proton(m, p, "CDCl3")
		}
	}
	if c := cpuTime() - c0; c > 0 {
		b.ReportMetric(float64(c.Nanoseconds())/float64(b.N), "cpu-ns/op")
	}
}

// BenchmarkProtons30 is BenchmarkProton30 through Protons, which shares the
// ring and neighbour look-ups across the protons.
func BenchmarkProtons30(b *testing.B) {
	m, err := smiles.Parse(benchSmiles)
	if err != nil {
		b.Fatal(err)
	}
	tab := Default()
	b.ReportAllocs()
	c0 := cpuTime()
	for b.Loop() {
		tab.Protons(m, "CDCl3")
	}
	if c := cpuTime() - c0; c > 0 {
		b.ReportMetric(float64(c.Nanoseconds())/float64(b.N), "cpu-ns/op")
	}
}
