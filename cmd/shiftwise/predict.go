package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"shiftwise/graph"
	"shiftwise/internal/atomicfile"
	"shiftwise/predict"
	"shiftwise/predict/spin"
	"shiftwise/shiftinc"
	"shiftwise/smiles"
	"shiftwise/spectrum"
)

func init() { register("predict", newPredictCmd) }

// predictOptions holds the flags of the predict command.
type predictOptions struct {
	Smiles  string
	Field   float64
	Solvent string
	Mode    string
	Rules   string
	JSON    bool
	Out     string
}

func newPredictCmd(f *Factory) *cobra.Command { return newPredictCmdWith(f, runPredict) }

// newPredictCmdWith builds the command with run as its action, so tests can
// capture the parsed options.
func newPredictCmdWith(f *Factory, run func(*Factory, *predictOptions) error) *cobra.Command {
	o := &predictOptions{}
	cmd := &cobra.Command{
		Use:   "predict SMILES",
		Short: "Predict the 1H NMR spectrum of a structure",
		Long: `predict estimates the 1H NMR spectrum of a structure given as SMILES: one
signal per proton environment with its shift and uncertainty, multiplicity,
couplings and proton count, and the line list. Strongly coupled clusters are
simulated exactly in auto mode.

Output: a table on a terminal, tab-separated text when piped, or JSON with
--json. --out writes the rendered spectrum as .csv (ppm,intensity), .jdx
(JCAMP-DX) or a plot (.svg, .png).`,
		Args: oneArg("predict", "SMILES"),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.Smiles = args[0]
			if err := checkField("predict", o.Field, cmd.Flags().Changed("field")); err != nil {
				return withCode(exitError, err)
			}
			return run(f, o)
		},
	}
	fl := cmd.Flags()
	fl.Float64Var(&o.Field, "field", predict.DefaultFieldMHz, "spectrometer 1H frequency in MHz")
	fl.StringVar(&o.Solvent, "solvent", predict.DefaultSolvent, "solvent (CDCl3, DMSO-d6, CD3OD, D2O, acetone-d6, C6D6, …)")
	fl.StringVar(&o.Mode, "mode", "auto", "simulation: auto, first-order or exact")
	fl.StringVar(&o.Rules, "rules", "", "TOML file adding or overriding shift increments")
	fl.BoolVar(&o.JSON, "json", false, "print JSON")
	fl.StringVar(&o.Out, "out", "", "write the spectrum to FILE (.csv, .jdx, .svg or .png)")
	return cmd
}

// runPredict parses the SMILES, predicts and writes the outputs.
func runPredict(f *Factory, o *predictOptions) error {
	mode, err := spin.ParseMode(o.Mode)
	if err != nil {
		return withCode(exitError, err)
	}
	if o.Out != "" {
		if err := predictCheckOut(o.Out); err != nil {
			return withCode(exitError, err)
		}
	}
	opt := predict.Options{FieldMHz: o.Field, Solvent: o.Solvent, Mode: mode}
	if o.Rules != "" {
		t, err := shiftinc.Load(o.Rules)
		if err != nil {
			return withCode(exitError, err)
		}
		opt.Rules = t
	}
	m, err := smiles.Parse(o.Smiles)
	if err != nil {
		return withCode(exitError, predictSmilesError(o.Smiles, err))
	}
	p, err := predict.Predict(m, o.Smiles, opt)
	if err != nil {
		return withCode(exitError, err)
	}
	if o.Out != "" {
		if err := predictWriteOut(o.Out, p); err != nil {
			return withCode(exitError, err)
		}
	}
	switch {
	case o.JSON:
		enc := json.NewEncoder(f.Out)
		enc.SetIndent("", "  ")
		return enc.Encode(p)
	case f.IsTTY:
		return predictTable(f.Out, p)
	}
	for _, wn := range p.Warnings {
		fmt.Fprintln(f.Err, "shiftwise: note:", wn)
	}
	return predictTSV(f.Out, p)
}

// predictSmilesError formats a SMILES error with the input and a caret
// under the offending column, for every error found (as describe does).
func predictSmilesError(src string, err error) error {
	pos := -1
	if l, ok := smiles.AsList(err); ok && len(l) > 1 {
		parts := make([]string, len(l))
		for i, e := range l {
			parts[i] = fmt.Sprintf("%v\n%s", e, smiles.Caret(src, e.Pos))
		}
		return errors.New(strings.Join(parts, "\n"))
	}
	if l, ok := smiles.AsList(err); ok && len(l) > 0 {
		pos = l[0].Pos
	}
	var ae *graph.AtomError
	if pos < 0 && errors.As(err, &ae) {
		pos = ae.Pos
	}
	if pos < 0 {
		return err
	}
	return fmt.Errorf("%v\n%s", err, smiles.Caret(src, pos))
}

// predictTable writes the signals as an aligned table.
func predictTable(w io.Writer, p *predict.Prediction) error {
	fmt.Fprintf(w, "%s   %s   %.2f g/mol   %g MHz   %s\n\n", p.Smiles, p.Formula, p.MolecularWeight, p.FieldMHz, p.Solvent)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "signal\tδ / ppm\tmult\tJ / Hz\tnH\tatoms\tnotes")
	for _, s := range p.Signals {
		fmt.Fprintf(tw, "%s\t%.2f ± %.2f\t%s\t%s\t%d\t%s\t%s\n", s.Label, s.ShiftPPM, s.ShiftSD,
			s.Multiplicity, predictJList(s, ", "), s.NH, predictAtoms(s.Atoms), strings.Join(predictFlags(s), ", "))
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	for _, wn := range p.Warnings {
		fmt.Fprintln(w, "note:", wn)
	}
	return nil
}

// predictTSV writes the signals as tab-separated values with a header.
func predictTSV(w io.Writer, p *predict.Prediction) error {
	var b strings.Builder
	b.WriteString("label\tshift_ppm\tshift_sd\tmultiplicity\tcouplings\tn_h\tatoms\tflags\n")
	for _, s := range p.Signals {
		fmt.Fprintf(&b, "%s\t%.3f\t%.3f\t%s\t%s\t%d\t%s\t%s\n", s.Label, s.ShiftPPM, s.ShiftSD,
			s.Multiplicity, predictJList(s, ";"), s.NH, predictAtoms(s.Atoms), strings.Join(predictFlags(s), ","))
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// predictJList formats the J list as "15.9 (D), 7.1 (B)".
func predictJList(s predict.Signal, sep string) string {
	parts := make([]string, 0, len(s.Couplings))
	for _, c := range s.Couplings {
		parts = append(parts, fmt.Sprintf("%.1f (%s)", c.JHz, c.To))
	}
	if len(parts) == 0 {
		return "-"
	}
	return strings.Join(parts, sep)
}

func predictAtoms(a []int) string {
	parts := make([]string, len(a))
	for i, x := range a {
		parts[i] = strconv.Itoa(x)
	}
	return strings.Join(parts, ",")
}

func predictFlags(s predict.Signal) []string {
	var fl []string
	if s.Exchangeable {
		fl = append(fl, "exchangeable")
	}
	if s.LowConfidence {
		fl = append(fl, "low confidence")
	}
	if s.Mode == "exact" || s.Mode == "fragment" {
		fl = append(fl, s.Mode)
	}
	return fl
}

// predictCheckOut refuses an output file of unknown type before any work.
func predictCheckOut(path string) error {
	switch strings.ToLower(filepath.Ext(path)) {
	case ".csv", ".jdx", ".dx", ".svg", ".png":
		return nil
	}
	return fmt.Errorf("%s: unknown output type %q (want .csv, .jdx, .svg or .png)", path, filepath.Ext(path))
}

// predictTrace renders the prediction over the usual 1H window, widened to
// include every line, at about four points per line width.
func predictTrace(p *predict.Prediction) *spectrum.Spectrum {
	lo, hi := -0.5, 10.5
	for _, l := range p.Lines {
		lo, hi = math.Min(lo, l.PPM-0.5), math.Max(hi, l.PPM+0.5)
	}
	points := int(math.Min(1<<18, math.Max(4096, (hi-lo)*p.FieldMHz*4/predict.DefaultLineWidthHz)))
	x, y := predict.Render(p, lo, hi, points, predict.DefaultLineWidthHz)
	return &spectrum.Spectrum{PPM: x, Y: y, FieldMHz: p.FieldMHz, Nucleus: "1H", Solvent: p.Solvent,
		Title: "predicted 1H spectrum of " + p.Smiles, Source: "shiftwise predict"}
}

// predictWriteOut writes the rendered spectrum in the format named by the
// file extension.
func predictWriteOut(path string, p *predict.Prediction) error {
	s := predictTrace(p)
	switch strings.ToLower(filepath.Ext(path)) {
	case ".csv":
		return atomicfile.Write(path, 0o644, func(w io.Writer) error { return spectrum.WriteCSV(w, s) })
	case ".jdx", ".dx":
		return atomicfile.Write(path, 0o644, func(w io.Writer) error { return spectrum.WriteJCAMP(w, s, false) })
	}
	return predictPlot(path, p, s)
}

// predictPlot draws the trace with the ppm axis decreasing to the right
// and a label over each signal.
func predictPlot(path string, p *predict.Prediction, s *spectrum.Spectrum) error {
	pl := plot.New()
	pl.Title.Text = "Predicted 1H spectrum, " + strconv.FormatFloat(p.FieldMHz, 'g', -1, 64) + " MHz, " + p.Solvent
	pl.X.Label.Text = "δ / ppm"
	pl.Y.Label.Text = "intensity"
	pl.X.Scale = plot.InvertedScale{Normalizer: plot.LinearScale{}}
	xy := make(plotter.XYs, len(s.PPM))
	top := 0.0
	for i := range s.PPM {
		xy[i].X, xy[i].Y = s.PPM[i], s.Y[i]
		top = math.Max(top, s.Y[i])
	}
	line, err := plotter.NewLine(xy)
	if err != nil {
		return err
	}
	pl.Add(line)
	if lb, err := predictLabels(p, s, top); err == nil {
		pl.Add(lb)
	}
	pl.X.Min, pl.X.Max = s.PPM[0], s.PPM[len(s.PPM)-1]
	pl.Y.Max = top * 1.12
	wt, err := pl.WriterTo(24*vg.Centimeter, 12*vg.Centimeter, strings.TrimPrefix(strings.ToLower(filepath.Ext(path)), "."))
	if err != nil {
		return err
	}
	return atomicfile.Write(path, 0o644, func(w io.Writer) error { _, err := wt.WriteTo(w); return err })
}

// predictLabels places each signal's label above its highest point: the
// highest over the span of the signal's own lines (a wide multiplet at a
// low field has a valley at its centre, where the label used to sit on top
// of the inner lines).
func predictLabels(p *predict.Prediction, s *spectrum.Spectrum, top float64) (*plotter.Labels, error) {
	var d plotter.XYLabels
	for _, sig := range p.Signals {
		lo, hi := sig.ShiftPPM-0.05, sig.ShiftPPM+0.05
		for _, l := range p.Lines {
			if l.Signal == sig.Label {
				lo, hi = math.Min(lo, l.PPM-0.01), math.Max(hi, l.PPM+0.01)
			}
		}
		h := 0.0
		for i, x := range s.PPM {
			if x >= lo && x <= hi {
				h = math.Max(h, s.Y[i])
			}
		}
		d.XYs = append(d.XYs, plotter.XY{X: sig.ShiftPPM, Y: h + 0.03*top})
		d.Labels = append(d.Labels, sig.Label+" "+sig.Multiplicity)
	}
	return plotter.NewLabels(d)
}
