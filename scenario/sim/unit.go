package sim

import (
	"context"
	"math"
	"math/rand/v2"
	"sync/atomic"

	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/internal/vecmath"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// solarIrradiance returns the direct solar irradiance (W/m²) at a distance
// from the sun in km: S₀·(AU/d)² with S₀ at 1 AU (ephem.SolarIrradiance1AU).
func solarIrradiance(distKm float64) float64 {
	q := ephem.AUKm / distKm
	return ephem.SolarIrradiance1AU * q * q
}

// degOf converts radians to degrees.
func degOf(rad float64) float64 { return rad * 180 / math.Pi }

// angleBetween returns the angle (rad) between two unit vectors, accurate
// near 0 and π (atan2 of |a×b| and a·b).
func angleBetween(a, b r3.Vec) float64 {
	return math.Atan2(vecmath.Norm(r3.Cross(a, b)), r3.Dot(a, b))
}

// stepGeom is what one step gives before any sensor is read: it depends on
// the orbit, the sun, the shadow and the attitude, not on which sensors fly.
type stepGeom struct {
	t         float64
	region    illum.Region
	lit       float64 // visible fraction of the solar disc
	direct    float64 // direct solar irradiance at the spacecraft, W/m² (× lit)
	sunBody   r3.Vec
	nadirBody r3.Vec
	sinBeta   float64
	body      bodyMatrix    // the attitude (body ← ECI)
	bodies    sensor.Bodies // the Moon and the Earth as the spacecraft sees them
}

// geometry computes stepGeom and, with an albedo model, each sensor's albedo
// (body axes) for the nominal boresights of a sensor list.
type geometry struct {
	cfg       *Config
	prop      orbit.Propagator
	sun, moon *sunCache
	law       attitude.Law
	eclAware  attitude.EclipseAware
	rows      attitude.RowsLaw
	// plainNadir: the law is a Plain nadir law, whose matrix the step
	// builds with attitude.NadirRows (its Rows, bit for bit).
	plainNadir      bool
	states          []orbit.State // the block of steps [blk0, blk0+len)
	blk0            int
	alb, corr       *albedo.Model
	table, corrTab  *localAlbedo
	jd0, jdUT0      float64
	boresights      []r3.Vec
	albIn           []albedo.Sensor
	albInECI        bool // albIn holds this step's axes (sensorsInECI)
	albOut, corrOut []albedo.Result
	// Sensors whose albedo runs through their own cell responses (quadrant
	// sensors): their sensor axes, and, when a table serves the others,
	// their own integral.
	cells        []int
	cellX, cellY []r3.Vec
	// Sensors whose cone reaches behind their mounting plane: their plane
	// normals (body axes). They too are integrated on their own when a
	// table serves the others (the tables hold whole cones).
	clipped []int
	clipN   []r3.Vec
	own     []int // cells ∪ clipped
	ownIn   []albedo.Sensor
	ownOut  []albedo.Result
}

func newGeometry(cfg *Config, arr *sensor.Array, u int, tables albedoTables) (*geometry, error) {
	g := &geometry{cfg: cfg, prop: cfg.NewPropagator(), table: tables.truth.clone(), corrTab: tables.onboard.clone(),
		jd0: ephem.JulianDateTT(cfg.Epoch), jdUT0: ephem.JulianDateUT1(cfg.Epoch)}
	g.sun = newSunCache(cfg.Sun, g.jd0)
	g.moon = newMoonCache(g.jd0)
	g.law = cfg.Law
	if cfg.LawForUnit != nil {
		g.law = cfg.LawForUnit(u)
	}
	g.eclAware, _ = g.law.(attitude.EclipseAware)
	g.rows, _ = g.law.(attitude.RowsLaw)
	if n, ok := g.law.(attitude.Nadir); ok && n.Plain() {
		g.plainNadir = true
	}
	n := arr.Len()
	for _, s := range arr.Sensors() {
		g.boresights = append(g.boresights, s.Mount().Boresight())
	}
	if cfg.NewAlbedo != nil {
		m, err := cfg.NewAlbedo()
		if err != nil {
			return nil, err
		}
		g.alb = m
		if cfg.NewCorrection != nil {
			if g.corr, err = cfg.NewCorrection(); err != nil {
				return nil, err
			}
		}
		g.albIn = make([]albedo.Sensor, n)
		g.albOut = make([]albedo.Result, n)
		g.corrOut = make([]albedo.Result, n)
		for i, s := range arr.Sensors() {
			g.albIn[i].HalfAngle = s.HalfAngle()
			if cfg.AlbedoResponse != nil {
				g.albIn[i].Response = cfg.AlbedoResponse[i]
			}
			if cr, ok := s.(albedo.CellResponse); ok {
				x, y, _ := s.Mount().Axes()
				g.albIn[i].Cells = cr
				g.cells = append(g.cells, i)
				g.cellX, g.cellY = append(g.cellX, x), append(g.cellY, y)
			}
			if cfg.MountNormals != nil && crossesPlane(s.Mount().Boresight(), cfg.MountNormals[i], s.HalfAngle()) {
				g.clipped = append(g.clipped, i)
				g.clipN = append(g.clipN, cfg.MountNormals[i])
			}
			if len(g.cells) > 0 && g.cells[len(g.cells)-1] == i || len(g.clipped) > 0 && g.clipped[len(g.clipped)-1] == i {
				g.own = append(g.own, i)
			}
		}
		g.ownIn = make([]albedo.Sensor, len(g.own))
		g.ownOut = make([]albedo.Result, len(g.own))
	}
	return g, nil
}

// geomBlock is the length of the blocks of steps whose orbit states are
// filled at once (Propagator.Fill: a recurrence for the J2-mean
// propagator). Blocks start at multiples of geomBlock, so a step's state
// does not depend on where a chunk starts.
const geomBlock = 1024

// state returns the orbit state of step k, filling its block when needed.
func (g *geometry) state(k int) orbit.State {
	if k < g.blk0 || k >= g.blk0+len(g.states) {
		g.blk0 = k - k%geomBlock
		n := min(geomBlock, g.cfg.Steps()-g.blk0)
		if cap(g.states) < n {
			g.states = make([]orbit.State, geomBlock)
		}
		g.states = g.states[:n]
		g.prop.Fill(g.states, float64(g.blk0)*g.cfg.Step, g.cfg.Step)
	}
	return g.states[k-g.blk0]
}

// step computes step k; with an albedo model it fills albBody (one entry per
// sensor), and with an on-board model too predBody (that model's
// prediction on the same sensors). It allocates nothing.
func (g *geometry) step(k int, albBody, predBody []sensor.Albedo) stepGeom {
	var sg stepGeom
	g.fill(&sg, k, albBody, predBody)
	return sg
}

// fill is step writing into sg, which the step loop reuses.
func (g *geometry) fill(sg *stepGeom, k int, albBody, predBody []sensor.Albedo) {
	cfg := g.cfg
	t := float64(k) * cfg.Step
	st := g.state(k)
	sunU, sunD := g.sun.at(t)
	lit, region := shadow(cfg.Cylindrical, st.R, sunU, sunD)
	M := &sg.body
	g.attitude(M, t, st, sunU, region)
	sg.t, sg.region, sg.lit, sg.direct = t, region, lit, solarIrradiance(sunD)*lit
	sg.sunBody = M.toBody(sunU)
	rn := vecmath.Norm(st.R)
	sg.nadirBody = M.toBody(r3.Scale(-1/rn, st.R))
	sg.sinBeta = illum.SinBetaAngle(st.R, st.V, sunU)
	g.bodies(sg, M, st.R, rn, sunU, sunD)
	if g.alb == nil {
		return
	}
	g.albInECI = false
	g.integrate(g.alb, g.table, g.albOut, st, sunU, sunD, M, t)
	toBody(albBody, g.albOut, M)
	if g.corr != nil {
		// The on-board model's prediction, by the same route as the truth
		// (a table when one serves it), so that the same model predicts
		// the same numbers.
		g.integrate(g.corr, g.corrTab, g.corrOut, st, sunU, sunD, M, t)
		toBody(predBody, g.corrOut, M)
	}
}

// attitude writes the law's matrix at time t, state st, sun direction
// sunU and shadow region into M.
func (g *geometry) attitude(M *bodyMatrix, t float64, st orbit.State, sunU r3.Vec, region illum.Region) {
	switch {
	case g.eclAware != nil:
		*M = attitudeRot(g.eclAware.AttitudeInEclipse(t, st, sunU, region != illum.Sunlit)).matrix()
	case g.plainNadir:
		if m, ok := attitude.NadirRows(st.R, st.V); ok {
			*M = bodyMatrix(m)
		} else {
			*M = bodyMatrix(g.rows.Rows(t, st, sunU))
		}
	case g.rows != nil:
		*M = bodyMatrix(g.rows.Rows(t, st, sunU)) // built directly, no quaternion
	default:
		*M = attitudeRot(g.law.Attitude(t, st, sunU)).matrix()
	}
}

// integrate fills out with model m's albedo on the sensors, from table t
// when it serves the step. The tables hold whole cones: the cell sensors and
// the cones cut by their mounting plane are then integrated on their own.
func (g *geometry) integrate(m *albedo.Model, t *localAlbedo, out []albedo.Result, st orbit.State, sunU r3.Vec, sunD float64, M *bodyMatrix, tS float64) {
	// The sensors' axes in ECI and the sidereal angle are what the cell
	// integral and the boresight tables ask for; a nadir-frame table
	// serves a step without them, so they are made only when asked.
	if t != nil && t.bore != nil {
		g.sensorsInECI(M)
	}
	if t == nil || !t.irradiance(out, st, sunU, sunD, g.albIn) {
		g.sensorsInECI(M)
		m.Irradiance(out, st.R, sunU, sunD, ephem.GMST(g.jdUT0+tS/86400), g.jd0+tS/86400, g.albIn)
		return
	}
	if len(g.own) == 0 {
		return
	}
	g.sensorsInECI(M)
	for k, i := range g.own {
		g.ownIn[k] = g.albIn[i]
	}
	m.Irradiance(g.ownOut, st.R, sunU, sunD, ephem.GMST(g.jdUT0+tS/86400), g.jd0+tS/86400, g.ownIn)
	for k, i := range g.own {
		out[i] = g.ownOut[k]
	}
}

// sensorsInECI turns the sensors' boresights, quadrant axes and mounting
// planes into ECI with the step's matrix M, once per step (albInECI).
func (g *geometry) sensorsInECI(M *bodyMatrix) {
	if g.albInECI {
		return
	}
	for i, b := range g.boresights {
		g.albIn[i].Normal = M.toECI(b)
	}
	for k, i := range g.cells {
		g.albIn[i].X, g.albIn[i].Y = M.toECI(g.cellX[k]), M.toECI(g.cellY[k])
	}
	for k, i := range g.clipped {
		g.albIn[i].Plane = M.toECI(g.clipN[k])
	}
	g.albInECI = true
}

// toBody turns the albedo model's results (directions in ECI) into the
// sensors' albedo in body axes.
func toBody(dst []sensor.Albedo, res []albedo.Result, M *bodyMatrix) {
	for i := range res {
		dst[i] = sensor.Albedo{Irradiance: res[i].Irradiance, Cells: res[i].Cells}
		if res[i].Irradiance > 0 {
			dst[i].Dir = M.toBody(res[i].Dir)
		}
	}
}

// stepView is what every unit of a task sees alike at one step, from the
// geometry and the nominal layout: which sensors the body blocks from the
// sun, the albedo each sensor gets past the body, and which sensors see the
// sun (coverage counts the nominal layout).
type stepView struct {
	sunBlocked []bool          // nil: nothing is ever blocked
	albSeen    []sensor.Albedo // nil without albedo
	predSeen   []sensor.Albedo // the on-board prediction past the body; nil without one
	sees       []bool
	seen       int
	// noAlbedo: no sensor gets albedo past the body (albSeen all zero),
	// taken once here for every unit.
	noAlbedo bool
	// moonIn, litEarthIn: the Moon, the lit Earth in each sensor's cone
	// (sensor.Bodies.MoonInCone, LitEarthInCone; the Moon also clear of the
	// body's obstructions).
	moonIn, litEarthIn []bool
	// moonHid, earthHid: the Moon in the cone but hidden (mounting plane or
	// obstructions), the lit Earth in the cone but its point nearest the
	// boresight behind an obstruction; the blinding rules see neither.
	moonHid, earthHid []bool
}

// viewer fills the stepView of each step, once for all units of a task.
type viewer struct {
	// hide[i] is sensor i's obstruction test (Config.Blocked[i]).
	hide []hider
	sees []func(r3.Vec) bool
	// seenFrom[i], when not NaN, replaces sees[i]: sensor i is a cosine
	// sensor seen through a sensor.SunView, whose SeesSun is the one
	// comparison bore[i]·d ≥ seenFrom[i] (Cosine.SeenFromCosine), and the
	// obstruction part of its view is vhide[i], or the step's
	// sunBlocked[i] when Blocked[i] is the same test (sameBlocked[i]).
	seenFrom    []float64
	bore        []r3.Vec
	vhide       []hider
	sameBlocked []bool
	// The nominal cones and mounting-plane normals (zero: none).
	cone []sensor.Cone
	face []r3.Vec
	// outside[i]: below this cosine from the nominal boresight sensor i
	// cannot see the sun (a cosine sensor's cone, less a margin far above
	// rounding), so its viewer need not be asked; −2 for the other kinds.
	outside []float64
	v       stepView
	// The steps each sensor of the nominal layout sees the sun, the Moon,
	// the lit Earth: the same for every unit of a task, so counted once
	// here and added to each unit's accumulator (addCounts).
	inView, moonInView, litEarthInView []int
}

func newViewer(cfg *Config, arr *sensor.Array) *viewer {
	n := arr.Len()
	w := &viewer{hide: make([]hider, n), face: make([]r3.Vec, n), inView: make([]int, n), moonInView: make([]int, n), litEarthInView: make([]int, n),
		v: stepView{sees: make([]bool, n), moonIn: make([]bool, n), litEarthIn: make([]bool, n), moonHid: make([]bool, n), earthHid: make([]bool, n)}}
	if cfg.Blocked != nil {
		w.v.sunBlocked = make([]bool, n)
	}
	if cfg.NewAlbedo != nil {
		w.v.albSeen = make([]sensor.Albedo, n)
		if cfg.NewCorrection != nil {
			w.v.predSeen = make([]sensor.Albedo, n)
		}
	}
	for i, s := range arr.Sensors() {
		if cfg.Blocked != nil {
			w.hide[i] = newHider(cfg.Blocked[i])
		}
		w.cone = append(w.cone, sensor.NewCone(s.Mount().Boresight(), s.HalfAngle()))
		cut := -2.0
		if _, ok := s.(*sensor.Cosine); ok {
			cut = math.Cos(s.HalfAngle()) - 1e-9
		}
		w.outside = append(w.outside, cut)
		o, _ := viewerOf(cfg, i).(*sky.Obstructed)
		from, bore, vh, same := seenByCosine(cfg, i, o)
		w.seenFrom, w.bore = append(w.seenFrom, from), append(w.bore, bore)
		w.vhide, w.sameBlocked = append(w.vhide, vh), append(w.sameBlocked, same)
		switch {
		case cfg.Viewers == nil:
			w.sees = append(w.sees, s.SeesSun)
		case o != nil && cut > -2 && !mayBlock(o) && inFront(w.cone[i].Axis, o.Face, cut):
			// Asked only inside the cone, which lies wholly above the
			// mounting plane: Hidden is false wherever Sees is asked.
			w.sees = append(w.sees, o.View.Sees)
		default:
			w.sees = append(w.sees, cfg.Viewers[i].Sees)
		}
		if cfg.MountNormals != nil {
			w.face[i] = cfg.MountNormals[i]
		}
	}
	return w
}

// at returns the view of a step whose geometry is g and whose albedo per
// sensor is albBody (ignored without albedo), predBody the on-board model's
// prediction (ignored without one). A sensor whose view of the sun is
// blocked by the body gets no direct light; its albedo is dropped when the
// mean arrival direction is blocked (a first approximation: a partly
// blocked Earth is not split). The prediction is blocked by the same rule:
// the flight software knows its own spacecraft.
func (w *viewer) at(g *stepGeom, albBody, predBody []sensor.Albedo) *stepView {
	w.view(&w.v, g, albBody, predBody)
	return &w.v
}

// view is at writing into v, whose slices have the lengths of the viewer's
// own (newViews makes such views).
func (w *viewer) view(v *stepView, g *stepGeom, albBody, predBody []sensor.Albedo) {
	if v.sunBlocked != nil {
		blocked, hide, sun := v.sunBlocked, w.hide, g.sunBody
		for i := range min(len(blocked), len(hide)) {
			h := &hide[i]
			if h.faceOnly {
				// hider.hidden written out: the mounting plane alone.
				blocked[i] = h.face != (r3.Vec{}) && !(r3.Dot(sun, h.face) > sky.FacePlaneMargin)
			} else {
				blocked[i] = h.hidden(sun)
			}
		}
	}
	if v.albSeen != nil {
		w.pastBody(v.albSeen, albBody)
		w.pastBody(v.predSeen, predBody)
		v.noAlbedo = noAlbedo(v.albSeen)
	}
	v.seen = 0
	sunlit := g.region == illum.Sunlit
	for i, sees := range w.sees {
		if from := w.seenFrom[i]; from == from {
			// Obstructed.Sees written out: SunView's SeesSun, then Hidden.
			v.sees[i] = sunlit && r3.Dot(w.bore[i], g.sunBody) >= from &&
				!(w.sameBlocked[i] && v.sunBlocked[i] || !w.sameBlocked[i] && w.vhide[i].hidden(g.sunBody))
		} else {
			v.sees[i] = sunlit && r3.Dot(w.cone[i].Axis, g.sunBody) >= w.outside[i] && sees(g.sunBody)
		}
		if v.sees[i] {
			v.seen++
			w.inView[i]++
		}
	}
	w.bodiesInCones(v, &g.bodies)
}

// newViews returns m views shaped as the viewer's own, their slices cut
// from one backing array each.
func (w *viewer) newViews(m int) []stepView {
	n := len(w.cone)
	vs := make([]stepView, m)
	sees, moonIn, litEarthIn := make([]bool, m*n), make([]bool, m*n), make([]bool, m*n)
	moonHid, earthHid := make([]bool, m*n), make([]bool, m*n)
	var blocked []bool
	if w.v.sunBlocked != nil {
		blocked = make([]bool, m*n)
	}
	var albSeen, predSeen []sensor.Albedo
	if w.v.albSeen != nil {
		albSeen = make([]sensor.Albedo, m*n)
	}
	if w.v.predSeen != nil {
		predSeen = make([]sensor.Albedo, m*n)
	}
	cut := func(s []bool, j int) []bool {
		if s == nil {
			return nil
		}
		return s[j*n : (j+1)*n : (j+1)*n]
	}
	cutAlb := func(s []sensor.Albedo, j int) []sensor.Albedo {
		if s == nil {
			return nil
		}
		return s[j*n : (j+1)*n : (j+1)*n]
	}
	for j := range vs {
		vs[j] = stepView{sunBlocked: cut(blocked, j), albSeen: cutAlb(albSeen, j), predSeen: cutAlb(predSeen, j),
			sees: cut(sees, j), moonIn: cut(moonIn, j), litEarthIn: cut(litEarthIn, j), moonHid: cut(moonHid, j), earthHid: cut(earthHid, j)}
	}
	return vs
}

// bodiesInCones sets the view's Moon and lit-Earth flags and counts them:
// sensor.Bodies.MoonInCone and LitEarthInCone written out over the sensors,
// the same comparisons without a copy of each cone
// (TestViewerBodiesFlagsAreTheRules).
func (w *viewer) bodiesInCones(v *stepView, b *sensor.Bodies) {
	moonIn, earthIn := v.moonIn[:len(w.cone)], v.litEarthIn[:len(w.cone)]
	face, hide := w.face[:len(w.cone)], w.hide[:len(w.cone)]
	moonN, earthN := w.moonInView[:len(w.cone)], w.litEarthInView[:len(w.cone)]
	// A hidden Moon or an unlit Earth is in no cone: its comparisons need
	// not be made (each flag is a conjunction that starts with it).
	moonHid, earthHid := v.moonHid[:len(w.cone)], v.earthHid[:len(w.cone)]
	if b.MoonHidden {
		clear(moonIn)
		clear(moonHid)
	} else {
		moonCut := -b.MoonSin
		for i := range w.cone {
			c := &w.cone[i]
			cone := r3.Dot(c.Axis, b.MoonDir) > c.Cos*b.MoonCos-c.Sin*b.MoonSin
			hid := cone && hide[i].hidden(b.MoonDir)
			in := cone && r3.Dot(b.MoonDir, face[i]) > moonCut && !hid
			moonIn[i], moonHid[i] = in, hid
			if in {
				moonN[i]++
			}
		}
	}
	if !b.EarthLit {
		clear(earthIn)
		clear(earthHid)
		return
	}
	earthCut := -b.EarthSin
	for i := range w.cone {
		c := &w.cone[i]
		in := r3.Dot(c.Axis, b.NadirDir) > c.Cos*b.EarthCos-c.Sin*b.EarthSin && r3.Dot(b.NadirDir, face[i]) > earthCut
		// Past the body's obstructions (a bus the sensor looks along): the
		// Earth's point deepest in the cone, the one nearest the boresight,
		// is the test (the rule chosen for an extended Earth).
		hid := in && hide[i].obstacles() && hide[i].obstructed(nearestOnDisc(c.Axis, b.NadirDir, b.EarthSin, b.EarthCos))
		in = in && !hid
		earthIn[i], earthHid[i] = in, hid
		if in {
			earthN[i]++
		}
	}
}

// nearestOnDisc is the direction of the disc of centre n and angular
// radius ρ (sin, cos) nearest the unit axis: the axis itself when it points
// into the disc, else n turned toward the axis by ρ.
func nearestOnDisc(axis, n r3.Vec, sinR, cosR float64) r3.Vec {
	c := r3.Dot(axis, n)
	if c >= cosR {
		return axis
	}
	t := r3.Sub(axis, r3.Scale(c, n))
	l := vecmath.Norm(t)
	if l == 0 {
		return n // the axis points away from the centre: any edge point is as near
	}
	return r3.Add(r3.Scale(cosR, n), r3.Scale(sinR/l, t))
}

// hider is one sensor's obstruction test (Config.Blocked[i]) as the step
// loop asks it: a mounting plane without obstacles is written out in
// place, bit for bit sky.Obstructed.Hidden, without a call per sensor per
// step.
type hider struct {
	o        *sky.Obstructed // nil: nothing ever hides
	faceOnly bool            // no obstacle of o may block (mayBlock): only its mounting plane
	face     r3.Vec          // o.Face
}

func newHider(o *sky.Obstructed) hider {
	if o == nil {
		return hider{}
	}
	return hider{o: o, faceOnly: !mayBlock(o), face: o.Face}
}

// mayBlock reports whether an obstacle of o may hide a direction above
// o's mounting plane: false when o has none but boxes whose face o sits on,
// looking out of it (sky.Box.ClearAbove), such as a sensor on the bus.
func mayBlock(o *sky.Obstructed) bool {
	for _, ob := range o.Obstacles {
		if b, ok := ob.(sky.Box); !ok || !b.ClearAbove(o.Position, o.Face) {
			return true
		}
	}
	return false
}

// hidden is o.Hidden(d); false without o.
// obstacles reports whether obstacles beyond the mounting plane may hide
// directions (obstructed then traces them).
func (h *hider) obstacles() bool { return h.o != nil && !h.faceOnly }

// obstructed reports whether an obstacle (not the mounting plane) blocks
// direction d.
func (h *hider) obstructed(d r3.Vec) bool {
	for _, ob := range h.o.Obstacles {
		if ob.Blocks(h.o.Position, d) {
			return true
		}
	}
	return false
}

func (h *hider) hidden(d r3.Vec) bool {
	if h.faceOnly {
		return h.face != (r3.Vec{}) && !(r3.Dot(d, h.face) > sky.FacePlaneMargin)
	}
	return h.o != nil && h.o.Hidden(d)
}

// seenByCosine says how the viewer may ask sensor i's view o (nil: not an
// obstruction test) without a call: when o looks through a sensor.SunView
// of a cosine sensor without roll-off, from is the least cosine from the
// boresight bore that the sensor sees (Cosine.SeenFromCosine), vh is o's
// obstruction test, and same reports that cfg.Blocked[i] is the same test
// (same position, plane and obstacles), whose answer the step has already;
// from is NaN otherwise.
func seenByCosine(cfg *Config, i int, o *sky.Obstructed) (from float64, bore r3.Vec, vh hider, same bool) {
	from = math.NaN()
	if o == nil {
		return
	}
	sv, ok := o.View.(sensor.SunView)
	if !ok {
		return
	}
	c, ok := sv.Sensor.(*sensor.Cosine)
	if !ok {
		return
	}
	cmin, ok := c.SeenFromCosine()
	if !ok {
		return
	}
	vh = newHider(o)
	if cfg.Blocked != nil {
		b := cfg.Blocked[i]
		same = b != nil && b.Position == o.Position && b.Face == o.Face && sameObstacles(b.Obstacles, o.Obstacles)
	}
	return cmin, c.Mount().Boresight(), vh, same
}

// sameObstacles reports whether a and b are the same slice.
func sameObstacles(a, b []sky.Obstacle) bool {
	return len(a) == len(b) && (len(a) == 0 || &a[0] == &b[0])
}

// viewerOf is cfg.Viewers[i]; nil without viewers.
func viewerOf(cfg *Config, i int) sky.Viewer {
	if cfg.Viewers == nil {
		return nil
	}
	return cfg.Viewers[i]
}

// inFront reports whether every unit direction d with d·axis ≥ cut lies
// above the plane of unit normal n by far more than sky.FacePlaneMargin
// (the cone's edge at least 1 mrad above it; closed form: the angle from
// n to d is at most the angle from n to the axis plus acos(cut)); true
// for a zero n (no plane).
func inFront(axis, n r3.Vec, cut float64) bool {
	if n == (r3.Vec{}) {
		return true
	}
	if math.Abs(vecmath.Norm(n)-1) > 1e-9 || math.Abs(vecmath.Norm(axis)-1) > 1e-9 || !(cut > -1 && cut <= 1) {
		return false
	}
	return angleBetween(axis, n)+math.Acos(cut) < math.Pi/2-1e-3
}

// addCounts adds the viewer's counts of the steps viewed so far to a unit's
// accumulator.
func (w *viewer) addCounts(a *unitAcc) {
	for i := range w.inView {
		a.inView[i] += w.inView[i]
		a.moonInView[i] += w.moonInView[i]
		a.litEarthInView[i] += w.litEarthInView[i]
	}
}

// bodies fills sg.bodies: the Moon from the spacecraft at r (its geocentric
// position less r), hidden when its whole disc is behind the Earth's, lit by
// Meeus's (48.1) from the Earth's centre; the Earth's angular radius and
// whether the sub-satellite point is sunlit (r·ŝ > 0). rn is |r|.
func (g *geometry) bodies(sg *stepGeom, M *bodyMatrix, r r3.Vec, rn float64, sunU r3.Vec, sunD float64) {
	mU, mD := g.moon.at(sg.t)
	geo := r3.Scale(mD, mU)
	rel := r3.Sub(geo, r)
	d := vecmath.Norm(rel)
	b := &sg.bodies
	b.MoonDir = M.toBody(r3.Scale(1/d, rel))
	b.MoonSin = ephem.MoonRadiusKm / d
	b.MoonCos = math.Sqrt(1 - b.MoonSin*b.MoonSin)
	b.MoonLit = ephem.MoonIlluminatedFraction(geo, r3.Scale(sunD, sunU))
	b.NadirDir = sg.nadirBody
	b.EarthSin = min(1, illum.EarthRadiusKm/rn)
	b.EarthCos = math.Sqrt(1 - b.EarthSin*b.EarthSin)
	b.EarthLit = r3.Dot(r, sunU) > 0
	// Wholly hidden: the angle from nadir to the Moon's centre is at most
	// ρE − ρM, i.e. its cosine at least cos ρE·cos ρM + sin ρE·sin ρM.
	b.MoonHidden = r3.Dot(b.MoonDir, b.NadirDir) >= b.EarthCos*b.MoonCos+b.EarthSin*b.MoonSin
}

// pastBody copies each sensor's albedo into dst (nil: none to copy),
// dropped where the body blocks its mean arrival direction.
func (w *viewer) pastBody(dst, albBody []sensor.Albedo) {
	for i := range dst {
		dst[i] = albBody[i]
		if albBody[i].Irradiance > 0 && w.hide[i].hidden(albBody[i].Dir) {
			dst[i] = sensor.Albedo{}
		}
	}
}

// reader reads one unit's sensors on a step's geometry and folds the result
// into its accumulator.
type reader struct {
	cfg             *Config
	arr             *sensor.Array
	ests            []sensor.Estimator
	bank            *sensor.CosineBank // every sensor, when all are cosine sensors without a temperature model
	readNo, readAlb []sensor.Reading
	noiseSrc        *rand.PCG
	noise           *rand.Rand
	acc             *unitAcc
	unit            int
	withAlbedo      bool
	filt            *gyroFilter // nil without a filter
	// The sensors with a blinding rule that can act.
	blinders  []int
	blindable []sensor.Blindable // blindable[j] is sensor blinders[j]
	// warm[i] is sensor i when its temperature model changes its readings
	// (nil otherwise; the slice is nil when no sensor has one); temps[i] is
	// its temperature at the step (°C).
	warm  []sensor.Warm
	temps []float64
	// With an on-board albedo model: the readings after its prediction is
	// subtracted (readCorr) and each sensor's subtraction (nil: a kind the
	// flight software does not correct, whose reading passes unchanged).
	readCorr  []sensor.Reading
	subtracts []sensor.AlbedoSubtracter
}

func newReader(cfg *Config, arr *sensor.Array, u, k0 int) *reader {
	n := arr.Len()
	r := &reader{cfg: cfg, arr: arr, ests: cfg.Estimators, unit: u, withAlbedo: cfg.NewAlbedo != nil,
		readNo: make([]sensor.Reading, n), readAlb: make([]sensor.Reading, n)}
	r.noiseSrc = rand.NewPCG(0, 0)
	r.noise = rand.New(r.noiseSrc)
	r.warm = warmSensors(arr)
	if r.warm != nil {
		// Readings at the sensors' temperatures go through ReadAt.
		r.temps = make([]float64, n)
	} else if cs := allCosines(arr); cs != nil {
		r.bank = sensor.NewCosineBank(cs)
	}
	for i, s := range arr.Sensors() {
		if b, ok := s.(sensor.Blindable); ok && b.Blinding() {
			r.blinders, r.blindable = append(r.blinders, i), append(r.blindable, b)
		}
	}
	if r.withAlbedo && cfg.NewCorrection != nil {
		r.readCorr = make([]sensor.Reading, n)
		for _, s := range arr.Sensors() {
			sub, _ := s.(sensor.AlbedoSubtracter)
			r.subtracts = append(r.subtracts, sub)
		}
	}
	if cfg.Filter != nil {
		r.filt = newGyroFilter(cfg, cfg.Array, u)
	}
	r.acc = newUnitAcc(cfg, arr, r.withAlbedo, r.readCorr != nil, u == 0, u < cfg.GapListUnits, float64(k0)*cfg.Step)
	r.acc.unit, r.acc.k0 = u, k0
	return r
}

// step reads the sensors at step k on the step's geometry g and view v. It
// allocates nothing unless a time series is kept.
func (r *reader) step(k int, g *stepGeom, v *stepView) {
	if k%noiseBlockSteps == 0 || k == r.acc.k0 {
		seedNoise(r.noiseSrc, r.cfg.Seed, r.unit, k)
	}
	// Readings without albedo, then with it, on the same noise draws: a
	// cosine array reads both in one pass (Cosine.ReadPair), other kinds
	// replay the noise stream.
	if r.bank != nil {
		if r.withAlbedo {
			r.bank.ReadPair(r.readNo, r.readAlb, g.sunBody, g.direct, v.albSeen, v.sunBlocked, r.noise)
		} else {
			r.bank.Read(r.readNo, g.sunBody, g.direct, v.sunBlocked, r.noise)
		}
	} else if r.warm != nil {
		for i, w := range r.warm {
			if w != nil {
				r.temps[i] = w.ThermalModel().Temperature(g.lit)
			}
		}
		saved := *r.noiseSrc
		readAllAt(r.readNo, r.warm, r.arr, g.sunBody, g.direct, nil, r.noise, v.sunBlocked, r.temps)
		if r.withAlbedo {
			*r.noiseSrc = saved
			readAllAt(r.readAlb, r.warm, r.arr, g.sunBody, g.direct, v.albSeen, r.noise, v.sunBlocked, r.temps)
		}
	} else {
		saved := *r.noiseSrc
		readAll(r.readNo, r.arr, g.sunBody, g.direct, nil, r.noise, v.sunBlocked)
		if r.withAlbedo {
			*r.noiseSrc = saved
			readAll(r.readAlb, r.arr, g.sunBody, g.direct, v.albSeen, r.noise, v.sunBlocked)
		}
	}
	r.blind(&g.bodies, v)
	if r.readCorr != nil {
		r.subtractPrediction(v.predSeen)
	}
	// A cosine bank copies a reading without albedo when the sensor gets
	// none (CosineBank.ReadPair): with no albedo on any sensor the two
	// lists are the same bits.
	same := r.bank != nil && r.withAlbedo && v.noAlbedo
	r.acc.step(k, g.t, g.region, g.lit, v.seen, g.sunBody, g.nadirBody, g.sinBeta, r.readNo, r.readAlb, r.readCorr, same, r.arr, r.ests)
	if r.filt != nil {
		real := r.readNo
		if r.withAlbedo {
			real = r.readAlb
		}
		r.filt.step(g, real, r.acc.primary)
	}
}

// noAlbedo reports whether no sensor gets albedo.
func noAlbedo(alb []sensor.Albedo) bool {
	for i := range alb {
		if alb[i].Irradiance != 0 {
			return false
		}
	}
	return true
}

// blind drops the readings of the sensors their blinding rule invalidates
// (the unit as drawn). The steps with the Moon and the lit Earth in each
// nominal cone are the viewer's counts.
func (r *reader) blind(b *sensor.Bodies, v *stepView) {
	for j, i := range r.blinders {
		// A Moon or lit Earth the body hides from the sensor cannot blind it.
		bb := *b
		bb.MoonHidden = bb.MoonHidden || v.moonHid[i]
		bb.EarthLit = bb.EarthLit && !v.earthHid[i]
		if r.blindable[j].Blinded(bb) {
			r.readNo[i], r.readAlb[i] = sensor.Reading{}, sensor.Reading{}
			r.acc.blinded[i]++
		}
	}
}

// subtractPrediction forms the corrected readings: each correctable
// sensor's realistic reading less the on-board prediction pred (past the
// body). The other sensors' readings pass unchanged.
func (r *reader) subtractPrediction(pred []sensor.Albedo) {
	for i, sub := range r.subtracts {
		if sub == nil {
			r.readCorr[i] = r.readAlb[i]
			continue
		}
		r.readCorr[i] = sub.SubtractAlbedo(r.readAlb[i], pred[i])
	}
}

// blockSteps is the length of the blocks of steps the step loop runs
// stage by stage: the geometry and the view of a whole block first (once
// for all units of a task), then each unit reads its sensors over the
// block, so that a unit's sensors, estimators and accumulators stay in
// cache for the block's steps. Each unit sees the same steps in the same
// order as step by step: the results do not depend on the length
// (TestBlockLengthChangesNothing sets it).
var blockSteps = 256

// streamRows is the number of series samples the first piece of a
// streamed series holds before it hands them on (task.stream).
var streamRows = 8192

// runChunk simulates the steps [tk.k0, tk.k1) of units [tk.u0, tk.u1),
// whose sensors (with their drawn errors) are arrays[u]: the geometry is
// computed once per step (on the nominal mounts, with unit tk.u0's
// attitude, the same for every unit of a task) and each unit's sensors are
// read on it, block by block (blockSteps).
func runChunk(ctx context.Context, cfg *Config, arrays []*sensor.Array, tk task, done *atomic.Int64, total int, tables albedoTables, integ *integration) ([]*unitAcc, error) {
	g, err := newGeometry(cfg, arrays[tk.u0], tk.u0, tables)
	if err != nil {
		return nil, err
	}
	if integ != nil {
		g.prop = integ.forPiece(tk.chunk)
	}
	readers := make([]*reader, tk.u1-tk.u0)
	for i := range readers {
		readers[i] = newReader(cfg, arrays[tk.u0+i], tk.u0+i, tk.k0)
	}
	albBody := make([]sensor.Albedo, arrays[tk.u0].Len())
	predBody := make([]sensor.Albedo, len(albBody))
	vw := newViewer(cfg, arrays[tk.u0])
	n := int64(len(readers))
	geoms := make([]stepGeom, min(blockSteps, tk.k1-tk.k0))
	views := vw.newViews(len(geoms))
	for b0 := tk.k0; b0 < tk.k1; b0 += len(geoms) {
		if b0 > tk.k0 {
			if ctx.Err() != nil {
				return nil, ctx.Err()
			}
			if d := done.Add(int64(len(geoms)) * n); cfg.Progress != nil && b0&1023 == 0 {
				cfg.Progress(float64(d) / float64(total))
			}
		}
		m := min(len(geoms), tk.k1-b0)
		for j := range m {
			g.fill(&geoms[j], b0+j, albBody, predBody)
			vw.view(&views[j], &geoms[j], albBody, predBody)
		}
		for _, r := range readers {
			for j := range m {
				r.step(b0+j, &geoms[j], &views[j])
			}
		}
		// The first piece of unit 0 hands its series on as it grows.
		if s := readers[0].acc.series; tk.stream != nil && s != nil && len(s.T) >= streamRows {
			if err := tk.stream(s); err != nil {
				return nil, err
			}
			s.reset()
		}
	}
	// The last sample stands for the time up to the run's end, not a whole
	// step beyond it: no spell outlasts the run.
	accs := make([]*unitAcc, len(readers))
	for i, r := range readers {
		vw.addCounts(r.acc)
		r.acc.end(min(float64(tk.k1)*cfg.Step, cfg.Duration))
		if r.filt != nil {
			r.acc.filter = r.filt.result(min(float64(tk.k1)*cfg.Step, cfg.Duration))
		}
		accs[i] = r.acc
	}
	return accs, nil
}

// readAll reads every sensor; blocked[i] (nil: none blocked) cuts sensor i's
// direct sunlight.
func readAll(dst []sensor.Reading, arr *sensor.Array, sun r3.Vec, direct float64, alb []sensor.Albedo, noise *rand.Rand, blocked []bool) {
	if blocked == nil {
		arr.Read(dst, sun, direct, alb, noise)
		return
	}
	for i, s := range arr.Sensors() {
		d := direct
		if blocked[i] {
			d = 0
		}
		var a sensor.Albedo
		if alb != nil {
			a = alb[i]
		}
		dst[i] = s.Read(sun, d, a, noise)
	}
}

// allCosines returns the sensors of arr when all are cosine sensors, nil
// otherwise.
func allCosines(arr *sensor.Array) []*sensor.Cosine {
	var cs []*sensor.Cosine
	for _, s := range arr.Sensors() {
		c, ok := s.(*sensor.Cosine)
		if !ok {
			return nil
		}
		cs = append(cs, c)
	}
	return cs
}

// warmSensors returns, per sensor, the ones whose temperature model changes
// their readings (nil entries for the others); nil when none does.
func warmSensors(arr *sensor.Array) []sensor.Warm {
	var out []sensor.Warm
	for i, s := range arr.Sensors() {
		if w, ok := s.(sensor.Warm); ok && w.ThermalModel().On() {
			if out == nil {
				out = make([]sensor.Warm, arr.Len())
			}
			out[i] = w
		}
	}
	return out
}

// readAllAt is readAll with the sensors of warm (non-nil entries) read at
// their temperatures temps[i] (°C).
func readAllAt(dst []sensor.Reading, warm []sensor.Warm, arr *sensor.Array, sun r3.Vec, direct float64, alb []sensor.Albedo, noise *rand.Rand, blocked []bool, temps []float64) {
	for i, s := range arr.Sensors() {
		d := direct
		if blocked != nil && blocked[i] {
			d = 0
		}
		var a sensor.Albedo
		if alb != nil {
			a = alb[i]
		}
		if w := warm[i]; w != nil {
			dst[i] = w.ReadAt(sun, d, a, noise, temps[i])
			continue
		}
		dst[i] = s.Read(sun, d, a, noise)
	}
}

// attitudeRot is a body ← ECI rotation with named directions of use.
type attitudeRot r3.Rotation

// toBody expresses an ECI vector in body axes.
func (a attitudeRot) toBody(v r3.Vec) r3.Vec { return r3.Rotation(a).Rotate(v) }

// bodyMatrix is the direction-cosine matrix of an attitude: rows are the
// body axes in ECI. Applying it costs 9 products where a quaternion
// rotation costs two Hamilton products, so the step builds it once.
type bodyMatrix [3]r3.Vec

// matrix returns the DCM of the rotation q·v·q̄.
func (a attitudeRot) matrix() bodyMatrix { return bodyMatrix(attitude.RowsOf(r3.Rotation(a))) }

// toBody expresses an ECI vector in body axes.
func (m *bodyMatrix) toBody(v r3.Vec) r3.Vec {
	return r3.Vec{X: r3.Dot(m[0], v), Y: r3.Dot(m[1], v), Z: r3.Dot(m[2], v)}
}

// toECI expresses a body vector in ECI axes (the transpose).
func (m *bodyMatrix) toECI(v r3.Vec) r3.Vec {
	return r3.Add(r3.Add(r3.Scale(v.X, m[0]), r3.Scale(v.Y, m[1])), r3.Scale(v.Z, m[2]))
}

// toECI expresses a body vector in ECI axes (the conjugate rotation).
func (a attitudeRot) toECI(v r3.Vec) r3.Vec {
	q := quat.Conj(quat.Number(a))
	return r3.Rotation(q).Rotate(v)
}

// shadow evaluates the configured shadow model. The day side (r·ŝ ≥ 0) of an
// orbit above 100 km is always in full sun: there the Earth's centre is at
// least 90° − 0.02° from the sun while the Earth's and sun's apparent radii
// add up to less than 80° (closed form), so the conical test is skipped.
func shadow(cylindrical bool, r, sunU r3.Vec, sunD float64) (float64, illum.Region) {
	if r3.Dot(r, sunU) >= 0 && r3.Norm2(r) > (illum.EarthRadiusKm+100)*(illum.EarthRadiusKm+100) {
		return 1, illum.Sunlit
	}
	if cylindrical {
		lit := illum.ShadowCylindrical(r, sunU)
		if lit > 0 {
			return 1, illum.Sunlit
		}
		return 0, illum.Umbra
	}
	return illum.ShadowConical(r, r3.Scale(sunD, sunU))
}

// crossesPlane reports whether a cone of half-angle h about the unit
// boresight b reaches behind the plane of outward normal n: the angle from
// n to b plus h exceeds 90°.
func crossesPlane(b, n r3.Vec, h float64) bool {
	if n == (r3.Vec{}) {
		return false
	}
	return angleBetween(b, n)+h > math.Pi/2+1e-12
}
