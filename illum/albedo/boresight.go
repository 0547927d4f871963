package albedo

import (
	"fmt"
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
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
	vals     []float32 // [radius][θs][θn][φ][ch][boresightVals]
	halfCone float64
	// ch is 1 for a uniform reflectance (E and E·Dir, the albedo baked
	// in) or zonalChannels for a zonal one (see zonalBasis).
	ch    int
	zonal Zonal
}

// zonalChannels is the number of reflectance channels of a zonal
// BoresightTable. A Zonal reflectance that never clamps is a quadratic in
// s = N̂·P̂ (N̂ the surface normal, P̂ the pole):
//
//	ρ = (A0 − A2/2) + A1 s + (3A2/2) s²,  s = Σ Nᵢ Pᵢ,
//
// so its cell sum is Σₖ cₖ(P̂, t) Iₖ with Iₖ the cell sum for the
// "reflectance" bₖ(N̂) of zonalBasis (1, the three Nᵢ, the six NᵢNⱼ), each
// a function of the local geometry alone. The table keeps every Iₖ (E and
// the vector sum of E·u); a lookup forms the cₖ from the pole in the sun
// frame and the season. Exact before interpolation.
const zonalChannels = 10

// zonalBasis fills b with the basis values of the normal n (local frame).
func zonalBasis(b *[zonalChannels]float64, n r3.Vec) {
	*b = [zonalChannels]float64{1, n.X, n.Y, n.Z, n.X * n.X, n.Y * n.Y, n.Z * n.Z, n.X * n.Y, n.X * n.Z, n.Y * n.Z}
}

// zonalCoefs fills c with the weights of the basis for the pole p (local
// frame) and first-degree coefficient a1.
func (z Zonal) coefs(c *[zonalChannels]float64, p r3.Vec, a1 float64) {
	q := 1.5 * z.A2
	*c = [zonalChannels]float64{z.A0 - 0.5*z.A2, a1 * p.X, a1 * p.Y, a1 * p.Z,
		q * p.X * p.X, q * p.Y * p.Y, q * p.Z * p.Z, 2 * q * p.X * p.Y, 2 * q * p.X * p.Z, 2 * q * p.Y * p.Z}
}

// NewBoresightTable builds the table of a cone of half-angle half and
// response resp at the given orbit radii (km, increasing, above the Earth;
// one radius serves only that radius), with the sun's polar step resDeg
// (DefaultTableResDeg) and the boresight step stepDeg
// (DefaultBoresightStepDeg). m gives the reflectance, which must be
// Uniform, and the cell count. The build forms the cell sum of
// Model.Irradiance for every node, each node's cone weights once for all
// sun angles (see buildRadius), on up to GOMAXPROCS goroutines.
func NewBoresightTable(m *Model, radiiKm []float64, half float64, resp Response, resDeg, stepDeg float64) (*BoresightTable, error) {
	if m == nil {
		return nil, fmt.Errorf("albedo: boresight table: nil model")
	}
	ch := 1
	switch r := m.refl.(type) {
	case Uniform:
	case Zonal:
		if !r.inRange() {
			return nil, fmt.Errorf("albedo: boresight table: the zonal profile leaves [0, 1] (it is clamped there): the table needs one that does not; use Model.Irradiance")
		}
		ch = zonalChannels
	default:
		return nil, fmt.Errorf("albedo: boresight table: reflectance is %T: the table needs a uniform or zonal reflectance; use Model.Irradiance for gridded maps", m.refl)
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
	t := &BoresightTable{radii: append([]float64(nil), radiiKm...), halfCone: half, ch: ch}
	t.polar, t.hb, t.nθn, t.nφ, t.per = boresightGrid(radiiKm[0], half, resDeg, stepDeg, ch)
	if z, ok := m.refl.(Zonal); ok {
		t.zonal = z
	}
	for _, r := range radiiKm {
		t.darkZ = append(t.darkZ, math.Sqrt(1-(EarthRadiusKm/r)*(EarthRadiusKm/r)))
	}
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
	for r, rKm := range radiiKm {
		mr, err := New(Config{Reflectance: m.refl, Cells: m.n, AltitudeKm: rKm - EarthRadiusKm, RebuildKm: m.rebuildKm})
		if err != nil {
			return nil, err
		}
		if ch == 1 {
			t.buildRadius(mr, sensors, r)
		} else {
			t.buildRadiusZonal(mr, sensors, r)
		}
	}
	return t, nil
}

// boresightGrid is the grid of a BoresightTable whose lowest radius is r0Km:
// the sun's polar nodes, the boresight step, the boresight nodes in polar
// angle and azimuth, and the values per radius (ch channels).
func boresightGrid(r0Km, half, resDeg, stepDeg float64, ch int) (polar polarGrid, hb float64, nθn, nφ, per int) {
	nθ := int(math.Ceil(180/resDeg - 1e-9))
	nb := int(math.Ceil(180/stepDeg - 1e-9))
	polar, hb = newPolarGrid(nθ), math.Pi/float64(nb)
	// A boresight farther from nadir than the Earth's disc plus the cone
	// (and a cell) sees nothing: the grid stops one step beyond.
	ηMax := math.Asin(EarthRadiusKm / r0Km)
	nθn = min(nb, int(math.Ceil((ηMax+half+0.05)/hb))+1) + 1
	nφ = nb + 1
	per = (polar.n + 1) * nθn * nφ * boresightVals * ch
	return polar, hb, nθn, nφ, per
}

// BoresightTableBytes is the memory of the values of a BoresightTable of
// nRadii radii from r0Km up, for a cone of half-angle half, zonal (ten
// channels) or uniform, at the given grid steps: what NewBoresightTable
// allocates (TestBoresightTableBytes), for a memory estimate made before
// any table is built.
func BoresightTableBytes(nRadii int, r0Km, half float64, zonal bool, resDeg, stepDeg float64) int64 {
	ch := 1
	if zonal {
		ch = zonalChannels
	}
	_, _, _, _, per := boresightGrid(r0Km, half, resDeg, stepDeg, ch)
	return int64(nRadii) * int64(per) * 4
}

// Bytes is the memory of the table's values.
func (t *BoresightTable) Bytes() int64 { return int64(len(t.vals)) * 4 }

// buildRadius fills the table at radius index r with the cell integral of
// Model.Irradiance, the spacecraft at −Z·r (nadir along +Z) and the sun in
// the x–z plane at azimuth 0 and each polar node. The sun enters the sum only
// through the cells' lit weights and the boresight only through its cone
// weights, so the lit weights of every sun row are computed once, and each
// boresight node's cone weights once and summed against every row: the same
// products and sums, in the same cell order, as one integral per row (the
// nodes agree with Model.Irradiance to float32 rounding,
// TestBoresightTableNodesAreTheIntegral), at a fraction of the cost. The
// nodes are shared out over up to GOMAXPROCS goroutines.
func (t *BoresightTable) buildRadius(m *Model, sensors []Sensor, r int) {
	rKm := t.radii[r]
	rSat := r3.Vec{Z: -rKm}
	geo := &m.geo
	ex, ey, ez := capFrame(rSat, vecmath.Norm(rSat))
	// A cell's lit weight, as Irradiance's first pass forms it, is
	// w = ρ S (N̂·ŝ) g at 1 AU where N̂·ŝ > 0. With the sun at polar angle θ in
	// the x–z plane, ŝ = sin θ·a + cos θ·b (a, b: the x and z axes in the cap
	// frame), so on the rows where the cell is lit w = sin θ·ρSg(N̂·a) +
	// cos θ·ρSg(N̂·b): linear in (sin θ, cos θ). A cell is lit on one run of
	// rows [first, end) (N̂·ŝ is a sinusoid in θ over a half period). Each
	// node's sums over the rows are then two running sums per value, fed
	// where a cell's run starts and ends: a few operations per cell and node
	// instead of one per cell, node and row.
	k := m.refl.(Uniform).Albedo * SolarIrradiance1AU
	ax, az := toFrame(r3.Vec{X: 1}, ex, ey, ez), toFrame(r3.Vec{Z: 1}, ex, ey, ez)
	var rows []int
	var sins, coss []float64
	for i := 0; i <= t.polar.n; i++ {
		sθ, cθ := math.Sincos(t.polar.angle(i))
		if cθ >= t.darkZ[r] {
			continue // every visible point has the sun below its horizon: zeros
		}
		rows = append(rows, i)
		sins, coss = append(sins, sθ), append(coss, cθ)
	}
	nr, nc := len(rows), len(geo.cells)
	first, end := make([]int32, nc), make([]int32, nc)
	ws, wc := make([]float64, nc), make([]float64, nc) // w = sin θ·ws + cos θ·wc
	for c := range geo.cells {
		cl := &geo.cells[c]
		first[c], end[c] = int32(nr), 0
		pa, pb := cl.px*ax.X+cl.py*ax.Y+cl.pz*ax.Z, cl.px*az.X+cl.py*az.Y+cl.pz*az.Z
		for q := range nr {
			if sins[q]*pa+coss[q]*pb > 0 {
				first[c], end[c] = min(first[c], int32(q)), int32(q+1)
			}
		}
		ws[c], wc[c] = k*cl.g*pa, k*cl.g*pb
	}
	// Per row: the changes of the sin θ and cos θ coefficients of E and of
	// the cap-frame E·u (8 values), at the row where they take effect.
	const coef = 2 * boresightVals
	var next atomic.Int64
	var wg sync.WaitGroup
	for range max(1, runtime.GOMAXPROCS(0)) {
		wg.Go(func() {
			steps := make([]float64, coef*(nr+1))
			for {
				j := int(next.Add(1) - 1)
				if j >= len(sensors) {
					return
				}
				sn := &sensors[j]
				n := toFrame(sn.Normal, ex, ey, ez)
				if missesDisc(n, sn.HalfAngle, geo) {
					continue
				}
				cw := newConeWeight(sn, geo.halfWidth)
				clear(steps)
				for c := range geo.cells {
					cl := &geo.cells[c]
					if first[c] >= end[c] {
						continue
					}
					f, frac := cw.at(n.X*cl.ux + n.Y*cl.uy + n.Z*cl.uz)
					if frac == 0 {
						continue
					}
					s, co := f*ws[c], f*wc[c]
					v := [coef]float64{s, s * cl.ux, s * cl.uy, s * cl.uz, co, co * cl.ux, co * cl.uy, co * cl.uz}
					addRows(steps, v[:], first[c], end[c])
				}
				var run [coef]float64
				for q, i := range rows {
					for x := range run {
						run[x] += steps[coef*q+x]
					}
					sθ, cθ := sins[q], coss[q]
					e := sθ*run[0] + cθ*run[4]
					if !(e > 0) {
						continue
					}
					d := capToECI(sθ*run[1]+cθ*run[5], sθ*run[2]+cθ*run[6], sθ*run[3]+cθ*run[7], ex, ey, ez)
					out := t.vals[r*t.per+(i*len(sensors)+j)*boresightVals:][:boresightVals]
					out[0] = float32(e)
					out[1] = float32(e * d.X)
					out[2] = float32(e * d.Y)
					out[3] = float32(e * d.Z)
				}
			}
		})
	}
	wg.Wait()
}

// buildRadiusZonal is buildRadius for a zonal table: the same running sums
// over the rows of sun angles, with every cell's lit weight at ρ = 1 times
// each basis value bₖ(N̂) of the cell's mean normal (zonalBasis), so each
// node holds the ten cell sums Iₖ: E and the vector sum of E·u (local frame,
// not normalised, so that the channels add).
func (t *BoresightTable) buildRadiusZonal(m *Model, sensors []Sensor, r int) {
	rKm := t.radii[r]
	rSat := r3.Vec{Z: -rKm}
	geo := &m.geo
	ex, ey, ez := capFrame(rSat, vecmath.Norm(rSat))
	k := SolarIrradiance1AU
	ax, az := toFrame(r3.Vec{X: 1}, ex, ey, ez), toFrame(r3.Vec{Z: 1}, ex, ey, ez)
	var rows []int
	var sins, coss []float64
	for i := 0; i <= t.polar.n; i++ {
		sθ, cθ := math.Sincos(t.polar.angle(i))
		if cθ >= t.darkZ[r] {
			continue
		}
		rows = append(rows, i)
		sins, coss = append(sins, sθ), append(coss, cθ)
	}
	nr, nc := len(rows), len(geo.cells)
	first, end := make([]int32, nc), make([]int32, nc)
	ws, wc := make([]float64, nc), make([]float64, nc)
	basis := make([][zonalChannels]float64, nc)
	for c := range geo.cells {
		cl := &geo.cells[c]
		first[c], end[c] = int32(nr), 0
		pa, pb := cl.px*ax.X+cl.py*ax.Y+cl.pz*ax.Z, cl.px*az.X+cl.py*az.Y+cl.pz*az.Z
		for q := range nr {
			if sins[q]*pa+coss[q]*pb > 0 {
				first[c], end[c] = min(first[c], int32(q)), int32(q+1)
			}
		}
		ws[c], wc[c] = k*cl.g*pa, k*cl.g*pb
		zonalBasis(&basis[c], capToLocal(cl.px, cl.py, cl.pz, ex, ey, ez))
	}
	const half = boresightVals * zonalChannels // the sin θ part, then the cos θ part
	const coef = 2 * half
	var next atomic.Int64
	var wg sync.WaitGroup
	for range max(1, runtime.GOMAXPROCS(0)) {
		wg.Go(func() {
			steps := make([]float64, coef*(nr+1))
			var v [coef]float64
			for {
				j := int(next.Add(1) - 1)
				if j >= len(sensors) {
					return
				}
				sn := &sensors[j]
				n := toFrame(sn.Normal, ex, ey, ez)
				if missesDisc(n, sn.HalfAngle, geo) {
					continue
				}
				cw := newConeWeight(sn, geo.halfWidth)
				clear(steps)
				for c := range geo.cells {
					cl := &geo.cells[c]
					if first[c] >= end[c] {
						continue
					}
					f, frac := cw.at(n.X*cl.ux + n.Y*cl.uy + n.Z*cl.uz)
					if frac == 0 {
						continue
					}
					s, co := f*ws[c], f*wc[c]
					for q, b := range basis[c] {
						sb, cb := s*b, co*b
						v[4*q], v[4*q+1], v[4*q+2], v[4*q+3] = sb, sb*cl.ux, sb*cl.uy, sb*cl.uz
						v[half+4*q], v[half+4*q+1], v[half+4*q+2], v[half+4*q+3] = cb, cb*cl.ux, cb*cl.uy, cb*cl.uz
					}
					addRows(steps, v[:], first[c], end[c])
				}
				var run [coef]float64
				for q, i := range rows {
					for x := range run {
						run[x] += steps[coef*q+x]
					}
					sθ, cθ := sins[q], coss[q]
					out := t.vals[r*t.per+(i*len(sensors)+j)*half:][:half]
					for c := range zonalChannels {
						e := sθ*run[4*c] + cθ*run[half+4*c]
						d := capToLocal(sθ*run[4*c+1]+cθ*run[half+4*c+1], sθ*run[4*c+2]+cθ*run[half+4*c+2], sθ*run[4*c+3]+cθ*run[half+4*c+3], ex, ey, ez)
						out[4*c], out[4*c+1], out[4*c+2], out[4*c+3] = float32(e), float32(d.X), float32(d.Y), float32(d.Z)
					}
				}
			}
		})
	}
	wg.Wait()
}

// capToLocal returns the cap-frame vector (x, y, z) in the coordinates the
// frame (ex, ey, ez) is given in.
func capToLocal(x, y, z float64, ex, ey, ez r3.Vec) r3.Vec {
	return r3.Vec{X: x*ex.X + y*ey.X + z*ez.X, Y: x*ex.Y + y*ey.Y + z*ez.Y, Z: x*ex.Z + y*ey.Z + z*ez.Z}
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
	// coef, coefM: a zonal table's basis weights for the pole as it is and
	// mirrored (y → −y), set by Season.
	coef, coefM [zonalChannels]float64
}

// Season sets, for a zonal table, the basis weights of the step prepared
// by Frame at Julian date jdTT (the seasonal first-degree term and the
// pole, EME2000 +Z, in the sun frame). A uniform table ignores it.
func (t *BoresightTable) Season(f *SunFrame, jdTT float64) {
	if t.ch == 1 || f.dark {
		return
	}
	a1 := t.zonal.a1(jdTT)
	p := r3.Vec{X: f.ex.Z, Y: f.ey.Z, Z: f.ez.Z}
	t.zonal.coefs(&f.coef, p, a1)
	p.Y = -p.Y
	t.zonal.coefs(&f.coefM, p, a1)
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

	if t.ch != 1 {
		return t.atZonal(f, mirror, jθ, bθ, jφ, bφ)
	}
	var c corners
	t.corners(&c, f, jθ, bθ, jφ, bφ, boresightVals)
	var v0, v1, v2, v3 float64 // E and E·Dir (boresightVals = 4), in registers
	for k := range c.n {
		row, w0, w1 := t.vals[c.off[k]:][:2*boresightVals], c.w0[k], c.w1[k]
		v0 += w0*float64(row[0]) + w1*float64(row[4])
		v1 += w0*float64(row[1]) + w1*float64(row[5])
		v2 += w0*float64(row[2]) + w1*float64(row[6])
		v3 += w0*float64(row[3]) + w1*float64(row[7])
	}
	return frameResult(f, mirror, v0, v1, v2, v3)
}

// corners are the grid nodes of one lookup, in the order of the sums:
// radius, sun angle, boresight angle from nadir (each lower node first);
// off[k] is the start in BoresightTable.vals of the node's pair of azimuth
// nodes, w0[k] and w1[k] their weights.
type corners struct {
	n      int
	off    [8]int
	w0, w1 [8]float64
}

// corners fills c for the lookup at boresight cell (jθ, jφ), fractions bθ
// and bφ, with nv values per node.
func (t *BoresightTable) corners(c *corners, f *SunFrame, jθ int, bθ float64, jφ int, bφ float64, nv int) {
	rows := 1
	if len(t.radii) > 1 {
		rows = 2
	}
	c.n = 0
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
			plane := base + (f.i+di)*t.nθn*t.nφ*nv
			for dθ := range 2 {
				wθ := wi * (1 - bθ)
				if dθ == 1 {
					wθ = wi * bθ
				}
				c.off[c.n] = plane + ((jθ+dθ)*t.nφ+jφ)*nv
				c.w0[c.n], c.w1[c.n] = wθ*(1-bφ), wθ*bφ
				c.n++
			}
		}
	}
}

// frameResult turns an interpolated irradiance e and E·Dir (dx, dy, dz) in
// the sun frame f (mirrored when the boresight was) into a Result in
// EME2000; no albedo when either vanishes.
func frameResult(f *SunFrame, mirror bool, e, dx, dy, dz float64) Result {
	n2 := dx*dx + dy*dy + dz*dz
	if !(e > 0) || !(n2 > 0) {
		return Result{}
	}
	inv := 1 / math.Sqrt(n2)
	dx, dy, dz = dx*inv, dy*inv, dz*inv
	if mirror {
		dy = -dy
	}
	return Result{Irradiance: e * f.scale, Dir: r3.Vec{
		X: dx*f.ex.X + dy*f.ey.X + dz*f.ez.X,
		Y: dx*f.ex.Y + dy*f.ey.Y + dz*f.ez.Y,
		Z: dx*f.ex.Z + dy*f.ey.Z + dz*f.ez.Z,
	}}
}

// atZonal is At for a zonal table: the channels interpolated as At
// interpolates E and E·Dir, then weighted with the step's basis weights.
func (t *BoresightTable) atZonal(f *SunFrame, mirror bool, jθ int, bθ float64, jφ int, bφ float64) Result {
	const nv = boresightVals * zonalChannels
	var cn corners
	t.corners(&cn, f, jθ, bθ, jφ, bφ, nv)
	var v [nv]float64
	for k := range cn.n {
		row, w0, w1 := t.vals[cn.off[k]:][:2*nv], cn.w0[k], cn.w1[k]
		for c := range nv {
			v[c] += w0*float64(row[c]) + w1*float64(row[nv+c])
		}
	}
	c := &f.coef
	if mirror {
		c = &f.coefM
	}
	var e, dx, dy, dz float64
	for k := range zonalChannels {
		e += c[k] * v[4*k]
		dx += c[k] * v[4*k+1]
		dy += c[k] * v[4*k+2]
		dz += c[k] * v[4*k+3]
	}
	return frameResult(f, mirror, e, dx, dy, dz)
}
