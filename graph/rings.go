package graph

import (
	"math/bits"
	"slices"
)

// Ring perception.
//
// Ring bonds are the bonds that are not bridges (Tarjan's low-link). Each
// ring system (connected set of ring bonds) with V atoms and E bonds has
// E-V+1 rings in its smallest set of smallest rings (SSSR). A system with
// one ring is walked directly; otherwise the SSSR is picked from Horton's
// candidate cycles (shortest path root→x, edge x–y, shortest path y→root)
// by Gaussian elimination over GF(2), shortest first (Horton, SIAM J.
// Comput. 16, 358, 1987). Rings returns that SSSR. Aromaticity is perceived
// on the symmetrized set, which adds equivalent rings (see symmetric).

// findRings computes m.ringBond, m.rings, m.ringBonds and m.atomRings.
func (m *Mol) findRings() {
	m.ringBond = m.bridgesComplement()
	m.rings, m.ringBonds = nil, nil
	m.extraRings, m.extraRingBonds = nil, nil
	for _, sys := range m.ringSystems() {
		m.addSystemRings(sys)
	}
	m.atomRings = make([][]int, len(m.Atoms))
	for ri, r := range m.rings {
		for _, a := range r {
			m.atomRings[a] = append(m.atomRings[a], ri)
		}
	}
}

// bridgesComplement marks every bond that lies on a cycle.
func (m *Mol) bridgesComplement() []bool {
	n := len(m.Atoms)
	inRing := make([]bool, len(m.Bonds))
	disc := make([]int, n)
	low := make([]int, n)
	for i := range disc {
		disc[i] = -1
	}
	type frame struct{ a, parentBond, next int }
	t := 0
	var stack []frame
	for s := range n {
		if disc[s] >= 0 {
			continue
		}
		disc[s], low[s] = t, t
		t++
		stack = append(stack[:0], frame{s, -1, 0})
		for len(stack) > 0 {
			f := &stack[len(stack)-1]
			if f.next < len(m.adj[f.a]) {
				bi := m.adj[f.a][f.next]
				f.next++
				if bi == f.parentBond {
					continue
				}
				o := m.Bonds[bi].Other(f.a)
				if disc[o] < 0 {
					disc[o], low[o] = t, t
					t++
					stack = append(stack, frame{o, bi, 0})
				} else {
					low[f.a] = min(low[f.a], disc[o])
					inRing[bi] = true // a back edge closes a cycle
				}
				continue
			}
			done := *f
			stack = stack[:len(stack)-1]
			if done.parentBond >= 0 {
				p := m.Bonds[done.parentBond].Other(done.a)
				low[p] = min(low[p], low[done.a])
				if low[done.a] <= disc[p] {
					inRing[done.parentBond] = true
				}
			}
		}
	}
	return inRing
}

// ringSystem is a connected set of ring bonds.
type ringSystem struct {
	atoms []int // ascending
	bonds []int // ascending
}

func (m *Mol) ringSystems() []ringSystem {
	seen := make([]bool, len(m.Atoms))
	atomBuf := make([]int, 0, len(m.Atoms))
	bondBuf := make([]int, 0, len(m.Bonds))
	var out []ringSystem
	for s := range m.Atoms {
		if seen[s] || !m.hasRingBond(s) {
			continue
		}
		a0, b0 := len(atomBuf), len(bondBuf)
		atomBuf = append(atomBuf, s)
		seen[s] = true
		for qi := a0; qi < len(atomBuf); qi++ {
			a := atomBuf[qi]
			for _, bi := range m.adj[a] {
				if !m.ringBond[bi] {
					continue
				}
				o := m.Bonds[bi].Other(a)
				if !seen[o] {
					seen[o] = true
					atomBuf = append(atomBuf, o)
				}
				if a < o {
					bondBuf = append(bondBuf, bi)
				}
			}
		}
		sys := ringSystem{atoms: atomBuf[a0:len(atomBuf):len(atomBuf)], bonds: bondBuf[b0:len(bondBuf):len(bondBuf)]}
		slices.Sort(sys.atoms)
		slices.Sort(sys.bonds)
		out = append(out, sys)
	}
	return out
}

func (m *Mol) hasRingBond(a int) bool {
	for _, bi := range m.adj[a] {
		if m.ringBond[bi] {
			return true
		}
	}
	return false
}

func (m *Mol) addSystemRings(sys ringSystem) {
	nr := len(sys.bonds) - len(sys.atoms) + 1
	if nr == 1 {
		atoms, bonds := m.walkCycle(sys.atoms[0], len(sys.atoms))
		m.rings = append(m.rings, atoms)
		m.ringBonds = append(m.ringBonds, bonds)
		return
	}
	h := newHorton(m, sys)
	basis, extra := h.sssr(nr)
	for _, c := range basis {
		m.rings = append(m.rings, c.atoms)
		m.ringBonds = append(m.ringBonds, c.bonds)
	}
	for _, c := range extra {
		m.extraRings = append(m.extraRings, c.atoms)
		m.extraRingBonds = append(m.extraRingBonds, c.bonds)
	}
}

// walkCycle follows the ring bonds of a single-ring system from start.
func (m *Mol) walkCycle(start, n int) (atoms, bonds []int) {
	buf := make([]int, 2*n)
	atoms, bonds = buf[:0:n], buf[n:n:2*n]
	prevBond, a := -1, start
	for {
		atoms = append(atoms, a)
		next := -1
		for _, bi := range m.adj[a] {
			if m.ringBond[bi] && bi != prevBond {
				next = bi
				break
			}
		}
		bonds = append(bonds, next)
		a = m.Bonds[next].Other(a)
		prevBond = next
		if a == start {
			return atoms, bonds
		}
	}
}

// cycle is a candidate ring: atoms in ring order, its bonds, and the bond
// set as a bit vector over the system's bonds.
type cycle struct {
	atoms, bonds []int
	vec          []uint64
}

type horton struct {
	m     *Mol
	sys   ringSystem
	local map[int]int // bond index -> position in sys.bonds
	words int
}

func newHorton(m *Mol, sys ringSystem) *horton {
	h := &horton{m: m, sys: sys, local: make(map[int]int, len(sys.bonds))}
	for i, b := range sys.bonds {
		h.local[b] = i
	}
	h.words = (len(sys.bonds) + 63) / 64
	return h
}

// sssr returns nr independent cycles of smallest total size, and the extra
// cycles that symmetrize the set (see symmetric).
func (h *horton) sssr(nr int) (sssr, extra []cycle) {
	cands := h.candidates()
	slices.SortStableFunc(cands, func(x, y cycle) int { return len(x.bonds) - len(y.bonds) })
	var basis [][]uint64
	var pivots []int
	var out []cycle
	used := make([]bool, len(cands))
	for ci, c := range cands {
		v := slices.Clone(c.vec)
		for i, b := range basis {
			if v[pivots[i]/64]&(1<<(pivots[i]%64)) != 0 {
				for w := range v {
					v[w] ^= b[w]
				}
			}
		}
		p := firstBit(v)
		if p < 0 {
			continue
		}
		basis = append(basis, v)
		pivots = append(pivots, p)
		out = append(out, c)
		used[ci] = true
		if len(out) == nr {
			break
		}
	}
	return out, h.symmetric(cands, used, out)
}

// symmetric returns the dependent cycles that could stand in for an SSSR
// ring of the same size: they share a bond with it and contain every bond
// that no other SSSR ring provides. Adding them keeps the ring set from
// depending on atom order (adamantane has four six-rings, cubane six
// four-rings); RDKit's symmetrized SSSR uses the same criterion.
func (h *horton) symmetric(cands []cycle, used []bool, sssr []cycle) []cycle {
	count := map[int]int{}
	for _, r := range sssr {
		for _, b := range r.bonds {
			count[b]++
		}
	}
	var extra []cycle
	for ci, c := range cands {
		if used[ci] {
			continue
		}
		for _, r := range sssr {
			if len(r.bonds) == len(c.bonds) && canReplace(r, c, count) {
				extra = append(extra, c)
				break
			}
		}
	}
	return extra
}

func canReplace(r, c cycle, count map[int]int) bool {
	share := false
	for _, b := range r.bonds {
		in := slices.Contains(c.bonds, b)
		share = share || in
		if !in && count[b] == 1 {
			return false
		}
	}
	return share
}

func firstBit(v []uint64) int {
	for w, x := range v {
		if x != 0 {
			return w*64 + bits.TrailingZeros64(x)
		}
	}
	return -1
}

// candidates builds Horton's cycle set, without duplicates.
func (h *horton) candidates() []cycle {
	m := h.m
	n := len(m.Atoms)
	dist := make([]int, n)
	parent := make([]int, n) // bond to parent in the BFS tree
	mark := make([]int, n)
	for i := range mark {
		mark[i] = -1
	}
	var out []cycle
	seen := map[string]bool{}
	stamp := 0
	for _, r := range h.sys.atoms {
		h.bfs(r, dist, parent)
		for _, bi := range h.sys.bonds {
			x, y := m.Bonds[bi].A, m.Bonds[bi].B
			if parent[x] == bi || parent[y] == bi {
				continue
			}
			stamp++
			c, ok := h.join(r, x, y, bi, parent, mark, stamp)
			if !ok {
				continue
			}
			key := string(u64bytes(c.vec))
			if seen[key] {
				continue
			}
			seen[key] = true
			out = append(out, c)
		}
	}
	return out
}

func u64bytes(v []uint64) []byte {
	b := make([]byte, 0, 8*len(v))
	for _, x := range v {
		for i := range 8 {
			b = append(b, byte(x>>(8*i)))
		}
	}
	return b
}

func (h *horton) bfs(r int, dist, parent []int) {
	for _, a := range h.sys.atoms {
		dist[a], parent[a] = -1, -1
	}
	dist[r] = 0
	queue := []int{r}
	for len(queue) > 0 {
		a := queue[0]
		queue = queue[1:]
		for _, bi := range h.m.adj[a] {
			if !h.m.ringBond[bi] {
				continue
			}
			o := h.m.Bonds[bi].Other(a)
			if dist[o] < 0 {
				dist[o], parent[o] = dist[a]+1, bi
				queue = append(queue, o)
			}
		}
	}
}

// join closes the cycle root→x, x–y, y→root if the two tree paths meet
// only at the root.
func (h *horton) join(r, x, y, bi int, parent, mark []int, stamp int) (cycle, bool) {
	m := h.m
	var px []int // x up to r, inclusive
	for a := x; ; a = m.Bonds[parent[a]].Other(a) {
		px = append(px, a)
		mark[a] = stamp
		if a == r {
			break
		}
	}
	var py []int // y up to r, exclusive
	for a := y; a != r; a = m.Bonds[parent[a]].Other(a) {
		if mark[a] == stamp {
			return cycle{}, false
		}
		py = append(py, a)
	}
	atoms := make([]int, 0, len(px)+len(py))
	for i := len(px) - 1; i >= 0; i-- {
		atoms = append(atoms, px[i])
	}
	for i := 0; i < len(py); i++ {
		atoms = append(atoms, py[i])
	}
	if len(atoms) < 3 {
		return cycle{}, false
	}
	c := cycle{atoms: atoms, vec: make([]uint64, h.words)}
	for i, a := range atoms {
		b := m.BondBetween(a, atoms[(i+1)%len(atoms)])
		c.bonds = append(c.bonds, b)
		l := h.local[b]
		c.vec[l/64] |= 1 << (l % 64)
	}
	return c, true
}
