package report

import (
	"bytes"
	"html"
	"math/rand/v2"
	"strings"
	"testing"
	"time"

	"shiftwise/compare"
	"shiftwise/predict"
	"shiftwise/smiles"
	"shiftwise/spectrum"
)

// syntheticCheck runs a real check of ethyl acetate against a spectrum
// rendered from its own prediction plus residual CHCl3 at 7.26 ppm
// (Gottlieb, Kotlyar & Nudelman 1997) and seeded noise, so the report shows
// assignments and one explained solvent peak.
func syntheticCheck(t testing.TB) *compare.Result {
	t.Helper()
	const smi = "CCOC(C)=O"
	m, err := smiles.Parse(smi)
	if err != nil {
		t.Fatal(err)
	}
	p, err := predict.Predict(m, smi, predict.Options{FieldMHz: 400, Solvent: "CDCl3"})
	if err != nil {
		t.Fatal(err)
	}
	p.Lines = append(p.Lines, predict.Line{PPM: 7.26, Intensity: 0.05, Signal: "solvent"})
	x, y := predict.Render(p, -0.5, 10.5, 32768, 1.0)
	rng := rand.New(rand.NewPCG(1, 2))
	for i := range y {
		y[i] += 2e-4 * rng.NormFloat64()
	}
	s := &spectrum.Spectrum{PPM: x, Y: y, FieldMHz: 400, Nucleus: "1H", Solvent: "CDCl3", Source: "synthetic"}
	r, err := compare.Check(compare.Input{Smiles: smi, Spectrum: s}, compare.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return r
}

func renderPage(t testing.TB) (string, *compare.Result) {
	t.Helper()
	r := syntheticCheck(t)
	var b bytes.Buffer
	err := Write(&b, Sample{ID: "TEST-1", Spectrum: "synthetic.jdx", Result: r,
		Created: time.Date(2026, 12, 1, 9, 0, 0, 0, time.UTC)})
	if err != nil {
		t.Fatal(err)
	}
	return b.String(), r
}

func TestPageCarriesVerdictPlotsAndAdvisory(t *testing.T) {
	page, r := renderPage(t)
	for _, want := range []string{
		`id="verdict">` + string(r.Verdict) + "<",
		html.EscapeString(compare.AdvisoryText),
		"<svg",
		"Reviewed by",
		"C4H8O2", // ethyl acetate, Hill formula
	} {
		if !strings.Contains(page, want) {
			t.Errorf("page lacks %q", want)
		}
	}
	// Self-contained: no external resources (common practice for reports
	// that must open from disk).
	for _, bad := range []string{"http://", "https://", "<script src", "<link rel"} {
		if strings.Contains(strings.ReplaceAll(page, "http://www.w3.org", ""), bad) {
			t.Errorf("page refers to an external resource (%q)", bad)
		}
	}
	if n := strings.Count(page, "<svg"); n < 1+len(r.Assignments) {
		t.Errorf("want an overview and %d multiplet plots, found %d svg elements", len(r.Assignments), n)
	}
}

func TestPageEscapesUserText(t *testing.T) {
	r := syntheticCheck(t)
	var b bytes.Buffer
	if err := Write(&b, Sample{ID: `<script>alert(1)</script>`, Result: r}); err != nil {
		t.Fatal(err)
	}
	if strings.Contains(b.String(), "<script>alert(1)") {
		t.Fatal("sample id was not escaped")
	}
}

func TestWriteNeedsResult(t *testing.T) {
	if err := Write(&bytes.Buffer{}, Sample{ID: "x"}); err == nil {
		t.Fatal("want an error for a sample without result")
	}
}

func TestIndexCountsVerdicts(t *testing.T) {
	pur := 97.5
	var b bytes.Buffer
	err := WriteIndex(&b, Index{Title: "batch", Rows: []IndexRow{
		{ID: "a", Verdict: "consistent", Score: 0.9, Purity: &pur, Report: "a.html"},
		{ID: "b", Verdict: "inconsistent", Score: 0.2},
		{ID: "c", Error: "spectrum: no such file"},
	}})
	if err != nil {
		t.Fatal(err)
	}
	s := b.String()
	for _, want := range []string{"consistent 1", "inconsistent 1", "errors 1", `href="a.html"`, "97.5", "no such file"} {
		if !strings.Contains(s, want) {
			t.Errorf("index lacks %q", want)
		}
	}
}

func BenchmarkWrite(b *testing.B) {
	r := syntheticCheck(b)
	var buf bytes.Buffer
	for b.Loop() {
		buf.Reset()
		if err := Write(&buf, Sample{ID: "B", Result: r}); err != nil {
			b.Fatal(err)
		}
	}
}
