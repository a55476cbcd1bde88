package shiftinc

import (
	"testing"

	"shiftwise/graph"
	"shiftwise/smiles"
)

// benchSmiles has 30 heavy atoms (checked in the benchmark).
const benchSmiles = "CCOC(=O)/C=C/c1ccc(OC)cc1C(=O)N2CCC(CC2)c3ccncc3Cl"

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
	b.ResetTimer()
	for b.Loop() {
		for _, p := range ps {
			tab.Proton(m, p, "CDCl3")
		}
	}
}

func BenchmarkProtons30(b *testing.B) {
	m, err := smiles.Parse(benchSmiles)
	if err != nil {
		b.Fatal(err)
	}
	tab := Default()
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		tab.Protons(m, "CDCl3")
	}
}
