package spectrum

import (
	"fmt"
	"math"
	"sort"
	"strings"
)

// xyParams describes one equally spaced table: the header values that
// give its abscissa and scale.
type xyParams struct {
	firstX, lastX, deltaX   float64
	hasFirst, hasLast, hasD bool
	deltaLine               int
	xFactor, yFactor        float64
	nPoints                 int // -1 when unknown
	nPointsLine             int
	countLabel              string // "NPOINTS" or "VAR_DIM", for messages
	firstY                  float64
	hasFirstY               bool
	firstYLine              int
	units                   string
	unitsLine               int
	table                   *ldr // the ##XYDATA= or ##DATA TABLE= record
}

// count names the record that gave nPoints.
func (p *xyParams) count() string {
	if p.countLabel == "" {
		return "NPOINTS"
	}
	return p.countLabel
}

// xydata reads a ##XYDATA=(X++(Y..Y)) block.
func (br *blockReader) xydata() error {
	p := xyParams{xFactor: 1, yFactor: 1, nPoints: -1}
	p.table = br.b.find("XYDATA")
	if err := checkXYForm(br.file, p.table); err != nil {
		return err
	}
	var err error
	var line int
	if p.firstX, p.hasFirst, _, err = br.optNum("FIRSTX"); err != nil {
		return err
	}
	if p.lastX, p.hasLast, _, err = br.optNum("LASTX"); err != nil {
		return err
	}
	if p.deltaX, p.hasD, p.deltaLine, err = br.optNum("DELTAX"); err != nil {
		return err
	}
	if f, ok, line, err := br.optNum("XFACTOR"); err != nil {
		return err
	} else if ok {
		if f == 0 {
			return errorf(br.file, line, "##XFACTOR= is zero")
		}
		p.xFactor = f
	}
	if f, ok, line, err := br.optNum("YFACTOR"); err != nil {
		return err
	} else if ok {
		if f == 0 {
			return errorf(br.file, line, "##YFACTOR= is zero")
		}
		p.yFactor = f
	}
	var n float64
	var ok bool
	if n, ok, line, err = br.optNum("NPOINTS"); err != nil {
		return err
	} else if ok {
		if n < 0 || n != math.Trunc(n) {
			return errorf(br.file, line, "##NPOINTS=%s is not a count", fmtNum(n))
		}
		p.nPoints = int(math.Min(n, math.MaxInt32*2))
		p.nPointsLine = line
	}
	if r := br.b.find("XUNITS"); r != nil {
		p.units, p.unitsLine = r.value, r.line
	}
	if p.firstY, p.hasFirstY, p.firstYLine, err = br.optNum("FIRSTY"); err != nil {
		return err
	}
	return br.decodeTrace(p)
}

// checkXYForm accepts "(X++(Y..Y))" with any spacing and symbol names.
func checkXYForm(file string, r *ldr) error {
	v := strings.ToUpper(strings.Join(strings.Fields(r.value), ""))
	if i := strings.IndexByte(v, ','); i >= 0 {
		v = v[:i]
	}
	if !strings.Contains(v, "++(") || !strings.Contains(v, "..") {
		return errorf(file, r.line, "##%s=%s: only the (X++(Y..Y)) form is supported", r.label, clip(r.value))
	}
	return nil
}

// decodeTrace decodes the table's lines and builds the ppm trace.
func (br *blockReader) decodeTrace(p xyParams) error {
	if isTimeUnit(p.units) {
		return errorf(br.file, p.unitsLine, "time-domain data is not supported yet (X units %s)", p.units)
	}
	d := xyDecoder{file: br.file, maxN: maxPoints}
	if p.nPoints >= 0 && p.nPoints < d.maxN {
		d.maxN = p.nPoints
		d.limit = fmt.Sprintf("##%s=%d", p.count(), p.nPoints)
	}
	d.ys = make([]float64, 0, preallocPoints(p))
	d.marks = make([]lineMark, 0, len(p.table.more))
	for _, l := range p.table.more {
		if err := d.decodeLine(l.num, l.text); err != nil {
			return err
		}
	}
	n := len(d.ys)
	if n == 0 {
		return errorf(br.file, p.table.line, "##%s= holds no data points", p.table.label)
	}
	if p.nPoints >= 0 && n != p.nPoints {
		return errorf(br.file, p.table.lastLine(), "##%s=%d (line %d) but the data hold %d points (file truncated?)",
			p.count(), p.nPoints, p.nPointsLine, n)
	}
	xs, err := br.abscissa(p, d.marks, n)
	if err != nil {
		return err
	}
	for i := range d.ys {
		d.ys[i] *= p.yFactor
	}
	// FIRSTY is rounded in most files: allow one Y step or 1e-4 relative.
	if p.hasFirstY && math.Abs(d.ys[0]-p.firstY) > math.Max(math.Abs(p.yFactor), 1e-4*math.Abs(p.firstY)) {
		br.warnf(p.firstYLine, "first Y value %s disagrees with the header's %s (check YFACTOR)", fmtNum(d.ys[0]), fmtNum(p.firstY))
	}
	return br.setTrace(xs, d.ys, p.units, p.unitsLine, p.table.line)
}

// preallocPoints sizes the Y slice: the claimed point count, but never
// more than four points per byte of data (a false claim then costs at most
// 32 bytes per byte of input) nor maxPrealloc. Heavily DUP-compressed data
// may need more; the slice then grows as values are decoded.
func preallocPoints(p xyParams) int {
	size := 0
	for _, l := range p.table.more {
		size += len(l.text)
	}
	return min(max(p.nPoints, 0), 4*size, maxPrealloc)
}

// abscissa computes the X of every point from FIRSTX/LASTX (or DELTAX) and
// checks it against the X written at the start of each line.
func (br *blockReader) abscissa(p xyParams, marks []lineMark, n int) ([]float64, error) {
	first := p.firstX
	if !p.hasFirst {
		if len(marks) == 0 {
			return nil, errorf(br.file, p.table.line, "missing ##FIRSTX=")
		}
		first = marks[0].x * p.xFactor
	}
	var step float64
	switch {
	case p.hasLast && n > 1:
		step = (p.lastX - first) / float64(n-1)
		if p.hasD && math.Abs(step-p.deltaX) > 1e-3*math.Abs(step)+1e-12 {
			br.warnf(p.deltaLine, "##DELTAX=%s disagrees with (LASTX-FIRSTX)/(NPOINTS-1) = %s; using the latter",
				fmtNum(p.deltaX), fmtNum(step))
		}
	case p.hasD:
		step = p.deltaX
	case n > 1:
		return nil, errorf(br.file, p.table.line, "need ##LASTX= or ##DELTAX= to place the points")
	}
	br.checkLineX(p, marks, first, step)
	xs := make([]float64, n)
	for i := range xs {
		xs[i] = first + float64(i)*step
	}
	return xs, nil
}

// checkLineX warns when the X at the start of a line is more than one point
// spacing away from where FIRSTX and the spacing place that point.
func (br *blockReader) checkLineX(p xyParams, marks []lineMark, first, step float64) {
	tol := math.Abs(step)
	if tol == 0 {
		tol = 1e-9 * math.Max(1, math.Abs(first))
	}
	warned := 0
	for _, m := range marks {
		want := first + float64(m.index)*step
		got := m.x * p.xFactor
		if math.Abs(got-want) > tol {
			br.warnf(m.line, "line starts at X=%s but point %d lies at %s (FIRSTX + index*DELTAX)",
				fmtNum(got), m.index+1, fmtNum(want))
			if warned++; warned == 3 {
				return
			}
		}
	}
}

// toPPM converts abscissae in units to ppm in place.
func (br *blockReader) toPPM(xs []float64, units string, unitsLine, line int) error {
	switch normLabel(units) {
	case "PPM":
		return nil
	case "HZ":
		mhz := br.s.FieldMHz
		if mhz == 0 {
			mhz = br.opt.FieldMHz
			br.s.FieldMHz = mhz
		}
		if mhz <= 0 {
			return errorf(br.file, line, "X in HZ but no ##.OBSERVE FREQUENCY=; cannot convert Hz to ppm (give the field in MHz)")
		}
		for i := range xs {
			xs[i] /= mhz
		}
		return nil
	case "":
		return errorf(br.file, line, "missing ##XUNITS=; expected HZ or PPM")
	}
	return errorf(br.file, unitsLine, "X units %q are not an NMR axis; expected HZ or PPM", units)
}

// setTrace converts xs to ppm, applies ##.SHIFT REFERENCE and stores the
// trace in ascending ppm order.
func (br *blockReader) setTrace(xs, ys []float64, units string, unitsLine, line int) error {
	if err := br.toPPM(xs, units, unitsLine, line); err != nil {
		return err
	}
	if err := br.shiftReference(xs); err != nil {
		return err
	}
	for _, x := range xs {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return errorf(br.file, line, "X values overflow (check FIRSTX, LASTX, XFACTOR)")
		}
	}
	sortTrace(xs, ys)
	br.s.PPM, br.s.Y = xs, ys
	return nil
}

// sortTrace puts a trace in ascending x order: reversed when it runs
// downwards (the usual NMR order), sorted when it is unordered (XYPOINTS).
func sortTrace(xs, ys []float64) {
	if len(xs) > 1 && xs[0] > xs[len(xs)-1] {
		reverseFloats(xs)
		reverseFloats(ys)
	}
	if sort.Float64sAreSorted(xs) {
		return
	}
	idx := make([]int, len(xs))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return xs[idx[a]] < xs[idx[b]] })
	x2 := make([]float64, len(xs))
	y2 := make([]float64, len(ys))
	for i, k := range idx {
		x2[i], y2[i] = xs[k], ys[k]
	}
	copy(xs, x2)
	copy(ys, y2)
}

// shiftReference applies "##.SHIFT REFERENCE= type, compound, point, ppm"
// (Davies & Lancashire 1993): data point number point (1-based, in file
// order) lies at ppm. Out-of-range point numbers (often 0) are ignored.
func (br *blockReader) shiftReference(xs []float64) error {
	r := br.b.find(".SHIFTREFERENCE")
	if r == nil {
		return nil
	}
	f := strings.Split(r.value, ",")
	if len(f) < 4 {
		br.warnf(r.line, "##%s= has %d fields, expected 4; ignored", r.label, len(f))
		return nil
	}
	pt, err1 := parseNum(f[2])
	ppm, err2 := parseNum(f[3])
	if err1 != nil || err2 != nil {
		return errorf(br.file, r.line, "##%s=: expected \"type, compound, point, ppm\", found %q", r.label, clip(r.value))
	}
	if pt < 1 || pt > float64(len(xs)) || pt != math.Trunc(pt) {
		return nil
	}
	off := ppm - xs[int(pt)-1]
	for i := range xs {
		xs[i] += off
	}
	return nil
}

func reverseFloats(v []float64) {
	for i, j := 0, len(v)-1; i < j; i, j = i+1, j-1 {
		v[i], v[j] = v[j], v[i]
	}
}

// tuples reads the AFFN numbers of a (XY..XY)-style table in groups of k.
func (br *blockReader) tuples(r *ldr, k int) ([][]float64, error) {
	var out [][]float64
	cur := make([]float64, 0, k)
	lastLine := r.line
	for _, l := range r.more {
		sc := lineScanner{s: l.text}
		for {
			kind, v, ok, msg := sc.next()
			if !ok {
				break
			}
			if msg != "" {
				return nil, errorf(br.file, l.num, "%s", msg)
			}
			if kind != tokAbs {
				return nil, errorf(br.file, l.num, "compressed value in ##%s=; expected plain numbers", r.label)
			}
			if len(out) >= maxPoints {
				return nil, errorf(br.file, l.num, "more than %d entries", maxPoints)
			}
			cur = append(cur, v)
			if len(cur) == k {
				out = append(out, cur)
				cur = make([]float64, 0, k)
			}
		}
		lastLine = l.num
	}
	if len(cur) != 0 {
		return nil, errorf(br.file, lastLine, "incomplete entry at the end of ##%s=: %d of %d values", r.label, len(cur), k)
	}
	return out, nil
}

// tupleSize reads the variable list of a table: (XY..XY) gives 2,
// (XYW..XYW) gives 3.
func tupleSize(file string, r *ldr) (int, error) {
	v := strings.ToUpper(strings.Join(strings.Fields(r.value), ""))
	switch {
	case strings.HasPrefix(v, "(XY..XY)"):
		return 2, nil
	case strings.HasPrefix(v, "(XYW..XYW)"):
		return 3, nil
	}
	return 0, errorf(file, r.line, "##%s=%s: only (XY..XY) and (XYW..XYW) are supported", r.label, clip(r.value))
}

// xyFactors returns XFACTOR and YFACTOR (1 when absent).
func (br *blockReader) xyFactors() (xf, yf float64, err error) {
	xf, yf = 1, 1
	if f, ok, _, e := br.optNum("XFACTOR"); e != nil {
		return 0, 0, e
	} else if ok {
		xf = f
	}
	if f, ok, _, e := br.optNum("YFACTOR"); e != nil {
		return 0, 0, e
	} else if ok {
		yf = f
	}
	return xf, yf, nil
}

// xypoints reads ##XYPOINTS=(XY..XY): an unevenly spaced trace.
func (br *blockReader) xypoints() error {
	r := br.b.find("XYPOINTS")
	if _, err := tupleSize(br.file, r); err != nil {
		return err
	}
	rows, err := br.tuples(r, 2)
	if err != nil {
		return err
	}
	if len(rows) == 0 {
		return errorf(br.file, r.line, "##%s= holds no points", r.label)
	}
	xf, yf, err := br.xyFactors()
	if err != nil {
		return err
	}
	units, unitsLine := br.units()
	if isTimeUnit(units) {
		return errorf(br.file, unitsLine, "time-domain data is not supported yet (X units %s)", units)
	}
	xs := make([]float64, len(rows))
	ys := make([]float64, len(rows))
	for i, row := range rows {
		xs[i], ys[i] = row[0]*xf, row[1]*yf
	}
	return br.setTrace(xs, ys, units, unitsLine, r.line)
}

// units returns the ##XUNITS= value and its line.
func (br *blockReader) units() (string, int) {
	if r := br.b.find("XUNITS"); r != nil {
		return r.value, r.line
	}
	return "", 0
}

// peakTable reads ##PEAK TABLE=(XY..XY) or (XYW..XYW) into PeakTable.
func (br *blockReader) peakTable() error {
	r := br.b.find("PEAKTABLE")
	k, err := tupleSize(br.file, r)
	if err != nil {
		return err
	}
	rows, err := br.tuples(r, k)
	if err != nil {
		return err
	}
	xf, yf, err := br.xyFactors()
	if err != nil {
		return err
	}
	units, unitsLine := br.units()
	xs := make([]float64, len(rows))
	for i, row := range rows {
		xs[i] = row[0] * xf
	}
	if err := br.toPPM(xs, units, unitsLine, r.line); err != nil {
		return err
	}
	for _, x := range xs {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return errorf(br.file, r.line, "peak positions overflow (check XFACTOR)")
		}
	}
	for i, row := range rows {
		p := Peak{PPM: xs[i], Intensity: row[1] * yf}
		if k == 3 {
			p.WidthHz = row[2] * xf
			if normLabel(units) == "PPM" {
				p.WidthHz *= br.s.FieldMHz // 0 when the field is unknown
			}
		}
		br.s.PeakTable = append(br.s.PeakTable, p)
	}
	sort.SliceStable(br.s.PeakTable, func(i, j int) bool { return br.s.PeakTable[i].PPM < br.s.PeakTable[j].PPM })
	return nil
}
