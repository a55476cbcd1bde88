package main

import (
	"fmt"
	"path/filepath"

	"github.com/schollz/progressbar/v3"
	"github.com/spf13/cobra"

	"shiftwise/screen"
)

// ScreenOptions are the flags of the screen command.
type ScreenOptions struct {
	Manifest string
	OutDir   string
	Jobs     int
}

func init() { register("screen", newScreenCmd) }

func newScreenCmd(f *Factory) *cobra.Command {
	opts := &ScreenOptions{}
	cmd := &cobra.Command{
		Use:   "screen MANIFEST.toml",
		Short: "Check a batch of samples listed in a manifest",
		Long: `screen checks every sample of a manifest in parallel and writes, into the
output directory, one HTML report per sample, an index page (index.html) and
a summary (summary.csv, summary.json). A sample that cannot be checked
(missing file, bad SMILES, corrupt spectrum) becomes an error row; the others
go on. Files are written atomically.

Manifest (TOML):
  title = "Week 48 batch"            # optional
  solvent = "CDCl3"                  # default for all samples
  [[sample]]
  id = "LOT-0412"
  spectrum = "spectra/lot0412.jdx"   # relative to the manifest
  smiles = "CCOC(=O)c1ccc(OC)cc1"    # intended product
  candidates = ["..."]               # optional alternatives to rank
  impurities = ["..."]               # optional expected impurities
  [sample.standard]                  # optional qNMR internal standard
  smiles = "COc1cc(OC)cc(OC)c1"
  mass_mg = 5.02
  purity_percent = 99.9
  sample_mass_mg = 12.1

Exit status: 0 all consistent; 3 any inconsistent; 4 any review and none
inconsistent; 1 any input error (usage, manifest, or a sample that could not
be checked).

The automated results are advisory: release of material follows the lab's
own procedures and qualified review.`,
		Args: oneArg("screen", "manifest file"),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.Manifest = args[0]
			return runScreen(f, opts)
		},
	}
	cmd.Flags().StringVarP(&opts.OutDir, "out", "o", "", "output directory (default: <manifest name>-results beside the manifest)")
	cmd.Flags().IntVarP(&opts.Jobs, "jobs", "j", 0, "samples checked in parallel (default: all cores)")
	return cmd
}

func runScreen(f *Factory, opts *ScreenOptions) error {
	m, err := screen.Load(opts.Manifest)
	if err != nil {
		return withCode(exitError, err)
	}
	out := opts.OutDir
	if out == "" {
		base := filepath.Base(opts.Manifest)
		out = filepath.Join(filepath.Dir(opts.Manifest), base[:len(base)-len(filepath.Ext(base))]+"-results")
	}
	sum, err := screen.Run(m, screen.Options{OutDir: out, Jobs: opts.Jobs, Version: version,
		Progress: progressReporter(f, len(m.Samples))})
	if err != nil {
		return withCode(exitError, err)
	}
	printScreenSummary(f, sum)
	fmt.Fprintf(f.Out, "report index: %s\n", filepath.Join(out, "index.html"))
	fmt.Fprintln(f.Out, "Advisory: release of material follows the lab's own procedures and qualified review.")
	if st := sum.Status(); st != screen.StatusOK {
		return withCode(st, nil)
	}
	return nil
}

// progressReporter draws a progress bar on a terminal (stderr) and plain
// lines otherwise.
func progressReporter(f *Factory, total int) func(int, int, screen.Row) {
	if f.ErrIsTTY {
		bar := progressbar.NewOptions(total,
			progressbar.OptionSetWriter(f.Err),
			progressbar.OptionSetDescription("checking"),
			progressbar.OptionShowCount(),
			progressbar.OptionClearOnFinish())
		return func(done, total int, r screen.Row) { bar.Set(done) }
	}
	return func(done, total int, r screen.Row) {
		state := r.Verdict
		if r.Error != "" {
			state = "error"
		}
		fmt.Fprintf(f.Err, "[%d/%d] %s %s\n", done, total, r.ID, state)
	}
}

func printScreenSummary(f *Factory, sum *screen.Summary) {
	if f.IsTTY {
		fmt.Fprintf(f.Out, "%-16s %-13s %6s %8s %6s  %s\n", "sample", "verdict", "score", "purity%", "unexpl", "found / error")
	}
	for _, r := range sum.Rows {
		pur := "-"
		if r.PurityPercent != nil {
			pur = fmt.Sprintf("%.1f", *r.PurityPercent)
			if r.PurityMethod == "qNMR" {
				pur += "q"
			}
		}
		v := r.Verdict
		if r.Error != "" {
			v = "error"
		}
		if f.IsTTY {
			fmt.Fprintf(f.Out, "%-16s %-13s %6.2f %8s %6d  %s%s\n", r.ID, v, r.Score, pur, r.Unexplained, r.Found, r.Error)
		} else {
			fmt.Fprintf(f.Out, "%s\t%s\t%.3f\t%s\t%d\t%s\t%s\n", r.ID, v, r.Score, pur, r.Unexplained, r.Found, r.Error)
		}
	}
}
