package sensor

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// QuadrantGeometry names how the light is shaded onto the four cells.
type QuadrantGeometry int

const (
	// GeometryAperture: a square aperture of side ApertureSide at height
	// Height above the cells; the spot of light moves across the cells.
	GeometryAperture QuadrantGeometry = iota
	// GeometryWall: a cross-shaped shade wall of height Height stands in the
	// gaps between the cells, whose inner edges are WallDistance from it; the
	// wall's shadow reaches the cells only beyond atan(WallDistance/Height).
	GeometryWall
)

// String names the geometry as the scenario file does.
func (g QuadrantGeometry) String() string {
	if g == GeometryWall {
		return "wall"
	}
	return "aperture"
}

// DeadZoneReading says what a quadrant sensor reports on an axis whose
// imbalance lies in the dead zone (a flat stretch of the transfer curve
// round the boresight, where the geometry gives no information).
type DeadZoneReading int

const (
	// DeadZoneStraightAbove reports 0 on that axis: the sun "straight
	// above" along it, biased by up to the dead-zone half-angle.
	DeadZoneStraightAbove DeadZoneReading = iota
	// DeadZoneNoSun reports no sun.
	DeadZoneNoSun
)

// String names the choice as the scenario file does.
func (d DeadZoneReading) String() string {
	if d == DeadZoneNoSun {
		return "no-sun"
	}
	return "straight-above"
}

// QuadrantSpec describes a four-quadrant shaded sun sensor: four square
// cells of side CellSide (all lengths in one unit, e.g. mm) shaded by an
// aperture or a wall (Geometry). Cells, seen from the front with sensor X
// right and Y up: A top-left, B top-right, C bottom-right, D bottom-left.
type QuadrantSpec struct {
	Name     string
	Mount    Mount
	Geometry QuadrantGeometry
	// ApertureSide is the side of the square aperture (aperture geometry);
	// Gap the width of the cross-shaped gap between the cells (aperture
	// geometry); WallDistance the distance from the wall to the cells' inner
	// edges (wall geometry). Height is the aperture's or the wall's height.
	ApertureSide, Height, CellSide, Gap, WallDistance float64
	// OffsetX, OffsetY displace the aperture (or wall) from the detector
	// centre (a build error the estimator does not know, same length unit);
	// OffsetSigma is drawn per unit on top, per axis.
	OffsetX, OffsetY, OffsetSigma float64
	// TwistSigma is the 1σ rotation of the unit about its boresight (rad),
	// drawn per unit on top of the misalignment (a detector soldered
	// slightly turned).
	TwistSigma float64
	// SizeErrX, SizeErrY make the shade not square: they add to the
	// aperture side (aperture geometry) or to the wall distance (wall
	// geometry) along each axis, a build error the estimator does not know
	// (same length unit); SizeSigma is drawn per unit and per axis on top.
	SizeErrX, SizeErrY, SizeSigma float64
	// Threshold is the cell-sum signal below which no sun is reported.
	Threshold float64
	// SignalMargin is the validity gate on intensity: a reading is valid only
	// when the cell sum lies within ±SignalMargin (relative) of the sum
	// expected for the sun at RefIrradiance wholly on the cells in the
	// measured direction. 0 turns the gate off.
	SignalMargin float64
	// ImbalanceMargin is the validity gate on position: each axis'
	// normalised imbalance must lie at least this far inside the end of the
	// calibrated linear range (LinearImbalance).
	ImbalanceMargin float64
	// DeadZoneImbalance: for a geometry with a dead zone, an axis whose
	// imbalance is within this of zero is taken to be in the dead zone;
	// DeadZone says what it reports. It is a setting of the flight software
	// and must exceed the imbalance the calibration residuals can fake
	// (about (2/Σ₀)·√(σ_d² + σ_n² + (σ_g·Σ₀/4)²)): below that, a dead-zone
	// reading turns into one at the dead zone's edge, off by up to twice
	// its half-angle.
	DeadZoneImbalance float64
	DeadZone          DeadZoneReading
	// RefIrradiance (W/m²) makes the cell sum 1 for a whole spot (aperture)
	// or a whole detector (wall) at normal incidence; 0 means SolarConstant.
	RefIrradiance float64
	// Sigma is the stated 1σ accuracy per axis (rad), used for weighting;
	// 0 derives it from the error model (see Quadrant.Sigma).
	Sigma  float64
	Errors Errors
}

// Quadrant is a four-quadrant shaded sun sensor.
type Quadrant struct {
	spec    QuadrantSpec
	actual  Mount
	unit    unitErrors
	offX    float64
	offY    float64
	sizeX   float64 // the unit's aperture side or wall distance along x
	sizeY   float64 // and along y
	norm    float64 // area that gives a cell sum of 1 (w² or 4c²)
	tanDead float64 // per-axis tangent of the dead-zone half-angle (the flat part of the transfer)
	// tanDeadRead: the tangent up to which an axis reads as in the dead
	// zone (its imbalance at most deadX), beyond tanDead; 0 without one.
	tanDeadRead float64
	tanLin      float64 // per-axis tangent where the calibrated linear range ends
	tanOn       float64 // aperture: where the closed form X = 2h·tan α/(w − g) ends (spot straddling the gap, wholly on the detector)
	xLin        float64 // imbalance there
	tanDet      float64 // per-axis tangent where light stops reaching a cell (+Inf: never)
	sigma       float64 // stated or derived 1σ per axis
	deadX       float64 // dead-zone imbalance threshold (stated or derived)
}

// NewQuadrant checks the spec and returns an ideal unit.
func NewQuadrant(s QuadrantSpec) (*Quadrant, error) {
	if err := checkName(s.Name); err != nil {
		return nil, err
	}
	if err := checkMount(s.Name, s.Mount); err != nil {
		return nil, err
	}
	aperture := s.Geometry == GeometryAperture
	if !aperture && s.Geometry != GeometryWall {
		return nil, fmt.Errorf("sensor: %q: geometry %d: want aperture or wall", s.Name, s.Geometry)
	}
	for _, f := range []struct {
		key string
		v   float64
		pos bool
	}{{"aperture_side", s.ApertureSide, aperture}, {"height", s.Height, true}, {"cell_side", s.CellSide, true},
		{"gap", s.Gap, false}, {"wall_distance", s.WallDistance, false}, {"offset_sigma", s.OffsetSigma, false},
		{"twist_sigma", s.TwistSigma, false}, {"size_sigma", s.SizeSigma, false}, {"threshold", s.Threshold, false},
		{"signal_margin", s.SignalMargin, false}, {"imbalance_margin", s.ImbalanceMargin, false},
		{"dead_zone_imbalance", s.DeadZoneImbalance, false},
		{"ref_irradiance", s.RefIrradiance, false}, {"sigma", s.Sigma, false}} {
		if math.IsNaN(f.v) || math.IsInf(f.v, 0) || f.v < 0 || (f.pos && f.v == 0) {
			want := "≥ 0"
			if f.pos {
				want = "> 0"
			}
			return nil, fmt.Errorf("sensor: %q: %s = %g: want a finite value %s", s.Name, f.key, f.v, want)
		}
	}
	if s.ImbalanceMargin >= 0.5 || s.DeadZoneImbalance >= 0.5 {
		return nil, fmt.Errorf("sensor: %q: imbalance_margin = %g, dead_zone_imbalance = %g: want [0, 0.5) (margins on an imbalance in [−1, 1])",
			s.Name, s.ImbalanceMargin, s.DeadZoneImbalance)
	}
	if s.DeadZone != DeadZoneStraightAbove && s.DeadZone != DeadZoneNoSun {
		return nil, fmt.Errorf("sensor: %q: dead zone reading %d: want straight-above or no-sun", s.Name, s.DeadZone)
	}
	if math.IsNaN(s.OffsetX) || math.IsNaN(s.OffsetY) || math.IsInf(s.OffsetX, 0) || math.IsInf(s.OffsetY, 0) {
		return nil, fmt.Errorf("sensor: %q: offset_x/offset_y: want finite lengths", s.Name)
	}
	if math.IsNaN(s.SizeErrX) || math.IsNaN(s.SizeErrY) || math.IsInf(s.SizeErrX, 0) || math.IsInf(s.SizeErrY, 0) {
		return nil, fmt.Errorf("sensor: %q: size_err_x/size_err_y: want finite lengths", s.Name)
	}
	if s.RefIrradiance == 0 {
		s.RefIrradiance = SolarConstant
	}
	if err := s.Errors.validate(s.Name); err != nil {
		return nil, err
	}
	q := &Quadrant{spec: s, actual: s.Mount, offX: s.OffsetX, offY: s.OffsetY}
	q.sizeX, q.sizeY = q.builtSize(s.SizeErrX), q.builtSize(s.SizeErrY)
	q.shape()
	q.sigma = s.Sigma
	if q.sigma == 0 {
		q.sigma = q.derivedSigma()
	}
	q.deadX = s.DeadZoneImbalance
	if q.xLin <= s.ImbalanceMargin {
		return nil, fmt.Errorf("sensor: %q: no reading can be valid: an aperture (%g mm) no wider than the gap (%g mm) never lights two cells at once; widen the aperture or narrow the gap",
			s.Name, s.ApertureSide, s.Gap)
	}
	if q.tanDead > 0 {
		q.tanDeadRead = q.invert(min(q.deadX, q.xLin))
	}
	if q.ValidHalfAngle() == 0 {
		return nil, fmt.Errorf("sensor: %q: threshold %g is above the cell sum at normal incidence (%.3f of full sun): no reading can be valid; give a lower threshold",
			s.Name, s.Threshold, q.sum(r3.Vec{Z: 1}, 0, 0)*SolarConstant/s.RefIrradiance)
	}
	return q, nil
}

// nominalSize is the aperture side (aperture geometry) or the wall
// distance (wall geometry) the flight software inverts with.
func (q *Quadrant) nominalSize() float64 {
	if q.spec.Geometry == GeometryWall {
		return q.spec.WallDistance
	}
	return q.spec.ApertureSide
}

// builtSize is the nominal size with a build error added, never below 0.
func (q *Quadrant) builtSize(err float64) float64 {
	return max(0, q.nominalSize()+err)
}

// shape fills the derived geometry: normalisation, dead zone, linear and
// detection ranges (closed forms of the one-axis geometry).
func (q *Quadrant) shape() {
	s := q.spec
	h, c := s.Height, s.CellSide
	if s.Geometry == GeometryWall {
		// The shadow of the wall top lies H·tan α from the wall: it reaches
		// the near cell at tan α = d/H and covers it at (d + c)/H.
		q.norm = 4 * c * c
		q.tanDead = s.WallDistance / h
		q.tanLin = (s.WallDistance + c) / h
		q.xLin = 1
		q.tanDet = math.Inf(1)
		return
	}
	w, g := s.ApertureSide, s.Gap
	q.norm = w * w
	q.tanDet = (w/2 + c + g/2) / h      // spot edge leaves the outer cell edge
	q.tanDead = max(0, (w-2*c-g)/(2*h)) // spot wider than the detector covers it all
	switch {
	case w <= g: // the spot never straddles the gap: no linear range
		q.tanLin, q.xLin = 0, 0
	default:
		// Both cells lit until the spot's inner edge crosses the gap, at
		// X = 1. A spot wider than a cell leaves the detector first, at
		// tan α = (c + g/2 − w/2)/h; beyond, the far cell stays wholly lit
		// (r = c) while the near one's lit length l falls, so
		// X = (c − l)/(c + l) still rises monotonically to 1 (elementary
		// geometry): the range is inverted by bisection there.
		q.tanLin, q.xLin = (w-g)/(2*h), 1
		q.tanOn = max(0, min((w-g)/2, c+g/2-w/2)/h)
	}
}

// Name implements Sensor.
func (q *Quadrant) Name() string { return q.spec.Name }

// Kind implements Sensor.
func (q *Quadrant) Kind() Kind {
	if q.spec.Geometry == GeometryWall {
		return KindQuadrantWall
	}
	return KindQuadrant
}

// Mount implements Sensor.
func (q *Quadrant) Mount() Mount { return q.spec.Mount }

// Spec returns the sensor's specification.
func (q *Quadrant) Spec() QuadrantSpec { return q.spec }

// Sigma implements Sensor: the stated accuracy, or when none is stated the
// one derived from the error model (see derivedSigma).
func (q *Quadrant) Sigma() float64 { return q.sigma }

// derivedSigma is the per-axis 1σ of the direction at normal incidence from
// the error model, to first order: the imbalance error of four equal cells
// (each ≈ Σ₀/4) from dark offsets, noise, gain mismatch and the ADC step q,
// σ_X = (2/Σ₀)·√(σ_d² + σ_n² + (σ_g·Σ₀/4)² + q²/12 + r²), times the slope
// dt/dX of the transfer at the start of the linear range, added in
// quadrature to the misalignment, half the twist variance (a twist δ turns a
// direction at angle α off the boresight by δ·sin α; taken at the mean of
// sin²), the aperture offset over the height and the shade size error
// σ_s: a wall distance off by δ moves every reading by δ/H in tangent; an
// aperture side off by δ scales the tangent by (w − g)/(w − g + δ), an
// error t·δ/(w − g) taken at the mean of t² over the linear range,
// tanLin²/3. r = 1e-4 of full sun is a
// resolution floor per cell (common practice, no source) that keeps an
// error-free sensor's weight finite and in proportion to its geometry, so
// that small errors change the weights of several sensors smoothly. It holds
// near normal incidence: the noise part grows as Σ₀/Σ(θ) off the boresight.
// A reading in the dead zone carries its own larger Reading.Sigma. Own
// first-order derivation from the geometry above.
func (q *Quadrant) derivedSigma() float64 {
	s := q.spec
	e := s.Errors
	sx := q.imbalanceSigma()
	slope := 0.0 // dt/dX
	switch {
	case s.Geometry == GeometryWall:
		slope = 2 * s.CellSide / s.Height // X = s/(2c − s), t = (d + s)/H at s → 0
	case s.ApertureSide > s.Gap:
		slope = (s.ApertureSide - s.Gap) / (2 * s.Height)
	}
	size := 0.0 // tangent error of the shade size error
	switch {
	case s.Geometry == GeometryWall:
		size = s.SizeSigma / s.Height
	case s.ApertureSide > s.Gap:
		size = s.SizeSigma * q.tanLin / (s.ApertureSide - s.Gap) / math.Sqrt(3)
	}
	v := slope*sx*slope*sx + e.MisalignSigma*e.MisalignSigma + s.TwistSigma*s.TwistSigma/2 +
		(s.OffsetSigma/s.Height)*(s.OffsetSigma/s.Height) + size*size
	if v == 0 { // no linear range and no error: any small weight
		return 0.01 * math.Pi / 180
	}
	return math.Sqrt(v)
}

// imbalanceSigma is σ_X of derivedSigma: the 1σ error of one axis'
// imbalance at normal incidence from the error model.
func (q *Quadrant) imbalanceSigma() float64 {
	const resolution = 1e-4
	e := q.spec.Errors
	sum0 := q.sum(r3.Vec{Z: 1}, 0, 0) // nominal sum at normal incidence
	if sum0 <= 0 {
		sum0 = 1
	}
	var q2 float64 // ADC step², per cell
	if e.ADCBits > 0 {
		step := e.FullScale / float64(uint64(1)<<e.ADCBits)
		q2 = step * step
	}
	return 2 / sum0 * math.Sqrt(e.DarkSigma*e.DarkSigma+e.NoiseSigma*e.NoiseSigma+(e.GainSigma*sum0/4)*(e.GainSigma*sum0/4)+
		q2/12+resolution*resolution)
}

// DeadZoneImbalance returns the imbalance below which an axis is taken to
// be in the dead zone.
func (q *Quadrant) DeadZoneImbalance() float64 { return q.deadX }

// overlap is the length of [a0, a1] ∩ [b0, b1].
func overlap(a0, a1, b0, b1 float64) float64 {
	return max(0, min(a1, b1)-max(a0, b0))
}

// axisLit returns the lit lengths of the negative and positive cells of one
// axis for a sun at tangent t along it, with the aperture (or wall)
// displaced by off and the aperture side (or wall distance) size along it.
func (q *Quadrant) axisLit(t, off, size float64) (neg, pos float64) {
	s := q.spec
	c := s.CellSide
	if s.Geometry == GeometryWall {
		// The shadow band runs from the wall foot (off) to the shadow of
		// its top (off − H·t); it covers the full length of the cells.
		b0, b1 := off, off-s.Height*t
		if b1 < b0 {
			b0, b1 = b1, b0
		}
		d := size
		return c - overlap(b0, b1, -d-c, -d), c - overlap(b0, b1, d, d+c)
	}
	w, g := size, s.Gap
	cx := off - s.Height*t // spot centre
	return overlap(cx-w/2, cx+w/2, -g/2-c, -g/2), overlap(cx-w/2, cx+w/2, g/2, g/2+c)
}

// cellAreas returns the lit areas A, B, C, D of the nominal geometry for a
// sensor-frame direction d (d.Z > 0) with the aperture (or wall) displaced
// by (ox, oy).
func (q *Quadrant) cellAreas(d r3.Vec, ox, oy float64) [4]float64 {
	n := q.nominalSize()
	return q.builtAreas(d, ox, oy, n, n)
}

// builtAreas is cellAreas with the aperture side (or wall distance) sx
// along x and sy along y.
func (q *Quadrant) builtAreas(d r3.Vec, ox, oy, sx, sy float64) [4]float64 {
	l, r := q.axisLit(d.X/d.Z, ox, sx)
	b, t := q.axisLit(d.Y/d.Z, oy, sy)
	return [4]float64{l * t, r * t, r * b, l * b}
}

// sum is the nominal cell sum (normalised, sun at RefIrradiance) for a
// sensor-frame direction d, with displacement (ox, oy).
func (q *Quadrant) sum(d r3.Vec, ox, oy float64) float64 {
	d = vecmath.Unit(d)
	if d.Z <= 0 {
		return 0
	}
	a := q.cellAreas(d, ox, oy)
	return d.Z * (a[0] + a[1] + a[2] + a[3]) / q.norm
}

// CellResponse is the relative response of each cell A, B, C, D of the
// nominal unit to a collimated beam from the unit sensor-frame direction d:
// cos θ times the cell's lit area over the normalising area (the whole spot
// for an aperture, the whole detector for a wall), zero when d.Z ≤ 0. The
// albedo model integrates radiance with it, cell by cell.
func (q *Quadrant) CellResponse(d r3.Vec) [4]float64 {
	if d.Z <= 0 {
		return [4]float64{}
	}
	a := q.cellAreas(d, 0, 0)
	k := d.Z / q.norm
	return [4]float64{a[0] * k, a[1] * k, a[2] * k, a[3] * k}
}

// ratio is the one-axis normalised imbalance (neg − pos)/(neg + pos) of the
// nominal geometry at tangent t; the second result is false when no light
// is on the cells.
func (q *Quadrant) ratio(t float64) (float64, bool) {
	n, p := q.axisLit(t, 0, q.nominalSize())
	if n+p <= 0 {
		return 0, false
	}
	return (n - p) / (n + p), true
}

// Transfer returns the ideal normalised imbalance X (or Y) of the nominal
// geometry for a sun at tangent tanAlpha along that axis. Closed forms:
// aperture, while the spot straddles the gap and stays on the detector,
// X = 2h·tan α/(w − g); wall, beyond the dead zone, X = −s/(2c − s) with
// s = H·tan α − d the shadow's reach into the near cell (0 inside).
func (q *Quadrant) Transfer(tanAlpha float64) float64 {
	x, _ := q.ratio(tanAlpha)
	return x
}

// invert returns the tangent t ≥ tanDead of the nominal geometry whose
// imbalance has magnitude ax ∈ [0, xLin]: closed forms in the linear part,
// else bisection on the monotone transfer curve (60 halvings).
func (q *Quadrant) invert(ax float64) float64 {
	s := q.spec
	if s.Geometry == GeometryWall {
		sh := 2 * s.CellSide * ax / (1 + ax) // |X| = s/(2c − s)
		return (s.WallDistance + sh) / s.Height
	}
	w, g := s.ApertureSide, s.Gap
	if t := ax * (w - g) / (2 * s.Height); t <= q.tanOn && q.tanDead == 0 {
		return t
	}
	lo, hi := q.tanDead, q.tanLin
	for range 60 {
		mid := 0.5 * (lo + hi)
		if r, _ := q.ratio(mid); r < ax {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi)
}

// axisAngle turns one axis' measured imbalance into a tangent through the
// nominal geometry, applying the position gate: ok is false outside the
// calibrated range, dead reports an imbalance in the dead zone.
func (q *Quadrant) axisAngle(x float64) (t float64, ok, dead bool) {
	m := q.spec.ImbalanceMargin
	ax := math.Abs(x)
	// |X| = 1: light on one side only, no position information.
	if !(ax <= q.xLin-m) || ax >= 1 || q.xLin <= m {
		return 0, false, false
	}
	if q.tanDead > 0 && ax <= q.deadX {
		return 0, true, true
	}
	t = q.invert(ax)
	// Aperture: X > 0 when the spot moves toward −x, i.e. for a sun toward
	// +x. Wall: the shadow falls on the −x cells for a sun toward +x, X < 0.
	if (x < 0) != (q.spec.Geometry == GeometryWall) {
		t = -t
	}
	return t, true, false
}

// DeadZoneHalfAngle returns the per-axis half-angle (rad) of the dead zone
// round the boresight, where the imbalance stays zero: atan(d/H) for a wall,
// atan((w − 2c − g)/2h) for an aperture wider than the detector, else 0.
func (q *Quadrant) DeadZoneHalfAngle() float64 { return math.Atan(q.tanDead) }

// DeadZoneReadHalfAngle returns the per-axis half-angle (rad) up to which
// a reading takes the dead-zone rule (straight-above or no sun): the
// imbalance stays within DeadZoneImbalance of zero a little beyond the
// flat part, to the angle the nominal transfer reaches it (0 without a
// dead zone).
func (q *Quadrant) DeadZoneReadHalfAngle() float64 { return math.Atan(q.tanDeadRead) }

// LinearHalfAngle returns the per-axis half-angle (rad) up to which a
// reading can be valid: where the imbalance reaches the end of the
// calibrated linear range less ImbalanceMargin (0 when there is none).
func (q *Quadrant) LinearHalfAngle() float64 {
	lim := q.xLin - q.spec.ImbalanceMargin
	if lim <= 0 {
		return 0
	}
	return math.Atan(q.invert(lim))
}

// ValidHalfAngle returns the per-axis half-angle (rad) up to which the
// nominal unit gives a valid reading from a 1 AU sun along a sensor axis:
// LinearHalfAngle, or less where the cell sum falls below the threshold
// first (the sum falls monotonically off the boresight: cos α times a lit
// area that does not grow). 0 when even the boresight is below it.
func (q *Quadrant) ValidHalfAngle() float64 {
	lin := q.LinearHalfAngle()
	above := func(t float64) bool {
		return q.sum(r3.Vec{X: t, Z: 1}, 0, 0)*SolarConstant/q.spec.RefIrradiance >= q.spec.Threshold
	}
	hi := math.Tan(lin)
	if above(hi) {
		return lin
	}
	if !above(0) {
		return 0
	}
	lo := 0.0
	for range 60 {
		mid := 0.5 * (lo + hi)
		if above(mid) {
			lo = mid
		} else {
			hi = mid
		}
	}
	return math.Atan(lo)
}

// LinearImbalance returns the imbalance at the end of the calibrated linear
// range (1 when it ends where a cell goes dark).
func (q *Quadrant) LinearImbalance() float64 { return q.xLin }

// DetectionHalfAngle returns the per-axis half-angle (rad) up to which light
// reaches a cell: atan((w/2 + c + g/2)/h) for an aperture, 90° for a wall.
func (q *Quadrant) DetectionHalfAngle() float64 { return math.Atan(q.tanDet) }

// InFOV implements Sensor: light from dir reaches a cell of the nominal
// geometry (the detection range; SeesSun says where a reading is valid).
func (q *Quadrant) InFOV(dir r3.Vec) bool {
	return q.Response(dir) > 0
}

// Response implements Sensor: cos θ times the lit cell area over the
// normalising area (the sum of CellResponse).
func (q *Quadrant) Response(dir r3.Vec) float64 {
	return q.sum(q.spec.Mount.ToSensor(dir), 0, 0)
}

// HalfAngle implements Sensor: the cone through the corners of the square
// detection range, tan = √2·(w/2 + c + g/2)/h for an aperture; 90° for a
// wall (its far cells stay lit to grazing incidence).
func (q *Quadrant) HalfAngle() float64 {
	if math.IsInf(q.tanDet, 1) {
		return math.Pi / 2
	}
	return math.Atan(math.Sqrt2 * q.tanDet)
}

// SeesSun implements Sensor: direct sun at SolarConstant from dir gives a
// valid reading of the nominal unit with no error (the gates applied), with
// a cell sum of at least MinSeenSignal.
func (q *Quadrant) SeesSun(dir r3.Vec) bool {
	d := q.spec.Mount.ToSensor(dir)
	if d.Z <= 0 {
		return false
	}
	var out Reading
	a := q.cellAreas(d, 0, 0)
	full := q.spec.Errors.FullScale
	k := d.Z * SolarConstant / q.spec.RefIrradiance / q.norm
	for i := range a {
		out.Cells[i] = k * a[i]
		if full > 0 && out.Cells[i] >= full {
			out.Cells[i], out.Saturated = full, true
		}
		out.Signal += out.Cells[i]
	}
	q.decide(&out)
	return out.Valid && out.Signal >= MinSeenSignal
}

// Read implements Sensor. Each cell gets S·cos θ☉ times its lit fraction of
// the normalising area, plus its albedo: alb.Cells when the albedo model
// integrated the cells' own responses, else alb.Irradiance split in the
// proportions of the mean direction's lit areas (nothing when that
// direction lights no cell). Then the validity gate (see decide).
func (q *Quadrant) Read(sun r3.Vec, direct float64, alb Albedo, noise *rand.Rand) Reading {
	return q.readAt(sun, direct, alb, noise, 1, 0)
}

// ThermalModel implements Warm.
func (q *Quadrant) ThermalModel() Thermal { return q.spec.Errors.Thermal }

// ReadAt implements Warm: every cell takes the temperature's gain factor
// and added dark signal.
func (q *Quadrant) ReadAt(sun r3.Vec, direct float64, alb Albedo, noise *rand.Rand, tempC float64) Reading {
	g, d := q.spec.Errors.Thermal.Factors(tempC)
	return q.readAt(sun, direct, alb, noise, g, d)
}

func (q *Quadrant) readAt(sun r3.Vec, direct float64, alb Albedo, noise *rand.Rand, gainT, darkT float64) Reading {
	var cells [4]float64
	if d := q.actual.ToSensor(sun); d.Z > 0 && direct > 0 {
		a := q.builtAreas(d, q.offX, q.offY, q.sizeX, q.sizeY)
		for i := range cells {
			cells[i] = direct * d.Z * a[i] / q.norm
		}
	}
	switch {
	case alb.Cells != [4]float64{}:
		for i := range cells {
			cells[i] += alb.Cells[i]
		}
	case alb.Irradiance > 0:
		if d := q.actual.ToSensor(alb.Dir); d.Z > 0 {
			a := q.builtAreas(d, q.offX, q.offY, q.sizeX, q.sizeY)
			if s := a[0] + a[1] + a[2] + a[3]; s > 0 {
				for i := range cells {
					cells[i] += alb.Irradiance * a[i] / s
				}
			}
		}
	}
	var out Reading
	for i := range cells {
		v := gainT*(1+q.unit.gain[i])*cells[i]/q.spec.RefIrradiance + q.unit.dark[i] + darkT
		v, sat := q.spec.Errors.convert(v, noise)
		out.Cells[i] = v
		out.Saturated = out.Saturated || sat
		out.Signal += v
	}
	q.decide(&out)
	return out
}

// decide is the validity gate a flight algorithm applies to the cells of
// out, and the inversion: no sun below the threshold or with a cell at full
// scale; each axis' imbalance inside the calibrated linear range less
// ImbalanceMargin (a reading outside is no sun, never an edge-of-range
// direction); the dead zone per DeadZone; and the cell sum within
// ±SignalMargin of the sum the nominal geometry expects for a sun at
// RefIrradiance in the measured direction (rejects partial spots, penumbra
// and albedo-dominated readings).
func (q *Quadrant) decide(out *Reading) {
	sum := out.Signal
	if sum <= 0 || sum < q.spec.Threshold || out.Saturated {
		return
	}
	A, B, C, D := out.Cells[0], out.Cells[1], out.Cells[2], out.Cells[3]
	x := ((A + D) - (B + C)) / sum
	y := ((C + D) - (A + B)) / sum
	tx, okx, deadX := q.axisAngle(x)
	ty, oky, deadY := q.axisAngle(y)
	if !okx || !oky || ((deadX || deadY) && q.spec.DeadZone == DeadZoneNoSun) {
		return
	}
	d := vecmath.Unit(r3.Vec{X: tx, Y: ty, Z: 1})
	if m := q.spec.SignalMargin; m > 0 {
		exp := q.sum(d, 0, 0)
		lo := exp
		if deadX || deadY {
			// An axis in the dead zone says only that the sun lies within
			// the zone along it: the sum expected of any direction there
			// lies between the one at the boresight and the one at the
			// zone's edge (the sum falls off the boresight), so the gate
			// takes that span. Against the boresight's alone it rejected
			// straight-above readings off the diagonals, a band of no sun
			// 36-41° off the boresight that check did not print.
			e := d
			if deadX {
				e.X = q.tanDeadRead * d.Z
			}
			if deadY {
				e.Y = q.tanDeadRead * d.Z
			}
			lo = min(exp, q.sum(e, 0, 0))
		}
		if !(exp > 0) || sum < lo*(1-m) || sum > exp*(1+m) {
			return
		}
	}
	out.Dir = q.spec.Mount.ToBody(d)
	out.Valid = true
	if deadX || deadY {
		out.Sigma = max(q.sigma, math.Atan(q.tanDeadRead/math.Sqrt(3)))
	}
}

// Draw implements Sensor.
func (q *Quadrant) Draw(rng *rand.Rand) Sensor {
	u := *q
	u.actual, u.unit = drawUnit(q.spec.Errors, q.spec.Mount, 4, rng)
	u.offX = q.spec.OffsetX + q.spec.OffsetSigma*rng.NormFloat64()
	u.offY = q.spec.OffsetY + q.spec.OffsetSigma*rng.NormFloat64()
	u.actual = u.actual.Misaligned(r3.Vec{Z: q.spec.TwistSigma * rng.NormFloat64()})
	if sg := q.spec.SizeSigma; sg > 0 { // drawn only when set: the stream of other units stays
		u.sizeX = u.builtSize(q.spec.SizeErrX + sg*rng.NormFloat64())
		u.sizeY = u.builtSize(q.spec.SizeErrY + sg*rng.NormFloat64())
	}
	return &u
}

// The keys shared by both quadrant geometries: the validity gate, the
// dead-zone reading, the accuracy and the twist. Defaults: common practice
// for a hobby four-quadrant shade, no source.
var quadrantGateParams = []Param{
	{Key: "signal_margin", Doc: "validity gate: cell sum within ± this (relative) of the sum expected for the sun wholly on the cells in the measured direction; 0 turns it off",
		Default: 0.2, Min: 0, Max: 10, Allowed: "[0, 10] (relative; 0 turns the intensity check off)"},
	{Key: "imbalance_margin", Doc: "validity gate: each axis' imbalance at least this far inside the end of the calibrated linear range",
		Default: 0.05, Min: 0, Max: 0.49, Allowed: "[0, 0.49] (of an imbalance in [-1, 1])"},
	// 0.03: three times the imbalance error of a 2 % gain mismatch between
	// cells, σ_X ≈ σ_g/2 (common practice, no source).
	{Key: "dead_zone_imbalance", Doc: "an imbalance within this of zero is in the dead zone (geometries with one); set it above what the calibration residuals can fake",
		Default: 0.03, Min: 0, Max: 0.49, Allowed: "[0, 0.49] (of an imbalance in [-1, 1])"},
	{Key: "dead_zone", Type: Choice, Doc: "what an axis in the dead zone reports: the boresight along it (biased), or no sun",
		Choices: []string{DeadZoneStraightAbove.String(), DeadZoneNoSun.String()}},
	{Key: "accuracy_deg_1sigma", Doc: "stated accuracy per axis for the weighted estimators; 0 derives it from the error model",
		Default: 0, Min: 0, Max: 90, Allowed: "[0, 90] degrees (0: derived from the error model)", Scale: math.Pi / 180},
	{Key: "twist_deg_1sigma", Doc: "1σ rotation of the unit about its boresight, drawn per unit (a detector soldered turned)",
		Default: 0, Min: 0, Max: 90, Allowed: "[0, 90] degrees", Scale: math.Pi / 180},
	{Key: "shade_size_mm_1sigma", Doc: "1σ error of the aperture side (quadrant) or of the wall distance (quadrant-wall), drawn per unit and per axis: a shade that is not square",
		Default: 0, Min: 0, Max: 10, Allowed: "[0, 10] mm"},
}

// quadrantSources are the error sources both geometries offer the budget.
var quadrantSources = []ErrorSource{{Name: SourceDarkOffset}, {Name: SourceGain}, {Name: SourceNoise},
	{Name: SourceQuantisation}, {Name: SourceMisalignment}, {Name: SourceApertureOffset},
	{Name: SourceTwist, Param: "twist_deg_1sigma"}, {Name: SourceShadeSize, Param: "shade_size_mm_1sigma"}, {Name: SourceTemperature}}

// The registry entries of the two quadrant geometries.
func init() {
	Register(KindInfo{
		Kind: KindQuadrant, Doc: "four-quadrant cells under a square aperture: a two-axis direction from the cell imbalance",
		Source:       "closed-form spot geometry X = 2h·tan α/(w − g) (elementary geometry); Wertz (ed.), Spacecraft Attitude Determination and Control, Reidel 1978, ch. 6 (from memory)",
		GeometricFOV: true, TwoAxis: true,
		Params: append([]Param{
			{Key: "shade_height_mm", Doc: "height of the aperture above the cells", Default: 1.0, Min: 0, Max: 100, MinOpen: true, Allowed: "(0, 100] mm"},
			{Key: "cell_size_mm", Doc: "side of each of the four square cells", Default: 2.0, Min: 0, Max: 100, MinOpen: true, Allowed: "(0, 100] mm"},
			{Key: "gap_mm", Doc: "gap between the cells", Default: 0.1, Min: 0, MaxKey: "cell_size_mm", Allowed: "[0, cell_size_mm] mm"},
			// The aperture is one cell wide by default, so the spot just fills
			// a cell at normal incidence (the usual proportion; common
			// practice, no source).
			{Key: "aperture_mm", Doc: "side of the square aperture; 0 means one cell side", Default: 0, Min: 0, Max: 100, Allowed: "[0, 100] mm (0: cell_size_mm)"},
		}, slices.Concat(quadrantGateParams, thermalParams)...),
		Sources: quadrantSources,
		Build:   buildQuadrant,
	})
	Register(KindInfo{
		Kind: KindQuadrantWall, Doc: "four-quadrant cells beside a cross-shaped shade wall: flat (a dead zone) until the wall's shadow reaches the cells at atan(d/H)",
		Source:       "closed-form wall-shadow geometry, shadow reach H·tan α − d (elementary geometry); a 30° dead zone for a hobby four-quadrant shade is common practice, no source",
		GeometricFOV: true, TwoAxis: true,
		Params: append([]Param{
			{Key: "shade_height_mm", Doc: "height H of the shade wall above the cells", Default: 1.0, Min: 0, Max: 100, MinOpen: true, Allowed: "(0, 100] mm"},
			{Key: "cell_size_mm", Doc: "side of each of the four square cells", Default: 2.0, Min: 0, Max: 100, MinOpen: true, Allowed: "(0, 100] mm"},
			// 0.577 mm beside a 1 mm wall: a 30° dead zone (common practice,
			// no source).
			{Key: "wall_distance_mm", Doc: "distance d from the wall to the cells' inner edges; the dead zone is atan(d/H)",
				Default: 0.577, Min: 0, Max: 100, Allowed: "[0, 100] mm"},
		}, slices.Concat(quadrantGateParams, thermalParams)...),
		Sources: quadrantSources,
		Build:   buildQuadrant,
	})
}

func buildQuadrant(c Common, p Params) (Sensor, error) {
	q, err := newQuadrantFrom(c, p)
	if err != nil {
		return nil, err
	}
	// The dead-zone keys act only where the geometry has a dead zone.
	if q.tanDead == 0 {
		for _, k := range []string{"dead_zone", "dead_zone_imbalance"} {
			if given(p, k) {
				fix := "widen aperture_mm beyond 2·cell_size_mm + gap_mm"
				if q.spec.Geometry == GeometryWall {
					fix = "give wall_distance_mm > 0"
				}
				return nil, fmt.Errorf("sensor: %q: %s: this geometry has no dead zone, so the key would change nothing; remove it, or %s", c.Name, k, fix)
			}
		}
	}
	return q, nil
}

// given reports whether the kind parameter key has a value other than its
// registry default (a default stated in the file changes nothing either).
func given(p Params, key string) bool {
	for _, d := range quadrantGateParams {
		if d.Key != key {
			continue
		}
		if d.Type == Choice {
			return p.Text[key] != "" && p.Text[key] != d.Choices[0]
		}
		return p.Num[key] != d.Default*ScaleOr1(d.Scale)
	}
	return false
}

func newQuadrantFrom(c Common, p Params) (*Quadrant, error) {
	spec := QuadrantSpec{Name: c.Name, Mount: c.Mount, Height: p.Num["shade_height_mm"], CellSide: p.Num["cell_size_mm"],
		Threshold: c.Threshold, SignalMargin: p.Num["signal_margin"], ImbalanceMargin: p.Num["imbalance_margin"],
		DeadZoneImbalance: p.Num["dead_zone_imbalance"], Sigma: p.Num["accuracy_deg_1sigma"],
		OffsetSigma: c.OffsetSigma, TwistSigma: p.Num["twist_deg_1sigma"], SizeSigma: p.Num["shade_size_mm_1sigma"], Errors: c.Errors}
	spec.Errors.Thermal = thermalFrom(p)
	if p.Text["dead_zone"] == DeadZoneNoSun.String() {
		spec.DeadZone = DeadZoneNoSun
	}
	if d, wall := p.Num["wall_distance_mm"]; wall {
		spec.Geometry, spec.WallDistance = GeometryWall, d
	} else {
		spec.Gap, spec.ApertureSide = p.Num["gap_mm"], p.Num["aperture_mm"]
		if spec.ApertureSide == 0 {
			spec.ApertureSide = spec.CellSide
		}
	}
	return NewQuadrant(spec)
}
