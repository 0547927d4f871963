package plots

import (
	"bytes"
	"context"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/chromedp/cdproto/runtime"
	"github.com/chromedp/chromedp"

	"codeberg.org/sunsight/sunsight/internal/atomicfile"
)

var screenshot = flag.String("screenshot", "", "write a PNG screenshot of the demo report to this path")

const chromiumPath = "/usr/bin/chromium"

// TestReportInBrowser loads the demo report in headless Chromium (offline,
// fresh profile): no console error, every figure has a size, the headline
// table holds the given numbers, and the page prints to PDF.
func TestReportInBrowser(t *testing.T) {
	if _, err := os.Stat(chromiumPath); err != nil {
		t.Skipf("chromium not found at %s (apt-get install chromium to run this test)", chromiumPath)
	}
	if testing.Short() {
		t.Skip("browser test skipped in -short mode")
	}
	dir := t.TempDir()
	path := filepath.Join(dir, "report.html")
	r := demoReport(t)
	if err := WriteReportFile(path, r); err != nil {
		t.Fatal(err)
	}
	opts := append(chromedp.DefaultExecAllocatorOptions[:],
		chromedp.ExecPath(chromiumPath),
		chromedp.NoSandbox,
		chromedp.DisableGPU,
		chromedp.Flag("headless", true),
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.Flag("no-first-run", true),
		chromedp.Flag("disable-quic", true),
		chromedp.UserDataDir(filepath.Join(dir, "profile")),
	)
	actx, cancelA := chromedp.NewExecAllocator(context.Background(), opts...)
	defer cancelA()
	var mu sync.Mutex
	var problems []string
	ctx, cancel := chromedp.NewContext(actx, chromedp.WithListener(func(ev any) {
		mu.Lock()
		defer mu.Unlock()
		switch e := ev.(type) {
		case *runtime.EventConsoleAPICalled:
			if e.Type == runtime.ConsoleAPICalledTypeError || e.Type == runtime.ConsoleAPICalledTypeAssert {
				problems = append(problems, fmt.Sprintf("console %s", e.Type))
			}
		case *runtime.EventExceptionThrown:
			problems = append(problems, "exception: "+e.ExceptionDetails.Text)
		}
	}))
	defer cancel()
	ctx, cancelT := context.WithTimeout(ctx, 90*time.Second)
	defer cancelT()

	if err := chromedp.Do(ctx, chromedp.EmulateViewport(1000, 1250), chromedp.Navigate("file://"+path)); err != nil {
		t.Fatalf("loading the report: %v", err)
	}
	sizes, err := chromedp.Run(ctx, chromedp.Evaluate[[]float64](
		`Array.from(document.querySelectorAll("svg")).map(s => { const r = s.getBoundingClientRect(); return r.width * r.height; })`))
	if err != nil {
		t.Fatal(err)
	}
	if len(sizes) != len(r.Figures) {
		t.Errorf("%d svg elements, want %d", len(sizes), len(r.Figures))
	}
	for i, a := range sizes {
		if !(a > 1000) {
			t.Errorf("figure %d has area %g px²", i, a)
		}
	}
	cells, err := chromedp.Run(ctx, chromedp.Evaluate[[]string](
		`Array.from(document.querySelectorAll("table.headline tbody td")).map(td => td.textContent.trim())`))
	if err != nil {
		t.Fatal(err)
	}
	got := strings.Join(cells, "|")
	for _, h := range r.Headline {
		if !strings.Contains(got, h.Label+"|"+h.Value+"|"+h.Unit) {
			t.Errorf("headline table %q lacks %s = %s %s", got, h.Label, h.Value, h.Unit)
		}
	}
	if *screenshot != "" {
		png, err := chromedp.Run(ctx, chromedp.CaptureScreenshot())
		if err != nil {
			t.Fatal(err)
		}
		if err := atomicfile.Write(*screenshot, png); err != nil {
			t.Fatal(err)
		}
	}
	pdf, err := chromedp.Run(ctx, chromedp.PrintToPDF())
	if err != nil {
		t.Fatal(err)
	}
	if len(pdf) < 1000 || !bytes.HasPrefix(pdf, []byte("%PDF")) {
		t.Errorf("print gave %d bytes starting %.8q", len(pdf), pdf)
	}
	mu.Lock()
	defer mu.Unlock()
	if len(problems) > 0 {
		t.Errorf("console problems: %v", problems)
	}
}
