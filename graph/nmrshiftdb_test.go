package graph_test

import (
	"bufio"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"shiftwise/graph"
	"shiftwise/internal/extdata"
	"shiftwise/smiles"
)

// Floors for the diastereotopic-CH2 rule against assigned experimental
// spectra (NMRShiftDB2 records as redistributed in patonlab/CASCADE, see
// /work/shared/data/SOURCES.md). Measured when the test was written; see
// the log of TestDiastereotopicNMRShiftDB -v.
const (
	// Of the CH2 groups whose two H are assigned shifts at least
	// splitPPM apart, the fraction that Environments splits. Measured
	// 365/408 = 0.895.
	minDiastereoRecall = 0.88
	// Of the CH2 groups Environments splits and the data assigns, the
	// fraction with two shifts listed (a single listed shift may also be
	// an unresolved or summarised pair, so this is a lower bound on
	// precision). Measured 365/529 = 0.690.
	minDiastereoSplitListed = 0.68
	// Of the =CH2 groups with two resolved shifts, the fraction split.
	// Measured 69/69.
	minVinylRecall = 1.0
	// Of the sets of two or more atoms with data, the fraction whose atoms
	// carry one shift (within equalPPM). Measured 506/521 = 0.971; the
	// rest are mostly hindered rotations (2,6-disubstituted anilides,
	// 2,6-diisopropylanilines) and meso/dl pairs the rules leave alone.
	minSetsEqual = 0.97
)

// splitPPM is the smallest difference of the two shifts of a CH2 counted as
// a resolved diastereotopic pair.
const splitPPM = 0.02

type shiftKey struct {
	id      string
	atomMap int
}

// readShifts collects, for spectrum 1 of each record, the shifts assigned to
// each H-bearing heavy atom (by atom map number).
func readShifts(t *testing.T, path string) map[shiftKey][]float64 {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	out := map[shiftKey][]float64{}
	sc := bufio.NewScanner(f)
	for n := 1; sc.Scan(); n++ {
		c := strings.Split(sc.Text(), "\t")
		if n == 1 || len(c) < 11 || c[1] != "1" {
			continue
		}
		mp, err1 := strconv.Atoi(c[7])
		ppm, err2 := strconv.ParseFloat(c[10], 64)
		if err1 != nil || err2 != nil {
			t.Fatalf("%s:%d: bad atom map or shift", path, n)
		}
		k := shiftKey{c[0], mp}
		out[k] = append(out[k], ppm)
	}
	return out
}

// pairStats counts a split judgement against the data: resolved pairs
// (two shifts at least splitPPM apart) split or not, and splits for which
// the data lists one shift or two equal ones.
type pairStats struct{ tp, fn, splitOne, splitTwo int }

func (p *pairStats) add(ppm []float64, split bool) {
	resolved := len(ppm) >= 2 && spread(ppm) >= splitPPM
	switch {
	case resolved && split:
		p.tp++
	case resolved:
		p.fn++
	case split && len(ppm) == 1:
		p.splitOne++
	case split:
		p.splitTwo++
	}
}

func (p *pairStats) recall() float64 { return float64(p.tp) / float64(max(1, p.tp+p.fn)) }
func (p *pairStats) listed() float64 {
	return float64(p.tp) / float64(max(1, p.tp+p.splitOne+p.splitTwo))
}

func (p *pairStats) log(t *testing.T, what string) {
	t.Logf("%s with two assigned shifts ≥ %.2f ppm apart: %d, split by Environments: %d (recall %.3f)",
		what, splitPPM, p.tp+p.fn, p.tp, p.recall())
	t.Logf("%s split by Environments and assigned: %d, of which two shifts listed: %d (%.3f); one shift listed: %d; two equal shifts: %d",
		what, p.tp+p.splitOne+p.splitTwo, p.tp, p.listed(), p.splitOne, p.splitTwo)
}

// TestEnvironmentsNMRShiftDB checks Environments against experimentally
// assigned 1H shifts (NMRShiftDB2, spectrum 1 of each record):
//
//   - a CH2 whose two H are listed with different shifts is diastereotopic
//     in fact (recall of the diastereotopic rule, and the fraction of its
//     splits that the data resolves);
//   - likewise for the two H of =CH2 groups;
//   - atoms placed in one set should carry one shift: the fraction of sets
//     of two or more atoms whose mean assigned shifts lie within
//     equalPPM of each other.
func TestEnvironmentsNMRShiftDB(t *testing.T) {
	molPath := extdata.Path(t, "shifts/nmrshiftdb2_nmr8k_1h_molecules.tsv")
	shifts := readShifts(t, extdata.Path(t, "shifts/nmrshiftdb2_nmr8k_1h_shifts.tsv"))
	f, err := os.Open(molPath)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var ch2, vinyl pairStats
	var sets, setsEqual, parseErr int
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for n := 1; sc.Scan(); n++ {
		c := strings.Split(sc.Text(), "\t")
		if n == 1 || len(c) < 4 {
			continue
		}
		m, err := smiles.Parse(c[3]) // atom-mapped SMILES
		if err != nil {
			parseErr++
			continue
		}
		envs := m.Environments()
		split := splitAtoms(envs, len(m.Atoms))
		for a, at := range m.Atoms {
			ppm, ok := shifts[shiftKey{c[0], at.Class}]
			if at.HCount() != 2 || at.Class == 0 || at.Element != "C" || !ok {
				continue
			}
			if _, isVinyl := m.AlkeneView(graph.Proton{Atom: a}); isVinyl {
				vinyl.add(ppm, split[a])
			} else {
				ch2.add(ppm, split[a])
			}
		}
		for _, e := range envs {
			if x, ok := setSpread(m, e, c[0], shifts); ok {
				sets++
				if x <= equalPPM {
					setsEqual++
				}
			}
		}
	}
	ch2.log(t, "sp3 CH2")
	vinyl.log(t, "=CH2")
	equal := float64(setsEqual) / float64(max(1, sets))
	t.Logf("sets of two or more assigned atoms: %d, one shift within %.2f ppm: %d (%.3f)", sets, equalPPM, setsEqual, equal)
	t.Logf("records the parser rejected: %d", parseErr)
	if r := ch2.recall(); r < minDiastereoRecall {
		t.Errorf("CH2 recall %.3f below the floor %.3f", r, minDiastereoRecall)
	}
	if l := ch2.listed(); l < minDiastereoSplitListed {
		t.Errorf("CH2 split-and-listed fraction %.3f below the floor %.3f", l, minDiastereoSplitListed)
	}
	if r := vinyl.recall(); r < minVinylRecall {
		t.Errorf("=CH2 recall %.3f below the floor %.3f", r, minVinylRecall)
	}
	if equal < minSetsEqual {
		t.Errorf("sets with one shift %.3f below the floor %.3f", equal, minSetsEqual)
	}
}

// equalPPM is the largest spread of mean shifts within one set counted as
// one shift.
const equalPPM = 0.05

// setSpread returns the spread of the mean assigned shifts of the atoms of
// e, when at least two of its atoms have data.
func setSpread(m *graph.Mol, e graph.Environment, id string, shifts map[shiftKey][]float64) (float64, bool) {
	var means []float64
	for _, a := range e.Atoms {
		ppm, ok := shifts[shiftKey{id, m.Atoms[a].Class}]
		if !ok || m.Atoms[a].Class == 0 {
			continue
		}
		sum := 0.0
		for _, v := range ppm {
			sum += v
		}
		means = append(means, sum/float64(len(ppm)))
	}
	if len(means) < 2 {
		return 0, false
	}
	return spread(means), true
}

// splitAtoms marks the atoms whose hydrogens fall into more than one set.
func splitAtoms(envs []graph.Environment, n int) []bool {
	seen := make([]int, n)
	out := make([]bool, n)
	for _, e := range envs {
		for _, a := range e.Atoms {
			seen[a]++
			if seen[a] > 1 {
				out[a] = true
			}
		}
	}
	return out
}

func spread(x []float64) float64 {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, v := range x {
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	return hi - lo
}
