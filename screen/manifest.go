package screen

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"github.com/BurntSushi/toml"

	"shiftwise/compare"
)

// Manifest is a batch of samples to check.
type Manifest struct {
	Title    string   `toml:"title"`
	Solvent  string   `toml:"solvent"`
	FieldMHz float64  `toml:"field_mhz"`
	Samples  []Sample `toml:"sample"`

	// Dir is the directory relative paths are resolved against (the
	// manifest's own directory when loaded from a file).
	Dir  string `toml:"-"`
	Path string `toml:"-"`
}

// Sample is one entry of a manifest.
type Sample struct {
	ID         string    `toml:"id"`
	Spectrum   string    `toml:"spectrum"`
	Smiles     string    `toml:"smiles"`
	Candidates []string  `toml:"candidates"`
	Impurities []string  `toml:"impurities"`
	Solvent    string    `toml:"solvent"`
	Standard   *Standard `toml:"standard"`

	// Line is the manifest line of the sample's [[sample]] header, for
	// messages; 0 when built in code.
	Line int `toml:"-"`
}

// Standard is the qNMR internal standard of a sample.
type Standard struct {
	Smiles        string  `toml:"smiles"`
	MassMg        float64 `toml:"mass_mg"`
	PurityPercent float64 `toml:"purity_percent"`
	SampleMassMg  float64 `toml:"sample_mass_mg"`
	SignalPPM     float64 `toml:"signal_ppm"`
}

// Load reads a manifest file. A syntax error, an unknown key or a manifest
// with no samples is an error naming the file and line. Problems of single
// samples (missing spectrum, bad SMILES) are not errors here: they become
// error rows when the batch runs.
func Load(path string) (*Manifest, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	m, err := Parse(string(b), path)
	if err != nil {
		return nil, err
	}
	m.Dir = filepath.Dir(path)
	m.Path = path
	return m, nil
}

// Parse reads a manifest from text; name is used in messages.
func Parse(text, name string) (*Manifest, error) {
	var m Manifest
	md, err := toml.Decode(text, &m)
	if err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			return nil, fmt.Errorf("%s:%d: %s", name, pe.Position.Line, pe.Message)
		}
		return nil, fmt.Errorf("%s: %w", name, err)
	}
	if und := md.Undecoded(); len(und) > 0 {
		keys := make([]string, len(und))
		for i, k := range und {
			keys[i] = k.String()
		}
		return nil, fmt.Errorf("%s:%d: unknown key %s (known: title, solvent, field_mhz, [[sample]] id, spectrum, smiles, candidates, impurities, solvent, [sample.standard])",
			name, keyLine(text, und[0]), strings.Join(keys, ", "))
	}
	if len(m.Samples) == 0 {
		return nil, fmt.Errorf("%s: no [[sample]] entries", name)
	}
	lines := sampleLines(text)
	for i := range m.Samples {
		if i < len(lines) {
			m.Samples[i].Line = lines[i]
		}
	}
	return &m, nil
}

// sampleLines returns the 1-based line numbers of the [[sample]] headers.
func sampleLines(text string) []int {
	var out []int
	for i, l := range strings.Split(text, "\n") {
		if strings.HasPrefix(strings.TrimSpace(l), "[[sample]]") {
			out = append(out, i+1)
		}
	}
	return out
}

// keyLine finds the line of the last part of key k, for messages (the TOML
// decoder reports unknown keys without positions).
func keyLine(text string, k toml.Key) int {
	last := k[len(k)-1]
	for i, l := range strings.Split(text, "\n") {
		t := strings.TrimSpace(l)
		if strings.HasPrefix(t, last) && strings.Contains(t, "=") && strings.TrimSpace(t[:strings.Index(t, "=")]) == last {
			return i + 1
		}
	}
	return 1
}

// validate checks what can be checked without running the sample. The
// error names the manifest line.
func (m *Manifest) validate(i int, seen map[string]int) error {
	s := &m.Samples[i]
	at := fmt.Sprintf("%s:%d: sample %d", m.Path, s.Line, i+1)
	switch {
	case strings.TrimSpace(s.ID) == "":
		return fmt.Errorf("%s: missing id", at)
	case seen[s.ID] > 0:
		return fmt.Errorf("%s: id %q already used by sample %d", at, s.ID, seen[s.ID])
	case strings.TrimSpace(s.Spectrum) == "":
		return fmt.Errorf("%s (%s): missing spectrum", at, s.ID)
	case strings.TrimSpace(s.Smiles) == "":
		return fmt.Errorf("%s (%s): missing smiles", at, s.ID)
	}
	if st := s.Standard; st != nil {
		if st.Smiles == "" || st.MassMg <= 0 || st.SampleMassMg <= 0 || st.PurityPercent <= 0 || st.PurityPercent > 100 {
			return fmt.Errorf("%s (%s): standard needs smiles, mass_mg > 0, sample_mass_mg > 0 and 0 < purity_percent ≤ 100", at, s.ID)
		}
	}
	return nil
}

// input builds the check input of sample i.
func (m *Manifest) input(i int) (compare.Input, compare.Options) {
	s := m.Samples[i]
	path := s.Spectrum
	if !filepath.IsAbs(path) {
		path = filepath.Join(m.Dir, path)
	}
	in := compare.Input{Smiles: s.Smiles, SpectrumPath: path, Candidates: s.Candidates, Impurities: s.Impurities}
	if st := s.Standard; st != nil {
		in.Standard = &compare.Standard{Smiles: st.Smiles, MassMg: st.MassMg, SampleMassMg: st.SampleMassMg,
			PurityPct: st.PurityPercent, SignalPPM: st.SignalPPM}
	}
	opt := compare.Options{Solvent: m.Solvent, FieldMHz: m.FieldMHz}
	if s.Solvent != "" {
		opt.Solvent = s.Solvent
	}
	return in, opt
}
