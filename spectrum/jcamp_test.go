package spectrum

import (
	"bufio"
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strconv"
	"strings"
	"testing"

	"shiftwise/internal/extdata"
)

const odcbPrefix = "spectra/jcamp_examples/o-dichlorobenzene_1h_200MHz_"

// TestODichlorobenzeneForms: the IUPAC test set o01-o10 (R. J. Lancashire,
// via nzhagen/jcamp; see SOURCES.md) stores one spectrum as XYDATA (o01-o05)
// and NTUPLES (o06-o10) in AFFN, PAC, SQZ, DIF and DIFDUP forms. All must
// decode to the trace of o01 (AFFN, uncompressed).
func TestODichlorobenzeneForms(t *testing.T) {
	t.Parallel()
	ref, err := ReadFile(extdata.Path(t, odcbPrefix+"o01.jdx"))
	if err != nil {
		t.Fatal(err)
	}
	// Header of o01: 8192 points from 2391.297363 to -402.202637 Hz at 200.136 MHz.
	if len(ref.PPM) != 8192 || ref.FieldMHz != 200.136 || ref.Solvent != "CDCL3" {
		t.Fatalf("o01: %d points, %g MHz, solvent %q", len(ref.PPM), ref.FieldMHz, ref.Solvent)
	}
	if lo, hi := -402.202637/200.136, 2391.297363/200.136; math.Abs(ref.PPM[0]-lo) > 1e-9 || math.Abs(ref.PPM[8191]-hi) > 1e-9 {
		t.Errorf("o01 axis %g..%g, want %g..%g", ref.PPM[0], ref.PPM[8191], lo, hi)
	}
	for i := 2; i <= 10; i++ {
		name := fmt.Sprintf("o%02d.jdx", i)
		t.Run(name, func(t *testing.T) {
			s, err := ReadFile(extdata.Path(t, odcbPrefix+name))
			if err != nil {
				t.Fatal(err)
			}
			if len(s.Y) != len(ref.Y) || len(s.Warnings) != 0 {
				t.Fatalf("%d points (want %d), warnings %v", len(s.Y), len(ref.Y), s.Warnings)
			}
			for k := range s.Y {
				// NTUPLES files give FIRST/LAST rounded to 1e-4 Hz.
				if s.Y[k] != ref.Y[k] || math.Abs(s.PPM[k]-ref.PPM[k]) > 1e-6 {
					t.Fatalf("point %d: (%g, %g), o01 has (%g, %g)", k, s.PPM[k], s.Y[k], ref.PPM[k], ref.Y[k])
				}
			}
		})
	}
}

// TestOtherExamples: the remaining files of jcamp_examples (nzhagen/jcamp,
// see SOURCES.md) parse with the header values they state.
func TestOtherExamples(t *testing.T) {
	t.Parallel()
	dir := "spectra/jcamp_examples/"
	t.Run("2-methyl-1-propanol in ppm", func(t *testing.T) {
		s, err := ReadFile(extdata.Path(t, dir+"2-methyl-1-propanol_1h_300MHz.jdx"))
		if err != nil {
			t.Fatal(err)
		}
		// Header: FIRSTX=0.449892, LASTX=3.951200 ppm, NPOINTS=2153, 300.149506 MHz.
		n := len(s.PPM)
		if n != 2153 || math.Abs(s.PPM[0]-0.449892) > 1e-9 || math.Abs(s.PPM[n-1]-3.9512) > 1e-9 || s.FieldMHz != 300.149506 {
			t.Errorf("%d points %g..%g at %g MHz", n, s.PPM[0], s.PPM[n-1], s.FieldMHz)
		}
	})
	t.Run("ethanol LINK file", func(t *testing.T) {
		path := extdata.Path(t, dir+"ethanol_1h_300MHz_linkblock.jdx")
		f, err := os.Open(path)
		if err != nil {
			t.Fatal(err)
		}
		defer f.Close()
		all, err := ReadJCAMPAll(f, path)
		if err != nil {
			t.Fatal(err)
		}
		// Block 3 is a 4-line peak table, block 4 the 16384-point spectrum.
		if len(all) != 2 || len(all[0].PeakTable) != 4 || len(all[1].PPM) != 16384 {
			t.Fatalf("blocks: %d", len(all))
		}
		s, err := ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		// ##.SHIFT REFERENCE=INTERNAL, ,16384, -1.9611: the last file point
		// (lowest frequency) lies at -1.9611 ppm.
		if len(s.PPM) != 16384 || math.Abs(s.PPM[0]+1.9611) > 1e-9 || len(s.PeakTable) != 4 {
			t.Errorf("picked %d points starting %g with %d peaks", len(s.PPM), s.PPM[0], len(s.PeakTable))
		}
		// The peak table lists 1.24796 ppm with relative height 1 times YFACTOR 35174796.
		if p := s.PeakTable[1]; p.PPM != 1.24796 || p.Intensity != 35174796 {
			t.Errorf("peak 2 = %+v", p)
		}
	})
	t.Run("quinine in Hz without field", func(t *testing.T) {
		path := extdata.Path(t, dir+"quinine_1h_hz.jdx")
		_, err := ReadFile(path)
		var pe *ParseError
		if !errors.As(err, &pe) || pe.Line != 9 || !strings.Contains(pe.Msg, "cannot convert Hz to ppm") {
			t.Fatalf("error %v, want line 9 (##XYDATA) about the missing field", err)
		}
		s, err := ReadFileWith(path, ReadOptions{FieldMHz: 400})
		if err != nil {
			t.Fatal(err)
		}
		// FIRSTX=5599.555 Hz, LASTX=-799.835 Hz, 65536 points (header).
		n := len(s.PPM)
		if n != 65536 || math.Abs(s.PPM[n-1]-5599.5550206830002935/400) > 1e-9 || s.FieldMHz != 400 {
			t.Errorf("%d points up to %g", n, s.PPM[n-1])
		}
	})
}

// cheminfoIndex reads index.tsv: folder -> observe MHz.
func cheminfoIndex(t *testing.T, path string) map[string]float64 {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	out := map[string]float64{}
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		c := strings.Split(sc.Text(), "\t")
		if len(c) < 7 || c[0] == "folder" {
			continue
		}
		mhz, err := strconv.ParseFloat(c[6], 64)
		if err != nil {
			t.Fatalf("index.tsv: %v", err)
		}
		out[c[0]] = mhz
	}
	return out
}

// cheminfoShifts reads assignments_1h.tsv: folder -> assigned shifts.
func cheminfoShifts(t *testing.T, path string) map[string][]float64 {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	out := map[string][]float64{}
	for _, line := range strings.Split(string(data), "\n")[1:] {
		c := strings.Split(line, "\t")
		if len(c) < 3 {
			continue
		}
		v, err := strconv.ParseFloat(c[2], 64)
		if err != nil {
			t.Fatalf("assignments_1h.tsv: %v", err)
		}
		out[c[0]] = append(out[c[0]], v)
	}
	return out
}

// TestCheminfoDataset: every spectrum of cheminfo/nmr-dataset1 (see
// SOURCES.md) parses; its field equals index.tsv's observe MHz, and the
// ppm axis (from HZ, the observe frequency and ##.SHIFT REFERENCE) puts a
// signal at nearly every shift assigned in assignments_1h.tsv.
func TestCheminfoDataset(t *testing.T) {
	t.Parallel()
	dir := extdata.Path(t, "spectra/cheminfo_nmr_dataset1")
	index := cheminfoIndex(t, filepath.Join(dir, "index.tsv"))
	shifts := cheminfoShifts(t, filepath.Join(dir, "assignments_1h.tsv"))
	files, _ := filepath.Glob(filepath.Join(dir, "*", "*.dx"))
	if len(files) < 21 {
		t.Fatalf("found %d .dx files, want at least 21", len(files))
	}
	for _, path := range files {
		folder := filepath.Base(filepath.Dir(path))
		t.Run(folder+"/"+filepath.Base(path), func(t *testing.T) {
			s, err := ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			n := len(s.PPM)
			if want := index[folder]; math.Abs(s.FieldMHz-want) > 1e-6 {
				t.Errorf("field %g MHz, index.tsv says %g", s.FieldMHz, want)
			}
			// Sensible 1H window (common practice, no source): within -5..35 ppm
			// (one file spans -2.5..32.5 ppm) and at least 3 ppm wide.
			if s.PPM[0] < -5 || s.PPM[n-1] > 35 || s.PPM[n-1]-s.PPM[0] < 3 {
				t.Errorf("axis %g..%g ppm", s.PPM[0], s.PPM[n-1])
			}
			checkSignalsAt(t, s, shifts[folder])
		})
	}
}

// checkSignalsAt requires a point above median + 20 MAD within 0.02 ppm of
// at least 80% of the assigned shifts (exchangeable protons may be broad).
func checkSignalsAt(t *testing.T, s *Spectrum, shifts []float64) {
	t.Helper()
	if len(shifts) == 0 {
		return
	}
	y := append([]float64(nil), s.Y...)
	sort.Float64s(y)
	med := y[len(y)/2]
	for i := range y {
		y[i] = math.Abs(y[i] - med)
	}
	sort.Float64s(y)
	thr := med + 20*y[len(y)/2]
	hit := 0
	for _, sh := range shifts {
		lo := sort.SearchFloat64s(s.PPM, sh-0.02)
		for i := lo; i < len(s.PPM) && s.PPM[i] <= sh+0.02; i++ {
			if s.Y[i] > thr {
				hit++
				break
			}
		}
	}
	if hit*10 < 8*len(shifts) {
		t.Errorf("signals at %d of %d assigned shifts", hit, len(shifts))
	}
}

// jdx builds a small XYDATA file around data lines.
func jdx(header string, data ...string) string {
	return "##TITLE=t\n##JCAMP-DX=5.01\n##DATA TYPE=NMR SPECTRUM\n" + header +
		"##XYDATA=(X++(Y..Y))\n" + strings.Join(data, "\n") + "\n##END=\n"
}

const smallHeader = "##.OBSERVE FREQUENCY=100\n##XUNITS=HZ\n##FIRSTX=500\n##LASTX=100\n##NPOINTS=5\n"

func TestJCAMPSmall(t *testing.T) {
	t.Parallel()
	// DIFDUP with Y-check values; X in Hz at 100 MHz runs 500..100 Hz = 5..1 ppm.
	src := jdx(smallHeader+"##YFACTOR=2\n", "500 A0JT", "300 A2J", "200 A3j", "100 A2")
	s, err := ReadJCAMP(strings.NewReader(src), "small.jdx")
	if err != nil {
		t.Fatal(err)
	}
	if want := []float64{1, 2, 3, 4, 5}; !equalFloats(s.PPM, want) {
		t.Errorf("ppm %v, want %v", s.PPM, want)
	}
	// File order 10 11 12 13 12 times YFACTOR 2, then reversed to ascending ppm.
	if want := []float64{24, 26, 24, 22, 20}; !equalFloats(s.Y, want) {
		t.Errorf("y %v, want %v", s.Y, want)
	}
	if len(s.Warnings) != 0 {
		t.Errorf("warnings %v", s.Warnings)
	}
}

// TestJCAMPErrors checks messages and line numbers of broken files.
func TestJCAMPErrors(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name string
		src  string
		line int
		msg  string
	}{
		{"Y-check mismatch", jdx(smallHeader, "500 A0JJ", "300 A3J", "200 A3J"), 11, "Y-check value 13 does not match the last value 12"},
		{"bad character", jdx(smallHeader, "500 10 11", "300 12 1#3 14"), 11, "unexpected character '#'"},
		{"too few points", jdx(smallHeader, "500 10 11 12"), 10, "##NPOINTS=5 (line 8) but the data hold 3 points"},
		{"too many points", jdx(smallHeader, "500 10 11 12", "200 1 2 3"), 11, "more data points than ##NPOINTS=5"},
		{"truncated", "##TITLE=t\n##XUNITS=HZ\n##XYDATA=(X++(Y..Y))\n1 2 3\n4 5", 5, "missing ##END="},
		{"no title", "##JCAMP-DX=5\n", 1, "expected ##TITLE="},
		{"FID", "##TITLE=t\n##DATA TYPE=NMR FID\n##XYDATA=(X++(Y..Y))\n0 1\n##END=\n", 2, "time-domain data is not supported yet"},
		{"time units", jdx("##XUNITS=SECONDS\n##FIRSTX=0\n##LASTX=1\n", "0 1 2"), 4, "time-domain data is not supported yet"},
		{"IR units", jdx("##XUNITS=1/CM\n##FIRSTX=0\n##LASTX=1\n", "0 1 2"), 4, "not an NMR axis"},
		{"no units", jdx("##FIRSTX=0\n##LASTX=1\n", "0 1 2"), 6, "missing ##XUNITS="},
		{"bad number", jdx("##XUNITS=PPM\n##FIRSTX=zero\n", "0 1 2"), 5, "##FIRSTX: expected a number"},
		{"no data", jdx("##XUNITS=PPM\n##FIRSTX=0\n"), 6, "holds no data points"},
		{"no spectrum", "##TITLE=link\n##DATA TYPE=LINK\n##END=\n", 1, "no spectrum"},
		{"huge NPOINTS", jdx("##XUNITS=PPM\n##FIRSTX=1\n##LASTX=0\n##NPOINTS=1000000000000\n", "1 1 2"), 9, "but the data hold 2 points"},
		{"2D", "##TITLE=t\n##DATA TYPE=nD NMR SPECTRUM\n##END=\n", 2, "multidimensional"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := ReadJCAMP(strings.NewReader(tc.src), "bad.jdx")
			var pe *ParseError
			if !errors.As(err, &pe) || pe.Line != tc.line || !strings.Contains(pe.Msg, tc.msg) || pe.File != "bad.jdx" {
				t.Errorf("error %v, want bad.jdx:%d: ...%s...", err, tc.line, tc.msg)
			}
		})
	}
}

// TestCorruptRealFile damages o02 (DIFDUP with Y-checks, IUPAC test set)
// and expects the damage to be located.
func TestCorruptRealFile(t *testing.T) {
	t.Parallel()
	data, err := os.ReadFile(extdata.Path(t, odcbPrefix+"o02.jdx"))
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(string(data), "\n")
	read := func(ls []string) error {
		_, err := ReadJCAMP(strings.NewReader(strings.Join(ls, "\n")), "o02.jdx")
		return err
	}
	check := func(name string, err error, line int, msg string) {
		var pe *ParseError
		if !errors.As(err, &pe) || pe.Line != line || !strings.Contains(pe.Msg, msg) {
			t.Errorf("%s: error %v, want line %d with %q", name, err, line, msg)
		}
	}
	// Line 61 dropped: line 62 (now 61) starts with a Y-check that cannot match.
	dropped := append(append([]string(nil), lines[:60]...), lines[61:]...)
	check("dropped line", read(dropped), 61, "Y-check")
	// Truncated after line 100.
	check("truncated", read(lines[:100]), 100, "missing ##END=")
	// A '!' in the middle of line 40.
	bad := append([]string(nil), lines...)
	bad[39] = bad[39][:30] + "!" + bad[39][31:]
	check("bad character", read(bad), 40, "unexpected character '!'")
}

// TestNoHugeAllocation: a header claiming 10^12 points must not be
// allocated (issue 5); reading such a file costs well under 1 MB.
func TestNoHugeAllocation(t *testing.T) {
	src := jdx("##XUNITS=PPM\n##FIRSTX=1\n##LASTX=0\n##NPOINTS=1000000000000\n", "1 1 2")
	var before, after runtime.MemStats
	runtime.ReadMemStats(&before)
	_, err := ReadJCAMP(strings.NewReader(src), "huge.jdx")
	runtime.ReadMemStats(&after)
	if err == nil {
		t.Fatal("no error for 2 points against NPOINTS=10^12")
	}
	if d := after.TotalAlloc - before.TotalAlloc; d > 1<<20 {
		t.Errorf("allocated %d bytes", d)
	}
}

// TestLabelNames: label names compare without case, spaces, dashes,
// slashes and underscores (McDonald & Wilks 1988 §4.1, value from memory of
// the rule; JCAMP-DX 5 keeps it).
func TestLabelNames(t *testing.T) {
	t.Parallel()
	for _, in := range []string{"NPOINTS", "N POINTS", "n-points", "N_Points", "N/POINTS"} {
		if got := normLabel(in); got != "NPOINTS" {
			t.Errorf("normLabel(%q) = %q", in, got)
		}
	}
	src := "##title= t $$ comment\n##Data Type= NMR Spectrum\n##x units=PPM\n##first_x=2\n##Last-X=1\n" +
		"##.Observe Frequency=400\n##.Solvent Name=DMSO-d6\n##n points=2\n##XY DATA=(X++(Y..Y)) $$ data\n2 5 6\n##END=\n"
	s, err := ReadJCAMP(strings.NewReader(src), "names.jdx")
	if err != nil {
		t.Fatal(err)
	}
	if !equalFloats(s.PPM, []float64{1, 2}) || !equalFloats(s.Y, []float64{6, 5}) || s.FieldMHz != 400 || s.Solvent != "DMSO-d6" {
		t.Errorf("got %+v", s)
	}
}

func TestPeakTableAndXYPoints(t *testing.T) {
	t.Parallel()
	src := "##TITLE=peaks\n##XUNITS=HZ\n##.OBSERVE FREQUENCY=400\n##XFACTOR=1\n##YFACTOR=2\n" +
		"##PEAK TABLE=(XYW..XYW)\n800,10,1.5; 400,5,2\n##END=\n" +
		"##TITLE=points\n##XUNITS=PPM\n##XYPOINTS=(XY..XY)\n3, 1\n1, 2\n2, 3\n##END=\n"
	all, err := ReadJCAMPAll(strings.NewReader(src), "two.jdx")
	if err != nil {
		t.Fatal(err)
	}
	if len(all) != 2 {
		t.Fatalf("%d blocks", len(all))
	}
	want := []Peak{{PPM: 1, Intensity: 10, WidthHz: 2}, {PPM: 2, Intensity: 20, WidthHz: 1.5}}
	if len(all[0].PeakTable) != 2 || all[0].PeakTable[0] != want[0] || all[0].PeakTable[1] != want[1] {
		t.Errorf("peaks %+v", all[0].PeakTable)
	}
	if !equalFloats(all[1].PPM, []float64{1, 2, 3}) || !equalFloats(all[1].Y, []float64{2, 3, 1}) {
		t.Errorf("points %v %v", all[1].PPM, all[1].Y)
	}
	// The trace block is picked by ReadJCAMP.
	s, err := ReadJCAMP(strings.NewReader(src), "two.jdx")
	if err != nil || len(s.PPM) != 3 {
		t.Errorf("ReadJCAMP picked %+v, %v", s, err)
	}
}

// ntuplesSrc builds an NTUPLES block whose imaginary page comes first.
func ntuplesSrc(kind, dim, units string) string {
	return "##TITLE=n\n##JCAMP-DX=5.01\n##.OBSERVE FREQUENCY=100\n##NTUPLES=" + kind + "\n" +
		"##VAR_NAME=FREQUENCY, SPECTRUM/REAL, SPECTRUM/IMAG, PAGE NUMBER\n##SYMBOL=X, R, I, N\n" +
		"##VAR_DIM=" + dim + "\n##UNITS=" + units + ", ARBITRARY UNITS, ARBITRARY UNITS\n" +
		"##FIRST=300, 1, 9\n##LAST=100, 3, 7\n##FACTOR=1, 2, 1, 1\n" +
		"##PAGE=N=2\n##DATA TABLE=(X++(I..I)), XYDATA\n300 I8j\n200 H8j\n100 G8\n" +
		"##PAGE=N=1\n##DATA TABLE=(X++(R..R)), XYDATA\n300 AJ\n200 BJ\n100 C\n" +
		"##END NTUPLES=" + kind + "\n##END=\n"
}

// TestNTuples: the real page is chosen whatever the page order, scaled by
// its FACTOR (Davies & Lancashire 1993 NTUPLES layout).
func TestNTuples(t *testing.T) {
	t.Parallel()
	s, err := ReadJCAMP(strings.NewReader(ntuplesSrc("NMR SPECTRUM", "3, 3, 3, 2", "HZ")), "nt.jdx")
	if err != nil {
		t.Fatal(err)
	}
	if !equalFloats(s.PPM, []float64{1, 2, 3}) || !equalFloats(s.Y, []float64{6, 4, 2}) {
		t.Errorf("ppm %v y %v", s.PPM, s.Y)
	}
	for _, tc := range []struct {
		src  string
		line int
		msg  string
	}{
		{ntuplesSrc("NMR FID", "3, 3, 3, 2", "TIME"), 4, "time-domain data is not supported yet"},
		{ntuplesSrc("NMR SPECTRUM", "3, 3, 3, 2", "SECONDS"), 8, "time-domain data is not supported yet"},
		{ntuplesSrc("NMR SPECTRUM", "4, 4, 4, 2", "HZ"), 21, "##VAR_DIM=4 (line 7) but the data hold 3 points"},
	} {
		_, err := ReadJCAMP(strings.NewReader(tc.src), "nt.jdx")
		var pe *ParseError
		if !errors.As(err, &pe) || pe.Line != tc.line || !strings.Contains(pe.Msg, tc.msg) {
			t.Errorf("error %v, want line %d with %q", err, tc.line, tc.msg)
		}
	}
}

// TestWarnings: inconsistencies that do not lose data are reported with
// their line, and the data are kept.
func TestWarnings(t *testing.T) {
	t.Parallel()
	// Line 12 claims X=150 where point 3 lies at 300 Hz (FIRSTX 500, step -100).
	src := jdx(smallHeader+"##DELTAX=-90\n", "500 1 2", "150 3 4 5")
	s, err := ReadJCAMP(strings.NewReader(src), "w.jdx")
	if err != nil {
		t.Fatal(err)
	}
	want := []string{
		"w.jdx:9: ##DELTAX=-90 disagrees with (LASTX-FIRSTX)/(NPOINTS-1) = -100; using the latter",
		"w.jdx:12: line starts at X=150 but point 3 lies at 300 (FIRSTX + index*DELTAX)",
	}
	if len(s.Warnings) != 2 || s.Warnings[0] != want[0] || s.Warnings[1] != want[1] {
		t.Errorf("warnings %q, want %q", s.Warnings, want)
	}
	if !equalFloats(s.Y, []float64{5, 4, 3, 2, 1}) {
		t.Errorf("y %v", s.Y)
	}
}

func TestFirstYWarning(t *testing.T) {
	t.Parallel()
	// FIRSTY=20 but the first value is 1 (YFACTOR 1): reported at line 9.
	s, err := ReadJCAMP(strings.NewReader(jdx(smallHeader+"##FIRSTY=20\n", "500 1 2 3 4 5")), "y.jdx")
	if err != nil {
		t.Fatal(err)
	}
	if len(s.Warnings) != 1 || !strings.HasPrefix(s.Warnings[0], "y.jdx:9: first Y value 1 disagrees") {
		t.Errorf("warnings %q", s.Warnings)
	}
}

// TestMultiLineValues: a value may continue on the following lines (JCAMP-DX
// labelled data records end at the next "##"; McDonald & Wilks 1988 §4,
// value from memory of the rule).
func TestMultiLineValues(t *testing.T) {
	t.Parallel()
	src := strings.Replace(ntuplesSrc("NMR SPECTRUM", "3, 3, 3, 2", "HZ"), "##SYMBOL=X, R, I, N\n", "##SYMBOL=X,\n  R, $$ real\n  I, N\n", 1)
	src = strings.Replace(src, "##TITLE=n\n", "##TITLE=first line\n  second line\n", 1)
	s, err := ReadJCAMP(strings.NewReader(src), "ml.jdx")
	if err != nil {
		t.Fatal(err)
	}
	if s.Title != "first line second line" || !equalFloats(s.Y, []float64{6, 4, 2}) {
		t.Errorf("title %q, y %v", s.Title, s.Y)
	}
}
