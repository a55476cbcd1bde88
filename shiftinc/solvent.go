package shiftinc

import (
	"strings"

	"shiftwise/internal/solvent"
)

// foldSolvent folds a solvent spelling for the table's own aliases (rows of
// a user file may add spellings); see solvent.Fold.
func foldSolvent(s string) string { return solvent.Fold(s) }

// NormalizeSolvent maps a solvent name to the name used in the tables:
// "CDCl3", "DMSO-d6", "CD3OD", "D2O", "acetone-d6", "C6D6", and also "CD3CN",
// "CD2Cl2", "CCl4", "pyridine-d5", "toluene-d8", "THF-d8". It accepts the
// usual spellings ("DMSO", "chloroform-d", "methanol-d4", "d6-acetone") and
// verbose database labels such as "Chloroform-D1 (CDCl3)": a name is
// recognised when a known spelling equals it or, failing that, when the
// text in parentheses or its first word is one. An empty name means CDCl3.
// ok is false for names it does not recognise (the name is then returned
// unchanged).
func NormalizeSolvent(name string) (string, bool) {
	return Default().NormalizeSolvent(name)
}

// NormalizeSolvent is the package function NormalizeSolvent, also
// accepting the aliases of solvent rows added to t.
func (t *Table) NormalizeSolvent(name string) (string, bool) {
	if strings.TrimSpace(name) == "" {
		return "CDCl3", true
	}
	f := foldSolvent(name)
	if n, ok := t.solventAlias[f]; ok && f != "" {
		return n, true
	}
	if n, ok := solvent.Normalize(name); ok {
		return n, true
	}
	return name, false
}

// solventRow returns the solvent row for a normalised name (nil if none).
func (t *Table) solventRow(name string) *Row { return t.row("solvent", name) }
