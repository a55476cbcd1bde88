package spectrum

import (
	"errors"
	"fmt"
	"math"
	"sort"
)

// Default processing parameters (see ProcessOptions).
const (
	// DefaultMinSNR is the peak-picking threshold: a peak must rise five
	// noise standard deviations above the baseline. At 5σ a Gaussian noise
	// point exceeds the threshold with probability 3·10⁻⁷, so a
	// 262,144-point trace yields well under one false peak (common
	// practice, no source; ICH Q2 uses S/N 3 for detection and 10 for
	// quantitation, value from memory).
	DefaultMinSNR = 5.0
	// DefaultJMaxHz is the largest line spacing joined into one multiplet.
	DefaultJMaxHz = 20.0
	// DefaultSolvent is assumed when neither the options nor the file name one.
	DefaultSolvent = "CDCl3"
	// assumedFieldMHz is used when the file does not give the observe
	// frequency and the options do not either.
	assumedFieldMHz = 400.0
	minTracePoints  = 16
	// maxIntensity bounds |y| so that squares and sums of squares stay finite.
	maxIntensity = 1e150
)

// ProcessOptions controls Process. The zero value is ready to use.
type ProcessOptions struct {
	// Solvent names the solvent in any spelling NormalizeSolvent accepts;
	// "" takes the file's, else DefaultSolvent.
	Solvent string
	// Reference is RefAuto (""), RefTMS, RefSolvent or RefNone.
	Reference string
	// MinSNR is the peak-picking threshold in noise standard deviations;
	// 0 means DefaultMinSNR.
	MinSNR float64
	// JMaxHz is the largest spacing of lines joined into one multiplet;
	// 0 means DefaultJMaxHz.
	JMaxHz float64
	// IntegralRef fixes the integral scale; nil uses the whole-number rule
	// (see integrate.go).
	IntegralRef *IntegralRef
	// FieldMHz overrides the file's observe frequency when positive.
	FieldMHz float64
}

// Process references, baseline-corrects and analyses s: noise, peaks over
// MinSNR, multiplets with regions, relative integrals, multiplicities and J
// values. For a spectrum with only a PeakTable the peaks are grouped and
// analysed from their intensities. s is not modified. The error says what is
// wrong with the input or the options.
func Process(s *Spectrum, opt ProcessOptions) (*PeakList, error) {
	if s == nil {
		return nil, errors.New("process: no spectrum")
	}
	cfg, err := resolveOptions(s, opt)
	if err != nil {
		return nil, err
	}
	var pr *processed
	switch {
	case len(s.PPM) > 0:
		pr, err = processTrace(s, cfg)
	case len(s.PeakTable) > 0:
		pr, err = processTable(s, cfg)
	default:
		return nil, fmt.Errorf("%s: spectrum has neither a trace nor a peak table", sourceName(s))
	}
	if err != nil {
		return nil, err
	}
	return pr.finish(cfg)
}

// config is ProcessOptions with defaults filled in.
type config struct {
	ProcessOptions
	field    float64
	solvent  Solvent
	haveSol  bool
	warnings []string
}

func resolveOptions(s *Spectrum, opt ProcessOptions) (*config, error) {
	c := &config{ProcessOptions: opt}
	switch opt.Reference {
	case "":
		c.Reference = RefAuto
	case RefAuto, RefTMS, RefSolvent, RefNone:
	default:
		return nil, fmt.Errorf("process: reference must be auto, tms, solvent or none, found %q", opt.Reference)
	}
	if c.MinSNR == 0 {
		c.MinSNR = DefaultMinSNR
	}
	if !(c.MinSNR > 0) {
		return nil, fmt.Errorf("process: minimum S/N must be positive, found %g", opt.MinSNR)
	}
	if c.JMaxHz == 0 {
		c.JMaxHz = DefaultJMaxHz
	}
	if !(c.JMaxHz > 0) {
		return nil, fmt.Errorf("process: largest J must be positive, found %g", opt.JMaxHz)
	}
	c.field = s.FieldMHz
	if opt.FieldMHz > 0 {
		c.field = opt.FieldMHz
	}
	if !(c.field > 0) {
		c.field = assumedFieldMHz
		c.warnings = append(c.warnings, fmt.Sprintf("observe frequency unknown; Hz values assume %g MHz", assumedFieldMHz))
	}
	name := opt.Solvent
	if name == "" {
		name = s.Solvent
	}
	if name == "" {
		name = DefaultSolvent
		c.warnings = append(c.warnings, "solvent not given; assuming "+DefaultSolvent)
	}
	c.solvent, c.haveSol = LookupSolvent(name)
	if !c.haveSol {
		if opt.Solvent != "" {
			return nil, fmt.Errorf("process: unknown solvent %q", opt.Solvent)
		}
		c.warnings = append(c.warnings, fmt.Sprintf("solvent %q not recognised; no residual signal known", name))
	}
	return c, nil
}

func sourceName(s *Spectrum) string {
	if s.Source != "" {
		return s.Source
	}
	return "spectrum"
}

// processed is the state shared by the trace and table paths.
type processed struct {
	ppm, y []float64 // corrected trace (nil for a table)
	sigma  float64
	lines  []line
	groups []group
	points int
	table  bool
}

// processTrace runs baseline, noise, picking, grouping and integration on a
// trace.
func processTrace(s *Spectrum, c *config) (*processed, error) {
	n := len(s.PPM)
	if len(s.Y) != n {
		return nil, fmt.Errorf("%s: %d ppm values but %d intensities", sourceName(s), n, len(s.Y))
	}
	if n < minTracePoints {
		return nil, fmt.Errorf("%s: trace has %d points, need at least %d", sourceName(s), n, minTracePoints)
	}
	for i := range n {
		if !isFinite(s.PPM[i]) || !isFinite(s.Y[i]) {
			return nil, fmt.Errorf("%s: point %d is not a finite number", sourceName(s), i+1)
		}
		if i > 0 && !(s.PPM[i] > s.PPM[i-1]) {
			return nil, fmt.Errorf("%s: ppm axis not strictly ascending at point %d", sourceName(s), i+1)
		}
	}
	if m := maxAbs(s.Y); m > maxIntensity {
		// The baseline's squared residuals would overflow.
		return nil, fmt.Errorf("%s: intensities up to %g are too large to process; scale the trace down", sourceName(s), m)
	}
	ppm := append([]float64(nil), s.PPM...)
	perPPM := float64(n-1) / (ppm[n-1] - ppm[0])
	bl := estimateBaseline(s.Y, perPPM)
	y := bl.Z // the corrected trace replaces the baseline in its own slice
	for i, z := range y {
		y[i] = s.Y[i] - z
	}
	sigma := regionNoise(y, bl.Free)
	if !(sigma > 0) {
		// A noise-free (simulated) trace: use a tiny floor so S/N stays finite.
		sigma = 1e-9 * maxAbs(y)
		if !(sigma > 0) {
			return nil, fmt.Errorf("%s: trace is flat", sourceName(s))
		}
	}
	hzPerPoint := c.field / perPPM
	p := &processed{ppm: ppm, y: y, sigma: sigma, points: n}
	p.lines = pickLines(ppm, y, sigma, c.MinSNR, hzPerPoint)
	flagArtifacts(p.lines, c.field, p.heightAt)
	p.groups = groupLines(p.lines, c.field, c.JMaxHz, sigma, p.valley)
	if c.haveSol {
		p.groups = splitResidual(p.groups, p.lines, c.solvent, c.field)
	}
	for k := range p.groups {
		p.groups[k].analyze(p.lines, c.field)
	}
	setRegions(p.groups, p.lines, c.field)
	integrateTrace(p.groups, p.lines, ppm, y, c.field)
	return p, nil
}

// processTable groups and analyses a peak list.
func processTable(s *Spectrum, c *config) (*processed, error) {
	ls := make([]line, 0, len(s.PeakTable))
	for i, pk := range s.PeakTable {
		if !isFinite(pk.PPM) || !isFinite(pk.Intensity) {
			return nil, fmt.Errorf("%s: peak %d is not a finite number", sourceName(s), i+1)
		}
		h := pk.Intensity
		if h == 0 {
			h = 1 // a list of positions only: every line counts the same
		}
		ls = append(ls, line{ppm: pk.PPM, height: h, widthHz: pk.WidthHz, snr: pk.SNR, idx: -1})
	}
	sort.SliceStable(ls, func(a, b int) bool { return ls[a].ppm < ls[b].ppm })
	p := &processed{lines: ls, table: true}
	flagArtifacts(p.lines, c.field, nil)
	p.groups = groupLines(p.lines, c.field, c.JMaxHz, 0, func(int, int) float64 { return math.Inf(-1) })
	if c.haveSol {
		p.groups = splitResidual(p.groups, p.lines, c.solvent, c.field)
	}
	for k := range p.groups {
		p.groups[k].analyze(p.lines, c.field)
	}
	setRegions(p.groups, p.lines, c.field)
	integrateTable(p.groups, p.lines)
	return p, nil
}

// valley is the lowest corrected trace value between lines a and b.
func (p *processed) valley(a, b int) float64 {
	i, j := p.lines[a].idx, p.lines[b].idx
	if i > j {
		i, j = j, i
	}
	m := math.Inf(1)
	for _, v := range p.y[i : j+1] {
		if v < m { // the trace is finite: no NaN to propagate
			m = v
		}
	}
	return m
}

// heightAt is the corrected trace at a ppm position (0 outside the trace).
func (p *processed) heightAt(x float64) float64 {
	n := len(p.ppm)
	if n == 0 || x < p.ppm[0] || x > p.ppm[n-1] {
		return 0
	}
	k := sort.SearchFloat64s(p.ppm, x)
	if k >= n {
		k = n - 1
	}
	return p.y[k]
}

// finish references, scales the integrals and builds the PeakList.
func (p *processed) finish(c *config) (*PeakList, error) {
	ref := reference(p.groups, p.lines, c.solvent, c.haveSol, c.Reference, c.field)
	if c.haveSol {
		markWater(p.groups, c.solvent, ref.shift)
	}
	scale, err := scaleIntegrals(p.groups, shiftedRef(c.IntegralRef, ref.shift))
	if err != nil {
		return nil, err
	}
	pl := &PeakList{
		FieldMHz: c.field, Points: p.points, Noise: p.sigma,
		ReferencePPM: ref.shift, Reference: ref.used,
		Peaks: make([]Peak, len(p.lines)), Multiplets: make([]Multiplet, 0, len(p.groups)),
	}
	if c.haveSol {
		pl.Solvent = c.solvent.Name
	}
	pl.Warnings = append(append(pl.Warnings, c.warnings...), ref.warnings...)
	for i, l := range p.lines {
		pl.Peaks[i] = Peak{PPM: l.ppm + ref.shift, Intensity: l.height, SNR: l.snr, WidthHz: l.widthHz, Artifact: l.artifact}
	}
	for _, g := range p.groups {
		m := Multiplet{
			PPM: g.centerPPM + ref.shift, FromPPM: g.from + ref.shift, ToPPM: g.to + ref.shift,
			Integral: g.raw * scale, Multiplicity: g.multiplicity, JHz: g.j,
			Peaks: len(g.lines), Label: g.label, PeakIndex: append([]int(nil), g.lines...), RawArea: g.raw,
		}
		if m.JHz == nil {
			m.JHz = []float64{}
		}
		pl.Multiplets = append(pl.Multiplets, m)
	}
	if !p.table {
		tr := &Spectrum{PPM: p.ppm, Y: p.y, FieldMHz: c.field, Nucleus: "1H", Solvent: pl.Solvent}
		for i := range tr.PPM {
			tr.PPM[i] += ref.shift
		}
		pl.Trace = tr
	}
	return pl, nil
}

// shiftedRef moves a ppm integral reference from the referenced axis (as the
// user sees it) back to the file's axis, on which the groups still are.
func shiftedRef(r *IntegralRef, shift float64) *IntegralRef {
	if r == nil || math.IsNaN(r.PPM) {
		return r
	}
	c := *r
	c.PPM -= shift
	return &c
}

func isFinite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// maxAbs is the largest |x| in v (NaN if v holds a NaN).
func maxAbs(v []float64) float64 {
	m := 0.0
	for _, x := range v {
		if a := math.Abs(x); a > m {
			m = a
		} else if a != a {
			return a
		}
	}
	return m
}
