package albedo

import (
	"fmt"
	"math"
	"runtime"
	"sync"

	"gonum.org/v1/gonum/spatial/r3"
)

// DefaultBoresightStepDeg is the default grid step of a BoresightTable in
// the boresight's angle from nadir and in the azimuth between the boresight
// and the sun, degrees.
const DefaultBoresightStepDeg = 3.0

// DefaultBoresightSunResDeg is the default polar step of the sun's angle
// from nadir in a BoresightTable, degrees (half of it from 70° to 110°):
// coarser than LocalTable's, since the boresight grid dominates the error
// of E and the build runs one integral per sun angle for every boresight.
const DefaultBoresightSunResDeg = 1.5

// BoresightSlackKm is how far outside its radii a BoresightTable still
// serves a radius, with the values of the nearest radius: 1 km moves the
// albedo by about 0.075 % of a sensor's largest value (see LocalTable),
// well inside the accuracy of the integral.
const BoresightSlackKm = 1.0

// boresightVals is the number of values stored per grid node: E and the
// three components of E·Dir.
const boresightVals = 4

// BoresightTable holds the albedo on a cone sensor of one half-angle and
// response, for a uniform reflectance, as a function of three angles and
// the orbit radius: the sun's angle from nadir θs, the boresight's angle
// from nadir θn and the azimuth φ of the boresight about nadir measured from
// the sun's. With a uniform Earth the visible cap is symmetric about nadir,
// so nothing else matters (the sun's distance only scales the result): one
// table serves every attitude and every sensor of that cone.
//
// The values are sampled with Model.Irradiance on a grid (θs on the polar
// grid of LocalTable, θn and φ ∈ [0, π] at a uniform step, φ < 0 by the
// mirror symmetry) at a few orbit radii, and interpolated linearly in each
// of the four; the accuracy is measured in TestBoresightTableMatchesIntegral
// and stated in the package documentation. A BoresightTable is read-only
// after NewBoresightTable and safe for concurrent use.
type BoresightTable struct {
	radii    []float64 // km, increasing
	polar    polarGrid
	hb       float64 // boresight grid step (θn and φ), rad
	nθn, nφ  int     // nodes in θn and φ
	darkZ    []float64
	per      int       // values per radius
	vals     []float32 // [radius][θs][θn][φ][boresightVals]
	halfCone float64
}

// NewBoresightTable builds the table of a cone of half-angle half and
// response resp at the given orbit radii (km, increasing, above the Earth;
// one radius serves only that radius), with the sun's polar step resDeg
// (DefaultTableResDeg) and the boresight step stepDeg
// (DefaultBoresightStepDeg). m gives the reflectance, which must be
// Uniform, and the cell count. The build runs one cell integral per sun
// angle and radius for all boresights at once, on up to GOMAXPROCS
// goroutines.
func NewBoresightTable(m *Model, radiiKm []float64, half float64, resp Response, resDeg, stepDeg float64) (*BoresightTable, error) {
	if m == nil {
		return nil, fmt.Errorf("albedo: boresight table: nil model")
	}
	u, ok := m.refl.(Uniform)
	if !ok {
		return nil, fmt.Errorf("albedo: boresight table: reflectance is %T: the table needs a uniform reflectance; use Model.Irradiance for zonal or gridded maps", m.refl)
	}
	if len(radiiKm) == 0 {
		return nil, fmt.Errorf("albedo: boresight table: no radius")
	}
	for i, r := range radiiKm {
		if math.IsNaN(r) || math.IsInf(r, 0) || r <= EarthRadiusKm || (i > 0 && r <= radiiKm[i-1]) {
			return nil, fmt.Errorf("albedo: boresight table: radii_km[%d] = %g: want increasing finite radii above the Earth's radius %g km", i, r, EarthRadiusKm)
		}
	}
	if !(resDeg > 0 && resDeg <= 10) || !(stepDeg > 0 && stepDeg <= 10) {
		return nil, fmt.Errorf("albedo: boresight table: res_deg = %g, step_deg = %g: each must lie in (0, 10] degrees", resDeg, stepDeg)
	}
	if err := (Sensor{Normal: r3.Vec{Z: 1}, HalfAngle: half}).Validate("sensor"); err != nil {
		return nil, err
	}
	nθ := int(math.Ceil(180/resDeg - 1e-9))
	nb := int(math.Ceil(180/stepDeg - 1e-9))
	t := &BoresightTable{radii: append([]float64(nil), radiiKm...), polar: newPolarGrid(nθ), hb: math.Pi / float64(nb), halfCone: half}
	// A boresight farther from nadir than the Earth's disc plus the cone
	// (and a cell) sees nothing: the grid stops one step beyond.
	ηMax := math.Asin(EarthRadiusKm / radiiKm[0])
	t.nθn = min(nb, int(math.Ceil((ηMax+half+0.05)/t.hb))+1) + 1
	t.nφ = nb + 1
	for _, r := range radiiKm {
		t.darkZ = append(t.darkZ, math.Sqrt(1-(EarthRadiusKm/r)*(EarthRadiusKm/r)))
	}
	t.per = (t.polar.n + 1) * t.nθn * t.nφ * boresightVals
	t.vals = make([]float32, len(radiiKm)*t.per)

	// The sensors of one row: every boresight node, in the local frame (+Z to nadir).
	sensors := make([]Sensor, 0, t.nθn*t.nφ)
	for i := range t.nθn {
		sθ, cθ := math.Sincos(float64(i) * t.hb)
		for j := range t.nφ {
			sφ, cφ := math.Sincos(float64(j) * t.hb)
			sensors = append(sensors, Sensor{Normal: r3.Vec{X: sθ * cφ, Y: sθ * sφ, Z: cθ}, HalfAngle: half, Response: resp})
		}
	}
	type job struct{ r, i int }
	jobs := make(chan job)
	var wg sync.WaitGroup
	var firstErr error
	var mu sync.Mutex
	for range max(1, runtime.GOMAXPROCS(0)) {
		wg.Go(func() {
			var mw *Model
			var rKm float64
			dst := make([]Result, len(sensors))
			for jb := range jobs {
				if mw == nil || rKm != radiiKm[jb.r] {
					rKm = radiiKm[jb.r]
					var err error
					mw, err = New(Config{Reflectance: u, Cells: m.n, AltitudeKm: rKm - EarthRadiusKm, RebuildKm: m.rebuildKm})
					if err != nil {
						mu.Lock()
						firstErr = err
						mu.Unlock()
						continue
					}
				}
				t.buildRow(mw, dst, sensors, jb.r, jb.i)
			}
		})
	}
	for r := range radiiKm {
		for i := 0; i <= t.polar.n; i++ {
			jobs <- job{r, i}
		}
	}
	close(jobs)
	wg.Wait()
	if firstErr != nil {
		return nil, firstErr
	}
	return t, nil
}

// buildRow fills the sun's polar row i at radius index r: the spacecraft at
// −Z·r (nadir along +Z), the sun in the x–z plane at azimuth 0.
func (t *BoresightTable) buildRow(m *Model, dst []Result, sensors []Sensor, r, i int) {
	sθ, cθ := math.Sincos(t.polar.angle(i))
	if cθ >= t.darkZ[r] {
		return // every visible point has the sun below its horizon: zeros
	}
	m.Irradiance(dst, r3.Vec{Z: -t.radii[r]}, r3.Vec{X: sθ, Z: cθ}, AUKm, 0, 0, sensors)
	row := t.vals[r*t.per+i*t.nθn*t.nφ*boresightVals:][:t.nθn*t.nφ*boresightVals]
	for k, res := range dst {
		v := row[k*boresightVals:][:boresightVals]
		v[0] = float32(res.Irradiance)
		v[1] = float32(res.Irradiance * res.Dir.X)
		v[2] = float32(res.Irradiance * res.Dir.Y)
		v[3] = float32(res.Irradiance * res.Dir.Z)
	}
}

// HalfAngle returns the cone half-angle of the table, rad.
func (t *BoresightTable) HalfAngle() float64 { return t.halfCone }

// Covers reports whether the table holds the radius rKm.
func (t *BoresightTable) Covers(rKm float64) bool {
	return rKm >= t.radii[0]-BoresightSlackKm && rKm <= t.radii[len(t.radii)-1]+BoresightSlackKm
}

// RadiiKm returns the radii the table was built at.
func (t *BoresightTable) RadiiKm() []float64 { return append([]float64(nil), t.radii...) }

// SunFrame is the part of a lookup shared by every sensor of one step: the
// local frame whose +Z is nadir and whose x–z plane holds the sun, the
// sun's grid cell and the radius interpolation.
type SunFrame struct {
	ex, ey, ez r3.Vec
	i          int     // polar interval of the sun
	a          float64 // fraction across it
	r          int     // radius interval (r, r+1), or r alone when r+1 is past the end
	fr         float64 // fraction across it
	scale      float64 // (AU/d)²
	dark       bool
}

// Frame prepares the lookups of one step: the spacecraft at rSat (km,
// EME2000), the sun in unit direction sunDir at sunDistKm. It reports false
// when the table does not hold the radius of rSat (the caller integrates).
func (t *BoresightTable) Frame(f *SunFrame, rSat, sunDir r3.Vec, sunDistKm float64) bool {
	rKm := math.Sqrt(r3.Norm2(rSat))
	if !t.Covers(rKm) || !(sunDistKm > 0) {
		return false
	}
	n := len(t.radii)
	f.r, f.fr = 0, 0
	if n > 1 {
		for f.r < n-2 && rKm > t.radii[f.r+1] {
			f.r++
		}
		f.fr = min(1, max(0, (rKm-t.radii[f.r])/(t.radii[f.r+1]-t.radii[f.r])))
	}
	ez := r3.Scale(-1/rKm, rSat)
	cs := r3.Dot(sunDir, ez)
	darkZ := t.darkZ[f.r]
	if n > 1 {
		darkZ = max(darkZ, t.darkZ[f.r+1])
	}
	f.dark = cs >= darkZ
	if f.dark {
		return true
	}
	// The sun's horizontal direction is the frame's +X; with the sun at
	// nadir or zenith any horizontal axis serves (the field is symmetric).
	h := r3.Sub(sunDir, r3.Scale(cs, ez))
	hn := math.Sqrt(r3.Norm2(h))
	if hn < 1e-12 {
		h = r3.Cross(ez, r3.Vec{X: 1})
		if r3.Norm2(h) < 1e-12 {
			h = r3.Cross(ez, r3.Vec{Y: 1})
		}
		hn = math.Sqrt(r3.Norm2(h))
	}
	f.ex = r3.Scale(1/hn, h)
	f.ey = r3.Cross(ez, f.ex)
	f.ez = ez
	f.i, f.a = t.polar.locate(math.Atan2(hn, cs))
	q := AUKm / sunDistKm
	f.scale = q * q
	return true
}

// At returns the albedo on a sensor with unit boresight n (EME2000) for the
// step prepared in f (Dir in EME2000). It does not allocate.
func (t *BoresightTable) At(f *SunFrame, n r3.Vec) Result {
	if f.dark {
		return Result{}
	}
	nx, ny, nz := r3.Dot(n, f.ex), r3.Dot(n, f.ey), r3.Dot(n, f.ez)
	mirror := ny < 0
	if mirror {
		ny = -ny
	}
	fθ := math.Atan2(math.Sqrt(nx*nx+ny*ny), nz) / t.hb
	jθ := int(fθ)
	if jθ >= t.nθn-1 {
		if float64(t.nθn-1)*t.hb < math.Pi-1e-9 {
			return Result{} // beyond the Earth's disc plus the cone
		}
		jθ = t.nθn - 2 // the grid reaches the zenith
	}
	bθ := fθ - float64(jθ)
	fφ := math.Atan2(ny, nx) / t.hb
	jφ := min(int(fφ), t.nφ-2)
	bφ := fφ - float64(jφ)

	var v [boresightVals]float64
	rows := 1
	if len(t.radii) > 1 {
		rows = 2
	}
	for dr := range rows {
		wr := 1 - f.fr
		if dr == 1 {
			wr = f.fr
		}
		base := (f.r + dr) * t.per
		for di := range 2 {
			wi := wr * (1 - f.a)
			if di == 1 {
				wi = wr * f.a
			}
			plane := t.vals[base+(f.i+di)*t.nθn*t.nφ*boresightVals:]
			for dθ := range 2 {
				wθ := wi * (1 - bθ)
				if dθ == 1 {
					wθ = wi * bθ
				}
				row := plane[((jθ+dθ)*t.nφ+jφ)*boresightVals:][:2*boresightVals]
				w0, w1 := wθ*(1-bφ), wθ*bφ
				for c := range boresightVals {
					v[c] += w0*float64(row[c]) + w1*float64(row[boresightVals+c])
				}
			}
		}
	}
	n2 := v[1]*v[1] + v[2]*v[2] + v[3]*v[3]
	if !(v[0] > 0) || !(n2 > 0) {
		return Result{}
	}
	inv := 1 / math.Sqrt(n2)
	dx, dy, dz := v[1]*inv, v[2]*inv, v[3]*inv
	if mirror {
		dy = -dy
	}
	return Result{Irradiance: v[0] * f.scale, Dir: r3.Vec{
		X: dx*f.ex.X + dy*f.ey.X + dz*f.ez.X,
		Y: dx*f.ex.Y + dy*f.ey.Y + dz*f.ez.Y,
		Z: dx*f.ex.Z + dy*f.ey.Z + dz*f.ez.Z,
	}}
}
