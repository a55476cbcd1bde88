package graph

import "fmt"

// Valence rules.
//
// Implicit hydrogens of organic-subset atoms follow OpenSMILES 3.1.5: the
// smallest normal valence at least as large as the bonded valence. Charged
// atoms are treated like the isoelectronic neutral atom of the same row
// ([NH4+] like C, [O-] like F, [CH-] like N), the convention RDKit also uses
// for its valence checks. A neutral nitrogen with bonded valence 4 is
// rejected rather than given a fifth bond to hydrogen.

// pGroup returns the periodic-table group (13–18) and row of a p-block
// element, or group 1 row 1 for hydrogen, or 0, 0 otherwise.
func pGroup(z int) (group, row int) {
	switch {
	case z == 1:
		return 1, 1
	case z >= 5 && z <= 10:
		return z - 5 + 13, 2
	case z >= 13 && z <= 18:
		return z - 13 + 13, 3
	case z >= 31 && z <= 36:
		return z - 31 + 13, 4
	case z >= 49 && z <= 54:
		return z - 49 + 13, 5
	case z >= 81 && z <= 86:
		return z - 81 + 13, 6
	}
	return 0, 0
}

// Valence lists, shared: callers must not modify them.
var (
	val0    = []int{0}
	val1    = []int{1}
	val2    = []int{2}
	val3    = []int{3}
	val4    = []int{4}
	val35   = []int{3, 5}
	val246  = []int{2, 4, 6}
	val1357 = []int{1, 3, 5, 7}
)

// valences returns the normal valences of element z with the given formal
// charge, or nil when there is no rule (metals, noble-gas compounds,
// charges that leave the row). The list ascends and must not be modified.
func valences(z, charge int) []int {
	g, row := pGroup(z)
	if g == 0 {
		return nil
	}
	if g == 18 {
		return nil // noble-gas compounds: no rule
	}
	if g == 1 {
		if charge == 0 {
			return val1
		}
		return val0
	}
	g -= charge
	if g < 13 || g > 18 {
		return nil
	}
	if row == 2 {
		switch g {
		case 13:
			return val3
		case 14:
			return val4
		case 15:
			return val35 // 5 only for nitro/N-oxide written uncharged
		case 16:
			return val2
		case 17:
			return val1
		}
		return val0
	}
	switch g {
	case 13:
		return val3
	case 14:
		return val4
	case 15:
		return val35
	case 16:
		return val246
	case 17:
		return val1357
	}
	return val0
}

// valenceElectrons returns the outer-shell electrons of a p-block atom after
// its formal charge, or -1 when not defined.
func valenceElectrons(z, charge int) int {
	g, _ := pGroup(z)
	if g < 13 {
		return -1
	}
	return g - 10 - charge
}

// bondedValence returns the sum of bond orders at a, counting bonds still
// marked aromatic (before kekulization) as 1, plus all hydrogens.
func (m *Mol) bondedValence(a int) int {
	s := m.Atoms[a].HCount()
	for _, bi := range m.adj[a] {
		b := &m.Bonds[bi]
		if b.Aromatic && !m.kekulized {
			s++
		} else {
			s += b.Order
		}
	}
	return s
}

// assignValences fills ImplicitH of organic-subset atoms, decides which
// written-aromatic atoms take a double bond in the Kekulé form (m.pi), and
// checks every atom's valence. It returns all problems found.
func (m *Mol) assignValences() []*AtomError {
	var errs []*AtomError
	for a := range m.Atoms {
		if err := m.assignAtom(a); err != nil {
			errs = append(errs, err)
		}
	}
	return errs
}

func (m *Mol) assignAtom(a int) *AtomError {
	at := &m.Atoms[a]
	z := AtomicNumber(at.Element)
	if z < 0 {
		return m.atomErr(a, fmt.Sprintf("unknown element %q", at.Element))
	}
	if z == 0 {
		// An aromatic wildcard may take a double bond (see kekulize).
		m.pi[a] = at.Aromatic && m.bondedValence(a) < 4
		return nil
	}
	if !at.Bracket {
		at.ImplicitH = 0
	}
	bs := m.bondedValence(a)
	vs := valences(z, at.Charge)
	if vs == nil {
		if at.Aromatic {
			return m.atomErr(a, fmt.Sprintf("element %s cannot be aromatic", at.Element))
		}
		return nil
	}
	if z == 7 && at.Charge == 0 && bs == 4 {
		return m.valenceErr(a, bs)
	}
	if at.Aromatic {
		return m.assignAromatic(a, bs, vs)
	}
	if at.Bracket {
		if bs > vs[len(vs)-1] {
			return m.valenceErr(a, bs)
		}
		return nil
	}
	for i, v := range vs {
		if v >= bs {
			if i > 0 && v != bs && fillsFirstOnly(z, at.Charge) {
				break
			}
			at.ImplicitH = v - bs
			return nil
		}
	}
	return m.valenceErr(a, bs)
}

// fillsFirstOnly reports elements whose higher valences are accepted only
// when written out in full (Cl and Br: OCl(=O)(=O)=O is perchloric acid,
// but C=Cl is an error rather than C=[ClH]), as RDKit does.
func fillsFirstOnly(z, charge int) bool { return charge == 0 && (z == 17 || z == 35) }

// assignAromatic handles an atom written aromatic: it takes a double bond
// when its first normal valence leaves room for one (c, n, [nH+], [o+]),
// and otherwise contributes its lone pair ([nH], o, s, substituted n).
func (m *Mol) assignAromatic(a, bs int, vs []int) *AtomError {
	at := &m.Atoms[a]
	v0 := vs[0]
	switch {
	case bs+1 <= v0:
		m.pi[a] = true
		if !at.Bracket {
			at.ImplicitH = v0 - bs - 1
		}
	case bs <= vs[len(vs)-1]:
		if !at.Bracket {
			for _, v := range vs {
				if v >= bs {
					at.ImplicitH = v - bs
					break
				}
			}
		}
	default:
		return m.valenceErr(a, bs)
	}
	return nil
}

func (m *Mol) valenceErr(a, bs int) *AtomError {
	at := &m.Atoms[a]
	sym := at.Element
	if at.Charge != 0 {
		sym = fmt.Sprintf("%s%s", sym, chargeString(at.Charge))
	}
	noun := "bonds"
	if bs == 1 {
		noun = "bond"
	}
	msg := fmt.Sprintf("impossible valence for %s (%d %s", sym, bs, noun)
	if h := at.HCount(); h > 0 {
		msg += fmt.Sprintf(" including %d H", h)
	}
	msg += ")"
	switch {
	case at.Charge != 0:
	case sym == "N" && bs == 4:
		msg += "; a four-bonded nitrogen is written [N+] or [NH+]"
	case sym == "O" && bs == 3:
		msg += "; a three-bonded oxygen is written [O+] or [OH+]"
	case sym == "C" && bs > 4:
		msg += "; check the bond symbols and branches at this carbon"
	}
	return m.atomErr(a, msg)
}

func (m *Mol) atomErr(a int, msg string) *AtomError {
	return &AtomError{Atom: a, Pos: m.Atoms[a].Pos, Msg: msg}
}

// chargeString formats a charge as "+", "-", "2+", "3-"; "" for zero.
func chargeString(c int) string {
	switch {
	case c == 0:
		return ""
	case c == 1:
		return "+"
	case c == -1:
		return "-"
	case c > 0:
		return fmt.Sprintf("%d+", c)
	}
	return fmt.Sprintf("%d-", -c)
}
