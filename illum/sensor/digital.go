package sensor

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/numtext"
	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// DigitalSpec describes a digital (aperture over a detector array) sun sensor.
type DigitalSpec struct {
	Name  string
	Mount Mount
	// HalfAngle is the cone half-angle, or with Square the half-angle per
	// sensor axis (rad), in (0, 90°).
	HalfAngle float64
	Square    bool
	// Sigma is the stated 1σ accuracy per axis (rad); the readings get
	// that noise on each axis angle.
	Sigma float64
	// MinIrradiance (W/m² on the detector, S·cos θ) is needed to detect the
	// spot.
	MinIrradiance float64
	// AlbedoThreshold (W/m²): diffuse light below it is ignored; above it
	// the centroid is pulled toward the albedo direction.
	AlbedoThreshold float64
	// MisalignSigma is the 1σ mounting error per axis (rad).
	MisalignSigma float64
	// Blind is the rule by which the Moon or the lit Earth in the field of
	// view invalidates a reading (zero value: never).
	Blind BlindRule
}

// BlindRule says when the Moon or the lit Earth inside a digital sensor's
// field of view (the cone of HalfAngle about the boresight of the unit as
// mounted) invalidates its reading. The reading is dropped, not biased: the
// centroid model has no photometry of a Moon spot or of stray Earth light
// on the detector, and a unit that cannot tell them from the sun is
// assumed to flag the frame (common practice, no source).
type BlindRule struct {
	// Moon on: some of the Moon's disc inside the cone, not hidden by the
	// Earth, with an illuminated fraction above MoonLitAbove ([0, 1)).
	Moon         bool
	MoonLitAbove float64
	// Earth on: the sub-satellite point sunlit and the Earth's disc
	// reaching more than EarthDepthAbove (rad, [0, π)) inside the cone.
	Earth           bool
	EarthDepthAbove float64
}

// Digital is a digital sun sensor.
type Digital struct {
	spec   DigitalSpec
	tanMax float64
	cosMax float64
	actual Mount
}

// NewDigital checks the spec and returns an ideal unit.
func NewDigital(s DigitalSpec) (*Digital, error) {
	if err := checkName(s.Name); err != nil {
		return nil, err
	}
	if err := checkMount(s.Name, s.Mount); err != nil {
		return nil, err
	}
	if !(s.HalfAngle > 0 && s.HalfAngle < math.Pi/2) {
		return nil, fmt.Errorf("sensor: %q: half-angle %s° is out of range; allowed (0°, 90°) for a digital sensor (its detector sits behind the aperture)", s.Name, numtext.Format(s.HalfAngle*180/math.Pi))
	}
	for _, f := range []struct {
		key string
		v   float64
	}{{"sigma", s.Sigma}, {"min_irradiance", s.MinIrradiance}, {"albedo_threshold", s.AlbedoThreshold}, {"misalign_sigma", s.MisalignSigma}} {
		if !(f.v >= 0) || math.IsInf(f.v, 0) {
			return nil, fmt.Errorf("sensor: %q: %s = %g: want a finite value ≥ 0", s.Name, f.key, f.v)
		}
	}
	if s.Sigma == 0 {
		return nil, fmt.Errorf("sensor: %q: sigma = 0: state the 1σ accuracy per axis (rad, > 0)", s.Name)
	}
	if b := s.Blind; b.Moon && !(b.MoonLitAbove >= 0 && b.MoonLitAbove < 1) || b.Earth && !(b.EarthDepthAbove >= 0 && b.EarthDepthAbove < math.Pi) {
		return nil, fmt.Errorf("sensor: %q: blinding thresholds: Moon lit fraction %g want [0, 1), Earth depth %s° want [0°, 180°)", s.Name, b.MoonLitAbove, numtext.Format(b.EarthDepthAbove*180/math.Pi))
	}
	if b := s.Blind; b.Earth && b.EarthDepthAbove >= s.HalfAngle+math.Pi/2-1e-9 {
		return nil, fmt.Errorf("sensor: %q: lit_earth_blind_depth_deg %s° can never act: the Earth's disc reaches at most the half angle plus its angular radius (below 90°) inside the cone, under %.4g° here; give a smaller depth, or 180 to turn the rule off",
			s.Name, numtext.Format(b.EarthDepthAbove*180/math.Pi), (s.HalfAngle+math.Pi/2)*180/math.Pi)
	}
	return &Digital{spec: s, tanMax: math.Tan(s.HalfAngle), cosMax: math.Cos(s.HalfAngle), actual: s.Mount}, nil
}

// Name implements Sensor.
func (d *Digital) Name() string { return d.spec.Name }

// Kind implements Sensor.
func (d *Digital) Kind() Kind { return KindDigital }

// Mount implements Sensor.
func (d *Digital) Mount() Mount { return d.spec.Mount }

// Spec returns the sensor's specification.
func (d *Digital) Spec() DigitalSpec { return d.spec }

// Sigma implements Sensor.
func (d *Digital) Sigma() float64 { return d.spec.Sigma }

// HalfAngle implements Sensor: the cone, or for a square FOV the cone through
// its corners, tan = √2·tan(half-angle).
func (d *Digital) HalfAngle() float64 {
	if d.spec.Square {
		return math.Atan(math.Sqrt2 * d.tanMax)
	}
	return d.spec.HalfAngle
}

func (d *Digital) inFOV(s r3.Vec) bool {
	if s.Z <= 0 {
		return false
	}
	if d.spec.Square {
		return math.Abs(s.X) <= d.tanMax*s.Z && math.Abs(s.Y) <= d.tanMax*s.Z
	}
	return s.Z >= d.cosMax*vecmath.Norm(s)
}

// InFOV implements Sensor.
func (d *Digital) InFOV(dir r3.Vec) bool { return d.inFOV(d.spec.Mount.ToSensor(dir)) }

// SeesSun implements Sensor: the sun is in the nominal field of view and
// its irradiance S·cos θ on the detector reaches MinIrradiance (and
// MinSeenSignal of full sun).
func (d *Digital) SeesSun(dir r3.Vec) bool {
	e := SolarConstant * d.Response(dir)
	return e >= d.spec.MinIrradiance && e >= MinSeenSignal*SolarConstant
}

// Response implements Sensor: cos θ inside the FOV.
func (d *Digital) Response(dir r3.Vec) float64 {
	s := d.spec.Mount.ToSensor(dir)
	if !d.inFOV(s) {
		return 0
	}
	return s.Z / vecmath.Norm(s)
}

// Read implements Sensor. The spot centroid, in tangent-plane coordinates
// (tan αx, tan αy), is the irradiance-weighted mean of the sun (S·cos θ,
// when above MinIrradiance) and of the albedo mean direction (when its
// irradiance reaches AlbedoThreshold and it is in the FOV). Albedo alone
// above the threshold gives a false sun. Noise of Sigma is added to each
// axis angle.
func (d *Digital) Read(sun r3.Vec, direct float64, alb Albedo, noise *rand.Rand) Reading {
	var wSum, tx, ty float64
	if s := d.actual.ToSensor(sun); d.inFOV(s) {
		if e := direct * s.Z / vecmath.Norm(s); e > 0 && e >= d.spec.MinIrradiance {
			wSum, tx, ty = e, e*s.X/s.Z, e*s.Y/s.Z
		}
	}
	if e := alb.Irradiance; e > 0 && e >= d.spec.AlbedoThreshold {
		if a := d.actual.ToSensor(alb.Dir); d.inFOV(a) {
			wSum += e
			tx += e * a.X / a.Z
			ty += e * a.Y / a.Z
		}
	}
	if wSum == 0 {
		return Reading{}
	}
	ax, ay := math.Atan(tx/wSum), math.Atan(ty/wSum)
	if noise != nil {
		ax += d.spec.Sigma * noise.NormFloat64()
		ay += d.spec.Sigma * noise.NormFloat64()
	}
	dir := vecmath.Unit(r3.Vec{X: math.Tan(ax), Y: math.Tan(ay), Z: 1})
	return Reading{Signal: wSum / SolarConstant, Dir: d.spec.Mount.ToBody(dir), Valid: true}
}

// Blinding implements Blindable: the unit has a rule that can act.
func (d *Digital) Blinding() bool { return d.spec.Blind.Moon || d.spec.Blind.Earth }

// Blinded implements Blindable: the rule of Spec().Blind acts on the unit
// as mounted (its drawn misalignment included).
func (d *Digital) Blinded(b Bodies) bool {
	r := d.spec.Blind
	bore := d.actual.Boresight()
	if r.Moon && b.MoonLit > r.MoonLitAbove && b.MoonInCone(NewCone(bore, d.HalfAngle()), r3.Vec{}) {
		return true
	}
	return r.Earth && b.EarthLit && b.EarthDepth(bore, d.HalfAngle()) > r.EarthDepthAbove
}

// Draw implements Sensor.
func (d *Digital) Draw(rng *rand.Rand) Sensor {
	u := *d
	u.actual, _ = drawUnit(Errors{MisalignSigma: d.spec.MisalignSigma}, d.spec.Mount, 0, rng)
	return &u
}

// The registry entry of the digital kind.
func init() {
	Register(KindInfo{
		Kind: KindDigital, Doc: "digital aperture sensor: a two-axis direction at its stated accuracy",
		Source:       "stated-accuracy model (common practice, no source)",
		HalfAngleDeg: 60, TwoAxis: true,
		Params: []Param{
			{Key: "accuracy_deg_1sigma", Doc: "stated accuracy per axis", Default: 0.5, Min: 0, Max: 90, Allowed: "[0, 90] degrees", Scale: math.Pi / 180},
			{Key: "fov_shape", Type: Choice, Doc: "cone, or a square of half side half_angle_deg", Choices: []string{"cone", "square"}},
			{Key: "moon_blind_lit_fraction", Doc: "the Moon inside the field of view invalidates the reading when its illuminated fraction is above this (1: never)",
				Default: 1, Min: 0, Max: 1, Allowed: "[0, 1]; 1 turns the rule off"},
			// 0.3 of full sun: above what a uniform Earth of albedo 0.3
			// gives a nadir-facing detector in low orbit (ρ·(R/r)² ≤ 0.27
			// at 400 km; closed form), so the default ignores albedo there
			// (common practice, no source). State the unit's own level.
			{Key: "albedo_ignore_below", Doc: "diffuse albedo irradiance on the detector, as a fraction of full sun, below which the centroid ignores it; above, it pulls the centroid toward the lit Earth (alone: a false sun)",
				Default: digitalAlbedoRejection, Min: 0, Max: 1, Allowed: "[0, 1] of full sun (1: albedo never counts)"},
			{Key: "lit_earth_blind_depth_deg", Doc: "the lit Earth reaching more than this far inside the field-of-view cone invalidates the reading (180: never)",
				Default: 180, Min: 0, Max: 180, Allowed: "[0, 180] degrees; 180 turns the rule off", Scale: math.Pi / 180},
		},
		Sources: []ErrorSource{{Name: SourceMisalignment}, {Name: SourceDigitalNoise, Param: "accuracy_deg_1sigma"}},
		Build:   buildDigital,
	})
}

// digitalAlbedoRejection is the default of albedo_ignore_below: the
// diffuse irradiance, as a fraction of the solar constant, below which a
// digital sensor ignores albedo (an assumed detector property; common
// practice, no source).
const digitalAlbedoRejection = 0.3

func buildDigital(c Common, p Params) (Sensor, error) {
	return NewDigital(DigitalSpec{Name: c.Name, Mount: c.Mount, HalfAngle: c.HalfAngle, Square: p.Text["fov_shape"] == "square",
		Sigma: p.Num["accuracy_deg_1sigma"], MinIrradiance: c.Threshold * SolarConstant,
		AlbedoThreshold: p.Num["albedo_ignore_below"] * SolarConstant, MisalignSigma: c.Errors.MisalignSigma,
		Blind: BlindRule{Moon: p.Num["moon_blind_lit_fraction"] < 1, MoonLitAbove: p.Num["moon_blind_lit_fraction"],
			Earth: p.Num["lit_earth_blind_depth_deg"] < math.Pi-1e-12, EarthDepthAbove: p.Num["lit_earth_blind_depth_deg"]}})
}
