package screen

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"runtime"
	"strconv"
	"strings"
	"sync"
	"time"
	"unicode"

	"shiftwise/compare"
	"shiftwise/internal/atomicfile"
	"shiftwise/report"
)

// Row is one sample's line of the summary.
type Row struct {
	ID            string   `json:"id"`
	Verdict       string   `json:"verdict"` // "" when the sample could not be checked
	Score         float64  `json:"score"`
	PurityPercent *float64 `json:"purity_percent"` // qNMR when available, else molar estimate
	PurityMethod  string   `json:"purity_method,omitempty"`
	Unexplained   int      `json:"unexplained_peaks"`
	Found         string   `json:"found"` // recognised species other than the compound, e.g. "ethyl acetate 7.4 mol%; water"
	Error         string   `json:"error"`
	Report        string   `json:"report"` // file name of the sample's report, relative to the output dir
}

// Summary is the outcome of a batch, in manifest order.
type Summary struct {
	Rows []Row
}

// Options controls Run.
type Options struct {
	OutDir  string // where reports and summaries go; "" writes nothing
	Jobs    int    // parallel samples; 0 means all cores
	Version string // recorded in reports
	// Progress, when not nil, is called after each sample finishes, from
	// the goroutine that finished it (calls are serialised).
	Progress func(done, total int, row Row)
	// Check replaces compare.Check (tests, benchmarks).
	Check func(compare.Input, compare.Options) (*compare.Result, error)

	preds *compare.SharedPredictions // set by Run
	Now   func() time.Time
}

// Run checks every sample of m. Errors of single samples become error rows;
// the returned error concerns the batch itself (output directory, summary
// files).
func Run(m *Manifest, opt Options) (*Summary, error) {
	if opt.Jobs <= 0 {
		opt.Jobs = runtime.NumCPU()
	}
	opt.Jobs = min(opt.Jobs, len(m.Samples)) // --jobs 100000 starts no idle workers
	if opt.Check == nil {
		opt.Check = compare.Check
	}
	if opt.Now == nil {
		opt.Now = time.Now
	}
	// Samples of one product share its prediction.
	opt.preds = &compare.SharedPredictions{}
	if opt.OutDir != "" {
		if err := os.MkdirAll(opt.OutDir, 0o755); err != nil {
			return nil, err
		}
		removeStaleTemps(opt.OutDir)
	}
	sum := &Summary{Rows: make([]Row, len(m.Samples))}
	// Validation first, in order, so duplicate ids are caught deterministically.
	seen := map[string]int{}
	bad := make([]error, len(m.Samples))
	files := map[int]string{}
	used := map[string]bool{}
	for i := range m.Samples {
		bad[i] = m.validate(i, seen)
		if m.Samples[i].ID != "" && seen[m.Samples[i].ID] == 0 {
			seen[m.Samples[i].ID] = i + 1
		}
		files[i] = reportName(m.Samples[i].ID, i, used)
	}
	var mu sync.Mutex
	done := 0
	work := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < opt.Jobs; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range work {
				row := runOne(m, i, bad[i], files[i], opt)
				mu.Lock()
				sum.Rows[i] = row
				done++
				if opt.Progress != nil {
					opt.Progress(done, len(m.Samples), row)
				}
				mu.Unlock()
			}
		}()
	}
	for i := range m.Samples {
		work <- i
	}
	close(work)
	wg.Wait()
	if opt.OutDir != "" {
		if err := writeOutputs(m, sum, opt); err != nil {
			return sum, err
		}
	}
	return sum, nil
}

// runOne checks one sample and writes its report. It never panics: a panic
// inside the check is turned into the sample's error so the batch goes on.
func runOne(m *Manifest, i int, invalid error, file string, opt Options) (row Row) {
	s := m.Samples[i]
	row = Row{ID: s.ID}
	if row.ID == "" {
		row.ID = fmt.Sprintf("sample-%d", i+1)
	}
	if strings.ContainsFunc(row.ID, unicode.IsControl) {
		row.ID = strconv.Quote(row.ID) // keeps tab-separated rows whole
	}
	defer func() {
		if p := recover(); p != nil {
			row = Row{ID: row.ID, Error: fmt.Sprintf("internal error (please report it): %v", p)}
		}
	}()
	if invalid != nil {
		row.Error = invalid.Error()
		return row
	}
	in, copt := m.input(i)
	if opt.preds != nil {
		copt.Predictor = opt.preds.Predictor(copt)
	}
	res, err := opt.Check(in, copt)
	if err != nil {
		// The check's error names the spectrum file or the option; say
		// which sample of the manifest it belongs to.
		row.Error = fmt.Sprintf("%s (%s): %v", m.where(i), row.ID, err)
		return row
	}
	row.Verdict = string(res.Verdict)
	row.Score = res.Score
	row.Unexplained = len(res.Unexplained)
	row.Found = foundSummary(res)
	switch {
	case res.Purity.QNMRMassPercent != nil:
		row.PurityPercent, row.PurityMethod = res.Purity.QNMRMassPercent, "qNMR"
	case res.Purity.MolarPercent != nil:
		row.PurityPercent, row.PurityMethod = res.Purity.MolarPercent, "molar estimate"
	}
	if opt.OutDir == "" {
		return row
	}
	err = atomicfile.Write(filepath.Join(opt.OutDir, file), 0o644, func(w io.Writer) error {
		return report.Write(w, report.Sample{ID: row.ID, Spectrum: s.Spectrum, Result: res,
			Created: opt.Now(), Version: opt.Version})
	})
	if err != nil {
		row.Error = "report not written: " + err.Error()
		return row
	}
	row.Report = file
	return row
}

// removeStaleTemps deletes temporary files that an interrupted earlier run
// left in dir (see atomicfile); finished files are never touched.
func removeStaleTemps(dir string) {
	stale, _ := filepath.Glob(filepath.Join(dir, ".*.tmp-*"))
	for _, f := range stale {
		os.Remove(f)
	}
}

// foundSummary lists the species other than the compound that the check
// recognised (residual protio solvent excluded: it is always there), with
// their molar share where one was estimated.
func foundSummary(res *compare.Result) string {
	var parts []string
	water := 0.0
	for _, u := range res.Unexplained {
		if u.Kind == "water" {
			water += u.IntegralH
		}
	}
	for _, f := range res.Found {
		if f.Kind == "solvent" || f.Kind == "standard" || strings.HasPrefix(f.Name, "TMS") {
			continue
		}
		switch {
		case f.Kind == "water" && water > 0:
			parts = append(parts, fmt.Sprintf("water %.2f H-eq", water))
		case f.MolPercent > 0:
			parts = append(parts, fmt.Sprintf("%s %.1f mol%%", f.Name, f.MolPercent))
		default:
			parts = append(parts, f.Name)
		}
	}
	return strings.Join(parts, "; ")
}

var unsafeChars = regexp.MustCompile(`[^A-Za-z0-9._-]+`)

// reportName makes a file name for a sample's report that is safe on every
// file system and unique within the batch.
func reportName(id string, i int, used map[string]bool) string {
	base := unsafeChars.ReplaceAllString(id, "_")
	if base == "" || base == "." || base == ".." || base == "index" || base == "summary" {
		base = fmt.Sprintf("sample-%d", i+1)
	}
	name := base + ".html"
	for k := 2; used[name]; k++ {
		name = fmt.Sprintf("%s-%d.html", base, k)
	}
	used[name] = true
	return name
}

// writeOutputs writes summary.csv, summary.json and index.html atomically.
func writeOutputs(m *Manifest, sum *Summary, opt Options) error {
	dir := opt.OutDir
	if err := atomicfile.Write(filepath.Join(dir, "summary.csv"), 0o644, func(w io.Writer) error {
		return WriteCSV(w, sum)
	}); err != nil {
		return err
	}
	if err := atomicfile.Write(filepath.Join(dir, "summary.json"), 0o644, func(w io.Writer) error {
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		return enc.Encode(struct {
			Manifest string `json:"manifest"`
			Advisory string `json:"advisory"`
			Samples  []Row  `json:"samples"`
		}{m.Path, compare.AdvisoryText, sum.Rows})
	}); err != nil {
		return err
	}
	ix := report.Index{Title: m.Title, Manifest: m.Path, Created: opt.Now()}
	if ix.Title == "" {
		ix.Title = "Batch check"
	}
	for _, r := range sum.Rows {
		ix.Rows = append(ix.Rows, report.IndexRow{ID: r.ID, Verdict: r.Verdict, Score: r.Score,
			Purity: r.PurityPercent, PurityMethod: r.PurityMethod, Unexplained: r.Unexplained, Found: r.Found,
			Error: r.Error, Report: r.Report})
	}
	return atomicfile.Write(filepath.Join(dir, "index.html"), 0o644, func(w io.Writer) error {
		return report.WriteIndex(w, ix)
	})
}

// WriteCSV writes the summary as CSV with a header row.
func WriteCSV(w io.Writer, sum *Summary) error {
	cw := csv.NewWriter(w)
	cw.Write([]string{"id", "verdict", "score", "purity_percent", "purity_method", "unexplained_peaks", "found", "error", "report"})
	for _, r := range sum.Rows {
		pur := ""
		if r.PurityPercent != nil {
			pur = strconv.FormatFloat(*r.PurityPercent, 'f', 1, 64)
		}
		score := ""
		if r.Error == "" {
			score = strconv.FormatFloat(r.Score, 'f', 3, 64)
		}
		cw.Write([]string{r.ID, r.Verdict, score, pur, r.PurityMethod, strconv.Itoa(r.Unexplained), r.Found, r.Error, r.Report})
	}
	cw.Flush()
	return cw.Error()
}

// Exit statuses of a batch (see the package documentation).
const (
	StatusOK           = 0
	StatusInputError   = 1
	StatusInconsistent = 3
	StatusReview       = 4
)

// Status maps the summary to the exit status documented in the package
// comment.
func (s *Summary) Status() int {
	var anyErr, anyBad, anyReview bool
	for _, r := range s.Rows {
		switch {
		case r.Error != "":
			anyErr = true
		case r.Verdict == string(compare.Inconsistent):
			anyBad = true
		case r.Verdict == string(compare.Review):
			anyReview = true
		}
	}
	switch {
	case anyErr:
		return StatusInputError
	case anyBad:
		return StatusInconsistent
	case anyReview:
		return StatusReview
	}
	return StatusOK
}
