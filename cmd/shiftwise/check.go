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
	"time"

	"github.com/spf13/cobra"

	"shiftwise/compare"
	"shiftwise/graph"
	"shiftwise/internal/atomicfile"
	"shiftwise/report"
	"shiftwise/smiles"
)

func init() { register("check", newCheckCmd) }

// checkOptions holds the flags of the check command.
type checkOptions struct {
	smiles, spectrum, solvent string
	field                     float64
	candidates, impurities    []string
	standard                  string
	standardMass, sampleMass  float64
	standardPurity            float64
	standardSignal            float64
	minSNR                    float64
	minPurity                 float64
	json                      bool
	report                    string            // HTML report path, "" for none
	predictor                 compare.Predictor // tests substitute hand-made predictions
}

const checkLong = `check predicts the 1H spectrum of the intended structure (--smiles), reads
and processes the measured spectrum (JCAMP-DX or CSV), assigns every predicted
signal to a measured multiplet, explains the other peaks (residual solvent,
water, common contaminants from the Gottlieb 1997 / Fulmer 2010 tables, 13C
satellites, the --impurity structures), estimates purity and gives a verdict:

  consistent     the spectrum supports the structure          exit status 0
  inconsistent   the spectrum contradicts the structure       exit status 3
  review         a person must look (reasons are listed)      exit status 4
  usage or input error                                        exit status 1

Inconsistent, among other rules: less than 60 % of the measured intensity
(residual solvent, TMS and artifacts left out) explained by the structure,
solvent, water and known impurities; or two or more non-exchangeable signals
(or 30 % of their H) missing, more than 3 SD away, of a clearly different
multiplicity more than 2 SD away, or in a multiplet holding at most 60 % of
their H where the region is short of a proton.

Among the rules for review: a signal missing or more than 3 SD away; a
region (below 3, 3-6.3, 6.3-9, above 9 ppm) short by 1 H and 20 % or more
with a multiplet holding at most 60 % of its H; unexplained peaks above 10 %
of the intensity, or above 5 % with one of at least 0.5 H. A contaminant
from the tables must have a compatible multiplicity: a tabulated singlet
never explains a resolved d, t, q, dd ...

--candidate ranks further structures (isomers, starting material, by-product)
against the same spectrum and names the signals that tell them apart. A
candidate scoring 0.03 higher than the intended structure means review; 0.05
higher while the intended structure has a missing or far signal or a region
short of a proton means inconsistent.

Impurity amounts (--impurity) come from the impurity's signals clear of the
compound's lines (median per proton), so an overlapped multiplet does not
inflate them.

qNMR: with --standard SMILES --standard-mass MG --sample-mass MG
--standard-purity PCT the mass purity of the sample is computed with the
internal-standard qNMR equation and an uncertainty estimate. Masses are
0.001-10000 mg, the purity in (0, 100] %. --standard-signal PPM picks the
standard's signal (within 0.1 ppm); when the standard or that signal is not
found, there is no qNMR result and the verdict is at least review, with the
reason.

Structures given to --smiles, --candidate, --impurity and --standard are all
parsed before any work: a bad one is a usage error naming the flag and its
position (--candidate 2) with the column and a caret. --field, when given, is
the observe frequency in MHz, 1-10000.

Output is a table on a terminal, tab-separated lines when piped (one
record per line, its kind first: verdict, reason, assignment, missing,
unexplained, purity, candidate, caution, warning, advisory), or JSON
(--json) with the keys verdict, score, reasons, assignments, unexplained,
missing, purity, candidates. --report FILE also writes an HTML report.

The automated result is advisory: release of material follows the lab's own
procedures and qualified review.`

func newCheckCmd(f *Factory) *cobra.Command {
	o := &checkOptions{}
	cmd := &cobra.Command{
		Use:   "check --smiles SMILES SPECTRUM",
		Short: "Check a measured 1H spectrum against the intended structure",
		Long:  checkLong,
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) != 1 {
				return withCode(exitError, fmt.Errorf("check: expected one spectrum file, found %d arguments", len(args)))
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			o.spectrum = args[0]
			return runCheck(f, o, cmd.Flags().Changed)
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&o.smiles, "smiles", "", "intended structure as SMILES (required)")
	fl.StringVar(&o.solvent, "solvent", "", "deuterated solvent (default: from the file)")
	fl.Float64Var(&o.field, "field", 0, "observe frequency in MHz (default: from the file)")
	fl.StringArrayVar(&o.candidates, "candidate", nil, "alternative structure to rank (repeatable)")
	fl.StringArrayVar(&o.impurities, "impurity", nil, "expected impurity as SMILES: starting material, by-product (repeatable)")
	fl.StringVar(&o.standard, "standard", "", "internal standard for qNMR, as SMILES")
	fl.Float64Var(&o.standardMass, "standard-mass", 0, "mass of internal standard weighed, mg")
	fl.Float64Var(&o.sampleMass, "sample-mass", 0, "mass of sample weighed, mg")
	fl.Float64Var(&o.standardPurity, "standard-purity", 0, "purity of the internal standard, mass %")
	fl.Float64Var(&o.standardSignal, "standard-signal", 0, "shift of the standard's signal to integrate, ppm (default: its largest)")
	fl.Float64Var(&o.minSNR, "min-snr", 0, "peak-picking threshold in noise SDs (default: processing's)")
	fl.Float64Var(&o.minPurity, "min-purity", 0, "purity in % below which the verdict is at least review: your release specification (default 80)")
	fl.BoolVar(&o.json, "json", false, "print the result as JSON")
	fl.StringVar(&o.report, "report", "", "also write a self-contained HTML report to `FILE`")
	cmd.SetFlagErrorFunc(func(c *cobra.Command, err error) error { return withCode(exitError, err) })
	return cmd
}

// validate checks the flags before any work: structures parse (each
// --candidate, --impurity and --standard named with its position and a
// caret), numbers are finite and in range. set reports whether a flag was
// given on the command line. Errors are usage errors (exit 1).
func (o *checkOptions) validate(set func(name string) bool) error {
	if strings.TrimSpace(o.smiles) == "" {
		return errors.New("check: --smiles is required")
	}
	if err := checkField("check", o.field, set("field")); err != nil {
		return err
	}
	if set("min-snr") && !(o.minSNR > 0 && o.minSNR <= maxMinSNR) {
		return fmt.Errorf("check: --min-snr must be a number of noise SDs in (0, %g], found %v", maxMinSNR, o.minSNR)
	}
	if set("min-purity") && !(o.minPurity > 0 && o.minPurity <= 100) {
		return fmt.Errorf("check: --min-purity must be a percentage in (0, 100], found %v", o.minPurity)
	}
	if err := o.validateQNMR(set); err != nil {
		return err
	}
	return o.validateStructures()
}

// maxMinSNR bounds --min-snr: a threshold beyond a million noise SDs picks
// nothing on any real spectrum (common practice, no source).
const maxMinSNR = 1e6

// validateQNMR checks the qNMR flags: all four or none; each mass finite and
// within compare's bounds (MinMassMg–MaxMassMg), the purity in (0, 100],
// the standard's signal finite and within ±MaxStandardPPM.
func (o *checkOptions) validateQNMR(set func(string) bool) error {
	q := set("standard") || set("standard-mass") || set("sample-mass") || set("standard-purity") || set("standard-signal")
	if !q {
		return nil
	}
	if o.standard == "" || !set("standard-mass") || !set("sample-mass") || !set("standard-purity") {
		return errors.New("check: qNMR needs --standard SMILES, --standard-mass MG, --sample-mass MG and --standard-purity PCT")
	}
	for _, m := range []struct {
		flag string
		v    float64
	}{{"--standard-mass", o.standardMass}, {"--sample-mass", o.sampleMass}} {
		if !(m.v >= compare.MinMassMg && m.v <= compare.MaxMassMg) {
			return fmt.Errorf("check: %s must be a weighed mass in mg between %g and %g, found %v", m.flag, compare.MinMassMg, compare.MaxMassMg, m.v)
		}
	}
	if !(o.standardPurity > 0 && o.standardPurity <= 100) {
		return fmt.Errorf("check: --standard-purity must be a mass %% in (0, 100], found %v", o.standardPurity)
	}
	if !(math.Abs(o.standardSignal) <= compare.MaxStandardPPM) {
		return fmt.Errorf("check: --standard-signal must be a shift in ppm within ±%g, found %v", compare.MaxStandardPPM, o.standardSignal)
	}
	return nil
}

// validateStructures parses every structure given (unless a test
// substitutes the predictor): an empty or malformed SMILES is an error
// naming the flag, its 1-based position among repeated flags, the column
// and a caret.
func (o *checkOptions) validateStructures() error {
	type entry struct{ flag, smi string }
	list := []entry{{"--smiles", o.smiles}}
	for k, c := range o.candidates {
		list = append(list, entry{fmt.Sprintf("--candidate %d", k+1), c})
	}
	for k, c := range o.impurities {
		list = append(list, entry{fmt.Sprintf("--impurity %d", k+1), c})
	}
	if o.standard != "" {
		list = append(list, entry{"--standard", o.standard})
	}
	for _, e := range list {
		if strings.TrimSpace(e.smi) == "" {
			return fmt.Errorf("check: %s: empty SMILES", e.flag)
		}
		if o.predictor != nil {
			continue
		}
		if _, err := smiles.Parse(e.smi); err != nil {
			return fmt.Errorf("check: %s: %w", e.flag, checkSmilesError(e.smi, err))
		}
	}
	return nil
}

// runCheck runs a check; set reports whether a flag was given (nil: none).
func runCheck(f *Factory, o *checkOptions, set func(string) bool) error {
	if set == nil {
		set = func(string) bool { return false }
	}
	if err := o.validate(set); err != nil {
		return withCode(exitError, err)
	}
	in := compare.Input{Smiles: o.smiles, SpectrumPath: o.spectrum, Candidates: o.candidates, Impurities: o.impurities}
	if o.standard != "" {
		in.Standard = &compare.Standard{Smiles: o.standard, MassMg: o.standardMass, SampleMassMg: o.sampleMass,
			PurityPct: o.standardPurity, SignalPPM: o.standardSignal}
	}
	res, err := compare.Check(in, compare.Options{FieldMHz: o.field, Solvent: o.solvent, MinSNR: o.minSNR, MinPurityPct: o.minPurity, Predictor: o.predictor})
	if err != nil {
		return withCode(exitError, err)
	}
	if o.report != "" {
		err := atomicfile.Write(o.report, 0o644, func(w io.Writer) error {
			return report.Write(w, report.Sample{ID: strings.TrimSuffix(filepath.Base(o.spectrum), filepath.Ext(o.spectrum)),
				Spectrum: o.spectrum, Result: res, Created: time.Now()})
		})
		if err != nil {
			return withCode(exitError, fmt.Errorf("check: writing report: %w", err))
		}
	}
	if o.json {
		enc := json.NewEncoder(f.Out)
		enc.SetIndent("", "  ")
		if err := enc.Encode(res); err != nil {
			return withCode(exitError, err)
		}
	} else if f.IsTTY {
		printCheckTable(f.Out, res)
	} else {
		printCheckTSV(f.Out, res)
	}
	switch res.Verdict {
	case compare.Consistent:
		return nil
	case compare.Inconsistent:
		return withCode(exitInconsistent, nil)
	default:
		return withCode(exitReview, nil)
	}
}

// checkSmilesError formats a SMILES error with the input and a caret under
// the offending column, for every error found (as predict does).
func checkSmilesError(src string, err error) error {
	if l, ok := smiles.AsList(err); ok && len(l) > 0 {
		parts := make([]string, len(l))
		for i, e := range l {
			parts[i] = fmt.Sprintf("%v\n%s", e, smiles.Caret(src, e.Pos))
		}
		return errors.New(strings.Join(parts, "\n"))
	}
	var ae *graph.AtomError
	if errors.As(err, &ae) {
		return fmt.Errorf("%v\n%s", err, smiles.Caret(src, ae.Pos))
	}
	return fmt.Errorf("%s: %w", src, err)
}

func fmtPtr(p *float64, unit string) string {
	if p == nil {
		return "—"
	}
	return fmt.Sprintf("%.1f%s", *p, unit)
}

// printCheckTable writes the human view: verdict and reasons, then tables.
func printCheckTable(w io.Writer, r *compare.Result) {
	fmt.Fprintf(w, "Verdict: %s   score %.2f   (%s, %.0f MHz)\n", strings.ToUpper(string(r.Verdict)), r.Score, r.Solvent, r.FieldMHz)
	for _, s := range r.Reasons {
		fmt.Fprintf(w, "  - %s\n", s)
	}
	fmt.Fprintf(w, "Scores: shifts %.2f, splitting %.2f, integrals %.2f, explained %.2f\n\n",
		r.Scores.Shifts, r.Scores.Splitting, r.Scores.Integrals, r.Scores.Explained)
	tw := tabwriter.NewWriter(w, 2, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "SIGNAL\tH\tPREDICTED\tMEASURED\tΔ ppm\tMULT (pred/meas)\tINTEGRAL H")
	for _, a := range r.Assignments {
		shared := ""
		if a.Shared {
			shared = " (shared)"
		}
		fmt.Fprintf(tw, "%s\t%d\t%.2f\t%.2f\t%+.2f\t%s / %s\t%.2f%s\n", a.Signal, a.NH, a.PredictedPPM, a.MeasuredPPM,
			a.DeltaPPM, orDash(a.PredictedMultiplicity), orDash(a.Multiplicity), a.IntegralH, shared)
	}
	tw.Flush()
	if len(r.Missing) > 0 {
		fmt.Fprintf(w, "Missing signals: %s\n", strings.Join(r.Missing, ", "))
	}
	if len(r.Unexplained) > 0 {
		fmt.Fprintln(w, "\nPeaks not from the compound:")
		tw = tabwriter.NewWriter(w, 2, 4, 2, ' ', 0)
		fmt.Fprintln(tw, "PPM\tMULT\tH-EQUIV\t% OF TOTAL\tLIKELY")
		for _, u := range r.Unexplained {
			fmt.Fprintf(tw, "%.2f\t%s\t%.2f\t%.1f\t%s\n", u.PPM, orDash(u.Multiplicity), u.IntegralH, u.Percent, orDash(u.Likely))
		}
		tw.Flush()
	}
	fmt.Fprintf(w, "\nPurity: %s mol %% (±%s) by integrals", fmtPtr(r.Purity.MolarPercent, ""), fmtPtr(r.Purity.MolarUncertainty, ""))
	if r.Purity.QNMRMassPercent != nil {
		fmt.Fprintf(w, "; qNMR %s mass %% (±%s)", fmtPtr(r.Purity.QNMRMassPercent, ""), fmtPtr(r.Purity.UncertaintyPercent, ""))
	}
	fmt.Fprintln(w)
	if len(r.Candidates) > 0 {
		fmt.Fprintln(w, "\nCandidates:")
		tw = tabwriter.NewWriter(w, 2, 4, 2, ' ', 0)
		fmt.Fprintln(tw, "RANK\tSCORE\tVERDICT\tSMILES\tDISCRIMINATING SIGNALS")
		for _, c := range r.Candidates {
			mark := ""
			if c.Main {
				mark = " (given)"
			}
			note := strings.Join(c.Discriminating, "; ")
			if c.Error != "" {
				note = c.Error
			}
			fmt.Fprintf(tw, "%d\t%.2f\t%s\t%s%s\t%s\n", c.Rank, c.Score, c.Verdict, c.Smiles, mark, orDash(note))
		}
		tw.Flush()
	}
	for _, c := range r.Cautions {
		fmt.Fprintf(w, "Caution: %s\n", c)
	}
	for _, s := range r.Warnings {
		fmt.Fprintf(w, "Warning: %s\n", s)
	}
	fmt.Fprintf(w, "\n%s\n", r.Advisory)
}

// printCheckTSV writes one record per line, first field the record kind.
func printCheckTSV(w io.Writer, r *compare.Result) {
	fmt.Fprintf(w, "verdict\t%s\t%.3f\n", r.Verdict, r.Score)
	for _, s := range r.Reasons {
		fmt.Fprintf(w, "reason\t%s\n", s)
	}
	for _, a := range r.Assignments {
		fmt.Fprintf(w, "assignment\t%s\t%.3f\t%.3f\t%s\t%.2f\n", a.Signal, a.PredictedPPM, a.MeasuredPPM, a.Multiplicity, a.IntegralH)
	}
	for _, m := range r.Missing {
		fmt.Fprintf(w, "missing\t%s\n", m)
	}
	for _, u := range r.Unexplained {
		fmt.Fprintf(w, "unexplained\t%.3f\t%.2f\t%.2f\t%s\n", u.PPM, u.IntegralH, u.Percent, u.Likely)
	}
	fmt.Fprintf(w, "purity\t%s\t%s\t%s\n", fmtPtr(r.Purity.MolarPercent, ""), fmtPtr(r.Purity.QNMRMassPercent, ""), fmtPtr(r.Purity.UncertaintyPercent, ""))
	for _, c := range r.Candidates {
		fmt.Fprintf(w, "candidate\t%d\t%s\t%.3f\t%s\n", c.Rank, c.Smiles, c.Score, c.Verdict)
	}
	for _, c := range r.Cautions {
		fmt.Fprintf(w, "caution\t%s\n", c)
	}
	for _, s := range r.Warnings {
		fmt.Fprintf(w, "warning\t%s\n", s)
	}
	fmt.Fprintf(w, "advisory\t%s\n", r.Advisory)
}

func orDash(s string) string {
	if s == "" {
		return "—"
	}
	return s
}
