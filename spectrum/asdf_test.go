package spectrum

import (
	"errors"
	"strings"
	"testing"
)

// decodeYs decodes data lines of an (X++(Y..Y)) table and returns the Y
// values.
func decodeYs(lines ...string) ([]float64, error) {
	d := xyDecoder{file: "t", maxN: maxPoints}
	for i, l := range lines {
		if err := d.decodeLine(i+1, []byte(l)); err != nil {
			return nil, err
		}
	}
	return d.ys, nil
}

func equalFloats(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// TestASDFSpecExamples decodes the compression examples of the JCAMP-DX
// specification. Source: McDonald & Wilks, Appl. Spectrosc. 42 (1988) 151,
// §5.3-5.10 and Tables VII/VIIb. The search tool did not return the paper's
// page text itself; the example strings below are those quoted from it in
// the public notebook giacomomarchioro/SpectraInteroperabilityFramework
// "spectraformat/ASDF and other compression.ipynb" (sections 5.3-5.10).
// The paper writes the ten ordinates 1 2 3 3 2 1 0 -1 -2 -3 in each form; as
// in a data line, an abscissa (here 0) precedes them.
func TestASDFSpecExamples(t *testing.T) {
	t.Parallel()
	ten := []float64{1, 2, 3, 3, 2, 1, 0, -1, -2, -3}
	four := []float64{50, 50, 50, 50}
	tests := []struct {
		name string
		line string
		want []float64
	}{
		{"AFFN (FIX) §5.3", "0 1 2 3 3 2 1 0 -1 -2 -3", ten},
		{"AFFN with exponent §5.3", "0 .34,66E-2", []float64{0.34, 0.66}},
		{"PAC §5.4", "0 1+2+3+3+2+1+0-1-2-3", ten},
		{"PAC blanks and signs §5.4", "0 1 2 3 3 2 1 0-1-2-3", ten},
		{"SQZ §5.5", "0 1BCCBA@abc", ten},
		{"DIF §5.6", "0 1JJ%jjjjjj", ten},
		{"DIFDUP §5.10", "0 1JT%jX", ten},
		{"DUP §5.9: 50 50 50 50 is 50V", "0 50V", four},
		{"DIF §5.10: 50% % %", "0 50% % %", four},
		{"DIFDUP §5.10: 50%U", "0 50%U", four},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, err := decodeYs(tc.line)
			if err != nil {
				t.Fatalf("decode %q: %v", tc.line, err)
			}
			if !equalFloats(got, tc.want) {
				t.Errorf("decode %q = %v, want %v", tc.line, got, tc.want)
			}
		})
	}
}

// TestASDFTable checks every pseudo-digit of Table VII (McDonald & Wilks
// 1988): SQZ @A-I/a-i, DIF %J-R/j-r, DUP S-Z/s.
func TestASDFTable(t *testing.T) {
	t.Parallel()
	for d := 0; d <= 9; d++ {
		sq := string("@ABCDEFGHI"[d])
		if got, _ := decodeYs("0 " + sq + "5"); !equalFloats(got, []float64{float64(d*10 + 5)}) {
			t.Errorf("SQZ %s5 = %v, want %d", sq, got, d*10+5)
		}
		if d > 0 {
			sqn := string("abcdefghi"[d-1])
			if got, _ := decodeYs("0 " + sqn + "5"); !equalFloats(got, []float64{float64(-(d*10 + 5))}) {
				t.Errorf("SQZ %s5 = %v, want %d", sqn, got, -(d*10 + 5))
			}
			dif := string("JKLMNOPQR"[d-1])
			if got, _ := decodeYs("0 @" + dif); !equalFloats(got, []float64{0, float64(d)}) {
				t.Errorf("DIF @%s = %v, want [0 %d]", dif, got, d)
			}
			difn := string("jklmnopqr"[d-1])
			if got, _ := decodeYs("0 @" + difn); !equalFloats(got, []float64{0, float64(-d)}) {
				t.Errorf("DIF @%s = %v, want [0 %d]", difn, got, -d)
			}
			dup := string("STUVWXYZs"[d-1])
			got, _ := decodeYs("0 A" + dup)
			if len(got) != d {
				t.Errorf("DUP A%s gives %d values, want %d", dup, len(got), d)
			}
		}
	}
}

// TestYCheck: in DIF form the first ordinate of a line repeats the last of
// the previous line (McDonald & Wilks 1988 §5.8, Y value check); it is
// verified and not stored twice.
func TestYCheck(t *testing.T) {
	t.Parallel()
	got, err := decodeYs("0 1JJ", "2 3jj", "4 1")
	if err != nil {
		t.Fatal(err)
	}
	if want := []float64{1, 2, 3, 2, 1}; !equalFloats(got, want) {
		t.Errorf("got %v, want %v", got, want)
	}
	// Line 2 repeats 4 where the previous line ended at 3.
	_, err = decodeYs("0 1JJ", "2 4jj")
	var pe *ParseError
	if !errors.As(err, &pe) || pe.Line != 2 || !strings.Contains(pe.Msg, "Y-check") {
		t.Errorf("mismatch error = %v, want a Y-check error on line 2", err)
	}
	// No check after a line that ends in SQZ form.
	got, err = decodeYs("0 1JJA", "3 B")
	if err != nil || !equalFloats(got, []float64{1, 2, 3, 1, 2}) {
		t.Errorf("no-check case = %v, %v", got, err)
	}
}

func TestASDFErrors(t *testing.T) {
	t.Parallel()
	tests := []struct {
		lines []string
		line  int
		msg   string
	}{
		{[]string{"0 1 2", "1 3!4"}, 2, "unexpected character '!'"},
		{[]string{"0 J5"}, 1, "DIF value at the start"},
		{[]string{"0 S"}, 1, "DUP count without"},
		{[]string{"0 1 ?"}, 1, "'?'"},
		{[]string{"0 1 A234567890123456789"}, 1, "too many digits"},
	}
	for _, tc := range tests {
		_, err := decodeYs(tc.lines...)
		var pe *ParseError
		if !errors.As(err, &pe) || pe.Line != tc.line || !strings.Contains(pe.Msg, tc.msg) {
			t.Errorf("%q: error %v, want line %d containing %q", tc.lines, err, tc.line, tc.msg)
		}
	}
}
