package compare

import "math"

// Hungarian solves the rectangular assignment problem: given an n×m cost
// matrix with n ≤ m (cost[i][j] is the cost of giving row i column j), it
// returns assign with assign[i] the column given to row i, every row getting
// a distinct column, such that the total cost is minimal, and that total.
//
// It is the shortest-augmenting-path form of the Hungarian method (Kuhn 1955,
// Munkres 1957) with row and column potentials, O(n²·m). Hungarian panics if
// the rows have unequal lengths or n > m (misuse by the caller). Costs must be
// finite.
func Hungarian(cost [][]float64) (assign []int, total float64) {
	n := len(cost)
	if n == 0 {
		return nil, 0
	}
	m := len(cost[0])
	for _, r := range cost {
		if len(r) != m {
			panic("compare: Hungarian: ragged cost matrix")
		}
	}
	if n > m {
		panic("compare: Hungarian: more rows than columns")
	}
	// 1-based arrays; p[j] is the row matched to column j (0 = none).
	u := make([]float64, n+1)
	v := make([]float64, m+1)
	p := make([]int, m+1)
	way := make([]int, m+1)
	minv := make([]float64, m+1)
	used := make([]bool, m+1)
	for i := 1; i <= n; i++ {
		p[0] = i
		j0 := 0
		for j := range minv {
			minv[j] = math.Inf(1)
			used[j] = false
		}
		for {
			used[j0] = true
			i0 := p[j0]
			delta := math.Inf(1)
			j1 := 0
			for j := 1; j <= m; j++ {
				if used[j] {
					continue
				}
				cur := cost[i0-1][j-1] - u[i0] - v[j]
				if cur < minv[j] {
					minv[j] = cur
					way[j] = j0
				}
				if minv[j] < delta {
					delta = minv[j]
					j1 = j
				}
			}
			for j := 0; j <= m; j++ {
				if used[j] {
					u[p[j]] += delta
					v[j] -= delta
				} else {
					minv[j] -= delta
				}
			}
			j0 = j1
			if p[j0] == 0 {
				break
			}
		}
		for j0 != 0 {
			j1 := way[j0]
			p[j0] = p[j1]
			j0 = j1
		}
	}
	assign = make([]int, n)
	for j := 1; j <= m; j++ {
		if p[j] != 0 {
			assign[p[j]-1] = j - 1
		}
	}
	for i, j := range assign {
		total += cost[i][j]
	}
	return assign, total
}
