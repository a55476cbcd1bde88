package shiftinc

import (
	"fmt"
	"math"
	"slices"

	"shiftwise/graph"
)

// Estimate is the predicted shift of one proton.
type Estimate struct {
	PPM, SD       float64  // SD: 1-sigma uncertainty from the scatter of the rules used
	Rules         []string // human-readable rules applied, e.g. "CH2 base 1.37", "α-OC(=O)R +2.75"
	LowConfidence bool     // no specific rule covered this proton
	Exchangeable  bool     // H on O, N or S
	Solvent       string   // normalised solvent used
}

// acc accumulates rules: a value, a variance and the rule texts.
type acc struct {
	ppm, v float64
	rules  []string
	low    bool
}

func (a *acc) base(label string, r *Row) {
	a.ppm += r.PPM
	a.v += r.SD * r.SD
	a.rules = append(a.rules, fmt.Sprintf("%s %.2f", label, r.PPM))
}

func (a *acc) add(label string, val, sd float64) {
	a.ppm += val
	a.v += sd * sd
	a.rules = append(a.rules, fmt.Sprintf("%s %+.2f", label, val))
}

func (a *acc) note(s string, sd float64) {
	a.v += sd * sd
	a.rules = append(a.rules, s)
}

// Proton estimates the chemical shift of proton p of molecule m (perceived)
// in the given solvent ("" means CDCl3). It never panics on a perceived
// molecule: a proton no rule covers gets a generic value for its kind with a
// wide SD and LowConfidence set; an out-of-range proton gets the generic
// fallback the same way.
func (t *Table) Proton(m *graph.Mol, p graph.Proton, solvent string) Estimate {
	return t.proton(newView(m), p, solvent)
}

// Protons estimates every proton of m, in atom order then proton index.
// It shares ring perception across the protons, so it is cheaper than
// calling Proton for each.
func (t *Table) Protons(m *graph.Mol, solvent string) map[graph.Proton]Estimate {
	v := newView(m)
	out := map[graph.Proton]Estimate{}
	for a := range m.Atoms {
		for i := 0; i < m.Atoms[a].HCount(); i++ {
			p := graph.Proton{Atom: a, Index: i}
			out[p] = t.proton(v, p, solvent)
		}
	}
	return out
}

func (t *Table) proton(v *view, p graph.Proton, solvent string) Estimate {
	var a acc
	sol, known := t.NormalizeSolvent(solvent)
	if !known {
		sol = "CDCl3"
	}
	est := Estimate{Solvent: sol}
	if p.Atom < 0 || p.Atom >= len(v.m.Atoms) || p.Index < 0 || p.Index >= v.m.Atoms[p.Atom].HCount() {
		a.base("no such proton: generic", t.row("special", "fallback-other"))
		a.low = true
		return t.finish(a, est, false)
	}
	switch v.el(p.Atom) {
	case "C":
		t.carbon(v, p, &a)
	case "O", "N", "S":
		est.Exchangeable = true
		t.exchangeable(v, p.Atom, sol, !known, &a)
		return t.finish(a, est, true)
	default:
		a.base("H on "+v.el(p.Atom)+": no rule, generic", t.row("special", "fallback-other"))
		a.low = true
	}
	switch r := t.solventRow(sol); {
	case !known:
		extra := 0.3
		if r := t.solventRow("unknown"); r != nil {
			extra = r.ExtraSD
		}
		a.note(fmt.Sprintf("solvent %q not recognised: CDCl3 values, +%.2f uncertainty", solvent, extra), extra)
	case r != nil && (r.Offset != 0 || r.ExtraSD != 0):
		a.add("solvent "+sol, r.Offset, r.ExtraSD)
	}
	return t.finish(a, est, false)
}

func (t *Table) finish(a acc, est Estimate, exch bool) Estimate {
	v := a.v
	if !exch {
		v += t.Params.ModelSD * t.Params.ModelSD
	}
	est.PPM = math.Round(a.ppm*1000) / 1000
	est.SD = math.Round(math.Sqrt(v)*1000) / 1000
	est.Rules = a.rules
	est.LowConfidence = a.low
	return est
}

// carbon dispatches a C–H by the carbon's bonding.
func (t *Table) carbon(v *view, p graph.Proton, a *acc) {
	c := p.Atom
	switch {
	case v.arom1(c):
		t.aromatic(v, c, a)
	case v.tripleTo(c) >= 0:
		t.alkyne(v, c, a)
	case v.carbonyl(c) || v.doubleTo(c, "N") >= 0:
		t.formyl(v, c, a)
	case v.doubleTo(c, "C") >= 0:
		if r := t.row("base", "cyclooctatetraene"); r != nil && v.cotRing(c) {
			a.base("cyclooctatetraene ring (tub, not conjugated)", r)
			return
		}
		if !t.vinyl(v, p, a) {
			if r := t.row("base", "allene"); r != nil && v.m.Hybridization(c) == 1 {
				a.base("allene =CH", r)
				return
			}
			a.base("sp2 C–H: no rule, generic", t.row("special", "fallback-sp2"))
			a.low = true
		}
	case v.m.Hybridization(c) == 3:
		t.sp3(v, c, a)
	default:
		a.base("C–H: no rule, generic", t.row("special", "fallback-sp2"))
		a.low = true
	}
}

// sp3 applies the alkane scheme: base + damped α increments + β
// increments + small-ring correction.
func (t *Table) sp3(v *view, c int, a *acc) {
	nh := v.h(c)
	if nh >= 4 {
		a.base("CH4", t.row("base", "CH4"))
		return
	}
	class := [...]string{"", "CH", "CH2", "CH3"}[nh]
	a.base(class+" base", t.row("base", class))
	pick := func(r *Row) float64 {
		switch nh {
		case 3:
			return r.CH3
		case 2:
			return r.CH2
		}
		return r.CH
	}
	var alpha, beta []inc
	nHal := 0
	for _, x := range v.nbrs(c) {
		if v.el(x) == "C" && !v.arom1(x) && v.m.Hybridization(x) == 3 {
			beta = append(beta, t.betaIncs(v, c, x, pick)...)
			continue
		}
		keys := v.classify(c, x)
		if keys[0] == "C=C" && t.alkeneConj(v, x, v.doubleTo(x, "C"), c) {
			keys = append([]string{"C=C-conj"}, keys...)
		}
		r := t.lookup("alpha", keys)
		in := inc{key: r.Key, val: pick(r), sd: r.SD, damp: t.Params.AlphaDamping,
			fallback: r.Key == "other", group: v.alphaGroup(x, r.Key)}
		if r.Damping != nil {
			in.damp = *r.Damping
		}
		in.like = in.damp
		switch {
		case r.DampingLike != nil:
			in.like = *r.DampingLike
		case in.group == "O/N" && t.Params.DonorDamping > 0:
			in.like = t.Params.DonorDamping
		}
		if in.group == "halogen" {
			nHal++
		}
		alpha = append(alpha, in)
	}
	for _, in := range beta {
		label, val := "β-"+in.key, in.val
		if nHal > 0 && t.Params.BetaDamping > 0 && t.Params.BetaDamping != 1 {
			f := math.Pow(t.Params.BetaDamping, float64(nHal))
			val *= f
			label += fmt.Sprintf(" (×%.2g: α halogen)", f)
		}
		a.low = a.low || in.fallback
		a.add(label, val, in.sd)
	}
	t.addAlpha(alpha, a)
	t.smallRing(v, c, a)
}

// inc is one α or β increment before damping.
type inc struct {
	key      string
	val, sd  float64
	damp     float64 // factor when a larger α increment of another group precedes
	like     float64 // factor per larger α increment of the same group
	group    string  // "halogen", "O/N", "aryl" or ""
	fallback bool
}

// betaIncs returns the β increments of the substituents on the sp3
// neighbour x of c.
func (t *Table) betaIncs(v *view, c, x int, pick func(*Row) float64) []inc {
	var out []inc
	for _, y := range v.nbrs(x) {
		if y == c {
			continue
		}
		keys := v.classify(x, y)
		if keys[len(keys)-2] == "alkyl" {
			continue
		}
		if v.h(x) == 0 {
			// On a quaternary carbon (tert-butyl esters, carbamates,
			// amides) some β effects are larger.
			keys = append([]string{keys[0] + "-tert"}, keys...)
		}
		r := t.lookup("beta", keys)
		if r.Key == "alkyl" {
			continue
		}
		out = append(out, inc{key: r.Key, val: pick(r), sd: r.SD, fallback: r.Key == "other"})
	}
	return out
}

// addAlpha adds the α increments, largest first. The largest counts
// fully; each further one is multiplied by its like factor once per
// larger increment of its own group (CH2Cl2, CHCl3, acetals, Ph3CH) and,
// when a larger increment of another group precedes it, once by its
// damping (PhCH2Cl, ClCH2OMe).
func (t *Table) addAlpha(alpha []inc, a *acc) {
	slices.SortStableFunc(alpha, func(p, q inc) int {
		switch {
		case p.val > q.val:
			return -1
		case p.val < q.val:
			return 1
		}
		return 0
	})
	for i, in := range alpha {
		val := in.val
		label := "α-" + in.key
		if i > 0 && val > 0 {
			nLike := 0
			for _, p := range alpha[:i] {
				if in.group != "" && p.group == in.group {
					nLike++
				}
			}
			f := math.Pow(in.like, float64(nLike))
			if nLike < i {
				f *= in.damp
			}
			if f != 1 {
				val *= f
				label += fmt.Sprintf(" (×%.2g)", f)
			}
		}
		a.low = a.low || in.fallback
		a.add(label, val, in.sd)
	}
}

// alphaGroup names the group of α substituent x for the like-damping of
// addAlpha: "halogen", "O/N" (O- or N-bound with a lone pair: ethers,
// alcohols, esters, amines, amides, azoles), "aryl", or "".
func (v *view) alphaGroup(x int, key string) string {
	switch v.el(x) {
	case "F", "Cl", "Br", "I":
		return "halogen"
	case "O":
		return "O/N"
	case "N":
		if v.m.Atoms[x].Charge <= 0 && key != "NO2" && key != "N+" {
			return "O/N"
		}
	case "C":
		if v.arom1(x) {
			return "aryl"
		}
	}
	return ""
}

// smallRing adds the correction for the smallest ring holding c.
func (t *Table) smallRing(v *view, c int, a *acc) {
	sizes := v.m.RingSizes(c)
	if len(sizes) == 0 {
		return
	}
	key := fmt.Sprintf("ring%d", sizes[0])
	if sizes[0] == 5 {
		for _, x := range v.nbrs(c) {
			if (v.el(x) == "O" || v.el(x) == "N" && !v.acylN(x)) && !v.arom1(x) && v.shareRing(c, x) && slices.Contains(v.m.RingSizes(x), 5) {
				key = "ring5-hetero"
			}
		}
	}
	if sizes[0] == 3 {
		for _, r := range v.rings {
			if len(r) != 3 || !slices.Contains(r, c) {
				continue
			}
			switch {
			case heteroRing(v, r):
				key = "ring3-hetero"
			case ringSubstituted(v, r):
				key = "ring3-substituted"
			}
		}
	}
	if r := t.row("ring", key); r != nil {
		a.add(key, r.PPM, r.SD)
	}
}

// vinyl applies Pascual–Meier–Simon: 5.25 + Z(gem) + Z(cis) + Z(trans).
func (t *Table) vinyl(v *view, p graph.Proton, a *acc) bool {
	av, ok := v.m.AlkeneView(p)
	if !ok {
		return false
	}
	c := p.Atom
	partner := v.doubleTo(c, "C")
	if partner < 0 {
		return false
	}
	a.base("C=CH base", t.row("base", "vinyl"))
	for _, s := range []struct {
		role string
		atom int
		from int
	}{{"gem", av.Gem, c}, {"cis", av.Cis, partner}, {"trans", av.Trans, partner}} {
		if s.atom < 0 || v.isH(s.atom) {
			continue // H or D: no increment
		}
		keys := t.alkeneKeys(v, c, partner, s.from, s.atom)
		r := t.lookup("alkene", keys)
		val := r.Gem
		switch s.role {
		case "cis":
			val = r.Cis
		case "trans":
			val = r.Trans
		}
		a.low = a.low || r.Key == "other"
		a.add(fmt.Sprintf("Z(%s, %s)", s.role, r.Key), val, r.SD)
	}
	if !av.Known {
		a.note("geometry not written, E assumed (+0.15 uncertainty)", 0.15)
	}
	return true
}

// alkeneKeys classifies substituent x on alkene carbon from (the double
// bond is c=partner) and adds the "-conj" and "alkyl-ring" variants.
func (t *Table) alkeneKeys(v *view, c, partner, from, x int) []string {
	keys := v.classify(from, x)
	switch keys[0] {
	case "C=C", "COR", "COOR", "COOH", "CHO", "amine", "NR2", "NHR", "NH2", "OR", "OCH3":
		// Donors (amine, OR) on a double bond that also carries an
		// acceptor are push-pull systems: the donor is conjugated, so the
		// "R conjugated" constants apply.
		if t.alkeneConj(v, c, partner, x) {
			k := keys[0]
			switch k {
			case "NR2", "NHR", "NH2":
				k = "amine"
			case "OCH3":
				k = "OR"
			}
			keys = append([]string{k + "-conj"}, keys...)
		}
	}
	if v.el(x) == "C" && !v.arom1(x) && v.m.Hybridization(x) == 3 && v.shareRing(x, c, partner) {
		i := slices.Index(keys, "CH3")
		if i < 0 {
			i = slices.Index(keys, "alkyl")
		}
		keys = slices.Insert(keys, i, "alkyl-ring")
	}
	return keys
}

// alkeneConj reports whether the double bond c=partner carries a
// conjugating group other than x, or x (a C=C) continues into one.
func (t *Table) alkeneConj(v *view, c, partner, x int) bool {
	for _, e := range []int{c, partner} {
		for _, y := range v.nbrs(e) {
			if y == c || y == partner || y == x {
				continue
			}
			if v.conjugating(e, y) {
				return true
			}
		}
	}
	if y := v.doubleTo(x, "C"); y >= 0 {
		for _, z := range v.nbrs(y) {
			if z != x && v.conjugating(y, z) {
				return true
			}
		}
	}
	return false
}

// ringSubstituted reports whether any atom of ring r has a heavy-atom
// neighbour outside the ring.
func ringSubstituted(v *view, r []int) bool {
	for _, a := range r {
		for _, x := range v.nbrs(a) {
			if !slices.Contains(r, x) {
				return true
			}
		}
	}
	return false
}

// cotRing reports whether c lies in a non-aromatic eight-membered ring of
// carbons with four ring double bonds (cyclooctatetraene).
func (v *view) cotRing(c int) bool {
	for _, r := range v.rings {
		if len(r) != 8 || !slices.Contains(r, c) {
			continue
		}
		doubles := 0
		for _, x := range r {
			if v.el(x) != "C" || v.arom1(x) {
				doubles = -100
			}
			if y := v.doubleTo(x, "C"); y >= 0 && slices.Contains(r, y) {
				doubles++
			}
		}
		if doubles == 8 { // each of the four bonds counted from both ends
			return true
		}
	}
	return false
}

// acylN reports whether nitrogen n carries a carbonyl or sulfonyl group.
func (v *view) acylN(n int) bool {
	for _, y := range v.nbrs(n) {
		if v.carbonyl(y) || v.sulfonyl(y) {
			return true
		}
	}
	return false
}
