package shiftinc

import "strings"

// builtinSolvents maps folded spellings (see foldSolvent) to normalised
// solvent names. Longer, more specific spellings are matched first.
var builtinSolvents = []struct {
	name      string
	spellings []string
}{
	{"DMSO-d6", []string{"dmsod6", "dmso", "dimethylsulfoxide", "dimethylsulphoxide", "dimethylsulfoxided6", "dimethylsulphoxided6", "dmcod6", "c2d6so", "cd32so"}},
	{"CD3OD", []string{"cd3od", "methanold4", "methanol", "meod", "meodd4", "cd3oh"}},
	{"D2O", []string{"d2o", "deuteriumoxide", "water", "h2o", "waterd2"}},
	{"acetone-d6", []string{"acetoned6", "acetone", "cd32co"}},
	{"C6D6", []string{"c6d6", "benzened6", "benzene"}},
	{"CDCl3", []string{"cdcl3", "chloroformd", "chloroformd1", "chloroform", "deuterochloroform", "chcl3"}},
	{"CD3CN", []string{"cd3cn", "acetonitriled3", "acetonitrile"}},
	{"CD2Cl2", []string{"cd2cl2", "dichloromethaned2", "methylenechlorided2", "dichloromethane"}},
	{"CCl4", []string{"ccl4", "tetrachloromethane", "carbontetrachloride"}},
	{"pyridine-d5", []string{"pyridined5", "pyridind5", "c5d5n", "pyridine"}},
	{"toluene-d8", []string{"toluened8", "toluold8", "toluene", "c7d8"}},
	{"THF-d8", []string{"thfd8", "tetrahydrofurand8", "thf", "c4d8o"}},
}

// foldSolvent lower-cases a solvent spelling and drops everything but
// letters and digits: "DMSO-d6" → "dmsod6", "chloroform-d" → "chloroformd".
func foldSolvent(s string) string {
	var b strings.Builder
	for _, r := range strings.ToLower(s) {
		if r >= 'a' && r <= 'z' || r >= '0' && r <= '9' {
			b.WriteRune(r)
		}
	}
	return b.String()
}

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
	try := func(s string) (string, bool) {
		f := foldSolvent(s)
		if f == "" {
			return "", false
		}
		if n, ok := t.solventAlias[f]; ok {
			return n, true
		}
		for _, b := range builtinSolvents {
			if foldSolvent(b.name) == f {
				return b.name, true
			}
			for _, sp := range b.spellings {
				if sp == f || "d6"+sp == f || "d4"+sp == f || "d8"+sp == f {
					return b.name, true
				}
			}
		}
		return "", false
	}
	if n, ok := try(name); ok {
		return n, true
	}
	// Verbose labels: "Chloroform-D1 (CDCl3)", "Benzene-D6 (C6D6)".
	if i := strings.IndexByte(name, '('); i >= 0 {
		if n, ok := try(name[:i]); ok {
			return n, true
		}
		inner := strings.Trim(name[i:], "() ")
		for _, part := range strings.FieldsFunc(inner, func(r rune) bool { return r == ',' || r == ')' || r == '(' }) {
			if n, ok := try(part); ok {
				return n, true
			}
		}
	}
	if f := strings.Fields(name); len(f) > 1 {
		if n, ok := try(f[0]); ok {
			return n, true
		}
	}
	return name, false
}

// solventRow returns the solvent row for a normalised name (nil if none).
func (t *Table) solventRow(name string) *Row { return t.row("solvent", name) }
