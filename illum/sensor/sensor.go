package sensor

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/spatial/r3"
)

// SolarConstant is the reference irradiance that gives a normalised signal
// of 1 at normal incidence when a sensor's RefIrradiance is left at zero:
// 1361 W/m² (TSI at 1 AU, Kopp & Lean 2011, GRL 38 L01706, from memory).
const SolarConstant = 1361.0

// MinSeenSignal is the smallest normalised signal from direct sun that
// counts as seeing it, whatever the threshold: a millionth of full sun, the
// reading of a cosine sensor 0.00006° from edge-on, which no detector
// resolves (common practice, no source). It keeps a threshold of 0 from
// counting a reading of rounding noise.
const MinSeenSignal = 1e-6

// Kind names a sensor kind.
type Kind string

// The sensor kinds.
const (
	KindCosine   Kind = "cosine"
	KindQuadrant Kind = "quadrant"
	KindDigital  Kind = "digital"
	// KindQuadrantWall is a four-quadrant sensor under a cross-shaped
	// shade wall (Quadrant with GeometryWall).
	KindQuadrantWall Kind = "quadrant-wall"
)

// Albedo is the Earth-reflected light reaching one sensor, as the albedo
// model delivers it: the response-weighted irradiance ∫L·R(θ)dω over the
// field of view (W/m², R from the sensor's Response) and the
// irradiance-weighted mean arrival direction (unit vector, body axes, pointing
// from the sensor toward the lit Earth). A zero Albedo means none.
//
// Cells, for a quadrant sensor, holds the albedo integrated through each
// cell's own response (W/m² in the units of direct irradiance: the direct
// sun S from direction d gives cell i S·CellResponse(d)[i]); zero when the
// albedo model did not integrate the cells, and the quadrant then splits
// Irradiance in the proportions of the mean direction's lit areas.
type Albedo struct {
	Irradiance float64
	Dir        r3.Vec
	Cells      [4]float64
}

// AlbedoSubtracter is a sensor kind whose flight software can subtract a
// predicted albedo from its reading before the estimators see it (the
// cosine kind: one signal, linear in the irradiance). SubtractAlbedo
// allocates nothing.
type AlbedoSubtracter interface {
	SubtractAlbedo(r Reading, predicted Albedo) Reading
}

// Reading is one sensor's output at one instant.
type Reading struct {
	// Signal is the normalised output: for a cosine sensor the quantised
	// signal (1 = normal sun at RefIrradiance, times gain); for a quadrant
	// sensor the sum of its four cells; for a digital sensor the
	// irradiance reaching the detector over its detection threshold (0 when
	// no spot).
	Signal float64
	// Dir is the measured sun direction in body axes for a two-axis kind,
	// rotated through the nominal mount (zero for a cosine sensor or when
	// not Valid).
	Dir r3.Vec
	// Cells holds the four quadrant cells A, B, C, D (zero for other kinds).
	Cells [4]float64
	// Valid says the sensor reports a sun: signal above its threshold and,
	// for two-axis kinds, a direction that could be inverted.
	Valid bool
	// Saturated says an output (a cell for a quadrant) hit full scale.
	Saturated bool
	// Sigma, when > 0, is this reading's own 1σ per axis (rad), worse than
	// the sensor's stated Sigma: a quadrant axis in its dead zone reports
	// "straight above" with the dead zone's spread, tan⁻¹(tan δ/√3). The
	// weighted estimators use it in place of the sensor's.
	Sigma float64
}

// Sensor is one sun sensor of any kind. Every vector is in body axes.
type Sensor interface {
	// Name is the sensor's label in tables and plots.
	Name() string
	// Kind names the sensor kind.
	Kind() Kind
	// Mount returns the nominal mount (what the estimator believes).
	Mount() Mount
	// InFOV reports whether light from the body direction dir reaches the
	// detector, through the nominal mount.
	InFOV(dir r3.Vec) bool
	// HalfAngle is the half-angle (rad) of the cone containing the field of
	// view: the cone itself, or the circumscribed cone of a square FOV.
	HalfAngle() float64
	// SeesSun reports whether the nominal unit (no error model, no noise,
	// no albedo) gives a valid reading from the sun alone in the body
	// direction dir at the irradiance SolarConstant: its modelled signal is
	// at or above its threshold, and never below MinSeenSignal. Coverage
	// counts a sensor as seeing the sun exactly there, so an edge-on sun
	// (a reading of cos 90° ≈ 1e-17) is decided by the signal, not by an
	// angle comparison that rounding can flip.
	SeesSun(dir r3.Vec) bool
	// Response is the relative response (1 at normal incidence) to a
	// collimated beam from the body direction dir, zero outside the FOV. The
	// albedo model integrates radiance with it.
	Response(dir r3.Vec) float64
	// Sigma is the stated 1σ angular accuracy (rad) of a direction from this
	// sensor, used to weight the combined estimate (0 for a cosine sensor:
	// it gives no direction alone).
	Sigma() float64
	// Read computes the reading for the unit sun direction sun (body axes),
	// the direct solar irradiance direct (W/m², already scaled by the
	// shadow fraction) and the albedo on this sensor. noise draws the
	// per-reading noise; nil gives noise-free readings. It allocates nothing.
	Read(sun r3.Vec, direct float64, alb Albedo, noise *rand.Rand) Reading
	// Draw returns one simulated unit with its errors drawn from rng
	// (misalignment, dark offsets, gain mismatch). The receiver is unchanged.
	Draw(rng *rand.Rand) Sensor
}

// Errors are the error-model parameters of a sensor; all zero gives ideal
// readings. Offsets and noise are in normalised signal units.
type Errors struct {
	// MisalignSigma is the 1σ mounting error per sensor axis (rad).
	MisalignSigma float64
	// DarkSigma is the 1σ dark offset drawn per cell per unit.
	DarkSigma float64
	// GainSigma is the 1σ relative gain mismatch drawn per cell per unit.
	GainSigma float64
	// NoiseSigma is the 1σ noise per reading (per cell for a quadrant).
	NoiseSigma float64
	// ADCBits quantises the output over [0, FullScale]; 0 means no ADC.
	ADCBits int
	// FullScale is the saturation level (normalised); 0 means none.
	FullScale float64
	// Thermal is the temperature model (zero: none; the kind's temperature
	// keys, not the errors block).
	Thermal Thermal
}

func (e Errors) validate(name string) error {
	for _, f := range []struct {
		key string
		v   float64
	}{{"misalign_sigma", e.MisalignSigma}, {"dark_sigma", e.DarkSigma}, {"gain_sigma", e.GainSigma},
		{"noise_sigma", e.NoiseSigma}, {"full_scale", e.FullScale}} {
		if !(f.v >= 0) || math.IsInf(f.v, 0) {
			return fmt.Errorf("sensor: %q: errors.%s = %g: want a finite value ≥ 0", name, f.key, f.v)
		}
	}
	if err := e.Thermal.validate(name); err != nil {
		return err
	}
	if e.ADCBits < 0 || e.ADCBits > 32 {
		return fmt.Errorf("sensor: %q: errors.adc_bits = %d: want 0 (no ADC) to 32", name, e.ADCBits)
	}
	if e.ADCBits > 0 && e.FullScale == 0 {
		return fmt.Errorf("sensor: %q: errors.adc_bits = %d needs errors.full_scale > 0", name, e.ADCBits)
	}
	return nil
}

// unitErrors are the values drawn once per simulated unit.
type unitErrors struct {
	dark [4]float64
	gain [4]float64 // relative mismatch: the gain is 1 + gain[i]
}

// drawUnit draws the misalignment and per-cell offsets and gains, always in
// the same order so that one seed gives one unit.
func drawUnit(e Errors, m Mount, cells int, rng *rand.Rand) (Mount, unitErrors) {
	var u unitErrors
	phi := r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()}
	for i := range cells {
		u.dark[i] = e.DarkSigma * rng.NormFloat64()
		u.gain[i] = e.GainSigma * rng.NormFloat64()
	}
	return m.Misaligned(r3.Scale(e.MisalignSigma, phi)), u
}

// convert applies noise, the ADC and saturation to an analogue signal.
func (e Errors) convert(v float64, noise *rand.Rand) (out float64, saturated bool) {
	if noise != nil && e.NoiseSigma > 0 {
		v += e.NoiseSigma * noise.NormFloat64()
	}
	return e.digitise(v)
}

// digitise clips a noisy signal to [0, full scale] and quantises it.
func (e Errors) digitise(v float64) (out float64, saturated bool) {
	if v < 0 {
		v = 0
	}
	if e.FullScale > 0 && v >= e.FullScale {
		v, saturated = e.FullScale, true
	}
	if e.ADCBits > 0 {
		q := e.FullScale / float64(uint64(1)<<e.ADCBits)
		v = roundNonNeg(v/q) * q
	}
	return v, saturated
}

// MountRow is one line of the mount table of the report, as plain data.
type MountRow struct {
	Name      string
	Kind      Kind
	Face      string     // "+X"... or "vector"
	TiltDeg   float64    // tilt from the face normal
	Toward    string     // face the tilt leans to ("" when none)
	Boresight [3]float64 // body axes, unit
	FOVDeg    float64    // half-angle of the (circumscribed) FOV cone
	// Quadrant sensors only (per sensor axis; zero for other kinds): the
	// half-angle up to which a reading can be valid, the half-angle up to
	// which light reaches a cell, and the dead zone round the boresight.
	LinearDeg, DetectionDeg, DeadZoneDeg float64
	// DeadZoneReadDeg: the half-angle up to which readings take the dead
	// zone's rule (the imbalance within dead_zone_imbalance of zero).
	DeadZoneReadDeg float64
}

// Row returns the mount-table row of a sensor.
func Row(s Sensor) MountRow {
	m := s.Mount()
	b := m.Boresight()
	face := m.Face().String()
	if m.Face() == FaceNone {
		face = "vector"
	}
	tilt, toward := m.Tilt()
	row := MountRow{
		Name: s.Name(), Kind: s.Kind(), Face: face,
		TiltDeg: tilt * 180 / math.Pi, Toward: toward.String(),
		Boresight: [3]float64{b.X, b.Y, b.Z}, FOVDeg: s.HalfAngle() * 180 / math.Pi,
	}
	if q, ok := s.(*Quadrant); ok {
		row.LinearDeg = q.ValidHalfAngle() * 180 / math.Pi
		row.DetectionDeg = q.DetectionHalfAngle() * 180 / math.Pi
		row.DeadZoneDeg = q.DeadZoneHalfAngle() * 180 / math.Pi
		row.DeadZoneReadDeg = q.DeadZoneReadHalfAngle() * 180 / math.Pi
	}
	return row
}

// ViewText says in words where a sensor can see the sun: for a quadrant
// sensor the linear range (where a reading can be valid), the detection
// range (where light reaches a cell) and the dead zone, per sensor axis;
// for the other kinds the field-of-view cone.
func ViewText(s Sensor) string {
	r := Row(s)
	if a, ok := s.(*ApertureArray); ok {
		return fmt.Sprintf("valid within ±%.1f° per axis (every spot on the detector), %.4f° 1σ per axis at the boresight from the centroids",
			a.AxisHalfAngle()*180/math.Pi, a.Sigma()*180/math.Pi)
	}
	q, ok := s.(*Quadrant)
	if !ok {
		return fmt.Sprintf("field of view %.1f° half-angle (cone containing it)", r.FOVDeg)
	}
	dz := "no dead zone"
	if r.DeadZoneDeg > 0 {
		dz = fmt.Sprintf("dead zone ±%.1f° (flat to ±%.1f°, imbalance below %.3f to ±%.1f°; reads %s there)",
			r.DeadZoneReadDeg, r.DeadZoneDeg, q.DeadZoneImbalance(), r.DeadZoneReadDeg, q.spec.DeadZone)
	}
	why := "linear range less the imbalance margin"
	if q.ValidHalfAngle() < q.LinearHalfAngle() {
		why = fmt.Sprintf("where the cell sum falls below the threshold %g; the linear range goes to ±%.1f°", q.spec.Threshold, q.LinearHalfAngle()*180/math.Pi)
	}
	return fmt.Sprintf("valid within ±%.1f° per axis (%s), light on the cells to ±%.1f°, %s",
		r.LinearDeg, why, r.DetectionDeg, dz)
}

func checkMount(name string, m Mount) error {
	if !m.defined {
		return fmt.Errorf("sensor: %q: mount: not set; build it with FaceMount or VectorMount", name)
	}
	return nil
}

func checkName(name string) error {
	if name == "" {
		return fmt.Errorf("sensor: name: empty; give every sensor a unique name")
	}
	return nil
}

// roundNonNeg is math.Round for x ≥ 0 (and NaN, +Inf), bit for bit: the
// fraction x − ⌊x⌋ is exact for every non-negative float64 (closed form),
// so rounding half away from zero is ⌊x⌋ + [fraction ≥ ½]. It spares the
// step loop math.Round's bit manipulation, which the ADC of every sensor
// pays at every step (TestRoundNonNegIsRound).
//
// It has no branch: the fraction's halves of the ADC step are as likely as
// each other under noise, and a branch on them is mispredicted half the
// time. up is 1 when the fraction is ≥ ½ (the sign bit of fraction − ½,
// which is exact for a fraction ≥ ¼ by Sterbenz's lemma and negative by at
// least ¼ below), and ⌊x⌋ gets +1 or −0 added: x + (−0) is x for every x,
// −0 included.
func roundNonNeg(x float64) float64 {
	f := math.Floor(x)
	up := 1 - math.Float64bits(x-f-0.5)>>63
	return f + math.Float64frombits(0x3ff0000000000000&-up|1<<63&(up-1))
}

// SunView is a sensor's field of view as a sky viewer (sky.Viewer): Sees(d)
// is the sensor's SeesSun(d). The step loop knows it by its type, so that
// it can ask a cosine sensor's view as one comparison of the cosine
// (Cosine.SeenFromCosine) instead of a call per sensor per step.
type SunView struct{ Sensor Sensor }

// Sees reports whether the sensor sees a sun in body direction d.
func (v SunView) Sees(d r3.Vec) bool { return v.Sensor.SeesSun(d) }
