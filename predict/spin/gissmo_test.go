package spin

import (
	"bufio"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"testing"

	"shiftwise/internal/extdata"
)

// gissmoRecord is one line of shifts/gissmo_spin_systems.jsonl (see
// ../shared/data/SOURCES.md): shifts [[atomID, ppm]], couplings
// [[id1, id2, Hz]].
type gissmoRecord struct {
	File      string      `json:"file"`
	Shifts    [][]float64 `json:"shifts"`
	Couplings [][]float64 `json:"couplings"`
}

// system turns a record into a System: every atom is a count-1 1H group
// (the data gives no grouping; equivalent atoms are merged by Simulate).
// Couplings naming an unknown atom are an error; a repeated pair keeps the
// first value and is counted.
func (r gissmoRecord) system() (System, int, error) {
	var s System
	idx := map[int]int{}
	for _, sh := range r.Shifts {
		if len(sh) != 2 {
			return s, 0, fmt.Errorf("%s: bad shift entry %v", r.File, sh)
		}
		idx[int(sh[0])] = len(s.Groups)
		s.Groups = append(s.Groups, Group{Name: fmt.Sprint(int(sh[0])), ShiftPPM: sh[1], Count: 1})
	}
	seen := map[[2]int]bool{}
	dups := 0
	for _, c := range r.Couplings {
		if len(c) != 3 {
			return s, 0, fmt.Errorf("%s: bad coupling entry %v", r.File, c)
		}
		a, okA := idx[int(c[0])]
		b, okB := idx[int(c[1])]
		if !okA || !okB {
			return s, 0, fmt.Errorf("%s: coupling %v names an unknown atom", r.File, c)
		}
		key := [2]int{min(a, b), max(a, b)}
		if seen[key] || a == b {
			dups++
			continue
		}
		seen[key] = true
		s.Couplings = append(s.Couplings, Coupling{a, b, c[2]})
	}
	return s, dups, nil
}

func readGissmo(t testing.TB) []gissmoRecord {
	t.Helper()
	f, err := os.Open(extdata.Path(t, "shifts/gissmo_spin_systems.jsonl"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var recs []gissmoRecord
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for line := 1; sc.Scan(); line++ {
		var r gissmoRecord
		if err := json.Unmarshal(sc.Bytes(), &r); err != nil {
			t.Fatalf("gissmo line %d: %v", line, err)
		}
		recs = append(recs, r)
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return recs
}

// TestGissmo simulates every GISSMO spin system (open dataset, parameters
// fitted to experimental metabolite spectra; SOURCES.md) in Auto mode at
// 600 MHz and at a benchtop 60 MHz, where more clusters are strongly
// coupled and the largest are simulated by fragments, and checks the sum
// rule on each: total intensity = number of 1H (physical law of the
// normalisation). Nothing may be refused.
func TestGissmo(t *testing.T) {
	t.Parallel()
	recs := readGissmo(t)
	if len(recs) != 1342 {
		t.Errorf("read %d spin systems, SOURCES.md says 1,342", len(recs))
	}
	for _, field := range []float64{600, 60} {
		failed, dups, notes := 0, 0, 0
		for _, r := range recs {
			sys, d, err := r.system()
			if err != nil {
				t.Error(err)
				continue
			}
			dups += d
			res, err := Simulate(sys, Options{FieldMHz: field})
			if err != nil {
				failed++
				t.Errorf("%s at %g MHz: %v", r.File, field, err)
				continue
			}
			if len(res.Notes) > 0 {
				notes++
				t.Logf("%s at %g MHz: %s", r.File, field, res.Notes)
			}
			if got, want := total(res), float64(len(sys.Groups)); math.Abs(got-want) > sumTol*want {
				t.Errorf("%s at %g MHz: total intensity %v, want %v", r.File, field, got, want)
			}
		}
		t.Logf("%g MHz: %d systems, %d failed, %d with approximations noted, %d repeated couplings skipped", field, len(recs), failed, notes, dups)
	}
}
