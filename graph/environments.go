package graph

import (
	"slices"
	"strconv"
)

// Proton is one hydrogen: its heavy atom and its index among that atom's
// hydrogens (0 … HCount-1).
type Proton struct {
	Atom, Index int
}

// Environment is a set of chemically equivalent protons.
type Environment struct {
	Label                  string   // "A", "B", … "Z", "AA", … in order of the first proton
	Atoms                  []int    // heavy atoms carrying these H, ascending
	Protons                []Proton // ordered by (Atom, Index)
	NH                     int      // number of protons
	Kind                   string   // CH3, CH2, CH, =CH2, =CH, ArH, CHO, ≡CH, OH, NH, NH2, COOH, SH, …
	Exchangeable           bool     // H on O, N or S (and HCl, HBr, … of salts)
	MagneticallyEquivalent bool     // every member couples alike to every other spin
}

// Environments groups the hydrogens of the molecule into chemically distinct
// sets, ordered by their first proton (atom, index) and labelled A, B, ….
//
// Protons start in one set per symmetry class of their heavy atom, refined by
// double-bond geometry (so that E/Z-distinct vinyl groups part) and by pairs
// of like groups that NMR tells apart (see envPairTags: the two groups on an
// amide N, as in DMF; diastereotopic groups such as the isopropyl CH3 of
// valine). Sets are then split where NMR distinguishes the hydrogens of one
// atom although topology does not:
//
//   - the two H of a =CH2 group when they are cis to different groups;
//   - the two H of a CH2 group that are diastereotopic: the carbon is sp3
//     and either (a) it has two heavy neighbours of different symmetry
//     class and a stereocentre lies within two bonds of it (an atom with a
//     written @ or @@, or an sp3 atom with four substituents of different
//     class), or (b) it lies in a ring of at most 8 atoms whose two faces
//     differ: another sp3 ring member carries two different groups outside
//     the ring (methylcyclohexane, cyclohexanol, decalin), or (c) it is one
//     of two like groups on a prochiral centre, or bonded to one (the OCH2
//     of CH3CH(OCH2CH3)2 or of (EtO)2P(S)OAr, the CH2 of 3-pentylamine).
//     Stereocentres include written @/@@ marks, saturated atoms with four
//     different groups and sulfoxides with two different groups;
//   - the two H of a primary amide NH2 (cis and trans to O).
//
// Ethyl groups of achiral molecules, cyclohexane and cyclohexanone are not
// split. The rule is deliberately conservative: stereocentres more than two
// bonds away and meso or C2-related pairs (pentane-2,4-diol CH2) are not
// considered, and ring flipping and fast rotation are assumed.
//
// The member of a split pair with proton Index 0 goes to the first set, and
// of two like groups the one with the lower atom index gets the first tag.
// Where a molecule holds several such pairs related by symmetry (the two
// amides of N,N,N',N'-tetramethylterephthalamide) the pairing across them
// cannot be read from a SMILES and follows atom order; set sizes and kinds
// do not depend on it. See envMagnetic for the MagneticallyEquivalent flag.
func (m *Mol) Environments() []Environment {
	cls := m.SymmetryClasses()
	bonds := m.alkBonds(cls)
	ecls := m.envClasses(cls, bonds)
	type group struct {
		key     [2]int
		protons []Proton
	}
	var groups []*group
	index := map[[2]int]*group{}
	for a := range m.Atoms {
		for i := 0; i < m.Atoms[a].HCount(); i++ {
			p := Proton{a, i}
			key := [2]int{ecls[a], m.envSubKey(p, ecls, cls, bonds)}
			g := index[key]
			if g == nil {
				g = &group{key: key}
				index[key] = g
				groups = append(groups, g)
			}
			g.protons = append(g.protons, p)
		}
	}
	envs := make([]Environment, len(groups))
	for k, g := range groups {
		envs[k] = m.envBuild(k, g.protons)
	}
	m.envMagnetic(envs, bonds)
	return envs
}

// envLabel returns the spreadsheet-style label of the k-th set: A … Z, AA, AB ….
func envLabel(k int) string {
	s := ""
	for k++; k > 0; k = (k - 1) / 26 {
		s = string(rune('A'+(k-1)%26)) + s
	}
	return s
}

func (m *Mol) envBuild(k int, ps []Proton) Environment {
	var atoms []int
	for _, p := range ps {
		if len(atoms) == 0 || atoms[len(atoms)-1] != p.Atom {
			atoms = append(atoms, p.Atom)
		}
	}
	kind, exch := m.protonKind(ps[0].Atom)
	return Environment{
		Label: envLabel(k), Atoms: atoms, Protons: ps, NH: len(ps),
		Kind: kind, Exchangeable: exch,
	}
}

// envClasses refines the symmetry classes by double-bond geometry and by
// pairs of like groups that NMR tells apart. Each carbon of a C=C gets, as
// an extra invariant, the sorted pairs (class of a position on it, class of
// the position cis to it), hydrogens counting as -1; each heavy substituent
// of a C=C gets the class of the position cis to it (so the two CH3 of a
// =C(CH3)2 group part when the other carbon carries two different groups);
// pairs from envPairTags get a tag 1 or 2.
func (m *Mol) envClasses(cls []int, bonds []alkBond) []int {
	tags := m.envPairTags(cls)
	if len(bonds) == 0 && tags == nil {
		return cls
	}
	cur := cls
	// Each round starts from the previous classes, so the partition only
	// gets finer and the loop ends after at most len(m.Atoms) rounds.
	for {
		extra := make([][][]int, len(m.Atoms))
		for _, ab := range bonds {
			extra[ab.a] = append(extra[ab.a], alkDescriptor(ab.sa, ab.sb, cur))
			extra[ab.b] = append(extra[ab.b], alkDescriptor(ab.sb, ab.sa, cur))
			for i := range 2 {
				if s := ab.sa[i].atom; s >= 0 {
					extra[s] = append(extra[s], []int{-2, alkCode(ab.sb[i], cur)})
				}
				if s := ab.sb[i].atom; s >= 0 {
					extra[s] = append(extra[s], []int{-2, alkCode(ab.sa[i], cur)})
				}
			}
		}
		init := make([][]int, len(m.Atoms))
		for a := range init {
			init[a] = []int{cur[a], 0}
			if tags != nil {
				init[a][1] = tags[a]
			}
			// Sorted, so that the order of the bonds does not matter.
			slices.SortFunc(extra[a], slices.Compare[[]int])
			for _, x := range extra[a] {
				init[a] = append(init[a], len(x))
				init[a] = append(init[a], x...)
			}
		}
		next := m.symRefine(init)
		if slices.Max(next) == slices.Max(cur) {
			return next
		}
		cur = next
	}
}

func alkCode(s alkSlot, cls []int) int {
	if s.atom < 0 {
		return -1
	}
	return cls[s.atom]
}

func alkDescriptor(own, other [2]alkSlot, cls []int) []int {
	p := [2][2]int{}
	for i := range own {
		p[i] = [2]int{alkCode(own[i], cls), alkCode(other[i], cls)}
	}
	if slices.Compare(p[0][:], p[1][:]) > 0 {
		p[0], p[1] = p[1], p[0]
	}
	return []int{p[0][0], p[0][1], p[1][0], p[1][1]}
}

// envSubKey separates protons of one atom class that NMR distinguishes:
// =CH2 hydrogens by the class of the group cis to them, diastereotopic CH2
// and primary amide NH2 hydrogens by their index.
func (m *Mol) envSubKey(p Proton, ecls, cls []int, bonds []alkBond) int {
	at := &m.Atoms[p.Atom]
	if at.HCount() != 2 {
		return 0
	}
	if ab, i, onA, ok := alkFind(bonds, p); ok {
		other := ab.sb
		if !onA {
			other = ab.sa
		}
		return 2 + alkCode(other[i], ecls) // ≥ 1, distinct from 0
	}
	if m.diastereotopic(p.Atom, cls) {
		return -1 - p.Index
	}
	if _, ok := m.amideN(p.Atom); ok {
		return -1 - p.Index // primary amide NH2: cis and trans to O
	}
	return 0
}

// protonKind names the kind of hydrogen carried by atom a and says whether
// it exchanges (H on O, N, S, and hydrogen halides).
func (m *Mol) protonKind(a int) (string, bool) {
	at := &m.Atoms[a]
	h := at.HCount()
	switch at.Element {
	case "C":
		return m.carbonKind(a, h), false
	case "O":
		if h >= 2 {
			return "H2O", true
		}
		if m.envAcidOH(a) {
			return "COOH", true
		}
		return "OH", true
	case "N":
		return envCount("NH", h) + envCharge(at.Charge), true
	case "S":
		return envCount("SH", h), true
	case "F", "Cl", "Br", "I":
		return "H" + at.Element, true // hydrogen halide, as in a hydrochloride salt
	}
	return envCount(at.Element+"H", h), false
}

func envCount(base string, h int) string {
	if h <= 1 {
		return base
	}
	return base + strconv.Itoa(h)
}

func envCharge(c int) string {
	switch {
	case c == 1:
		return "+"
	case c == -1:
		return "-"
	case c > 1:
		return strconv.Itoa(c) + "+"
	case c < -1:
		return strconv.Itoa(-c) + "-"
	}
	return ""
}

func (m *Mol) carbonKind(a, h int) string {
	if m.Atoms[a].Aromatic {
		return "ArH"
	}
	var dbl, tri bool
	var dblO bool
	for _, bi := range m.adj[a] {
		b := &m.Bonds[bi]
		switch b.Order {
		case 2:
			dbl = true
			if m.Atoms[b.Other(a)].Element == "O" {
				dblO = true
			}
		case 3:
			tri = true
		}
	}
	switch {
	case dblO:
		return "CHO"
	case tri:
		return "≡CH"
	case dbl:
		return envCount("=CH", h)
	}
	return envCount("CH", h)
}

// envAcidOH reports whether oxygen o is the OH of a carboxylic acid: bonded
// to a carbon that also bears a doubly bonded oxygen.
func (m *Mol) envAcidOH(o int) bool {
	for _, c := range m.Neighbors(o) {
		if m.Atoms[c].Element != "C" {
			continue
		}
		for _, bi := range m.adj[c] {
			b := &m.Bonds[bi]
			x := b.Other(c)
			if x != o && b.Order == 2 && m.Atoms[x].Element == "O" {
				return true
			}
		}
	}
	return false
}
