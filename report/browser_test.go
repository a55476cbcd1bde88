package report

import (
	"context"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/chromedp/cdproto/runtime"
	"github.com/chromedp/chromedp"

	"shiftwise/internal/atomicfile"
	"shiftwise/internal/extdata"
)

// TestReportInBrowser opens a generated report in headless Chromium (Debian's
// chromium package) and checks what a reviewer sees: the page loads without
// console errors or exceptions, shows the verdict, and draws the spectrum
// plot with a non-zero size. A screenshot is left in the test's temp dir.
func TestReportInBrowser(t *testing.T) {
	if testing.Short() {
		t.Skip("browser test skipped in -short mode")
	}
	chromium := extdata.Tool(t, "chromium")
	page, r := renderPage(t)
	dir := t.TempDir()
	file := filepath.Join(dir, "report.html")
	if err := atomicfile.WriteBytes(file, []byte(page), 0o644); err != nil {
		t.Fatal(err)
	}

	opts := append(chromedp.DefaultExecAllocatorOptions[:],
		chromedp.ExecPath(chromium),
		chromedp.NoSandbox,
		chromedp.DisableGPU,
		chromedp.UserDataDir(filepath.Join(dir, "profile")),
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.Flag("disable-quic", true),
		chromedp.Flag("no-first-run", true),
	)
	actx, cancelA := chromedp.NewExecAllocator(context.Background(), opts...)
	defer cancelA()
	ctx, cancel := chromedp.NewContext(actx)
	defer cancel()
	// The first action starts the browser: it must run on a context
	// without a deadline (chromedp's rule); later actions get a timeout.
	if err := chromedp.Do(ctx, chromedp.EmulateViewport(1200, 900)); err != nil {
		t.Fatalf("starting chromium: %v", err)
	}
	var mu sync.Mutex
	var problems []string
	if err := chromedp.Listen(ctx, func(ev any) {
		mu.Lock()
		defer mu.Unlock()
		switch e := ev.(type) {
		case *runtime.EventConsoleAPICalled:
			if e.Type == runtime.ConsoleAPICalledTypeError || e.Type == runtime.ConsoleAPICalledTypeAssert {
				problems = append(problems, "console "+string(e.Type))
			}
		case *runtime.EventExceptionThrown:
			problems = append(problems, "exception: "+e.ExceptionDetails.Text)
		}
	}); err != nil {
		t.Fatal(err)
	}
	tctx, cancelT := context.WithTimeout(ctx, 60*time.Second)
	defer cancelT()
	if err := chromedp.Do(tctx, chromedp.Navigate("file://"+file)); err != nil {
		t.Fatalf("navigate: %v", err)
	}
	if err := chromedp.Do(tctx, chromedp.WaitVisible("#verdict")); err != nil {
		t.Fatalf("verdict not visible: %v", err)
	}
	verdict, err := chromedp.Run(tctx, chromedp.Text("#verdict"))
	if err != nil {
		t.Fatal(err)
	}
	w, err := chromedp.Run(tctx, chromedp.Evaluate[float64](`document.querySelector("#overview svg").getBoundingClientRect().width`))
	if err != nil {
		t.Fatal(err)
	}
	h, err := chromedp.Run(tctx, chromedp.Evaluate[float64](`document.querySelector("#overview svg").getBoundingClientRect().height`))
	if err != nil {
		t.Fatal(err)
	}
	shot, err := chromedp.Run(tctx, chromedp.FullScreenshot(80))
	if err != nil {
		t.Fatal(err)
	}
	if got := strings.ToLower(strings.TrimSpace(verdict)); got != string(r.Verdict) {
		t.Errorf("verdict shown %q, want %q", got, r.Verdict)
	}
	if w <= 0 || h <= 0 {
		t.Errorf("spectrum plot has size %.0f×%.0f", w, h)
	}
	mu.Lock()
	defer mu.Unlock()
	if len(problems) > 0 {
		t.Errorf("page problems: %v", problems)
	}
	shotPath := filepath.Join(dir, "report.jpg")
	if err := os.WriteFile(shotPath, shot, 0o644); err != nil {
		t.Fatal(err)
	}
	t.Logf("screenshot: %s (%d bytes), plot %.0f×%.0f px", shotPath, len(shot), w, h)
}
