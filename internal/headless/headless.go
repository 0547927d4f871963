// Package headless opens a report in the system's headless Chromium for
// tests and screenshots: offline, a fresh profile, console errors and
// exceptions collected, full-page screenshots at a given width, printing to
// PDF on A4 or Letter paper and counting its pages.
//
// # Model
//
// A Browser drives /usr/bin/chromium through chromedp (the DevTools
// protocol). Printing uses the browser's own print layout with the page's
// @page rules; the paper size is given in inches (A4 8.27 × 11.69 in,
// Letter 8.5 × 11 in). Pages are counted from the PDF's page objects
// ("/Type /Page"), which Chromium writes uncompressed.
//
// # Assumptions
//
// Debian's chromium package is installed at /usr/bin/chromium (`.ci/run`
// installs it); callers skip their test when Available is false.
//
// # Accuracy
//
// The page count is what this Chromium prints; another browser may break
// pages elsewhere.
//
// # References
//
//   - Chrome DevTools Protocol, Page.printToPDF and Page.captureScreenshot
//     (https://chromedevtools.github.io/devtools-protocol/).
//   - ISO 216 (A4 210 × 297 mm); ANSI/ASME Y14.1 (Letter 8.5 × 11 in).
package headless

import (
	"context"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"sync"
	"time"

	"github.com/chromedp/cdproto/runtime"
	"github.com/chromedp/chromedp"
)

// Path is where the browser is looked for.
const Path = "/usr/bin/chromium"

// Available reports whether the browser is installed.
func Available() bool {
	_, err := os.Stat(Path)
	return err == nil
}

// Paper is a sheet size in inches.
type Paper struct {
	Name          string
	Width, Height float64
}

// The two papers the report is laid out for.
var (
	A4     = Paper{"A4", 210 / 25.4, 297 / 25.4}
	Letter = Paper{"Letter", 8.5, 11}
)

// Browser is one headless browser with one tab.
type Browser struct {
	ctx      context.Context
	cancel   []context.CancelFunc
	mu       sync.Mutex
	problems []string
}

// Open starts the browser with a fresh profile under dir. A start that
// fails (several test binaries may start browsers at once on a small
// machine) is tried again twice.
func Open(dir string) (*Browser, error) {
	var err error
	for try := range 3 {
		var b *Browser
		if b, err = open(filepath.Join(dir, fmt.Sprintf("profile-%d", try))); err == nil {
			return b, nil
		}
		time.Sleep(time.Duration(try+1) * time.Second)
	}
	return nil, err
}

func open(profile string) (*Browser, error) {
	opts := append(chromedp.DefaultExecAllocatorOptions[:],
		chromedp.ExecPath(Path),
		chromedp.NoSandbox,
		chromedp.DisableGPU,
		chromedp.Flag("headless", true),
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.Flag("no-first-run", true),
		chromedp.Flag("disable-quic", true),
		chromedp.Flag("disable-dev-shm-usage", true),
		chromedp.UserDataDir(profile),
	)
	b := &Browser{}
	actx, cancelA := chromedp.NewExecAllocator(context.Background(), opts...)
	ctx, cancel := chromedp.NewContext(actx, chromedp.WithListener(func(ev any) {
		b.mu.Lock()
		defer b.mu.Unlock()
		switch e := ev.(type) {
		case *runtime.EventConsoleAPICalled:
			if e.Type == runtime.ConsoleAPICalledTypeError || e.Type == runtime.ConsoleAPICalledTypeAssert {
				b.problems = append(b.problems, fmt.Sprintf("console %s", e.Type))
			}
		case *runtime.EventExceptionThrown:
			b.problems = append(b.problems, "exception: "+e.ExceptionDetails.Text)
		}
	}))
	b.ctx, b.cancel = ctx, []context.CancelFunc{cancel, cancelA}
	// The first Run starts the browser; it must not carry a timeout.
	if _, err := chromedp.Run(ctx, chromedp.Navigate("about:blank")); err != nil {
		b.Close()
		return nil, fmt.Errorf("headless: starting %s: %w", Path, err)
	}
	return b, nil
}

// Close stops the browser.
func (b *Browser) Close() {
	for _, c := range b.cancel {
		c()
	}
}

// Problems returns the console errors and exceptions seen so far.
func (b *Browser) Problems() []string {
	b.mu.Lock()
	defer b.mu.Unlock()
	return append([]string(nil), b.problems...)
}

func (b *Browser) timeout() (context.Context, context.CancelFunc) {
	return context.WithTimeout(b.ctx, 90*time.Second)
}

// Load shows the file in a viewport width CSS pixels wide (height px tall).
func (b *Browser) Load(path string, width, height int64) error {
	abs, err := filepath.Abs(path)
	if err != nil {
		return err
	}
	ctx, cancel := b.timeout()
	defer cancel()
	return chromedp.Do(ctx, chromedp.EmulateViewport(width, height), chromedp.Navigate("file://"+abs))
}

// Eval evaluates a JavaScript expression in the page and returns its value.
func Eval[T any](b *Browser, expr string) (T, error) {
	ctx, cancel := b.timeout()
	defer cancel()
	return chromedp.Run(ctx, chromedp.Evaluate[T](expr))
}

// Viewport is a PNG of the visible part of the page (the first screen).
func (b *Browser) Viewport() ([]byte, error) {
	ctx, cancel := b.timeout()
	defer cancel()
	return chromedp.Run(ctx, chromedp.CaptureScreenshot())
}

// PDF prints the page on the paper with the page's own margins.
func (b *Browser) PDF(p Paper) ([]byte, error) {
	ctx, cancel := b.timeout()
	defer cancel()
	return chromedp.Run(ctx, chromedp.PrintToPDF(chromedp.PDFPaper(chromedp.PaperSize{Width: p.Width, Height: p.Height}),
		chromedp.PDFPrintBackground()))
}

var pageObj = regexp.MustCompile(`/Type\s*/Page[^s]`)

// Pages counts the page objects of a PDF.
func Pages(pdf []byte) int { return len(pageObj.FindAllIndex(pdf, -1)) }
