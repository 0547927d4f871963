package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/internal/atomicfile"
	"codeberg.org/sunsight/sunsight/internal/headless"
)

var docsShots = flag.String("docs", "", "write desktop (1400 px) and phone (390 px) screenshots of each example's report into this folder")

// Report limits of the bundled examples (issue: a review board reads the
// report in five seconds and prints it on a few pages).
const (
	maxReportBytes = 500_000
	maxNadirPages  = 6 // A4 and Letter
)

// TestExampleReportsInBrowser runs the three bundled examples with a
// report and the JSON record, opens each report in headless Chromium and
// checks: no console error, the verdict banner says what the JSON verdict
// says, every figure is drawn with its caption, the page does not overflow
// a 390 px phone, the file is at most 500 KB, and the nadir example prints
// on at most 6 pages of A4 and of Letter.
func TestExampleReportsInBrowser(t *testing.T) {
	if !headless.Available() {
		t.Skipf("chromium not found at %s (apt-get install chromium to run this test)", headless.Path)
	}
	if testing.Short() {
		t.Skip("browser test skipped in -short mode")
	}
	dir := t.TempDir()
	b, err := headless.Open(dir)
	if err != nil {
		t.Fatal(err)
	}
	defer b.Close()
	for _, name := range []string{"nadir-6u-sso", "dawn-dusk-12u", "tumbling-3u", "mission-6u"} {
		t.Run(name, func(t *testing.T) {
			report := filepath.Join(dir, name+".html")
			var out, errb bytes.Buffer
			code := runMain([]string{"run", "-quiet", "-json", "-report", report, "../../examples/" + name + ".yaml"}, &out, &errb)
			if code != exitOK && code != exitTargetFailed {
				t.Fatalf("exit %d: %s", code, errb.String())
			}
			var rec struct {
				Targets []struct {
					Label string `json:"label"`
					Pass  bool   `json:"pass"`
				} `json:"targets"`
				Verdict verdictRecord `json:"verdict"`
			}
			if err := json.Unmarshal(out.Bytes(), &rec); err != nil {
				t.Fatalf("JSON: %v", err)
			}
			st, err := os.Stat(report)
			if err != nil {
				t.Fatal(err)
			}
			t.Logf("%s: %d bytes", name, st.Size())
			if st.Size() > maxReportBytes {
				t.Errorf("report is %d bytes, limit %d", st.Size(), maxReportBytes)
			}
			html, _ := os.ReadFile(report)
			for _, bad := range []string{"<script", `src="http`, `href="http`, "url(http", "@import", "<link"} {
				if bytes.Contains(html, []byte(bad)) {
					t.Errorf("report holds %q (must be self-contained, no script)", bad)
				}
			}

			if err := b.Load(report, 1400, 1000); err != nil {
				t.Fatal(err)
			}
			banner, err := headless.Eval[map[string]any](b, `(() => { const v = document.querySelector("#verdict");
				return v ? {status: v.dataset.status, text: v.querySelector(".verdict-text").textContent,
				items: Array.from(v.querySelectorAll("li")).map(li => li.textContent)} : {}; })()`)
			if err != nil {
				t.Fatal(err)
			}
			v := rec.Verdict
			if banner["status"] != v.Status {
				t.Errorf("banner status %v, JSON verdict %q", banner["status"], v.Status)
			}
			text, _ := banner["text"].(string)
			want := v.Text
			if v.Failed > 0 {
				want = fmt.Sprintf("%d of %d targets failed", v.Failed, v.Targets)
			}
			if !strings.Contains(text, want) {
				t.Errorf("banner %q does not say %q (JSON verdict)", text, want)
			}
			items, _ := banner["items"].([]any)
			var failed []string
			for _, tg := range rec.Targets {
				if !tg.Pass {
					failed = append(failed, tg.Label)
				}
			}
			if len(items) != len(failed) || len(failed) != v.Failed {
				t.Errorf("banner names %d failed targets, JSON %d (%v)", len(items), v.Failed, failed)
			}
			for i, l := range failed {
				if i < len(items) && !strings.HasPrefix(fmt.Sprint(items[i]), l) {
					t.Errorf("banner item %d %q does not name %q", i, items[i], l)
				}
			}

			figs, err := headless.Eval[[]map[string]float64](b, `Array.from(document.querySelectorAll("section.figure")).map(s => {
				const r = s.querySelector("svg").getBoundingClientRect();
				return {area: r.width * r.height, captions: s.querySelectorAll("figcaption p").length,
				images: Array.from(s.querySelectorAll("svg image")).filter(i => i.getBBox().width > 0).length}; })`)
			if err != nil {
				t.Fatal(err)
			}
			if len(figs) < 4 || bytes.Count(html, []byte("<svg")) != len(figs) {
				t.Errorf("%d figure sections, %d svg elements", len(figs), bytes.Count(html, []byte("<svg")))
			}
			for i, f := range figs {
				if f["area"] < 100_000 || f["captions"] < 2 {
					t.Errorf("figure %d: area %.0f px², %.0f caption paragraphs", i+1, f["area"], f["captions"])
				}
			}
			if len(figs) > 0 && figs[0]["images"] != 1 {
				t.Errorf("sky map shows %.0f raster fills, want 1", figs[0]["images"])
			}
			if *docsShots != "" {
				shot(t, b, filepath.Join(*docsShots, "report-"+name+"-desktop.png"))
			}

			if err := b.Load(report, 390, 844); err != nil {
				t.Fatal(err)
			}
			w, err := headless.Eval[float64](b, `document.documentElement.scrollWidth`)
			if err != nil {
				t.Fatal(err)
			}
			if w > 392 {
				t.Errorf("page is %.0f px wide on a 390 px phone (tables must scroll inside their box)", w)
			}
			if *docsShots != "" {
				shot(t, b, filepath.Join(*docsShots, "report-"+name+"-phone.png"))
			}

			for _, p := range []headless.Paper{headless.A4, headless.Letter} {
				pdf, err := b.PDF(p)
				if err != nil {
					t.Fatal(err)
				}
				n := headless.Pages(pdf)
				t.Logf("%s: %d %s pages", name, n, p.Name)
				if name == "nadir-6u-sso" && n > maxNadirPages {
					t.Errorf("prints on %d %s pages, limit %d", n, p.Name, maxNadirPages)
				}
			}
			if probs := b.Problems(); len(probs) > 0 {
				t.Errorf("console problems: %v", probs)
			}
		})
	}
}

// shot writes the first screen of the loaded page.
func shot(t *testing.T, b *headless.Browser, path string) {
	t.Helper()
	png, err := b.Viewport()
	if err != nil {
		t.Fatal(err)
	}
	if err := atomicfile.Write(path, png); err != nil {
		t.Fatal(err)
	}
}
