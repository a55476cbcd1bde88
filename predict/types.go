package predict

// Prediction is the expected 1H spectrum of one structure. Its JSON form is
// fixed: scripts read it (see README).
type Prediction struct {
	Smiles          string   `json:"smiles"`
	Formula         string   `json:"formula"`
	MolecularWeight float64  `json:"molecular_weight"`
	FieldMHz        float64  `json:"field_mhz"`
	Solvent         string   `json:"solvent"`
	Signals         []Signal `json:"signals"`
	Lines           []Line   `json:"lines"`
	Warnings        []string `json:"warnings,omitempty"`
}

// Signal is one proton environment with its predicted shift and splitting.
type Signal struct {
	Label         string     `json:"label"`
	Atoms         []int      `json:"atoms"` // 0-based heavy-atom indices in SMILES order
	NH            int        `json:"n_h"`
	Kind          string     `json:"kind"`
	ShiftPPM      float64    `json:"shift_ppm"`
	ShiftSD       float64    `json:"shift_sd"`
	Multiplicity  string     `json:"multiplicity"`
	Exchangeable  bool       `json:"exchangeable"`
	LowConfidence bool       `json:"low_confidence"`
	Mode          string     `json:"mode"` // "first-order", "exact" or "fragment" (approximate second-order, see spin.Fragment)
	Couplings     []Coupling `json:"couplings"`
	Rules         []string   `json:"rules,omitempty"` // increments applied, for the reasons shown to the user
}

// Coupling is a J coupling from a signal to another signal (or to a
// heteronucleus, named by element, e.g. "F3" for fluorine on atom 3).
type Coupling struct {
	To     string  `json:"to"`
	JHz    float64 `json:"j_hz"`
	JMin   float64 `json:"j_min"`
	JMax   float64 `json:"j_max"`
	NBonds int     `json:"n_bonds"`
}

// Line is one transition of the predicted spectrum. Intensities are scaled so
// that the lines of a signal sum to its number of protons.
type Line struct {
	PPM       float64 `json:"ppm"`
	Intensity float64 `json:"intensity"`
	Signal    string  `json:"signal"`
}
