package compare

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"

	"shiftwise/predict"
	"shiftwise/spectrum"
)

// Predictor predicts the 1H spectrum of a SMILES string at a field and in a
// solvent. Options.Predictor overrides the default (smiles.Parse followed by
// predict.Predict).
type Predictor func(smiles string, fieldMHz float64, solvent string) (*predict.Prediction, error)

// defaultPredictor and defaultProcessor are set by pipeline.go to the real
// parser/predictor and spectrum processing.
var (
	defaultPredictor func(opt Options) Predictor
	defaultProcessor func(s *spectrum.Spectrum, solvent string, opt Options) (*spectrum.PeakList, error)
	defaultReader    func(path string) (*spectrum.Spectrum, error)
)

// Check predicts the intended structure, processes the spectrum, assigns
// predicted signals to measured multiplets, explains every other peak,
// estimates purity, ranks the candidates and gives a verdict with reasons.
// Errors concern the input (unreadable spectrum, unparsable SMILES of the
// main structure); problems with a candidate or an impurity are reported in
// the Result instead.
func Check(in Input, opt Options) (*Result, error) {
	if in.Standard != nil {
		if err := in.Standard.Validate(); err != nil {
			return nil, err
		}
	}
	if f := opt.FieldMHz; f < 0 || !finite(f) {
		return nil, fmt.Errorf("check: field must be a positive number of MHz (0 for the file's), found %v", f)
	}
	pl, trace, warn, err := loadPeaks(in, opt)
	if err != nil {
		return nil, err
	}
	field := opt.FieldMHz
	if !(field > 0) {
		field = usableField(pl.FieldMHz)
	}
	if !(field > 0) && trace != nil {
		field = usableField(trace.FieldMHz)
	}
	solvName := opt.Solvent
	if solvName == "" {
		solvName = pl.Solvent
	}
	if solvName == "" && in.Spectrum != nil {
		solvName = in.Spectrum.Solvent
	}
	if solvName == "" && trace != nil {
		solvName = trace.Solvent
	}
	solv, solvOK := LookupSolvent(solvName)
	if !solvOK {
		if solvName == "" {
			warn = append(warn, "solvent unknown: residual solvent and contaminants cannot be identified (give --solvent)")
		} else {
			warn = append(warn, fmt.Sprintf("solvent %q not in the impurity table: residual solvent and contaminants cannot be identified", solvName))
		}
	}
	ms := prepMultiplets(pl)
	altRes := -1
	if solvOK && opt.Solvent == "" {
		// The file's solvent, not the user's: trust the lines over the header.
		if alt, j, ok := solventFromLines(ms, solv, field); ok {
			warn = append(warn, solventWarning(solv, alt))
			solv, altRes = alt, j
		}
	}
	canon := solvName
	if solvOK {
		canon = solv.Name
	}
	pr := opt.Predictor
	if pr == nil {
		if defaultPredictor == nil {
			return nil, errors.New("compare: no predictor available")
		}
		pr = defaultPredictor(opt)
	}
	pred := in.Prediction
	if pred == nil {
		if in.Smiles == "" {
			return nil, errors.New("check: no structure given (SMILES)")
		}
		pred, err = pr(in.Smiles, field, canon)
		if err != nil {
			return nil, err
		}
	}
	pre := claimFixed(ms, solv, solvOK, field)
	if altRes >= 0 && pre[altRes] == "" {
		pre[altRes] = "solvent" // the residual line that told the solvent
	}
	extras, xwarn := predictExtras(in, pr, field, canon)
	warn = append(warn, xwarn...)

	main := evaluateStructure(in.Smiles, pred, ms, pre, field, solv, solvOK, extras, pl.Trace)
	res := buildResult(main, ms, pl, trace, field, canon)
	res.Warnings = append(append(append(res.Warnings, pl.Warnings...), warn...), pred.Warnings...)
	res.Artifact = append(res.Artifact, peakArtifacts(pl)...)
	var qerr error
	if in.Standard != nil {
		res.Purity.QNMR, qerr = qnmrFor(in.Standard, main, main.ms, extras)
		if qerr == nil {
			p, u := res.Purity.QNMR.PurityPercent, res.Purity.QNMR.Uncertainty
			res.Purity.QNMRMassPercent, res.Purity.UncertaintyPercent = &p, &u
		}
	}
	rankCandidates(res, in, opt, pr, main, ms, pre, field, solv, solvOK, extras, canon, pl.Trace)
	if qerr != nil {
		qnmrMissingRule(res, qerr)
	} else if q := res.Purity.QNMR; q != nil {
		qnmrOverRule(res, q)
	}
	minPurity := opt.MinPurityPct
	if !(minPurity > 0) {
		minPurity = DefaultMinPurity
	}
	lowPurityRule(res, minPurity)
	return res, nil
}

// DefaultMinPurity: a molar purity by integrals, or a qNMR mass purity,
// below this (%) asks for review whatever the structure's fit, unless
// Options.MinPurityPct sets the lab's own specification: a sample that is
// mostly something else is not released on a "consistent" (4-methylanisole
// with 70 mol % of cumene, the cumene read as ethanol and toluene, was
// consistent at 10 % purity). Residual solvent of a few mol % (the demo's
// ethyl acetate at 7 %) stays above it. Common practice, no source for the
// level; release specifications are the lab's own.
const DefaultMinPurity = 80.0

// lowPurityRule applies the purity floor min (%), naming the largest other
// species.
func lowPurityRule(res *Result, min float64) {
	var why string
	if p := res.Purity.MolarPercent; p != nil && *p < min {
		largest := ""
		best := 0.0
		for _, c := range res.Purity.Components[1:] {
			if c.MolPercent > best {
				best, largest = c.MolPercent, c.Name
			}
		}
		why = fmt.Sprintf("molar purity by integrals is %.1f %%", *p)
		if largest != "" {
			why += fmt.Sprintf("; the largest other species, %s, holds %.1f mol %%", largest, best)
		}
	} else if q := res.Purity.QNMRMassPercent; q != nil && *q < min {
		why = fmt.Sprintf("qNMR mass purity is %.1f %%", *q)
	}
	if why == "" {
		return
	}
	res.Reasons = append(res.Reasons, fmt.Sprintf("%s (below %g %%)", why, min))
	if res.Verdict == Consistent {
		res.Verdict = Review
	}
	for k := range res.Candidates {
		if res.Candidates[k].Main {
			res.Candidates[k].Verdict = res.Verdict
		}
	}
}

// qnmrOverRule: a mass purity above 100 % by more than twice its standard
// uncertainty (and at least 2 points) cannot be: an integral holds another
// signal, or a mass or the standard's purity was entered wrong. The verdict
// is at least review, with the reason.
func qnmrOverRule(res *Result, q *QNMR) {
	if q.PurityPercent <= 100+math.Max(2, 2*q.Uncertainty) {
		return
	}
	res.Reasons = append(res.Reasons, fmt.Sprintf("qNMR purity %.1f %% exceeds 100 %%: an integral includes another signal, or a mass or the standard's purity was entered wrong", q.PurityPercent))
	if res.Verdict == Consistent {
		res.Verdict = Review
	}
	for k := range res.Candidates {
		if res.Candidates[k].Main {
			res.Candidates[k].Verdict = res.Verdict
		}
	}
}

// qnmrMissingRule: an assay was asked for (an internal standard given) but
// no qNMR result could be computed. The structure check stands, but a
// person must look: the verdict is at least review, with the reason (doc.go,
// "Scores and verdict").
func qnmrMissingRule(res *Result, err error) {
	res.Warnings = append(res.Warnings, err.Error())
	res.Reasons = append(res.Reasons, strings.TrimPrefix(err.Error(), "qNMR: "))
	if res.Verdict == Consistent {
		res.Verdict = Review
	}
	for k := range res.Candidates {
		if res.Candidates[k].Main {
			res.Candidates[k].Verdict = res.Verdict
		}
	}
}

// usableField returns f when it is a positive finite field, else 0 (the
// predictor's default then applies).
func usableField(f float64) float64 {
	if f > 0 && finite(f) {
		return f
	}
	return 0
}

func loadPeaks(in Input, opt Options) (*spectrum.PeakList, *spectrum.Spectrum, []string, error) {
	if in.Peaks != nil {
		return in.Peaks, in.Peaks.Trace, nil, nil
	}
	s := in.Spectrum
	if s == nil {
		if in.SpectrumPath == "" {
			return nil, nil, nil, errors.New("check: no spectrum given")
		}
		if defaultReader == nil {
			return nil, nil, nil, errors.New("compare: no spectrum reader available")
		}
		var err error
		if s, err = defaultReader(in.SpectrumPath); err != nil {
			return nil, nil, nil, err
		}
	}
	if defaultProcessor == nil {
		return nil, nil, nil, errors.New("compare: no spectrum processing available")
	}
	solv := opt.Solvent
	pl, err := defaultProcessor(s, solv, opt)
	if err != nil {
		return nil, nil, nil, err
	}
	trace := pl.Trace
	if trace == nil {
		trace = s
	}
	return pl, trace, nil, nil
}

func predictExtras(in Input, pr Predictor, field float64, solvent string) ([]extraSpecies, []string) {
	var out []extraSpecies
	var warn []string
	add := func(smi, kind string) {
		p, err := pr(smi, field, solvent)
		if err != nil {
			warn = append(warn, fmt.Sprintf("%s %s not used: %v", kind, smi, err))
			return
		}
		out = append(out, extraSpecies{name: kind + " " + smi, kind: kind, smiles: smi, sig: p.Signals, mw: p.MolecularWeight})
	}
	if in.Standard != nil && in.Standard.Smiles != "" {
		add(in.Standard.Smiles, "standard")
	}
	for _, s := range in.Impurities {
		add(s, "impurity")
	}
	return out, warn
}

// evaluateStructure runs assignment, explanation and scoring for one
// prediction.
func evaluateStructure(smi string, pred *predict.Prediction, ms []mplet, pre []string, field float64,
	solv SolventInfo, solvOK bool, extras []extraSpecies, trace *spectrum.Spectrum) *evaluation {
	avail := make([]bool, len(ms))
	penalty := make([]float64, len(ms))
	sig := pred.Signals
	if len(sig) > maxSignals {
		sig = sig[:maxSignals]
	}
	for j := range ms {
		avail[j] = pre[j] == "" || pre[j] == "solvent"
		if pre[j] == "solvent" && !compoundUnderResidual(sig, ms, pre, j) {
			penalty[j] = solventCost
		}
	}
	p2 := *pred
	p2.Signals = sig
	sigM, scale, spread := matchStructure(sig, ms, avail, penalty, waterLines(ms, solv, solvOK), field)
	eff := absorbParts(sig, ms, avail, sigM, scale)
	if s, sp := fitScale(sig, eff, sigM, penalty); s > 0 {
		scale, spread = s, sp
	}
	eff, pre = splitHiddenLines(&p2, sig, eff, pre, sigM, field, solv, solvOK)
	ev := &evaluation{smiles: smi, pred: &p2, sigM: sigM, scale: scale, spread: spread, ms: eff, trace: trace,
		solv: solv, solvOK: solvOK}
	ev.ex = explain(eff, pre, sig, sigM, scale, field, solv, solvOK, extras, compoundWindows(&p2, sig, sigM, eff, field),
		compoundLines(&p2, sig, sigM, eff))
	ev.evaluate(eff, field)
	return ev
}

// compoundUnderResidual reports whether the multiplet j taken as the
// residual solvent is mostly the compound's: on the first integral
// estimate (the compound's non-exchangeable H over the other multiplets'
// area) it holds at least residualMaxH, and compound signals are
// predicted inside it (± 0.05 ppm). At 60 MHz a phenyl group's five H
// collapse into one line at 7.30 that processing takes for CHCl3; the
// residual cannot be that large next to it, so the multiplet is assigned
// like any other (its small residual share is excess area).
func compoundUnderResidual(sig []predict.Signal, ms []mplet, pre []string, j int) bool {
	nh, area := 0, 0.0
	for _, s := range sig {
		if !s.Exchangeable {
			nh += s.NH
		}
	}
	for k, m := range ms {
		if k != j && pre[k] == "" {
			area += m.area
		}
	}
	if nh == 0 || !(area > 0) || ms[j].area*float64(nh)/area < residualMaxH {
		return false
	}
	for _, s := range sig {
		if !s.Exchangeable && s.ShiftPPM >= ms[j].from-0.05 && s.ShiftPPM <= ms[j].to+0.05 {
			return true
		}
	}
	return false
}

// residualMaxH: a residual solvent line holding this many H-equivalents
// of the compound is not only residual (common practice, no source: a
// well-deuterated solvent's residual stays well below one proton of a
// 5–20 mg sample).
const residualMaxH = 1.5

// waterLines marks the multiplets centred within waterTol of the solvent's
// water shift (nil when the solvent is unknown).
func waterLines(ms []mplet, solv SolventInfo, solvOK bool) []bool {
	if !solvOK {
		return nil
	}
	w, ok := waterShift(solv.Name)
	if !ok {
		return nil
	}
	out := make([]bool, len(ms))
	for j, m := range ms {
		out[j] = math.Abs(m.ppm-w) <= waterTol
	}
	return out
}

// maxSignals caps the work of one assignment (a 30-heavy-atom molecule has
// at most about 40 environments).
const maxSignals = 80

func buildResult(ev *evaluation, ms []mplet, pl *spectrum.PeakList, trace *spectrum.Spectrum, field float64, solvent string) *Result {
	r := &Result{
		Verdict: ev.verdict, Score: round3(ev.score), Reasons: ev.reasons,
		Assignments: ev.assign, Unexplained: ev.ex.unexplained, Missing: ev.missing,
		Smiles: ev.smiles, Solvent: solvent, FieldMHz: field, Scores: roundParts(ev.parts),
		HPerArea: ev.scale, Found: ev.ex.found, Artifact: ev.ex.artifacts, Cautions: ev.caution,
		Advisory: AdvisoryText, Details: ev.fits, Prediction: ev.pred, Peaks: pl, Trace: trace,
	}
	if r.Reasons == nil {
		r.Reasons = []string{}
	}
	if r.Assignments == nil {
		r.Assignments = []Assignment{}
	}
	if r.Unexplained == nil {
		r.Unexplained = []Unexplained{}
	}
	if r.Missing == nil {
		r.Missing = []string{}
	}
	r.Purity = molarPurity(ev)
	for k := range r.Found {
		if a, ok := ev.ex.amounts[r.Found[k].Name]; ok {
			for _, c := range r.Purity.Components {
				if c.Name == r.Found[k].Name {
					r.Found[k].MolPercent = math.Round(c.MolPercent*100) / 100
				}
			}
			_ = a
		}
	}
	r.Candidates = []Candidate{}
	return r
}

func roundParts(p PartScores) PartScores {
	return PartScores{Shifts: round3(p.Shifts), Splitting: round3(p.Splitting), Integrals: round3(p.Integrals),
		Explained: round3(p.Explained), Missing: round3(p.Missing), Shape: round3(p.Shape)}
}

// molarPurity turns the identified species into a molar composition and
// states its assumptions. Its uncertainty combines the scatter of the
// integral scale over the compound's multiplets with a 10 % relative
// uncertainty of each small impurity integral (common practice, no source).
func molarPurity(ev *evaluation) Purity {
	name := "compound"
	if ev.smiles != "" {
		name = "compound " + ev.smiles
	}
	pct, comps := ev.ex.molar(name)
	for k := range comps {
		comps[k].MolPercent = math.Round(comps[k].MolPercent*100) / 100
	}
	imp := 1 - pct/100
	rel := math.Hypot(ev.spread, 0.10)
	u := 100 * pct / 100 * imp * rel
	if len(ev.ex.amounts) == 0 {
		u = 0
	}
	p := round2(pct)
	uu := round2(u)
	pur := Purity{MolarPercent: &p, MolarUncertainty: &uu, UncertaintyPercent: &uu, Components: comps,
		Assumptions: []string{
			"integrals per proton are equal for all species (full relaxation between scans, flat baseline, no saturation)",
			"only identified species are counted: residual solvent, water and unidentified peaks are left out",
			"integral scale fitted as the weighted median over the assigned multiplets of the compound",
		}}
	if ev.scale <= 0 {
		pur.MolarPercent, pur.MolarUncertainty, pur.UncertaintyPercent = nil, nil, nil
	}
	if ev.ex.total > 0 && ev.ex.unknownArea > 0 {
		pur.Assumptions = append(pur.Assumptions, fmt.Sprintf("unidentified peaks (%.1f %% of the intensity) are not included", 100*ev.ex.unknownArea/ev.ex.total))
	}
	return pur
}

func rankCandidates(res *Result, in Input, opt Options, pr Predictor, main *evaluation, ms []mplet, pre []string,
	field float64, solv SolventInfo, solvOK bool, extras []extraSpecies, solvent string, trace *spectrum.Spectrum) {
	if len(in.Candidates) == 0 {
		return
	}
	limit := opt.MaxCandidates
	if limit <= 0 {
		limit = 20
	}
	type entry struct {
		c  Candidate
		ev *evaluation
	}
	list := []entry{{Candidate{Smiles: in.Smiles, Score: round3(main.score), Verdict: main.verdict, Main: true}, main}}
	for k, smi := range in.Candidates {
		if k >= limit {
			res.Warnings = append(res.Warnings, fmt.Sprintf("only the first %d candidates were scored", limit))
			break
		}
		p, err := pr(smi, field, solvent)
		if err != nil {
			list = append(list, entry{Candidate{Smiles: smi, Verdict: Review, Error: err.Error()}, nil})
			continue
		}
		ev := evaluateStructure(smi, p, ms, pre, field, solv, solvOK, extras, trace)
		list = append(list, entry{Candidate{Smiles: smi, Score: round3(ev.score), Verdict: ev.verdict}, ev})
	}
	sort.SliceStable(list, func(a, b int) bool {
		if (list[a].ev == nil) != (list[b].ev == nil) {
			return list[a].ev != nil
		}
		return list[a].c.Score > list[b].c.Score
	})
	for k := range list {
		list[k].c.Rank = k + 1
		if k > 0 && list[k].ev != nil {
			list[k].c.Discriminating = list[k].ev.discriminating(list[k].ev.ms)
		}
		res.Candidates = append(res.Candidates, list[k].c)
	}
	if best := list[0]; !best.c.Main && best.ev != nil {
		candidateRule(res, main, best.ev, best.ev.score)
		for k := range res.Candidates {
			if res.Candidates[k].Main {
				res.Candidates[k].Verdict = res.Verdict
			}
		}
	}
}
