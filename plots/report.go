package plots

import (
	"bytes"
	_ "embed"
	"errors"
	"fmt"
	"html/template"
	"io"
	"regexp"

	"codeberg.org/sunsight/sunsight/internal/atomicfile"
)

// Report is everything the HTML design-review report shows. All text is
// escaped; only Figure.SVG, which must come from Chart.SVG, is inlined.
type Report struct {
	Title string
	// Verdict is the banner at the top: all targets met, or which failed.
	Verdict Verdict
	// Provenance is shown under the banner: date, input path and hash,
	// tool version, VCS revision, seed.
	Provenance  []Field
	GeneratedBy string // free text under the provenance (optional)
	// ScenarioRecord is the resolved scenario as text (shown verbatim).
	ScenarioRecord string
	Mounts         []MountRow
	Headline       []HeadlineRow
	// Tables are further plain tables shown after the headline and mount
	// tables (for example the estimators side by side, the sensors).
	Tables      []Table
	Figures     []Figure
	Assumptions []Assumption
	Notes       []string
}

// Verdict is the overall judgement of the run against its targets, shown as
// the banner at the top of the report.
type Verdict struct {
	// Status is "met", "failed" or "no-targets" (anything else is refused).
	Status string
	// Text is the verdict in one line ("1 of 4 targets failed: …").
	Text string
	// Failed names the failed targets, one per line of the banner.
	Failed []string
}

// Table is a plain table of text cells; every column after the first is
// aligned right (they hold figures).
type Table struct {
	Title  string
	Header []string
	Rows   [][]string
	// Note is one line under the table (what a mark or unit means).
	Note string
}

// Field is one named value of the provenance list.
type Field struct{ Name, Value string }

// MountRow is one sensor of the layout.
type MountRow struct {
	Name         string
	Kind         string
	Face         string
	AzDeg, ElDeg float64 // boresight in body axes
	HalfAngleDeg float64 // field-of-view half-angle
}

// HeadlineRow is one figure of merit. Pass is nil when there is no target.
type HeadlineRow struct {
	Label  string
	Value  string
	Unit   string
	Target string
	Pass   *bool
	// Flag, when set, warns that the value is valid but misleading (for
	// example an estimator valid most of the time with errors beyond the
	// false-sun bound); shown under the label.
	Flag string
}

// Figure is one inline figure; SVG is the output of Chart.SVG (render the
// chart with Chart.Uncaptioned and give its caption as Lines, so the text
// reflows as HTML).
type Figure struct {
	Title   string
	Caption string   // one paragraph of caption (optional)
	Lines   []string // further caption paragraphs (Caption.Lines)
	// Shape is "tall" for a figure of stacked panels (printed a little
	// taller), empty otherwise.
	Shape string
	SVG   []byte
}

// Assumption names a model and its published source.
type Assumption struct {
	Model  string
	Source string
}

//go:embed report.html.tmpl
var reportTemplate string

//go:embed report.css
var reportCSS string

var reportTmpl = template.Must(template.New("report").Funcs(template.FuncMap{
	"css":   func() template.CSS { return template.CSS(reportCSS) },
	"deg":   func(v float64) string { return fmt.Sprintf("%.1f", v) },
	"deref": func(b *bool) bool { return *b },
	"inc":   func(i int) int { return i + 1 },
}).Parse(reportTemplate))

var (
	xmlDecl    = regexp.MustCompile(`^\s*<\?xml[^>]*\?>\s*`)
	xmlComment = regexp.MustCompile(`^\s*<!--.*?-->\s*`)
)

// inlineSVG strips the XML declaration and generator comment from our own
// vgsvg output and checks that what is left is a single svg element.
func inlineSVG(b []byte) (template.HTML, error) {
	b = xmlDecl.ReplaceAll(b, nil)
	b = xmlComment.ReplaceAll(b, nil)
	b = bytes.TrimSpace(b)
	if !bytes.HasPrefix(b, []byte("<svg")) || !bytes.HasSuffix(b, []byte("</svg>")) {
		return "", errors.New("plots: not an SVG document from Chart.SVG")
	}
	if bytes.Contains(bytes.ToLower(b), []byte("<script")) {
		return "", errors.New("plots: the SVG holds a script")
	}
	return template.HTML(b), nil
}

type reportView struct {
	Report
	Figs []figView
}

type figView struct {
	Figure
	Inline template.HTML
}

// WriteReport writes the self-contained HTML report (no scripts, no remote
// assets) to w.
func WriteReport(w io.Writer, r Report) error {
	if r.Title == "" {
		return fmt.Errorf("plots: report: Title is empty; give the report a title")
	}
	switch r.Verdict.Status {
	case "", "met", "failed", "no-targets":
	default:
		return fmt.Errorf("plots: report: Verdict.Status %q is not one of met, failed, no-targets", r.Verdict.Status)
	}
	v := reportView{Report: r}
	for i, f := range r.Figures {
		h, err := inlineSVG(f.SVG)
		if err != nil {
			return fmt.Errorf("plots: report: Figures[%d] (%q): %w", i, f.Title, err)
		}
		v.Figs = append(v.Figs, figView{Figure: f, Inline: h})
	}
	var buf bytes.Buffer
	if err := reportTmpl.Execute(&buf, v); err != nil {
		return fmt.Errorf("plots: report: %w", err)
	}
	_, err := w.Write(buf.Bytes())
	return err
}

// WriteReportFile writes the report to path through a temporary file in
// the same folder, renamed into place.
func WriteReportFile(path string, r Report) error {
	var buf bytes.Buffer
	if err := WriteReport(&buf, r); err != nil {
		return err
	}
	return atomicfile.Write(path, buf.Bytes())
}
