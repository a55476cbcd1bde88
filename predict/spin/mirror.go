package spin

import (
	"cmp"
	"math"
	"slices"

	"gonum.org/v1/gonum/mat"
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
	if dst.out == nil {
		dst.out = getLines(len(src.out))[:0]
	}
	dst.out = slices.Grow(dst.out, len(src.out))
	for _, l := range src.out {
		dst.out = append(dst.out, rawLine{hz: 2*nu0 - l.hz, inten: l.inten, eg: egMap[l.eg]})
	}
	dst.dropped += src.dropped
}

// diagonaliseMirror diagonalises the middle block blk, which R maps to
// itself (total Mz = 0), where R commutes with H: in the basis of
// R-symmetric and R-antisymmetric combinations (e_s ± e_σ(s))/√2 the block
// splits into two halves, each diagonalised on its own (about a quarter of
// the work). The eigenvectors are returned in the product basis.
func (b *basis) diagonaliseMirror(blk int, jm [][]float64, perm []int) (eigen, error) {
	states := b.blocks[blk]
	d := len(states)
	// sigma[i]: position of R(state i) in the block.
	sigma := make([]int, d)
	for i, s := range states {
		r := 0
		for k, sp := range b.spins {
			r += b.stride[perm[k]] * (sp.twoF - b.digit(s, k))
		}
		sigma[i] = b.pos[r]
	}
	// Orbits: representatives i ≤ sigma[i]; fixed points are symmetric.
	var plus, minus []int
	for i, j := range sigma {
		if i < j {
			plus, minus = append(plus, i), append(minus, i)
		} else if i == j {
			plus = append(plus, i)
		}
	}
	h := b.hamiltonian(blk, jm)
	defer putFloats(h.RawSymmetric().Data)
	vd := getFloats(d * d)
	clear(vd)
	vecs := mat.NewDense(d, d, vd)
	vals := make([]float64, 0, d)
	col := 0
	for _, half := range []struct {
		reps []int
		sign float64
	}{{plus, 1}, {minus, -1}} {
		n := len(half.reps)
		if n == 0 {
			continue
		}
		// q(p) = (e_i + sign·e_σ(i))/√2, or e_i for a fixed point.
		coef := func(i int) (int, float64, float64) {
			if sigma[i] == i {
				return i, 1, 0
			}
			return sigma[i], math.Sqrt2 / 2, half.sign * math.Sqrt2 / 2
		}
		a := getFloats(n * n)
		defer putFloats(a)
		for p, i := range half.reps {
			i2, ci, ci2 := coef(i)
			for q := p; q < n; q++ {
				j := half.reps[q]
				j2, cj, cj2 := coef(j)
				v := ci*cj*h.At(i, j) + ci*cj2*h.At(i, j2) + ci2*cj*h.At(i2, j) + ci2*cj2*h.At(i2, j2)
				a[p*n+q] = v
			}
		}
		ev, ok := symEigen(a, n)
		if !ok {
			return eigen{}, errEigen
		}
		vals = append(vals, ev...)
		for p, i := range half.reps {
			i2, ci, ci2 := coef(i)
			row, row2 := vecs.RawRowView(i), vecs.RawRowView(i2)
			for c := 0; c < n; c++ {
				x := a[p*n+c]
				row[col+c] += ci * x
				if ci2 != 0 {
					row2[col+c] += ci2 * x
				}
			}
		}
		col += n
	}
	return eigen{vals: vals, vecs: vecs}, nil
}
