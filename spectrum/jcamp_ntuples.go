package spectrum

import (
	"math"
	"strings"
)

// ntPage is one ##PAGE= of an NTUPLES block with the records that follow it.
type ntPage struct {
	page *ldr
	recs []*ldr
}

func (p *ntPage) find(name string) *ldr {
	for _, r := range p.recs {
		if r.name == name {
			return r
		}
	}
	return nil
}

// ntVars holds the per-variable lists of an NTUPLES header.
type ntVars struct {
	names, symbols, units []string
	first, last, factor   []string
	dim                   []string
}

// list splits a comma-separated NTUPLES list value.
func (br *blockReader) list(name string) []string {
	r := br.b.find(name)
	if r == nil {
		return nil
	}
	f := strings.Split(r.fullValue(), ",")
	for i := range f {
		f[i] = strings.TrimSpace(f[i])
	}
	return f
}

func listAt(list []string, i int) string {
	if i < 0 || i >= len(list) {
		return ""
	}
	return list[i]
}

// ntuples reads the real part of an "##NTUPLES= NMR SPECTRUM" block
// (Davies & Lancashire 1993; JCAMP-DX 6 keeps the same layout).
func (br *blockReader) ntuples() error {
	nt := br.b.find("NTUPLES")
	kind := strings.ToUpper(nt.value)
	if strings.Contains(kind, "FID") {
		return errorf(br.file, nt.line, "time-domain data is not supported yet (##%s=%s)", nt.label, nt.value)
	}
	if strings.HasPrefix(kind, "ND ") || strings.Contains(kind, "2D") {
		return errorf(br.file, nt.line, "multidimensional NMR data is not supported (##%s=%s)", nt.label, nt.value)
	}
	v := ntVars{
		names: br.list("VARNAME"), symbols: br.list("SYMBOL"), units: br.list("UNITS"),
		first: br.list("FIRST"), last: br.list("LAST"), factor: br.list("FACTOR"), dim: br.list("VARDIM"),
	}
	if len(v.symbols) == 0 {
		return errorf(br.file, nt.line, "##NTUPLES= block without ##SYMBOL=")
	}
	pg, xsym, ysym, err := br.pickPage(v)
	if err != nil {
		return err
	}
	return br.decodePage(v, pg, xsym, ysym)
}

// pages splits the block's records into pages.
func (br *blockReader) pages() []*ntPage {
	var out []*ntPage
	var cur *ntPage
	for _, r := range br.b.recs {
		switch r.name {
		case "PAGE":
			cur = &ntPage{page: r}
			out = append(out, cur)
		case "ENDNTUPLES":
			cur = nil
		default:
			if cur != nil {
				cur.recs = append(cur.recs, r)
			}
		}
	}
	return out
}

// pickPage chooses the page of the real part: the first whose dependent
// variable is named .../REAL or has symbol R; else the first page.
func (br *blockReader) pickPage(v ntVars) (*ntPage, int, int, error) {
	nt := br.b.find("NTUPLES")
	var pick *ntPage
	xs, ys := -1, -1
	for _, p := range br.pages() {
		dt := p.find("DATATABLE")
		if dt == nil {
			continue
		}
		x, y, err := tableSymbols(br.file, dt, v.symbols)
		if err != nil {
			return nil, 0, 0, err
		}
		isReal := strings.Contains(strings.ToUpper(listAt(v.names, y)), "REAL") || strings.EqualFold(listAt(v.symbols, y), "R")
		if pick == nil || isReal {
			pick, xs, ys = p, x, y
		}
		if isReal {
			break
		}
	}
	if pick == nil {
		return nil, 0, 0, errorf(br.file, nt.line, "##NTUPLES= block without a ##PAGE= holding a ##DATA TABLE=")
	}
	return pick, xs, ys, nil
}

// tableSymbols parses "(X++(R..R)), XYDATA" into the indices of X and R in
// the ##SYMBOL= list.
func tableSymbols(file string, dt *ldr, symbols []string) (int, int, error) {
	v := strings.ToUpper(strings.Join(strings.Fields(dt.value), ""))
	form := "XYDATA"
	if i := strings.LastIndexByte(v, ','); i >= 0 {
		form = v[i+1:]
		v = v[:i]
	}
	bad := func() (int, int, error) {
		return 0, 0, errorf(file, dt.line, "##%s=%s: expected (X++(Y..Y)), XYDATA", dt.label, clip(dt.value))
	}
	if form != "XYDATA" {
		return 0, 0, errorf(file, dt.line, "##%s=: only XYDATA tables are supported, found %s", dt.label, form)
	}
	i := strings.Index(v, "++(")
	j := strings.Index(v, "..")
	if !strings.HasPrefix(v, "(") || i < 0 || j < i+3 {
		return bad()
	}
	xsym, ysym := v[1:i], v[i+3:j]
	x, y := -1, -1
	for k, s := range symbols {
		switch strings.ToUpper(s) {
		case xsym:
			x = k
		case ysym:
			y = k
		}
	}
	if x < 0 || y < 0 {
		return 0, 0, errorf(file, dt.line, "##%s=: symbols %s and %s are not both in ##SYMBOL=", dt.label, xsym, ysym)
	}
	return x, y, nil
}

// decodePage decodes the chosen page with the per-variable FIRST, LAST,
// FACTOR, VAR_DIM and UNITS of its two variables.
func (br *blockReader) decodePage(v ntVars, pg *ntPage, x, y int) error {
	dt := pg.find("DATATABLE")
	p := xyParams{xFactor: 1, yFactor: 1, nPoints: -1, table: dt, countLabel: "VAR_DIM"}
	line := br.b.find("NTUPLES").line
	num := func(list []string, i int, what string) (float64, bool, error) {
		s := listAt(list, i)
		if s == "" {
			return 0, false, nil
		}
		f, err := parseNum(s)
		if err != nil {
			return 0, false, errorf(br.file, line, "##%s= entry %d: expected a number, found %q", what, i+1, clip(s))
		}
		return f, true, nil
	}
	var err error
	if p.firstX, p.hasFirst, err = num(v.first, x, "FIRST"); err != nil {
		return err
	}
	if p.lastX, p.hasLast, err = num(v.last, x, "LAST"); err != nil {
		return err
	}
	if p.firstY, p.hasFirstY, err = num(v.first, y, "FIRST"); err != nil {
		return err
	}
	if r := br.b.find("FIRST"); r != nil {
		p.firstYLine = r.line
	}
	for _, f := range []struct {
		dst *float64
		i   int
	}{{&p.xFactor, x}, {&p.yFactor, y}} {
		val, ok, err := num(v.factor, f.i, "FACTOR")
		if err != nil {
			return err
		}
		if ok && val != 0 {
			*f.dst = val
		}
	}
	dim, ok, err := num(v.dim, y, "VAR_DIM")
	if err != nil {
		return err
	}
	if r := pg.find("NPOINTS"); r != nil {
		if dim, err = parseNum(r.value); err != nil {
			return errorf(br.file, r.line, "##NPOINTS: expected a number, found %q", clip(r.value))
		}
		ok = true
		p.countLabel = "NPOINTS"
	}
	if ok {
		if dim < 0 || dim != math.Trunc(dim) {
			return errorf(br.file, line, "##VAR_DIM=%s is not a count", fmtNum(dim))
		}
		p.nPoints = int(math.Min(dim, math.MaxInt32*2))
		p.nPointsLine = line
		if r := br.b.find("VARDIM"); r != nil && p.countLabel == "VAR_DIM" {
			p.nPointsLine = r.line
		}
	}
	p.units, p.unitsLine = listAt(v.units, x), line
	if r := br.b.find("UNITS"); r != nil {
		p.unitsLine = r.line
	}
	return br.decodeTrace(p)
}
