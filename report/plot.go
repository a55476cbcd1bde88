package report

import (
	"bytes"
	"fmt"
	"image/color"
	"math"
	"sort"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"shiftwise/compare"
	"shiftwise/predict"
)

// Palette of our own: measured trace in ink, prediction in slate blue,
// unexplained peaks in burnt orange.
var (
	inkColor       = color.RGBA{R: 0x22, G: 0x22, B: 0x2b, A: 0xff}
	predColor      = color.RGBA{R: 0x3d, G: 0x5a, B: 0x98, A: 0xff}
	flagColor      = color.RGBA{R: 0xc2, G: 0x5b, B: 0x12, A: 0xff}
	maxPlotPoints  = 1200 // min/max decimation keeps SVGs small whatever the trace length
	overviewWidth  = 26 * vg.Centimeter
	overviewHeight = 11 * vg.Centimeter
	zoomWidth      = 6.2 * vg.Centimeter
	zoomHeight     = 4.6 * vg.Centimeter
)

// window is a ppm range, From < To.
type window struct{ From, To float64 }

// decimate reduces (x, y) within w to at most about n points by keeping the
// minimum and maximum of each bucket, so peaks survive the reduction.
func decimate(x, y []float64, w window, n int) plotter.XYs {
	lo := sort.SearchFloat64s(x, w.From)
	hi := sort.SearchFloat64s(x, w.To)
	if hi > len(x) {
		hi = len(x)
	}
	if hi-lo <= n {
		out := make(plotter.XYs, 0, hi-lo)
		for i := lo; i < hi; i++ {
			out = append(out, plotter.XY{X: x[i], Y: y[i]})
		}
		return out
	}
	buckets := n / 2
	out := make(plotter.XYs, 0, 2*buckets)
	for b := 0; b < buckets; b++ {
		s := lo + (hi-lo)*b/buckets
		e := lo + (hi-lo)*(b+1)/buckets
		imin, imax := s, s
		for i := s; i < e; i++ {
			if y[i] < y[imin] {
				imin = i
			}
			if y[i] > y[imax] {
				imax = i
			}
		}
		if imin > imax {
			imin, imax = imax, imin
		}
		out = append(out, plotter.XY{X: x[imin], Y: y[imin]})
		if imax != imin {
			out = append(out, plotter.XY{X: x[imax], Y: y[imax]})
		}
	}
	return out
}

// maxIn returns the largest y within w.
func maxIn(x, y []float64, w window) float64 {
	m := 0.0
	lo := sort.SearchFloat64s(x, w.From)
	for i := lo; i < len(x) && x[i] <= w.To; i++ {
		if y[i] > m {
			m = y[i]
		}
	}
	return m
}

// svgOf renders p to an SVG string of the given size.
func svgOf(p *plot.Plot, w, h vg.Length) (string, error) {
	wt, err := p.WriterTo(w, h, "svg")
	if err != nil {
		return "", err
	}
	var b bytes.Buffer
	if _, err := wt.WriteTo(&b); err != nil {
		return "", err
	}
	s := b.String()
	// Drop the XML prolog so the SVG can be inlined in HTML.
	if i := bytes.Index(b.Bytes(), []byte("<svg")); i > 0 {
		s = s[i:]
	}
	return s, nil
}

// spectrumWindow chooses the ppm range to show: the measured trace's span
// clipped to the usual 1H range, widened to include every predicted line.
func spectrumWindow(r *compare.Result) window {
	w := window{From: -0.5, To: 10.5}
	if r.Trace != nil && len(r.Trace.PPM) > 1 {
		w.From = math.Max(w.From, r.Trace.PPM[0])
		w.To = math.Min(w.To, r.Trace.PPM[len(r.Trace.PPM)-1])
	}
	if r.Prediction != nil {
		for _, l := range r.Prediction.Lines {
			w.From = math.Min(w.From, l.PPM-0.2)
			w.To = math.Max(w.To, l.PPM+0.2)
		}
	}
	return w
}

// predictedTrace renders the prediction on the grid of the measured trace
// (or a default grid) scaled to the measured maximum, negated for mirroring.
func predictedTrace(r *compare.Result, w window, scale float64, lwHz float64) ([]float64, []float64) {
	if r.Prediction == nil || len(r.Prediction.Lines) == 0 {
		return nil, nil
	}
	n := 8192
	x, y := predict.Render(r.Prediction, w.From, w.To, n, lwHz)
	m := 0.0
	for _, v := range y {
		m = math.Max(m, v)
	}
	if m == 0 {
		return x, y
	}
	for i := range y {
		y[i] = -y[i] / m * scale
	}
	return x, y
}

// newSpectrumPlot makes a plot with the trade's reversed ppm axis.
func newSpectrumPlot(w window, title string) *plot.Plot {
	p := plot.New()
	p.Title.Text = title
	p.X.Label.Text = "δ / ppm"
	p.X.Min, p.X.Max = w.From, w.To
	p.X.Scale = plot.InvertedScale{Normalizer: plot.LinearScale{}}
	p.X.Tick.Marker = ppmTicks{}
	p.Y.Tick.Marker = plot.ConstantTicks(nil)
	p.HideY()
	return p
}

// ppmTicks places ticks where plot.DefaultTicks does and labels them with
// as many decimals as their spacing needs: the enlarged multiplet panels
// span a few hundredths of a ppm, where the default labels read
// "1.4 1.4 1.4".
type ppmTicks struct{}

// Ticks implements plot.Ticker.
func (ppmTicks) Ticks(lo, hi float64) []plot.Tick {
	ts := plot.DefaultTicks{}.Ticks(lo, hi)
	var major []int
	for i, t := range ts {
		if t.Label != "" {
			major = append(major, i)
		}
	}
	step := hi - lo
	for k := 1; k < len(major); k++ {
		step = math.Min(step, math.Abs(ts[major[k]].Value-ts[major[k-1]].Value))
	}
	dec := 0
	if step > 0 {
		dec = max(0, int(math.Ceil(-math.Log10(step)-1e-9)))
	}
	label := func(v float64) string { return strconv.FormatFloat(v, 'f', dec, 64) }
	for ; dec < 6; dec++ {
		distinct := true
		for k := 1; k < len(major); k++ {
			if label(ts[major[k]].Value) == label(ts[major[k-1]].Value) {
				distinct = false
			}
		}
		if distinct {
			break
		}
	}
	for _, i := range major {
		ts[i].Label = label(ts[i].Value)
	}
	return ts
}

// addLine adds a polyline in the given colour.
func addLine(p *plot.Plot, xys plotter.XYs, c color.Color, width vg.Length) error {
	if len(xys) < 2 {
		return nil
	}
	l, err := plotter.NewLine(xys)
	if err != nil {
		return err
	}
	l.Color = c
	l.Width = width
	p.Add(plainLine{l})
	return nil
}

// plainLine is a line plotter without glyph boxes: a plotter.Line reports
// one per point, and padding the axes over a thousand of them took a
// quarter of a report's drawing time; a line has no glyphs to keep inside
// the plot.
type plainLine struct{ l *plotter.Line }

func (pl plainLine) Plot(c draw.Canvas, p *plot.Plot) { pl.l.Plot(c, p) }

func (pl plainLine) DataRange() (xmin, xmax, ymin, ymax float64) { return pl.l.DataRange() }

// addLabels writes texts at points.
func addLabels(p *plot.Plot, xys plotter.XYs, texts []string, c color.Color, size vg.Length) error {
	if len(xys) == 0 {
		return nil
	}
	lb, err := plotter.NewLabels(plotter.XYLabels{XYs: xys, Labels: texts})
	if err != nil {
		return err
	}
	for i := range lb.TextStyle {
		lb.TextStyle[i].Color = c
		lb.TextStyle[i].Font.Size = size
		lb.TextStyle[i].XAlign = draw.XCenter
	}
	p.Add(lb)
	return nil
}

// overviewSVG draws the whole spectrum: measured on top, prediction mirrored
// below, predicted signals labelled at their assigned shift, unexplained
// multiplets marked with their likely identity.
func overviewSVG(r *compare.Result) (string, error) {
	w := spectrumWindow(r)
	p := newSpectrumPlot(w, "")
	top := 1.0
	if r.Trace != nil && len(r.Trace.PPM) > 1 {
		top = maxIn(r.Trace.PPM, r.Trace.Y, w)
		if top <= 0 {
			top = 1
		}
		if err := addLine(p, decimate(r.Trace.PPM, r.Trace.Y, w, maxPlotPoints), inkColor, 0.6); err != nil {
			return "", err
		}
	} else if r.Peaks != nil {
		if err := addSticks(p, r, w, &top); err != nil {
			return "", err
		}
	}
	px, py := predictedTrace(r, w, 0.6*top, 1.5)
	if px != nil {
		if err := addLine(p, decimate(px, py, w, maxPlotPoints), predColor, 0.6); err != nil {
			return "", err
		}
	}
	if err := addSignalLabels(p, r, top); err != nil {
		return "", err
	}
	if err := addUnexplainedMarks(p, r, top); err != nil {
		return "", err
	}
	p.Y.Min, p.Y.Max = -0.75*top, 1.25*top
	return svgOf(p, overviewWidth, overviewHeight)
}

// addSticks draws a peak list as vertical sticks when no trace exists.
func addSticks(p *plot.Plot, r *compare.Result, w window, top *float64) error {
	*top = 0
	for _, pk := range r.Peaks.Peaks {
		*top = math.Max(*top, pk.Intensity)
	}
	if *top <= 0 {
		*top = 1
	}
	for _, pk := range r.Peaks.Peaks {
		if pk.PPM < w.From || pk.PPM > w.To {
			continue
		}
		if err := addLine(p, plotter.XYs{{X: pk.PPM, Y: 0}, {X: pk.PPM, Y: pk.Intensity}}, inkColor, 0.8); err != nil {
			return err
		}
	}
	return nil
}

// addSignalLabels puts each predicted signal's label below the mirrored
// prediction at its predicted shift.
func addSignalLabels(p *plot.Plot, r *compare.Result, top float64) error {
	if r.Prediction == nil {
		return nil
	}
	var xys plotter.XYs
	var texts []string
	for _, s := range r.Prediction.Signals {
		xys = append(xys, plotter.XY{X: s.ShiftPPM, Y: -0.7 * top})
		texts = append(texts, s.Label)
	}
	return addLabels(p, xys, texts, predColor, 8)
}

// addUnexplainedMarks marks every unexplained multiplet above the trace with
// a triangle and its number in the page's table of unexplained peaks
// (numbers stay legible where names would pile up). Only the ones the table
// lists with an identity get their name as well, when they hold at least
// namedMinPercent of the intensity.
func addUnexplainedMarks(p *plot.Plot, r *compare.Result, top float64) error {
	if len(r.Unexplained) == 0 {
		return nil
	}
	const namedMinPercent = 1.0
	var xys plotter.XYs
	var texts []string
	for i, u := range r.Unexplained {
		text := fmt.Sprint(i + 1)
		if u.Likely != "" && u.Percent >= namedMinPercent {
			text += " " + u.Likely
		}
		y := (1.04 + 0.07*float64(i%3)) * top
		xys = append(xys, plotter.XY{X: u.PPM, Y: y})
		texts = append(texts, text)
	}
	sc, err := plotter.NewScatter(xys)
	if err != nil {
		return err
	}
	sc.GlyphStyle = draw.GlyphStyle{Color: flagColor, Radius: 2.5, Shape: draw.PyramidGlyph{}}
	p.Add(sc)
	shifted := make(plotter.XYs, len(xys))
	for i, xy := range xys {
		shifted[i] = plotter.XY{X: xy.X, Y: xy.Y + 0.035*top}
	}
	return addLabels(p, shifted, texts, flagColor, 7)
}

// zoomSVG draws one assigned multiplet enlarged: the measured region on top
// and the predicted lines of the signal(s) assigned to it mirrored below.
func zoomSVG(r *compare.Result, a compare.Assignment) (string, error) {
	if r.Peaks == nil || a.Multiplet < 0 || a.Multiplet >= len(r.Peaks.Multiplets) {
		return "", fmt.Errorf("no measured multiplet for signal %s", a.Signal)
	}
	m := r.Peaks.Multiplets[a.Multiplet]
	half := math.Max(0.03, (m.ToPPM-m.FromPPM)/2+0.02)
	mid := (m.FromPPM + m.ToPPM) / 2
	w := window{From: mid - half, To: mid + half}
	p := newSpectrumPlot(w, fmt.Sprintf("%s: %.3f ppm, %s", a.Signal, a.MeasuredPPM, orDash(a.Multiplicity)))
	p.Title.TextStyle.Font.Size = 8
	p.X.Tick.Label.Font.Size = 6
	p.X.Label.TextStyle.Font.Size = 7
	top := 1.0
	if r.Trace != nil && len(r.Trace.PPM) > 1 {
		top = maxIn(r.Trace.PPM, r.Trace.Y, w)
		if top <= 0 {
			top = 1
		}
		if err := addLine(p, decimate(r.Trace.PPM, r.Trace.Y, w, 320), inkColor, 0.7); err != nil {
			return "", err
		}
	}
	if err := addPredictedSignal(p, r, a, w, top); err != nil {
		return "", err
	}
	p.Y.Min, p.Y.Max = -1.1*top, 1.1*top
	return svgOf(p, zoomWidth, zoomHeight)
}

// addPredictedSignal renders the predicted lines of the assigned signal,
// moved to the measured centre so the shapes can be compared, mirrored.
func addPredictedSignal(p *plot.Plot, r *compare.Result, a compare.Assignment, w window, top float64) error {
	if r.Prediction == nil {
		return nil
	}
	sub := &predict.Prediction{FieldMHz: r.Prediction.FieldMHz}
	shift := a.MeasuredPPM - a.PredictedPPM
	for _, l := range r.Prediction.Lines {
		if l.Signal == a.Signal {
			l.PPM += shift
			sub.Lines = append(sub.Lines, l)
		}
	}
	if len(sub.Lines) == 0 {
		return nil
	}
	x, y := predict.Render(sub, w.From, w.To, 480, 1.0)
	m := 0.0
	for _, v := range y {
		m = math.Max(m, v)
	}
	if m == 0 {
		return nil
	}
	xys := make(plotter.XYs, len(x))
	for i := range x {
		xys[i] = plotter.XY{X: x[i], Y: -y[i] / m * top}
	}
	return addLine(p, xys, predColor, 0.7)
}

func orDash(s string) string {
	if s == "" {
		return "–"
	}
	return s
}
