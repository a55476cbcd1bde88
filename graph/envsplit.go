package graph

import "slices"

// This file holds the finer judgements made on proton sets: whether the
// hydrogens of a CH2 (or two like groups) are diastereotopic, which amide
// groups are distinct, and whether the members of a set are magnetically
// equivalent.

// stereoReach is how many bonds from a stereocentre a CH2 (or a pair of
// like groups) is still taken as diastereotopic.
const stereoReach = 2

// diastereotopic reports whether the two hydrogens of atom c are
// diastereotopic by the conservative rule documented on Environments.
func (m *Mol) diastereotopic(c int, cls []int) bool {
	at := &m.Atoms[c]
	if at.Element != "C" || at.HCount() != 2 || m.Degree(c) != 2 || !m.envSingleBonded(c) {
		return false
	}
	nb := m.Neighbors(c)
	dist := m.symDistances(c)
	if cls[nb[0]] != cls[nb[1]] {
		for x, d := range dist {
			if d >= 1 && d <= stereoReach && m.stereocentre(x, cls) {
				return true
			}
		}
	}
	if m.nextToProchiral(c, dist, cls) {
		return true
	}
	ring := m.envSmallestRing(c, nb[0], nb[1])
	if ring == nil || len(ring) > 8 {
		return false
	}
	in := make(map[int]bool, len(ring))
	for _, r := range ring {
		in[r] = true
	}
	for _, r := range ring {
		if r != c && m.faceDifferentiating(r, in, cls) {
			return true
		}
	}
	return false
}

// envSingleBonded reports whether atom a is non-aromatic and has only
// single bonds.
func (m *Mol) envSingleBonded(a int) bool {
	if m.Atoms[a].Aromatic {
		return false
	}
	for _, bi := range m.adj[a] {
		if b := &m.Bonds[bi]; b.Aromatic || b.Order != 1 {
			return false
		}
	}
	return true
}

// stereocentre reports whether atom x is a tetrahedral stereocentre: it has
// a written @ or @@ mark, or it is a saturated atom with four positions
// whose occupants (hydrogens counting as one kind) are of four different
// symmetry classes.
func (m *Mol) stereocentre(x int, cls []int) bool {
	at := &m.Atoms[x]
	if at.Chiral != ChiralNone {
		return true
	}
	if m.sulfoxide(x) {
		nb := m.Neighbors(x)
		var r []int
		for _, o := range nb {
			if m.Atoms[o].Element != "O" || m.Degree(o) != 1 {
				r = append(r, cls[o])
			}
		}
		return len(r) == 2 && r[0] != r[1]
	}
	if !m.tetrahedral(x) {
		return false
	}
	seen := map[int]bool{}
	for _, c := range m.positions(x, cls) {
		if seen[c] {
			return false
		}
		seen[c] = true
	}
	return true
}

// sulfoxide reports whether x is the pyramidal S of a sulfoxide: three
// neighbours, one of them a doubly bonded O.
func (m *Mol) sulfoxide(x int) bool {
	if m.Atoms[x].Element != "S" || m.Degree(x) != 3 || m.Atoms[x].HCount() != 0 {
		return false
	}
	n := 0
	for _, bi := range m.adj[x] {
		b := &m.Bonds[bi]
		if b.Order == 2 && m.Atoms[b.Other(x)].Element == "O" {
			n++
		}
	}
	return n == 1
}

// tetrahedral reports whether x holds four positions in a tetrahedron that
// do not exchange: a saturated C or Si, a quaternary N+, or a P or S with
// four neighbours (phosphates, thiophosphates, phosphonium, sulfones).
func (m *Mol) tetrahedral(x int) bool {
	at := &m.Atoms[x]
	n := m.Degree(x) + at.HCount()
	if n != 4 || at.Aromatic {
		return false
	}
	switch at.Element {
	case "C", "Si":
		return m.envSingleBonded(x)
	case "N":
		return at.Charge == 1 && m.envSingleBonded(x)
	case "P", "S":
		return m.Degree(x) == 4
	}
	return false
}

// positions lists the symmetry classes of the four positions of x, -1 for
// each hydrogen.
func (m *Mol) positions(x int, cls []int) []int {
	var p []int
	for i := 0; i < m.Atoms[x].HCount(); i++ {
		p = append(p, -1)
	}
	for _, o := range m.Neighbors(x) {
		p = append(p, cls[o])
	}
	return p
}

// prochiralPair returns the two like groups of a tetrahedral atom x whose
// other two positions differ from each other and from the pair: the
// situation that makes the two groups, and the two H of a CH2 within
// either, diastereotopic (CH3CH(OCH2CH3)2, the OCH2 of (EtO)2P(S)OAr).
func (m *Mol) prochiralPair(x int, cls []int) (int, int, bool) {
	if !m.tetrahedral(x) {
		return 0, 0, false
	}
	nb := m.Neighbors(x)
	g1, g2 := -1, -1
	for i, a := range nb {
		for _, b := range nb[i+1:] {
			if cls[a] == cls[b] {
				if g1 >= 0 {
					return 0, 0, false // three like groups, or two pairs
				}
				g1, g2 = a, b
			}
		}
	}
	if g1 < 0 {
		return 0, 0, false
	}
	var rest []int
	for _, c := range m.positions(x, cls) {
		if c != cls[g1] {
			rest = append(rest, c)
		}
	}
	if len(rest) != 2 || rest[0] == rest[1] {
		return 0, 0, false
	}
	return g1, g2, true
}

// nextToProchiral reports whether CH2 atom c is one of the like groups of a
// prochiral centre, or bonded to one (dist are the distances from c).
func (m *Mol) nextToProchiral(c int, dist []int, cls []int) bool {
	for x, d := range dist {
		if d < 1 || d > 2 {
			continue
		}
		g1, g2, ok := m.prochiralPair(x, cls)
		if !ok {
			continue
		}
		for _, g := range []int{g1, g2} {
			if g == c || (d == 2 && m.BondBetween(g, c) >= 0) {
				return true
			}
		}
	}
	return false
}

// faceDifferentiating reports whether ring atom r (of the ring whose atoms
// are in) is a saturated atom, not a neutral nitrogen (which inverts), whose
// two positions outside the ring hold groups of different class.
func (m *Mol) faceDifferentiating(r int, in map[int]bool, cls []int) bool {
	at := &m.Atoms[r]
	h := at.HCount()
	if m.Degree(r)+h != 4 || !m.envSingleBonded(r) || (at.Element == "N" && at.Charge == 0) {
		return false
	}
	var out []int
	for i := 0; i < h; i++ {
		out = append(out, -1)
	}
	for _, o := range m.Neighbors(r) {
		if !in[o] {
			out = append(out, cls[o])
		}
	}
	return len(out) == 2 && out[0] != out[1]
}

// envSmallestRing returns the atoms of a smallest ring through c and its
// neighbours x and y (the shortest x…y path avoiding c, plus c), or nil.
func (m *Mol) envSmallestRing(c, x, y int) []int {
	prev := map[int]int{x: -1}
	queue := []int{x}
	for len(queue) > 0 {
		v := queue[0]
		queue = queue[1:]
		if v == y {
			ring := []int{c}
			for u := y; u >= 0; u = prev[u] {
				ring = append(ring, u)
			}
			return ring
		}
		for _, o := range m.Neighbors(v) {
			if o == c {
				continue
			}
			if _, ok := prev[o]; !ok {
				prev[o] = v
				queue = append(queue, o)
			}
		}
	}
	return nil
}

// envSp2 reports whether atom a is aromatic or doubly bonded.
func (m *Mol) envSp2(a int) bool {
	if m.Atoms[a].Aromatic {
		return true
	}
	for _, bi := range m.adj[a] {
		if m.Bonds[bi].Order == 2 {
			return true
		}
	}
	return false
}

// envMagnetic sets MagneticallyEquivalent on each set. Members of a set are
// magnetically equivalent when each has the same coupling to every spin
// outside the set. Couplings are judged from topology: a coupling is
// identified by its number of bonds and, across a C=C, by cis/trans. Counted
// are 2J and 3J to protons, 4J between two hydrogens on sp2 atoms (meta and
// W couplings), and H–F and H–P couplings through at most 4 bonds.
// Exchangeable protons (OH, NH, SH) take no part as partners, and small
// allylic and benzylic 4J are ignored, so the aromatic H of p-xylene count
// as equivalent while the AA'BB' sets of 4-chloroanisole do not.
func (m *Mol) envMagnetic(envs []Environment, bonds []alkBond) {
	dist := make(map[int][]int)
	d := func(a, b int) int {
		if dist[a] == nil {
			dist[a] = m.symDistances(a)
		}
		return dist[a][b]
	}
	var partners []Proton
	var hetero []int
	for _, e := range envs {
		if !e.Exchangeable {
			partners = append(partners, e.Protons...)
		}
	}
	for a, at := range m.Atoms {
		if at.Element == "F" || at.Element == "P" {
			hetero = append(hetero, a)
		}
	}
	key := func(p, t Proton) int {
		n := d(p.Atom, t.Atom) + 2
		switch {
		case n < 2 || n > 4:
			return 0
		case n == 4 && !(m.envSp2(p.Atom) && m.envSp2(t.Atom)):
			return 0
		}
		return n*10 + int(m.protonRelation(bonds, p, t))
	}
	for k := range envs {
		e := &envs[k]
		e.MagneticallyEquivalent = m.envMagEq(e, partners, hetero, key, d)
	}
}

func (m *Mol) envMagEq(e *Environment, partners []Proton, hetero []int,
	key func(p, t Proton) int, d func(a, b int) int) bool {
	if len(e.Atoms) < 2 {
		return true
	}
	member := make(map[Proton]bool, len(e.Protons))
	for _, p := range e.Protons {
		member[p] = true
	}
	s0 := e.Protons[0]
	for _, s := range e.Protons[1:] {
		if s.Atom == s0.Atom {
			continue
		}
		for _, t := range partners {
			if !member[t] && key(s0, t) != key(s, t) {
				return false
			}
		}
		for _, f := range hetero {
			if hetKey(d(s0.Atom, f)) != hetKey(d(s.Atom, f)) {
				return false
			}
		}
	}
	return true
}

// hetKey identifies an H–F or H–P coupling by its number of bonds, given
// the heavy-atom distance, or 0 when it is too remote to count.
func hetKey(dist int) int {
	if dist < 0 || dist+1 > 4 {
		return 0
	}
	return dist + 1
}

// envPairTags marks pairs of topologically equivalent groups that NMR
// nevertheless tells apart, so that the refinement in envClasses parts them
// and everything in their branches:
//
//   - the two groups on an amide nitrogen, cis and trans to the carbonyl O
//     (slow C–N rotation: the two N-CH3 of DMF and DMA give two signals),
//     also in thioamides, carbamates and dithiocarbamates; ureas rotate
//     faster and are left alone;
//   - diastereotopic groups: two like groups on an sp3 carbon whose other
//     two positions differ, when a stereocentre lies within two bonds (the
//     isopropyl CH3 of valine and leucine), or when the carbon is in a ring
//     of at most 8 atoms whose faces differ (1,1,3-trimethylcyclohexane).
//
// Which member of a pair is first is arbitrary (the lower atom index); the
// partition does not depend on it. It returns nil when there is no pair.
func (m *Mol) envPairTags(cls []int) []int {
	var tags []int
	for x := range m.Atoms {
		g1, g2, ok := m.amidePair(x, cls)
		if !ok {
			g1, g2, ok = m.diastereotopicPair(x, cls)
		}
		if !ok {
			continue
		}
		if tags == nil {
			tags = make([]int, len(m.Atoms))
		}
		tags[min(g1, g2)], tags[max(g1, g2)] = 1, 2
	}
	return tags
}

// amideN returns the acyl carbon of x when x is an amide nitrogen: neutral,
// non-aromatic, singly bonded with three positions, bonded to a carbon that
// is doubly bonded to O or S and carries no other nitrogen (amides,
// thioamides, carbamates, dithiocarbamates; not ureas or guanidines).
func (m *Mol) amideN(x int) (int, bool) {
	at := &m.Atoms[x]
	if at.Element != "N" || at.Charge != 0 || m.Degree(x)+at.HCount() != 3 || !m.envSingleBonded(x) {
		return -1, false
	}
	for _, c := range m.Neighbors(x) {
		if m.Atoms[c].Element != "C" || m.Atoms[c].Aromatic {
			continue
		}
		acyl, other := false, true
		for _, bi := range m.adj[c] {
			b := &m.Bonds[bi]
			o := b.Other(c)
			switch el := m.Atoms[o].Element; {
			case b.Order == 2 && (el == "O" || el == "S"):
				acyl = true
			case o != x && el == "N":
				other = false
			}
		}
		if acyl && other {
			return c, true
		}
	}
	return -1, false
}

// amidePair returns the two like heavy groups on amide nitrogen x.
func (m *Mol) amidePair(x int, cls []int) (int, int, bool) {
	c, ok := m.amideN(x)
	if !ok || m.Degree(x) != 3 {
		return 0, 0, false
	}
	var g []int
	for _, o := range m.Neighbors(x) {
		if o != c {
			g = append(g, o)
		}
	}
	if cls[g[0]] != cls[g[1]] {
		return 0, 0, false
	}
	return g[0], g[1], true
}

// diastereotopicPair returns the two like groups of a prochiral carbon x
// (see prochiralPair) when they are diastereotopic by the rule documented
// on envPairTags.
func (m *Mol) diastereotopicPair(x int, cls []int) (int, int, bool) {
	if m.Atoms[x].Element != "C" {
		return 0, 0, false
	}
	g1, g2, ok := m.prochiralPair(x, cls)
	if !ok {
		return 0, 0, false
	}
	if m.nearStereocentre(x, g1, g2, cls) {
		return g1, g2, true
	}
	var rest []int
	for _, a := range m.Neighbors(x) {
		if a != g1 && a != g2 {
			rest = append(rest, a)
		}
	}
	if len(rest) != 2 {
		return 0, 0, false
	}
	ring := m.envSmallestRing(x, rest[0], rest[1])
	if ring == nil || len(ring) > 8 || slices.Contains(ring, g1) || slices.Contains(ring, g2) {
		return 0, 0, false
	}
	in := make(map[int]bool, len(ring))
	for _, r := range ring {
		in[r] = true
	}
	for _, r := range ring {
		if r != x && m.faceDifferentiating(r, in, cls) {
			return g1, g2, true
		}
	}
	return 0, 0, false
}

// nearStereocentre reports whether a stereocentre lies within two bonds of
// x, outside the like groups g1 and g2, and is the only atom of its
// symmetry class. A stereocentre with a topological twin may be mapped onto
// it by a mirror or a C2 axis that also swaps g1 and g2 (the bridgehead
// neighbours of cis-decalin), a case this rule leaves alone.
func (m *Mol) nearStereocentre(x, g1, g2 int, cls []int) bool {
	count := make(map[int]int)
	for _, c := range cls {
		count[c]++
	}
	for y, d := range m.symDistances(x) {
		if d >= 1 && d <= stereoReach && y != g1 && y != g2 && count[cls[y]] == 1 && m.stereocentre(y, cls) {
			return true
		}
	}
	return false
}
