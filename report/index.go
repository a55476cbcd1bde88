package report

import (
	_ "embed"
	"fmt"
	"html/template"
	"io"
	"time"
)

//go:embed index.html.tmpl
var indexTemplate string

// IndexRow is one sample of a batch on the index page.
type IndexRow struct {
	ID           string
	Verdict      string // "consistent", "inconsistent", "review", or "" on error
	Score        float64
	Purity       *float64 // molar or qNMR purity, % ; nil when not estimated
	PurityMethod string   // "qNMR" or "molar estimate"
	Unexplained  int
	Found        string // recognised species other than the compound
	Error        string // the sample's error, when it could not be checked
	Report       string // relative link to the sample's page; "" when none
}

// Index is the content of a batch's index page.
type Index struct {
	Title    string
	Manifest string
	Created  time.Time
	Rows     []IndexRow
}

type indexData struct {
	Index
	Style  template.CSS
	Counts map[string]int
}

var indexPage = template.Must(template.New("index").Funcs(funcs).Parse(indexTemplate))

// WriteIndex renders the batch index page to w.
func WriteIndex(w io.Writer, ix Index) error {
	d := indexData{Index: ix, Style: template.CSS(styleSheet), Counts: map[string]int{}}
	for _, r := range ix.Rows {
		k := r.Verdict
		if r.Error != "" {
			k = "error"
		}
		d.Counts[k]++
	}
	if err := indexPage.Execute(w, d); err != nil {
		return fmt.Errorf("report: index: %w", err)
	}
	return nil
}
