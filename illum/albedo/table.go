package albedo

import (
	"fmt"
	"math"
	"runtime"
	"sort"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// DefaultTableResDeg is the default grid step of a LocalTable, degrees.
const DefaultTableResDeg = 1.0

// tableVals is the number of values stored per sensor and grid node:
// E, the three components of E·Dir, and Fill.
const tableVals = 5

// LocalTable holds, for sensors given in a local frame whose +Z axis points
// to nadir (any x and y axes), the albedo Result as a function of the sun
// direction in that frame, for a uniform reflectance at one orbit radius.
//
// With a uniform reflectance the visible cap is symmetric about nadir, so the
// albedo on a sensor fixed in such a frame depends only on the sun direction
// in it (and on S, which scales it). The table samples Model.Irradiance on a
// grid of the sun's polar angle from nadir and its azimuth and interpolates
// bilinearly; the accuracy is in the package documentation. A LocalTable is
// read-only after NewLocalTable and safe for concurrent use.
type LocalTable struct {
	radiusKm float64
	sensors  int
	polar    polarGrid
	nφ       int     // azimuth nodes on [0, 2π)
	dφ       float64 // azimuth step, rad
	darkZ    float64 // sun z (nadir component) at and above which no visible point is lit
	vals     []float64
}

// Polar band, degrees from nadir, where the table uses half the polar step.
// With the sun near 90° from nadir the terminator crosses the ground below
// the spacecraft, where the small nearby area fills most of the solid angle:
// the albedo and above all its mean direction turn fastest there (measured:
// at a uniform 1° step the worst direction error, 0.97° at 400 km, lies
// between 85° and 95°, and under 0.15° outside 80°…100°).
const (
	fineLoDeg  = 70.0
	fineHiDeg  = 110.0
	fineFactor = 2
)

// polarGrid is a piecewise uniform grid of the sun's polar angle θ from
// nadir on [0, π]: step h below lo, h/fineFactor on [lo, hi], h above hi.
type polarGrid struct {
	h, lo, hi  float64 // rad
	nLo, nFine int     // intervals below lo and on [lo, hi]
	n          int     // intervals in all
}

func newPolarGrid(nθ int) polarGrid {
	h := math.Pi / float64(nθ)
	nLo := int(math.Floor(fineLoDeg * math.Pi / 180 / h))
	nHi := int(math.Ceil(fineHiDeg * math.Pi / 180 / h))
	if nHi <= nLo { // a coarse grid: at least one refined interval
		nHi = nLo + 1
	}
	g := polarGrid{h: h, lo: float64(nLo) * h, hi: float64(nHi) * h, nLo: nLo, nFine: (nHi - nLo) * fineFactor}
	g.n = nLo + g.nFine + (nθ - nHi)
	return g
}

// angle returns the polar angle of node i.
func (g *polarGrid) angle(i int) float64 {
	switch {
	case i <= g.nLo:
		return float64(i) * g.h
	case i <= g.nLo+g.nFine:
		return g.lo + float64(i-g.nLo)*g.h/fineFactor
	}
	return g.hi + float64(i-g.nLo-g.nFine)*g.h
}

// locate returns the interval i holding θ ∈ [0, π] and the fraction a ∈ [0, 1] across it.
func (g *polarGrid) locate(θ float64) (int, float64) {
	var f float64
	switch {
	case θ < g.lo:
		f = θ / g.h
	case θ < g.hi:
		f = float64(g.nLo) + (θ-g.lo)/g.h*fineFactor
	default:
		f = float64(g.nLo+g.nFine) + (θ-g.hi)/g.h
	}
	i := min(int(f), g.n-1)
	return i, f - float64(i)
}

// NewLocalTable builds the table for sensors whose normals are given in the
// local frame (+Z to nadir), at orbit radius radiusKm, with a grid step of
// resDeg degrees in (0, 10] (DefaultTableResDeg is 1°; the step is shrunk so
// that it divides 180° and 360°). m gives the reflectance, which must be
// Uniform, and the cell count; m itself is only read. The build forms the
// cell sum of Model.Irradiance at every grid node (see build), on up to
// GOMAXPROCS goroutines; nodes where the sun lights no visible point are
// zero without integration.
func NewLocalTable(m *Model, radiusKm float64, sensors []Sensor, resDeg float64) (*LocalTable, error) {
	if m == nil {
		return nil, fmt.Errorf("albedo: local table: nil model")
	}
	u, ok := m.refl.(Uniform)
	if !ok {
		return nil, fmt.Errorf("albedo: local table: reflectance is %T: the table needs a uniform reflectance (the cap must be symmetric about nadir); use Model.Irradiance for zonal or gridded maps", m.refl)
	}
	if math.IsNaN(radiusKm) || math.IsInf(radiusKm, 0) || radiusKm <= EarthRadiusKm {
		return nil, fmt.Errorf("albedo: local table: radius_km = %g: must be a finite orbit radius above the Earth's radius %g km", radiusKm, EarthRadiusKm)
	}
	if !(resDeg > 0 && resDeg <= 10) {
		return nil, fmt.Errorf("albedo: local table: res_deg = %g: must lie in (0, 10] degrees (default %g)", resDeg, DefaultTableResDeg)
	}
	if len(sensors) == 0 {
		return nil, fmt.Errorf("albedo: local table: no sensors")
	}
	for i, s := range sensors {
		if err := s.Validate(fmt.Sprintf("sensors[%d]", i)); err != nil {
			return nil, err
		}
		if s.Cells != nil {
			return nil, fmt.Errorf("albedo: local table: sensors[%d] has cells: the table keeps one value per sensor; integrate it with Model.Irradiance", i)
		}
	}
	nθ := int(math.Ceil(180/resDeg - 1e-9))
	t := &LocalTable{
		radiusKm: radiusKm,
		sensors:  len(sensors),
		polar:    newPolarGrid(nθ),
		nφ:       2 * nθ,
		dφ:       math.Pi / float64(nθ),
		darkZ:    math.Sqrt(1 - (EarthRadiusKm/radiusKm)*(EarthRadiusKm/radiusKm)),
	}
	ns := len(sensors)
	t.vals = make([]float64, (t.polar.n+1)*t.nφ*ns*tableVals)

	// The caller's sensors are copied: the build must not see later edits.
	sn := append([]Sensor(nil), sensors...)
	mr, err := New(Config{Reflectance: u, Cells: m.n, AltitudeKm: radiusKm - EarthRadiusKm, RebuildKm: m.rebuildKm})
	if err != nil {
		return nil, err
	}
	t.build(mr, sn)
	return t, nil
}

// coneCell is a cap cell inside a sensor's cone: its index, the cone weight
// the sum gives it and the share of the cell inside the cone.
type coneCell struct {
	c       int32
	f, frac float64
}

// build fills the table with the cell sum of Model.Irradiance at every
// node, the spacecraft at −Z·r (nadir along +Z, so Result.Dir comes out in
// the local frame). As in BoresightTable.buildRadius, along a column of
// fixed sun azimuth φ a lit cell's weight is linear in (sin θ, cos θ) over
// the run of polar nodes where it is lit: each sensor's cone weights are
// formed once and each column's sums over θ are running sums fed where a
// cell's run starts and ends (the nodes equal the integral to rounding,
// TestLocalTableNodesAreTheIntegral). The columns are shared out over up to
// GOMAXPROCS goroutines; nodes where the sun lights no visible point are
// zero.
func (t *LocalTable) build(m *Model, sensors []Sensor) {
	rSat := r3.Vec{Z: -t.radiusKm}
	geo := &m.geo
	ex, ey, ez := capFrame(rSat, vecmath.Norm(rSat))
	k := m.refl.(Uniform).Albedo * SolarIrradiance1AU
	var rows []int
	var sins, coss []float64
	for i := 0; i <= t.polar.n; i++ {
		sθ, cθ := math.Sincos(t.polar.angle(i))
		if cθ >= t.darkZ {
			continue // every visible point has the sun below its horizon: zeros
		}
		rows = append(rows, i)
		sins, coss = append(sins, sθ), append(coss, cθ)
	}
	nr, ns := len(rows), len(sensors)
	if nr == 0 {
		return
	}
	// Each sensor's cells and cone weights, once.
	cones := make([][]coneCell, ns)
	fillScale := make([]float64, ns)
	for s := range sensors {
		sn := &sensors[s]
		cw := newConeWeight(sn, geo.halfWidth)
		fillScale[s] = geo.cellSolidAngle / (2 * math.Pi * (1 - cw.cosH))
		n, p := toFrame(sn.Normal, ex, ey, ez), toFrame(sn.Plane, ex, ey, ez)
		if missesDisc(n, sn.HalfAngle, geo) {
			continue
		}
		for c := range geo.cells {
			cl := &geo.cells[c]
			f, frac := cw.at(n.X*cl.ux + n.Y*cl.uy + n.Z*cl.uz)
			if frac == 0 || behind(p, cl) {
				continue
			}
			cones[s] = append(cones[s], coneCell{c: int32(c), f: f, frac: frac})
		}
	}
	bz := toFrame(r3.Vec{Z: 1}, ex, ey, ez)
	nodeLen := ns * tableVals
	// Per row: the changes of the sin θ and cos θ coefficients of E and of
	// the cap-frame E·u, and of the lit share of the cone (9 values).
	const coef = 2*boresightVals + 1
	var next atomic.Int64
	var wg sync.WaitGroup
	for range max(1, runtime.GOMAXPROCS(0)) {
		wg.Go(func() {
			suns := make([]r3.Vec, nr)
			first, end := make([]int32, len(geo.cells)), make([]int32, len(geo.cells))
			ws, wc := make([]float64, len(geo.cells)), make([]float64, len(geo.cells))
			steps := make([]float64, coef*(nr+1))
			for {
				j := int(next.Add(1) - 1)
				if j >= t.nφ {
					return
				}
				sφ, cφ := math.Sincos(float64(j) * t.dφ)
				for q := range nr {
					suns[q] = toFrame(r3.Vec{X: sins[q] * cφ, Y: sins[q] * sφ, Z: coss[q]}, ex, ey, ez)
				}
				az := toFrame(r3.Vec{X: cφ, Y: sφ}, ex, ey, ez)
				// Each cell's lit run: N̂·ŝ is a sinusoid in θ over half a
				// period, so it is lit on a prefix (N̂·ŝ > 0 at θ = 0) or a
				// suffix of the rows, found by bisection on Irradiance's
				// own test.
				for c := range geo.cells {
					cl := &geo.cells[c]
					lit := func(q int) bool { s := suns[q]; return cl.px*s.X+cl.py*s.Y+cl.pz*s.Z > 0 }
					pa, pb := cl.px*az.X+cl.py*az.Y+cl.pz*az.Z, cl.px*bz.X+cl.py*bz.Y+cl.pz*bz.Z
					ws[c], wc[c] = k*cl.g*pa, k*cl.g*pb
					if lit(0) {
						first[c], end[c] = 0, int32(sort.Search(nr, func(q int) bool { return !lit(q) }))
					} else {
						first[c], end[c] = int32(sort.Search(nr, lit)), int32(nr)
					}
				}
				for s, cone := range cones {
					clear(steps)
					for _, cc := range cone {
						if first[cc.c] >= end[cc.c] {
							continue
						}
						cl := &geo.cells[cc.c]
						a, b := cc.f*ws[cc.c], cc.f*wc[cc.c]
						v := [coef]float64{a, a * cl.ux, a * cl.uy, a * cl.uz, b, b * cl.ux, b * cl.uy, b * cl.uz, cc.frac}
						addRows(steps, v[:], first[cc.c], end[cc.c])
					}
					var run [coef]float64
					for q, i := range rows {
						for x := range run {
							run[x] += steps[coef*q+x]
						}
						sθ, cθ := sins[q], coss[q]
						out := t.vals[(i*t.nφ+j)*nodeLen+s*tableVals:][:tableVals]
						out[4] = min(1, run[8]*fillScale[s])
						if e := sθ*run[0] + cθ*run[4]; e > 0 {
							d := capToECI(sθ*run[1]+cθ*run[5], sθ*run[2]+cθ*run[6], sθ*run[3]+cθ*run[7], ex, ey, ez)
							out[0], out[1], out[2], out[3] = e, e*d.X, e*d.Y, e*d.Z
						}
					}
				}
			}
		})
	}
	wg.Wait()
	// The poles are one direction each: every azimuth takes node 0's values.
	for _, i := range []int{0, t.polar.n} {
		row := t.vals[i*t.nφ*nodeLen : (i+1)*t.nφ*nodeLen]
		for j := 1; j < t.nφ; j++ {
			copy(row[j*nodeLen:(j+1)*nodeLen], row[:nodeLen])
		}
	}
}

// RadiusKm returns the orbit radius the table was built for.
func (t *LocalTable) RadiusKm() float64 { return t.radiusKm }

// Irradiance writes into dst[i] the albedo seen by the table's sensor i for
// the sun in direction sunLocal (local frame, +Z to nadir; need not be unit)
// at distance sunDistKm. Result.Dir is in the local frame. It does not
// allocate. dst must be at least as long as the table's sensors. When the sun
// is below the horizon of every visible point the results are exactly zero.
func (t *LocalTable) Irradiance(dst []Result, sunLocal r3.Vec, sunDistKm float64) {
	ns := t.sensors
	if len(dst) < ns {
		panic("albedo: dst shorter than the table's sensors")
	}
	dst = dst[:ns]
	ρxy := math.Sqrt(sunLocal.X*sunLocal.X + sunLocal.Y*sunLocal.Y)
	norm := math.Sqrt(ρxy*ρxy + sunLocal.Z*sunLocal.Z)
	if !(sunDistKm > 0) || !(norm > 0) || sunLocal.Z >= t.darkZ*norm {
		clear(dst)
		return
	}
	q := AUKm / sunDistKm
	scale := q * q // S(d) = S₀ (AU/d)²; the table is built at 1 AU

	// Cell of the grid and the bilinear weights.
	i, a := t.polar.locate(math.Atan2(ρxy, sunLocal.Z))
	φ := math.Atan2(sunLocal.Y, sunLocal.X)
	if φ < 0 {
		φ += 2 * math.Pi
	}
	fφ := φ / t.dφ
	j := int(fφ)
	if j >= t.nφ {
		j = t.nφ - 1
	}
	b := fφ - float64(j)
	j1 := j + 1
	if j1 == t.nφ {
		j1 = 0
	}
	w00, w01, w10, w11 := (1-a)*(1-b), (1-a)*b, a*(1-b), a*b
	stride := ns * tableVals
	v00 := t.vals[(i*t.nφ+j)*stride:][:stride]
	v01 := t.vals[(i*t.nφ+j1)*stride:][:stride]
	v10 := t.vals[((i+1)*t.nφ+j)*stride:][:stride]
	v11 := t.vals[((i+1)*t.nφ+j1)*stride:][:stride]
	for k := range dst {
		o := k * tableVals
		var v [tableVals]float64
		for c := range v {
			v[c] = w00*v00[o+c] + w01*v01[o+c] + w10*v10[o+c] + w11*v11[o+c]
		}
		n2 := v[1]*v[1] + v[2]*v[2] + v[3]*v[3]
		if !(v[0] > 0) || !(n2 > 0) {
			dst[k] = Result{}
			continue
		}
		inv := 1 / math.Sqrt(n2)
		dst[k] = Result{
			Irradiance: v[0] * scale,
			Dir:        r3.Vec{X: v[1] * inv, Y: v[2] * inv, Z: v[3] * inv},
			Fill:       min(1, max(0, v[4])),
		}
	}
}

// addRows adds the node values v to the running sums of the rows from
// first on and takes them off again from row end on: a difference array
// over the rows (steps holds len(v) values per row), which the builders
// then sum row by row.
func addRows(steps, v []float64, first, end int32) {
	n := len(v)
	on, off := steps[n*int(first):][:n], steps[n*int(end):][:n]
	for x := range v {
		on[x] += v[x]
		off[x] -= v[x]
	}
}
