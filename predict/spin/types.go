package spin

import "fmt"

// Group is a set of magnetically equivalent nuclei: one shift, and the same
// coupling from every member to every nucleus outside the group. Simulate
// relies on this for the composite-particle reduction. Nuclei that are only
// chemically equivalent (the AA'BB' protons of a para-disubstituted benzene)
// must be given as separate groups with their own couplings.
type Group struct {
	Name     string
	ShiftPPM float64
	Count    int    // number of nuclei in the group, ≥ 1
	Nucleus  string // "1H" (default when empty), "19F" or "31P"
}

// IsProton reports whether the group is observed in a 1H spectrum.
func (g Group) IsProton() bool { return g.Nucleus == "" || g.Nucleus == "1H" }

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

// String returns "auto", "first-order" or "exact".
func (m Mode) String() string {
	switch m {
	case Auto:
		return "auto"
	case FirstOrder:
		return "first-order"
	case Exact:
		return "exact"
	case Fragment:
		return "fragment"
	}
	return fmt.Sprintf("Mode(%d)", int(m))
}

// ParseMode converts "auto", "first-order" or "exact" to a Mode.
func ParseMode(s string) (Mode, error) {
	switch s {
	case "auto":
		return Auto, nil
	case "first-order", "firstorder", "first":
		return FirstOrder, nil
	case "exact":
		return Exact, nil
	}
	return Auto, fmt.Errorf("unknown mode %q (want auto, first-order or exact)", s)
}

// Modes.
const (
	Auto       Mode = iota // exact where coupling is strong, first-order elsewhere
	FirstOrder             // successive splitting everywhere
	Exact                  // full diagonalisation of each coupled cluster
	// Fragment is reported in Result.ModeUsed, never chosen: Auto mode
	// simulated the group's cluster, too large to diagonalise, by
	// fragments (an approximation, see DefaultFragmentSpins).
	Fragment
)

// Options controls a simulation.
type Options struct {
	FieldMHz float64 // 1H observe frequency in MHz; must be > 0
	Mode     Mode
	// StrongRatio: in Auto mode a coupling is strong when |Δν| < StrongRatio·|J|.
	// Zero means the default (10, common practice, no source).
	StrongRatio float64
	// MaxSpins bounds exact simulation: a cluster whose largest Mz block is
	// bigger than that of MaxSpins distinct spin-1/2 nuclei, or whose total
	// diagonalisation work exceeds theirs, is refused with an error that
	// suggests first-order mode. Zero means DefaultMaxSpins (12); at most 16.
	// In Auto mode such a cluster is simulated by fragments instead.
	MaxSpins int
	// FragmentSpins bounds the fragments of an oversized cluster in Auto
	// mode in the same way. Zero means DefaultFragmentSpins (9); at most 16.
	FragmentSpins int
}

// Line is one transition of the 1H spectrum. Intensities are normalised so
// that the lines attributed to a group sum to the group's Count.
type Line struct {
	Hz        float64 // offset from 0 ppm at the field: PPM·FieldMHz
	PPM       float64
	Intensity float64
	Group     int // the group this line is attributed to
	// A transition of a strongly coupled cluster is shared among the groups
	// whose spins take part in it: each share is a separate Line with the
	// same Hz. A share may be slightly negative when a line is strongly
	// mixed; the sum over groups at one frequency is the physical intensity.
}

// Result is the outcome of Simulate.
type Result struct {
	Lines []Line
	// ModeUsed[g] is the mode actually used for group g (FirstOrder, Exact
	// or Fragment).
	ModeUsed []Mode
	// Dropped is the total intensity of exact transitions weaker than
	// MinLine, which are not listed: the lines plus Dropped sum to the
	// number of 1H nuclei.
	Dropped float64
	// Notes says where Auto mode had to approximate: clusters simulated by
	// fragments, or computed first-order because they were too large even
	// for fragments.
	Notes []string
}
