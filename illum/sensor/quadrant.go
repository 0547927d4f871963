package sensor

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// QuadrantSpec describes a four-quadrant sun sensor: a square aperture of
// side ApertureSide at height Height above four square cells of side
// CellSide separated by a cross-shaped gap Gap (all lengths in one unit,
// e.g. mm). Cells, seen from the front with sensor X right and Y up:
// A top-left, B top-right, C bottom-right, D bottom-left.
type QuadrantSpec struct {
	Name                                string
	Mount                               Mount
	ApertureSide, Height, CellSide, Gap float64
	// OffsetX, OffsetY displace the aperture centre from the detector
	// centre (a build error, same length unit); OffsetSigma is drawn per
	// unit on top, per axis.
	OffsetX, OffsetY, OffsetSigma float64
	// Threshold is the cell-sum signal below which no sun is reported.
	Threshold float64
	// RefIrradiance (W/m²) makes the cell sum 1 for a whole spot at normal
	// incidence; 0 means SolarConstant.
	RefIrradiance float64
	// Sigma is the stated 1σ accuracy per axis (rad), used for weighting.
	Sigma  float64
	Errors Errors
}

// Quadrant is a four-quadrant shaded sun sensor.
type Quadrant struct {
	spec   QuadrantSpec
	actual Mount
	unit   unitErrors
	offX   float64
	offY   float64
}

// NewQuadrant checks the spec and returns an ideal unit.
func NewQuadrant(s QuadrantSpec) (*Quadrant, error) {
	if err := checkName(s.Name); err != nil {
		return nil, err
	}
	if err := checkMount(s.Name, s.Mount); err != nil {
		return nil, err
	}
	for _, f := range []struct {
		key string
		v   float64
		pos bool
	}{{"aperture_side", s.ApertureSide, true}, {"height", s.Height, true}, {"cell_side", s.CellSide, true},
		{"gap", s.Gap, false}, {"offset_sigma", s.OffsetSigma, false}, {"threshold", s.Threshold, false},
		{"ref_irradiance", s.RefIrradiance, false}, {"sigma", s.Sigma, true}} {
		if math.IsNaN(f.v) || math.IsInf(f.v, 0) || f.v < 0 || (f.pos && f.v == 0) {
			want := "≥ 0"
			if f.pos {
				want = "> 0"
			}
			return nil, fmt.Errorf("sensor %q: %s = %g: want a finite value %s", s.Name, f.key, f.v, want)
		}
	}
	if math.IsNaN(s.OffsetX) || math.IsNaN(s.OffsetY) || math.IsInf(s.OffsetX, 0) || math.IsInf(s.OffsetY, 0) {
		return nil, fmt.Errorf("sensor %q: offset_x/offset_y: want finite lengths", s.Name)
	}
	if s.RefIrradiance == 0 {
		s.RefIrradiance = SolarConstant
	}
	if err := s.Errors.validate(s.Name); err != nil {
		return nil, err
	}
	return &Quadrant{spec: s, actual: s.Mount, offX: s.OffsetX, offY: s.OffsetY}, nil
}

// Name implements Sensor.
func (q *Quadrant) Name() string { return q.spec.Name }

// Kind implements Sensor.
func (q *Quadrant) Kind() Kind { return KindQuadrant }

// Mount implements Sensor.
func (q *Quadrant) Mount() Mount { return q.spec.Mount }

// Spec returns the sensor's specification.
func (q *Quadrant) Spec() QuadrantSpec { return q.spec }

// Sigma implements Sensor.
func (q *Quadrant) Sigma() float64 { return q.spec.Sigma }

// overlap is the length of [a0, a1] ∩ [b0, b1].
func overlap(a0, a1, b0, b1 float64) float64 {
	return math.Max(0, math.Min(a1, b1)-math.Max(a0, b0))
}

// split returns the spot length on the negative and positive cells of one
// axis for a spot centred at cx.
func (q *Quadrant) split(cx float64) (neg, pos float64) {
	w, c, g := q.spec.ApertureSide, q.spec.CellSide, q.spec.Gap
	a0, a1 := cx-w/2, cx+w/2
	return overlap(a0, a1, -g/2-c, -g/2), overlap(a0, a1, g/2, g/2+c)
}

// ratio is the one-axis normalised difference (neg − pos)/(neg + pos) for a
// spot centred at cx; the second result is false when no light is on the cells.
func (q *Quadrant) ratio(cx float64) (float64, bool) {
	n, p := q.split(cx)
	if n+p <= 0 {
		return 0, false
	}
	return (n - p) / (n + p), true
}

// Transfer returns the ideal normalised difference X (or Y) of the nominal
// geometry for a sun at tangent tanAlpha along that axis: the spot moves by
// −h·tan α. Closed form while the spot straddles the gap and stays on the
// detector: X = 2h·tan α/(w − g).
func (q *Quadrant) Transfer(tanAlpha float64) float64 {
	x, _ := q.ratio(-q.spec.Height * tanAlpha)
	return x
}

// invert finds the spot centre of the nominal geometry giving ratio x: in
// closed form, cx = −x·(w − g)/2, while the spot straddles the gap and stays
// on the detector, else by bisection on the monotone transfer curve (60
// halvings).
func (q *Quadrant) invert(x float64) float64 {
	w, c, g := q.spec.ApertureSide, q.spec.CellSide, q.spec.Gap
	if w > g {
		cx := -x * (w - g) / 2
		if a := math.Abs(cx); a <= (w-g)/2 && a+w/2 <= c+g/2 {
			return cx
		}
	}
	lo, hi := -(w/2 + c + g/2), w/2+c+g/2 // ratio(lo) = +1 side, ratio(hi) = −1 side
	for range 60 {
		mid := 0.5 * (lo + hi)
		r, _ := q.ratio(mid)
		if r == x {
			return mid
		}
		if r > x {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi)
}

// cellAreas returns the lit areas A, B, C, D for a sensor-frame direction
// d (d.Z > 0) with the aperture displaced by (ox, oy).
func (q *Quadrant) cellAreas(d r3.Vec, ox, oy float64) [4]float64 {
	h := q.spec.Height
	l, r := q.split(ox - h*d.X/d.Z)
	b, t := q.split(oy - h*d.Y/d.Z)
	return [4]float64{l * t, r * t, r * b, l * b}
}

// InFOV implements Sensor: the spot of the nominal geometry touches a cell.
func (q *Quadrant) InFOV(dir r3.Vec) bool {
	return q.Response(dir) > 0
}

// SeesSun implements Sensor: the nominal unit (spec geometry, no drawn
// errors) reads the sun at SolarConstant as a valid direction, with a cell
// sum of at least MinSeenSignal.
func (q *Quadrant) SeesSun(dir r3.Vec) bool {
	n := Quadrant{spec: q.spec, actual: q.spec.Mount, offX: q.spec.OffsetX, offY: q.spec.OffsetY}
	n.spec.Errors = Errors{}
	r := n.Read(dir, SolarConstant, Albedo{}, nil)
	return r.Valid && r.Signal >= MinSeenSignal
}

// Response implements Sensor: cos θ times the lit cell area over the spot
// area w².
func (q *Quadrant) Response(dir r3.Vec) float64 {
	d := q.spec.Mount.ToSensor(dir)
	if d.Z <= 0 {
		return 0
	}
	a := q.cellAreas(d, 0, 0)
	w := q.spec.ApertureSide
	return d.Z * (a[0] + a[1] + a[2] + a[3]) / (w * w)
}

// HalfAngle implements Sensor: the cone through the corners of the square
// FOV, tan = √2·(w/2 + c + g/2)/h.
func (q *Quadrant) HalfAngle() float64 {
	s := q.spec
	return math.Atan(math.Sqrt2 * (s.ApertureSide/2 + s.CellSide + s.Gap/2) / s.Height)
}

// Read implements Sensor. Each cell gets S·cos θ☉ times its lit fraction of
// the spot; albedo is treated as a point source in its mean direction whose
// response-weighted irradiance is split over the cells in the proportions of
// that direction's spot (evenly when that spot misses the cells).
func (q *Quadrant) Read(sun r3.Vec, direct float64, alb Albedo, noise *rand.Rand) Reading {
	var cells [4]float64
	w2 := q.spec.ApertureSide * q.spec.ApertureSide
	if d := q.actual.ToSensor(sun); d.Z > 0 && direct > 0 {
		a := q.cellAreas(d, q.offX, q.offY)
		for i := range cells {
			cells[i] = direct * d.Z * a[i] / w2
		}
	}
	if alb.Irradiance > 0 {
		f := [4]float64{0.25, 0.25, 0.25, 0.25}
		if d := q.actual.ToSensor(alb.Dir); d.Z > 0 {
			a := q.cellAreas(d, q.offX, q.offY)
			if s := a[0] + a[1] + a[2] + a[3]; s > 0 {
				for i := range f {
					f[i] = a[i] / s
				}
			}
		}
		for i := range cells {
			cells[i] += alb.Irradiance * f[i]
		}
	}
	var out Reading
	var sum float64
	for i := range cells {
		v := (1+q.unit.gain[i])*cells[i]/q.spec.RefIrradiance + q.unit.dark[i]
		v, sat := q.spec.Errors.convert(v, noise)
		out.Cells[i] = v
		out.Saturated = out.Saturated || sat
		sum += v
	}
	out.Signal = sum
	if sum <= 0 || sum < q.spec.Threshold {
		return out
	}
	A, B, C, D := out.Cells[0], out.Cells[1], out.Cells[2], out.Cells[3]
	x := ((A + D) - (B + C)) / sum
	y := ((C + D) - (A + B)) / sum
	const edge = 1 - 1e-9
	if math.Abs(x) >= edge || math.Abs(y) >= edge {
		out.Saturated = true
		return out
	}
	h := q.spec.Height
	tx, ty := -q.invert(x)/h, -q.invert(y)/h
	out.Dir = q.spec.Mount.ToBody(vecmath.Unit(r3.Vec{X: tx, Y: ty, Z: 1}))
	out.Valid = true
	return out
}

// Draw implements Sensor.
func (q *Quadrant) Draw(rng *rand.Rand) Sensor {
	u := *q
	u.actual, u.unit = drawUnit(q.spec.Errors, q.spec.Mount, 4, rng)
	u.offX = q.spec.OffsetX + q.spec.OffsetSigma*rng.NormFloat64()
	u.offY = q.spec.OffsetY + q.spec.OffsetSigma*rng.NormFloat64()
	return &u
}

// The registry entry of the quadrant kind.
func init() {
	Register(KindInfo{
		Kind: KindQuadrant, Doc: "four-quadrant cells under a square aperture: a two-axis direction from the cell imbalance",
		Source:       "closed-form spot geometry X = 2h·tan α/w; Wertz (ed.), Spacecraft Attitude Determination and Control, Reidel 1978, ch. 6 (from memory)",
		HalfAngleDeg: 60, TwoAxis: true,
		Params: []Param{
			{Key: "shade_height_mm", Doc: "height of the aperture above the cells", Default: 1.0, Min: 0, Max: 100, MinOpen: true, Allowed: "(0, 100] mm"},
			{Key: "cell_size_mm", Doc: "side of the square of four cells", Default: 2.0, Min: 0, Max: 100, MinOpen: true, Allowed: "(0, 100] mm"},
			{Key: "gap_mm", Doc: "gap between the cells", Default: 0.1, Min: 0, MaxKey: "cell_size_mm", Allowed: "[0, cell_size_mm] mm"},
		},
		Sources: []ErrorSource{{Name: SourceDarkOffset}, {Name: SourceGain}, {Name: SourceNoise},
			{Name: SourceQuantisation}, {Name: SourceMisalignment}, {Name: SourceApertureOffset}},
		Build: buildQuadrant,
	})
}

// quadrantSigma is the 1σ accuracy used to weight a quadrant sensor's
// direction: 1°, a typical figure for a home-built shaded quad cell (common
// practice, no source).
const quadrantSigma = math.Pi / 180

func buildQuadrant(c Common, p Params) (Sensor, error) {
	// The aperture is one cell wide, so the spot just fills a cell at
	// normal incidence (the usual proportion; common practice, no source).
	cell := p.Num["cell_size_mm"]
	return NewQuadrant(QuadrantSpec{Name: c.Name, Mount: c.Mount, ApertureSide: cell, Height: p.Num["shade_height_mm"],
		CellSide: cell, Gap: p.Num["gap_mm"], Threshold: c.Threshold, Sigma: quadrantSigma,
		OffsetSigma: c.OffsetSigma, Errors: c.Errors})
}
