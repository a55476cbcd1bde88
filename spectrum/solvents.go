package spectrum

import "shiftwise/internal/solvent"

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

// NormalizeSolvent returns the canonical name of a solvent as written in a
// file header or on the command line ("CHLOROFORM-D" → "CDCl3", "DMSO" →
// "DMSO-d6", "MeOD" → "CD3OD", "CDCl3 + TMS" → "CDCl3", …), using the
// project's one spelling table (internal/solvent). ok is false when the name
// is not recognised; the returned name is then the input, trimmed.
func NormalizeSolvent(name string) (string, bool) { return solvent.Normalize(name) }

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
