package graph

import (
	"sort"
	"strconv"
	"strings"
)

// Formula returns the molecular formula in Hill order (C, then H, then the
// other elements alphabetically; without carbon, all alphabetically), with
// the net charge appended ("+", "2-"). Isotope labels are counted under
// their element; wildcard atoms count as "*" (sorted with the symbols, as
// RDKit writes them).
func (m *Mol) Formula() string {
	counts := map[string]int{}
	charge := 0
	for a := range m.Atoms {
		at := &m.Atoms[a]
		charge += at.Charge
		if h := at.HCount(); h > 0 {
			counts["H"] += h
		}
		counts[at.Element]++
	}
	syms := make([]string, 0, len(counts))
	for s := range counts {
		if !(counts["C"] > 0 && (s == "C" || s == "H")) {
			syms = append(syms, s)
		}
	}
	sort.Strings(syms)
	if counts["C"] > 0 {
		front := []string{"C"}
		if counts["H"] > 0 {
			front = append(front, "H")
		}
		syms = append(front, syms...)
	}
	var sb strings.Builder
	for _, s := range syms {
		sb.WriteString(s)
		if n := counts[s]; n > 1 {
			sb.WriteString(strconv.Itoa(n))
		}
	}
	sb.WriteString(chargeString(charge))
	return sb.String()
}

// AverageMass returns the molecular weight in g/mol from the IUPAC 2021
// standard atomic weights (see elements.go). Atoms with an isotope label
// count with that isotope's mass. Electron masses are ignored.
func (m *Mol) AverageMass() float64 {
	sum := 0.0
	for a := range m.Atoms {
		at := &m.Atoms[a]
		if at.Isotope > 0 {
			sum += IsotopeMass(at.Element, at.Isotope)
		} else {
			sum += StandardWeight(at.Element)
		}
		sum += float64(at.HCount()) * StandardWeight("H")
	}
	return sum
}

// MonoisotopicMass returns the mass in u of the molecule made of the most
// abundant isotope of each element (AME2020 masses, see elements.go), or of
// the labelled isotope where one is written. For ions the mass of the
// missing or extra electrons is taken into account (electron mass
// 0.000548579909 u, CODATA 2018), as mass spectrometry needs.
func (m *Mol) MonoisotopicMass() float64 {
	const electron = 0.000548579909
	sum := 0.0
	for a := range m.Atoms {
		at := &m.Atoms[a]
		sum -= float64(at.Charge) * electron
		sum += IsotopeMass(at.Element, at.Isotope)
		sum += float64(at.HCount()) * IsotopeMass("H", 0)
	}
	return sum
}

// Components returns the connected components (the '.'-separated parts of
// a SMILES such as a salt), each as ascending atom indices, ordered by their
// first atom.
func (m *Mol) Components() [][]int {
	seen := make([]bool, len(m.Atoms))
	var out [][]int
	for s := range m.Atoms {
		if seen[s] {
			continue
		}
		comp := []int{s}
		seen[s] = true
		for i := 0; i < len(comp); i++ {
			for _, bi := range m.adj[comp[i]] {
				if o := m.Bonds[bi].Other(comp[i]); !seen[o] {
					seen[o] = true
					comp = append(comp, o)
				}
			}
		}
		sort.Ints(comp)
		out = append(out, comp)
	}
	return out
}
