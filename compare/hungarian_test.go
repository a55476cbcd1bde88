package compare

import (
	"math"
	"math/rand/v2"
	"testing"
)

// bruteAssign returns the minimal total cost over all injective row→column
// maps, by enumeration. Minimality by exhaustive search is a mathematical
// identity, no source needed.
func bruteAssign(cost [][]float64) float64 {
	n, m := len(cost), len(cost[0])
	best := math.Inf(1)
	used := make([]bool, m)
	var rec func(i int, sum float64)
	rec = func(i int, sum float64) {
		if i == n {
			best = math.Min(best, sum)
			return
		}
		for j := 0; j < m; j++ {
			if !used[j] {
				used[j] = true
				rec(i+1, sum+cost[i][j])
				used[j] = false
			}
		}
	}
	rec(0, 0)
	return best
}

func TestHungarianMatchesBruteForce(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(1, 1))
	const tol = 1e-9
	for trial := 0; trial < 400; trial++ {
		n := 1 + rng.IntN(6)
		m := n + rng.IntN(3)
		cost := make([][]float64, n)
		for i := range cost {
			cost[i] = make([]float64, m)
			for j := range cost[i] {
				if trial%3 == 0 {
					cost[i][j] = float64(rng.IntN(5)) // many ties
				} else {
					cost[i][j] = rng.Float64()*20 - 5
				}
			}
		}
		assign, total := Hungarian(cost)
		seen := map[int]bool{}
		for i, j := range assign {
			if j < 0 || j >= m || seen[j] {
				t.Fatalf("trial %d: row %d got column %d (invalid or repeated) in %v", trial, i, j, assign)
			}
			seen[j] = true
		}
		if want := bruteAssign(cost); math.Abs(total-want) > tol*(1+math.Abs(want)) {
			t.Fatalf("trial %d (%d×%d): Hungarian total %g, brute force %g", trial, n, m, total, want)
		}
	}
}

func TestHungarianSmall(t *testing.T) {
	t.Parallel()
	// Hand-checked: the anti-diagonal costs 1+1+1 = 3; every other
	// permutation costs more (common practice, no source: worked by hand).
	cost := [][]float64{{9, 9, 1}, {9, 1, 9}, {1, 9, 9}}
	assign, total := Hungarian(cost)
	if total != 3 || assign[0] != 2 || assign[1] != 1 || assign[2] != 0 {
		t.Fatalf("got %v total %g, want [2 1 0] total 3", assign, total)
	}
	if a, tot := Hungarian(nil); a != nil || tot != 0 {
		t.Fatalf("empty: got %v %g", a, tot)
	}
}
