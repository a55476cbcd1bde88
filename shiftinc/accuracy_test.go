package shiftinc

import (
	"bufio"
	"fmt"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"shiftwise/graph"
	"shiftwise/internal/extdata"
	"shiftwise/smiles"
)

// Accuracy on NMRShiftDB2 (shared data shifts/, see ../shared/data/SOURCES.md):
// nmrshiftdb2_nmr8k_1h_shifts.tsv (one row per assigned peak) joined to the
// atom-mapped SMILES of nmrshiftdb2_nmr8k_1h_molecules.tsv through atom_map,
// which is the SMILES atom class (":n", graph.Atom.Class).
//
// How rows are compared:
//   - within one spectrum, rows repeating the same (atom, shift) are counted
//     once (some records list a CH3 value once per proton);
//   - each remaining row is compared with the nearest of the predictions for
//     the protons of its atom (diastereotopic CH2 pairs are listed as two
//     rows with different shifts; our two protons may carry equal
//     predictions, so nearest-match is the fair pairing);
//   - "CDCl3" is the subset whose solvent field names CDCl3; "all" includes
//     the records with unreported solvent (predicted as CDCl3) and every
//     other solvent (predicted in that solvent);
//   - exchangeable protons (on O, N, S) are excluded from the headline and
//     reported separately;
//   - split "even"/"odd" is by nmrshiftdb2 id parity. Tables were adjusted
//     only by chemical reasoning with cited handbook values, never fitted;
//     where a change was prompted by looking at errors, only the even-id
//     half was inspected, and the odd half is reported as held out.
//
// Regression limits below are the level reached (commit of the test) plus
// a small margin; tighten them when the tables improve.
const (
	maxMAECDCl3 = 0.210 // ppm, CDCl3 records, non-exchangeable (reached 0.195)
	maxMAEAll   = 0.325 // ppm, all records, non-exchangeable (reached 0.303)
	minCoverage = 0.64  // fraction of |error| ≤ SD, all records, non-exchangeable (reached 0.686)
	maxMAEExch  = 1.85  // ppm, all records, exchangeable O–H/N–H/S–H (reached 1.727)
)

type shiftRow struct {
	id, spectrum string
	solvent      string
	atomMap      int
	shift        float64
}

type accStat struct {
	n        int
	sumAbs   float64
	covered  int
	sumSq    float64
	lowConf  int
	lowConfN int
}

func (s *accStat) add(err, sd float64, low bool) {
	s.n++
	s.sumAbs += math.Abs(err)
	s.sumSq += err * err
	if math.Abs(err) <= sd {
		s.covered++
	}
	if low {
		s.lowConf++
	}
}

func (s *accStat) String() string {
	if s.n == 0 {
		return "n=0"
	}
	return fmt.Sprintf("n=%5d  MAE %.3f  RMSE %.3f  |err|≤SD %4.1f%%  low-confidence %d",
		s.n, s.sumAbs/float64(s.n), math.Sqrt(s.sumSq/float64(s.n)),
		100*float64(s.covered)/float64(s.n), s.lowConf)
}

func (s *accStat) mae() float64 { return s.sumAbs / float64(max(s.n, 1)) }

func readTSV(t *testing.T, path string, fn func(cols map[string]int, f []string)) {
	t.Helper()
	fh, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	sc := bufio.NewScanner(fh)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	var cols map[string]int
	for sc.Scan() {
		f := strings.Split(sc.Text(), "\t")
		if cols == nil {
			cols = map[string]int{}
			for i, c := range f {
				cols[c] = i
			}
			continue
		}
		fn(cols, f)
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
}

// protonClass names the class a proton on atom a is reported under.
func protonClass(v *view, a int) string {
	switch {
	case v.el(a) != "C":
		return "exchangeable"
	case v.arom1(a):
		if r := v.aromRing(a); r != nil && heteroRing(v, r) {
			return "heteroaromatic"
		}
		return "aromatic"
	case v.carbonyl(a):
		return "CHO"
	case v.tripleTo(a) >= 0:
		return "other"
	case v.doubleTo(a, "C") >= 0:
		return "vinyl"
	case v.m.Hybridization(a) == 3:
		return "aliphatic"
	}
	return "other"
}

var accClasses = []string{"aliphatic", "vinyl", "aromatic", "heteroaromatic", "CHO", "other", "exchangeable"}

func TestAccuracyNMRShiftDB(t *testing.T) {
	molPath := extdata.Path(t, "shifts/nmrshiftdb2_nmr8k_1h_molecules.tsv")
	shiftPath := extdata.Path(t, "shifts/nmrshiftdb2_nmr8k_1h_shifts.tsv")

	mapped := map[string]string{}
	readTSV(t, molPath, func(c map[string]int, f []string) {
		mapped[f[c["nmrshiftdb2_id"]]] = f[c["mapped_smiles"]]
	})
	bySpec := map[string][]shiftRow{}
	var specKeys []string
	readTSV(t, shiftPath, func(c map[string]int, f []string) {
		am, err1 := strconv.Atoi(f[c["atom_map"]])
		sh, err2 := strconv.ParseFloat(f[c["shift_ppm"]], 64)
		if err1 != nil || err2 != nil || f[c["element"]] == "" {
			return
		}
		r := shiftRow{id: f[c["nmrshiftdb2_id"]], spectrum: f[c["spectrum"]],
			solvent: f[c["solvent"]], atomMap: am, shift: sh}
		k := r.id + "/" + r.spectrum
		if _, ok := bySpec[k]; !ok {
			specKeys = append(specKeys, k)
		}
		bySpec[k] = append(bySpec[k], r)
	})

	tab := Default()
	stats := map[string]*accStat{} // "<subset>/<class>"
	get := func(k string) *accStat {
		if stats[k] == nil {
			stats[k] = &accStat{}
		}
		return stats[k]
	}
	var dump *bufio.Writer
	if p := os.Getenv("SHIFTINC_DUMP"); p != "" {
		fh, err := os.Create(p)
		if err != nil {
			t.Fatal(err)
		}
		defer fh.Close()
		dump = bufio.NewWriter(fh)
		defer dump.Flush()
	}
	parseFail, unmapped := 0, 0
	cache := map[string]*graph.Mol{}
	for _, k := range specKeys {
		rows := bySpec[k]
		id := rows[0].id
		m, ok := cache[id]
		if !ok {
			var err error
			m, err = smiles.Parse(mapped[id])
			if err != nil {
				m = nil
				parseFail++
			}
			cache[id] = m
		}
		if m == nil {
			continue
		}
		byClass := map[int]int{}
		for i := range m.Atoms {
			if c := m.Atoms[i].Class; c > 0 {
				byClass[c] = i
			}
		}
		// Unreported or unrecognised solvents are passed as written: the
		// estimate then uses CDCl3 values with the "unknown" extra SD.
		solvent, known := tab.NormalizeSolvent(rows[0].solvent)
		if strings.TrimSpace(rows[0].solvent) == "" || !known {
			solvent = "unreported"
		}
		v := newView(m)
		seen := map[[2]float64]bool{}
		preds := map[int][]Estimate{}
		for _, r := range rows {
			a, ok := byClass[r.atomMap]
			if !ok || m.Atoms[a].HCount() == 0 {
				unmapped++
				continue
			}
			key := [2]float64{float64(a), r.shift}
			if seen[key] {
				continue
			}
			seen[key] = true
			if preds[a] == nil {
				for i := 0; i < m.Atoms[a].HCount(); i++ {
					preds[a] = append(preds[a], tab.proton(v, graph.Proton{Atom: a, Index: i}, solvent))
				}
			}
			best := preds[a][0]
			for _, e := range preds[a][1:] {
				if math.Abs(e.PPM-r.shift) < math.Abs(best.PPM-r.shift) {
					best = e
				}
			}
			err := best.PPM - r.shift
			class := protonClass(v, a)
			idn, _ := strconv.Atoi(id)
			half := []string{"even", "odd"}[idn%2]
			subsets := []string{"all", "all-" + half}
			if solvent == "CDCl3" {
				subsets = append(subsets, "CDCl3")
			}
			for _, s := range subsets {
				get(s+"/"+class).add(err, best.SD, best.LowConfidence)
				if class != "exchangeable" {
					get(s+"/non-exchangeable").add(err, best.SD, best.LowConfidence)
				}
			}
			if dump != nil && idn%2 == 0 {
				fmt.Fprintf(dump, "%+.2f\t%s\t%s\t%d\t%s\t%.2f\t%.2f\t%s\t%s\n", err, id, class, a,
					mapped[id], r.shift, best.PPM, strings.Join(best.Rules, "; "), rows[0].solvent)
			}
		}
	}
	t.Logf("records: %d spectra, %d SMILES failed to parse, %d rows not mapped to an H-bearing atom", len(specKeys), parseFail, unmapped)
	for _, sub := range []string{"CDCl3", "all", "all-even", "all-odd"} {
		t.Logf("%s, non-exchangeable: %v", sub, get(sub+"/non-exchangeable"))
		for _, c := range accClasses {
			if s := stats[sub+"/"+c]; s != nil && (sub == "CDCl3" || sub == "all") {
				t.Logf("    %-15s %v", c, s)
			}
		}
	}
	if parseFail > len(mapped)/20 {
		t.Errorf("%d of %d SMILES failed to parse", parseFail, len(mapped))
	}
	if got := get("CDCl3/non-exchangeable").mae(); got > maxMAECDCl3 {
		t.Errorf("CDCl3 MAE %.3f ppm > %.3f", got, maxMAECDCl3)
	}
	all := get("all/non-exchangeable")
	if got := all.mae(); got > maxMAEAll {
		t.Errorf("all-records MAE %.3f ppm > %.3f", got, maxMAEAll)
	}
	if got := get("all/exchangeable").mae(); got > maxMAEExch {
		t.Errorf("exchangeable MAE %.3f ppm > %.3f", got, maxMAEExch)
	}
	if cov := float64(all.covered) / float64(max(all.n, 1)); cov < minCoverage {
		t.Errorf("calibration: %.1f%% of errors within SD < %.0f%%", 100*cov, 100*minCoverage)
	}
}
