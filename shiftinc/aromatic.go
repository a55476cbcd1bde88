package shiftinc

import (
	"fmt"
	"slices"
	"strings"
)

// parseRing splits a ring pattern ("c n C:c C:c c c") into tokens and
// checks them.
func parseRing(s string) ([]string, error) {
	toks := strings.Fields(s)
	if len(toks) < 3 || len(toks) > 8 {
		return nil, fmt.Errorf("pattern %q: want 3 to 8 atoms", s)
	}
	for _, tk := range toks {
		base, _, _ := strings.Cut(tk, ":")
		switch base {
		case "c", "n", "o", "s", "se", "nH", "n+", "nO", "c=o", "c=s", "C", "N", "*":
		default:
			return nil, fmt.Errorf("pattern %q: unknown atom %q", s, tk)
		}
	}
	return toks, nil
}

// ringToken names ring atom a of ring r for pattern matching (see the
// header of tables/hetero.toml).
func (v *view) ringToken(r []int, a int) string {
	if x := v.fusedPartner(r, a); x >= 0 {
		return strings.ToUpper(v.el(a)[:1]) + ":" + v.simpleToken(x)
	}
	return v.simpleToken(a)
}

// simpleToken is the token of an aromatic atom ignoring fusion.
func (v *view) simpleToken(a int) string {
	at := &v.m.Atoms[a]
	el := strings.ToLower(at.Element)
	switch at.Element {
	case "N":
		if at.Charge > 0 {
			for _, y := range v.nbrs(a) {
				if v.el(y) == "O" && v.m.Atoms[y].Charge < 0 {
					return "nO"
				}
			}
			return "n+"
		}
		if at.HCount() > 0 || v.m.Degree(a) >= 3 {
			return "nH"
		}
	case "C":
		if y := v.doubleTo(a, "O", "S"); y >= 0 && !v.arom1(y) {
			return "c=" + strings.ToLower(v.el(y))
		}
	}
	return el
}

// fusedPartner returns the neighbour of ring atom a that lies outside ring
// r on an aromatic ring shared with a (a fused ring), or -1.
func (v *view) fusedPartner(r []int, a int) int {
	for _, x := range v.nbrs(a) {
		if slices.Contains(r, x) || !v.arom1(x) {
			continue
		}
		if v.shareAromRing(a, x) {
			return x
		}
	}
	return -1
}

// rotate returns ring r starting at a, forward and backward.
func rotate(r []int, a int) (fw, bw []int) {
	i := slices.Index(r, a)
	n := len(r)
	fw = make([]int, n)
	bw = make([]int, n)
	for k := 0; k < n; k++ {
		fw[k] = r[(i+k)%n]
		bw[k] = r[(i-k+n)%n]
	}
	return fw, bw
}

// matchRing scores pattern pat against tokens; -1 when it does not match.
// The score counts exact tokens (3), fused atoms whose partner differs
// ("C:c" for "C:n", 1: the nearest parent ring system) and partial
// wildcards "X:*" (1).
func matchRing(pat, toks []string) int {
	if len(pat) != len(toks) {
		return -1
	}
	score := 0
	for i, p := range pat {
		switch {
		case p == toks[i]:
			score += 3
		case p == "*":
		case len(p) > 2 && p[1] == ':' && strings.HasPrefix(toks[i], p[:2]):
			score++
		default:
			return -1
		}
	}
	return score
}

// aromatic estimates an aromatic C–H: ring base value (benzene, a
// heteroaromatic pattern or the additive aza fallback) plus the benzene
// substituent increments of the ring's substituents.
func (t *Table) aromatic(v *view, c int, a *acc) {
	r := v.aromRing(c)
	if r == nil {
		a.base("aromatic C–H, ring not found: generic", t.row("special", "fallback-aromatic"))
		a.low = true
		return
	}
	fw, bw := rotate(r, c)
	tf := make([]string, len(r))
	tb := make([]string, len(r))
	plain := len(r) == 6
	for i := range fw {
		tf[i] = v.ringToken(r, fw[i])
		tb[i] = v.ringToken(r, bw[i])
		plain = plain && tf[i] == "c"
	}
	scale := 1.0
	switch {
	case plain:
		a.base("benzene base", t.row("base", "benzene"))
	default:
		var best *Row
		bestScore := -1
		for _, h := range t.hetero {
			s := max(matchRing(h.ring, tf), matchRing(h.ring, tb))
			if s > bestScore {
				best, bestScore = h, s
			}
		}
		switch {
		case best != nil && bestScore >= 0:
			a.base(best.Key, best)
		case len(r) == 6 && !slices.ContainsFunc(tf, func(s string) bool { return s == "nH" || strings.HasPrefix(s, "c=") }):
			t.azaFallback(v, r, c, fw, tf, a)
		default:
			a.base(fmt.Sprintf("%d-ring aromatic C–H, no pattern for [%s]: generic", len(r), strings.Join(tf, " ")), t.row("special", "fallback-aromatic"))
			a.low = true
		}
		if heteroRing(v, r) || len(r) != 6 {
			scale = t.Params.Hetero6Scale
			if len(r) == 5 {
				scale = t.Params.Hetero5Scale
			}
		}
	}
	t.ringSubstituents(v, r, c, fw, bw, scale, a)
	t.peri(v, r, c, a)
}

// peri adds the effect of a substituent at the peri position: c's ring
// neighbour f is shared with a fused ring, and the substituent sits on
// f's neighbour p in that other ring (H8 and C1 of naphthalene, H5 and C3
// of indolizine).
func (t *Table) peri(v *view, r []int, c int, a *acc) {
	for _, f := range v.nbrs(c) {
		if !slices.Contains(r, f) {
			continue
		}
		p := v.fusedPartner(r, f)
		if p < 0 {
			continue
		}
		for _, x := range v.nbrs(p) {
			if x == f || v.shareAromRing(p, x) {
				continue
			}
			if v.order(p, x) == 2 {
				continue
			}
			if row := t.lookup("peri", v.classify(p, x)); row != nil && row.Key != "other" {
				a.add("peri-"+row.Key, row.PPM, row.SD)
			}
		}
	}
}

// azaFallback handles a six-membered aromatic ring with no pattern (and no
// lactam-type atom): the benzene base plus the "aza" increments for each
// ring nitrogen and the "fused" increments for each atom shared with
// another aromatic ring.
func (t *Table) azaFallback(v *view, r []int, c int, fw []int, toks []string, a *acc) {
	a.base("benzene base (no ring pattern)", t.row("base", "benzene"))
	for i := 1; i < len(fw); i++ {
		key, label := "", ""
		switch {
		case toks[i] == "n" || toks[i] == "n+" || toks[i] == "nO":
			key, label = "aza", "ring N"
		case strings.Contains(toks[i], ":"):
			key, label = "fused", "fused ring"
		default:
			continue
		}
		row := t.row("benzene", key)
		if row == nil {
			continue
		}
		d := min(i, len(fw)-i)
		val := [...]float64{0, row.Ortho, row.Meta, row.Para}[d]
		a.add(fmt.Sprintf("%s %s", label, [...]string{"", "ortho", "meta", "para"}[d]), val, row.SD)
	}
}

// ringSubstituents adds the benzene increments of the substituents on ring
// r (other than at c), scaled for heteroaromatic rings.
func (t *Table) ringSubstituents(v *view, r []int, c int, fw, bw []int, scale float64, a *acc) {
	n := len(r)
	if n != 5 && n != 6 {
		return
	}
	for i := 1; i < n; i++ {
		j := fw[i]
		d := min(i, n-i)
		pos := [...]string{"", "ortho", "meta", "para"}[d]
		if n == 5 && d == 2 {
			// Two bonds away: para-like through the heteroatom, meta-like
			// through carbon.
			mid := fw[1]
			if i == 3 {
				mid = bw[1]
			}
			if v.el(mid) != "C" {
				pos = "para"
			}
		}
		for _, x := range v.nbrs(j) {
			if slices.Contains(r, x) || v.shareAromRing(j, x) {
				continue
			}
			if v.order(j, x) == 2 && (v.el(x) == "O" || v.el(x) == "S") {
				continue // c=o, part of the ring pattern
			}
			if v.el(x) == "O" && v.m.Atoms[x].Charge < 0 && v.el(j) == "N" {
				continue // N-oxide, part of the ring pattern
			}
			keys := v.classify(j, x)
			if keys[0] == "C=C" && t.vinylConj(v, x) {
				keys = append([]string{"C=C-conj"}, keys...)
			}
			row := t.lookup("benzene", keys)
			val := row.Ortho
			switch pos {
			case "meta":
				val = row.Meta
			case "para":
				val = row.Para
			}
			label := fmt.Sprintf("%s-%s", pos, row.Key)
			if scale != 1 {
				val *= scale
				label += fmt.Sprintf(" (×%.2g)", scale)
			}
			a.low = a.low || row.Key == "other"
			a.add(label, val, row.SD)
		}
	}
}

// vinylConj reports whether the vinyl group starting at x continues into
// a further conjugating group.
func (t *Table) vinylConj(v *view, x int) bool {
	y := v.doubleTo(x, "C")
	if y < 0 {
		return false
	}
	for _, z := range v.nbrs(y) {
		if z != x && v.conjugating(y, z) {
			return true
		}
	}
	return false
}
