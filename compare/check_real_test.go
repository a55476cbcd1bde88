package compare

import (
	"bufio"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"shiftwise/internal/extdata"
	"shiftwise/smiles"
	"shiftwise/spectrum"
)

// wrongIsomers gives, per folder of the cheminfo/nmr-dataset1 open dataset,
// a plausible wrong structure: positional isomer, E/Z isomer, ketone for
// alcohol, ring-position swap (chosen by hand; common practice, no source).
var wrongIsomers = map[string]string{
	"1047626-52-7":         "CC1(C)C2CCC(C)(C2)C1(O)c1cscn1",
	"140-67-0":             "C/C=C/c1ccc(OC)cc1",
	"141-32-2":             "C=CC(=O)OCC(C)C",
	"14434-41-4":           "C=CC(=C)C(O)CC=C(C)C",
	"16485-10-2":           "CC(C)(CO)C(O)C(=O)NCC(C)O",
	"2216-51-5":            "CC(C)C1CCC(C)CC1=O",
	"2591-86-8":            "CC(=O)N1CCCC1",
	"2759-55-9":            "CCC(=O)Nc1ccccc1C",
	"403-40-7":             "NCCc1ccc(F)cc1",
	"485-35-8":             "CN1CC2CC(C1)c1cccc(=O)n1C2",
	"492-62-6":             "OCC1(O)OCC(O)C(O)C1O",
	"50-36-2":              "COC(=O)C1C(OC(=O)Cc2ccccc2)CC2CCC1N2",
	"50-78-2":              "CC(=O)Oc1ccc(cc1)C(=O)O",
	"517920-70-6":          "Nc1c(Br)cc(F)cc1[N+](=O)[O-]",
	"57946-61-9":           "Nc1ccccc1OCC(F)(F)F",
	"620-71-3":             "CC(=O)N(C)c1ccccc1",
	"623-47-2":             "CC#CC(=O)OC",
	"623-70-1":             "C/C=C\\C(=O)OCC",
	"86-55-5":              "O=C(O)c1ccc2ccccc2c1",
	"91-64-5":              "O=c1ccoc2ccccc12",
	"noCAS_phosphineoxide": "CC(C)=CCCC(C)CP(C)(=O)CC",
}

// Measured levels on the real spectra (2026-12-02 01:36 UTC: consistent
// 19/21, assignments agreeing 107/137, wrong isomer rejected or ranked
// lower 20/21; before the rules for coupled exchangeables, envelopes,
// baseline humps, the solvent read from its lines and blurred patterns:
// 16/21, 104/137, 20/21). The test fails below them. See the log line of
// TestRealSpectra for the figures.
const (
	minRealConsistent = 19.0 / 21
	minRealAssigned   = 107.0 / 137
	minRealWrong      = 20.0 / 21
)

type realCompound struct {
	folder, name, smiles, file string
	mapped                     string
	shifts                     map[int][]float64 // attached atom number → dataset shifts
}

func readRealSet(t *testing.T) []realCompound {
	dir := extdata.Path(t, "spectra/cheminfo_nmr_dataset1")
	rows := readTSV(t, filepath.Join(dir, "index.tsv"))
	assign := readTSV(t, filepath.Join(dir, "assignments_1h.tsv"))
	var out []realCompound
	for _, r := range rows[1:] {
		c := realCompound{folder: r[0], name: r[2], smiles: r[3], shifts: map[int][]float64{}}
		for _, f := range strings.Split(r[7], ",") {
			if strings.HasSuffix(f, ".dx") && (c.file == "" || f == "1h.dx") {
				c.file = filepath.Join(dir, r[0], f)
			}
		}
		for _, a := range assign[1:] {
			if a[0] != c.folder {
				continue
			}
			n, err1 := strconv.Atoi(a[3])
			v, err2 := strconv.ParseFloat(a[2], 64)
			if err1 == nil && err2 == nil {
				c.shifts[n] = append(c.shifts[n], v)
				c.mapped = a[6]
			}
		}
		out = append(out, c)
	}
	return out
}

func readTSV(t *testing.T, path string) [][]string {
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var out [][]string
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for sc.Scan() {
		out = append(out, strings.Split(sc.Text(), "\t"))
	}
	return out
}

// TestRealSpectra checks each compound of cheminfo/nmr-dataset1 (open
// dataset, MIT licence; /work/shared/data/spectra/cheminfo_nmr_dataset1)
// against its own structure and a wrong isomer, and compares our
// assignments with the dataset's NMReDATA assignments (assignments_1h.tsv).
func TestRealSpectra(t *testing.T) {
	set := readRealSet(t)
	nOK, nWrong, nWrongOK := 0, 0, 0
	nAssign, nAssignOK := 0, 0
	for _, c := range set {
		spec, err := spectrum.ReadFile(c.file)
		if err != nil {
			t.Errorf("%s: %v", c.folder, err)
			continue
		}
		in := Input{Smiles: c.smiles, Spectrum: spec}
		if w, ok := wrongIsomers[c.folder]; ok {
			in.Candidates = []string{w}
		}
		res, err := Check(in, Options{})
		if err != nil {
			t.Errorf("%s: %v", c.folder, err)
			continue
		}
		if res.Verdict == Consistent {
			nOK++
		} else {
			t.Logf("%s (%s, %s): %s %.2f: %s", c.folder, c.name, res.Solvent, res.Verdict, res.Score, strings.Join(res.Reasons, " | "))
		}
		for _, cand := range res.Candidates {
			if cand.Main {
				continue
			}
			nWrong++
			if cand.Verdict == Inconsistent || cand.Score < res.Score {
				nWrongOK++
			} else {
				t.Logf("%s: wrong %s not rejected: %s %.2f vs %.2f", c.folder, cand.Smiles, cand.Verdict, cand.Score, res.Score)
			}
		}
		a, ok := compareAssignments(t, c, spec)
		nAssign += a
		nAssignOK += ok
	}
	rc, ra, rw := frac(nOK, len(set)), frac(nAssignOK, nAssign), frac(nWrongOK, nWrong)
	t.Logf("real spectra (cheminfo/nmr-dataset1): %d compounds; consistent with own structure %d/%d (%.0f %%); assignments agreeing with assignments_1h.tsv %d/%d (%.0f %%); wrong isomer rejected or ranked lower %d/%d (%.0f %%)",
		len(set), nOK, len(set), 100*rc, nAssignOK, nAssign, 100*ra, nWrongOK, nWrong, 100*rw)
	if rc < minRealConsistent || ra < minRealAssigned || rw < minRealWrong {
		t.Errorf("below measured levels: consistent %.2f (min %.2f), assignments %.2f (min %.2f), wrong %.2f (min %.2f)",
			rc, minRealConsistent, ra, minRealAssigned, rw, minRealWrong)
	}
}

// compareAssignments checks the atom-mapped SMILES of the dataset and counts
// our assigned non-exchangeable signals whose measured multiplet lies within
// 0.05 ppm (or inside the multiplet) of the dataset shift of one of their
// atoms.
func compareAssignments(t *testing.T, c realCompound, spec *spectrum.Spectrum) (n, ok int) {
	if c.mapped == "" {
		return 0, 0
	}
	m, err := smiles.Parse(c.mapped)
	if err != nil {
		t.Logf("%s: mapped SMILES: %v", c.folder, err)
		return 0, 0
	}
	res, err := Check(Input{Smiles: c.mapped, Spectrum: spec}, Options{})
	if err != nil {
		t.Logf("%s: %v", c.folder, err)
		return 0, 0
	}
	sigAtoms := map[string][]int{}
	exch := map[string]bool{}
	for _, s := range res.Prediction.Signals {
		sigAtoms[s.Label] = s.Atoms
		exch[s.Label] = s.Exchangeable
	}
	for _, a := range res.Assignments {
		if exch[a.Signal] {
			continue
		}
		var want []float64
		for _, at := range sigAtoms[a.Signal] {
			if at >= 0 && at < len(m.Atoms) {
				want = append(want, c.shifts[m.Atoms[at].Class]...)
			}
		}
		if len(want) == 0 {
			continue
		}
		n++
		mp := res.Peaks.Multiplets[a.Multiplet]
		good := false
		for _, w := range want {
			if math.Abs(w-a.MeasuredPPM) <= 0.05 || (w >= mp.FromPPM-0.01 && w <= mp.ToPPM+0.01) {
				good = true
			}
		}
		if good {
			ok++
		} else {
			t.Logf("%s: signal %s (atoms %v) assigned to %.2f, dataset %v", c.folder, a.Signal, sigAtoms[a.Signal], a.MeasuredPPM, want)
		}
	}
	return n, ok
}
