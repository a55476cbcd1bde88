package spin

import (
	"errors"
	"math"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

// cspin is one (composite) spin of a cluster: spin F = twoF/2 with frequency
// nu, belonging to cluster-local group grp.
type cspin struct {
	twoF int
	nu   float64
	grp  int
}

// basis is the product basis of a set of spins, sorted into blocks of equal
// total Mz. A state is a mixed-radix number whose digit k is the number of
// steps spin k is lowered from m = F (0 … 2F); block b holds the states
// whose digits sum to b, i.e. total 2M = Σ2F − 2b.
type basis struct {
	spins  []cspin
	stride []int
	blocks [][]int // state numbers per block
	pos    []int   // position of a state within its block
}

func newBasis(spins []cspin) *basis {
	b := &basis{spins: spins, stride: make([]int, len(spins))}
	total, nb := 1, 1
	for k, s := range spins {
		b.stride[k] = total
		total *= s.twoF + 1
		nb += s.twoF
	}
	b.blocks = make([][]int, nb)
	b.pos = make([]int, total)
	for s := 0; s < total; s++ {
		sum := 0
		for k := range spins {
			sum += b.digit(s, k)
		}
		b.pos[s] = len(b.blocks[sum])
		b.blocks[sum] = append(b.blocks[sum], s)
	}
	return b
}

// digit returns how far spin k is lowered from m = F in state s.
func (b *basis) digit(s, k int) int { return (s / b.stride[k]) % (b.spins[k].twoF + 1) }

// m returns the Mz of spin k in state s.
func (b *basis) m(s, k int) float64 { return float64(b.spins[k].twoF)/2 - float64(b.digit(s, k)) }

// raise and lower return √(F(F+1) − m(m±1)), the matrix elements of F±.
func raise(twoF int, m float64) float64 {
	f := float64(twoF) / 2
	return math.Sqrt(f*(f+1) - m*(m+1))
}

func lower(twoF int, m float64) float64 {
	f := float64(twoF) / 2
	return math.Sqrt(f*(f+1) - m*(m-1))
}

// hamiltonian builds block blk of H = Σ ν Fz + Σ J F·F (J from the
// cluster-local matrix jm) directly in the block's states.
func (b *basis) hamiltonian(blk int, jm [][]float64) *mat.SymDense {
	states := b.blocks[blk]
	h := mat.NewSymDense(len(states), nil)
	ms := make([]float64, len(b.spins))
	for i, s := range states {
		diag := 0.0
		for k, sp := range b.spins {
			ms[k] = b.m(s, k)
			diag += sp.nu * ms[k]
			for l := 0; l < k; l++ {
				diag += jm[sp.grp][b.spins[l].grp] * ms[k] * ms[l]
			}
		}
		h.SetSym(i, i, diag)
		// ½J (F+_k F−_l + F−_k F+_l): every ordered pair (k, l), raising k
		// and lowering l, reaches each off-diagonal element from one side.
		for k, sk := range b.spins {
			if b.digit(s, k) == 0 {
				continue
			}
			for l, sl := range b.spins {
				j := jm[sk.grp][sl.grp]
				if l == k || j == 0 || b.digit(s, l) == sl.twoF {
					continue
				}
				v := j / 2 * raise(sk.twoF, ms[k]) * lower(sl.twoF, ms[l])
				h.SetSym(i, b.pos[s-b.stride[k]+b.stride[l]], v)
			}
		}
	}
	return h
}

// eigen holds the eigenvalues and eigenvectors (columns) of one block.
type eigen struct {
	vals []float64
	vecs *mat.Dense
}

var errEigen = errors.New("spin: eigen-decomposition did not converge")

func (b *basis) diagonalise(blk int, jm [][]float64) (eigen, error) {
	var es mat.EigenSym
	if ok := es.Factorize(b.hamiltonian(blk, jm), true); !ok {
		return eigen{}, errEigen
	}
	var v mat.Dense
	es.VectorsTo(&v)
	return eigen{vals: es.Values(nil), vecs: &v}, nil
}

// transitions returns the lines of spins (intensities not normalised: they
// sum to Tr(F+F−) over the product basis), attributed to the cluster-local
// groups 0 … ngrp−1. eg in the returned lines is the cluster-local group.
func transitions(spins []cspin, jm [][]float64, ngrp int) ([]rawLine, error) {
	if len(spins) == 0 {
		return nil, nil
	}
	b := newBasis(spins)
	cur, err := b.diagonalise(0, jm)
	if err != nil {
		return nil, err
	}
	var out []rawLine
	for blk := 0; blk+1 < len(b.blocks); blk++ {
		next, err := b.diagonalise(blk+1, jm)
		if err != nil {
			return nil, err
		}
		out = b.lines(blk, cur, next, ngrp, out)
		cur = next
	}
	return out, nil
}

// lines appends the transitions from block blk (eigen e0) to block blk+1
// (eigen e1): A_g = V1ᵀ F−_g V0 for each group, A = Σ A_g; line (i → j) at
// E0_i − E1_j with share A_g(j,i)·A(j,i) for group g.
func (b *basis) lines(blk int, e0, e1 eigen, ngrp int, out []rawLine) []rawLine {
	d0, d1 := len(e0.vals), len(e1.vals)
	w := make(map[int]*mat.Dense)
	for i, s := range b.blocks[blk] {
		row := e0.vecs.RawRowView(i)
		for k, sp := range b.spins {
			if b.digit(s, k) == sp.twoF {
				continue
			}
			wg := w[sp.grp]
			if wg == nil {
				wg = mat.NewDense(d1, d0, nil)
				w[sp.grp] = wg
			}
			c := lower(sp.twoF, b.m(s, k))
			floats.AddScaled(wg.RawRowView(b.pos[s+b.stride[k]]), c, row)
		}
	}
	ag := make([]*mat.Dense, ngrp)
	total := mat.NewDense(d1, d0, nil)
	for g, wg := range w {
		a := mat.NewDense(d1, d0, nil)
		a.Mul(e1.vecs.T(), wg)
		ag[g] = a
		total.Add(total, a)
	}
	const thr = 1e-10 // |<j|F−|i>|² below this is a forbidden line
	for j := 0; j < d1; j++ {
		trow := total.RawRowView(j)
		for i, a := range trow {
			if a*a < thr {
				continue
			}
			hz := e0.vals[i] - e1.vals[j]
			for g, m := range ag {
				if m == nil {
					continue
				}
				if c := m.At(j, i) * a; math.Abs(c) > minIntensity {
					out = append(out, rawLine{hz: hz, inten: c, eg: g})
				}
			}
		}
	}
	return out
}
