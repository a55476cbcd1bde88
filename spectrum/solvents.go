package spectrum

import (
	"strings"
	"unicode"
)

// Solvent describes a deuterated NMR solvent: where its residual
// (incompletely deuterated) proton signal and its dissolved water appear in a
// 1H spectrum.
//
// The residual and water shifts are those of Fulmer et al. 2010
// (Organometallics 29, 2176, Table 1), which extend Gottlieb, Kotlyar &
// Nudelman 1997 (J. Org. Chem. 62, 7512, Table 1); the numbers here were
// written down from memory of those tables, not re-read from them. The
// H–D couplings of the residual multiplets are typical values, also from
// memory.
type Solvent struct {
	Name         string  // canonical name, e.g. "CDCl3", "DMSO-d6"
	ResidualPPM  float64 // residual 1H signal used for referencing
	Multiplicity string  // pattern of the residual signal: "s", "t" (1:1:1 of CHD), "p" (1:2:3:2:1 of CHD2)
	JHDHz        float64 // H–D coupling of the residual pattern; 0 for a singlet
	WaterPPM     float64 // H2O/HOD signal in this solvent
	Source       string  // where the numbers come from
}

const fulmerSource = "Fulmer et al. 2010, Organometallics 29, 2176, Table 1 (values from memory)"

// residuals is the table behind Residuals and LookupSolvent, in the order of
// Fulmer et al. 2010, Table 1, with a few common extras.
var residuals = []Solvent{
	{"CDCl3", 7.26, "s", 0, 1.56, fulmerSource},
	{"acetone-d6", 2.05, "p", 2.2, 2.84, fulmerSource},
	{"DMSO-d6", 2.50, "p", 1.9, 3.33, fulmerSource},
	{"C6D6", 7.16, "s", 0, 0.40, fulmerSource},
	{"CD3CN", 1.94, "p", 2.5, 2.13, fulmerSource},
	{"CD3OD", 3.31, "p", 1.7, 4.87, fulmerSource},
	{"D2O", 4.79, "s", 0, 4.79, fulmerSource},
	{"CD2Cl2", 5.32, "t", 1.0, 1.52, fulmerSource},
	{"THF-d8", 3.58, "s", 0, 2.46, fulmerSource},
	{"toluene-d8", 2.08, "p", 2.3, 0.43, fulmerSource},
	{"pyridine-d5", 8.74, "s", 0, 4.96, fulmerSource},
}

// solventAliases maps a folded spelling (see foldSolvent) to the canonical
// name. It covers the ways JCAMP-DX headers and people write the solvents.
var solventAliases = map[string]string{
	"CDCL3": "CDCl3", "CHLOROFORMD": "CDCl3", "CHLOROFORM": "CDCl3", "DEUTEROCHLOROFORM": "CDCl3", "CHLOROFORMD1": "CDCl3",
	"ACETONE": "acetone-d6", "ACETONED6": "acetone-d6", "ACETONED": "acetone-d6", "CD3COCD3": "acetone-d6", "ACETON": "acetone-d6",
	"DMSO": "DMSO-d6", "DMSOD6": "DMSO-d6", "DMSOD": "DMSO-d6", "DIMETHYLSULFOXIDED6": "DMSO-d6", "DIMETHYLSULFOXIDE": "DMSO-d6", "CD3SOCD3": "DMSO-d6",
	"C6D6": "C6D6", "BENZENED6": "C6D6", "BENZENE": "C6D6",
	"CD3CN": "CD3CN", "ACETONITRILED3": "CD3CN", "ACETONITRILE": "CD3CN", "ACN": "CD3CN",
	"CD3OD": "CD3OD", "MEOD": "CD3OD", "METHANOLD4": "CD3OD", "METHANOL": "CD3OD", "MEODD4": "CD3OD", "CDOD": "CD3OD", "MEOHD4": "CD3OD",
	"D2O": "D2O", "DEUTERIUMOXIDE": "D2O", "WATERD2": "D2O", "HDO": "D2O", "H2OD2O": "D2O",
	"CD2CL2": "CD2Cl2", "DICHLOROMETHANED2": "CD2Cl2", "METHYLENECHLORIDED2": "CD2Cl2", "DICHLOROMETHANE": "CD2Cl2", "DCM": "CD2Cl2",
	"THFD8": "THF-d8", "THF": "THF-d8", "TETRAHYDROFURAND8": "THF-d8",
	"TOLUENED8": "toluene-d8", "TOLUENE": "toluene-d8", "C7D8": "toluene-d8",
	"PYRIDINED5": "pyridine-d5", "PYRIDINE": "pyridine-d5", "C5D5N": "pyridine-d5",
}

// foldSolvent upper-cases a solvent name and drops everything but letters and
// digits, so "DMSO-d6", "dmso_d6" and "DMSO D6" fold to the same key.
func foldSolvent(name string) string {
	var b strings.Builder
	for _, r := range name {
		if unicode.IsLetter(r) || unicode.IsDigit(r) {
			b.WriteRune(unicode.ToUpper(r))
		}
	}
	return b.String()
}

// NormalizeSolvent returns the canonical name of a solvent as written in a
// file header or on the command line ("CHLOROFORM-D" → "CDCl3", "DMSO" →
// "DMSO-d6", "MeOD" → "CD3OD", …). ok is false when the name is not
// recognised; the returned name is then the input, trimmed.
func NormalizeSolvent(name string) (string, bool) {
	key := foldSolvent(name)
	if c, ok := solventAliases[key]; ok {
		return c, true
	}
	// Headers sometimes add a concentration or a mixture note
	// ("CDCl3 + TMS", "DMSO-D6 (99.9%)"): try the first word.
	if f := strings.FieldsFunc(name, func(r rune) bool { return r == ' ' || r == '+' || r == '(' || r == ',' || r == '/' }); len(f) > 1 {
		if c, ok := solventAliases[foldSolvent(f[0])]; ok {
			return c, true
		}
	}
	return strings.TrimSpace(name), false
}

// LookupSolvent returns the residual-signal data of a solvent given in any
// spelling NormalizeSolvent accepts.
func LookupSolvent(name string) (Solvent, bool) {
	c, ok := NormalizeSolvent(name)
	if !ok {
		return Solvent{}, false
	}
	for _, s := range residuals {
		if s.Name == c {
			return s, true
		}
	}
	return Solvent{}, false
}

// Residuals returns a copy of the residual-solvent table (Fulmer et al. 2010,
// Table 1; values from memory).
func Residuals() []Solvent {
	out := make([]Solvent, len(residuals))
	copy(out, residuals)
	return out
}
