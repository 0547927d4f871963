package sensor

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"

	"gonum.org/v1/gonum/interp"
	"gonum.org/v1/gonum/spatial/r3"
)

// CosineSpec describes a coarse cosine sun sensor (one photodiode).
type CosineSpec struct {
	Name  string
	Mount Mount
	// HalfAngle is the FOV cone half-angle (rad), in (0, π/2].
	HalfAngle float64
	// RollOffAngle and RollOffRel give an optional measured relative
	// response versus incidence angle (rad, strictly increasing), which
	// multiplies the cosine; linear interpolation, held constant past the
	// ends. Empty means an ideal cosine.
	RollOffAngle, RollOffRel []float64
	// Threshold is the normalised signal below which the sensor counts as
	// dark (not used by least squares).
	Threshold float64
	// RefIrradiance (W/m²) gives a signal of 1 at normal incidence; 0 means
	// SolarConstant.
	RefIrradiance float64
	Errors        Errors
}

// Cosine is a coarse sun sensor: reading = gain·(S·R(θ)·[in FOV] + E_alb)/S_ref
// + dark offset + noise, quantised and clipped.
type Cosine struct {
	spec    CosineSpec
	cosHalf float64
	rolloff *interp.PiecewiseLinear
	lo, hi  float64 // roll-off table range
	actual  Mount   // mount with its drawn misalignment
	unit    unitErrors
}

// NewCosine checks the spec and returns an ideal unit (no drawn errors).
func NewCosine(s CosineSpec) (*Cosine, error) {
	if err := checkName(s.Name); err != nil {
		return nil, err
	}
	if err := checkMount(s.Name, s.Mount); err != nil {
		return nil, err
	}
	if !(s.HalfAngle > 0 && s.HalfAngle <= math.Pi/2) {
		return nil, fmt.Errorf("sensor: %q: half_angle = %g rad: want (0, 90°]", s.Name, s.HalfAngle)
	}
	if !(s.Threshold >= 0) || math.IsInf(s.Threshold, 0) {
		return nil, fmt.Errorf("sensor: %q: threshold = %g: want a finite value ≥ 0", s.Name, s.Threshold)
	}
	if !(s.RefIrradiance >= 0) || math.IsInf(s.RefIrradiance, 0) {
		return nil, fmt.Errorf("sensor: %q: ref_irradiance = %g: want W/m² > 0 (or 0 for the solar constant)", s.Name, s.RefIrradiance)
	}
	if s.RefIrradiance == 0 {
		s.RefIrradiance = SolarConstant
	}
	if err := s.Errors.validate(s.Name); err != nil {
		return nil, err
	}
	c := &Cosine{spec: s, cosHalf: math.Cos(s.HalfAngle), actual: s.Mount}
	if len(s.RollOffAngle) > 0 || len(s.RollOffRel) > 0 {
		if len(s.RollOffAngle) != len(s.RollOffRel) || len(s.RollOffAngle) < 2 {
			return nil, fmt.Errorf("sensor: %q: roll_off: want ≥ 2 (angle, relative response) pairs of equal length, got %d angles and %d values",
				s.Name, len(s.RollOffAngle), len(s.RollOffRel))
		}
		for i, a := range s.RollOffAngle {
			if i > 0 && !(a > s.RollOffAngle[i-1]) {
				return nil, fmt.Errorf("sensor: %q: roll_off angle %d (%g rad): want strictly increasing angles", s.Name, i, a)
			}
			if r := s.RollOffRel[i]; !(r >= 0) || math.IsInf(r, 0) {
				return nil, fmt.Errorf("sensor: %q: roll_off value %d (%g): want a finite relative response ≥ 0", s.Name, i, r)
			}
		}
		c.spec.RollOffAngle = slices.Clone(s.RollOffAngle)
		c.spec.RollOffRel = slices.Clone(s.RollOffRel)
		c.rolloff = new(interp.PiecewiseLinear)
		if err := c.rolloff.Fit(c.spec.RollOffAngle, c.spec.RollOffRel); err != nil {
			return nil, fmt.Errorf("sensor: %q: roll_off: %v", s.Name, err)
		}
		c.lo, c.hi = s.RollOffAngle[0], s.RollOffAngle[len(s.RollOffAngle)-1]
	}
	return c, nil
}

// Name implements Sensor.
func (c *Cosine) Name() string { return c.spec.Name }

// Kind implements Sensor.
func (c *Cosine) Kind() Kind { return KindCosine }

// Mount implements Sensor.
func (c *Cosine) Mount() Mount { return c.spec.Mount }

// Spec returns the sensor's specification.
func (c *Cosine) Spec() CosineSpec { return c.spec }

// HalfAngle implements Sensor.
func (c *Cosine) HalfAngle() float64 { return c.spec.HalfAngle }

// Sigma implements Sensor: a cosine sensor gives no direction alone.
func (c *Cosine) Sigma() float64 { return 0 }

// Threshold returns the dark threshold (normalised signal).
func (c *Cosine) Threshold() float64 { return c.spec.Threshold }

// InFOV implements Sensor (cone about the nominal boresight).
func (c *Cosine) InFOV(dir r3.Vec) bool {
	return c.inCone(r3.Dot(c.spec.Mount.Boresight(), dir))
}

func (c *Cosine) inCone(cosTheta float64) bool {
	return cosTheta > 0 && cosTheta >= c.cosHalf
}

// SeesSun implements Sensor: the nominal signal R(θ)·S/S_ref reaches the
// threshold (and MinSeenSignal).
func (c *Cosine) SeesSun(dir r3.Vec) bool {
	v := c.Response(dir) * SolarConstant / c.spec.RefIrradiance
	return v >= c.spec.Threshold && v >= MinSeenSignal
}

// Response implements Sensor: cos θ times the roll-off, zero outside the FOV.
func (c *Cosine) Response(dir r3.Vec) float64 {
	return c.response(r3.Dot(c.spec.Mount.Boresight(), dir))
}

func (c *Cosine) response(cosTheta float64) float64 {
	if !c.inCone(cosTheta) {
		return 0
	}
	if c.rolloff == nil {
		return cosTheta
	}
	th := math.Acos(min(cosTheta, 1))
	th = min(max(th, c.lo), c.hi)
	return cosTheta * c.rolloff.Predict(th)
}

// Read implements Sensor.
func (c *Cosine) Read(sun r3.Vec, direct float64, alb Albedo, noise *rand.Rand) Reading {
	var r Reading
	c.readInto(&r, sun, direct, alb.Irradiance, noise)
	return r
}

// readInto is Read writing into a caller's reading: the array's loop calls
// it directly, without the interface call and the copy of a whole Reading.
func (c *Cosine) readInto(r *Reading, sun r3.Vec, direct, albIrr float64, noise *rand.Rand) {
	c.readIntoAt(r, sun, direct, albIrr, noise, 1, 0)
}

// readIntoAt is readInto with the temperature's gain factor and added dark
// signal (Thermal.Factors).
func (c *Cosine) readIntoAt(r *Reading, sun r3.Vec, direct, albIrr float64, noise *rand.Rand, gainT, darkT float64) {
	e := direct*c.response(r3.Dot(c.actual.Boresight(), sun)) + albIrr
	v := gainT*(1+c.unit.gain[0])*e/c.spec.RefIrradiance + c.unit.dark[0] + darkT
	v, sat := c.spec.Errors.convert(v, noise)
	*r = Reading{Signal: v, Valid: v > 0 && v >= c.spec.Threshold, Saturated: sat}
}

// ThermalModel implements Warm.
func (c *Cosine) ThermalModel() Thermal { return c.spec.Errors.Thermal }

// ReadAt implements Warm.
func (c *Cosine) ReadAt(sun r3.Vec, direct float64, alb Albedo, noise *rand.Rand, tempC float64) Reading {
	var r Reading
	g, d := c.spec.Errors.Thermal.Factors(tempC)
	c.readIntoAt(&r, sun, direct, alb.Irradiance, noise, g, d)
	return r
}

// ReadPair reads the sensor without and with an albedo irradiance albIrr
// (W/m²) on one noise draw: the readings two Reads would give from the same
// state of the noise stream, which ReadPair leaves where one Read would.
func (c *Cosine) ReadPair(noAlb, withAlb *Reading, sun r3.Vec, direct, albIrr float64, noise *rand.Rand) {
	e := direct * c.response(r3.Dot(c.actual.Boresight(), sun))
	g := 1 + c.unit.gain[0]
	v0 := g*e/c.spec.RefIrradiance + c.unit.dark[0]
	v1 := g*(e+albIrr)/c.spec.RefIrradiance + c.unit.dark[0]
	if er := &c.spec.Errors; noise != nil && er.NoiseSigma > 0 {
		n := er.NoiseSigma * noise.NormFloat64()
		v0, v1 = v0+n, v1+n
	}
	v0, s0 := c.spec.Errors.digitise(v0)
	v1, s1 := c.spec.Errors.digitise(v1)
	*noAlb = Reading{Signal: v0, Valid: v0 > 0 && v0 >= c.spec.Threshold, Saturated: s0}
	*withAlb = Reading{Signal: v1, Valid: v1 > 0 && v1 >= c.spec.Threshold, Saturated: s1}
}

// SubtractAlbedo implements AlbedoSubtracter: the flight software's
// correction of a reading by a predicted albedo irradiance p (W/m²), with the
// nominal gain it knows, s' = s − p/S_ref. The result is clipped at zero, and
// a remainder within the rounding of the subtraction (4 ulp of the reading)
// is zero, so that a perfect prediction leaves no rounding residue that a
// zero threshold would count as a sun. It is valid when the reading was and
// s' still reaches the threshold; a saturated reading stays flagged.
func (c *Cosine) SubtractAlbedo(r Reading, p Albedo) Reading {
	v := r.Signal - p.Irradiance/c.spec.RefIrradiance
	if v <= 4*epsilon*r.Signal {
		v = 0
	}
	return Reading{Signal: v, Valid: r.Valid && v > 0 && v >= c.spec.Threshold, Saturated: r.Saturated}
}

// epsilon is the float64 machine epsilon, 2⁻⁵².
const epsilon = 0x1p-52

// Draw implements Sensor.
func (c *Cosine) Draw(rng *rand.Rand) Sensor {
	u := *c
	u.actual, u.unit = drawUnit(c.spec.Errors, c.spec.Mount, 1, rng)
	return &u
}

// The registry entry of the cosine kind.
func init() {
	Register(KindInfo{
		Kind: KindCosine, Doc: "coarse cosine photodiode: one signal proportional to the cosine of the incidence",
		Source:       "Wertz (ed.), Spacecraft Attitude Determination and Control, Reidel 1978, ch. 6 (cosine detector; from memory)",
		HalfAngleDeg: 90,
		Params: append([]Param{{Key: "roll_off", Type: Table,
			Doc: "measured response relative to the cosine law: [angle_deg, relative_response] rows",
			Columns: [2]Column{{Name: "angle_deg", Min: 0, Max: 90, Increasing: true, Scale: math.Pi / 180},
				{Name: "relative_response", Min: 0, Max: 2}}}}, thermalParams...),
		Sources: []ErrorSource{{Name: SourceDarkOffset}, {Name: SourceGain}, {Name: SourceNoise},
			{Name: SourceQuantisation}, {Name: SourceMisalignment}, {Name: SourceTemperature}},
		Build: buildCosine,
	})
}

func buildCosine(c Common, p Params) (Sensor, error) {
	spec := CosineSpec{Name: c.Name, Mount: c.Mount, HalfAngle: c.HalfAngle, Threshold: c.Threshold, Errors: c.Errors}
	spec.Errors.Thermal = thermalFrom(p)
	for _, rp := range p.Table["roll_off"] {
		spec.RollOffAngle = append(spec.RollOffAngle, rp[0])
		spec.RollOffRel = append(spec.RollOffRel, rp[1])
	}
	return NewCosine(spec)
}

// ResponseTable implements ResponseTabler: cos θ times the roll-off, nil
// for an ideal cosine.
func (c *Cosine) ResponseTable() (incidence, response []float64) {
	if len(c.spec.RollOffAngle) == 0 {
		return nil, nil
	}
	incidence = slices.Clone(c.spec.RollOffAngle)
	response = make([]float64, len(incidence))
	for k, a := range incidence {
		response[k] = c.spec.RollOffRel[k] * math.Cos(a)
	}
	return incidence, response
}

// SeenFromCosine returns the least cosine c of the angle between the nominal
// boresight and a direction d for which SeesSun(d) holds, so that
// SeesSun(d) ⇔ Boresight·d ≥ c, bit for bit (ok); +Inf when no direction
// is seen. ok is false with a roll-off, whose response is not monotonic in
// the cosine. SeesSun is monotonic in the cosine without one: the response
// is the cosine itself inside the cone and 0 outside, and the products and
// quotient of SeesSun round monotonically (IEEE 754), so the set of
// cosines seen is an interval up to +Inf, found by bisection on the
// ordered bit patterns of positive floats (closed form).
func (c *Cosine) SeenFromCosine() (cosMin float64, ok bool) {
	if c.rolloff != nil {
		return 0, false
	}
	seen := func(ct float64) bool {
		v := c.response(ct) * SolarConstant / c.spec.RefIrradiance
		return v >= c.spec.Threshold && v >= MinSeenSignal
	}
	// A dot product of unit vectors rounds to at most 1 + 4ε; 2 bounds it.
	lo, hi := uint64(0), math.Float64bits(2)
	if !seen(2) {
		return math.Inf(1), true
	}
	// Invariant: seen(hi), !seen(lo) (seen(+0) is false: response 0).
	for hi-lo > 1 {
		mid := lo + (hi-lo)/2
		if seen(math.Float64frombits(mid)) {
			hi = mid
		} else {
			lo = mid
		}
	}
	return math.Float64frombits(hi), true
}
