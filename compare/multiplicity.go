package compare

import (
	"math"
	"sort"
	"strings"

	"shiftwise/predict"
)

// pattern is a first-order multiplicity read from a label such as "dt":
// the multiplicity (number of lines) of each splitting. known is false for
// "m" and unrecognised labels; broad marks "br".
type pattern struct {
	n     []int
	known bool
	broad bool
}

var multWords = map[string]int{
	"s": 1, "d": 2, "t": 3, "q": 4, "p": 5, "quint": 5, "quin": 5, "pent": 5,
	"sext": 6, "sxt": 6, "h": 6, "hept": 7, "sept": 7, "oct": 8, "non": 9,
}

// parsePattern reads a multiplicity label: "s", "d", "t", "q", "quint",
// "sext", "sept", and letter strings such as "dd", "dt", "tdd"; "br s" and
// "bs" are broad singlets; "m" (or anything else) is unknown.
func parsePattern(label string) pattern {
	l := strings.ToLower(strings.TrimSpace(label))
	var p pattern
	if strings.HasPrefix(l, "br") {
		p.broad = true
		l = strings.TrimSpace(strings.TrimPrefix(strings.TrimPrefix(l, "br"), "."))
	}
	if l == "bs" {
		p.broad, l = true, "s"
	}
	if l == "" && p.broad {
		l = "s"
	}
	if n, ok := multWords[l]; ok {
		if n > 1 {
			p.n = []int{n}
		}
		p.known = true
		return p
	}
	for _, r := range l {
		n, ok := multWords[string(r)]
		if !ok || n == 1 || r == 'p' || r == 'h' {
			return pattern{broad: p.broad}
		}
		p.n = append(p.n, n)
	}
	p.known = len(p.n) > 0
	return p
}

// lines returns the number of lines of a first-order pattern.
func (p pattern) lines() int {
	n := 1
	for _, k := range p.n {
		n *= k
	}
	return n
}

// multCost scores the agreement of a predicted and a measured multiplicity:
// 0 for the same pattern, 0.3 when one side is unknown ("m") or the line
// counts agree (dd vs q), up to 3 for very different patterns.
func multCost(pred, meas string) float64 {
	a, b := parsePattern(pred), parsePattern(meas)
	if !a.known || !b.known {
		return 0.3
	}
	if equalInts(a.n, b.n) {
		return 0
	}
	la, lb := a.lines(), b.lines()
	if la == lb {
		return 0.3
	}
	if len(b.n) > 0 && subMultiset(b.n, a.n) {
		return 0.4 // measured lacks some predicted splittings: small J unresolved
	}
	if len(a.n) > 0 && subMultiset(a.n, b.n) {
		return 0.8 // measured shows a splitting not predicted
	}
	if b.broad && la <= 2 {
		return 0.3 // small splittings blur into a broad line
	}
	c := 1.2 * math.Abs(math.Log2(float64(la)/float64(lb)))
	if (la == 1) != (lb == 1) {
		c += 0.8 // a singlet versus a split signal is a strong clue
	}
	return math.Min(3, c)
}

func equalInts(a, b []int) bool {
	x := append([]int(nil), a...)
	y := append([]int(nil), b...)
	sort.Ints(x)
	sort.Ints(y)
	if len(x) != len(y) {
		return false
	}
	for i := range x {
		if x[i] != y[i] {
			return false
		}
	}
	return true
}

// JTolHz is the tolerance for comparing a predicted and a measured J:
// typical couplings vary by ±1.5 Hz with substitution (common practice, no
// source).
const JTolHz = 1.5

// distinctJ returns the predicted couplings of at least 1 Hz, merged when
// within 0.8 Hz of each other, largest first.
func distinctJ(s predict.Signal) []float64 {
	var js []float64
	for _, c := range s.Couplings {
		if math.Abs(c.JHz) >= 1 {
			js = append(js, math.Abs(c.JHz))
		}
	}
	sort.Sort(sort.Reverse(sort.Float64Slice(js)))
	var out []float64
	for _, j := range js {
		if len(out) == 0 || out[len(out)-1]-j > 0.8 {
			out = append(out, j)
		}
	}
	return out
}

// jCost compares the largest predicted couplings with the measured ones
// (both largest first): 0 when within JTolHz, growing to 2.
//
// When the two sides have different numbers of couplings the patterns
// differ, which the multiplicity term already counts: then only the
// largest couplings are compared, at half weight.
func jCost(pred []float64, meas []float64) float64 {
	if len(pred) == 0 || len(meas) == 0 {
		return 0
	}
	if len(pred) != len(meas) {
		return 0.5 * jCost(pred[:1], largest(meas))
	}
	m := append([]float64(nil), meas...)
	sort.Sort(sort.Reverse(sort.Float64Slice(m)))
	n := min(len(pred), len(m))
	sum := 0.0
	for i := 0; i < n; i++ {
		sum += math.Abs(pred[i] - m[i])
	}
	r := sum / float64(n) / JTolHz
	if r <= 1 {
		return 0
	}
	return math.Min(2, 0.5*(r-1)*(r-1)+0.3*(r-1))
}

// subMultiset reports whether every element of a occurs in b (counting
// repeats).
func subMultiset(a, b []int) bool {
	left := map[int]int{}
	for _, x := range b {
		left[x]++
	}
	for _, x := range a {
		if left[x] == 0 {
			return false
		}
		left[x]--
	}
	return true
}

// smallJHz: couplings below this are often not resolved in measured
// multiplets (line width, digital resolution; common practice, no source).
const smallJHz = 2.5

// signalMultCost is multCost for a predicted signal, also accepting (at 0.4)
// the pattern left when its couplings below smallJHz are not resolved.
// nhOf gives the number of H of each signal label.
func signalMultCost(s predict.Signal, meas string, nhOf map[string]int) float64 {
	c := multCost(s.Multiplicity, meas)
	if c <= 0.4 {
		return c
	}
	b := parsePattern(meas)
	if !b.known {
		return c
	}
	var red []int
	for _, cp := range s.Couplings {
		if math.Abs(cp.JHz) < smallJHz {
			continue
		}
		n := 1
		if k, ok := nhOf[cp.To]; ok {
			n = k
		}
		red = append(red, n+1)
	}
	if equalInts(red, b.n) {
		return 0.4
	}
	return c
}

// largest returns the largest value of xs as a one-element slice.
func largest(xs []float64) []float64 {
	m := xs[0]
	for _, x := range xs[1:] {
		m = math.Max(m, x)
	}
	return []float64{m}
}

// blurredFrac: a single measured line at least this fraction as wide (Hz,
// at half height) as the total span of a signal's predicted pattern can be
// that pattern unresolved: lines closer than about their width merge
// (common practice, no source; the Rayleigh-type criterion for two
// Lorentzians).
const blurredFrac = 0.8

// patternSpanHz is the distance between the outer lines of a signal's
// first-order pattern: Σ n·|J| over its couplings (n the H of the partner
// signal, 1 for a heteronucleus).
func patternSpanHz(s predict.Signal, nhOf map[string]int) float64 {
	span := 0.0
	for _, c := range s.Couplings {
		n := 1
		if k, ok := nhOf[c.To]; ok {
			n = k
		}
		span += float64(n) * math.Abs(c.JHz)
	}
	return span
}

// seenMult is the measured multiplicity as a signal can read it: a
// multiplet that is one broad line (width ≥ broadLineHz) at least
// blurredFrac as wide as the signal's predicted pattern is that pattern
// unresolved ("m": low digital resolution, heavy apodisation, shimming),
// not a singlet.
func seenMult(s predict.Signal, m mplet, nhOf map[string]int) string {
	if !broadLine(m) {
		return m.mult
	}
	if span := patternSpanHz(s, nhOf); span > 0 && m.pk[0].WidthHz >= blurredFrac*span {
		return "m"
	}
	return m.mult
}
