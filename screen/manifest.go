package screen

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"unicode"

	"github.com/BurntSushi/toml"

	"shiftwise/compare"
	"shiftwise/smiles"
)

// Manifest is a batch of samples to check.
type Manifest struct {
	Title    string   `toml:"title,omitempty"`
	Solvent  string   `toml:"solvent"`
	FieldMHz float64  `toml:"field_mhz,omitzero"`
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
	Candidates []string  `toml:"candidates,omitempty"`
	Impurities []string  `toml:"impurities,omitempty"`
	Solvent    string    `toml:"solvent,omitempty"`
	Standard   *Standard `toml:"standard,omitempty"`

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
	SignalPPM     float64 `toml:"signal_ppm,omitzero"`
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
	if f := m.FieldMHz; f != 0 && !(f >= 1 && f <= 10000) {
		return nil, fmt.Errorf("%s:%d: field_mhz must be the 1H observe frequency in MHz, between 1 and 10000 (or absent: from each file), found %v",
			name, keyLine(text, toml.Key{"field_mhz"}), f)
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
	at := m.where(i)
	switch {
	case strings.TrimSpace(s.ID) == "":
		return fmt.Errorf("%s: missing id", at)
	case strings.ContainsFunc(s.ID, unicode.IsControl):
		return fmt.Errorf("%s: id %q contains a tab, newline or other control character", at, s.ID)
	case seen[s.ID] > 0:
		return fmt.Errorf("%s: id %q already used by sample %d", at, s.ID, seen[s.ID])
	case strings.TrimSpace(s.Spectrum) == "":
		return fmt.Errorf("%s (%s): missing spectrum", at, s.ID)
	case strings.TrimSpace(s.Smiles) == "":
		return fmt.Errorf("%s (%s): missing smiles", at, s.ID)
	}
	if err := s.checkSmiles(); err != nil {
		return fmt.Errorf("%s (%s): %w", at, s.ID, err)
	}
	if st := s.Standard; st != nil {
		if st.Smiles == "" || st.MassMg <= 0 || st.SampleMassMg <= 0 || st.PurityPercent <= 0 || st.PurityPercent > 100 {
			return fmt.Errorf("%s (%s): standard needs smiles, mass_mg > 0, sample_mass_mg > 0 and 0 < purity_percent ≤ 100", at, s.ID)
		}
	}
	return nil
}

// where names sample i for messages: "manifest.toml:12: sample 3".
func (m *Manifest) where(i int) string {
	if m.Path == "" {
		return fmt.Sprintf("sample %d", i+1)
	}
	return fmt.Sprintf("%s:%d: sample %d", m.Path, m.Samples[i].Line, i+1)
}

// checkSmiles parses every structure of the sample, so that a typo in a
// candidate or an impurity is an error row naming the field, not a
// candidate silently ranked last or an impurity silently dropped.
func (s *Sample) checkSmiles() error {
	fields := []struct {
		name string
		smi  string
	}{{"smiles", s.Smiles}}
	for k, c := range s.Candidates {
		fields = append(fields, struct{ name, smi string }{fmt.Sprintf("candidates[%d]", k+1), c})
	}
	for k, c := range s.Impurities {
		fields = append(fields, struct{ name, smi string }{fmt.Sprintf("impurities[%d]", k+1), c})
	}
	if s.Standard != nil && s.Standard.Smiles != "" {
		fields = append(fields, struct{ name, smi string }{"standard.smiles", s.Standard.Smiles})
	}
	for _, f := range fields {
		if _, err := smiles.Parse(f.smi); err != nil {
			return fmt.Errorf("%s %q: %w", f.name, f.smi, err)
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
