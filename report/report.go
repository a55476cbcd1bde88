package report

import (
	_ "embed"
	"fmt"
	"html/template"
	"io"
	"time"

	"shiftwise/compare"
)

//go:embed page.html.tmpl
var pageTemplate string

//go:embed style.css
var styleSheet string

// Sample is what one report page shows.
type Sample struct {
	ID       string          // sample or lot identifier
	Spectrum string          // spectrum file name, for the record
	Result   *compare.Result // the check; must not be nil
	Created  time.Time       // when the check ran
	Version  string          // shiftwise version that produced it
}

// pageData is what the template sees.
type pageData struct {
	Sample
	Style           template.CSS
	Overview        template.HTML
	Zooms           []zoom
	Formula         string
	MolecularWeight float64
	Signals         int
	PlotErrors      []string
}

type zoom struct {
	Signal string
	SVG    template.HTML
}

var funcs = template.FuncMap{
	"f1": func(x float64) string { return fmt.Sprintf("%.1f", x) },
	"f2": func(x float64) string { return fmt.Sprintf("%.2f", x) },
	"f3": func(x float64) string { return fmt.Sprintf("%.3f", x) },
	"fp": func(x *float64, digits int) string {
		if x == nil {
			return "–"
		}
		return fmt.Sprintf("%.*f", digits, *x)
	},
	"js": func(js []float64) string {
		if len(js) == 0 {
			return ""
		}
		s := ""
		for i, j := range js {
			if i > 0 {
				s += ", "
			}
			s += fmt.Sprintf("%.1f", j)
		}
		return s + " Hz"
	},
	"inc": func(i int) int { return i + 1 },
}

var page = template.Must(template.New("page").Funcs(funcs).Parse(pageTemplate))

// maxZooms caps the enlarged multiplet panels on one page.
const maxZooms = 24

// Write renders the report page of one sample to w. The page is a complete
// HTML document with inline styles and inline SVG plots. A plot that cannot
// be drawn is replaced by a note on the page rather than failing the report.
func Write(w io.Writer, s Sample) error {
	if s.Result == nil {
		return fmt.Errorf("report: sample %q has no result", s.ID)
	}
	d := pageData{Sample: s, Style: template.CSS(styleSheet)}
	if p := s.Result.Prediction; p != nil {
		d.Formula, d.MolecularWeight, d.Signals = p.Formula, p.MolecularWeight, len(p.Signals)
	}
	if svg, err := overviewSVG(s.Result); err != nil {
		d.PlotErrors = append(d.PlotErrors, "spectrum plot: "+err.Error())
	} else {
		d.Overview = template.HTML(svg) // produced by gonum/plot's SVG backend, not user text
	}
	for i, a := range s.Result.Assignments {
		if i == maxZooms {
			break
		}
		svg, err := zoomSVG(s.Result, a)
		if err != nil {
			d.PlotErrors = append(d.PlotErrors, "multiplet "+a.Signal+": "+err.Error())
			continue
		}
		d.Zooms = append(d.Zooms, zoom{Signal: a.Signal, SVG: template.HTML(svg)})
	}
	return page.Execute(w, d)
}
