package compare

import (
	"fmt"
	"math"
)

// Solvent read from the spectrum's own lines. A file may name the wrong
// solvent (a template header, a dataset's default): its residual line is
// then absent while another solvent's residual and water lines are there.
// Tolerances: residual lines sit within ±0.03 ppm of their tabulated shift
// and water moves by about ±0.1 ppm with concentration and temperature
// (Gottlieb 1997, Fulmer 2010; values from memory); a residual multiplet is
// narrow (at most sharpWidth) and shaped like one (residualLike: at 60 MHz
// propylbenzene's aromatic envelope at 7.24 and its CH2 at 1.62 passed for
// CHCl3 and its water, and a CD3OD spectrum was read as CDCl3).
const (
	residualTol = 0.03
	waterTol    = 0.10
)

// solventFromLines returns the table solvent whose residual and water lines
// are both present among ms when the declared solvent's residual line is
// not (no multiplet within residualTol of it, none covering it), and the
// index into ms of that residual line. ok is false when the declared
// residual is present, when no other solvent has both lines, or when more
// than one has (ambiguous). D2O has only one line (HDO) and cannot be told
// this way.
func solventFromLines(ms []mplet, declared SolventInfo, field float64) (alt SolventInfo, res int, ok bool) {
	for _, m := range ms {
		if declared.Residual >= m.from-residualTol && declared.Residual <= m.to+residualTol {
			return SolventInfo{}, -1, false
		}
	}
	t, err := loadTable()
	if err != nil {
		return SolventInfo{}, -1, false
	}
	var found []SolventInfo
	var at []int
	for _, s := range t.Solvents {
		if s.Name == declared.Name {
			continue
		}
		w, ok := waterShift(s.Name)
		if !ok || math.Abs(w-s.Residual) < 2*waterTol {
			continue // no separate water line (D2O)
		}
		r, wat := -1, -1
		for j, m := range ms {
			if math.Abs(m.ppm-s.Residual) <= residualTol && m.to-m.from <= sharpWidth(field) && residualLike(m, s) {
				r = j
			} else if math.Abs(m.ppm-w) <= waterTol {
				wat = j
			}
		}
		if r >= 0 && wat >= 0 {
			found = append(found, s)
			at = append(at, r)
		}
	}
	if len(found) != 1 {
		return SolventInfo{}, -1, false
	}
	return found[0], at[0], true
}

// waterShift returns the tabulated water shift in a solvent.
func waterShift(solv string) (float64, bool) {
	for _, sp := range SpeciesFor(solv) {
		if sp.Kind == "water" && len(sp.Signals) > 0 {
			p, ok := sp.Signals[0].PPM[solv]
			return p, ok
		}
	}
	return 0, false
}

// solventWarning says why the check used another solvent than the file's.
func solventWarning(declared, used SolventInfo) string {
	w, _ := waterShift(used.Name)
	return fmt.Sprintf("the file names %s, but its residual line (%.2f ppm) is absent while the residual (%.2f ppm) and water (%.2f ppm) lines of %s are present: checked as %s",
		declared.Name, declared.Residual, used.Residual, w, used.Name, used.Name)
}
