package plots

import (
	"bytes"
	"fmt"
	"image/color"
	"math"
	"path/filepath"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"

	"codeberg.org/sunsight/sunsight/internal/atomicfile"
)

// Caption is the text printed under every figure. The caller fills it so
// that a figure cut out of the report still says what it shows.
type Caption struct {
	Scenario    string // e.g. "500 km SSO, LTAN 10:30, nadir pointing, 3 orbits from 2025-06-21"
	Model       string // e.g. "two-body + J2, low-precision sun, conical shadow, albedo 0.3 uniform"
	Assumptions string // e.g. "ideal cosine sensors, no sensor noise"
}

// Lines returns the non-empty caption lines, each labelled.
func (c Caption) Lines() []string {
	var out []string
	add := func(label, s string) {
		if s = strings.TrimSpace(s); s != "" {
			out = append(out, label+s)
		}
	}
	add("Scenario: ", c.Scenario)
	add("Model: ", c.Model)
	add("Assumptions: ", c.Assumptions)
	return out
}

// Chart is a finished figure: one or more plots stacked top to bottom,
// sharing a width, with the caption under them.
type Chart struct {
	// Panels are drawn top to bottom with plot.Align.
	Panels []*plot.Plot
	// Caption is wrapped to the chart width under the panels.
	Caption Caption
	// Width and Height default to DefaultWidth × DefaultHeight.
	Width, Height vg.Length

	// drawn records the data handed to each plotter, for tests to read back.
	drawn []drawnSeries
	sky   *skyPlotter
	// DPI is the resolution of PNG output; 0 means DefaultDPI.
	DPI int
}

// DefaultDPI is the PNG resolution: twice the 96 dpi of a screen.
const DefaultDPI = 192

func (c *Chart) dpi() int {
	if c.DPI > 0 {
		return c.DPI
	}
	return DefaultDPI
}

// drawnSeries is the data of one plotter as drawn (after unit scaling).
type drawnSeries struct {
	Panel int
	Label string
	XYs   plotter.XYs
}

// Figure sizes and text sizes chosen to stay legible on a projector
// (10 × 6 in with labels of 14 pt; common practice, no source).
const (
	DefaultWidth  = 10 * vg.Inch
	DefaultHeight = 6 * vg.Inch

	titleSize   = 16
	labelSize   = 14
	tickSize    = 12
	legendSize  = 12
	captionSize = 11
)

// Palette (colour-blind safe, Okabe & Ito 2008 "Color Universal Design",
// from memory).
var (
	colBlack    = color.RGBA{0, 0, 0, 255}
	colOrange   = color.RGBA{230, 159, 0, 255}
	colSky      = color.RGBA{86, 180, 233, 255}
	colGreen    = color.RGBA{0, 158, 115, 255}
	colBlue     = color.RGBA{0, 114, 178, 255}
	colVermil   = color.RGBA{213, 94, 0, 255}
	colPurple   = color.RGBA{204, 121, 167, 255}
	colUmbra    = color.NRGBA{60, 60, 60, 90}
	colPenumbra = color.NRGBA{150, 150, 150, 60}
	colSeason   = color.NRGBA{240, 228, 66, 110}
	colRun      = color.NRGBA{0, 114, 178, 70}
	colGrid     = color.RGBA{200, 200, 200, 255}
)

var seriesColours = []color.Color{colBlue, colVermil, colGreen, colOrange, colPurple, colSky, colBlack}

func seriesColour(i int) color.Color { return seriesColours[i%len(seriesColours)] }

// One font family for every figure and the report page: Liberation Sans
// (metric-compatible with Arial), named in SVG with fallbacks.
func init() { plot.DefaultFont = font.Font{Typeface: "Liberation", Variant: "Sans"} }

// svgFontFamily is the family vgsvg writes and the same with fallbacks.
var svgFontFamily = [2][]byte{[]byte("font-family:Liberation Sans;"), []byte("font-family:'Liberation Sans',Arial,Helvetica,sans-serif;")}

// newPlot returns a plot with the project's text sizes and a light grid.
func newPlot(title, xLabel, yLabel string) *plot.Plot {
	p := plot.New()
	p.Title.Text = title
	p.Title.TextStyle.Font.Size = titleSize
	p.Title.Padding = 6
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Label.TextStyle.Font.Size = labelSize
		a.Tick.Label.Font.Size = tickSize
		a.Tick.Marker = niceTicks{}
	}
	p.X.Label.Text = xLabel
	p.Y.Label.Text = yLabel
	p.Legend.TextStyle.Font.Size = legendSize
	p.Legend.Top = true
	g := plotter.NewGrid()
	g.Vertical.Color = colGrid
	g.Horizontal.Color = colGrid
	p.Add(g)
	return p
}

func (c *Chart) size() (vg.Length, vg.Length) {
	w, h := c.Width, c.Height
	if w <= 0 {
		w = DefaultWidth
	}
	if h <= 0 {
		h = DefaultHeight
	}
	return w, h
}

func captionStyle() text.Style {
	return text.Style{
		Color:   colBlack,
		Font:    font.From(plot.DefaultFont, captionSize),
		XAlign:  draw.XLeft,
		YAlign:  draw.YTop,
		Handler: plot.DefaultTextHandler,
	}
}

// wrap breaks s into lines no wider than w in style sty.
func wrap(s string, sty text.Style, w vg.Length) []string {
	var lines []string
	cur := ""
	for _, word := range strings.Fields(s) {
		try := word
		if cur != "" {
			try = cur + " " + word
		}
		if cur != "" && sty.Width(try) > w {
			lines = append(lines, cur)
			cur = "    " + word
			continue
		}
		cur = try
	}
	if cur != "" {
		lines = append(lines, cur)
	}
	return lines
}

// Draw draws the chart onto dc.
func (c *Chart) Draw(dc draw.Canvas) {
	const pad = 8
	sty := captionStyle()
	w := dc.Max.X - dc.Min.X
	var lines []string
	for _, l := range c.Caption.Lines() {
		lines = append(lines, wrap(l, sty, w-2*pad)...)
	}
	lineH := sty.Height("Ag") * 1.15
	capH := vg.Length(0)
	if len(lines) > 0 {
		capH = lineH*vg.Length(len(lines)) + 2*pad
	}
	y := dc.Min.Y + capH - pad
	for _, l := range lines {
		dc.FillText(sty, vg.Point{X: dc.Min.X + pad, Y: y}, l)
		y -= lineH
	}
	if capH > 0 {
		rule := draw.LineStyle{Color: colGrid, Width: 1}
		dc.StrokeLine2(rule, dc.Min.X+pad, dc.Min.Y+capH, dc.Max.X-pad, dc.Min.Y+capH)
	}
	area := draw.Crop(dc, 0, 0, capH, 0)
	if len(c.Panels) == 0 {
		return
	}
	// Legends go in a column right of the panels, outside the data: each
	// panel's legend is taken out while the panel draws and drawn beside
	// it, then put back (a chart may be drawn more than once).
	legends := make([]plot.Legend, len(c.Panels))
	var lw vg.Length
	if c.sky == nil {
		for i, p := range c.Panels {
			r := p.Legend.Rectangle(area)
			if w := r.Max.X - r.Min.X; w > 0 {
				legends[i] = p.Legend
				lw = max(lw, w)
			}
		}
	}
	if lw > 0 {
		lw += 16
		for i, p := range c.Panels {
			if legends[i].TextStyle.Font.Size > 0 {
				p.Legend = plot.NewLegend()
				defer func(p *plot.Plot, l plot.Legend) { p.Legend = l }(p, legends[i])
			}
		}
	}
	panels := draw.Crop(area, 0, -lw, 0, 0)
	rows := make([][]*plot.Plot, len(c.Panels))
	for i, p := range c.Panels {
		rows[i] = []*plot.Plot{p}
	}
	t := draw.Tiles{Rows: len(rows), Cols: 1, PadTop: 4, PadBottom: 4, PadLeft: 4, PadRight: 12, PadY: 10}
	cs := plot.Align(rows, t, panels)
	for i, p := range c.Panels {
		p.Draw(cs[i][0])
		if legends[i].TextStyle.Font.Size > 0 {
			l := legends[i]
			l.Left, l.Top, l.XOffs, l.YOffs = true, true, 0, -float64ToLen(l.TextStyle.Font.Size)*1.6
			box := draw.Canvas{Canvas: dc.Canvas, Rectangle: vg.Rectangle{
				Min: vg.Point{X: area.Max.X - lw + 6, Y: cs[i][0].Min.Y}, Max: vg.Point{X: area.Max.X, Y: cs[i][0].Max.Y}}}
			l.Draw(box)
		}
	}
}

func float64ToLen(v vg.Length) vg.Length { return v }

// Uncaptioned returns a copy of the chart without its drawn caption, for a
// page that sets the caption as text beside the figure.
func (c *Chart) Uncaptioned() *Chart {
	d := *c
	d.Caption = Caption{}
	return &d
}

// Formats lists the file formats Save and Encode accept.
var Formats = []string{"png", "svg", "pdf"}

// Encode renders the chart in format "png", "svg" or "pdf".
func (c *Chart) Encode(format string) ([]byte, error) {
	format = strings.ToLower(strings.TrimPrefix(format, "."))
	ok := false
	for _, f := range Formats {
		ok = ok || f == format
	}
	if !ok {
		return nil, fmt.Errorf("plots: format %q is not supported; use one of %s", format, strings.Join(Formats, ", "))
	}
	w, h := c.size()
	var cv vg.CanvasWriterTo
	if format == "png" {
		// Twice screen resolution (192 dpi), sharp on slides.
		cv = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(w, h), vgimg.UseDPI(c.dpi()))}
	} else {
		var err error
		if cv, err = draw.NewFormattedCanvas(w, h, format); err != nil {
			return nil, fmt.Errorf("plots: %w", err)
		}
	}
	c.Draw(draw.New(cv))
	var buf bytes.Buffer
	if _, err := cv.WriteTo(&buf); err != nil {
		return nil, fmt.Errorf("plots: encoding %s: %w", format, err)
	}
	b := buf.Bytes()
	if format == "svg" {
		b = bytes.ReplaceAll(b, svgFontFamily[0], svgFontFamily[1])
	}
	return b, nil
}

// SVG renders the chart as SVG, ready for Figure.SVG in a Report.
func (c *Chart) SVG() ([]byte, error) { return c.Encode("svg") }

// Save renders the chart in format ("png", "svg" or "pdf"; empty means
// the extension of path) and writes it to path through a temporary file in
// the same folder, renamed into place, so a failure never leaves a partial
// file.
func Save(c *Chart, path, format string) error {
	if format == "" {
		format = strings.TrimPrefix(filepath.Ext(path), ".")
	}
	b, err := c.Encode(format)
	if err != nil {
		return err
	}
	return atomicfile.Write(path, b)
}

// xy builds plotter.XYs from two slices, skipping pairs where either is NaN
// or infinite.
func xy(x, y []float64) plotter.XYs {
	n := min(len(x), len(y))
	out := make(plotter.XYs, 0, n)
	for i := 0; i < n; i++ {
		if finite(x[i]) && finite(y[i]) {
			out = append(out, plotter.XY{X: x[i], Y: y[i]})
		}
	}
	return out
}

// segments splits (x, y) at NaN values into runs that plotter.NewLine
// accepts (it rejects NaN).
func segments(x, y []float64) []plotter.XYs {
	var segs []plotter.XYs
	var cur plotter.XYs
	n := min(len(x), len(y))
	for i := 0; i < n; i++ {
		if !finite(x[i]) || !finite(y[i]) {
			if len(cur) > 0 {
				segs = append(segs, cur)
				cur = nil
			}
			continue
		}
		cur = append(cur, plotter.XY{X: x[i], Y: y[i]})
	}
	if len(cur) > 0 {
		segs = append(segs, cur)
	}
	return segs
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// swatch is a legend thumbnail filled with one colour.
type swatch struct{ c color.Color }

func (s swatch) Thumbnail(c *draw.Canvas) {
	pts := []vg.Point{{X: c.Min.X, Y: c.Min.Y}, {X: c.Max.X, Y: c.Min.Y}, {X: c.Max.X, Y: c.Max.Y}, {X: c.Min.X, Y: c.Max.Y}}
	c.FillPolygon(s.c, pts)
	c.StrokeLines(draw.LineStyle{Color: color.Gray{150}, Width: 0.5}, append(pts, pts[0]))
}
