package headless

import (
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var (
	measure = flag.String("measure", "", "comma-separated HTML files: print each on A4 and Letter and log size and page counts")
	keepPDF = flag.Bool("keep-pdf", false, "with -measure, write FILE.a4.pdf and FILE.letter.pdf beside each file")
	shots   = flag.String("shots", "", "with -measure, write the first screen of each file at 1400 px (desktop) and 390 px (phone) into this folder as report-STEM-desktop.png and report-STEM-phone.png")
)

// TestMeasure prints given reports and logs their size and page counts
// (go test ./internal/headless -run Measure -v -measure a.html,b.html).
func TestMeasure(t *testing.T) {
	if *measure == "" {
		t.Skip("use -measure FILES")
	}
	if !Available() {
		t.Skip("no chromium")
	}
	b, err := Open(t.TempDir())
	if err != nil {
		t.Fatal(err)
	}
	defer b.Close()
	for _, f := range strings.Split(*measure, ",") {
		st, err := os.Stat(f)
		if err != nil {
			t.Fatal(err)
		}
		stem := strings.TrimSuffix(filepath.Base(f), ".html")
		if *shots != "" {
			for _, v := range []struct {
				name string
				w, h int64
			}{{"phone", 390, 844}, {"desktop", 1400, 1000}} {
				if err := b.Load(f, v.w, v.h); err != nil {
					t.Fatal(err)
				}
				png, err := b.Viewport()
				if err != nil {
					t.Fatal(err)
				}
				if err := os.WriteFile(filepath.Join(*shots, "report-"+stem+"-"+v.name+".png"), png, 0o644); err != nil {
					t.Fatal(err)
				}
			}
		}
		if err := b.Load(f, 1400, 900); err != nil {
			t.Fatal(err)
		}
		var pages []int
		for _, p := range []Paper{A4, Letter} {
			pdf, err := b.PDF(p)
			if err != nil {
				t.Fatal(err)
			}
			pages = append(pages, Pages(pdf))
			if *keepPDF {
				if err := os.WriteFile(strings.TrimSuffix(f, ".html")+"."+strings.ToLower(p.Name)+".pdf", pdf, 0o644); err != nil {
					t.Fatal(err)
				}
			}
		}
		t.Logf("%s: %d bytes, %d A4 pages, %d Letter pages", f, st.Size(), pages[0], pages[1])
	}
}

// A known page count: a page of three forced page breaks prints on four
// pages (closed form).
func TestPagesCounted(t *testing.T) {
	if !Available() || testing.Short() {
		t.Skip("no chromium or -short")
	}
	dir := t.TempDir()
	f := dir + "/p.html"
	html := `<!DOCTYPE html><html><body>` + strings.Repeat(`<p style="break-after:page">x</p>`, 3) + `<p>y</p></body></html>`
	if err := os.WriteFile(f, []byte(html), 0o644); err != nil {
		t.Fatal(err)
	}
	b, err := Open(dir)
	if err != nil {
		t.Fatal(err)
	}
	defer b.Close()
	if err := b.Load(f, 800, 600); err != nil {
		t.Fatal(err)
	}
	pdf, err := b.PDF(A4)
	if err != nil {
		t.Fatal(err)
	}
	if n := Pages(pdf); n != 4 {
		t.Errorf("%d pages, want 4", n)
	}
}
