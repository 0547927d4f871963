package plots

import (
	"fmt"
	"image/color"
	"math"
	"sort"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// SkyMap is the body-frame sphere gridded in azimuth and elevation, with the
// number of sensors that see the sun from each direction.
//
// Azimuth is measured in the body X–Y plane from +X toward +Y (any range;
// it is wrapped to −180…180°), elevation from the X–Y plane toward +Z.
type SkyMap struct {
	AzDeg  []float64 // cell centres, increasing
	ElDeg  []float64 // cell centres, increasing, within −90…90
	Counts [][]int   // Counts[i][j]: sensors seeing direction (ElDeg[i], AzDeg[j])
	// Boresights are drawn as rings with their names.
	Boresights []Marker
	// SunTrack is the sun's body-frame direction over the run (sunlit
	// samples only); drawn as small dots.
	SunTrack []Point
}

// Marker is a named body-frame direction.
type Marker struct {
	Name         string
	AzDeg, ElDeg float64
}

// Point is a body-frame direction.
type Point struct{ AzDeg, ElDeg float64 }

// Coverage classes of the sky map legend: 0, 1, 2, 3 and 4 or more sensors.
var coverageColours = []color.Color{
	color.RGBA{250, 215, 205, 255}, // 0: blind (pale red, stands out)
	color.RGBA{198, 219, 239, 255}, // 1
	color.RGBA{107, 174, 214, 255}, // 2
	color.RGBA{33, 113, 181, 255},  // 3
	color.RGBA{8, 48, 107, 255},    // 4+
}

var coverageLabels = []string{"0 sensors", "1 sensor", "2 sensors", "3 sensors", "4+ sensors"}

func coverageClass(n int) int { return max(0, min(n, 4)) }

func (f SkyMap) validate() error {
	if len(f.AzDeg) == 0 || len(f.ElDeg) == 0 {
		return fmt.Errorf("plots: sky map: AzDeg and ElDeg must not be empty")
	}
	if len(f.Counts) != len(f.ElDeg) {
		return fmt.Errorf("plots: sky map: Counts has %d rows, want one per ElDeg (%d)", len(f.Counts), len(f.ElDeg))
	}
	for i, row := range f.Counts {
		if len(row) != len(f.AzDeg) {
			return fmt.Errorf("plots: sky map: Counts[%d] has %d cells, want one per AzDeg (%d)", i, len(row), len(f.AzDeg))
		}
	}
	for i, v := range f.ElDeg {
		if !finite(v) || v < -90 || v > 90 || (i > 0 && v <= f.ElDeg[i-1]) {
			return fmt.Errorf("plots: sky map: ElDeg[%d] = %g; elevations must increase within −90…90", i, v)
		}
	}
	for i, v := range f.AzDeg {
		if !finite(v) || (i > 0 && v <= f.AzDeg[i-1]) {
			return fmt.Errorf("plots: sky map: AzDeg[%d] = %g; azimuths must be finite and increase", i, v)
		}
	}
	return nil
}

// edges returns cell edges half-way between centres, the outer ones half a
// spacing beyond the end centres (one centre: a 1° wide cell).
func edges(c []float64) []float64 {
	e := make([]float64, len(c)+1)
	for i := 1; i < len(c); i++ {
		e[i] = (c[i-1] + c[i]) / 2
	}
	h0, h1 := 0.5, 0.5
	if len(c) > 1 {
		h0 = (c[1] - c[0]) / 2
		h1 = (c[len(c)-1] - c[len(c)-2]) / 2
	}
	e[0] = c[0] - h0
	e[len(c)] = c[len(c)-1] + h1
	return e
}

// wrapAz wraps degrees into [−180, 180).
func wrapAz(a float64) float64 {
	a = math.Mod(a+180, 360)
	if a < 0 {
		a += 360
	}
	return a - 180
}

// skyCell is one projected cell: a polygon in Hammer coordinates and its class.
type skyCell struct {
	Poly  []xyPt
	Class int
}

type xyPt struct{ X, Y float64 }

func hammerDeg(azDeg, elDeg float64) xyPt {
	x, y := Hammer(azDeg*math.Pi/180, elDeg*math.Pi/180)
	return xyPt{x, y}
}

// cellPolygon outlines the cell [a0,a1]×[e0,e1] (deg, a within ±180) with
// n points per side, so the curved projected edges are followed.
func cellPolygon(a0, a1, e0, e1 float64, n int) []xyPt {
	pts := make([]xyPt, 0, 4*n)
	for k := 0; k < n; k++ {
		pts = append(pts, hammerDeg(a0+(a1-a0)*float64(k)/float64(n), e0))
	}
	for k := 0; k < n; k++ {
		pts = append(pts, hammerDeg(a1, e0+(e1-e0)*float64(k)/float64(n)))
	}
	for k := 0; k < n; k++ {
		pts = append(pts, hammerDeg(a1-(a1-a0)*float64(k)/float64(n), e1))
	}
	for k := 0; k < n; k++ {
		pts = append(pts, hammerDeg(a0, e1-(e1-e0)*float64(k)/float64(n)))
	}
	return pts
}

// skyPlotter draws the projected sphere with its own equal-scale transform
// (the Hammer ellipse must not be stretched, or equal areas would not look
// equal).
type skyPlotter struct {
	Cells      []skyCell
	Track      []xyPt
	Boresights []Marker
	Graticule  [][]xyPt
}

// azRun is a span of azimuth [a0, a1] (deg) of one coverage class.
type azRun struct {
	a0, a1 float64
	class  int
}

// mergeRuns sorts the spans of one row and joins touching spans of the same
// class.
func mergeRuns(row []azRun) []azRun {
	sort.Slice(row, func(i, j int) bool { return row[i].a0 < row[j].a0 })
	var out []azRun
	for _, r := range row {
		if k := len(out) - 1; k >= 0 && out[k].class == r.class && math.Abs(out[k].a1-r.a0) < 1e-9 {
			out[k].a1 = r.a1
			continue
		}
		out = append(out, r)
	}
	return out
}

func newSkyPlotter(f SkyMap) *skyPlotter {
	s := &skyPlotter{Boresights: f.Boresights}
	ae, ee := edges(f.AzDeg), edges(f.ElDeg)
	for i := range f.ElDeg {
		e0, e1 := math.Max(ee[i], -90), math.Min(ee[i+1], 90)
		var row []azRun
		for j := range f.AzDeg {
			c := wrapAz(f.AzDeg[j])
			lo, hi := c-(f.AzDeg[j]-ae[j]), c+(ae[j+1]-f.AzDeg[j])
			// A cell that crosses ±180° is drawn in two pieces.
			for _, shift := range []float64{-360, 0, 360} {
				a0, a1 := math.Max(lo+shift, -180), math.Min(hi+shift, 180)
				if a0 < a1 {
					row = append(row, azRun{a0, a1, coverageClass(f.Counts[i][j])})
				}
			}
		}
		// Neighbouring cells of one class are drawn as one polygon, which
		// keeps the SVG small (a 2° map has 16 200 cells).
		for _, r := range mergeRuns(row) {
			n := max(6, int((r.a1-r.a0)/2))
			s.Cells = append(s.Cells, skyCell{Poly: cellPolygon(r.a0, r.a1, e0, e1, n), Class: r.class})
		}
	}
	for _, p := range f.SunTrack {
		if finite(p.AzDeg) && finite(p.ElDeg) {
			s.Track = append(s.Track, hammerDeg(wrapAz(p.AzDeg), p.ElDeg))
		}
	}
	for a := -180.0; a <= 180; a += 30 {
		var l []xyPt
		for e := -90.0; e <= 90; e += 2 {
			l = append(l, hammerDeg(a, e))
		}
		s.Graticule = append(s.Graticule, l)
	}
	for e := -60.0; e <= 60; e += 30 {
		var l []xyPt
		for a := -180.0; a <= 180; a += 2 {
			l = append(l, hammerDeg(a, e))
		}
		s.Graticule = append(s.Graticule, l)
	}
	return s
}

func (s *skyPlotter) Plot(c draw.Canvas, _ *plot.Plot) {
	const xr, yr = 2 * math.Sqrt2, math.Sqrt2
	w, h := c.Max.X-c.Min.X, c.Max.Y-c.Min.Y
	scale := math.Min(float64(w)/(2*xr*1.04), float64(h)/(2*yr*1.08))
	cx, cy := (c.Min.X+c.Max.X)/2, (c.Min.Y+c.Max.Y)/2
	tr := func(p xyPt) vg.Point {
		return vg.Point{X: cx + vg.Length(p.X*scale), Y: cy + vg.Length(p.Y*scale)}
	}
	poly := func(ps []xyPt) []vg.Point {
		out := make([]vg.Point, len(ps))
		for i, p := range ps {
			out[i] = tr(p)
		}
		return out
	}
	for _, cell := range s.Cells {
		ps := poly(cell.Poly)
		c.FillPolygon(coverageColours[cell.Class], ps)
		// A hairline of the same colour hides anti-aliasing seams.
		c.StrokeLines(draw.LineStyle{Color: coverageColours[cell.Class], Width: 0.4}, append(ps, ps[0]))
	}
	grid := draw.LineStyle{Color: color.RGBA{120, 120, 120, 255}, Width: 0.6, Dashes: []vg.Length{2, 2}}
	for _, l := range s.Graticule {
		c.StrokeLines(grid, poly(l))
	}
	var rim []xyPt
	for k := 0; k <= 360; k++ {
		t := float64(k) * math.Pi / 180
		rim = append(rim, xyPt{xr * math.Cos(t), yr * math.Sin(t)})
	}
	c.StrokeLines(draw.LineStyle{Color: colBlack, Width: 1}, poly(rim))

	lab := text.Style{Color: color.RGBA{40, 40, 40, 255}, Font: font.From(plot.DefaultFont, tickSize),
		XAlign: draw.XCenter, YAlign: draw.YCenter, Handler: plot.DefaultTextHandler}
	halo := func(sty text.Style, pt vg.Point, txt string) {
		r := sty.Rectangle(txt)
		r.Min = r.Min.Add(pt).Sub(vg.Point{X: 1.5, Y: 1})
		r.Max = r.Max.Add(pt).Add(vg.Point{X: 1.5, Y: 1})
		c.FillPolygon(color.NRGBA{255, 255, 255, 190}, []vg.Point{r.Min, {X: r.Max.X, Y: r.Min.Y}, r.Max, {X: r.Min.X, Y: r.Max.Y}})
		c.FillText(sty, pt, txt)
	}
	below := lab
	below.YAlign = draw.YTop
	for a := -150.0; a <= 150; a += 30 {
		halo(below, tr(hammerDeg(a, 0)).Sub(vg.Point{Y: 9}), fmt.Sprintf("%.0f°", a))
	}
	labR := lab
	labR.XAlign = draw.XRight
	for e := -60.0; e <= 60; e += 30 {
		if e == 0 {
			continue
		}
		p := tr(hammerDeg(-180, e))
		halo(labR, vg.Point{X: p.X - 4, Y: p.Y}, fmt.Sprintf("%+.0f°", e))
	}
	c.FillText(labR, tr(xyPt{0, yr}).Sub(vg.Point{X: 22, Y: 4}), "+90°")
	c.FillText(labR, tr(xyPt{0, -yr}).Sub(vg.Point{X: 22, Y: -4}), "−90°")

	sun := draw.GlyphStyle{Color: colOrange, Radius: 1.6, Shape: draw.CircleGlyph{}}
	for _, p := range s.Track {
		c.DrawGlyph(sun, tr(p))
	}
	ring := draw.GlyphStyle{Color: colBlack, Radius: 5, Shape: draw.CrossGlyph{}}
	name := lab
	name.XAlign = draw.XLeft
	name.Font.Size = legendSize
	for _, b := range s.Boresights {
		p := tr(hammerDeg(wrapAz(b.AzDeg), b.ElDeg))
		c.DrawGlyph(draw.GlyphStyle{Color: color.White, Radius: 6.5, Shape: draw.CircleGlyph{}}, p)
		c.DrawGlyph(ring, p)
		halo(name, vg.Point{X: p.X + 8, Y: p.Y + 7}, b.Name)
	}
}

// glyphThumb is a legend thumbnail showing one glyph.
type glyphThumb struct{ g draw.GlyphStyle }

func (t glyphThumb) Thumbnail(c *draw.Canvas) { c.DrawGlyph(t.g, c.Center()) }

// Plot draws the sky map in the Hammer equal-area projection.
func (f SkyMap) Plot(caption Caption) (*Chart, error) {
	if err := f.validate(); err != nil {
		return nil, err
	}
	p := newPlot("Sun visibility over the body-frame sphere (Hammer equal-area)",
		"body azimuth (deg, from +X toward +Y); labels on the equator", "elevation (deg)")
	p.X.Tick.Marker = plot.ConstantTicks(nil)
	p.Y.Tick.Marker = plot.ConstantTicks(nil)
	p.X.LineStyle.Width = 0
	p.Y.LineStyle.Width = 0
	p.Y.Label.Text = ""
	p.X.Label.Text = "azimuth from +X toward +Y (deg, on the equator); elevation (deg, on the left rim)"
	sky := newSkyPlotter(f)
	p.Add(sky)
	for i, l := range coverageLabels {
		p.Legend.Add(l, swatch{coverageColours[i]})
	}
	if len(f.SunTrack) > 0 {
		p.Legend.Add("sun track (sunlit)", glyphThumb{draw.GlyphStyle{Color: colOrange, Radius: 3, Shape: draw.CircleGlyph{}}})
	}
	if len(f.Boresights) > 0 {
		p.Legend.Add("sensor boresight", glyphThumb{draw.GlyphStyle{Color: colBlack, Radius: 5, Shape: draw.CrossGlyph{}}})
	}
	p.Legend.Left = false
	p.Legend.YOffs = 0
	p.Legend.XOffs = 0
	p.Legend.Padding = 2
	return &Chart{Panels: []*plot.Plot{p}, Caption: caption, sky: sky}, nil
}
