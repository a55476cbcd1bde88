package spectrum

// Spectrum is a measured or simulated 1D 1H trace on a ppm axis. Readers
// return the points in ascending ppm order whatever the file's order.
type Spectrum struct {
	PPM      []float64 // ascending
	Y        []float64 // same length as PPM
	FieldMHz float64   // observe frequency; 0 when the file does not say
	Nucleus  string    // "1H" unless the file says otherwise
	Solvent  string    // as the file names it, e.g. "CDCl3"; "" when unknown
	Title    string
	Source   string // file path or other origin, for messages
	// PeakTable holds the peaks of a file that carries a peak list instead
	// of (or besides) a trace. PPM and Y are empty for a peak-list-only file.
	PeakTable []Peak
	// Warnings lists tolerated inconsistencies found while reading, each as
	// "file:line: message" (e.g. a line whose X disagrees with FIRSTX and
	// DELTAX). Nil when the file was clean.
	Warnings []string
}

// Peak is one picked maximum.
type Peak struct {
	PPM       float64 `json:"ppm"`
	Intensity float64 `json:"intensity"`
	SNR       float64 `json:"snr"`
	WidthHz   float64 `json:"width_hz,omitempty"`
	// Artifact is set when the peak is not a signal of the sample:
	// Artifact13C or ArtifactSideband. Such peaks belong to no multiplet.
	Artifact string `json:"artifact,omitempty"`
}

// Multiplet is a group of peaks that belong to one signal, with its region,
// integral and first-order analysis.
type Multiplet struct {
	PPM          float64   `json:"ppm"`
	FromPPM      float64   `json:"from_ppm"`
	ToPPM        float64   `json:"to_ppm"`
	Integral     float64   `json:"integral"`
	Multiplicity string    `json:"multiplicity"`
	JHz          []float64 `json:"j_hz"`
	Peaks        int       `json:"peaks"`
	// Label marks a multiplet that is not the compound's: LabelSolvent (the
	// residual solvent signal) or LabelTMS. Empty otherwise.
	Label     string  `json:"label,omitempty"`
	PeakIndex []int   `json:"-"` // indices into the peak list
	RawArea   float64 `json:"-"` // area before relative scaling
}

// PeakList is the outcome of processing a spectrum. Its JSON form is fixed.
type PeakList struct {
	FieldMHz   float64     `json:"field_mhz"`
	Points     int         `json:"points"`
	Peaks      []Peak      `json:"peaks"`
	Multiplets []Multiplet `json:"multiplets"`
	Noise      float64     `json:"noise"`
	// ReferencePPM is the shift the axis was moved by when referencing (0 if none).
	ReferencePPM float64 `json:"reference_shift_ppm"`
	// Solvent is the canonical solvent name used for referencing ("" if unknown).
	Solvent string `json:"solvent,omitempty"`
	// Reference is how the axis was referenced: RefTMS, RefSolvent or RefNone.
	Reference string `json:"reference,omitempty"`
	// Warnings says what processing could not do as asked (reference signal
	// not found, field assumed, ...).
	Warnings []string `json:"warnings,omitempty"`
	// Trace is the processed (referenced, baseline-corrected) trace, for plots;
	// nil when the input was a peak list.
	Trace *Spectrum `json:"-"`
}
