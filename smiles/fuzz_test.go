package smiles

import (
	"errors"
	"testing"
)

// FuzzParse checks that Parse never panics and that every error it returns
// carries a position inside the input (common practice, no source).
func FuzzParse(f *testing.F) {
	for _, s := range valids {
		f.Add(s)
	}
	for _, s := range invalids {
		f.Add(s)
	}
	for _, tc := range specValid {
		f.Add(tc.smiles)
	}
	f.Add(atorvastatin)
	f.Add(imatinib)
	f.Fuzz(func(t *testing.T, s string) {
		m, err := Parse(s)
		if err == nil {
			if m == nil {
				t.Fatal("nil molecule without error")
			}
			checkInvariants(t, s, m)
			return
		}
		var l ErrorList
		if !errors.As(err, &l) || len(l) == 0 {
			t.Fatalf("error %T %v is not a non-empty ErrorList", err, err)
		}
		for _, e := range l {
			if e.Pos < 0 || e.Pos > len(s) {
				t.Fatalf("Parse(%q): error %q at %d outside [0, %d]", s, e.Msg, e.Pos, len(s))
			}
		}
	})
}
