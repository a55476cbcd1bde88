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
	// 434/477 = 0.910 (with stereoReach 3 it would be 454/477 = 0.952, at
	// 454/666 = 0.682 for the fraction below).
	minDiastereoRecall = 0.90
	// Of the CH2 groups Environments splits and the data assigns, the
	// fraction with two shifts listed (a single listed shift may also be
	// an unresolved or summarised pair, so this is a lower bound on
	// precision). Measured 434/610 = 0.711.
	minDiastereoSplitListed = 0.70
)

// splitPPM is the smallest difference of the two shifts of a CH2 counted as
// a resolved diastereotopic pair.
const splitPPM = 0.02

type ch2Key struct {
	id      string
	atomMap int
}

// readCH2Shifts collects, for spectrum 1 of each record, the shifts
// assigned to each heavy atom (by atom map number) carrying two H.
func readCH2Shifts(t *testing.T, path string) map[ch2Key][]float64 {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	out := map[ch2Key][]float64{}
	sc := bufio.NewScanner(f)
	for n := 1; sc.Scan(); n++ {
		c := strings.Split(sc.Text(), "\t")
		if n == 1 || len(c) < 11 || c[1] != "1" || c[9] != "2" {
			continue
		}
		mp, err1 := strconv.Atoi(c[7])
		ppm, err2 := strconv.ParseFloat(c[10], 64)
		if err1 != nil || err2 != nil {
			t.Fatalf("%s:%d: bad atom map or shift", path, n)
		}
		k := ch2Key{c[0], mp}
		out[k] = append(out[k], ppm)
	}
	return out
}

// TestDiastereotopicNMRShiftDB checks the diastereotopic-CH2 rule of
// Environments against experimentally assigned 1H shifts: a CH2 whose two H
// are listed with different shifts is diastereotopic in fact.
func TestDiastereotopicNMRShiftDB(t *testing.T) {
	molPath := extdata.Path(t, "shifts/nmrshiftdb2_nmr8k_1h_molecules.tsv")
	shifts := readCH2Shifts(t, extdata.Path(t, "shifts/nmrshiftdb2_nmr8k_1h_shifts.tsv"))
	f, err := os.Open(molPath)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var tp, fn, splitOne, splitTwo, parseErr int
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
		split := splitAtoms(m)
		for a, at := range m.Atoms {
			if at.HCount() != 2 || at.Class == 0 || at.Element != "C" {
				continue
			}
			ppm, ok := shifts[ch2Key{c[0], at.Class}]
			if !ok {
				continue
			}
			resolved := len(ppm) >= 2 && spread(ppm) >= splitPPM
			switch {
			case resolved && split[a]:
				tp++
			case resolved:
				fn++
			case split[a] && len(ppm) == 1:
				splitOne++
			case split[a]:
				splitTwo++ // listed twice with (nearly) one shift
			}
		}
	}
	recall := float64(tp) / float64(max(1, tp+fn))
	listed := float64(tp) / float64(max(1, tp+splitOne+splitTwo))
	t.Logf("CH2 with two assigned shifts ≥ %.2f ppm apart: %d, split by Environments: %d (recall %.3f)", splitPPM, tp+fn, tp, recall)
	t.Logf("CH2 split by Environments and assigned: %d, of which two shifts listed: %d (%.3f); one shift listed: %d; two equal shifts: %d",
		tp+splitOne+splitTwo, tp, listed, splitOne, splitTwo)
	t.Logf("records the parser rejected: %d", parseErr)
	if recall < minDiastereoRecall {
		t.Errorf("recall %.3f below the floor %.3f", recall, minDiastereoRecall)
	}
	if listed < minDiastereoSplitListed {
		t.Errorf("split-and-listed fraction %.3f below the floor %.3f", listed, minDiastereoSplitListed)
	}
}

// splitAtoms marks the atoms whose hydrogens fall into more than one set.
func splitAtoms(m *graph.Mol) []bool {
	seen := make([]int, len(m.Atoms))
	out := make([]bool, len(m.Atoms))
	for _, e := range m.Environments() {
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
