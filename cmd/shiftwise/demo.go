package main

import (
	"fmt"
	"path/filepath"

	"github.com/spf13/cobra"

	"shiftwise/internal/demo"
	"shiftwise/screen"
)

// DemoOptions are the flags of the demo command.
type DemoOptions struct {
	OutDir string
	Jobs   int
}

func init() { register("demo", newDemoCmd) }

func newDemoCmd(f *Factory) *cobra.Command {
	opts := &DemoOptions{}
	cmd := &cobra.Command{
		Use:   "demo",
		Short: "Run a batch check on the built-in demo scenario (invented data)",
		Long: `demo writes an invented contract lab's batch — seven samples with
synthesised spectra: a clean pass, a wrong regioisomer, a wet sample, residual
solvent, leftover starting material, a low qNMR assay and a benchtop (80 MHz)
spectrum — then screens it exactly as 'shiftwise screen' would and prints
where the report index is.

The scenario and its spectra are invented for the demo; they are not data
about real samples. The demo exits 0 when the batch ran, whatever the
verdicts.`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error { return runDemo(f, opts) },
	}
	cmd.Flags().StringVarP(&opts.OutDir, "out", "o", "shiftwise-demo", "directory for the demo's spectra, manifest and reports")
	cmd.Flags().IntVarP(&opts.Jobs, "jobs", "j", 0, "samples checked in parallel (default: all cores)")
	return cmd
}

func runDemo(f *Factory, opts *DemoOptions) error {
	manifest, stories, err := demo.Write(opts.OutDir)
	if err != nil {
		return withCode(exitError, err)
	}
	fmt.Fprintf(f.Out, "Demo batch (invented data) written to %s\n\n", manifest)
	for _, s := range stories {
		fmt.Fprintf(f.Out, "  %s  %s\n", s.ID, s.Text)
	}
	fmt.Fprintln(f.Out)
	m, err := screen.Load(manifest)
	if err != nil {
		return withCode(exitError, err)
	}
	out := filepath.Join(opts.OutDir, "reports")
	sum, err := screen.Run(m, screen.Options{OutDir: out, Jobs: opts.Jobs, Version: version,
		Progress: progressReporter(f, len(m.Samples))})
	if err != nil {
		return withCode(exitError, err)
	}
	printScreenSummary(f, sum)
	abs, _ := filepath.Abs(filepath.Join(out, "index.html"))
	fmt.Fprintf(f.Out, "\nReport index: %s\n", abs)
	fmt.Fprintln(f.Out, "Open it in a browser. The automated results are advisory: release of material follows the lab's own procedures and qualified review.")
	return nil
}
