package compare

import (
	_ "embed"
	"fmt"
	"sort"
	"strings"
	"sync"

	"github.com/BurntSushi/toml"

	"shiftwise/internal/solvent"
)

//go:embed tables/impurities.toml
var impurityTOML string

// SolventInfo is a deuterated solvent of the impurity table.
type SolventInfo struct {
	Name         string   `toml:"name"`
	Aliases      []string `toml:"aliases"`
	Residual     float64  `toml:"residual"`
	ResidualName string   `toml:"residual_name"`
	ResidualMult string   `toml:"residual_mult"`
}

// Species is a trace impurity of the table (Gottlieb 1997, Fulmer 2010;
// values from memory, see tables/impurities.toml) with its signals.
type Species struct {
	Name    string          `toml:"name"`
	Kind    string          `toml:"kind"` // "contaminant" (default), "water", "reference"
	Tol     float64         `toml:"tol"`  // matching tolerance, ppm; 0 = DefaultImpurityTol
	Source  string          `toml:"source"`
	Signals []SpeciesSignal `toml:"signal"`
}

// SpeciesSignal is one signal of a Species: shifts per canonical solvent.
type SpeciesSignal struct {
	H    int                `toml:"h"`
	Mult string             `toml:"mult"`
	PPM  map[string]float64 `toml:"ppm"`
}

// DefaultImpurityTol is the shift tolerance for matching a table impurity
// signal, ppm. Concentration and temperature move these singlets by about
// ±0.02 ppm (common practice, no source).
const DefaultImpurityTol = 0.035

type impurityTable struct {
	Solvents []SolventInfo `toml:"solvent"`
	Species  []Species     `toml:"species"`
}

var (
	tableOnce sync.Once
	table     impurityTable
	tableErr  error
)

func loadTable() (*impurityTable, error) {
	tableOnce.Do(func() {
		md, err := toml.Decode(impurityTOML, &table)
		if err != nil {
			tableErr = fmt.Errorf("compare: tables/impurities.toml: %w", err)
			return
		}
		if und := md.Undecoded(); len(und) > 0 {
			tableErr = fmt.Errorf("compare: tables/impurities.toml: unknown key %s", und[0])
		}
	})
	return &table, tableErr
}

// LookupSolvent returns the table entry for a solvent in any common spelling
// ("DMSO", "dmso-d6", "Acetone", "CHLOROFORM-D"); names are resolved with the
// project's one spelling table (internal/solvent), then the table's own
// aliases. ok is false when the solvent is not tabulated.
func LookupSolvent(name string) (SolventInfo, bool) {
	t, err := loadTable()
	if err != nil || strings.TrimSpace(name) == "" {
		return SolventInfo{}, false
	}
	if canon, ok := solvent.Normalize(name); ok {
		for _, s := range t.Solvents {
			if s.Name == canon {
				return s, true
			}
		}
	}
	key := solvent.Fold(name)
	for _, s := range t.Solvents {
		for _, a := range append([]string{s.Name}, s.Aliases...) {
			if solvent.Fold(a) == key {
				return s, true
			}
		}
	}
	return SolventInfo{}, false
}

// SpeciesFor returns the table impurities with at least one signal
// tabulated in the canonical solvent name, each reduced to its tabulated
// signals, sorted by name.
func SpeciesFor(solvent string) []Species {
	t, err := loadTable()
	if err != nil {
		return nil
	}
	var out []Species
	for _, sp := range t.Species {
		c := sp
		c.Signals = nil
		for _, sg := range sp.Signals {
			if _, ok := sg.PPM[solvent]; ok {
				c.Signals = append(c.Signals, sg)
			}
		}
		if len(c.Signals) == 0 {
			continue
		}
		if c.Kind == "" {
			c.Kind = "contaminant"
		}
		if c.Tol == 0 {
			c.Tol = DefaultImpurityTol
		}
		out = append(out, c)
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Name < out[j].Name })
	return out
}

// speciesH returns the total H of the species' signals tabulated.
func speciesH(sp Species) int {
	n := 0
	for _, s := range sp.Signals {
		n += s.H
	}
	return n
}
