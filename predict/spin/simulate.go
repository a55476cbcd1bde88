package spin

import (
	"cmp"
	"errors"
	"fmt"
	"math"
	"runtime"
	"slices"
	"sort"
)

// Defaults and tolerances.
const (
	// DefaultStrongRatio is the Auto-mode threshold on |Δν|/|J| below which a
	// coupling is strong (common practice, no source).
	DefaultStrongRatio = 10
	// DefaultMaxSpins bounds exact clusters (see Options.MaxSpins): 12
	// distinct spin-1/2 nuclei, largest Mz block 924 states (about 7 MB per
	// matrix). 14 (block 3432, about 95 MB per matrix) must be asked for.
	DefaultMaxSpins = 12
	// MaxCount is the largest Count accepted for one group.
	MaxCount = 64
	// MaxLines bounds first-order splitting: a splitting step that would
	// give more lines than this is refused with ErrTooLarge.
	MaxLines = 1 << 21

	mergeTolHz    = 1e-3 // lines closer than this are one line (far below any line width)
	equivTolPPM   = 1e-9 // shift tolerance for magnetic equivalence
	equivTolHz    = 1e-9 // coupling tolerance for magnetic equivalence
	maxConfigs    = 16   // X-approximation configurations per cluster
	minIntensity  = 1e-12
	maxSpinsLimit = 16 // MaxSpins above this is refused outright (block 12870 states, 1.3 GB per matrix)
)

// ErrTooLarge is wrapped by the error Simulate returns when a cluster is too
// large to simulate exactly.
var ErrTooLarge = errors.New("cluster too large for exact simulation")

// Simulate computes the 1H line spectrum of sys. It returns an error for an
// invalid system or options, and one wrapping ErrTooLarge when a cluster
// exceeds the exact-simulation bound or splitting would exceed MaxLines
// lines. Lines are sorted by group, then by frequency.
func Simulate(sys System, opt Options) (*Result, error) {
	if err := validate(sys, opt); err != nil {
		return nil, err
	}
	if opt.StrongRatio == 0 {
		opt.StrongRatio = DefaultStrongRatio
	}
	if opt.MaxSpins == 0 {
		opt.MaxSpins = DefaultMaxSpins
	}
	es := reduce(sys, opt.FieldMHz)
	clusters := es.clusters(opt)
	res := &Result{ModeUsed: make([]Mode, len(sys.Groups))}
	for g := range res.ModeUsed {
		res.ModeUsed[g] = FirstOrder
	}
	var lines []rawLine
	for _, c := range clusters {
		mode := Exact
		cl, dropped, err := es.simulateCluster(c, opt)
		if opt.Mode == Auto && len(c) > 1 && errors.Is(err, ErrTooLarge) {
			if len(c) <= MaxFragmentGroups {
				mode = Fragment
				cl, dropped, err = es.fragmentLines(c, opt)
				res.Notes = append(res.Notes, fmt.Sprintf("groups %s form a strongly coupled cluster too large to simulate exactly; simulated by fragments of up to %d spins (approximate second-order patterns)", es.names(c), fragSpins(opt)))
			} else {
				mode = FirstOrder
				cl, dropped, err = es.firstOrderLines(c, opt)
				res.Notes = append(res.Notes, fmt.Sprintf("groups %s form a strongly coupled cluster of %d groups, too large to simulate exactly or by fragments (at most %d groups); first-order patterns used", es.names(c), len(c), MaxFragmentGroups))
			}
		}
		if err != nil {
			return nil, err
		}
		res.Dropped += dropped
		if lines == nil {
			lines = cl
		} else {
			lines = append(lines, cl...)
			putLines(cl)
		}
		if mode != FirstOrder && (opt.Mode == Exact || len(c) > 1) {
			for _, eg := range c {
				for _, m := range es.g[eg].members {
					res.ModeUsed[m] = mode
				}
			}
		}
	}
	res.Lines = es.distribute(sys, lines, opt.FieldMHz)
	putLines(lines) // nothing refers to the raw lines any more
	return res, nil
}

// validate checks the system and options.
func validate(sys System, opt Options) error {
	if !(opt.FieldMHz > 0) || math.IsInf(opt.FieldMHz, 0) {
		return fmt.Errorf("spin: field must be a positive number of MHz, got %v", opt.FieldMHz)
	}
	if opt.Mode != Auto && opt.Mode != FirstOrder && opt.Mode != Exact {
		return fmt.Errorf("spin: unknown mode %d", int(opt.Mode))
	}
	if opt.StrongRatio < 0 || math.IsNaN(opt.StrongRatio) || math.IsInf(opt.StrongRatio, 0) {
		return fmt.Errorf("spin: strong-coupling ratio must be a finite number ≥ 0, got %v", opt.StrongRatio)
	}
	if opt.MaxSpins < 0 || opt.MaxSpins > maxSpinsLimit {
		return fmt.Errorf("spin: MaxSpins must be between 0 and %d, got %d", maxSpinsLimit, opt.MaxSpins)
	}
	if opt.FragmentSpins < 0 || opt.FragmentSpins > maxSpinsLimit {
		return fmt.Errorf("spin: FragmentSpins must be between 0 and %d, got %d", maxSpinsLimit, opt.FragmentSpins)
	}
	if len(sys.Groups) == 0 {
		return errors.New("spin: the system has no groups")
	}
	for i, g := range sys.Groups {
		if err := validGroup(g); err != nil {
			return fmt.Errorf("spin: group %d (%q): %v", i, g.Name, err)
		}
	}
	seen := map[[2]int]int{}
	for k, c := range sys.Couplings {
		if err := validCoupling(c, len(sys.Groups)); err != nil {
			return fmt.Errorf("spin: coupling %d: %v", k, err)
		}
		key := [2]int{min(c.A, c.B), max(c.A, c.B)}
		if prev, dup := seen[key]; dup {
			return fmt.Errorf("spin: coupling %d: groups %d and %d are already coupled by coupling %d", k, c.A, c.B, prev)
		}
		seen[key] = k
	}
	return nil
}

func validGroup(g Group) error {
	switch {
	case g.Count < 1:
		return fmt.Errorf("count must be at least 1, got %d", g.Count)
	case g.Count > MaxCount:
		return fmt.Errorf("count %d is above the limit of %d", g.Count, MaxCount)
	case math.IsNaN(g.ShiftPPM) || math.IsInf(g.ShiftPPM, 0):
		return fmt.Errorf("shift must be a finite number, got %v", g.ShiftPPM)
	}
	switch g.Nucleus {
	case "", "1H", "19F", "31P":
		return nil
	}
	return fmt.Errorf("unknown nucleus %q (want 1H, 19F or 31P)", g.Nucleus)
}

func validCoupling(c Coupling, n int) error {
	switch {
	case c.A < 0 || c.A >= n || c.B < 0 || c.B >= n:
		return fmt.Errorf("group index out of range (%d, %d; %d groups)", c.A, c.B, n)
	case c.A == c.B:
		return fmt.Errorf("couples group %d to itself (a coupling inside an equivalent group leaves no trace)", c.A)
	case math.IsNaN(c.JHz) || math.IsInf(c.JHz, 0):
		return fmt.Errorf("J must be a finite number, got %v", c.JHz)
	}
	return nil
}

// egroup is a group after merging magnetically equivalent groups.
type egroup struct {
	nu      float64 // Hz
	n       int     // number of spin-1/2 nuclei
	proton  bool
	members []int    // indices into System.Groups
	name    string   // of the first member, for messages
	names   []string // of all members, for notes
}

// esys is the reduced system: merged groups and a dense coupling matrix.
type esys struct {
	g []egroup
	j [][]float64
}

// rawLine is a line of a merged group, before distribution to the members.
type rawLine struct {
	hz, inten float64
	eg        int
}

// reduce merges groups that are magnetically equivalent: same nucleus, same
// shift and the same coupling to every other group. This is exact: the
// couplings inside such a set commute with the rest of the Hamiltonian and
// with F−.
func reduce(sys System, field float64) *esys {
	n := len(sys.Groups)
	j := make([][]float64, n)
	for i := range j {
		j[i] = make([]float64, n)
	}
	for _, c := range sys.Couplings {
		j[c.A][c.B], j[c.B][c.A] = c.JHz, c.JHz
	}
	// Non-zero couplings of each group, by partner index: comparing these
	// keeps the equivalence test linear in the couplings, not in the
	// groups (a long chain has hundreds of CH2 groups of one shift).
	nz := make([][]pairJ, n)
	for a := range j {
		for c, v := range j[a] {
			if v != 0 {
				nz[a] = append(nz[a], pairJ{c, v})
			}
		}
	}
	rep := make([]int, n)
	for i := range rep {
		rep[i] = -1
	}
	es := &esys{}
	for a := 0; a < n; a++ {
		if rep[a] >= 0 {
			continue
		}
		rep[a] = len(es.g)
		ga := sys.Groups[a]
		eg := egroup{nu: ga.ShiftPPM * field, n: ga.Count, proton: ga.IsProton(), members: []int{a}, name: ga.Name, names: []string{ga.Name}}
		for b := a + 1; b < n; b++ {
			if rep[b] < 0 && equivalent(sys.Groups, nz, a, b) {
				rep[b] = rep[a]
				eg.n += sys.Groups[b].Count
				eg.members = append(eg.members, b)
				eg.names = append(eg.names, sys.Groups[b].Name)
			}
		}
		es.g = append(es.g, eg)
	}
	m := len(es.g)
	es.j = make([][]float64, m)
	for i := range es.j {
		es.j[i] = make([]float64, m)
	}
	for a := 0; a < n; a++ {
		for b := 0; b < n; b++ {
			if rep[a] != rep[b] {
				es.j[rep[a]][rep[b]] = j[a][b]
			}
		}
	}
	return es
}

// pairJ is a coupling to group c.
type pairJ struct {
	c int
	j float64
}

// equivalent reports whether groups a and b are magnetically equivalent:
// same nucleus and shift, and the same coupling to every other group (nz
// lists each group's non-zero couplings in order of partner).
func equivalent(gs []Group, nz [][]pairJ, a, b int) bool {
	if gs[a].IsProton() != gs[b].IsProton() || (!gs[a].IsProton() && gs[a].Nucleus != gs[b].Nucleus) {
		return false
	}
	if math.Abs(gs[a].ShiftPPM-gs[b].ShiftPPM) > equivTolPPM {
		return false
	}
	x, y := nz[a], nz[b]
	for len(x) > 0 || len(y) > 0 {
		var c int
		var ja, jb float64
		switch {
		case len(y) == 0 || (len(x) > 0 && x[0].c < y[0].c):
			c, ja, x = x[0].c, x[0].j, x[1:]
		case len(x) == 0 || y[0].c < x[0].c:
			c, jb, y = y[0].c, y[0].j, y[1:]
		default:
			c, ja, jb, x, y = x[0].c, x[0].j, y[0].j, x[1:], y[1:]
		}
		if c != a && c != b && math.Abs(ja-jb) > equivTolHz {
			return false
		}
	}
	return true
}

// clusters returns the 1H merged groups partitioned into clusters: by strong
// couplings in Auto mode, by non-zero couplings in Exact mode, one group per
// cluster in FirstOrder mode.
func (es *esys) clusters(opt Options) [][]int {
	n := len(es.g)
	parent := make([]int, n)
	for i := range parent {
		parent[i] = i
	}
	var find func(int) int
	find = func(x int) int {
		for parent[x] != x {
			parent[x] = parent[parent[x]]
			x = parent[x]
		}
		return x
	}
	for a := 0; a < n; a++ {
		for b := a + 1; b < n; b++ {
			if es.joined(a, b, opt) {
				parent[find(a)] = find(b)
			}
		}
	}
	idx := map[int]int{}
	var out [][]int
	for a := 0; a < n; a++ {
		if !es.g[a].proton {
			continue
		}
		r := find(a)
		k, ok := idx[r]
		if !ok {
			k = len(out)
			idx[r] = k
			out = append(out, nil)
		}
		out[k] = append(out[k], a)
	}
	return out
}

// joined reports whether merged groups a and b belong to one cluster.
func (es *esys) joined(a, b int, opt Options) bool {
	j := es.j[a][b]
	if j == 0 || !es.g[a].proton || !es.g[b].proton {
		return false
	}
	switch opt.Mode {
	case Exact:
		return true
	case Auto:
		return math.Abs(es.g[a].nu-es.g[b].nu) < opt.StrongRatio*math.Abs(j)
	}
	return false
}

// partners returns the merged groups outside cluster c coupled to it,
// largest |J| first.
func (es *esys) partners(c []int) []int {
	in := map[int]bool{}
	for _, g := range c {
		in[g] = true
	}
	var ps []int
	maxJ := map[int]float64{}
	for p := range es.g {
		if in[p] {
			continue
		}
		for _, g := range c {
			if j := math.Abs(es.j[g][p]); j > 0 {
				if _, ok := maxJ[p]; !ok {
					ps = append(ps, p)
				}
				maxJ[p] = math.Max(maxJ[p], j)
			}
		}
	}
	sort.SliceStable(ps, func(i, k int) bool { return maxJ[ps[i]] > maxJ[ps[k]] })
	return ps
}

// simulateCluster returns the lines of the groups of cluster c, including the
// effect of all outside partners.
func (es *esys) simulateCluster(c []int, opt Options) ([]rawLine, float64, error) {
	return es.simulateGroups(c, opt, -1)
}

// simulateGroups is simulateCluster keeping only the lines of group keep
// (all groups when keep < 0) before the first-order splitting by partners.
// With keep ≥ 0 (a fragment) transitions are attributed to groups by
// weight (sink.weighted), so that the kept lines are not negative.
func (es *esys) simulateGroups(c []int, opt Options, keep int) ([]rawLine, float64, error) {
	ps := es.partners(c)
	if len(c) == 1 && opt.Mode != Exact {
		g := c[0]
		lines := []rawLine{{hz: es.g[g].nu, inten: float64(es.g[g].n), eg: g}}
		lines, err := es.splitBy(lines, ps)
		return lines, 0, err
	}
	cost, err := es.exactCost(c, opt.MaxSpins)
	if err != nil {
		return nil, 0, err
	}
	// Take partners into the X-approximation while the number of
	// configurations and the total work stay bounded.
	budget := workBudget(opt.MaxSpins)
	nconf := 1.0
	k := 0
	limit := float64(maxConfigs)
	if keep >= 0 {
		limit = fragmentConfigs
	}
	for ; k < len(ps); k++ {
		next := nconf * float64(es.g[ps[k]].n+1)
		if next > limit || next*cost > budget {
			break
		}
		nconf = next
	}
	lines, dropped, err := es.exactLines(c, ps[:k], keep >= 0)
	if err != nil {
		return nil, 0, err
	}
	if keep >= 0 {
		lines = slices.DeleteFunc(lines, func(l rawLine) bool { return l.eg != keep })
	}
	lines, err = es.splitBy(mergeRaw(lines), ps[k:])
	return lines, dropped, err
}

// splitBy splits every line first-order by the partners ps, using the
// coupling between the line's group and each partner.
func (es *esys) splitBy(lines []rawLine, ps []int) ([]rawLine, error) {
	for _, p := range ps {
		n := es.g[p].n
		if len(lines)*(n+1) > MaxLines {
			return nil, fmt.Errorf("spin: splitting by group %q would give more than %d lines: %w", es.g[p].name, MaxLines, ErrTooLarge)
		}
		w := binomialWeights(n)
		out := make([]rawLine, 0, len(lines)*(n+1))
		for _, l := range lines {
			j := es.j[l.eg][p]
			if j == 0 {
				out = append(out, l)
				continue
			}
			for k, wk := range w {
				m := float64(n)/2 - float64(k)
				out = append(out, rawLine{hz: l.hz + j*m, inten: l.inten * wk, eg: l.eg})
			}
		}
		lines = mergeRaw(out)
	}
	return lines, nil
}

// binomialWeights returns C(n,k)/2^n for k = 0..n (Pascal's triangle).
func binomialWeights(n int) []float64 {
	w := make([]float64, n+1)
	w[0] = math.Pow(0.5, float64(n))
	for k := 1; k <= n; k++ {
		w[k] = w[k-1] * float64(n-k+1) / float64(k)
	}
	return w
}

// mergeRaw sorts lines by group and frequency and merges coincident ones.
func mergeRaw(lines []rawLine) []rawLine {
	sortRaw(lines)
	// Merge runs that start within mergeTolHz of their first line; the
	// merged line sits at the intensity-weighted position.
	out := lines[:0]
	start := 0.0
	for _, l := range lines {
		if n := len(out); n > 0 && out[n-1].eg == l.eg && l.hz-start <= mergeTolHz {
			q := &out[n-1]
			if t := q.inten + l.inten; t != 0 && q.inten*l.inten > 0 {
				q.hz = (q.hz*q.inten + l.hz*l.inten) / t
			}
			q.inten += l.inten
			continue
		}
		// A new run: the finished one is dropped if it came to nothing.
		if n := len(out); n > 0 && math.Abs(out[n-1].inten) <= minIntensity {
			out = out[:n-1]
		}
		start = l.hz
		out = append(out, l)
	}
	if n := len(out); n > 0 && math.Abs(out[n-1].inten) <= minIntensity {
		out = out[:n-1]
	}
	return out
}

// sortRaw sorts lines by group, then frequency, stably: a counting sort by
// group, then each group's run by an LSD radix sort on the frequency's bits
// (frequencies are finite; -0 sorts before +0).
func sortRaw(lines []rawLine) {
	if len(lines) < 2 {
		return
	}
	ng := 0
	for _, l := range lines {
		ng = max(ng, l.eg+1)
	}
	tmp := getLines(len(lines))
	defer putLines(tmp)
	start := make([]int, ng+1)
	for _, l := range lines {
		start[l.eg+1]++
	}
	for g := 1; g <= ng; g++ {
		start[g] += start[g-1]
	}
	if !slices.IsSortedFunc(lines, func(x, y rawLine) int { return x.eg - y.eg }) {
		next := slices.Clone(start[:ng])
		for _, l := range lines {
			tmp[next[l.eg]] = l
			next[l.eg]++
		}
		copy(lines, tmp)
	}
	sortGroup := func(g int) { radixByHz(lines[start[g]:start[g+1]], tmp[start[g]:start[g+1]]) }
	if len(lines) < 1<<15 {
		for g := 0; g < ng; g++ {
			sortGroup(g)
		}
		return
	}
	parallel(ng, sortGroup) // groups are independent
}

// hzKey maps a frequency to an integer of the same order.
func hzKey(hz float64) uint64 {
	k := math.Float64bits(hz)
	if k>>63 == 1 {
		return ^k
	}
	return k | 1<<63
}

// radixByHz sorts ls by frequency (stable), using tmp (same length) as
// scratch space. An LSD radix sort on the upper 32 bits of the key (one
// histogram pass for its four bytes; bytes that all lines share are
// skipped) leaves out of order only lines within about 1e-6 of each other
// relative to their frequency; insertion on the full key finishes, and a
// merge sort takes over should that need many moves (thousands of lines at
// one frequency).
func radixByHz(ls, tmp []rawLine) {
	byKey := func(x, y rawLine) int { return cmp.Compare(hzKey(x.hz), hzKey(y.hz)) }
	if len(ls) < 64 {
		slices.SortStableFunc(ls, byKey)
		return
	}
	var count [4][256]int
	for _, l := range ls {
		k := hzKey(l.hz) >> 32
		count[0][byte(k)]++
		count[1][byte(k>>8)]++
		count[2][byte(k>>16)]++
		count[3][byte(k>>24)]++
	}
	src, dst := ls, tmp
	for p := range count {
		c := &count[p]
		shift := 32 + 8*p
		if c[byte(hzKey(src[0].hz)>>shift)] == len(src) {
			continue
		}
		pos := 0
		for b, n := range c {
			c[b] = pos
			pos += n
		}
		for _, l := range src {
			b := byte(hzKey(l.hz) >> shift)
			dst[c[b]] = l
			c[b]++
		}
		src, dst = dst, src
	}
	if &src[0] != &ls[0] {
		copy(ls, src)
	}
	budget := 8 * len(ls)
	for i := 1; i < len(ls); i++ {
		l := ls[i]
		k := hzKey(l.hz)
		j := i
		for ; j > 0 && hzKey(ls[j-1].hz) > k; j-- {
			ls[j] = ls[j-1]
		}
		ls[j] = l
		if budget -= i - j; budget < 0 {
			slices.SortStableFunc(ls, byKey)
			return
		}
	}
}

// distribute shares each merged group's lines among its member groups in
// proportion to their counts and returns the sorted output lines.
func (es *esys) distribute(sys System, lines []rawLine, field float64) []Line {
	var out []Line
	single := true
	for _, g := range es.g {
		single = single && len(g.members) == 1
	}
	if single {
		// One line per raw line: converted in parallel for long lists.
		out = make([]Line, len(lines))
		parts := 1
		if len(lines) >= 1<<15 {
			parts = runtime.GOMAXPROCS(0)
		}
		parallel(parts, func(p int) {
			for i := len(lines) * p / parts; i < len(lines)*(p+1)/parts; i++ {
				l := lines[i]
				out[i] = Line{Hz: l.hz, PPM: l.hz / field, Intensity: l.inten, Group: es.g[l.eg].members[0]}
			}
		})
	} else {
		out = make([]Line, 0, len(lines))
		for _, l := range lines {
			eg := es.g[l.eg]
			for _, m := range eg.members {
				f := float64(sys.Groups[m].Count) / float64(eg.n)
				out = append(out, Line{Hz: l.hz, PPM: l.hz / field, Intensity: l.inten * f, Group: m})
			}
		}
	}
	byLine := func(x, y Line) int {
		if c := cmp.Compare(x.Group, y.Group); c != 0 {
			return c
		}
		if c := cmp.Compare(x.Hz, y.Hz); c != 0 {
			return c
		}
		return cmp.Compare(x.Intensity, y.Intensity)
	}
	// Usually already in order (lines come sorted by merged group and
	// frequency; most merged groups have one member).
	if !slices.IsSortedFunc(out, byLine) {
		slices.SortFunc(out, byLine)
	}
	return out
}
