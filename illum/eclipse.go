package illum

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// Geometry gives the geocentric satellite and sun positions (km, EME2000) at
// t seconds after the run's epoch.
type Geometry func(t float64) (rSat, rSun r3.Vec)

// ShadowModel names the shadow geometry of an eclipse search.
type ShadowModel int

const (
	// Conical: umbra and penumbra cones of the solar disc (ShadowConical).
	Conical ShadowModel = iota
	// Cylindrical: the Earth's cylindrical shadow (ShadowCylindrical). It
	// has no penumbra, so an eclipse's umbra times equal its shadow times.
	Cylindrical
)

// Eclipse is one passage through the Earth's shadow. Times are seconds
// after the run's epoch. UmbraStart and UmbraEnd are NaN when the pass is
// penumbral only (conical model); in the cylindrical model they equal the
// penumbra times.
type Eclipse struct {
	PenumbraStart, UmbraStart, UmbraEnd, PenumbraEnd float64
	// StartCut is set when the span began inside this eclipse: the start
	// times are then the span's start, not a shadow boundary.
	StartCut bool
	// EndCut is set when the span ended inside this eclipse: the end times
	// are then the span's end.
	EndCut bool
}

// Duration is the time from penumbra entry to penumbra exit, s.
func (e Eclipse) Duration() float64 { return e.PenumbraEnd - e.PenumbraStart }

// UmbraDuration is the time spent in the umbra, s (0 for a penumbral pass).
func (e Eclipse) UmbraDuration() float64 {
	if e.PenumbralOnly() {
		return 0
	}
	return e.UmbraEnd - e.UmbraStart
}

// PenumbralOnly reports whether the pass never reached the umbra.
func (e Eclipse) PenumbralOnly() bool { return math.IsNaN(e.UmbraStart) }

// Complete reports whether both ends of the eclipse lie inside the span.
func (e Eclipse) Complete() bool { return !e.StartCut && !e.EndCut }

// EventTolS is the tolerance to which FindEclipses refines each boundary time.
const EventTolS = 1e-3

// crossing is a time at which a shadow margin changes sign.
type crossing struct {
	t     float64
	enter bool // the margin becomes negative (into shadow)
}

// detector watches one shadow margin along the grid and records its sign
// changes, including a pair hidden between two samples.
type detector struct {
	f          func(float64) float64
	t0, t1, t2 float64
	g0, g1, g2 float64
	n          int
	out        []crossing
}

func (d *detector) reset(f func(float64) float64) {
	d.f = f
	d.n = 0
	d.out = d.out[:0]
}

func (d *detector) push(t, g float64) {
	d.t0, d.g0 = d.t1, d.g1
	d.t1, d.g1 = d.t2, d.g2
	d.t2, d.g2 = t, g
	d.n++
	if d.n < 2 {
		return
	}
	if (d.g1 < 0) != (d.g2 < 0) {
		r := brentRoot(d.f, d.t1, d.t2, d.g1, d.g2, EventTolS)
		d.out = append(d.out, crossing{r, d.g2 < 0})
		return
	}
	if d.n < 3 || (d.g0 < 0) != (d.g1 < 0) {
		return
	}
	// Same sign at three samples: a sampled local extremum may hide a pair
	// of crossings shorter than the step (a grazing pass).
	switch {
	case d.g1 >= 0 && d.g1 < d.g0 && d.g1 <= d.g2:
		tm, gm := goldenMin(d.f, d.t0, d.t2, EventTolS)
		if gm < 0 {
			d.out = append(d.out,
				crossing{brentRoot(d.f, d.t0, tm, d.g0, gm, EventTolS), true},
				crossing{brentRoot(d.f, tm, d.t2, gm, d.g2, EventTolS), false})
		}
	case d.g1 < 0 && d.g1 > d.g0 && d.g1 >= d.g2:
		neg := func(t float64) float64 { return -d.f(t) }
		tm, gm := goldenMin(neg, d.t0, d.t2, EventTolS)
		if gm <= 0 {
			d.out = append(d.out,
				crossing{brentRoot(d.f, d.t0, tm, d.g0, -gm, EventTolS), false},
				crossing{brentRoot(d.f, tm, d.t2, -gm, d.g2, EventTolS), true})
		}
	}
}

// Finder searches for eclipses and keeps its scratch buffers between calls,
// so that repeated searches (as in YearTable) do not allocate. The zero value
// is ready to use (conical shadow); a Finder is not safe for concurrent use.
type Finder struct {
	// Model is the shadow geometry searched (zero value: Conical).
	Model    ShadowModel
	pen, umb detector
}

// FindEclipses returns the eclipses (conical shadow) between t0 and t1 s,
// sampling the geometry every step s and refining each boundary with Brent's
// method to EventTolS. Passes shorter than the step are found from the
// minimum of the shadow margin between samples. Eclipses cut by the span's
// ends carry StartCut or EndCut.
func FindEclipses(g Geometry, t0, t1, step float64) []Eclipse {
	var f Finder
	return f.Append(nil, g, t0, t1, step)
}

// FindEclipsesModel is FindEclipses in the given shadow model.
func FindEclipsesModel(m ShadowModel, g Geometry, t0, t1, step float64) []Eclipse {
	f := Finder{Model: m}
	return f.Append(nil, g, t0, t1, step)
}

// Append appends the eclipses between t0 and t1 to dst (see FindEclipses).
func (f *Finder) Append(dst []Eclipse, g Geometry, t0, t1, step float64) []Eclipse {
	if !(t1 > t0) || !(step > 0) {
		return dst
	}
	margins := shadowMargins
	if f.Model == Cylindrical {
		margins = cylinderMargins
	}
	penF := func(t float64) float64 { p, _ := margins(g(t)); return p }
	umbF := func(t float64) float64 { _, u := margins(g(t)); return u }
	f.pen.reset(penF)
	f.umb.reset(umbF)
	var p0, u0 float64
	n := int(math.Ceil((t1 - t0) / step))
	for i := 0; i <= n; i++ {
		t := t0 + float64(i)*step
		if i == n {
			t = t1
		}
		p, u := margins(g(t))
		if i == 0 {
			p0, u0 = p, u
		}
		f.pen.push(t, p)
		if f.Model != Cylindrical {
			f.umb.push(t, u)
		}
	}
	n0 := len(dst)
	dst = assemble(dst, f.pen.out, f.umb.out, p0 < 0, u0 < 0, t0, t1)
	if f.Model == Cylindrical {
		// No penumbra: the whole shadow is umbra.
		for i := n0; i < len(dst); i++ {
			dst[i].UmbraStart, dst[i].UmbraEnd = dst[i].PenumbraStart, dst[i].PenumbraEnd
		}
	}
	return dst
}

// assemble pairs penumbra crossings into eclipses and places the umbra
// crossings inside them.
func assemble(dst []Eclipse, pen, umb []crossing, inPen, inUmb bool, t0, t1 float64) []Eclipse {
	nan := math.NaN()
	cur := Eclipse{PenumbraStart: t0, UmbraStart: nan, UmbraEnd: nan, StartCut: true}
	open := inPen
	if open && inUmb {
		cur.UmbraStart = t0
	}
	ui := 0
	// umbraUpTo places the umbra crossings up to time t in the open eclipse.
	umbraUpTo := func(t float64) {
		for ; ui < len(umb) && umb[ui].t <= t; ui++ {
			if !open {
				continue
			}
			if umb[ui].enter {
				if math.IsNaN(cur.UmbraStart) {
					cur.UmbraStart = umb[ui].t
				}
			} else {
				cur.UmbraEnd = umb[ui].t
			}
		}
	}
	for _, c := range pen {
		if c.enter {
			umbraUpTo(c.t)
			open = true
			cur = Eclipse{PenumbraStart: c.t, UmbraStart: nan, UmbraEnd: nan}
			continue
		}
		umbraUpTo(c.t)
		if !open {
			continue
		}
		cur.PenumbraEnd = c.t
		if !math.IsNaN(cur.UmbraStart) && math.IsNaN(cur.UmbraEnd) {
			cur.UmbraEnd = c.t // numerical guard: the umbra lies inside the penumbra
		}
		dst = append(dst, cur)
		open = false
	}
	if open {
		umbraUpTo(t1)
		cur.PenumbraEnd = t1
		cur.EndCut = true
		if !math.IsNaN(cur.UmbraStart) && (math.IsNaN(cur.UmbraEnd) || cur.UmbraEnd < cur.UmbraStart) {
			cur.UmbraEnd = t1
		}
		dst = append(dst, cur)
	}
	return dst
}
