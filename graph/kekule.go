package graph

import (
	"fmt"
	"math/bits"
)

// Kekulization.
//
// Every atom written aromatic that has room for one more bond (m.pi, decided
// from its valence in assignAromatic) must get exactly one double bond among
// its aromatic bonds. That is a perfect matching on the graph of aromatic
// bonds between such atoms; it is found with a greedy start and Edmonds'
// blossom algorithm for augmenting paths (Edmonds, Can. J. Math. 17, 449,
// 1965), which also handles odd rings such as azulene's.

// demoteAromatic turns aromatic bonds that cannot be part of an aromatic
// ring into single bonds (the bond joining the rings of biphenyl written
// c1ccccc1c1ccccc1, or ':' between aliphatic atoms), and reports aromatic
// atoms outside any ring.
func (m *Mol) demoteAromatic() []*AtomError {
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if !b.Aromatic || !m.ringBond[bi] {
			continue
		}
		// A wildcard in an aromatic ring stands for an aromatic atom.
		for _, pair := range [2][2]int{{b.A, b.B}, {b.B, b.A}} {
			if w, o := &m.Atoms[pair[0]], &m.Atoms[pair[1]]; w.Element == "*" && o.Aromatic {
				w.Aromatic = true
			}
		}
	}
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if !b.Aromatic {
			continue
		}
		if !m.ringBond[bi] || !m.Atoms[b.A].Aromatic || !m.Atoms[b.B].Aromatic {
			b.Aromatic = false
			b.Order = 1
		}
	}
	var errs []*AtomError
	for a := range m.Atoms {
		if m.Atoms[a].Aromatic && len(m.atomRings[a]) == 0 {
			errs = append(errs, m.atomErr(a, fmt.Sprintf(
				"aromatic atom outside a ring (write %s in upper case, or close the ring)",
				lowerSym(m.Atoms[a].Element))))
		}
	}
	return errs
}

func lowerSym(s string) string {
	if s == "" {
		return s
	}
	b := []byte(s)
	if b[0] >= 'A' && b[0] <= 'Z' {
		b[0] += 'a' - 'A'
	}
	return string(b)
}

// kekulize assigns Kekulé orders to the aromatic bonds.
func (m *Mol) kekulize() *AtomError {
	var nodes []int
	local := make([]int, len(m.Atoms))
	for a := range m.Atoms {
		local[a] = -1
		if m.pi[a] {
			local[a] = len(nodes)
			nodes = append(nodes, a)
		}
	}
	for bi := range m.Bonds {
		if m.Bonds[bi].Aromatic {
			m.Bonds[bi].Order = 1
		}
	}
	m.kekulized = true
	if len(nodes) == 0 {
		return nil
	}
	g := make([][]int, len(nodes))
	flat := make([]int, 0, 3*len(nodes))
	for i, a := range nodes {
		start := len(flat)
		for _, bi := range m.adj[a] {
			b := &m.Bonds[bi]
			if o := local[b.Other(a)]; b.Aromatic && o >= 0 {
				flat = append(flat, o)
			}
		}
		g[i] = flat[start:len(flat):len(flat)]
	}
	match := m.matchWithWildcards(nodes, g)
	for i, j := range match {
		if j < 0 && m.Atoms[nodes[i]].Element != "*" {
			return m.kekuleErr(nodes[i], nodes)
		}
		if j >= 0 && i < j {
			m.Bonds[m.BondBetween(nodes[i], nodes[j])].Order = 2
		}
	}
	return nil
}

// matchWithWildcards finds a matching that covers every node except
// aromatic wildcards, which may or may not take a double bond: subsets of
// wildcards are tried from the smallest up (all of them at once when there
// are more than six).
func (m *Mol) matchWithWildcards(nodes []int, g [][]int) []int {
	var wild []int
	for i, a := range nodes {
		if m.Atoms[a].Element == "*" {
			wild = append(wild, i)
		}
	}
	if len(wild) == 0 {
		return maxMatching(g)
	}
	if len(wild) > 6 {
		return maxMatching(g)
	}
	var best []int
	for size := 0; size <= len(wild); size++ {
		for mask := 0; mask < 1<<len(wild); mask++ {
			if bits.OnesCount(uint(mask)) != size {
				continue
			}
			off := map[int]bool{}
			for k, w := range wild {
				if mask&(1<<k) == 0 {
					off[w] = true
				}
			}
			sub := make([][]int, len(g))
			for i := range g {
				if off[i] {
					continue
				}
				for _, j := range g[i] {
					if !off[j] {
						sub[i] = append(sub[i], j)
					}
				}
			}
			match := maxMatching(sub)
			ok := true
			for i, j := range match {
				if j < 0 && !off[i] {
					ok = false
					break
				}
			}
			if ok {
				return match
			}
			if best == nil {
				best = match
			}
		}
	}
	return best
}

// kekuleErr explains a failed kekulization at the first atom of the ring
// system that could not be kekulized, or at a pyrrole-type nitrogen written
// without its hydrogen when the system has one (the usual mistake).
func (m *Mol) kekuleErr(a int, nodes []int) *AtomError {
	first := a
	for _, n := range nodes {
		if !m.sameSystem(n, a) {
			continue
		}
		first = min(first, n)
		at := &m.Atoms[n]
		if at.Element == "N" && at.Charge == 0 && at.HCount() == 0 && m.Degree(n) == 2 {
			return m.atomErr(n, "cannot kekulize aromatic system: no alternating single and double bonds fit (did you mean [nH]?)")
		}
	}
	return m.atomErr(first, fmt.Sprintf(
		"cannot kekulize aromatic system: no alternating single and double bonds fit the ring system starting at this %s (check the ring size and the hydrogens written in brackets)",
		lowerSym(m.Atoms[first].Element)))
}

// sameSystem reports whether a and b share a ring system.
func (m *Mol) sameSystem(a, b int) bool {
	seen := map[int]bool{a: true}
	queue := []int{a}
	for len(queue) > 0 {
		x := queue[0]
		queue = queue[1:]
		if x == b {
			return true
		}
		for _, bi := range m.adj[x] {
			if o := m.Bonds[bi].Other(x); m.ringBond[bi] && !seen[o] {
				seen[o] = true
				queue = append(queue, o)
			}
		}
	}
	return false
}

// maxMatching returns a maximum matching of the undirected graph g as a
// partner index per node (-1 when unmatched).
func maxMatching(g [][]int) []int {
	n := len(g)
	match := make([]int, n)
	for i := range match {
		match[i] = -1
	}
	// Greedy start: nodes with fewest free neighbours first.
	for pass := 1; pass <= 3; pass++ {
		for v := range n {
			if match[v] >= 0 {
				continue
			}
			free := 0
			for _, w := range g[v] {
				if match[w] < 0 {
					free++
				}
			}
			if free == 0 || (free > pass && pass < 3) {
				continue
			}
			for _, w := range g[v] {
				if match[w] < 0 {
					match[v], match[w] = w, v
					break
				}
			}
		}
	}
	b := newBlossom(g, match)
	for v := range n {
		if match[v] < 0 {
			b.augment(v)
		}
	}
	return match
}

type blossom struct {
	g            [][]int
	match, p     []int
	base         []int
	used, inBlos []bool
	queue        []int
}

func newBlossom(g [][]int, match []int) *blossom {
	n := len(g)
	return &blossom{g: g, match: match, p: make([]int, n), base: make([]int, n),
		used: make([]bool, n), inBlos: make([]bool, n)}
}

func (b *blossom) augment(root int) {
	u := b.findPath(root)
	for u >= 0 {
		pv := b.p[u]
		ppv := b.match[pv]
		b.match[u], b.match[pv] = pv, u
		u = ppv
	}
}

func (b *blossom) lca(x, y int) int {
	seen := make([]bool, len(b.g))
	for {
		x = b.base[x]
		seen[x] = true
		if b.match[x] < 0 {
			break
		}
		x = b.p[b.match[x]]
	}
	for {
		y = b.base[y]
		if seen[y] {
			return y
		}
		y = b.p[b.match[y]]
	}
}

func (b *blossom) markPath(v, base, child int) {
	for b.base[v] != base {
		b.inBlos[b.base[v]] = true
		b.inBlos[b.base[b.match[v]]] = true
		b.p[v] = child
		child = b.match[v]
		v = b.p[b.match[v]]
	}
}

func (b *blossom) findPath(root int) int {
	for i := range b.g {
		b.used[i], b.p[i], b.base[i] = false, -1, i
	}
	b.used[root] = true
	b.queue = append(b.queue[:0], root)
	for qi := 0; qi < len(b.queue); qi++ {
		v := b.queue[qi]
		for _, to := range b.g[v] {
			if b.base[v] == b.base[to] || b.match[v] == to {
				continue
			}
			if to == root || (b.match[to] >= 0 && b.p[b.match[to]] >= 0) {
				cur := b.lca(v, to)
				for i := range b.inBlos {
					b.inBlos[i] = false
				}
				b.markPath(v, cur, to)
				b.markPath(to, cur, v)
				for i := range b.g {
					if b.inBlos[b.base[i]] {
						b.base[i] = cur
						if !b.used[i] {
							b.used[i] = true
							b.queue = append(b.queue, i)
						}
					}
				}
			} else if b.p[to] < 0 {
				b.p[to] = v
				if b.match[to] < 0 {
					return to
				}
				b.used[b.match[to]] = true
				b.queue = append(b.queue, b.match[to])
			}
		}
	}
	return -1
}
