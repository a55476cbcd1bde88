package smiles

import (
	"fmt"

	"shiftwise/graph"
)

// checkBondDirs looks at the '/' and '\' marks around each double bond. Two
// marked single bonds on the same end that point the same way as seen from
// that end contradict each other (OpenSMILES 3.9.3: C/C(\F)=C/F is
// invalid); the marks around that double bond are dropped with a warning,
// so its geometry counts as unspecified.
func (p *parser) checkBondDirs(m *graph.Mol) {
	for bi := range m.Bonds {
		db := &m.Bonds[bi]
		if db.Order != 2 || db.Aromatic {
			continue
		}
		for _, end := range []int{db.A, db.B} {
			if pos, bad := conflictingDirs(m, end, bi); bad {
				p.warn(pos, fmt.Sprintf("conflicting '/' and '\\' marks around the double bond at col %d; its geometry is ignored", db.Pos+1))
				clearDirs(m, db.A, bi)
				clearDirs(m, db.B, bi)
				break
			}
		}
	}
}

// dirFrom returns the mark of bond b as seen from atom a.
func dirFrom(b *graph.Bond, a int) graph.BondDir {
	if b.A == a || b.Dir == graph.DirNone {
		return b.Dir
	}
	if b.Dir == graph.DirUp {
		return graph.DirDown
	}
	return graph.DirUp
}

func conflictingDirs(m *graph.Mol, a, skip int) (int, bool) {
	var seen [3]bool
	for _, bi := range m.BondsOf(a) {
		b := &m.Bonds[bi]
		if bi == skip || b.Order != 1 {
			continue
		}
		d := dirFrom(b, a)
		if d == graph.DirNone {
			continue
		}
		if seen[d] {
			return max(b.Pos, 0), true
		}
		seen[d] = true
	}
	return 0, false
}

func clearDirs(m *graph.Mol, a, skip int) {
	for _, bi := range m.BondsOf(a) {
		if bi != skip {
			m.Bonds[bi].Dir = graph.DirNone
		}
	}
}
