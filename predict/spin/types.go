package spin

// Group is a set of nuclei with one shift that are treated as equivalent
// (chemically equivalent; Magnetic says whether they are also magnetically
// equivalent, which allows composite-particle reduction).
type Group struct {
	Name     string
	ShiftPPM float64
	Count    int    // number of nuclei in the group, ≥ 1
	Nucleus  string // "1H" (default when empty), "19F" or "31P"
}

// Coupling is a scalar coupling between two groups, by index into
// System.Groups. J between members of one group is not needed: it leaves
// no trace in the spectrum of a magnetically equivalent group.
type Coupling struct {
	A, B int
	JHz  float64
}

// System is an isotropic spin system.
type System struct {
	Groups    []Group
	Couplings []Coupling
}

// Mode chooses how a cluster of coupled spins is computed.
type Mode int

// Modes.
const (
	Auto       Mode = iota // exact where coupling is strong, first-order elsewhere
	FirstOrder             // successive splitting everywhere
	Exact                  // full diagonalisation of each coupled cluster
)

// Options controls a simulation.
type Options struct {
	FieldMHz float64 // 1H observe frequency in MHz; must be > 0
	Mode     Mode
	// StrongRatio: in Auto mode a coupling is strong when |Δν| < StrongRatio·|J|.
	// Zero means the default (10, common practice, no source).
	StrongRatio float64
	// MaxSpins is the largest cluster simulated exactly; a larger one is
	// refused with an error that suggests first-order mode. Zero means default.
	MaxSpins int
}

// Line is one transition of the 1H spectrum. Intensities are normalised so
// that the lines attributed to a group sum to the group's Count.
type Line struct {
	Hz        float64 // offset from 0 ppm at the field: PPM·FieldMHz
	PPM       float64
	Intensity float64
	Group     int // the group this line is attributed to
}

// Result is the outcome of Simulate.
type Result struct {
	Lines []Line
	// ModeUsed[g] is the mode actually used for group g (FirstOrder or Exact).
	ModeUsed []Mode
}
