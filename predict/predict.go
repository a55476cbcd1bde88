package predict

import (
	"fmt"
	"math"
	"slices"

	"shiftwise/graph"
	"shiftwise/predict/spin"
	"shiftwise/shiftinc"
)

// Defaults for Options fields left zero.
const (
	DefaultFieldMHz    = 400
	DefaultSolvent     = "CDCl3"
	DefaultLineWidthHz = 1.0
)

// Thresholds on |J| in Hz.
const (
	minReportHz = 0.5 // couplings listed in Signal.Couplings and split in first-order lines
	minSpinHz   = 0.7 // couplings passed to the exact simulation (smaller ones merge into the line width)
	strongNames = 2.0 // |Δν| < strongNames·|J| names the signal "m"
)

// Options controls a prediction. The zero value predicts at 400 MHz in
// CDCl3 in Auto mode with the embedded increment tables.
type Options struct {
	FieldMHz    float64         // 1H observe frequency; 0 means DefaultFieldMHz
	Solvent     string          // solvent name; "" means CDCl3
	Mode        spin.Mode       // Auto, FirstOrder or Exact
	Rules       *shiftinc.Table // shift increments; nil means shiftinc.Default()
	LineWidthHz float64         // line width (FWHM) used for naming; 0 means DefaultLineWidthHz
}

// withDefaults fills zero fields and checks the rest.
func (o Options) withDefaults() (Options, error) {
	if o.FieldMHz == 0 {
		o.FieldMHz = DefaultFieldMHz
	}
	if !(o.FieldMHz > 0) || math.IsInf(o.FieldMHz, 0) {
		return o, fmt.Errorf("predict: field must be a positive number of MHz, got %v", o.FieldMHz)
	}
	if o.LineWidthHz == 0 {
		o.LineWidthHz = DefaultLineWidthHz
	}
	if !(o.LineWidthHz > 0) || math.IsInf(o.LineWidthHz, 0) {
		return o, fmt.Errorf("predict: line width must be a positive number of Hz, got %v", o.LineWidthHz)
	}
	if o.Rules == nil {
		o.Rules = shiftinc.Default()
	}
	name, ok := o.Rules.NormalizeSolvent(o.Solvent)
	if !ok {
		return o, fmt.Errorf("predict: unknown solvent %q", o.Solvent)
	}
	o.Solvent = name
	if o.Mode != spin.Auto && o.Mode != spin.FirstOrder && o.Mode != spin.Exact {
		return o, fmt.Errorf("predict: unknown mode %d", int(o.Mode))
	}
	return o, nil
}

// Predict computes the expected 1H spectrum of the perceived molecule m.
// smiles is recorded in the result as given. It returns an error for bad
// options, and in Exact mode when a coupled cluster is too large to
// simulate (the error suggests first-order mode).
func Predict(m *graph.Mol, smiles string, opt Options) (*Prediction, error) {
	opt, err := opt.withDefaults()
	if err != nil {
		return nil, err
	}
	s := newSystem(m, opt)
	p := &Prediction{
		Smiles:          smiles,
		Formula:         m.Formula(),
		MolecularWeight: math.Round(m.AverageMass()*1e4) / 1e4,
		FieldMHz:        opt.FieldMHz,
		Solvent:         opt.Solvent,
		Warnings:        s.warnings,
		Signals:         []Signal{},
		Lines:           []Line{},
	}
	if len(s.envs) == 0 {
		return p, nil
	}
	lines, modes, err := s.lines(opt)
	if err != nil {
		return nil, err
	}
	p.Warnings = s.warnings
	for i := range s.envs {
		p.Signals = append(p.Signals, s.signal(i, modes[i], opt))
	}
	p.Lines = lines
	return p, nil
}

// lines computes the line list in the chosen mode and the mode used per
// signal; in Auto mode a cluster too large for exact simulation falls back
// to first-order with a warning.
func (s *system) lines(opt Options) ([]Line, []string, error) {
	if opt.Mode == spin.FirstOrder {
		return s.firstOrderLines(opt), s.modes("first-order"), nil
	}
	lines, modes, err := s.exactLines(opt)
	if err == nil {
		return lines, modes, nil
	}
	if opt.Mode == spin.Auto {
		// Auto mode never fails for want of exact simulation (a cluster
		// over the spin package's bounds, a group over spin.MaxCount).
		s.warnings = append(s.warnings, "exact simulation not possible; first-order patterns used ("+err.Error()+")")
		return s.firstOrderLines(opt), s.modes("first-order"), nil
	}
	return nil, nil, fmt.Errorf("predict: %w", err)
}

func (s *system) modes(m string) []string {
	out := make([]string, len(s.envs))
	for i := range out {
		out[i] = m
	}
	return out
}

// signal builds the Signal of environment i.
func (s *system) signal(i int, mode string, opt Options) Signal {
	e := &s.envs[i]
	sig := Signal{
		Label:         e.env.Label,
		Atoms:         slices.Clone(e.env.Atoms),
		NH:            e.env.NH,
		Kind:          e.env.Kind,
		ShiftPPM:      round(e.shift, 1e-3),
		ShiftSD:       round(e.sd, 1e-3),
		Exchangeable:  e.env.Exchangeable,
		LowConfidence: e.low,
		Mode:          mode,
		Couplings:     []Coupling{},
		Rules:         e.rules,
	}
	for _, ps := range e.partners {
		sig.Couplings = append(sig.Couplings, Coupling{
			To: ps.to, JHz: round(math.Abs(ps.j), 0.1),
			JMin: round(ps.jmin, 0.1), JMax: round(ps.jmax, 0.1), NBonds: ps.nb,
		})
	}
	sig.Multiplicity = s.multiplicity(i, opt)
	return sig
}

// round rounds x to a multiple of step (a power of ten ≤ 1) so that the
// JSON shows short decimals.
func round(x, step float64) float64 {
	inv := math.Round(1 / step)
	return math.Round(x*inv) / inv
}
