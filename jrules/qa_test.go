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

// TestSevenRingOrtho: vicinal H–H across a bond of a seven-membered
// aromatic ring is about 10 Hz (azulene J45 9.5, J56 9.9 Hz; Pretsch, value
// from memory). Before, such a pair got no ring rule and was "unresolved"
// (0 Hz), so azulene's seven-ring protons were predicted as singlets.
func TestSevenRingOrtho(t *testing.T) {
	m, err := smiles.Parse("c1ccc2cccc2cc1") // azulene: atoms 0,1,2,8,9 ring H
	if err != nil {
		t.Fatal(err)
	}
	for _, pair := range [][2]int{{0, 1}, {1, 2}} {
		j, ok := Between(m, h(pair[0]), h(pair[1]))
		if !ok || j.Typical < 9 || j.Typical > 11 || j.NBonds != 3 {
			t.Errorf("azulene H%d–H%d: %+v, %v; want ³J 9–11 Hz", pair[0], pair[1], j, ok)
		}
	}
	// The six-membered ring is unchanged: benzene ortho 7.54 Hz (Pretsch,
	// value from memory).
	b, _ := smiles.Parse("c1ccccc1")
	if j, ok := Between(b, h(0), h(1)); !ok || j.Typical < 7 || j.Typical > 8.5 {
		t.Errorf("benzene ortho: %+v", j)
	}
}
