package compare

import (
	"errors"
	"fmt"
	"math"
)

// Default standard uncertainties for qNMR (common practice, no source): a
// five-place analytical balance reads 0.01 mg; a certified standard's purity
// is typically stated to ±0.1 %; integration repeatability of well-resolved
// signals is about 0.5 % (values from memory).
const (
	DefaultMassUncertaintyMg = 0.01
	DefaultPurityUncertainty = 0.1
	MinIntegralUncertainty   = 0.005
)

// Bounds of the qNMR inputs of a Standard (common practice, no source): a
// microbalance reads 0.001 mg, and 10 g is far beyond what is weighed into
// an NMR tube; shifts beyond ±MaxStandardPPM are in the wrong unit.
// Within them every term of the qNMR equation stays finite.
const (
	MinMassMg      = 0.001
	MaxMassMg      = 10000.0
	MaxStandardPPM = 1000.0
)

// Validate checks the weighed masses (finite, MinMassMg–MaxMassMg), the
// purity (0, 100] %, the signal shift (within ±MaxStandardPPM) and that the
// uncertainties are finite and not negative. The error names the field.
func (st *Standard) Validate() error {
	if st.Smiles == "" {
		return errors.New("qNMR: the standard has no structure (SMILES)")
	}
	for _, m := range []struct {
		name string
		v    float64
	}{{"standard mass", st.MassMg}, {"sample mass", st.SampleMassMg}} {
		if !(m.v >= MinMassMg && m.v <= MaxMassMg) {
			return fmt.Errorf("qNMR: %s must be between %g and %g mg, found %v", m.name, MinMassMg, MaxMassMg, m.v)
		}
	}
	if !(st.PurityPct > 0 && st.PurityPct <= 100) {
		return fmt.Errorf("qNMR: standard purity must be in (0, 100] %%, found %v", st.PurityPct)
	}
	if !(math.Abs(st.SignalPPM) <= MaxStandardPPM) {
		return fmt.Errorf("qNMR: standard signal must be within ±%g ppm, found %v", MaxStandardPPM, st.SignalPPM)
	}
	for _, u := range []struct {
		name string
		v    float64
	}{{"mass uncertainty", st.MassUncertaintyMg}, {"purity uncertainty", st.PurityUncertainty}, {"integral uncertainty", st.IntegralUncertainty}} {
		if !(u.v >= 0) || math.IsInf(u.v, 0) {
			return fmt.Errorf("qNMR: %s must be finite and not negative, found %v", u.name, u.v)
		}
	}
	return nil
}

// QNMRPurity applies the internal-standard qNMR equation
//
//	P_a = (I_a/I_std) · (N_std/N_a) · (M_a/M_std) · (m_std/m_a) · P_std
//
// with I the integrals, N the numbers of protons integrated, M the molar
// masses, m the weighed masses and P_std the standard's purity (mass %).
// It returns the analyte purity in mass % or an error for non-positive terms.
func QNMRPurity(q QNMR) (float64, error) {
	for _, v := range []struct {
		name string
		x    float64
	}{
		{"analyte integral", q.IntegralAnalyte}, {"standard integral", q.IntegralStandard},
		{"analyte proton count", float64(q.NAnalyte)}, {"standard proton count", float64(q.NStandard)},
		{"analyte molar mass", q.MAnalyte}, {"standard molar mass", q.MStandard},
		{"sample mass", q.MassAnalyteMg}, {"standard mass", q.MassStandardMg}, {"standard purity", q.PurityStandard},
	} {
		if !(v.x > 0) || math.IsInf(v.x, 0) {
			return 0, fmt.Errorf("qNMR: %s must be positive, found %g", v.name, v.x)
		}
	}
	p := (q.IntegralAnalyte / q.IntegralStandard) * (float64(q.NStandard) / float64(q.NAnalyte)) *
		(q.MAnalyte / q.MStandard) * (q.MassStandardMg / q.MassAnalyteMg) * q.PurityStandard
	if math.IsInf(p, 0) || math.IsNaN(p) {
		return 0, fmt.Errorf("qNMR: purity out of range (terms differ by too many orders of magnitude)")
	}
	return p, nil
}

// QNMRUncertainty is the standard uncertainty (percentage points) of a qNMR
// purity by first-order propagation (GUM, uncorrelated inputs) of the
// relative uncertainties of the product:
//
//	(u_P/P)² = u_r(I_a)² + u_r(I_std)² + (u_m/m_a)² + (u_m/m_std)² + (u_Pstd/P_std)²
//
// relIa and relIstd are relative integral uncertainties, uMassMg the balance
// uncertainty (each weighing), uPstd the standard's purity uncertainty in
// percentage points. Molar-mass uncertainties are negligible and left out.
func QNMRUncertainty(q QNMR, relIa, relIstd, uMassMg, uPstd float64) (float64, error) {
	p, err := QNMRPurity(q)
	if err != nil {
		return 0, err
	}
	if relIa < 0 || relIstd < 0 || uMassMg < 0 || uPstd < 0 {
		return 0, errors.New("qNMR: uncertainties must not be negative")
	}
	r2 := relIa*relIa + relIstd*relIstd +
		sq(uMassMg/q.MassAnalyteMg) + sq(uMassMg/q.MassStandardMg) + sq(uPstd/q.PurityStandard)
	u := p * math.Sqrt(r2)
	if math.IsInf(u, 0) || math.IsNaN(u) {
		return 0, errors.New("qNMR: uncertainty out of range")
	}
	return u, nil
}

func sq(x float64) float64 { return x * x }

// qnmrFor applies the qNMR equation to a check: the analyte integral is the
// summed area of the compound's multiplets that hold only compound signals
// (non-exchangeable, no other species' signal in their region:
// analyteIntegral), the standard's the multiplet of its chosen signal.
func qnmrFor(st *Standard, ev *evaluation, ms []mplet, extras []extraSpecies) (*QNMR, error) {
	var std *extraSpecies
	for k := range extras {
		if extras[k].kind == "standard" {
			std = &extras[k]
		}
	}
	if std == nil {
		return nil, errors.New("qNMR: the standard's structure could not be predicted")
	}
	hits := ev.ex.extraHits[std.name]
	if len(hits) == 0 {
		return nil, fmt.Errorf("qNMR: internal standard %s not found in the spectrum; no qNMR result", std.smiles)
	}
	best := -1
	for k, h := range hits {
		switch {
		case st.SignalPPM != 0:
			if best < 0 || math.Abs(ms[h.j].ppm-st.SignalPPM) < math.Abs(ms[hits[best].j].ppm-st.SignalPPM) {
				best = k
			}
		case best < 0 || h.sig.NH > hits[best].sig.NH:
			best = k
		}
	}
	if st.SignalPPM != 0 && math.Abs(ms[hits[best].j].ppm-st.SignalPPM) > 0.1 {
		return nil, fmt.Errorf("qNMR: internal standard signal at %.2f ppm not found; no qNMR result", st.SignalPPM)
	}
	hs := hits[best]
	ia, na, perH := analyteIntegral(ev, ms, foreignShifts(ev, ms, extras))
	if na == 0 {
		return nil, errors.New("qNMR: no clean compound multiplet to integrate (every compound multiplet shares its region with another signal)")
	}
	q := QNMR{IntegralAnalyte: ia, IntegralStandard: ms[hs.j].area, NAnalyte: na, NStandard: hs.sig.NH,
		MAnalyte: ev.pred.MolecularWeight, MStandard: std.mw, MassAnalyteMg: st.SampleMassMg,
		MassStandardMg: st.MassMg, PurityStandard: st.PurityPct, StandardPPM: ms[hs.j].ppm}
	p, err := QNMRPurity(q)
	if err != nil {
		return nil, err
	}
	relI := st.IntegralUncertainty
	relA := relI
	if relI <= 0 {
		relI = MinIntegralUncertainty
		relA = math.Max(MinIntegralUncertainty, perH)
	}
	um, up := st.MassUncertaintyMg, st.PurityUncertainty
	if um <= 0 {
		um = DefaultMassUncertaintyMg
	}
	if up <= 0 {
		up = DefaultPurityUncertainty
	}
	u, err := QNMRUncertainty(q, relA, relI, um, up)
	if err != nil {
		return nil, err
	}
	q.PurityPercent, q.Uncertainty = round2(p), round2(u)
	return &q, nil
}

// foreignShifts lists where signals that are not the compound's may lie:
// the internal standard's and the given impurities' signals (where they
// were matched, else where predicted) and, when the solvent is known, its
// water and residual lines. A compound multiplet whose region holds one
// of them is not clean for qNMR: at 60 MHz the OCH3 singlets of methyl
// 4-nitrobenzoate (3.94) and of 1,3,5-trimethoxybenzene (3.78) merge into
// one multiplet, and integrating it as the analyte gave 183 %.
func foreignShifts(ev *evaluation, ms []mplet, extras []extraSpecies) []float64 {
	var out []float64
	for _, e := range extras {
		at := map[string]float64{}
		for _, h := range ev.ex.extraHits[e.name] {
			at[h.sig.Label] = ms[h.j].ppm
		}
		for _, s := range e.sig {
			if p, ok := at[s.Label]; ok {
				out = append(out, p)
			} else {
				out = append(out, s.ShiftPPM)
			}
		}
	}
	if ev.solvOK {
		out = append(out, ev.solv.Residual)
		if w, ok := waterShift(ev.solv.Name); ok {
			out = append(out, w)
		}
	}
	return out
}

// analyteIntegral sums the areas and H of the clean compound multiplets
// (compound signals only, none exchangeable or far from its prediction,
// no foreign shift within the region ± 0.02 ppm) and returns the relative
// standard error of their per-H areas. A multiplet holding several
// compound signals (an aromatic AA'BB' envelope) counts with their summed H.
func analyteIntegral(ev *evaluation, ms []mplet, foreign []float64) (area float64, nh int, relSE float64) {
	hAt := map[int]int{}
	bad := map[int]bool{}
	for i, j := range ev.sigM {
		if j < 0 {
			continue
		}
		hAt[j] += ev.pred.Signals[i].NH
		if ev.pred.Signals[i].Exchangeable || ev.z[i] > poorZ {
			bad[j] = true
		}
	}
	var perH []float64
	for j, h := range hAt {
		if bad[j] || ev.ex.owner[j] != "compound" || h == 0 {
			continue
		}
		clean := true
		for _, x := range foreign {
			if x >= ms[j].from-0.02 && x <= ms[j].to+0.02 {
				clean = false
			}
		}
		if !clean {
			continue
		}
		area += ms[j].area
		nh += h
		perH = append(perH, ms[j].area/float64(h))
	}
	if len(perH) > 1 {
		mean, v := 0.0, 0.0
		for _, x := range perH {
			mean += x
		}
		mean /= float64(len(perH))
		for _, x := range perH {
			v += sq(x - mean)
		}
		relSE = math.Sqrt(v/float64(len(perH)-1)) / mean / math.Sqrt(float64(len(perH)))
	}
	return area, nh, relSE
}
