package spin

import (
	"errors"
	"math/rand/v2"
	"runtime"
	"sync"
	"testing"
	"time"
)

// TestSchedule: every diagonalisation and every pair runs exactly once, a
// pair only after both its blocks, a block is released exactly once and
// only after the pairs on both sides, no more than workers+2 blocks are
// held at once, and a failed diagonalisation stops the run with its error.
func TestSchedule(t *testing.T) {
	t.Parallel()
	for n := 1; n <= 9; n++ {
		for workers := 1; workers <= 4; workers++ {
			var mu sync.Mutex
			diagN := make([]int, n)
			pairN := make([]int, n)
			relN := make([]int, n)
			held, maxHeld := 0, 0
			nap := func() { time.Sleep(time.Duration(rand.IntN(200)) * time.Microsecond) }
			r := rand.New(rand.NewPCG(uint64(n), uint64(workers)))
			diag := func(b int) {
				mu.Lock()
				diagN[b]++
				held++
				maxHeld = max(maxHeld, held)
				mu.Unlock()
				nap()
			}
			pair := func(b int) {
				mu.Lock()
				if diagN[b] != 1 || diagN[b+1] != 1 || relN[b] != 0 || relN[b+1] != 0 {
					t.Errorf("n=%d w=%d: pair %d ran with blocks not ready or released", n, workers, b)
				}
				pairN[b]++
				mu.Unlock()
				nap()
			}
			release := func(b int) {
				mu.Lock()
				if (b > 0 && pairN[b-1] != 1) || (b < n-1 && pairN[b] != 1) {
					t.Errorf("n=%d w=%d: block %d released before its pairs", n, workers, b)
				}
				relN[b]++
				held--
				mu.Unlock()
			}
			costs := make([]float64, n)
			for b := range costs {
				costs[b] = r.Float64()
			}
			if err := schedule(n, workers, func(b int) float64 { return costs[b] }, diag, pair, func(int) error { return nil }, release); err != nil {
				t.Fatalf("n=%d w=%d: %v", n, workers, err)
			}
			for b := 0; b < n; b++ {
				if diagN[b] != 1 || relN[b] != 1 || (b < n-1 && pairN[b] != 1) {
					t.Errorf("n=%d w=%d: block %d diag %d release %d pair %d, want 1 each", n, workers, b, diagN[b], relN[b], pairN[b])
				}
			}
			if maxHeld > workers+2 {
				t.Errorf("n=%d w=%d: %d blocks held at once, want ≤ %d", n, workers, maxHeld, workers+2)
			}
		}
	}
	boom := errors.New("boom")
	err := schedule(6, 2, func(b int) float64 { return float64(b) }, func(int) {}, func(int) {}, func(b int) error {
		if b == 3 {
			return boom
		}
		return nil
	}, func(int) {})
	if !errors.Is(err, boom) {
		t.Errorf("error %v, want boom", err)
	}
}

// TestWorkersSameResult: the lines do not depend on the number of
// goroutines (each block pair writes its own part; parts are joined in
// order). Not parallel: it changes GOMAXPROCS.
func TestWorkersSameResult(t *testing.T) {
	sys := chain(9, 0.01)
	sys.Groups[0].ShiftPPM += 0.003 // break the mirror symmetry
	var ref *Result
	for _, procs := range []int{1, 2, 4} {
		old := runtime.GOMAXPROCS(procs)
		res, err := Simulate(sys, Options{FieldMHz: 400, Mode: Exact})
		runtime.GOMAXPROCS(old)
		if err != nil {
			t.Fatal(err)
		}
		if ref == nil {
			ref = res
			continue
		}
		if len(res.Lines) != len(ref.Lines) || res.Dropped != ref.Dropped {
			t.Fatalf("GOMAXPROCS %d: %d lines, dropped %g; with 1: %d, %g", procs, len(res.Lines), res.Dropped, len(ref.Lines), ref.Dropped)
		}
		for i := range res.Lines {
			if res.Lines[i] != ref.Lines[i] {
				t.Fatalf("GOMAXPROCS %d: line %d = %+v, with 1: %+v", procs, i, res.Lines[i], ref.Lines[i])
			}
		}
	}
}
