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

	"shiftwise/graph"
	"shiftwise/smiles"
)

func init() { register("describe", newDescribeCmd) }

// describeOptions holds the arguments of the describe command.
type describeOptions struct {
	smiles string
	json   bool
}

// describeResult is the fixed JSON shape of describe: scripts read it.
type describeResult struct {
	Smiles           string            `json:"smiles"`
	Formula          string            `json:"formula"`
	MolecularWeight  float64           `json:"molecular_weight"`
	MonoisotopicMass float64           `json:"monoisotopic_mass"`
	Environments     []describeEnvJSON `json:"environments"`
}

// describeEnvJSON is one proton environment in the JSON output.
type describeEnvJSON struct {
	Label                  string `json:"label"`
	Atoms                  []int  `json:"atoms"`
	NH                     int    `json:"n_h"`
	Kind                   string `json:"kind"`
	Exchangeable           bool   `json:"exchangeable"`
	MagneticallyEquivalent bool   `json:"magnetically_equivalent"`
}

const describeLong = `describe reads a structure as SMILES and prints its molecular formula
(Hill order), molecular weight (g/mol, IUPAC standard atomic weights, two
decimals), monoisotopic mass (u, four decimals) and its proton environments:
the sets of chemically equivalent hydrogens an 1H spectrum shows, each with a
label, the 0-based indices of the heavy atoms carrying them (in the order the
atoms are written in the SMILES), the number of H and the kind (CH3, CH2, CH,
=CH2, =CH, ArH, CHO, OH, NH, ...).

Flags in the table: "exchangeable" marks H on O, N or S; "not magnetically
equivalent" marks chemically equivalent H that couple differently to another
spin (the AA'BB' ring H of a para-disubstituted benzene).

Output is a table on a terminal, tab-separated lines when piped, or JSON
(--json) with the keys smiles, formula, molecular_weight, monoisotopic_mass,
environments (label, atoms, n_h, kind, exchangeable, magnetically_equivalent).

A SMILES that cannot be read exits with status 1 and shows the column.`

func newDescribeCmd(f *Factory) *cobra.Command {
	o := &describeOptions{}
	cmd := &cobra.Command{
		Use:   "describe SMILES",
		Short: "Show formula, masses and proton environments of a structure",
		Long:  describeLong,
		Args:  oneArg("describe", "SMILES argument"),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.smiles = args[0]
			return runDescribe(f, o)
		},
	}
	cmd.Flags().BoolVar(&o.json, "json", false, "print JSON")
	return cmd
}

func runDescribe(f *Factory, o *describeOptions) error {
	m, err := smiles.Parse(o.smiles)
	if err != nil {
		printSmilesError(f.Err, o.smiles, err)
		return withCode(exitError, nil)
	}
	res := describe(o.smiles, m)
	switch {
	case o.json:
		enc := json.NewEncoder(f.Out)
		enc.SetIndent("", "  ")
		if err := enc.Encode(res); err != nil {
			return withCode(exitError, err)
		}
	case f.IsTTY:
		printDescribeTable(f.Out, res)
	default:
		printDescribeTSV(f.Out, res)
	}
	return nil
}

// printSmilesError writes each positioned SMILES error followed by the input
// with a caret under the column.
func printSmilesError(w io.Writer, src string, err error) {
	list, ok := smiles.AsList(err)
	if !ok || len(list) == 0 {
		fmt.Fprintln(w, "shiftwise describe:", err)
		return
	}
	for _, e := range list {
		fmt.Fprintf(w, "shiftwise describe: %v\n%s\n", e, indent(smiles.Caret(src, e.Pos), "  "))
	}
}

func indent(s, pre string) string {
	return pre + strings.ReplaceAll(s, "\n", "\n"+pre)
}

// describe collects what the command prints.
func describe(src string, m *graph.Mol) *describeResult {
	res := &describeResult{
		Smiles:           src,
		Formula:          m.Formula(),
		MolecularWeight:  roundTo(m.AverageMass(), 2),
		MonoisotopicMass: roundTo(m.MonoisotopicMass(), 4),
		Environments:     []describeEnvJSON{},
	}
	for _, e := range m.Environments() {
		res.Environments = append(res.Environments, describeEnvJSON{
			Label: e.Label, Atoms: e.Atoms, NH: e.NH, Kind: e.Kind,
			Exchangeable: e.Exchangeable, MagneticallyEquivalent: e.MagneticallyEquivalent,
		})
	}
	return res
}

func roundTo(x float64, digits int) float64 {
	p := math.Pow(10, float64(digits))
	return math.Round(x*p) / p
}

func joinInts(xs []int) string {
	s := make([]string, len(xs))
	for i, x := range xs {
		s[i] = strconv.Itoa(x)
	}
	return strings.Join(s, ",")
}

// envFlags describes the flags of an environment in words ("" when none).
func envFlags(e describeEnvJSON) string {
	var f []string
	if e.Exchangeable {
		f = append(f, "exchangeable")
	}
	if !e.MagneticallyEquivalent {
		f = append(f, "not magnetically equivalent")
	}
	return strings.Join(f, "; ")
}

func printDescribeTable(w io.Writer, r *describeResult) {
	tw := tabwriter.NewWriter(w, 2, 4, 2, ' ', 0)
	fmt.Fprintf(tw, "SMILES\t%s\n", r.Smiles)
	fmt.Fprintf(tw, "formula\t%s\n", r.Formula)
	fmt.Fprintf(tw, "molecular weight\t%.2f g/mol\n", r.MolecularWeight)
	fmt.Fprintf(tw, "monoisotopic mass\t%.4f u\n", r.MonoisotopicMass)
	tw.Flush()
	fmt.Fprintln(w)
	if len(r.Environments) == 0 {
		fmt.Fprintln(w, "no proton environments (no protium bonded to a heavy atom)")
		return
	}
	tw = tabwriter.NewWriter(w, 2, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "LABEL\tATOMS\tH\tKIND\tFLAGS")
	for _, e := range r.Environments {
		fmt.Fprintf(tw, "%s\t%s\t%d\t%s\t%s\n", e.Label, joinInts(e.Atoms), e.NH, e.Kind, envFlags(e))
	}
	tw.Flush()
}

// printDescribeTSV writes one record per line, its type in the first field:
// smiles, formula, molecular_weight, monoisotopic_mass, then one
// "environment" line per set (label, atoms, n_h, kind, exchangeable,
// magnetically_equivalent).
func printDescribeTSV(w io.Writer, r *describeResult) {
	fmt.Fprintf(w, "smiles\t%s\n", r.Smiles)
	fmt.Fprintf(w, "formula\t%s\n", r.Formula)
	fmt.Fprintf(w, "molecular_weight\t%.2f\n", r.MolecularWeight)
	fmt.Fprintf(w, "monoisotopic_mass\t%.4f\n", r.MonoisotopicMass)
	for _, e := range r.Environments {
		fmt.Fprintf(w, "environment\t%s\t%s\t%d\t%s\t%t\t%t\n",
			e.Label, joinInts(e.Atoms), e.NH, e.Kind, e.Exchangeable, e.MagneticallyEquivalent)
	}
}
