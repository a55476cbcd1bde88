// Package solvent names the deuterated NMR solvents the same way everywhere:
// one table of canonical names and the spellings met in file headers,
// databases and on the command line. The shift tables (shiftinc), the
// residual-signal table (spectrum) and the impurity tables (compare) all key
// on these canonical names.
package solvent

import (
	"slices"
	"strings"
	"unicode"
)

// Canonical names.
const (
	CDCl3     = "CDCl3"
	DMSO      = "DMSO-d6"
	CD3OD     = "CD3OD"
	D2O       = "D2O"
	Acetone   = "acetone-d6"
	C6D6      = "C6D6"
	CD3CN     = "CD3CN"
	CD2Cl2    = "CD2Cl2"
	CCl4      = "CCl4"
	Pyridine  = "pyridine-d5"
	Toluene   = "toluene-d8"
	THF       = "THF-d8"
	Default   = CDCl3 // what a spectrum without a solvent is assumed to be in
	maxFields = 8
)

// spellings maps each canonical name to its folded spellings (see Fold).
// Plain protio names ("chloroform", "benzene") are accepted because headers
// and databases often write the solvent that way.
var spellings = map[string][]string{
	CDCl3:    {"CDCL3", "CHLOROFORMD", "CHLOROFORMD1", "CHLOROFORM", "DEUTEROCHLOROFORM", "CHCL3"},
	DMSO:     {"DMSOD6", "DMSO", "DMSOD", "DIMETHYLSULFOXIDE", "DIMETHYLSULPHOXIDE", "DIMETHYLSULFOXIDED6", "DIMETHYLSULPHOXIDED6", "CD3SOCD3", "CD32SO", "C2D6SO", "DMCOD6"},
	CD3OD:    {"CD3OD", "METHANOLD4", "METHANOL", "MEOD", "MEODD4", "CD3OH", "CDOD", "MEOHD4"},
	D2O:      {"D2O", "DEUTERIUMOXIDE", "WATER", "H2O", "WATERD2", "HDO", "H2OD2O"},
	Acetone:  {"ACETONED6", "ACETONE", "ACETONED", "CD3COCD3", "CD32CO", "ACETON"},
	C6D6:     {"C6D6", "BENZENED6", "BENZENE"},
	CD3CN:    {"CD3CN", "ACETONITRILED3", "ACETONITRILE", "ACN"},
	CD2Cl2:   {"CD2CL2", "DICHLOROMETHANED2", "METHYLENECHLORIDED2", "DICHLOROMETHANE", "DCM"},
	CCl4:     {"CCL4", "TETRACHLOROMETHANE", "CARBONTETRACHLORIDE"},
	Pyridine: {"PYRIDINED5", "PYRIDIND5", "PYRIDINE", "C5D5N"},
	Toluene:  {"TOLUENED8", "TOLUOLD8", "TOLUENE", "C7D8"},
	THF:      {"THFD8", "THF", "TETRAHYDROFURAND8", "C4D8O"},
}

var byFold = func() map[string]string {
	m := map[string]string{}
	for name, sp := range spellings {
		m[Fold(name)] = name
		for _, s := range sp {
			m[s] = name
			// "d6-DMSO", "d4-methanol": the label written first.
			for _, pre := range []string{"D6", "D4", "D8", "D3", "D2", "D5", "D1"} {
				m[pre+s] = name
			}
		}
	}
	return m
}()

// Fold upper-cases a name and keeps only letters and digits, so "DMSO-d6",
// "dmso_d6" and "DMSO D6" fold alike.
func Fold(name string) string {
	var b strings.Builder
	for _, r := range name {
		if unicode.IsLetter(r) || unicode.IsDigit(r) {
			b.WriteRune(unicode.ToUpper(r))
		}
	}
	return b.String()
}

// Normalize returns the canonical name of a solvent written in any usual
// spelling: exactly, as the text in parentheses ("Chloroform-D1 (CDCl3)"),
// or as the first word of a longer label ("CDCl3 + TMS", "DMSO-D6 99.9%").
// ok is false when the name is not recognised; the trimmed input is then
// returned. An empty name is not recognised: callers choose their default.
func Normalize(name string) (string, bool) {
	name = strings.TrimSpace(name)
	if c, ok := byFold[Fold(name)]; ok {
		return c, true
	}
	if i := strings.IndexByte(name, '('); i >= 0 {
		if c, ok := byFold[Fold(name[:i])]; ok {
			return c, true
		}
		inner := strings.FieldsFunc(name[i:], func(r rune) bool { return r == '(' || r == ')' || r == ',' })
		for _, part := range inner {
			if c, ok := byFold[Fold(part)]; ok {
				return c, true
			}
		}
	}
	f := strings.FieldsFunc(name, func(r rune) bool { return r == ' ' || r == '+' || r == '(' || r == ',' || r == '/' || r == '\t' })
	if len(f) > 1 && len(f) <= maxFields {
		if c, ok := byFold[Fold(f[0])]; ok {
			return c, true
		}
	}
	return name, false
}

// Names returns the canonical names, sorted.
func Names() []string {
	out := make([]string, 0, len(spellings))
	for n := range spellings {
		out = append(out, n)
	}
	slices.Sort(out)
	return out
}
