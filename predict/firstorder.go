package predict

import (
	"math"
	"sort"
	"strings"
)

// firstOrderLines splits every signal by its J list: n equivalent partners
// with coupling J give n+1 lines with binomial intensities (Pascal's
// triangle), applied successively for each partner set. Intensities of a
// signal sum to its number of protons.
func (s *system) firstOrderLines(opt Options) []Line {
	var out []Line
	for i := range s.envs {
		e := &s.envs[i]
		ls := []hzLine{{0, float64(e.env.NH)}}
		for _, ps := range e.partners {
			ls = split(ls, math.Abs(ps.j), ps.n)
		}
		out = append(out, toLines(ls, e.shift, opt.FieldMHz, e.env.Label)...)
	}
	return out
}

// hzLine is a line at an offset in Hz with an intensity.
type hzLine struct{ hz, in float64 }

// split splits each line into n+1 lines spaced j Hz with binomial weights,
// merging coincident lines.
func split(ls []hzLine, j float64, n int) []hzLine {
	w := binomial(n)
	out := make([]hzLine, 0, len(ls)*(n+1))
	for _, l := range ls {
		for k, c := range w {
			out = append(out, hzLine{l.hz + (float64(k)-float64(n)/2)*j, l.in * c})
		}
	}
	return mergeLines(out)
}

// binomial returns row n of Pascal's triangle divided by 2^n.
func binomial(n int) []float64 {
	w := []float64{1}
	for r := 0; r < n; r++ {
		next := make([]float64, len(w)+1)
		for k, v := range w {
			next[k] += v / 2
			next[k+1] += v / 2
		}
		w = next
	}
	return w
}

// mergeLines sorts lines by frequency and merges those closer than 1 mHz.
func mergeLines(ls []hzLine) []hzLine {
	sort.Slice(ls, func(a, b int) bool { return ls[a].hz < ls[b].hz })
	out := ls[:0]
	for _, l := range ls {
		if n := len(out); n > 0 && math.Abs(out[n-1].hz-l.hz) < 1e-3 {
			out[n-1].in += l.in
			continue
		}
		out = append(out, l)
	}
	return out
}

// toLines converts offsets around shift (ppm) into Lines.
func toLines(ls []hzLine, shift, field float64, label string) []Line {
	out := make([]Line, 0, len(ls))
	for _, l := range ls {
		out = append(out, Line{PPM: round(shift+l.hz/field, 1e-5), Intensity: round(l.in, 1e-6), Signal: label})
	}
	return out
}

// multiplicity names signal i in the trade's notation.
func (s *system) multiplicity(i int, opt Options) string {
	e := &s.envs[i]
	var sets []partnerSet
	for _, ps := range e.partners {
		if math.Abs(ps.j) < opt.LineWidthHz {
			continue // merges into the line width
		}
		if !ps.hetero && math.Abs(ps.deltaHz) < strongNames*math.Abs(ps.j) {
			return "m" // strongly coupled: not a first-order pattern
		}
		sets = append(sets, ps)
	}
	if len(sets) == 0 {
		if e.env.Exchangeable {
			return "br s"
		}
		return "s"
	}
	return nameSets(mergeSets(sets, opt.LineWidthHz))
}

// eqSet is a set of n partners with (nearly) the same |J|.
type eqSet struct {
	j float64
	n int
}

// mergeSets merges partner sets whose |J| agree within the line width or
// 10 %, largest J first.
func mergeSets(sets []partnerSet, lw float64) []eqSet {
	var out []eqSet
	for _, ps := range sets {
		j := math.Abs(ps.j)
		merged := false
		for k := range out {
			if math.Abs(out[k].j-j) <= math.Max(lw, 0.1*j) {
				out[k].j = (out[k].j*float64(out[k].n) + j*float64(ps.n)) / float64(out[k].n+ps.n)
				out[k].n += ps.n
				merged = true
				break
			}
		}
		if !merged {
			out = append(out, eqSet{j, ps.n})
		}
	}
	sort.SliceStable(out, func(a, b int) bool { return out[a].j > out[b].j })
	return out
}

// setNames are the names of n equivalent partners, n = 1…6.
var setNames = [...]string{"", "d", "t", "q", "p", "sext", "sept"}

// nameSets joins the set names in descending J: "dt", "ddd", "tq"; "m" for
// more than three sets or a set too large to name in a combination.
func nameSets(sets []eqSet) string {
	if len(sets) > 3 {
		return "m"
	}
	if len(sets) == 1 {
		if sets[0].n < len(setNames) {
			return setNames[sets[0].n]
		}
		return "m"
	}
	var b strings.Builder
	for _, st := range sets {
		if st.n > 3 {
			return "m"
		}
		b.WriteString(setNames[st.n])
	}
	return b.String()
}
