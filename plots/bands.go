package plots

import (
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Interval is a span [Start, End] on a figure's x axis, in the same unit as
// the series it goes with (seconds for a Timeline, days for a YearView).
type Interval struct{ Start, End float64 }

// bands shades intervals over the full height of a panel.
type bands struct {
	Spans []Interval
	Fill  color.Color
}

func (b bands) Plot(c draw.Canvas, p *plot.Plot) {
	tx, _ := p.Transforms(&c)
	for _, s := range b.Spans {
		x0, x1 := tx(s.Start), tx(s.End)
		x0 = max(x0, c.Min.X)
		x1 = min(x1, c.Max.X)
		if x1 <= x0 {
			continue
		}
		c.FillPolygon(b.Fill, []vg.Point{{X: x0, Y: c.Min.Y}, {X: x1, Y: c.Min.Y}, {X: x1, Y: c.Max.Y}, {X: x0, Y: c.Max.Y}})
	}
}

// vline draws a vertical line at X across a panel.
type vline struct {
	X     float64
	Style draw.LineStyle
}

func (v vline) Plot(c draw.Canvas, p *plot.Plot) {
	tx, _ := p.Transforms(&c)
	x := tx(v.X)
	if x < c.Min.X || x > c.Max.X {
		return
	}
	c.StrokeLine2(v.Style, x, c.Min.Y, x, c.Max.Y)
}

// DataRange makes sure the marked value is inside the axis range.
func (v vline) DataRange() (xmin, xmax, ymin, ymax float64) {
	return v.X, v.X, math.Inf(1), math.Inf(-1)
}

// hline draws a horizontal line at Y across a panel.
type hline struct {
	Y     float64
	Style draw.LineStyle
}

func (h hline) Plot(c draw.Canvas, p *plot.Plot) {
	_, ty := p.Transforms(&c)
	y := ty(h.Y)
	if y < c.Min.Y || y > c.Max.Y {
		return
	}
	c.StrokeLine2(h.Style, c.Min.X, y, c.Max.X, y)
}

func (h hline) DataRange() (xmin, xmax, ymin, ymax float64) {
	return math.Inf(1), math.Inf(-1), h.Y, h.Y
}

func (h hline) Thumbnail(c *draw.Canvas) {
	y := (c.Min.Y + c.Max.Y) / 2
	c.StrokeLine2(h.Style, c.Min.X, y, c.Max.X, y)
}

func (v vline) Thumbnail(c *draw.Canvas) {
	y := (c.Min.Y + c.Max.Y) / 2
	c.StrokeLine2(v.Style, c.Min.X, y, c.Max.X, y)
}

// runs turns a boolean mask over x into intervals where it is true, each
// stretched half a step either side.
func runs(x []float64, mask []bool) []Interval {
	var out []Interval
	n := min(len(x), len(mask))
	half := func(i, j int) float64 {
		if j < 0 || j >= n {
			return 0
		}
		return (x[j] - x[i]) / 2
	}
	for i := 0; i < n; i++ {
		if !mask[i] {
			continue
		}
		j := i
		for j+1 < n && mask[j+1] {
			j++
		}
		lo := x[i] + half(i, i-1)
		if i == 0 {
			lo = x[i]
		}
		hi := x[j] + half(j, j+1)
		if j == n-1 {
			hi = x[j]
		}
		out = append(out, Interval{lo, hi})
		i = j
	}
	return out
}

// Target is a requirement drawn on a figure: a line at Value (in the axis
// unit of the figure) with its verdict, e.g. Label "≤ 5.00°", Got "15.29°",
// Pass false.
type Target struct {
	Value float64
	Label string // the requirement as text
	Got   string // the run's value as text
	Pass  bool
}

// text is the legend entry of the target: "target ≤ 5.00°: FAIL (15.29°)".
func (t Target) text() string {
	v := "pass"
	if !t.Pass {
		v = "FAIL"
	}
	s := "target " + t.Label + ": " + v
	if t.Got != "" {
		s += " (" + t.Got + ")"
	}
	return s
}

// style is the line of a target: black, long dashes and dots (no series
// uses it); the verdict is in the legend text.
func (t Target) style() draw.LineStyle {
	return draw.LineStyle{Color: colBlack, Width: 2.2, Dashes: []vg.Length{10, 3, 2, 3}}
}
