package jrules

import (
	"math"
	"testing"

	"shiftwise/smiles"
)

// TestGeminalHFByFluorineCount: ²J(H,F) grows with the number of F on the
// carbon: CH3F 46.4, CH2F2 50.2, PhCHF2 56.4, CHF3 79.7 Hz (Pretsch,
// 1H–19F coupling tables; values from memory). Before, every H–C–F took
// 47 Hz (range 44–58), so fluoroform's 79.7 Hz fell outside the range and
// the very common ArCHF2 triplet was predicted 9 Hz too narrow.
func TestGeminalHFByFluorineCount(t *testing.T) {
	tests := []struct {
		smi    string
		c, f   int // carbon bearing the H, one F on it
		actual float64
	}{
		{"CF", 0, 1, 46.4},
		{"FCF", 1, 0, 50.2},
		{"FC(F)c1ccccc1", 1, 0, 56.4},
		{"FC(F)F", 1, 0, 79.7},
	}
	for _, tc := range tests {
		m, err := smiles.Parse(tc.smi)
		if err != nil {
			t.Fatal(err)
		}
		j, ok := ToHetero(m, h(tc.c), tc.f)
		if !ok || j.NBonds != 2 {
			t.Fatalf("%s: %+v, %v", tc.smi, j, ok)
		}
		if tc.actual < j.Min || tc.actual > j.Max || math.Abs(j.Typical-tc.actual) > 6.5 {
			t.Errorf("%s: ²J(H,F) %.1f [%.1f, %.1f], measured %.1f", tc.smi, j.Typical, j.Min, j.Max, tc.actual)
		}
	}
}
