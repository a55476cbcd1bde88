package spin

import (
	"errors"
	"math"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"

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
	data := getFloats(len(states) * len(states))
	clear(data)
	h := mat.NewSymDense(len(states), data)
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
	h := b.hamiltonian(blk, jm)
	n := h.SymmetricDim()
	a := h.RawSymmetric().Data
	vals, ok := symEigen(a, n)
	if !ok {
		return eigen{}, errEigen
	}
	return eigen{vals: vals, vecs: mat.NewDense(n, n, a)}, nil
}

// sink receives the lines of a sub-spectrum: intensities are multiplied by
// scale and cluster-local group k is reported as eg[k].
type sink struct {
	out     []rawLine
	chunks  [][]rawLine // lines added by transitions, joined by all
	scale   float64
	eg      []int
	dropped float64 // intensity of transitions weaker than MinLine
	// weighted attributes each transition |A|² to the groups in proportion
	// to |A_g|² instead of sharing it as A_g·A (see fragment.go).
	weighted bool
}

// all returns the lines of all chunks and of out in one slice, ordered by
// group (a counting sort, stable), ready for mergeRaw.
func (s *sink) all() []rawLine {
	n, ng := len(s.out), 0
	for _, c := range s.chunks {
		n += len(c)
	}
	if n == len(s.out) {
		return s.out
	}
	chunks := append(s.chunks, s.out)
	for _, c := range chunks {
		for _, l := range c {
			ng = max(ng, l.eg+1)
		}
	}
	// Stable counting sort by group. The chunks are split into runs of
	// about equal line counts, one per worker; worker w writes group g's
	// lines from start[g] plus the counts of g in the runs before it.
	parts := 1
	if n >= 1<<15 {
		parts = min(runtime.GOMAXPROCS(0), len(chunks))
	}
	cut := make([]int, parts+1) // worker w takes chunks cut[w] … cut[w+1]−1
	for w, k, seen := 1, 0, 0; w < parts; w++ {
		for k < len(chunks) && seen < n*w/parts {
			seen += len(chunks[k])
			k++
		}
		cut[w] = k
	}
	cut[parts] = len(chunks)
	count := make([][]int, parts)
	parallel(parts, func(w int) {
		count[w] = make([]int, ng)
		for _, c := range chunks[cut[w]:cut[w+1]] {
			for _, l := range c {
				count[w][l.eg]++
			}
		}
	})
	next := make([][]int, parts)
	pos := 0
	for w := range next {
		next[w] = make([]int, ng)
	}
	for g := 0; g < ng; g++ {
		for w := 0; w < parts; w++ {
			next[w][g] = pos
			pos += count[w][g]
		}
	}
	out := getLines(n)
	parallel(parts, func(w int) {
		nx := next[w]
		for _, c := range chunks[cut[w]:cut[w+1]] {
			for _, l := range c {
				out[nx[l.eg]] = l
				nx[l.eg]++
			}
		}
	})
	for _, c := range s.chunks {
		putLines(c)
	}
	s.chunks = nil
	return out
}

// transitions adds the lines of spins to dst (as chunks; raw intensities, which sum
// to Tr(F+F−) over the product basis, times dst.scale). Blocks are
// diagonalised, and the lines between neighbouring blocks computed, on up to
// GOMAXPROCS goroutines; the result does not depend on their number.
//
// The blocks are scheduled by schedule: at most GOMAXPROCS+2 blocks'
// eigenvectors are held at once.
func transitions(spins []cspin, jm [][]float64, dst *sink) error {
	if len(spins) == 0 {
		return nil
	}
	b := newBasis(spins)
	nb := len(b.blocks)
	eig := make([]eigen, nb)
	errs := make([]error, nb)
	parts := make([]sink, nb-1)
	// With a mirror symmetry only blocks 0 … nb/2 are needed: pair b and
	// pair nb−2−b are images of each other.
	perm, nu0, sym := mirror(spins, jm)
	use := nb
	if sym {
		use = nb/2 + 1
	}
	diag := func(blk int) {
		if sym && nb%2 == 1 && blk == nb/2 {
			eig[blk], errs[blk] = b.diagonaliseMirror(blk, jm, perm)
		} else {
			eig[blk], errs[blk] = b.diagonalise(blk, jm)
		}
	}
	pair := func(blk int) {
		parts[blk] = sink{scale: dst.scale, eg: dst.eg, weighted: dst.weighted}
		b.lines(blk, eig[blk], eig[blk+1], &parts[blk])
	}
	cost := func(blk int) float64 {
		d := float64(len(b.blocks[blk]))
		if sym && nb%2 == 1 && blk == nb/2 {
			return d * d * d / 4 // two halves
		}
		return d * d * d
	}
	if err := schedule(use, runtime.GOMAXPROCS(0), cost, diag, pair, func(blk int) error { return errs[blk] }, func(blk int) {
		if eig[blk].vecs != nil {
			putFloats(eig[blk].vecs.RawMatrix().Data)
		}
		eig[blk] = eigen{}
	}); err != nil {
		return err
	}
	if sym {
		egMap := map[int]int{}
		for k, p := range perm {
			egMap[dst.eg[spins[k].grp]] = dst.eg[spins[p].grp]
		}
		for blk := 0; blk < nb-2-blk; blk++ {
			m := &parts[nb-2-blk]
			*m = sink{scale: dst.scale, eg: dst.eg, weighted: dst.weighted}
			mirrorLines(m, &parts[blk], nu0, egMap)
		}
	}
	for i := range parts {
		if len(parts[i].out) > 0 {
			dst.chunks = append(dst.chunks, parts[i].out)
		}
		dst.dropped += parts[i].dropped
	}
	return nil
}

// schedule runs diag(0) … diag(n−1) and pair(0) … pair(n−2), where pair(b)
// needs diag(b) and diag(b+1), on `workers` goroutines. A worker takes the
// lowest pair whose blocks are ready, otherwise the next diagonalisation,
// which may start only while fewer than workers+2 blocks are held (a block
// is released, by release(b), once the pairs on both sides are done), so
// memory stays bounded while a large block is diagonalised alongside
// smaller ones. Diagonalisations start with the costliest block (cost(b))
// and grow a contiguous range from it, taking the costlier neighbour first,
// so the longest task starts at once and every new block has a started
// neighbour to pair with. After a diagonalisation failed (failed(b) != nil)
// no new work starts, and the errors are returned.
func schedule(n, workers int, cost func(int) float64, diag, pair func(int), failed func(int) error, release func(int)) error {
	if n == 0 {
		return nil
	}
	order := make([]int, 0, n)
	lo := 0
	for b := 1; b < n; b++ {
		if cost(b) > cost(lo) {
			lo = b
		}
	}
	hi := lo
	order = append(order, lo)
	for lo > 0 || hi < n-1 {
		if hi == n-1 || (lo > 0 && cost(lo-1) >= cost(hi+1)) {
			lo--
			order = append(order, lo)
		} else {
			hi++
			order = append(order, hi)
		}
	}
	var mu sync.Mutex
	cond := sync.NewCond(&mu)
	diagDone := make([]bool, n)
	pairState := make([]int8, max(n-1, 0)) // 0 waiting, 1 running, 2 done
	nextDiag, held, running := 0, 0, 0
	var errs []error
	// next returns the task to run (isPair, index) or ok=false when
	// nothing is left; it waits while nothing is ready. mu is held.
	next := func() (isPair bool, k int, ok bool) {
		for {
			if errs != nil {
				return false, 0, false
			}
			pending := false
			for p := 0; p < n-1; p++ {
				if pairState[p] == 0 && diagDone[p] && diagDone[p+1] {
					pairState[p] = 1
					return true, p, true
				}
				pending = pending || pairState[p] != 2
			}
			if nextDiag < n && held < workers+2 {
				nextDiag++
				held++
				return false, order[nextDiag-1], true
			}
			if !pending && nextDiag >= n {
				return false, 0, false
			}
			if running == 0 { // nothing running and nothing ready: a bug
				errs = append(errs, errors.New("spin: block scheduling stalled"))
				return false, 0, false
			}
			cond.Wait()
		}
	}
	done := func(b int) bool { // block b no longer needed
		return (b == 0 || pairState[b-1] == 2) && (b == n-1 || pairState[b] == 2)
	}
	var wg sync.WaitGroup
	for w := 0; w < max(1, min(workers, n)); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			mu.Lock()
			defer mu.Unlock()
			for {
				isPair, k, ok := next()
				if !ok {
					cond.Broadcast()
					return
				}
				running++
				mu.Unlock()
				if isPair {
					pair(k)
				} else {
					diag(k)
				}
				mu.Lock()
				running--
				if isPair {
					pairState[k] = 2
					for _, b := range []int{k, k + 1} {
						if done(b) {
							release(b)
							held--
						}
					}
				} else {
					diagDone[k] = true
					if err := failed(k); err != nil {
						errs = append(errs, err)
					} else if n == 1 {
						release(k)
						held--
					}
				}
				cond.Broadcast()
			}
		}()
	}
	wg.Wait()
	return errors.Join(errs...)
}

// parallel calls fn(0) … fn(n−1) on up to GOMAXPROCS goroutines, handing
// out the indices in order, and returns when all calls have returned.
func parallel(n int, fn func(i int)) {
	workers := min(runtime.GOMAXPROCS(0), n)
	if workers <= 1 {
		for i := 0; i < n; i++ {
			fn(i)
		}
		return
	}
	var next atomic.Int64
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := int(next.Add(1)) - 1; i < n; i = int(next.Add(1)) - 1 {
				fn(i)
			}
		}()
	}
	wg.Wait()
}

// Thresholds for reporting transitions (raw |<b|F−|a>|², of order 1 for an
// allowed line) and group shares (relative to the transition).
const (
	forbidden = 1e-8 // weaker raw transitions are dropped
	// MinLine is the intensity (one nucleus = 1) below which an exact
	// transition is not reported; its intensity is added to
	// Result.Dropped instead. Such lines are invisible at any realistic
	// signal-to-noise ratio.
	MinLine  = 1e-6
	minShare = 1e-4 // smaller shares go to the largest share of the line
)

// transition is one significant line (i in the upper block, j in the
// lower) with its total amplitude a = <j|F−|i>.
type transition struct {
	i, j int
	a    float64
}

// lines appends the transitions from block blk (eigen e0) to block blk+1
// (eigen e1): A = V1ᵀ F− V0; line (i → j) at E0_i − E1_j with intensity
// A(j,i)², shared among groups as A_g(j,i)·A(j,i), A_g = V1ᵀ F−_g V0.
func (b *basis) lines(blk int, e0, e1 eigen, dst *sink) {
	d0, d1 := len(e0.vals), len(e1.vals)
	w := mat.NewDense(d1, d0, getFloats(d1*d0))
	b.lowerInto(w, blk, e0, -1)
	a := mat.NewDense(d1, d0, getFloats(d1*d0))
	a.Mul(e1.vecs.T(), w)
	defer putFloats(w.RawMatrix().Data)
	defer putFloats(a.RawMatrix().Data)
	nsig := 0
	for _, v := range a.RawMatrix().Data {
		if in := v * v; in*dst.scale >= MinLine && in >= forbidden {
			nsig++
		}
	}
	sig := make([]transition, 0, nsig)
	for j := 0; j < d1; j++ {
		for i, v := range a.RawRowView(j) {
			switch in := v * v; {
			case in*dst.scale >= MinLine && in >= forbidden:
				sig = append(sig, transition{i, j, v})
			default:
				dst.dropped += in * dst.scale
			}
		}
	}
	grps := b.groups()
	shares := b.shares(blk, e0, e1, grps, sig, w, a)
	g := len(grps)
	if dst.weighted && g > 1 {
		// A_g = share/A; the weights A_g²/Σ A_h² are not negative and sum
		// to 1, so each transition keeps its intensity A².
		for t, tr := range sig {
			sh := shares[t*g : (t+1)*g]
			norm := 0.0
			for k, c := range sh {
				sh[k] = c / tr.a
				norm += sh[k] * sh[k]
			}
			for k, c := range sh {
				sh[k] = tr.a * tr.a * c * c / norm
			}
		}
	}
	// Fold shares below minShare of the line into its largest share, and
	// count the lines to allocate them at once.
	nout := 0
	for t, tr := range sig {
		sh := shares[t*g : (t+1)*g]
		big, rest := 0, 0.0
		cut := minShare * tr.a * tr.a
		for k, c := range sh {
			if math.Abs(c) > math.Abs(sh[big]) {
				big = k
			}
		}
		for k, c := range sh {
			if k != big && math.Abs(c) < cut {
				rest += c
				sh[k] = 0
			}
		}
		if math.Abs(sh[big]) < cut {
			rest += sh[big]
			sh[big] = 0
		}
		sh[big] += rest
		for _, c := range sh {
			if c != 0 {
				nout++
			}
		}
	}
	if dst.out == nil {
		dst.out = getLines(nout)[:0]
	}
	dst.out = slices.Grow(dst.out, nout)
	for t, tr := range sig {
		hz := e0.vals[tr.i] - e1.vals[tr.j]
		sh := shares[t*g : (t+1)*g]
		for k, c := range sh {
			if c == 0 {
				continue
			}
			dst.out = append(dst.out, rawLine{hz: hz, inten: c * dst.scale, eg: dst.eg[grps[k]]})
		}
	}
}

// groups returns the cluster-local groups present among the spins.
func (b *basis) groups() []int {
	var gs []int
	seen := map[int]bool{}
	for _, s := range b.spins {
		if !seen[s.grp] {
			seen[s.grp] = true
			gs = append(gs, s.grp)
		}
	}
	return gs
}

// lowerInto sets w = F−_g V0 (all groups when g < 0), rows in block blk+1.
func (b *basis) lowerInto(w *mat.Dense, blk int, e0 eigen, g int) {
	w.Zero()
	for i, s := range b.blocks[blk] {
		row := e0.vecs.RawRowView(i)
		for k, sp := range b.spins {
			if (g >= 0 && sp.grp != g) || b.digit(s, k) == sp.twoF {
				continue
			}
			c := lower(sp.twoF, b.m(s, k))
			floats.AddScaled(w.RawRowView(b.pos[s+b.stride[k]]), c, row)
		}
	}
}

// shares returns, for each significant transition t and group k, the share
// A_gk(j,i)·A(j,i) at index t·len(grps)+k. It uses one matrix product per
// group, or for few transitions sums over the F−_g matrix elements per
// transition, whichever is cheaper. w is scratch space.
func (b *basis) shares(blk int, e0, e1 eigen, grps []int, sig []transition, w, a *mat.Dense) []float64 {
	g := len(grps)
	sh := make([]float64, len(sig)*g)
	if g == 1 {
		for t, tr := range sig {
			sh[t] = tr.a * tr.a
		}
		return sh
	}
	d0, d1 := len(e0.vals), len(e1.vals)
	perProduct := 2 * float64(d1) * float64(d1) * float64(d0) * float64(g-1)
	perTransition := float64(len(sig)) * float64(d0) * float64(len(b.spins))
	if perTransition < perProduct {
		b.sharesDirect(blk, e0, e1, grps, sig, sh)
		return sh
	}
	ag := mat.NewDense(d1, d0, getFloats(d1*d0))
	defer putFloats(ag.RawMatrix().Data)
	for k, grp := range grps[:g-1] {
		b.lowerInto(w, blk, e0, grp)
		ag.Mul(e1.vecs.T(), w)
		for t, tr := range sig {
			sh[t*g+k] = ag.At(tr.j, tr.i) * tr.a
		}
	}
	for t, tr := range sig {
		last := tr.a * tr.a
		for k := 0; k < g-1; k++ {
			last -= sh[t*g+k]
		}
		sh[t*g+g-1] = last
	}
	return sh
}

// sharesDirect computes the shares transition by transition:
// A_g(j,i) = Σ_s V0(s,i)·U_g(s) with U_g(s) = Σ over spins k of g of
// <r|F−_k|s>·V1(r,j), r = s lowered at k. U is built once per lower state
// j (sig is grouped by j), and each share is then one dot product.
func (b *basis) sharesDirect(blk int, e0, e1 eigen, grps []int, sig []transition, sh []float64) {
	type elem struct {
		s, r, k int32 // state in blk, state in blk+1, index into grps
		c       float64
	}
	gi := map[int]int{}
	for k, g := range grps {
		gi[g] = k
	}
	var els []elem
	for i, s := range b.blocks[blk] {
		for k, sp := range b.spins {
			if b.digit(s, k) == sp.twoF {
				continue
			}
			els = append(els, elem{int32(i), int32(b.pos[s+b.stride[k]]), int32(gi[sp.grp]), lower(sp.twoF, b.m(s, k))})
		}
	}
	r0, c0 := e0.vecs.Dims()
	r1, c1 := e1.vecs.Dims()
	v0t := mat.NewDense(c0, r0, getFloats(r0*c0))
	v1t := mat.NewDense(c1, r1, getFloats(r1*c1))
	v0t.Copy(e0.vecs.T())
	v1t.Copy(e1.vecs.T())
	defer putFloats(v0t.RawMatrix().Data)
	defer putFloats(v1t.RawMatrix().Data)
	g, d0 := len(grps), len(e0.vals)
	// Transitions are shared among goroutines in runs that start at a new
	// lower state j, each with its own U; large products only (other block
	// pairs may keep the cores busy).
	parts := 1
	if float64(len(sig))*float64(g*d0) > 4e6 {
		parts = runtime.GOMAXPROCS(0)
	}
	bounds := []int{0}
	for p := 1; p < parts; p++ {
		t := max(len(sig)*p/parts, bounds[len(bounds)-1])
		for t < len(sig) && t > 0 && sig[t].j == sig[t-1].j {
			t++
		}
		bounds = append(bounds, t)
	}
	bounds = append(bounds, len(sig))
	parallel(len(bounds)-1, func(p int) {
		u := make([]float64, g*d0)
		cur := -1
		for t := bounds[p]; t < bounds[p+1]; t++ {
			tr := sig[t]
			if tr.j != cur {
				cur = tr.j
				clear(u)
				y := v1t.RawRowView(tr.j)
				for _, e := range els {
					u[int(e.k)*d0+int(e.s)] += e.c * y[e.r]
				}
			}
			x := v0t.RawRowView(tr.i)
			for k := 0; k < g; k++ {
				sh[t*g+k] = floats.Dot(u[k*d0:(k+1)*d0], x) * tr.a
			}
		}
	})
}
