package smiles

import "testing"

// Drug-like molecules for the benchmark (structures as commonly written;
// atorvastatin C33H35FN2O5, 41 heavy atoms; imatinib C29H31N7O, 37 heavy
// atoms — formulas common facts of the trade).
const (
	atorvastatin = "CC(C)c1c(C(=O)Nc2ccccc2)c(-c2ccccc2)c(-c2ccc(F)cc2)n1CC[C@@H](O)C[C@@H](O)CC(=O)O"
	imatinib     = "Cc1ccc(NC(=O)c2ccc(CN3CCN(C)CC3)cc2)cc1Nc1nccc(-c2cccnc2)n1"
)

func TestBenchMolecules(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct{ smiles, formula string }{
		{atorvastatin, "C33H35FN2O5"},
		{imatinib, "C29H31N7O"},
	} {
		m, err := Parse(tc.smiles)
		if err != nil {
			t.Fatal(err)
		}
		if m.Formula() != tc.formula {
			t.Errorf("%s: formula %s, want %s", tc.smiles, m.Formula(), tc.formula)
		}
	}
}

// BenchmarkParsePerceive parses and perceives (implicit H, kekulization,
// rings, aromaticity) one drug-like molecule per iteration. Besides ns/op
// (wall clock) it reports cpu-ns/op, the process CPU time per molecule,
// which is steadier on a loaded machine.
func BenchmarkParsePerceive(b *testing.B) {
	for _, bc := range []struct{ name, smiles string }{
		{"atorvastatin", atorvastatin},
		{"imatinib", imatinib},
	} {
		b.Run(bc.name, func(b *testing.B) {
			b.ReportAllocs()
			c0 := cpuTime()
			for b.Loop() {
				if _, err := Parse(bc.smiles); err != nil {
					b.Fatal(err)
				}
			}
			if c := cpuTime() - c0; c > 0 {
				b.ReportMetric(float64(c.Nanoseconds())/float64(b.N), "cpu-ns/op")
			}
		})
	}
}
