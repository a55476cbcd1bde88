package shiftinc

import (
	"fmt"
	"math"
)

// formyl handles H on a carbon doubly bonded to O, S or N: aldehydes,
// formates, formamides, thioformyl and imines.
func (t *Table) formyl(v *view, c int, a *acc) {
	sp := func(key, label string) {
		r := t.row("special", key)
		if r == nil {
			r = t.row("special", "fallback-sp2")
			a.low = true
		}
		a.base(label, r)
	}
	if n := v.doubleTo(c, "N"); n >= 0 && !v.carbonyl(c) {
		key := "CH=N"
		for _, y := range v.nbrs(n) {
			if y == c {
				continue
			}
			switch v.el(y) {
			case "N":
				key = "CH=N-N"
			case "O":
				key = "CH=N-O"
			}
		}
		sp(key, key)
		return
	}
	if v.doubleTo(c, "O") < 0 {
		sp("HC=S", "HC=S")
		return
	}
	o := v.doubleTo(c, "O")
	key := "CHO-H"
	for _, y := range v.nbrs(c) {
		if y == o {
			continue
		}
		switch {
		case v.el(y) == "O":
			key = "HCOO"
		case v.el(y) == "N":
			key = "HCON"
		case v.el(y) == "C" && v.arom1(y):
			key = "CHO-aryl"
			if r := v.aromRing(y); r != nil && heteroRing(v, r) {
				key = "CHO-heteroaryl"
			}
		case v.el(y) == "C" && v.doubleTo(y, "C") >= 0:
			key = "CHO-vinyl"
		case v.el(y) == "C":
			key = "CHO-alkyl"
		default:
			key = "CHO-other"
		}
	}
	sp(key, key)
}

// alkyne handles ≡C–H by the group on the other alkyne carbon.
func (t *Table) alkyne(v *view, c int, a *acc) {
	y := v.tripleTo(c)
	key := "≡CH-H"
	if v.el(y) != "C" {
		key = "≡CH-other"
	}
	for _, z := range v.nbrs(y) {
		if z == c {
			continue
		}
		switch {
		case v.arom1(z):
			key = "≡CH-aryl"
		case v.carbonyl(z):
			key = "≡CH-C=O"
		case v.el(z) == "C" && (v.doubleTo(z, "C") >= 0 || v.tripleTo(z) >= 0):
			key = "≡CH-C=C"
		case v.el(z) == "C":
			key = "≡CH-alkyl"
			for _, w := range v.nbrs(z) {
				switch v.el(w) {
				case "O", "N", "S", "Cl", "Br", "I", "F":
					key = "≡CH-CH2X"
				}
			}
		default:
			key = "≡CH-other"
		}
	}
	r := t.row("special", key)
	if r == nil {
		r = t.row("special", "≡CH-other")
	}
	if r == nil {
		r = t.row("special", "fallback-sp2")
		a.low = true
	}
	a.base(key, r)
}

// exchangeable handles H on O, N and S with solvent-dependent values.
func (t *Table) exchangeable(v *view, x int, sol string, unknown bool, a *acc) {
	key := v.exchangeKey(x)
	r := t.row("exchangeable", key)
	if r == nil {
		a.base("H on "+v.el(x)+": no rule, generic", t.row("special", "fallback-other"))
		a.low = true
		return
	}
	if unknown {
		// Solvent not known: midway between CDCl3 and DMSO-d6, the two
		// usual solvents, with the half-difference added to the SD.
		if d, ok := r.BySolvent["DMSO-d6"]; ok {
			mid, half := (r.PPM+d.PPM)/2, math.Abs(d.PPM-r.PPM)/2
			sd := math.Sqrt((r.SD*r.SD+d.SD*d.SD)/2 + half*half)
			a.ppm += mid
			a.v += sd * sd
			a.rules = append(a.rules, fmt.Sprintf("%s %.2f (exchangeable; solvent unknown: between CDCl3 %.2f and DMSO-d6 %.2f)", key, mid, r.PPM, d.PPM))
			return
		}
	}
	if sv, ok := r.BySolvent[sol]; ok {
		a.ppm += sv.PPM
		a.v += sv.SD * sv.SD
		a.rules = append(a.rules, fmt.Sprintf("%s in %s %.2f (exchangeable, wide range)", key, sol, sv.PPM))
		if sol == "CD3OD" || sol == "D2O" {
			a.rules = append(a.rules, "exchanges with solvent deuterium: usually not observed (merges with HDO)")
		}
		return
	}
	a.ppm += r.PPM
	a.v += r.SD * r.SD
	a.rules = append(a.rules, fmt.Sprintf("%s %.2f (exchangeable, wide range)", key, r.PPM))
	switch {
	case unknown:
		a.note(fmt.Sprintf("solvent not recognised: CDCl3 value for %s, +0.5 uncertainty", key), 0.5)
	case sol != "CDCl3":
		a.note(fmt.Sprintf("no %s value for %s: CDCl3 value, +0.5 uncertainty", sol, key), 0.5)
	}
}

// exchangeKey names the kind of an O–H, N–H or S–H.
func (v *view) exchangeKey(x int) string {
	switch v.el(x) {
	case "O":
		return v.ohKey(x)
	case "N":
		return v.nhKey(x)
	case "S":
		for _, y := range v.nbrs(x) {
			if v.arom1(y) {
				return "SH-aryl"
			}
		}
		return "SH-alkyl"
	}
	return ""
}

func (v *view) ohKey(o int) string {
	for _, y := range v.nbrs(o) {
		switch {
		case v.carbonyl(y):
			return "COOH"
		case v.sulfonyl(y):
			return "OH-other"
		case v.el(y) == "N":
			return "OH-oxime"
		case v.arom1(y):
			if v.orthoCarbonyl(y) {
				return "OH-phenol-chelated"
			}
			return "OH-phenol"
		case v.el(y) == "C" && v.doubleTo(y, "C") >= 0:
			z := v.doubleTo(y, "C")
			for _, w := range v.nbrs(z) {
				if w != y && v.carbonyl(w) {
					return "OH-enol"
				}
			}
			return "OH-alcohol"
		case v.el(y) == "C":
			for _, z := range v.nbrs(y) {
				if z != o && v.el(z) == "O" && v.order(y, z) == 1 {
					return "OH-hemiacetal"
				}
			}
			return "OH-alcohol"
		}
	}
	return "OH-other"
}

// orthoCarbonyl reports whether an aromatic atom has a ring neighbour
// carrying a C=O group (intramolecular H bond for an OH on it).
func (v *view) orthoCarbonyl(a int) bool {
	for _, b := range v.nbrs(a) {
		if !v.arom1(b) {
			continue
		}
		for _, z := range v.nbrs(b) {
			if z != a && !v.arom1(z) && v.carbonyl(z) {
				return true
			}
		}
	}
	return false
}

func (v *view) nhKey(n int) string {
	at := &v.m.Atoms[n]
	if at.Charge > 0 {
		return "NH+"
	}
	if at.Aromatic {
		r := v.aromRing(n)
		if r != nil && len(r) == 5 {
			for _, y := range r {
				if y != n && v.el(y) != "C" {
					return "NH-azole"
				}
			}
			return "NH-pyrrole"
		}
		return "NH-lactam"
	}
	var nCO, nSO2, nAr, nHetAr int
	urea, hydrazone, amidine, enamine, chelated := false, false, false, false, false
	for _, y := range v.nbrs(n) {
		switch {
		case v.el(y) == "N" && v.doubleTo(y) >= 0:
			hydrazone = true
		case v.el(y) == "C" && !v.arom1(y) && v.doubleTo(y, "N") >= 0:
			amidine = true
		case v.el(y) == "C" && !v.arom1(y) && v.doubleTo(y, "C") >= 0:
			z := v.doubleTo(y, "C")
			for _, w := range v.nbrs(z) {
				if w != y && (v.carbonyl(w) || v.tripleTo(w) >= 0 || v.el(w) == "N" && v.m.Atoms[w].Charge > 0) {
					enamine = true
				}
			}
		}
		switch {
		case v.carbonyl(y):
			nCO++
			for _, z := range v.nbrs(y) {
				if z != n && (v.el(z) == "O" || v.el(z) == "N") && v.order(y, z) == 1 {
					urea = true
				}
			}
		case v.sulfonyl(y):
			nSO2++
		case v.arom1(y):
			nAr++
			if r := v.aromRing(y); r != nil && heteroRing(v, r) {
				nHetAr++
			}
			if v.orthoCarbonyl(y) || v.orthoNitro(y) {
				chelated = true
			}
		}
	}
	switch {
	case nSO2 > 0:
		return "NH-sulfonamide"
	case nCO >= 2:
		return "NH-imide"
	case nCO >= 1 && hydrazone:
		return "NH-hydrazide"
	case hydrazone:
		return "NH-hydrazone"
	case nCO == 1 && urea:
		return "NH-urea"
	case nCO == 1 && nAr > 0:
		return "NH-anilide"
	case nCO == 1 && at.HCount() >= 2:
		return "NH2-amide"
	case nCO == 1:
		return "NH-amide"
	case amidine:
		return "NH-amidine"
	case enamine:
		return "NH-enamine"
	case nHetAr > 0:
		return "NH-heteroarylamine"
	case nAr >= 2:
		return "NH-diarylamine"
	case nAr > 0 && chelated:
		return "NH-aniline-chelated"
	case nAr > 0:
		return "NH-aniline"
	case v.doubleTo(n) >= 0:
		return "NH-other"
	case at.HCount() >= 2:
		return "NH2-amine"
	}
	return "NH-amine"
}

// orthoNitro reports whether an aromatic atom has a ring neighbour
// carrying a nitro group.
func (v *view) orthoNitro(a int) bool {
	for _, b := range v.nbrs(a) {
		if !v.arom1(b) {
			continue
		}
		for _, z := range v.nbrs(b) {
			if z != a && v.el(z) == "N" && v.m.Atoms[z].Charge > 0 && v.doubleTo(z, "O") >= 0 {
				return true
			}
		}
	}
	return false
}
