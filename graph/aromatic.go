package graph

// Aromaticity perception on the Kekulé form.
//
// The model follows the one RDKit uses by default (documented in the RDKit
// Book, "Aromaticity"): a ring, or a fused pair or triple of SSSR rings
// sharing one bond, is aromatic when every atom is a candidate and the
// π electrons sum to 4n+2. Per atom:
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

// perceiveAromaticity sets Atom.Aromatic and Bond.Aromatic from the Kekulé
// orders and the SSSR.
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
	elec := make([]int, len(m.Atoms))
	for a := range m.Atoms {
		elec[a] = -2 // not computed
	}
	count := func(atoms []int) int {
		sum := 0
		for _, a := range atoms {
			if elec[a] == -2 {
				elec[a] = m.piElectrons(a)
			}
			if elec[a] < 0 {
				return -1
			}
			sum += elec[a]
		}
		return sum
	}
	arom := make([]bool, len(m.rings))
	for ri, r := range m.rings {
		if huckel(count(r)) {
			arom[ri] = true
			m.markAromatic(ri)
		}
	}
	m.fusedAromaticity(arom, count)
}

func huckel(n int) bool { return n >= 2 && (n-2)%4 == 0 }

func (m *Mol) markAromatic(ri int) {
	for _, a := range m.rings[ri] {
		m.Atoms[a].Aromatic = true
	}
	for _, bi := range m.ringBonds[ri] {
		m.Bonds[bi].Aromatic = true
	}
}

// fusedAromaticity tests unions of two and three rings that share a bond
// (azulene, and fused systems whose single rings fail the 4n+2 count).
func (m *Mol) fusedAromaticity(arom []bool, count func([]int) int) {
	nr := len(m.rings)
	if nr < 2 || nr > 40 {
		return
	}
	shares := func(i, j int) bool { return sharedBonds(m.ringBonds[i], m.ringBonds[j]) == 1 }
	union := func(rs ...int) []int {
		seen := map[int]bool{}
		var out []int
		for _, r := range rs {
			for _, a := range m.rings[r] {
				if !seen[a] {
					seen[a] = true
					out = append(out, a)
				}
			}
		}
		return out
	}
	for i := 0; i < nr; i++ {
		for j := i + 1; j < nr; j++ {
			if (arom[i] && arom[j]) || !shares(i, j) {
				continue
			}
			if huckel(count(union(i, j))) {
				m.markAromatic(i)
				m.markAromatic(j)
			}
		}
	}
	if nr > 8 {
		return
	}
	for i := 0; i < nr; i++ {
		for j := i + 1; j < nr; j++ {
			for k := j + 1; k < nr; k++ {
				links := b2n(shares(i, j)) + b2n(shares(i, k)) + b2n(shares(j, k))
				if links < 2 || (arom[i] && arom[j] && arom[k]) {
					continue
				}
				if huckel(count(union(i, j, k))) {
					m.markAromatic(i)
					m.markAromatic(j)
					m.markAromatic(k)
				}
			}
		}
	}
}

func b2n(b bool) int {
	if b {
		return 1
	}
	return 0
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
