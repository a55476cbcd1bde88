package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"shiftwise/internal/atomicfile"
	"shiftwise/predict/spin"
)

func init() { register("simulate", newSimulateCmd) }

// Defaults of the simulate command when neither the file nor a flag says.
const (
	simDefaultField = 400.0 // MHz
	simDefaultWidth = 1.0   // Hz
	simTracePoints  = 16384
)

// simulateOptions holds the arguments of the simulate command.
type simulateOptions struct {
	file     string
	fieldMHz float64
	mode     string
	json     bool
	out      string
}

// simulateJSON is the fixed JSON shape of the simulate command.
type simulateJSON struct {
	FieldMHz float64        `json:"field_mhz"`
	Lines    []simulateLine `json:"lines"`
}

type simulateLine struct {
	PPM       float64 `json:"ppm"`
	Hz        float64 `json:"hz"`
	Intensity float64 `json:"intensity"`
	Group     string  `json:"group"`
	Mode      string  `json:"mode"`
}

const simulateLong = `simulate computes the 1H line spectrum of a spin system described in a small
TOML file, to test a hypothesis directly: turn couplings on and off and watch
the pattern change, or compare fields and modes.

  field_mhz = 400          # optional; --field overrides (default 400)
  line_width_hz = 0.8      # optional; used for --out traces (default 1)
  [[group]]                # one table per set of equivalent nuclei
  name = "a"
  shift_ppm = 5.80
  count = 1                # optional, default 1
  nucleus = "1H"           # optional: 1H (default), 19F or 31P
  [[coupling]]
  between = ["a", "b"]
  j_hz = 17.0

Modes: exact diagonalises each coupled cluster; first-order splits every group
by its partners (Pascal's triangle); auto (default) is exact where |Δν| < 10·|J|
and first-order elsewhere. In auto mode a strongly coupled cluster too large to
diagonalise (more than 12 distinct spins) is simulated by fragments: each group
with its most strongly coupled neighbours, up to 9 spins, an approximation
marked "fragment" in the mode column. 19F and 31P split the 1H lines but are
not shown.

Each line is the sum over the groups that take part in the transition and is
labelled with the group carrying most of it; intensities are scaled so that
the whole spectrum sums to the number of 1H nuclei (each group contributes its
count). Output is
a table on a terminal, tab-separated lines when piped, or JSON (--json):
{"field_mhz": 400, "lines": [{"ppm", "hz", "intensity", "group", "mode"}, ...]}.
--out FILE writes the spectrum drawn with Lorentzian lines of the file's line
width: .csv as a trace (ppm,intensity), .svg, .png or .pdf as a plot.

Errors in the file name the file, line and key, and exit with status 1.`

func newSimulateCmd(f *Factory) *cobra.Command {
	o := &simulateOptions{}
	cmd := &cobra.Command{
		Use:   "simulate SPINS.toml",
		Short: "Simulate the 1H spectrum of a spin system (exact or first-order)",
		Long:  simulateLong,
		Args:  oneArg("simulate", "spin-system file"),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.file = args[0]
			if err := checkField("simulate", o.fieldMHz, cmd.Flags().Changed("field")); err != nil {
				return withCode(exitError, err)
			}
			return runSimulate(f, o)
		},
	}
	fl := cmd.Flags()
	fl.Float64Var(&o.fieldMHz, "field", 0, "1H observe frequency in MHz (default: from the file, else 400)")
	fl.StringVar(&o.mode, "mode", "auto", "simulation mode: auto, first-order or exact")
	fl.BoolVar(&o.json, "json", false, "print JSON")
	fl.StringVar(&o.out, "out", "", "write the rendered spectrum to FILE (.csv, .svg, .png or .pdf)")
	return cmd
}

func runSimulate(f *Factory, o *simulateOptions) error {
	mode, err := spin.ParseMode(o.mode)
	if err != nil {
		return withCode(exitError, fmt.Errorf("simulate: --mode: %w", err))
	}
	if o.fieldMHz < 0 || math.IsNaN(o.fieldMHz) || math.IsInf(o.fieldMHz, 0) {
		return withCode(exitError, fmt.Errorf("simulate: --field must be a positive number of MHz, found %v", o.fieldMHz))
	}
	switch strings.ToLower(filepath.Ext(o.out)) {
	case "", ".csv", ".svg", ".png", ".pdf":
	default:
		return withCode(exitError, fmt.Errorf("simulate: --out %s: expected a .csv, .svg, .png or .pdf file", o.out))
	}
	sf, err := spin.ReadFile(o.file)
	var fe spin.FileErrors
	if errors.As(err, &fe) && len(fe) > 1 {
		msgs := make([]string, len(fe))
		for i, e := range fe {
			msgs[i] = e.Error()
		}
		return withCode(exitError, errors.New(strings.Join(msgs, "\n")))
	}
	if err != nil {
		return withCode(exitError, err)
	}
	field := simFirst(o.fieldMHz, sf.FieldMHz, simDefaultField)
	res, err := spin.Simulate(sf.System, spin.Options{FieldMHz: field, Mode: mode})
	if mode == spin.Auto && errors.Is(err, spin.ErrTooLarge) {
		// Auto never fails for want of exact simulation: like predict, it
		// falls back to first-order patterns and says so.
		fmt.Fprintf(f.Err, "shiftwise: note: %s: a strongly coupled cluster is too large to simulate exactly; first-order patterns used\n", o.file)
		res, err = spin.Simulate(sf.System, spin.Options{FieldMHz: field, Mode: spin.FirstOrder})
	}
	if err != nil {
		return withCode(exitError, fmt.Errorf("%s: %w", o.file, err))
	}
	for _, n := range res.Notes {
		fmt.Fprintf(f.Err, "shiftwise: note: %s: %s\n", o.file, n)
	}
	out := simulateResult(sf, res, field)
	if len(out.Lines) == 0 {
		fmt.Fprintf(f.Err, "shiftwise: note: %s has no 1H group: no lines to show (19F and 31P only split 1H lines)\n", o.file)
	}
	if o.out != "" {
		if err := writeSimTrace(o.out, sf.Name, res, field, simFirst(sf.LineWidthHz, simDefaultWidth)); err != nil {
			return withCode(exitError, err)
		}
	}
	switch {
	case o.json:
		enc := json.NewEncoder(f.Out)
		enc.SetIndent("", "  ")
		if err := enc.Encode(out); err != nil {
			return withCode(exitError, err)
		}
	case f.IsTTY:
		printSimTable(f.Out, o.file, out)
	default:
		printSimTSV(f.Out, out)
	}
	return nil
}

// simFirst returns the first positive value.
func simFirst(xs ...float64) float64 {
	for _, x := range xs {
		if x > 0 {
			return x
		}
	}
	return 0
}

func simulateResult(sf *spin.File, res *spin.Result, field float64) *simulateJSON {
	out := &simulateJSON{FieldMHz: field, Lines: []simulateLine{}}
	for _, l := range res.Spectrum() {
		out.Lines = append(out.Lines, simulateLine{
			PPM:       simRound(l.PPM, 5),
			Hz:        simRound(l.Hz, 3),
			Intensity: simRound(l.Intensity, 5),
			Group:     sf.System.Groups[l.Group].Name,
			Mode:      res.ModeUsed[l.Group].String(),
		})
	}
	return out
}

func simRound(x float64, digits int) float64 {
	p := math.Pow(10, float64(digits))
	return math.Round(x*p) / p
}

func printSimTable(w io.Writer, file string, r *simulateJSON) {
	fmt.Fprintf(w, "%s at %g MHz: %d lines\n\n", file, r.FieldMHz, len(r.Lines))
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintln(tw, "group\tppm\tHz\tintensity\tmode\t")
	for _, l := range r.Lines {
		fmt.Fprintf(tw, "%s\t%.4f\t%.2f\t%.4f\t%s\t\n", l.Group, l.PPM, l.Hz, l.Intensity, l.Mode)
	}
	tw.Flush()
}

func printSimTSV(w io.Writer, r *simulateJSON) {
	for _, l := range r.Lines {
		fmt.Fprintf(w, "%s\t%.5f\t%.3f\t%.5f\t%s\n", l.Group, l.PPM, l.Hz, l.Intensity, l.Mode)
	}
}

// writeSimTrace writes the rendered spectrum: CSV (ppm,intensity, from high
// to low ppm), or a plot (.svg, .png, .pdf) with the ppm axis running from
// high to low.
func writeSimTrace(path, title string, res *spin.Result, field, width float64) error {
	lo, hi := spin.Span(res.Lines, 20*width/field+0.05)
	ppm, y := spin.Render(res.Lines, field, hi, lo, simTracePoints, width)
	if strings.ToLower(filepath.Ext(path)) != ".csv" {
		return plotSimTrace(path, fmt.Sprintf("%s, %g MHz", filepath.Base(title), field), ppm, y)
	}
	var b strings.Builder
	b.WriteString("ppm,intensity\n")
	for i := range ppm {
		fmt.Fprintf(&b, "%.6f,%.6g\n", ppm[i], y[i])
	}
	return atomicfile.WriteBytes(path, []byte(b.String()), 0o644)
}

func plotSimTrace(path, title string, ppm, y []float64) error {
	p := plot.New()
	p.Title.Text = title
	p.X.Label.Text = "δ / ppm"
	p.Y.Label.Text = "intensity"
	p.X.Scale = plot.InvertedScale{Normalizer: p.X.Scale}
	xy := make(plotter.XYs, len(ppm))
	for i := range ppm {
		xy[i].X, xy[i].Y = ppm[i], y[i]
	}
	l, err := plotter.NewLine(xy)
	if err != nil {
		return err
	}
	p.Add(l)
	wt, err := p.WriterTo(20*vg.Centimeter, 10*vg.Centimeter, strings.TrimPrefix(strings.ToLower(filepath.Ext(path)), "."))
	if err != nil {
		return err
	}
	return atomicfile.Write(path, 0o644, func(w io.Writer) error { _, err := wt.WriteTo(w); return err })
}
