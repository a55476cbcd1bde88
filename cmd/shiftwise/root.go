package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"sort"

	"github.com/spf13/cobra"
	"golang.org/x/term"
)

// Exit codes shared by all commands. check and screen add their verdict codes.
const (
	exitOK           = 0
	exitError        = 1 // usage or input error
	exitInconsistent = 3 // the spectrum does not support the structure
	exitReview       = 4 // a person must look
)

// Factory carries what commands need from the outside world, so tests can
// substitute in-memory streams.
type Factory struct {
	In       io.Reader
	Out      io.Writer
	Err      io.Writer
	IsTTY    bool // Out is a terminal: draw tables and progress bars
	ErrIsTTY bool
}

func newFactory() *Factory {
	return &Factory{
		In: os.Stdin, Out: os.Stdout, Err: os.Stderr,
		IsTTY:    term.IsTerminal(int(os.Stdout.Fd())),
		ErrIsTTY: term.IsTerminal(int(os.Stderr.Fd())),
	}
}

// exitError carries a specific exit code out of a command's RunE.
type codeError struct {
	code int
	err  error // may be nil: the command already printed what it had to say
}

func (e *codeError) Error() string {
	if e.err == nil {
		return fmt.Sprintf("exit status %d", e.code)
	}
	return e.err.Error()
}
func (e *codeError) Unwrap() error { return e.err }

// withCode wraps err (possibly nil) so that Main exits with code.
func withCode(code int, err error) error { return &codeError{code: code, err: err} }

// commandMakers holds the constructors of the subcommands. Each command file
// registers its constructor in an init function, so that files for separate
// commands do not edit a shared list.
var commandMakers = map[string]func(*Factory) *cobra.Command{}

func register(name string, mk func(*Factory) *cobra.Command) { commandMakers[name] = mk }

// newRootCmd builds the command tree.
func newRootCmd(f *Factory) *cobra.Command {
	root := &cobra.Command{
		Use:   "shiftwise",
		Short: "Check a measured 1H NMR spectrum against the intended structure",
		Long: `shiftwise predicts the 1H NMR spectrum of a structure given as SMILES,
reads a measured spectrum (JCAMP-DX or CSV), matches the two, explains or flags
every peak and gives an advisory verdict with reasons.

The automated result is advisory: release of material follows the lab's own
procedures and qualified review.`,
		SilenceUsage:  true,
		SilenceErrors: true,
		Version:       version, // --version: the same string the reports record
	}
	root.SetOut(f.Out)
	root.SetErr(f.Err)
	root.SetIn(f.In)
	names := make([]string, 0, len(commandMakers))
	for n := range commandMakers {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		root.AddCommand(commandMakers[n](f))
	}
	return root
}

// Main runs the command line and returns the process exit code.
func Main(args []string, f *Factory) int {
	root := newRootCmd(f)
	root.SetArgs(args)
	err := root.Execute()
	if err == nil {
		return exitOK
	}
	var ce *codeError
	if errors.As(err, &ce) {
		if ce.err != nil {
			fmt.Fprintln(f.Err, "shiftwise:", ce.err)
		}
		return ce.code
	}
	fmt.Fprintln(f.Err, "shiftwise:", err)
	return exitError
}

// version is the shiftwise version recorded in reports; set at build time
// with -ldflags "-X main.version=...".
var version = "dev"

// Bounds of a --field value in MHz. Outside them the number is almost
// certainly in the wrong unit (Hz, GHz or tesla) or a typo: 1H observe
// frequencies run from about 40 MHz (benchtop) to about 1200 MHz.
const (
	minFieldMHz = 1
	maxFieldMHz = 10000
)

// checkField refuses a --field value given explicitly (changed is true) that
// is not a 1H observe frequency in MHz. An unset flag (0) means the default.
func checkField(cmd string, v float64, changed bool) error {
	if !changed {
		return nil
	}
	if !(v >= minFieldMHz && v <= maxFieldMHz) {
		return fmt.Errorf("%s: --field must be the 1H observe frequency in MHz, between %d and %d (e.g. 400), found %v", cmd, minFieldMHz, maxFieldMHz, v)
	}
	return nil
}

// oneArg returns an argument check for commands that take exactly one
// positional argument (what names it in the message); a wrong count is a
// usage error with exit status 1.
func oneArg(command, what string) cobra.PositionalArgs {
	return func(cmd *cobra.Command, args []string) error {
		if len(args) != 1 {
			return withCode(exitError, fmt.Errorf("%s: expected one %s, found %d arguments", command, what, len(args)))
		}
		return nil
	}
}
