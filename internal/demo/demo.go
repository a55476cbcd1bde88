// Package demo writes the embedded demo scenario — an invented contract
// lab's batch of samples — as synthesised JCAMP-DX spectra plus a screening
// manifest, ready for the screen package.
package demo

import (
	_ "embed"
	"fmt"
	"io"
	"os"
	"path/filepath"

	"github.com/BurntSushi/toml"

	"shiftwise/internal/atomicfile"
	"shiftwise/internal/synth"
	"shiftwise/screen"
	"shiftwise/spectrum"
)

//go:embed scenario.toml
var scenarioTOML string

type scenario struct {
	Title   string       `toml:"title"`
	Solvent string       `toml:"solvent"`
	Samples []demoSample `toml:"sample"`
}

type demoSample struct {
	ID         string           `toml:"id"`
	Story      string           `toml:"story"`
	Smiles     string           `toml:"smiles"`
	Candidates []string         `toml:"candidates"`
	Impurities []string         `toml:"impurities"`
	Standard   *screen.Standard `toml:"standard"`
	Tube       tube             `toml:"tube"`
}

type tube struct {
	Seed         uint64          `toml:"seed"`
	FieldMHz     float64         `toml:"field_mhz"`
	Water        float64         `toml:"water"`
	WaterWidthHz float64         `toml:"water_width_hz"`
	Components   []tubeComponent `toml:"component"`
}

type tubeComponent struct {
	Smiles string  `toml:"smiles"`
	Moles  float64 `toml:"moles"`
	Jitter float64 `toml:"jitter"`
}

// Story is one sample's line of the scenario, for printing.
type Story struct{ ID, Text string }

// Write synthesises the demo spectra into dir/spectra and writes
// dir/manifest.toml. It returns the manifest path and the samples' stories.
func Write(dir string) (string, []Story, error) {
	var sc scenario
	md, err := toml.Decode(scenarioTOML, &sc)
	if err != nil {
		return "", nil, fmt.Errorf("demo scenario: %w", err)
	}
	if und := md.Undecoded(); len(und) > 0 {
		return "", nil, fmt.Errorf("demo scenario: unknown key %s", und[0])
	}
	if err := os.MkdirAll(filepath.Join(dir, "spectra"), 0o755); err != nil {
		return "", nil, err
	}
	man := screen.Manifest{Title: sc.Title, Solvent: sc.Solvent}
	var stories []Story
	for _, s := range sc.Samples {
		rel := filepath.Join("spectra", s.ID+".jdx")
		if err := writeSpectrum(filepath.Join(dir, rel), sc.Solvent, s.Tube); err != nil {
			return "", nil, fmt.Errorf("demo sample %s: %w", s.ID, err)
		}
		man.Samples = append(man.Samples, screen.Sample{ID: s.ID, Spectrum: rel, Smiles: s.Smiles,
			Candidates: s.Candidates, Impurities: s.Impurities, Standard: s.Standard})
		stories = append(stories, Story{s.ID, s.Story})
	}
	path := filepath.Join(dir, "manifest.toml")
	err = atomicfile.Write(path, 0o644, func(w io.Writer) error {
		fmt.Fprintf(w, "# shiftwise demo manifest — invented scenario, synthesised spectra.\n")
		return toml.NewEncoder(w).Encode(man)
	})
	return path, stories, err
}

func writeSpectrum(path, solvent string, t tube) error {
	r := synth.Recipe{FieldMHz: t.FieldMHz, Solvent: solvent, Seed: t.Seed, Satellites: true, TMS: 0.05}
	for _, c := range t.Components {
		r.Components = append(r.Components, synth.Component{Smiles: c.Smiles, Moles: c.Moles, Jitter: c.Jitter})
	}
	if t.Water > 0 {
		w := t.WaterWidthHz
		if w == 0 {
			w = 2.5
		}
		if sol, ok := spectrum.LookupSolvent(solvent); ok {
			r.Extra = append(r.Extra, synth.Singlet{PPM: sol.WaterPPM, H: t.Water, WidthHz: w})
		}
	}
	s, err := synth.Make(r)
	if err != nil {
		return err
	}
	s.Title = "shiftwise demo (invented data)"
	return atomicfile.Write(path, 0o644, func(w io.Writer) error { return spectrum.WriteJCAMP(w, s, true) })
}
