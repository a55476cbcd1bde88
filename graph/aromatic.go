package graph

import "slices"

// Aromaticity perception on the Kekulé form.
//
// The model follows the one RDKit uses by default (documented in the RDKit
// Book, "Aromaticity"): a ring, or a connected combination of up to six
// fused rings, is aromatic when every atom is a candidate and the π
// electrons sum to 4n+2 (see perceiveAromaticity). Per atom:
//
//   - a double bond that lies in a ring: 1 electron;
//   - an exocyclic double bond to a more electronegative atom (C=O, C=N,
//     C=S): 0 electrons; to carbon: 1 electron;
//   - only single bonds: a lone pair gives 2 (pyrrole N, furan O, thiophene
//     S, [cH-]), an empty p orbital 0 ([cH+], three-bonded B);
//   - not a candidate: more than three neighbours including H, a triple bond
//     or two multiple bonds, a bonded valence other than the first normal
//     valence of the (isoelectronic) element, an unpaired electron, or an
//     element outside B, C, N, O, P, S, As, Se, Te.

// aromaticElements are the elements that may be aromatic.
var aromaticElements = map[string]bool{"B": true, "C": true, "N": true, "O": true, "P": true,
	"S": true, "As": true, "Se": true, "Te": true}

// piElectrons returns the π electrons atom a gives to an aromatic ring, or
// -1 when it cannot be part of one.
func (m *Mol) piElectrons(a int) int {
	at := &m.Atoms[a]
	if at.Element == "*" {
		return m.wildElectrons(a)
	}
	if !aromaticElements[at.Element] || m.Degree(a)+at.HCount() > 3 {
		return -1
	}
	z := AtomicNumber(at.Element)
	vs := valences(z, at.Charge)
	bs := at.HCount()
	ringDouble, exoDouble, multiple := false, -1, 0
	for _, bi := range m.adj[a] {
		b := &m.Bonds[bi]
		bs += b.Order
		switch {
		case b.Order == 2:
			multiple++
			if m.ringBond[bi] {
				ringDouble = true
			} else {
				exoDouble = b.Other(a)
			}
		case b.Order > 2:
			return -1
		}
	}
	if vs == nil || bs != vs[0] || multiple > 1 {
		return -1
	}
	switch {
	case ringDouble:
		return 1
	case exoDouble >= 0:
		if m.Atoms[exoDouble].Element == "C" {
			return 1
		}
		return 0
	}
	switch lone := valenceElectrons(z, at.Charge) - bs; {
	case lone >= 2:
		return 2
	case lone == 0:
		return 0
	}
	return -1
}

// wildPi marks a wildcard atom that may give 0, 1 or 2 π electrons.
const wildPi = 1000

// wildElectrons: a wildcard with a ring double bond gives 1 electron; one
// with only single bonds stands for whatever atom would make its ring
// aromatic (OpenSMILES 3.1.6), so it may give 0 to 2.
func (m *Mol) wildElectrons(a int) int {
	for _, bi := range m.adj[a] {
		if m.Bonds[bi].Order == 2 && m.ringBond[bi] {
			return 1
		}
		if m.Bonds[bi].Order > 2 {
			return -1
		}
	}
	if m.Degree(a)+m.Atoms[a].HCount() > 3 {
		return -1
	}
	return wildPi
}

// perceiveAromaticity sets Atom.Aromatic and Bond.Aromatic from the Kekulé
// orders and the rings.
//
// Rings whose atoms are all candidates are grouped into fused systems
// (rings sharing a bond). In each system every connected combination of up
// to six rings is tested, smallest first: the π electrons of the atoms that
// lie in one or two of the combined rings (atoms shared by three rings have
// no p orbital on the perimeter) must sum to 4n+2; if so, the atoms and
// bonds of all rings of the combination are aromatic. This is the fused-ring
// procedure of RDKit's default model, which we are checked against.
func (m *Mol) perceiveAromaticity() {
	for a := range m.Atoms {
		m.Atoms[a].Aromatic = false
	}
	for bi := range m.Bonds {
		m.Bonds[bi].Aromatic = false
	}
	if len(m.rings) == 0 {
		return
	}
	rs := ringSet{
		atoms: append(slices.Clip(m.rings), m.extraRings...),
		bonds: append(slices.Clip(m.ringBonds), m.extraRingBonds...),
	}
	elec := make([]int, len(m.Atoms))
	for a := range m.Atoms {
		elec[a] = -2 // not computed
	}
	var cand []int
	for ri, r := range rs.atoms {
		ok := true
		for _, a := range r {
			if elec[a] == -2 {
				elec[a] = m.piElectrons(a)
			}
			ok = ok && elec[a] >= 0
		}
		if ok {
			cand = append(cand, ri)
		}
	}
	occ := make([]int, len(m.Atoms)) // scratch for aromaticSystem
	for _, sys := range rs.fusedGroups(cand) {
		m.aromaticSystem(rs, sys, elec, occ)
	}
}

// ringSet is the SSSR plus its symmetrizing rings, as atoms and bonds.
type ringSet struct{ atoms, bonds [][]int }

func huckel(n int) bool { return n >= 2 && (n-2)%4 == 0 }

// huckelRange reports whether sum plus 0–2 electrons from each of wild
// wildcard atoms can reach 4n+2.
func huckelRange(sum, wild int) bool {
	for n := sum; n <= sum+2*wild; n++ {
		if huckel(n) {
			return true
		}
	}
	return false
}

// maxFused is the largest number of rings combined in one Hückel test.
const maxFused = 6

// fusedGroups splits the candidate rings into groups joined by shared bonds.
func (rs ringSet) fusedGroups(cand []int) [][]int {
	group := make([]int, len(cand))
	for i := range group {
		group[i] = -1
	}
	var out [][]int
	for i := range cand {
		if group[i] >= 0 {
			continue
		}
		g := len(out)
		group[i] = g
		members := []int{i}
		for k := 0; k < len(members); k++ {
			for j := range cand {
				if group[j] < 0 && sharedBonds(rs.bonds[cand[members[k]]], rs.bonds[cand[j]]) > 0 {
					group[j] = g
					members = append(members, j)
				}
			}
		}
		rings := make([]int, len(members))
		for k, mi := range members {
			rings[k] = cand[mi]
		}
		slices.Sort(rings)
		out = append(out, rings)
	}
	return out
}

// aromaticSystem runs the Hückel test on the connected combinations of the
// rings of one fused system.
func (m *Mol) aromaticSystem(rs ringSet, sys, elec, occ []int) {
	total := 0 // distinct bonds of the system
	for i, ri := range sys {
		for _, b := range rs.bonds[ri] {
			seen := false
			for _, rj := range sys[:i] {
				seen = seen || slices.Contains(rs.bonds[rj], b)
			}
			if !seen {
				total++
			}
		}
	}
	done := 0
	mark := func(ri int) {
		for _, a := range rs.atoms[ri] {
			m.Atoms[a].Aromatic = true
		}
		for _, b := range rs.bonds[ri] {
			if !m.Bonds[b].Aromatic {
				m.Bonds[b].Aromatic = true
				done++
			}
		}
	}
	test := func(combo []int) {
		for _, ri := range combo {
			for _, a := range rs.atoms[ri] {
				occ[a]++
			}
		}
		sum, wild, real := 0, 0, false
		for _, ri := range combo {
			for _, a := range rs.atoms[ri] {
				n := occ[a]
				occ[a] = 0 // count each atom once, and reset the scratch
				switch {
				case n == 0, n > 2:
				case elec[a] == wildPi:
					wild++
				default:
					sum += elec[a]
					real = true
				}
			}
		}
		if real && huckelRange(sum, wild) {
			for _, ri := range combo {
				mark(ri)
			}
		}
	}
	adj := rs.neighbours(sys)
	level := make([][]int, 0, len(sys)) // connected combinations of the current size
	for _, ri := range sys {
		level = append(level, []int{ri})
	}
	for k := 1; k <= maxFused && len(level) > 0; k++ {
		if done >= total || (k > 2 && len(sys) > 300) {
			return
		}
		for _, combo := range level {
			test(combo)
		}
		level = grow(level, adj)
	}
}

// neighbours maps each ring of sys to the rings of sys it shares a bond with.
func (rs ringSet) neighbours(sys []int) map[int][]int {
	adj := make(map[int][]int, len(sys))
	for i, a := range sys {
		for _, b := range sys[i+1:] {
			if sharedBonds(rs.bonds[a], rs.bonds[b]) > 0 {
				adj[a] = append(adj[a], b)
				adj[b] = append(adj[b], a)
			}
		}
	}
	return adj
}

// grow returns the connected ring combinations one ring larger than those
// in level, each once, as ascending ring lists.
func grow(level [][]int, adj map[int][]int) [][]int {
	seen := map[string]bool{}
	var out [][]int
	key := make([]byte, 0, 64)
	for _, combo := range level {
		for _, r := range combo {
			for _, nb := range adj[r] {
				if slices.Contains(combo, nb) {
					continue
				}
				next := append(slices.Clone(combo), nb)
				slices.Sort(next)
				key = key[:0]
				for _, x := range next {
					key = append(key, byte(x), byte(x>>8), byte(x>>16))
				}
				if !seen[string(key)] {
					seen[string(key)] = true
					out = append(out, next)
				}
			}
		}
	}
	return out
}

func sharedBonds(x, y []int) int {
	n := 0
	for _, a := range x {
		for _, b := range y {
			if a == b {
				n++
			}
		}
	}
	return n
}
