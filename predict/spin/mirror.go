package spin

import (
	"cmp"
	"math"
	"slices"
)

// Mirror symmetry. If a permutation π of the spins (an involution) keeps
// every 2F and every coupling, J(π(k),π(l)) = J(k,l), and reflects the
// frequencies about a centre ν0, ν(π(k)) = 2ν0 − ν(k), then R = (π combined
// with inverting every spin) satisfies R H R⁻¹ = H − 2ν0·Fz. R maps a state
// of Mz block b to block nb−1−b, and its matrix in the product basis is a
// plain permutation (the F± matrix elements √(F(F+1) − m(m±1)) are
// unchanged by m → −m with raising and lowering exchanged). Hence the lines
// between blocks b and b+1 determine those between nb−2−b and nb−1−b: a
// line at f of group g gives a line at 2ν0 − f of group π(g) with the same
// intensity. The spectrum is then the mirror image of itself, as for a
// chain of equally spaced shifts with symmetric couplings, and only about
// half of the blocks need to be diagonalised.

// mirrorTolHz is the tolerance on ν(k) + ν(π(k)) = 2ν0 and on equal J;
// a line then moves by at most about this much.
const mirrorTolHz = 1e-9

// useMirror lets tests compare with the plain computation.
var useMirror = true

// mirror returns π (spin k ↔ spin perm[k]) and ν0 when the spins have a
// mirror symmetry of the form above, pairing the spins in order of
// frequency from both ends.
func mirror(spins []cspin, jm [][]float64) (perm []int, nu0 float64, ok bool) {
	n := len(spins)
	if !useMirror || n < 2 {
		return nil, 0, false
	}
	order := make([]int, n)
	for i := range order {
		order[i] = i
	}
	slices.SortStableFunc(order, func(x, y int) int { return cmp.Compare(spins[x].nu, spins[y].nu) })
	perm = make([]int, n)
	for i := range order {
		perm[order[i]] = order[n-1-i]
	}
	nu0 = (spins[order[0]].nu + spins[order[n-1]].nu) / 2
	for k, s := range spins {
		p := spins[perm[k]]
		if p.twoF != s.twoF || math.Abs(s.nu+p.nu-2*nu0) > mirrorTolHz {
			return nil, 0, false
		}
		for l := range spins {
			if math.Abs(jm[s.grp][spins[l].grp]-jm[p.grp][spins[perm[l]].grp]) > mirrorTolHz {
				return nil, 0, false
			}
		}
	}
	return perm, nu0, true
}

// mirrorLines appends to dst the mirror images of the lines of src: at
// 2ν0 − f, with group egMap[eg].
func mirrorLines(dst, src *sink, nu0 float64, egMap map[int]int) {
	dst.out = slices.Grow(dst.out, len(src.out))
	for _, l := range src.out {
		dst.out = append(dst.out, rawLine{hz: 2*nu0 - l.hz, inten: l.inten, eg: egMap[l.eg]})
	}
	dst.dropped += src.dropped
}
