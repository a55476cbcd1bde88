package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"shiftwise/spectrum"
)

func init() { register("peaks", newPeaksCmd) }

// peaksOptions holds the arguments of the peaks command.
type peaksOptions struct {
	file        string
	solvent     string
	reference   string
	minSNR      float64
	integralRef string
	fieldMHz    float64
	json        bool
}

// peaksJSON is the fixed JSON shape of the peaks command.
type peaksJSON struct {
	FieldMHz     float64         `json:"field_mhz"`
	Points       int             `json:"points"`
	Solvent      string          `json:"solvent,omitempty"`
	Reference    string          `json:"reference,omitempty"`
	ReferencePPM float64         `json:"reference_shift_ppm"`
	Noise        float64         `json:"noise"`
	Peaks        []peakJSON      `json:"peaks"`
	Multiplets   []multipletJSON `json:"multiplets"`
	Warnings     []string        `json:"warnings,omitempty"`
}

type peakJSON struct {
	PPM       float64 `json:"ppm"`
	Intensity float64 `json:"intensity"`
	SNR       float64 `json:"snr"`
	WidthHz   float64 `json:"width_hz,omitempty"`
	Artifact  string  `json:"artifact,omitempty"`
}

type multipletJSON struct {
	PPM          float64   `json:"ppm"`
	FromPPM      float64   `json:"from_ppm"`
	ToPPM        float64   `json:"to_ppm"`
	Integral     float64   `json:"integral"`
	Multiplicity string    `json:"multiplicity"`
	JHz          []float64 `json:"j_hz"`
	Peaks        int       `json:"peaks"`
	Label        string    `json:"label,omitempty"`
}

const peaksLong = `peaks reads a measured 1H spectrum (JCAMP-DX or CSV: a trace or a peak list)
and shows what a chemist reads from it: the multiplets with their shift, region,
relative integral, multiplicity and couplings, and the picked peaks.

Processing: the axis is referenced (--reference auto: TMS at 0 ppm when its
line is there; otherwise the residual solvent signal, Fulmer et al. 2010, which
moves the axis only when it lies more than 0.05 ppm from its tabulated shift;
tms, solvent: onto that signal; none: keep the file's axis); the baseline is a
Whittaker smoother refitted to the signal-free points; the noise is a robust
(median absolute deviation) standard deviation; peaks must reach --min-snr
times the noise (default 5).

Multiplets: peaks closer than 20 Hz, or overlapping, form one multiplet. Its
multiplicity (s, d, t, q, p, sext, sept, dd, dt, td, ddd, ...) and J values come
from a first-order analysis (line spacings in Hz; for n lines of equal
couplings the outer-line distance / (n-1)); "m" when the pattern is not
first-order (asymmetric, inconsistent spacings or intensities). 13C satellites,
spinning sidebands and line-shape skirts of strong lines are marked on the
peaks and left out of the multiplets.

Integrals are relative: the smallest well-resolved multiplet (first-order, not
the solvent, TMS or a water singlet) is set to a whole number of H, the
smallest of 1-4 that makes the other well-resolved multiplets whole numbers too;
when none does, the largest unit that makes at least half of the multiplets
whole numbers is used (else the smallest is 1 H).
--integral-ref PPM=NH instead sets the multiplet at PPM to NH protons
(--integral-ref #K=NH: the K-th multiplet of the table).

Output is a table on a terminal, tab-separated lines when piped, or JSON
(--json) with the keys field_mhz, points, peaks (ppm, intensity, snr) and
multiplets (ppm, from_ppm, to_ppm, integral, multiplicity, j_hz, peaks).

A file that cannot be read exits with status 1 and names the file and line.`

func newPeaksCmd(f *Factory) *cobra.Command {
	o := &peaksOptions{}
	cmd := &cobra.Command{
		Use:   "peaks FILE",
		Short: "Pick peaks, multiplets, integrals and J values of a measured spectrum",
		Long:  peaksLong,
		Args:  oneArg("peaks", "spectrum file"),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.file = args[0]
			return runPeaks(f, o)
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&o.solvent, "solvent", "", "solvent (default: from the file, else CDCl3)")
	fl.StringVar(&o.reference, "reference", spectrum.RefAuto, "axis reference: auto, tms, solvent or none")
	fl.Float64Var(&o.minSNR, "min-snr", spectrum.DefaultMinSNR, "peak-picking threshold in noise standard deviations")
	fl.StringVar(&o.integralRef, "integral-ref", "", "set the multiplet at PPM to NH protons: PPM=NH or #K=NH")
	fl.Float64Var(&o.fieldMHz, "field-mhz", 0, "observe frequency in MHz (overrides the file's; needed for a file with X in Hz and no frequency)")
	fl.BoolVar(&o.json, "json", false, "print JSON")
	return cmd
}

func runPeaks(f *Factory, o *peaksOptions) error {
	opt, err := o.processOptions()
	if err != nil {
		return withCode(exitError, err)
	}
	s, err := spectrum.ReadFileWith(o.file, spectrum.ReadOptions{FieldMHz: o.fieldMHz})
	if err != nil {
		return withCode(exitError, err)
	}
	pl, err := spectrum.Process(s, opt)
	if err != nil {
		return withCode(exitError, fmt.Errorf("%s: %w", o.file, err))
	}
	res := peaksResult(pl)
	switch {
	case o.json:
		enc := json.NewEncoder(f.Out)
		enc.SetIndent("", "  ")
		if err := enc.Encode(res); err != nil {
			return withCode(exitError, err)
		}
	case f.IsTTY:
		printPeaksTable(f.Out, o.file, res)
	default:
		printPeaksTSV(f.Out, res)
	}
	return nil
}

// processOptions checks the flags and turns them into ProcessOptions.
func (o *peaksOptions) processOptions() (spectrum.ProcessOptions, error) {
	opt := spectrum.ProcessOptions{Solvent: o.solvent, Reference: o.reference, MinSNR: o.minSNR, FieldMHz: o.fieldMHz}
	switch o.reference {
	case spectrum.RefAuto, spectrum.RefTMS, spectrum.RefSolvent, spectrum.RefNone:
	default:
		return opt, fmt.Errorf("peaks: --reference must be auto, tms, solvent or none, found %q", o.reference)
	}
	if !(o.minSNR > 0) {
		return opt, fmt.Errorf("peaks: --min-snr must be positive, found %g", o.minSNR)
	}
	if o.fieldMHz < 0 {
		return opt, fmt.Errorf("peaks: --field-mhz must be positive, found %g", o.fieldMHz)
	}
	if o.solvent != "" {
		if _, ok := spectrum.LookupSolvent(o.solvent); !ok {
			return opt, fmt.Errorf("peaks: unknown solvent %q (known: %s)", o.solvent, knownSolvents())
		}
	}
	if o.integralRef != "" {
		r, err := parseIntegralRef(o.integralRef)
		if err != nil {
			return opt, err
		}
		opt.IntegralRef = r
	}
	return opt, nil
}

func knownSolvents() string {
	var names []string
	for _, s := range spectrum.Residuals() {
		names = append(names, s.Name)
	}
	return strings.Join(names, ", ")
}

// parseIntegralRef reads PPM=NH or #K=NH (K counted from 1).
func parseIntegralRef(s string) (*spectrum.IntegralRef, error) {
	bad := func(why string) error {
		return fmt.Errorf("peaks: --integral-ref %q: %s (expected PPM=NH or #K=NH, e.g. 3.71=2)", s, why)
	}
	at, nh, ok := strings.Cut(s, "=")
	if !ok {
		return nil, bad("missing '='")
	}
	n, err := strconv.ParseFloat(strings.TrimSpace(nh), 64)
	if err != nil || !(n > 0) || math.IsInf(n, 0) {
		return nil, bad("proton count must be a positive number")
	}
	at = strings.TrimSpace(at)
	if k, isIndex := strings.CutPrefix(at, "#"); isIndex {
		i, err := strconv.Atoi(k)
		if err != nil || i < 1 {
			return nil, bad("multiplet number must be a whole number from 1")
		}
		return &spectrum.IntegralRef{PPM: math.NaN(), Index: i - 1, NH: n}, nil
	}
	p, err := strconv.ParseFloat(at, 64)
	if err != nil || math.IsNaN(p) || math.IsInf(p, 0) {
		return nil, bad("shift must be a number in ppm")
	}
	return &spectrum.IntegralRef{PPM: p, NH: n}, nil
}

// peaksResult rounds the processing outcome to the printed precision.
func peaksResult(pl *spectrum.PeakList) *peaksJSON {
	r := &peaksJSON{
		FieldMHz: roundTo(pl.FieldMHz, 4), Points: pl.Points, Solvent: pl.Solvent,
		Reference: pl.Reference, ReferencePPM: roundTo(pl.ReferencePPM, 4), Noise: roundTo(pl.Noise, 3),
		Peaks: []peakJSON{}, Multiplets: []multipletJSON{}, Warnings: pl.Warnings,
	}
	for _, p := range pl.Peaks {
		r.Peaks = append(r.Peaks, peakJSON{
			PPM: roundTo(p.PPM, 4), Intensity: roundTo(p.Intensity, 1), SNR: roundTo(p.SNR, 1),
			WidthHz: roundTo(p.WidthHz, 2), Artifact: p.Artifact,
		})
	}
	for _, m := range pl.Multiplets {
		js := make([]float64, len(m.JHz))
		for i, j := range m.JHz {
			js[i] = roundTo(j, 1)
		}
		r.Multiplets = append(r.Multiplets, multipletJSON{
			PPM: roundTo(m.PPM, 4), FromPPM: roundTo(m.FromPPM, 4), ToPPM: roundTo(m.ToPPM, 4),
			Integral: roundTo(m.Integral, 2), Multiplicity: m.Multiplicity, JHz: js, Peaks: m.Peaks, Label: m.Label,
		})
	}
	return r
}

func joinJ(js []float64) string {
	s := make([]string, len(js))
	for i, j := range js {
		s[i] = strconv.FormatFloat(j, 'f', 1, 64)
	}
	return strings.Join(s, ", ")
}

func printPeaksTable(w io.Writer, file string, r *peaksJSON) {
	tw := tabwriter.NewWriter(w, 2, 4, 2, ' ', 0)
	fmt.Fprintf(tw, "file\t%s\n", file)
	fmt.Fprintf(tw, "field\t%.2f MHz, %d points\n", r.FieldMHz, r.Points)
	ref := r.Reference
	if r.ReferencePPM != 0 {
		ref += fmt.Sprintf(" (axis moved %+.4f ppm)", r.ReferencePPM)
	}
	fmt.Fprintf(tw, "solvent\t%s\n", peaksDash(r.Solvent))
	fmt.Fprintf(tw, "reference\t%s\n", peaksDash(ref))
	fmt.Fprintf(tw, "noise\t%.4g\n", r.Noise)
	tw.Flush()
	for _, wn := range r.Warnings {
		fmt.Fprintln(w, "warning:", wn)
	}
	fmt.Fprintln(w)
	if len(r.Multiplets) == 0 {
		fmt.Fprintln(w, "no multiplets above the threshold")
	} else {
		tw = tabwriter.NewWriter(w, 2, 4, 2, ' ', 0)
		fmt.Fprintln(tw, "#\tPPM\tRANGE\tINTEGRAL\tMULT\tJ (Hz)\tPEAKS\tNOTE")
		for i, m := range r.Multiplets {
			fmt.Fprintf(tw, "%d\t%.3f\t%.3f–%.3f\t%.2f\t%s\t%s\t%d\t%s\n",
				i+1, m.PPM, m.FromPPM, m.ToPPM, m.Integral, m.Multiplicity, joinJ(m.JHz), m.Peaks, m.Label)
		}
		tw.Flush()
	}
	fmt.Fprintln(w)
	tw = tabwriter.NewWriter(w, 2, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "PEAK PPM\tINTENSITY\tS/N\tWIDTH (Hz)\tNOTE")
	for _, p := range r.Peaks {
		fmt.Fprintf(tw, "%.4f\t%.4g\t%.1f\t%.2f\t%s\n", p.PPM, p.Intensity, p.SNR, p.WidthHz, p.Artifact)
	}
	tw.Flush()
}

func peaksDash(s string) string {
	if s == "" {
		return "-"
	}
	return s
}

// printPeaksTSV writes one record per line, its type in the first field:
// field_mhz, points, solvent, reference, noise, warning, then one
// "multiplet" line (ppm, from_ppm, to_ppm, integral, multiplicity, j_hz
// comma-separated, peaks, label) per multiplet and one "peak" line (ppm,
// intensity, snr, width_hz, artifact) per peak.
func printPeaksTSV(w io.Writer, r *peaksJSON) {
	fmt.Fprintf(w, "field_mhz\t%g\n", r.FieldMHz)
	fmt.Fprintf(w, "points\t%d\n", r.Points)
	fmt.Fprintf(w, "solvent\t%s\n", r.Solvent)
	fmt.Fprintf(w, "reference\t%s\t%g\n", r.Reference, r.ReferencePPM)
	fmt.Fprintf(w, "noise\t%g\n", r.Noise)
	for _, wn := range r.Warnings {
		fmt.Fprintf(w, "warning\t%s\n", wn)
	}
	for _, m := range r.Multiplets {
		js := strings.ReplaceAll(joinJ(m.JHz), " ", "")
		fmt.Fprintf(w, "multiplet\t%.4f\t%.4f\t%.4f\t%.2f\t%s\t%s\t%d\t%s\n",
			m.PPM, m.FromPPM, m.ToPPM, m.Integral, m.Multiplicity, js, m.Peaks, m.Label)
	}
	for _, p := range r.Peaks {
		fmt.Fprintf(w, "peak\t%.4f\t%g\t%.1f\t%.2f\t%s\n", p.PPM, p.Intensity, p.SNR, p.WidthHz, p.Artifact)
	}
}
