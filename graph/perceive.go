package graph

import "slices"

// Perceive completes a molecule built atom by atom (as the SMILES parser
// does): it finds the rings (SSSR), assigns implicit hydrogens to
// organic-subset atoms, checks valences, kekulizes atoms written aromatic,
// and perceives aromaticity on the Kekulé form, so that benzene written
// C1=CC=CC=C1 ends up aromatic like c1ccccc1.
//
// Two clean-ups happen on the way, as RDKit does them: an aromatic nitrogen
// written with a double bond to oxygen (O=n1ccccc1) becomes the
// charge-separated N-oxide, and a wildcard '*' bonded into an aromatic ring
// stands for an aromatic atom that may or may not take a double bond.
// Aromaticity follows RDKit's default model (see perceiveAromaticity), the
// reference the project is checked against.
//
// It returns nil or the first problem as a *AtomError; PerceiveAll returns
// all of them. Perceive may be called again after the molecule changes.
func (m *Mol) Perceive() error {
	if errs := m.PerceiveAll(); len(errs) > 0 {
		return errs[0]
	}
	return nil
}

// PerceiveAll is Perceive returning every problem found, in atom order
// within each stage. Kekulization is skipped when valences are wrong.
func (m *Mol) PerceiveAll() []*AtomError {
	m.perceived = false
	m.kekulized = false
	m.symClasses = nil
	m.pi = make([]bool, len(m.Atoms))
	m.findRings()
	errs := m.demoteAromatic()
	m.chargeSeparateNOxides()
	errs = append(errs, m.assignValences()...)
	if len(errs) > 0 {
		return errs
	}
	if err := m.kekulize(); err != nil {
		return []*AtomError{err}
	}
	m.perceiveAromaticity()
	m.perceived = true
	m.symClasses = m.computeSymmetryClasses()
	return nil
}

// ensureRings computes rings if Perceive has not run.
func (m *Mol) ensureRings() {
	if m.ringBond == nil || len(m.ringBond) != len(m.Bonds) || len(m.atomRings) != len(m.Atoms) {
		m.findRings()
	}
}

// Rings returns the smallest set of smallest rings, each as atom indices in
// ring order. The slices must not be modified.
func (m *Mol) Rings() [][]int {
	m.ensureRings()
	return m.rings
}

// RingBonds returns the bond indices of each ring of Rings, in ring order.
func (m *Mol) RingBonds() [][]int {
	m.ensureRings()
	return m.ringBonds
}

// InRing reports whether atom a lies on a ring.
func (m *Mol) InRing(a int) bool {
	m.ensureRings()
	return len(m.atomRings[a]) > 0
}

// RingSizes returns the sizes of the SSSR rings containing atom a, ascending.
func (m *Mol) RingSizes(a int) []int {
	m.ensureRings()
	out := make([]int, 0, len(m.atomRings[a]))
	for _, ri := range m.atomRings[a] {
		out = append(out, len(m.rings[ri]))
	}
	slices.Sort(out)
	return out
}

// BondInRing reports whether bond b lies on a ring.
func (m *Mol) BondInRing(b int) bool {
	m.ensureRings()
	return m.ringBond[b]
}

// Hybridization returns 1 (sp: a triple bond or two double bonds), 2 (sp2:
// aromatic or one double bond) or 3 (otherwise) for atom a, from the Kekulé
// orders.
func (m *Mol) Hybridization(a int) int {
	if m.Atoms[a].Aromatic {
		return 2
	}
	doubles := 0
	for _, bi := range m.adj[a] {
		switch o := m.Bonds[bi].Order; {
		case o >= 3:
			return 1
		case o == 2:
			doubles++
		}
	}
	switch {
	case doubles >= 2:
		return 1
	case doubles == 1:
		return 2
	}
	return 3
}

// chargeSeparateNOxides rewrites an aromatic nitrogen written with a double
// bond to oxygen (O=n1ccccc1) as the N-oxide [O-][n+]1ccccc1, the same
// clean-up RDKit applies, so that the ring can be kekulized.
func (m *Mol) chargeSeparateNOxides() {
	for a := range m.Atoms {
		at := &m.Atoms[a]
		if at.Element != "N" || !at.Aromatic || at.Charge != 0 {
			continue
		}
		for _, bi := range m.adj[a] {
			b := &m.Bonds[bi]
			o := &m.Atoms[b.Other(a)]
			if b.Order == 2 && !b.Aromatic && o.Element == "O" && o.Charge == 0 && m.Degree(b.Other(a)) == 1 {
				at.Charge, o.Charge, b.Order = 1, -1, 1
				break
			}
		}
	}
}
