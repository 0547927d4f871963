package albedo

import (
	"fmt"
	"math"
	"time"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// Sensor is a small flat sensor seen by the albedo model.
type Sensor struct {
	Normal    r3.Vec   // boresight, unit, EME2000
	HalfAngle float64  // cone field of view, rad, (0, π/2]
	Response  Response // relative response vs incidence; zero value = cosine
	// Cells, when set, is a detector split into cells (a four-quadrant
	// sensor): the sum runs through each cell's own response, in the
	// sensor frame (X, Y, Normal), instead of Response, and fills
	// Result.Cells. HalfAngle still bounds the cells the sum visits.
	Cells CellResponse
	X, Y  r3.Vec // sensor axes with Cells: unit, ⟂ Normal, Y = Normal × X
	// Plane, when not zero, is the outward unit normal (EME2000) of the
	// surface the sensor sits on: light arriving from directions at or
	// behind that plane (u·Plane ≤ 0) is cut, as the body hides it. A
	// tilted sensor's cone reaches behind its face; the plane clips it.
	Plane r3.Vec
}

// behind reports whether the cell's direction lies at or behind the
// sensor's mounting plane p (cap frame; zero p: never).
func behind(p r3.Vec, l *cell) bool {
	return p != (r3.Vec{}) && p.X*l.ux+p.Y*l.uy+p.Z*l.uz <= 0
}

// CellResponse is the response of a detector split into up to four cells to
// a collimated beam arriving from the sensor-frame direction d (d.Z = cos θ
// > 0; d need not be unit: the response must scale with |d| as cos θ does):
// the relative response of each cell, so that a direct beam of irradiance S
// gives cell i the signal S·CellResponse(d)[i].
type CellResponse interface {
	CellResponse(d r3.Vec) [4]float64
}

// Validate reports a sensor the model cannot use; field names the sensor in
// the caller's terms (for example "sensors[2]").
func (s Sensor) Validate(field string) error {
	n := vecmath.Norm(s.Normal)
	if math.IsNaN(n) || math.Abs(n-1) > 1e-6 {
		return fmt.Errorf("albedo: %s.normal has length %g: give a unit vector", field, n)
	}
	if !(s.HalfAngle > 0 && s.HalfAngle <= math.Pi/2) {
		return fmt.Errorf("albedo: %s.half_angle = %g rad: must lie in (0, π/2]", field, s.HalfAngle)
	}
	return nil
}

// Result is the albedo seen by one sensor.
type Result struct {
	// Irradiance is ∫ L(ω)·R(θ) dω over the field of view, W/m². For a cosine
	// sensor it is the irradiance on the sensor plane; compare it with
	// S·R(θ_sun) of the direct sun.
	Irradiance float64
	// Dir is the irradiance-weighted mean arrival direction (unit, EME2000,
	// from the spacecraft toward the Earth); the zero vector when Irradiance is 0.
	Dir r3.Vec
	// Fill is the fraction of the field-of-view solid angle filled by sunlit,
	// visible Earth, in [0, 1].
	Fill float64
	// Cells is, for a sensor with Cells, ∫ L(ω)·CellResponse(ω)[i] dω
	// per cell (W/m²); Irradiance is then their sum.
	Cells [4]float64
}

// Config sets up a Model.
type Config struct {
	// Reflectance of the Earth; nil means Uniform{DefaultAlbedo}.
	Reflectance Reflectance
	// Cells on the visible cap; 0 means DefaultCells. See the convergence
	// table in the package documentation.
	Cells int
	// AltitudeKm builds the cap geometry ahead of the first call; 0 means
	// "any altitude": the geometry is built at the first call.
	AltitudeKm float64
	// RebuildKm: the geometry is rebuilt when the orbit radius differs from
	// the one it was built for by more than this; 0 means DefaultRebuildKm.
	RebuildKm float64
}

// Model integrates Earth albedo over the visible cap. A Model keeps scratch
// space: use one per goroutine.
type Model struct {
	refl      Reflectance
	kind      int
	n         int
	rebuildKm float64
	geo       capGeometry
	gx, gw    []float64 // Gauss–Legendre nodes for the cells' radial means
	w         []float64 // per cell: its lit weight, or unlit (< 0) at this step
	runs      []span    // scratch: the runs of cells one sensor may see
	fullScan  bool      // visit every cell (the reference the tests compare with)
	// zonalInRange: a Zonal reflectance that stays inside [0, 1] at every
	// latitude and season, so its clamp is the identity and is skipped.
	zonalInRange bool
	// tabs, with NewTableFactory: the shared zonal tables; kinds the ones
	// this model has met, frame and served the scratch of a step.
	tabs   *sharedTables
	kinds  []coneTable
	frame  SunFrame
	served []bool
}

// unlit marks a cell of Model.w the sun does not light at this step.
const unlit = -1.0

// radialNodes is the Gauss–Legendre order of the cells' radial means.
const radialNodes = 6

const (
	kindUniform = iota
	kindZonal
	kindGrid
	kindOther
)

// New returns a model, or an error naming the field of cfg that is wrong.
func New(cfg Config) (*Model, error) {
	m := &Model{refl: cfg.Reflectance, n: cfg.Cells, rebuildKm: cfg.RebuildKm}
	if m.refl == nil {
		m.refl = Uniform{Albedo: DefaultAlbedo}
	}
	if err := checkReflectance(m.refl); err != nil {
		return nil, err
	}
	switch m.refl.(type) {
	case Uniform:
		m.kind = kindUniform
	case Zonal:
		m.kind = kindZonal
		m.zonalInRange = m.refl.(Zonal).inRange()
	case *Grid:
		m.kind = kindGrid
	default:
		m.kind = kindOther
	}
	if m.n == 0 {
		m.n = DefaultCells
	}
	if m.n < 16 || m.n > 1_000_000 {
		return nil, fmt.Errorf("albedo: config.cells = %d: must lie in [16, 1000000] (0 for the default %d)", cfg.Cells, DefaultCells)
	}
	if m.rebuildKm == 0 {
		m.rebuildKm = DefaultRebuildKm
	}
	if !(m.rebuildKm > 0) || math.IsInf(m.rebuildKm, 0) {
		return nil, fmt.Errorf("albedo: config.rebuild_km = %g: must be a positive distance in km (0 for the default %g)", cfg.RebuildKm, DefaultRebuildKm)
	}
	if math.IsNaN(cfg.AltitudeKm) || cfg.AltitudeKm < 0 || math.IsInf(cfg.AltitudeKm, 0) {
		return nil, fmt.Errorf("albedo: config.altitude_km = %g: must be a finite altitude ≥ 0 km (0 for any altitude)", cfg.AltitudeKm)
	}
	m.w = make([]float64, 0, m.n)
	m.gx, m.gw = make([]float64, radialNodes), make([]float64, radialNodes)
	quad.Legendre{}.FixedLocations(m.gx, m.gw, -1, 1)
	if cfg.AltitudeKm > 0 {
		m.geo.build(EarthRadiusKm+cfg.AltitudeKm, m.n, m.gx, m.gw)
	}
	return m, nil
}

// Cells returns the number of cells on the visible cap.
func (m *Model) Cells() int { return m.n }

// IsUniform reports whether the model's reflectance is the same everywhere
// (the case the albedo tables serve).
func (m *Model) IsUniform() bool { return m.kind == kindUniform }

// SharesTables reports whether the model reads its cones from the shared
// zonal tables of NewTableFactory (built on first use).
func (m *Model) SharesTables() bool { return m.tabs != nil }

// SharesTablesWith reports whether m and o read their cones from the same
// shared zonal tables (models of one NewTableFactory).
func (m *Model) SharesTablesWith(o *Model) bool { return m.tabs != nil && m.tabs == o.tabs }

// capFrame returns the unit basis (ex, ey, ez) of the cap frame, ez toward rSat.
func capFrame(rSat r3.Vec, r float64) (ex, ey, ez r3.Vec) {
	ez = r3.Scale(1/r, rSat)
	ref := r3.Vec{Z: 1}
	if math.Abs(ez.Z) > 0.9 {
		ref = r3.Vec{X: 1}
	}
	ex = vecmath.Unit(r3.Cross(ref, ez))
	ey = r3.Cross(ez, ex)
	return ex, ey, ez
}

// ensureGeometry rebuilds the cap cells when r has drifted by more than RebuildKm.
func (m *Model) ensureGeometry(r float64) {
	if len(m.geo.cells) == 0 || math.Abs(r-m.geo.rKm) > m.rebuildKm {
		m.geo.build(r, m.n, m.gx, m.gw)
	}
	m.w = m.w[:len(m.geo.cells)]
	if cap(m.runs) < 2*len(m.geo.rings) {
		m.runs = make([]span, 0, 2*len(m.geo.rings))
	}
}

func toFrame(v, ex, ey, ez r3.Vec) r3.Vec {
	return r3.Vec{X: r3.Dot(v, ex), Y: r3.Dot(v, ey), Z: r3.Dot(v, ez)}
}

// Irradiance writes into dst[i] the albedo seen by sensors[i], for a spacecraft
// at rSat (km, EME2000), a sun in unit direction sunDir at sunDistKm (the sun
// is taken at infinity for the direction, its distance scales S), the
// Greenwich mean sidereal angle gmst (rad) and the Julian date jdTT. It does
// not allocate. dst must be at least as long as sensors. A spacecraft at or
// below the surface gets zero results.
func (m *Model) Irradiance(dst []Result, rSat, sunDir r3.Vec, sunDistKm, gmst, jdTT float64, sensors []Sensor) {
	if len(dst) < len(sensors) {
		panic("albedo: dst shorter than sensors")
	}
	for i := range sensors {
		dst[i] = Result{}
	}
	r := vecmath.Norm(rSat)
	if !(r > EarthRadiusKm) || !(sunDistKm > 0) {
		return
	}
	served := m.served[:0]
	if m.tabs != nil {
		if cap(m.served) < len(sensors) {
			m.served = make([]bool, len(sensors))
		}
		served = m.served[:len(sensors)]
		if m.fromTables(dst, served, rSat, sunDir, r, sunDistKm, jdTT, sensors) {
			return
		}
	}
	m.ensureGeometry(r)
	ex, ey, ez := capFrame(rSat, r)
	s := toFrame(sunDir, ex, ey, ez)
	q := AUKm / sunDistKm
	irr := SolarIrradiance1AU * q * q // S(d) = S₀ (AU/d)²

	// Pass 1, shared by all sensors: the radiance times solid angle of every
	// sunlit cell, w = L·ω with L = ρ S (N̂·ŝ)/π (Lambert's law) and
	// ω = π g, so w = ρ S (N̂·ŝ) g (cell sum of Bhanderi & Bak 2005, from
	// memory); unlit cells are marked.
	w := m.w
	switch m.kind {
	case kindUniform:
		k := m.refl.(Uniform).Albedo * irr
		for i := range m.geo.cells {
			c := &m.geo.cells[i]
			cs := c.px*s.X + c.py*s.Y + c.pz*s.Z // N̂·ŝ
			if cs <= 0 {
				w[i] = unlit
				continue
			}
			w[i] = k * cs * c.g
		}
	case kindZonal:
		z := m.refl.(Zonal)
		a1 := z.a1(jdTT)
		pole := r3.Vec{X: ex.Z, Y: ey.Z, Z: ez.Z} // EME2000 z axis in the cap frame
		for i := range m.geo.cells {
			c := &m.geo.cells[i]
			cs := c.px*s.X + c.py*s.Y + c.pz*s.Z
			if cs <= 0 {
				w[i] = unlit
				continue
			}
			sφ := c.px*pole.X + c.py*pole.Y + c.pz*pole.Z
			if m.zonalInRange {
				w[i] = z.unclamped(sφ, a1) * irr * cs * c.g
			} else {
				w[i] = z.at(sφ, a1) * irr * cs * c.g
			}
		}
	default:
		var month int
		g, isGrid := m.refl.(*Grid)
		if isGrid {
			month = monthOf(jdTT)
		}
		for i := range m.geo.cells {
			c := &m.geo.cells[i]
			cs := c.px*s.X + c.py*s.Y + c.pz*s.Z
			if cs <= 0 {
				w[i] = unlit
				continue
			}
			x := c.px*ex.X + c.py*ey.X + c.pz*ez.X
			y := c.px*ex.Y + c.py*ey.Y + c.pz*ez.Y
			zz := c.px*ex.Z + c.py*ey.Z + c.pz*ez.Z
			// The cell's mean normal is slightly shorter than 1 near the limb.
			q := min(1, max(-1, zz/math.Sqrt(x*x+y*y+zz*zz)))
			var ρ float64
			if isGrid {
				// The row and column of asin(q) and atan2(y, x) − gmst,
				// found without either where a bin decides them.
				ρ = g.value(g.rowOfSin(q), g.columnOf(y, x, gmst), month)
			} else {
				lat := math.Asin(q)
				lon := math.Atan2(y, x) - gmst // Earth-fixed longitude through GMST
				ρ = min(1, max(0, m.refl.Reflectance(lat, lon, jdTT)))
			}
			w[i] = ρ * irr * cs * c.g
		}
	}

	// Pass 2: each sensor sums over the lit cells in its cone.
	for i := range sensors {
		if len(served) > 0 && served[i] {
			continue
		}
		dst[i] = m.sumSensor(&sensors[i], ex, ey, ez)
	}
}

// sumCells integrates the lit cells through a cell detector's own
// responses: each Earth cell lights the detector cells its own direction
// lights (midpoint rule on the cell's mean arrival direction; the cell
// responses are continuous, so no edge weighting is needed).
func (m *Model) sumCells(sn *Sensor, ex, ey, ez r3.Vec) Result {
	geo := &m.geo
	n := toFrame(sn.Normal, ex, ey, ez)
	x, y := toFrame(sn.X, ex, ey, ez), toFrame(sn.Y, ex, ey, ez)
	p := toFrame(sn.Plane, ex, ey, ez)
	var res Result
	if missesDisc(n, sn.HalfAngle, geo) {
		return res
	}
	var dx, dy, dz, count float64
	m.runs = geo.windows(m.runs, n, 0, m.fullScan)
	for _, run := range m.runs {
		for k := run.lo; k < run.hi; k++ {
			lw := m.w[k]
			if lw < 0 {
				continue
			}
			l := &geo.cells[k]
			c := n.X*l.ux + n.Y*l.uy + n.Z*l.uz
			if c <= 0 || behind(p, l) {
				continue
			}
			d := r3.Vec{X: x.X*l.ux + x.Y*l.uy + x.Z*l.uz, Y: y.X*l.ux + y.Y*l.uy + y.Z*l.uz, Z: c}
			w := sn.Cells.CellResponse(d)
			t := w[0] + w[1] + w[2] + w[3]
			if t <= 0 {
				continue
			}
			count++
			for i := range w {
				res.Cells[i] += lw * w[i]
			}
			we := lw * t
			res.Irradiance += we
			dx += we * l.ux
			dy += we * l.uy
			dz += we * l.uz
		}
	}
	if res.Irradiance > 0 {
		res.Dir = capToECI(dx, dy, dz, ex, ey, ez)
	}
	cosH := math.Cos(sn.HalfAngle)
	res.Fill = min(1, count*geo.cellSolidAngle/(2*math.Pi*(1-cosH)))
	return res
}

// coneWeight is the weight a cone sensor gives a cell at cos θ = c from its
// boresight. Cells within hw of the cone edge are cut by it: the sensor
// weight is averaged over the cell, taking cos θ as uniform on [c − δ, c + δ],
// δ = hw·sin θ (hw = half the angular cell size). Away from the edge the
// weight is cos θ (cosine) or R(θ) at the centre. Every cell has the same
// solid angle, so the filled solid angle is that times the cell count.
type coneWeight struct {
	cosH, hw, inner, outer float64
	resp                   Response
	cosine                 bool
}

func newConeWeight(sn *Sensor, hw float64) coneWeight {
	cosH := math.Cos(sn.HalfAngle)
	if sn.HalfAngle >= math.Pi/2 {
		cosH = 0
	}
	return coneWeight{cosH: cosH, hw: hw, inner: cosH + hw, outer: cosH - hw, resp: sn.Response, cosine: sn.Response.IsCosine()}
}

// at returns the weight f of a cell at cosine c from the boresight and the
// share frac of the cell inside the cone (frac = 0: out of view): c itself
// for a cosine sensor with the cell wholly inside, else edge.
func (k *coneWeight) at(c float64) (f, frac float64) {
	switch {
	case c <= k.outer:
		return 0, 0
	case k.cosine && c >= k.inner:
		return c, 1
	}
	return k.edge(c)
}

// edge returns the weight f of a cell at c with outer < c and not (c ≥
// inner on a cosine response), and the share frac of the cell inside the
// cone; frac = 0 means the cell is out of view. The common case (a cosine
// sensor, the cell wholly inside: f = c) is left to the caller's loop.
func (k *coneWeight) edge(c float64) (f, frac float64) {
	if c >= k.inner {
		return k.resp.At(c), 1
	}
	δ := k.hw * math.Sqrt(max(0, 1-c*c))
	lo, hi := max(k.cosH, c-δ), c+δ
	switch {
	case δ == 0 && c > k.cosH:
		return k.resp.At(c), 1
	case δ == 0 || lo >= hi:
		return 0, 0
	}
	frac = (hi - lo) / (2 * δ)
	if k.cosine {
		return (hi*hi - lo*lo) / (4 * δ), frac // mean of c over [lo, hi] × frac
	}
	return frac * k.resp.At(0.5*(lo+hi)), frac
}

// missesDisc reports whether a cone of half-angle h about the cap-frame
// boresight n misses the Earth's disc (angular radius η about nadir −z)
// with a cell's margin: it then sees nothing.
func missesDisc(n r3.Vec, h float64, geo *capGeometry) bool {
	return math.Acos(max(-1, min(1, -n.Z))) >= geo.η+h+geo.halfWidth
}

// sumSensor integrates the lit cells over one sensor's cone: E = Σ L R(θ) ω
// (Bhanderi & Bak 2005, from memory), with the cone weights of coneWeight.
func (m *Model) sumSensor(sn *Sensor, ex, ey, ez r3.Vec) Result {
	if sn.Cells != nil {
		return m.sumCells(sn, ex, ey, ez)
	}
	geo := &m.geo
	n := toFrame(sn.Normal, ex, ey, ez)
	p := toFrame(sn.Plane, ex, ey, ez) // zero without a plane
	var res Result
	if missesDisc(n, sn.HalfAngle, geo) {
		return res
	}
	cw := newConeWeight(sn, geo.halfWidth)
	plane := p != (r3.Vec{})
	var e, dx, dy, dz, count float64
	m.runs = geo.windows(m.runs, n, cw.outer, m.fullScan)
	for _, run := range m.runs {
		for k := run.lo; k < run.hi; k++ {
			lw := m.w[k]
			if lw < 0 {
				continue
			}
			l := &geo.cells[k]
			c := n.X*l.ux + n.Y*l.uy + n.Z*l.uz // cos θ at the sensor
			if c <= cw.outer || (plane && behind(p, l)) {
				continue
			}
			// coneWeight.at written out: the common case stays in the loop.
			f, frac := c, 1.0
			if !(cw.cosine && c >= cw.inner) {
				if f, frac = cw.edge(c); frac == 0 {
					continue
				}
			}
			count += frac
			we := lw * f
			e += we
			dx += we * l.ux
			dy += we * l.uy
			dz += we * l.uz
		}
	}
	if e > 0 {
		res.Irradiance = e
		res.Dir = capToECI(dx, dy, dz, ex, ey, ez)
	}
	res.Fill = min(1, count*geo.cellSolidAngle/(2*math.Pi*(1-cw.cosH)))
	return res
}

// capToECI returns the unit vector along the cap-frame sum (dx, dy, dz).
func capToECI(dx, dy, dz float64, ex, ey, ez r3.Vec) r3.Vec {
	return vecmath.Unit(r3.Add(r3.Add(r3.Scale(dx, ex), r3.Scale(dy, ey)), r3.Scale(dz, ez)))
}

// ViewFactor returns the geometric view factor from a flat element with unit
// normal (EME2000) and cone half-angle halfAngle at rSat to the whole visible
// Earth, treating the Earth as a uniform Lambertian emitter (no sun, no
// reflectance), through the same cells and sensor sum as Irradiance.
// For halfAngle = π/2 it is the plane-element-to-sphere configuration factor.
func (m *Model) ViewFactor(rSat, normal r3.Vec, halfAngle float64) float64 {
	r := vecmath.Norm(rSat)
	if !(r > EarthRadiusKm) {
		return 0
	}
	m.ensureGeometry(r)
	ex, ey, ez := capFrame(rSat, r)
	for i := range m.geo.cells {
		m.w[i] = m.geo.cells[i].g
	}
	s := Sensor{Normal: normal, HalfAngle: halfAngle}
	return m.sumSensor(&s, ex, ey, ez).Irradiance
}

// monthOf returns the calendar month 1…12 of Julian date jd (the TT–UTC
// difference of about a minute is ignored for a monthly map).
func monthOf(jd float64) int {
	const unixEpochJD = 2440587.5
	sec := (jd - unixEpochJD) * 86400
	if math.IsNaN(sec) || math.Abs(sec) > 1e15 {
		return 1
	}
	return int(time.Unix(int64(math.Floor(sec)), 0).UTC().Month())
}
