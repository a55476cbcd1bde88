package spectrum

import (
	"math/rand/v2"
	"strconv"
	"testing"
)

// TestExactDecimalMatchesStrconv checks the hand-rolled decimal conversion of
// AFFN and ASDF numbers against strconv.ParseFloat, the correctly rounded
// reference (IEEE 754 round to nearest), bit for bit.
func TestExactDecimalMatchesStrconv(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	texts := []string{"0.1", "-0.0", "5.", ".5", "123456789012.345", "999999999999999", "0.000000000000001", "-7.25"}
	for range 20000 {
		intDigits, fracDigits := rng.IntN(10), rng.IntN(8)
		b := []byte{}
		if rng.IntN(2) == 0 {
			b = append(b, '-')
		}
		for range intDigits + 1 {
			b = append(b, byte('0'+rng.IntN(10)))
		}
		if fracDigits > 0 {
			b = append(b, '.')
			for range fracDigits {
				b = append(b, byte('0'+rng.IntN(10)))
			}
		}
		texts = append(texts, string(b))
	}
	for _, text := range texts {
		want, err := strconv.ParseFloat(text, 64)
		if err != nil {
			t.Fatal(err)
		}
		sc := lineScanner{s: []byte(text)}
		kind, got, ok, msg := sc.next()
		if !ok || msg != "" || kind != tokAbs || got != want || (got == 0 && (1/got > 0) != (1/want > 0)) {
			t.Errorf("AFFN %q = %v (%q), want %v", text, got, msg, want)
		}
		// The same number written with a SQZ pseudo-digit: 1.5 → A.5, -1.5 → a.5.
		if text[0] == '-' || text[0] == '0' || text[0] == '.' || len(text) < 2 {
			continue
		}
		sqz := string(rune('A'+text[0]-'1')) + text[1:]
		sc = lineScanner{s: []byte(sqz)}
		kind, got, _, msg = sc.next()
		if msg != "" || kind != tokAbs || got != want {
			t.Errorf("SQZ %q = %v (%q), want %v", sqz, got, msg, want)
		}
	}
}
