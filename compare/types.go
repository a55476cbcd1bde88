package compare

import (
	"shiftwise/predict"
	"shiftwise/predict/spin"
	"shiftwise/spectrum"
)

// Verdict is the outcome of a check.
type Verdict string

// Verdicts. Their meaning is documented in doc.go (thresholds) and in the
// help of the check command (exit codes 0, 3 and 4).
const (
	Consistent   Verdict = "consistent"   // the spectrum supports the structure
	Inconsistent Verdict = "inconsistent" // the spectrum contradicts the structure
	Review       Verdict = "review"       // a person must look
)

// AdvisoryText is copied into every Result: the check is an aid, not a
// release decision.
const AdvisoryText = "The automated result is advisory: release of material follows the lab's own procedures and qualified review."

// Input names what is checked: the intended structure and the measured
// spectrum, plus optional alternatives, expected impurities and an internal
// standard. Exactly one of SpectrumPath, Spectrum or Peaks must be given.
type Input struct {
	Smiles string // the intended structure

	SpectrumPath string             // a JCAMP-DX or CSV file, read with spectrum.ReadFile
	Spectrum     *spectrum.Spectrum // an already read spectrum
	Peaks        *spectrum.PeakList // an already processed peak list (skips processing)

	// Prediction, when not nil, is used instead of predicting Smiles (for
	// tests and for callers that predict once and check many spectra).
	Prediction *predict.Prediction

	Candidates []string // alternative structures ranked against the same spectrum
	Impurities []string // expected impurities (starting materials, by-products)

	Standard *Standard // internal standard for qNMR; nil when none
}

// Standard describes an internal standard weighed into the sample for
// quantitative NMR (qNMR).
type Standard struct {
	Smiles       string  // structure of the standard, for its molar mass and H count
	MassMg       float64 // mass of standard weighed, mg
	SampleMassMg float64 // mass of sample weighed, mg
	PurityPct    float64 // purity of the standard, mass %
	// SignalPPM selects the standard's signal to integrate; 0 picks the
	// largest predicted signal of the standard that is found in the spectrum.
	SignalPPM float64
	// Standard uncertainties; zero selects the defaults documented in
	// qnmr.go (balance 0.01 mg, purity 0.1 %).
	MassUncertaintyMg   float64
	PurityUncertainty   float64 // percentage points
	IntegralUncertainty float64 // relative (0.01 = 1 %); 0 estimates it from the data
}

// Options tunes a check. The zero value works: field and solvent then come
// from the spectrum file.
type Options struct {
	FieldMHz    float64   // observe frequency; 0 takes it from the spectrum (default 400)
	Solvent     string    // deuterated solvent; "" takes it from the spectrum
	Mode        spin.Mode // prediction mode for strongly coupled clusters
	LineWidthHz float64   // line width for rendered predictions; 0 = 1 Hz
	MinSNR      float64   // peak-picking threshold passed to processing; 0 = its default
	// Predictor, when not nil, replaces the default prediction (SMILES
	// parsing and predict.Predict) for every structure of the check.
	Predictor Predictor `json:"-"`
	// MaxCandidates caps the number of candidate structures scored (work cap);
	// 0 means 20.
	MaxCandidates int
	// MinPurityPct is the purity (molar by integrals, or qNMR mass %) below
	// which the verdict is at least review: the lab's release
	// specification. 0 means DefaultMinPurity.
	MinPurityPct float64
}

// Result is the outcome of Check. Its JSON form is fixed (keys verdict,
// score, reasons, assignments, unexplained, missing, purity, candidates);
// further keys may be added, never renamed.
type Result struct {
	Verdict     Verdict       `json:"verdict"`
	Score       float64       `json:"score"`
	Reasons     []string      `json:"reasons"`
	Assignments []Assignment  `json:"assignments"`
	Unexplained []Unexplained `json:"unexplained"`
	Missing     []string      `json:"missing"`
	Purity      Purity        `json:"purity"`
	Candidates  []Candidate   `json:"candidates"`

	Smiles   string      `json:"smiles"`
	Solvent  string      `json:"solvent"`
	FieldMHz float64     `json:"field_mhz"`
	Scores   PartScores  `json:"scores"`
	HPerArea float64     `json:"h_per_area"` // fitted integral scale: protons per unit of measured area
	Found    []Identity  `json:"identified"` // recognised solvents, contaminants and given impurities
	Artifact []Artifact  `json:"artifacts"`  // 13C satellites and spinning sidebands (not impurities)
	Cautions []string    `json:"cautions"`   // limits of the method that apply to this check
	Warnings []string    `json:"warnings"`   // problems met on the way (prediction, processing)
	Advisory string      `json:"advisory"`
	Details  []SignalFit `json:"signals"` // one row per predicted signal, assigned or not

	// Prediction, Peaks and Trace are kept for plots and reports.
	Prediction *predict.Prediction `json:"-"`
	Peaks      *spectrum.PeakList  `json:"-"`
	Trace      *spectrum.Spectrum  `json:"-"` // processed trace (Peaks.Trace), nil for peak lists
}

// Assignment maps one predicted signal to the measured multiplet that
// explains it. Several signals may share one multiplet (overlap).
type Assignment struct {
	Signal       string  `json:"signal"`
	PredictedPPM float64 `json:"predicted_ppm"`
	MeasuredPPM  float64 `json:"measured_ppm"`
	Multiplicity string  `json:"multiplicity"` // measured
	IntegralH    float64 `json:"integral_h"`   // measured H of the multiplet share given to this signal

	PredictedMultiplicity string  `json:"predicted_multiplicity"`
	NH                    int     `json:"n_h"`
	Multiplet             int     `json:"multiplet"` // index into PeakList.Multiplets
	Shared                bool    `json:"shared"`    // the multiplet also explains other signals
	DeltaPPM              float64 `json:"delta_ppm"` // measured − predicted
	Z                     float64 `json:"z"`         // |delta| in units of the prediction's SD
}

// Unexplained is a measured multiplet (or part of one) that the structure
// does not explain.
type Unexplained struct {
	PPM          float64 `json:"ppm"`
	IntegralH    float64 `json:"integral_h"` // in H-equivalents of the fitted scale
	Percent      float64 `json:"percent"`    // of the total measured intensity (artifacts excluded)
	Likely       string  `json:"likely"`     // likely identity, "" when unknown
	FromPPM      float64 `json:"from_ppm"`
	ToPPM        float64 `json:"to_ppm"`
	Multiplicity string  `json:"multiplicity"`
	Kind         string  `json:"kind"` // "solvent", "water", "contaminant", "impurity", "unknown"
	Multiplet    int     `json:"multiplet"`
}

// Identity is a recognised species other than the compound: residual
// solvent, water, a table contaminant or a user-given impurity.
type Identity struct {
	Name        string    `json:"name"`
	Kind        string    `json:"kind"` // "solvent", "water", "contaminant", "impurity", "standard"
	PPM         []float64 `json:"ppm"`
	Multiplets  []int     `json:"multiplets"`
	MatchedH    float64   `json:"matched_h"`   // protons of one molecule seen in the matched signals
	MolPercent  float64   `json:"mol_percent"` // relative to compound + identified impurities; 0 for solvent/water
	Signals     int       `json:"signals"`     // signals of the species found
	SignalsWant int       `json:"signals_expected"`
	Source      string    `json:"source"` // table source (paper) or "--impurity"
}

// Artifact is a measured multiplet explained as a 13C satellite or a spinning
// sideband of a larger peak.
type Artifact struct {
	PPM       float64 `json:"ppm"`
	Kind      string  `json:"kind"` // "13C satellite", "spinning sideband", "baseline hump"
	ParentPPM float64 `json:"parent_ppm"`
	Percent   float64 `json:"percent_of_parent"`
	Multiplet int     `json:"multiplet"`
}

// Purity holds the purity estimates. Nil pointers encode as JSON null.
type Purity struct {
	MolarPercent       *float64    `json:"molar_percent"`
	QNMRMassPercent    *float64    `json:"qnmr_mass_percent"`
	UncertaintyPercent *float64    `json:"uncertainty_percent"` // of qNMR when present, else of the molar estimate
	MolarUncertainty   *float64    `json:"molar_uncertainty_percent"`
	Components         []Component `json:"components"`
	Assumptions        []string    `json:"assumptions"`
	QNMR               *QNMR       `json:"qnmr,omitempty"`
}

// Component is one species of the molar composition.
type Component struct {
	Name       string  `json:"name"`
	MolPercent float64 `json:"mol_percent"`
}

// QNMR records the terms of the qNMR equation so that a reviewer can redo it.
type QNMR struct {
	IntegralAnalyte  float64 `json:"integral_analyte"`
	IntegralStandard float64 `json:"integral_standard"`
	NAnalyte         int     `json:"n_analyte"`
	NStandard        int     `json:"n_standard"`
	MAnalyte         float64 `json:"molar_mass_analyte"`
	MStandard        float64 `json:"molar_mass_standard"`
	MassAnalyteMg    float64 `json:"mass_analyte_mg"`
	MassStandardMg   float64 `json:"mass_standard_mg"`
	PurityStandard   float64 `json:"purity_standard_percent"`
	PurityPercent    float64 `json:"purity_percent"`
	Uncertainty      float64 `json:"uncertainty_percent"` // standard uncertainty, percentage points
	StandardPPM      float64 `json:"standard_ppm"`
}

// Candidate is one structure scored against the spectrum.
type Candidate struct {
	Smiles         string   `json:"smiles"`
	Score          float64  `json:"score"`
	Verdict        Verdict  `json:"verdict"`
	Rank           int      `json:"rank"`
	Main           bool     `json:"main"` // the structure given with --smiles
	Discriminating []string `json:"discriminating,omitempty"`
	Error          string   `json:"error,omitempty"`
}

// PartScores are the partial scores, each 0–1 (1 is perfect agreement).
type PartScores struct {
	Shifts    float64 `json:"shifts"`
	Splitting float64 `json:"splitting"`
	Integrals float64 `json:"integrals"`
	Explained float64 `json:"explained"` // fraction of measured intensity explained
	Shape     float64 `json:"shape"`     // correlation of predicted and measured multiplet shapes (0 when no trace)
	Missing   float64 `json:"missing_h_fraction"`
}

// SignalFit is the verdict on one predicted signal.
type SignalFit struct {
	Signal        string  `json:"signal"`
	PredictedPPM  float64 `json:"predicted_ppm"`
	ShiftSD       float64 `json:"shift_sd"`
	Multiplicity  string  `json:"multiplicity"`
	NH            int     `json:"n_h"`
	Exchangeable  bool    `json:"exchangeable"`
	LowConfidence bool    `json:"low_confidence"`
	Multiplet     int     `json:"multiplet"` // -1 when missing
	Note          string  `json:"note,omitempty"`
}
