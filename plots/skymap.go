package plots

import (
	"fmt"
	"image"
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
	// samples only, in time order); drawn as a dotted track from a start
	// marker to an arrow head.
	SunTrack []Point
	// Nadir is the body-frame direction of the Earth's centre over the run
	// (time order) and EarthRadiusDeg the angular radius of the Earth seen
	// from the spacecraft. A nadir that stays put is drawn as the Earth
	// disc; a moving one as its track.
	Nadir          []Point
	EarthRadiusDeg float64
	// Obstructions are named parts of the body drawn as labelled marks at
	// their direction from the body centre.
	Obstructions []Marker
}

// Marker is a named body-frame direction.
type Marker struct {
	Name         string
	AzDeg, ElDeg float64
}

// sameMarkDeg is the angle within which boresights share one mark and one
// label (names joined), so labels of sensors on one face do not overprint.
const sameMarkDeg = 1.0

// mergeMarkers joins markers less than tolDeg apart into the first of
// them, their names joined by ", " in the given order.
func mergeMarkers(ms []Marker, tolDeg float64) []Marker {
	var out []Marker
	cosTol := math.Cos(tolDeg * math.Pi / 180)
	dir := func(m Marker) [3]float64 {
		az, el := m.AzDeg*math.Pi/180, m.ElDeg*math.Pi/180
		return [3]float64{math.Cos(el) * math.Cos(az), math.Cos(el) * math.Sin(az), math.Sin(el)}
	}
next:
	for _, m := range ms {
		d := dir(m)
		for i := range out {
			o := dir(out[i])
			if d[0]*o[0]+d[1]*o[1]+d[2]*o[2] >= cosTol {
				out[i].Name += ", " + m.Name
				continue next
			}
		}
		out = append(out, m)
	}
	return out
}

// Point is a body-frame direction.
type Point struct{ AzDeg, ElDeg float64 }

// Coverage classes 0, 1, 2, 3 and 4 or more sensors. The blind class is
// near-black with vermilion hatching, so it stands out in colour and in
// greyscale; 1…4+ are a sequential ramp from dark blue to yellow with
// lightness rising by about 15 L* per class (after the viridis ramp of
// S. van der Walt and N. Smith, 2015, from memory). TestCoverageColoursDistinct
// checks every pair in normal vision, simulated deuteranopia and
// protanopia, and greyscale.
var coverageColours = []color.RGBA{
	{38, 12, 8, 255},    // 0: blind
	{59, 82, 139, 255},  // 1
	{33, 145, 140, 255}, // 2
	{94, 201, 98, 255},  // 3
	{253, 231, 37, 255}, // 4+
}

// blindHatch is the stripe colour over the blind class.
var blindHatch = color.RGBA{230, 97, 40, 255}

var coverageLabels = []string{"0 sensors (blind)", "1 sensor", "2 sensors", "3 sensors", "4+ sensors"}

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
	if !(f.EarthRadiusDeg >= 0 && f.EarthRadiusDeg <= 90) {
		return fmt.Errorf("plots: sky map: EarthRadiusDeg = %g; want 0…90", f.EarthRadiusDeg)
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

// classGrid finds the coverage class of any direction.
type classGrid struct {
	azEdges, elEdges []float64
	counts           [][]int
}

func newClassGrid(f SkyMap) classGrid {
	return classGrid{azEdges: edges(f.AzDeg), elEdges: edges(f.ElDeg), counts: f.Counts}
}

// class returns the class of (az, el) in degrees, or −1 outside the grid.
func (g classGrid) class(az, el float64) int {
	i := sort.SearchFloat64s(g.elEdges, el) - 1
	if el == g.elEdges[0] {
		i = 0
	}
	if i < 0 || i >= len(g.counts) {
		return -1
	}
	lo := g.azEdges[0]
	a := lo + math.Mod(math.Mod(az-lo, 360)+360, 360)
	j := sort.SearchFloat64s(g.azEdges, a) - 1
	if a == lo {
		j = 0
	}
	if j < 0 || j >= len(g.counts[i]) {
		return -1
	}
	return coverageClass(g.counts[i][j])
}

// Raster size of the sky-map fill: 2:1 like the Hammer ellipse, fine
// enough for a slide at twice screen resolution.
const skyRasterW, skyRasterH = 1200, 600

// raster draws the classes in the Hammer ellipse as a paletted image
// (transparent outside), with the blind class hatched.
func (g classGrid) raster(w, h int) *image.Paletted {
	pal := color.Palette{color.RGBA{}}
	for _, c := range coverageColours {
		pal = append(pal, c)
	}
	pal = append(pal, blindHatch)
	img := image.NewPaletted(image.Rect(0, 0, w, h), pal)
	const xr, yr = 2 * math.Sqrt2, math.Sqrt2
	for py := range h {
		y := yr * (1 - 2*(float64(py)+0.5)/float64(h))
		for px := range w {
			x := xr * (2*(float64(px)+0.5)/float64(w) - 1)
			lam, phi, ok := InverseHammer(x, y)
			if !ok {
				continue
			}
			c := g.class(lam*180/math.Pi, phi*180/math.Pi)
			if c < 0 {
				continue
			}
			idx := uint8(1 + c)
			if c == 0 && (px+py)%9 < 2 {
				idx = uint8(len(pal) - 1)
			}
			img.SetColorIndex(px, py, idx)
		}
	}
	return img
}

// skyPlotter draws the projected sphere with its own equal-scale transform
// (the Hammer ellipse must not be stretched, or equal areas would not look
// equal) and its own legend to the right of the map.
type skyPlotter struct {
	Fill         *image.Paletted
	Track        []xyPt
	Boresights   []Marker
	Obstructions []Marker
	Graticule    [][]xyPt
	// Earth is the disc outline (a fixed nadir) or nil; NadirTrack the
	// nadir points of a moving nadir.
	Earth          [][]xyPt
	EarthCentre    *xyPt
	NadirTrack     []xyPt
	EarthRadiusDeg float64
}

// smallCircle returns the outline of the cone of half-angle r (deg) about
// (az, el), split where it crosses the ±180° meridian.
func smallCircle(az, el, r float64) [][]xyPt {
	d := math.Pi / 180
	c := unitDir(az, el)
	// Two unit vectors perpendicular to c.
	ref := [3]float64{0, 0, 1}
	if math.Abs(c[2]) > 0.9 {
		ref = [3]float64{1, 0, 0}
	}
	u := unit3(cross3(c, ref))
	v := cross3(c, u)
	var out [][]xyPt
	var cur []xyPt
	prev := math.NaN()
	for k := 0; k <= 360; k += 2 {
		t := float64(k) * d
		var p [3]float64
		for i := range 3 {
			p[i] = math.Cos(r*d)*c[i] + math.Sin(r*d)*(math.Cos(t)*u[i]+math.Sin(t)*v[i])
		}
		a := math.Atan2(p[1], p[0]) / d
		e := math.Asin(max(-1, min(1, p[2]))) / d
		if !math.IsNaN(prev) && math.Abs(a-prev) > 180 {
			out = append(out, cur)
			cur = nil
		}
		cur = append(cur, hammerDeg(a, e))
		prev = a
	}
	return append(out, cur)
}

func unitDir(az, el float64) [3]float64 {
	d := math.Pi / 180
	return [3]float64{math.Cos(el*d) * math.Cos(az*d), math.Cos(el*d) * math.Sin(az*d), math.Sin(el * d)}
}

func cross3(a, b [3]float64) [3]float64 {
	return [3]float64{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
}

func unit3(a [3]float64) [3]float64 {
	n := math.Sqrt(a[0]*a[0] + a[1]*a[1] + a[2]*a[2])
	return [3]float64{a[0] / n, a[1] / n, a[2] / n}
}

// meanDir returns the mean direction of points and the largest angle of any
// point from it (deg).
func meanDir(pts []Point) (Point, float64) {
	var s [3]float64
	for _, p := range pts {
		u := unitDir(p.AzDeg, p.ElDeg)
		for i := range 3 {
			s[i] += u[i]
		}
	}
	m := unit3(s)
	worst := 0.0
	for _, p := range pts {
		u := unitDir(p.AzDeg, p.ElDeg)
		c := m[0]*u[0] + m[1]*u[1] + m[2]*u[2]
		worst = max(worst, math.Acos(max(-1, min(1, c)))*180/math.Pi)
	}
	return Point{math.Atan2(m[1], m[0]) * 180 / math.Pi, math.Asin(max(-1, min(1, m[2]))) * 180 / math.Pi}, worst
}

// fixedSpreadDeg is how far a direction may wander and still be drawn as
// fixed (one disc, one sun marker).
const fixedSpreadDeg = 3.0

func newSkyPlotter(f SkyMap) *skyPlotter {
	g := newClassGrid(f)
	s := &skyPlotter{Boresights: f.Boresights, Obstructions: f.Obstructions, Fill: g.raster(skyRasterW, skyRasterH),
		EarthRadiusDeg: f.EarthRadiusDeg}
	for _, p := range f.SunTrack {
		if finite(p.AzDeg) && finite(p.ElDeg) {
			s.Track = append(s.Track, hammerDeg(wrapAz(p.AzDeg), p.ElDeg))
		}
	}
	if len(f.Nadir) > 0 && f.EarthRadiusDeg > 0 {
		m, spread := meanDir(f.Nadir)
		if spread <= fixedSpreadDeg {
			s.Earth = smallCircle(m.AzDeg, m.ElDeg, f.EarthRadiusDeg)
			c := hammerDeg(wrapAz(m.AzDeg), m.ElDeg)
			s.EarthCentre = &c
		} else {
			for _, p := range f.Nadir {
				s.NadirTrack = append(s.NadirTrack, hammerDeg(wrapAz(p.AzDeg), p.ElDeg))
			}
		}
	}
	for a := -180.0; a <= 180; a += 30 {
		var l []xyPt
		for e := -90.0; e <= 90; e += 5 {
			l = append(l, hammerDeg(a, e))
		}
		s.Graticule = append(s.Graticule, l)
	}
	for e := -60.0; e <= 60; e += 30 {
		var l []xyPt
		for a := -180.0; a <= 180; a += 5 {
			l = append(l, hammerDeg(a, e))
		}
		s.Graticule = append(s.Graticule, l)
	}
	return s
}

// sunFixed reports whether the sun stays within about 3° in body axes.
func (s *skyPlotter) sunFixed() bool {
	for _, p := range s.Track {
		if math.Hypot(p.X-s.Track[0].X, p.Y-s.Track[0].Y) > 0.05 {
			return false
		}
	}
	return true
}

// maxTrackDots bounds the dots drawn of a track (evenly thinned), which
// keeps the figure small.
const maxTrackDots = 360

// thin returns at most n points of pts, evenly spaced, keeping the last.
func thin(pts []xyPt, n int) []xyPt {
	if len(pts) <= n {
		return pts
	}
	out := make([]xyPt, 0, n+1)
	for k := range n {
		out = append(out, pts[k*len(pts)/n])
	}
	return append(out, pts[len(pts)-1])
}

// skyLegendW is the width kept right of the map for its legend.
const skyLegendW = 2.05 * vg.Inch

func (s *skyPlotter) Plot(c draw.Canvas, _ *plot.Plot) {
	const xr, yr = 2 * math.Sqrt2, math.Sqrt2
	const tickRoom = 22 // points below the map for the azimuth ticks
	mapC := c
	mapC.Max.X -= skyLegendW
	mapC.Min.X += 30 // elevation labels
	mapC.Min.Y += tickRoom
	w, h := mapC.Max.X-mapC.Min.X, mapC.Max.Y-mapC.Min.Y
	scale := min(float64(w)/(2*xr*1.02), float64(h)/(2*yr*1.04))
	cx, cy := (mapC.Min.X+mapC.Max.X)/2, (mapC.Min.Y+mapC.Max.Y)/2
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
	c.DrawImage(vg.Rectangle{Min: tr(xyPt{-xr, -yr}), Max: tr(xyPt{xr, yr})}, s.Fill)
	grid := draw.LineStyle{Color: color.NRGBA{255, 255, 255, 150}, Width: 0.5, Dashes: []vg.Length{2, 2}}
	for _, l := range s.Graticule {
		c.StrokeLines(grid, poly(l))
	}
	var rim []xyPt
	for k := 0; k <= 360; k += 2 {
		t := float64(k) * math.Pi / 180
		rim = append(rim, xyPt{xr * math.Cos(t), yr * math.Sin(t)})
	}
	c.StrokeLines(draw.LineStyle{Color: colBlack, Width: 1.2}, poly(rim))

	lab := text.Style{Color: color.RGBA{40, 40, 40, 255}, Font: font.From(plot.DefaultFont, tickSize),
		XAlign: draw.XCenter, YAlign: draw.YCenter, Handler: plot.DefaultTextHandler}
	halo := func(sty text.Style, pt vg.Point, txt string) {
		r := sty.Rectangle(txt)
		r.Min = r.Min.Add(pt).Sub(vg.Point{X: 1.5, Y: 1})
		r.Max = r.Max.Add(pt).Add(vg.Point{X: 1.5, Y: 1})
		c.FillPolygon(color.NRGBA{255, 255, 255, 215}, []vg.Point{r.Min, {X: r.Max.X, Y: r.Min.Y}, r.Max, {X: r.Min.X, Y: r.Max.Y}})
		c.FillText(sty, pt, txt)
	}
	// Ticks off the data: azimuth under the map at the x where each
	// meridian crosses the equator, elevation left of the rim.
	below := lab
	below.YAlign = draw.YTop
	base := tr(xyPt{0, -yr}).Y - 4
	tickLine := draw.LineStyle{Color: color.Gray{90}, Width: 0.8}
	for a := -180.0; a <= 180; a += 30 {
		if math.Abs(a) == 150 {
			continue // too close to ±180° on the page
		}
		x := tr(hammerDeg(a, 0)).X
		c.StrokeLine2(tickLine, x, base, x, base+4)
		c.FillText(below, vg.Point{X: x, Y: base - 1}, fmt.Sprintf("%.0f°", a))
	}
	labR := lab
	labR.XAlign = draw.XRight
	for e := -60.0; e <= 60; e += 30 {
		if e == 0 {
			continue // the −X marker sits there
		}
		p := tr(hammerDeg(-180, e))
		c.FillText(labR, vg.Point{X: p.X - 5, Y: p.Y}, fmt.Sprintf("%+.0f°", e))
	}
	// Body axes.
	axis := lab
	axis.Font.Size = legendSize
	axes := []struct {
		name   string
		az, el float64
	}{{"+X", 0, 0}, {"+Y", 90, 0}, {"−Y", -90, 0}, {"−X", 180, 0}, {"−X", -180, 0}, {"+Z", 0, 90}, {"−Z", 0, -90}}
	for _, a := range axes {
		p := tr(hammerDeg(a.az, a.el))
		sq := draw.GlyphStyle{Color: colBlack, Radius: 3.2, Shape: draw.SquareGlyph{}}
		c.DrawGlyph(draw.GlyphStyle{Color: color.White, Radius: 4.6, Shape: draw.SquareGlyph{}}, p)
		c.DrawGlyph(sq, p)
		off := vg.Point{X: 0, Y: -12}
		switch a.name {
		case "+Z":
			off = vg.Point{X: -18, Y: -4}
		case "−Z":
			off = vg.Point{X: -18, Y: 4}
		}
		if a.az == 180 {
			off = vg.Point{X: -15, Y: -12}
		} else if a.az == -180 {
			off = vg.Point{X: 15, Y: -12}
		}
		halo(axis, p.Add(off), a.name)
	}

	// The Earth: disc outline and label, or the nadir track.
	earth := draw.LineStyle{Color: color.RGBA{0, 40, 110, 255}, Width: 2.2, Dashes: []vg.Length{7, 3}}
	earthHalo := draw.LineStyle{Color: color.White, Width: 4}
	for _, l := range s.Earth {
		c.StrokeLines(earthHalo, poly(l))
		c.StrokeLines(earth, poly(l))
	}
	name := lab
	name.XAlign = draw.XLeft
	name.Font.Size = legendSize - 1
	if s.EarthCentre != nil {
		p := tr(*s.EarthCentre)
		c.DrawGlyph(draw.GlyphStyle{Color: earth.Color, Radius: 4, Shape: draw.PlusGlyph{}}, p)
		halo(name, p.Add(vg.Point{X: 7, Y: -9}), fmt.Sprintf("nadir, Earth %.0f° radius", s.EarthRadiusDeg))
	}
	for _, p := range thin(s.NadirTrack, maxTrackDots/2) {
		c.DrawGlyph(draw.GlyphStyle{Color: earth.Color, Radius: 1.1, Shape: draw.CircleGlyph{}}, tr(p))
	}

	// Obstructions.
	for _, o := range s.Obstructions {
		p := tr(hammerDeg(wrapAz(o.AzDeg), o.ElDeg))
		c.DrawGlyph(draw.GlyphStyle{Color: color.White, Radius: 6, Shape: draw.TriangleGlyph{}}, p)
		c.DrawGlyph(draw.GlyphStyle{Color: colPurple, Radius: 4.5, Shape: draw.TriangleGlyph{}}, p)
		halo(name, p.Add(vg.Point{X: 8, Y: -8}), o.Name)
	}

	// The sun: track, start and direction of time, or one marker.
	sunEdge := draw.GlyphStyle{Color: colBlack, Radius: 7, Shape: draw.CircleGlyph{}}
	sunFill := draw.GlyphStyle{Color: colOrange, Radius: 5.6, Shape: draw.CircleGlyph{}}
	if n := len(s.Track); n > 0 {
		fixed := s.sunFixed()
		// The track as one line (split where it jumps across the ±180°
		// edge), with a dot every tenth of the samples kept.
		pts := thin(s.Track, maxTrackDots)
		var run []vg.Point
		flush := func() {
			if len(run) > 1 {
				c.StrokeLines(draw.LineStyle{Color: colBlack, Width: 3.4}, run)
				c.StrokeLines(draw.LineStyle{Color: colOrange, Width: 2}, run)
			}
			run = nil
		}
		for i, p := range pts {
			if i > 0 && math.Abs(p.X-pts[i-1].X) > 1 {
				flush()
			}
			run = append(run, tr(p))
		}
		flush()
		for i := 0; i < len(pts); i += max(1, len(pts)/36) {
			c.DrawGlyph(draw.GlyphStyle{Color: colBlack, Radius: 2.4, Shape: draw.CircleGlyph{}}, tr(pts[i]))
			c.DrawGlyph(draw.GlyphStyle{Color: colOrange, Radius: 1.6, Shape: draw.CircleGlyph{}}, tr(pts[i]))
		}
		if !fixed {
			p0 := tr(s.Track[0])
			c.DrawGlyph(sunEdge, p0)
			c.DrawGlyph(sunFill, p0)
			halo(name, p0.Add(vg.Point{X: 10, Y: 10}), "start")
			// Arrow head at the end of the track, pointing along it.
			k := n - 1
			for k > 0 && math.Hypot(s.Track[k].X-s.Track[n-1].X, s.Track[k].Y-s.Track[n-1].Y) < 0.08 {
				k--
			}
			a, b := tr(s.Track[k]), tr(s.Track[n-1])
			if d := math.Hypot(float64(b.X-a.X), float64(b.Y-a.Y)); d > 0 && d < 80 {
				ux, uy := float64(b.X-a.X)/d, float64(b.Y-a.Y)/d
				const L, W = 11, 5
				tip := b
				left := vg.Point{X: b.X - vg.Length(L*ux-W*uy), Y: b.Y - vg.Length(L*uy+W*ux)}
				right := vg.Point{X: b.X - vg.Length(L*ux+W*uy), Y: b.Y - vg.Length(L*uy-W*ux)}
				c.FillPolygon(colBlack, []vg.Point{tip, left, right})
			}
		}
	}
	ring := draw.GlyphStyle{Color: colBlack, Radius: 5, Shape: draw.CrossGlyph{}}
	// A sun fixed in body axes is drawn over everything (below): a label
	// that would run under it goes to the left of its mark instead.
	sunAt, sunOn := vg.Point{}, len(s.Track) > 0 && s.sunFixed()
	if sunOn {
		sunAt = tr(s.Track[0])
	}
	nameLeft := name
	nameLeft.XAlign = draw.XRight
	for _, b := range mergeMarkers(s.Boresights, sameMarkDeg) {
		p := tr(hammerDeg(wrapAz(b.AzDeg), b.ElDeg))
		c.DrawGlyph(draw.GlyphStyle{Color: color.White, Radius: 6.5, Shape: draw.CircleGlyph{}}, p)
		c.DrawGlyph(ring, p)
		at := vg.Point{X: p.X + 8, Y: p.Y + 7}
		if sunOn && underSun(name.Rectangle(b.Name), at, sunAt) {
			halo(nameLeft, vg.Point{X: p.X - 8, Y: p.Y + 7}, b.Name)
			continue
		}
		halo(name, at, b.Name)
	}
	if len(s.Track) > 0 && s.sunFixed() {
		// A sun fixed in body axes is drawn last, large, so nothing hides it.
		p0 := tr(s.Track[0])
		c.DrawGlyph(draw.GlyphStyle{Color: colBlack, Radius: 9, Shape: draw.CircleGlyph{}}, p0)
		c.DrawGlyph(draw.GlyphStyle{Color: colOrange, Radius: 7.4, Shape: draw.CircleGlyph{}}, p0)
		c.DrawGlyph(draw.GlyphStyle{Color: colBlack, Radius: 1.8, Shape: draw.CircleGlyph{}}, p0)
	}
	s.legend(c, lab)
}

// underSun reports whether a label of extent r placed at pt reaches within
// the fixed sun marker's radius (9 pt) of sun.
func underSun(r vg.Rectangle, pt, sun vg.Point) bool {
	const rad = 9
	return sun.X >= r.Min.X+pt.X-rad && sun.X <= r.Max.X+pt.X+rad && sun.Y >= r.Min.Y+pt.Y-rad && sun.Y <= r.Max.Y+pt.Y+rad
}

// legend draws the key to the right of the map, outside the data.
func (s *skyPlotter) legend(c draw.Canvas, lab text.Style) {
	sty := lab
	sty.XAlign, sty.YAlign = draw.XLeft, draw.YCenter
	sty.Font.Size = legendSize - 1
	x := c.Max.X - skyLegendW + 14
	y := c.Max.Y - 8
	const row = 17
	head := sty
	head.Font.Size = legendSize
	c.FillText(head, vg.Point{X: x, Y: y}, "sensors seeing the sun")
	y -= row
	for i := range coverageColours {
		r := vg.Rectangle{Min: vg.Point{X: x, Y: y - 6}, Max: vg.Point{X: x + 22, Y: y + 6}}
		pts := []vg.Point{r.Min, {X: r.Max.X, Y: r.Min.Y}, r.Max, {X: r.Min.X, Y: r.Max.Y}}
		c.FillPolygon(coverageColours[i], pts)
		if i == 0 {
			for k := vg.Length(2); k < 34; k += 6 {
				x0, x1 := r.Min.X+k-12, r.Min.X+k
				c.StrokeLine2(draw.LineStyle{Color: blindHatch, Width: 1.3}, max(x0, r.Min.X), r.Min.Y+(max(x0, r.Min.X)-x0),
					min(x1, r.Max.X), r.Min.Y+12-(x1-min(x1, r.Max.X)))
			}
		}
		c.StrokeLines(draw.LineStyle{Color: color.Gray{60}, Width: 0.5}, append(pts, pts[0]))
		c.FillText(sty, vg.Point{X: x + 28, Y: y}, coverageLabels[i])
		y -= row
	}
	y -= 4
	item := func(draw func(p vg.Point), label string) {
		draw(vg.Point{X: x + 11, Y: y})
		c.FillText(sty, vg.Point{X: x + 28, Y: y}, label)
		y -= row
	}
	if len(s.Track) > 0 && s.sunFixed() {
		item(func(p vg.Point) {
			c.DrawGlyph(draw.GlyphStyle{Color: colBlack, Radius: 7, Shape: draw.CircleGlyph{}}, p)
			c.DrawGlyph(draw.GlyphStyle{Color: colOrange, Radius: 5.6, Shape: draw.CircleGlyph{}}, p)
			c.DrawGlyph(draw.GlyphStyle{Color: colBlack, Radius: 1.5, Shape: draw.CircleGlyph{}}, p)
		}, "sun, fixed in body axes")
	} else if len(s.Track) > 0 {
		item(func(p vg.Point) {
			c.DrawGlyph(draw.GlyphStyle{Color: colBlack, Radius: 6, Shape: draw.CircleGlyph{}}, p)
			c.DrawGlyph(draw.GlyphStyle{Color: colOrange, Radius: 4.8, Shape: draw.CircleGlyph{}}, p)
		}, "sun at start")
		item(func(p vg.Point) {
			for k := -9; k <= 3; k += 4 {
				c.DrawGlyph(draw.GlyphStyle{Color: colBlack, Radius: 2.2, Shape: draw.CircleGlyph{}}, p.Add(vg.Point{X: vg.Length(k)}))
				c.DrawGlyph(draw.GlyphStyle{Color: colOrange, Radius: 1.5, Shape: draw.CircleGlyph{}}, p.Add(vg.Point{X: vg.Length(k)}))
			}
			c.FillPolygon(colBlack, []vg.Point{p.Add(vg.Point{X: 12}), p.Add(vg.Point{X: 3, Y: 4.5}), p.Add(vg.Point{X: 3, Y: -4.5})})
		}, "sun track, arrow: time")
	}
	if len(s.Earth) > 0 {
		item(func(p vg.Point) {
			c.StrokeLine2(draw.LineStyle{Color: color.RGBA{0, 40, 110, 255}, Width: 2.2, Dashes: []vg.Length{7, 3}}, p.X-11, p.Y, p.X+11, p.Y)
		}, "Earth disc edge")
	}
	if len(s.NadirTrack) > 0 {
		item(func(p vg.Point) {
			for k := -8; k <= 8; k += 4 {
				c.DrawGlyph(draw.GlyphStyle{Color: color.RGBA{0, 40, 110, 255}, Radius: 1.3, Shape: draw.CircleGlyph{}}, p.Add(vg.Point{X: vg.Length(k)}))
			}
		}, fmt.Sprintf("nadir (Earth %.0f°)", s.EarthRadiusDeg))
	}
	if len(s.Boresights) > 0 {
		item(func(p vg.Point) {
			c.DrawGlyph(draw.GlyphStyle{Color: colBlack, Radius: 5, Shape: draw.CrossGlyph{}}, p)
		}, "sensor boresight")
	}
	if len(s.Obstructions) > 0 {
		item(func(p vg.Point) {
			c.DrawGlyph(draw.GlyphStyle{Color: colPurple, Radius: 4.5, Shape: draw.TriangleGlyph{}}, p)
		}, "obstruction")
	}
	item(func(p vg.Point) {
		c.DrawGlyph(draw.GlyphStyle{Color: colBlack, Radius: 3.2, Shape: draw.SquareGlyph{}}, p)
	}, "body axis")
}

// Plot draws the sky map in the Hammer equal-area projection.
func (f SkyMap) Plot(caption Caption) (*Chart, error) {
	if err := f.validate(); err != nil {
		return nil, err
	}
	p := newPlot("Sun visibility over the body-frame sphere (Hammer equal-area)", "", "")
	p.X.Tick.Marker = plot.ConstantTicks(nil)
	p.Y.Tick.Marker = plot.ConstantTicks(nil)
	p.X.LineStyle.Width = 0
	p.Y.LineStyle.Width = 0
	p.X.Label.Text = "azimuth from +X toward +Y (deg, where each meridian crosses the equator); elevation toward +Z (deg, left)"
	p.X.Label.TextStyle.Font.Size = tickSize
	p.HideAxes()
	p.Title.TextStyle.Font.Size = titleSize
	sky := newSkyPlotter(f)
	p.Add(sky)
	return &Chart{Panels: []*plot.Plot{p}, Caption: caption, Height: 5.6 * vg.Inch, sky: sky}, nil
}
