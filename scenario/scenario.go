package scenario

import (
	"fmt"
	"path/filepath"
	"time"

	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// Scenario is a validated scenario file with every default filled in and every
// value in the units of the code's boundary contract: radians, km, seconds.
type Scenario struct {
	Name     string
	Epoch    time.Time // UTC start of the run
	Duration Span
	Step     Span
	Seed     int64 // every random draw of the run derives from it
	Orbit    Orbit
	SunModel string // "low-precision" or "meeus"
	Shadow   string // "conical" or "cylindrical"
	Attitude Attitude
	Modes    []Mode // further named attitudes a run or layout search may evaluate
	// Timeline, when Set, flies phases in turn; Attitude is then
	// LawTimeline.
	Timeline   Timeline
	Body       Body
	Estimators []string // "least-squares", "opposite-pairs", "two-axis", "combined"
	Albedo     Albedo
	Validity   Validity
	GyroFilter GyroFilter // the gyro-aided sun-direction filter, when Set
	Targets    Targets
	MonteCarlo MonteCarlo
	Budget     Budget
	Output     Output
	Dir        string // folder of the scenario file; relative paths are taken from it

	record []byte
}

// Orbit kinds.
const (
	OrbitCircular  = "circular"        // altitude_km + inclination_deg
	OrbitSunSync   = "sun-synchronous" // altitude_km + ltan
	OrbitKeplerian = "keplerian"       // full mean elements
	OrbitTLE       = "tle"             // mean elements read from a TLE
	OrbitState     = "state"           // osculating position and velocity (EME2000) at the epoch
	OrbitFile      = "ephemeris-file"  // states read from a CCSDS OEM, interpolated
)

// Orbit is the starting orbit. For OrbitSunSync the inclination and RAAN are
// left at zero: the build step derives them from AltitudeKm, LTANHours and the
// epoch with orbit's J2 helpers.
type Orbit struct {
	Kind            string
	Propagator      string  // "two-body", "j2-mean", "j2-numeric" or "sgp4" (the default for a TLE)
	AltitudeKm      float64 // circular and sun-synchronous kinds; else a−Rₑ
	LTANHours       float64 // sun-synchronous kind only, in [0, 24)
	LTANSolarTime   string  // "mean" (default) or "apparent": the solar time LTANHours is read in
	SemiMajorAxisKm float64 // all kinds (Rₑ + altitude for the circular kinds)
	Eccentricity    float64
	InclinationRad  float64
	RAANRad         float64
	ArgPerigeeRad   float64
	MeanAnomalyRad  float64
	TLE             *TLE // the parsed element set for OrbitTLE, else nil
	// Osculating is set when the elements (OrbitKeplerian) or the state
	// (OrbitState) are osculating values at the epoch rather than mean
	// elements; the build step converts them (first-order J2 averaging) for
	// j2-mean and starts j2-numeric from them as they are.
	Osculating bool
	// StatePositionKm and StateVelocityKmS are the EME2000 state of
	// OrbitState at the epoch.
	StatePositionKm, StateVelocityKmS r3.Vec
	// EphemerisFile is the CCSDS OEM of OrbitFile (resolved path); the
	// propagator is then "ephemeris-file".
	EphemerisFile string
}

// Attitude law names.
const (
	LawNadir     = attitude.NameNadir
	LawSun       = attitude.NameSun
	LawInertial  = attitude.NameInertial
	LawSpin      = attitude.NameSpin
	LawTumble    = attitude.NameTumble
	LawIsotropic = attitude.NameIsotropic
	LawSchedule  = attitude.NameSchedule // InSunlight while lit, InEclipse in shadow
)

// Law is one attitude law with its parameters; only those of its kind are set.
type Law struct {
	Name string // one of the Law* constants
	// File is the attitude history of a replay law (AEM or CSV), resolved
	// against the scenario file's folder.
	File string
	// PointAxis is the body axis pointed at nadir (nadir) or at the sun (sun);
	// AlignAxis is the body axis brought closest to the velocity (nadir) or to
	// the orbit normal (sun).
	PointAxis, AlignAxis r3.Vec
	// AlignTo is what a sun law brings AlignAxis closest to: the orbit
	// normal (default), nadir, or the fixed inertial direction AlignInertial
	// (unit, EME2000).
	AlignTo       string
	AlignInertial r3.Vec
	// RollRad, PitchRad, YawRad offset the nadir attitude from LVLH (3-2-1).
	RollRad, PitchRad, YawRad float64
	// ClockRad turns the sun-pointing attitude about the sun line.
	ClockRad float64
	// Orientation is the body ← ECI attitude of an inertial law, or the
	// starting attitude of a spin law, when given as a quaternion (scalar
	// first, unit norm). When EulerSequence is set, EulerRad holds the angles
	// instead and the build step turns them into a rotation.
	Orientation   quat.Number
	EulerRad      [3]float64
	EulerSequence string // e.g. "321"; empty when a quaternion was given
	SpinAxis      r3.Vec // spin law: body axis of rotation
	RateRadS      float64
	// MinRateRadS and MaxRateRadS bound the tumble law's initial body rate:
	// its magnitude is drawn uniformly on [min, max], its axis uniformly on
	// the sphere (body axes), per Monte Carlo unit.
	MinRateRadS, MaxRateRadS float64
	// Inertia, when HasInertia, is the body's inertia tensor (body axes,
	// kg·m², row-major, symmetric): the tumble then follows Euler's
	// equations (torque-free motion); without it the tumble is a fixed-axis
	// spin at the drawn rate.
	Inertia    [3][3]float64
	HasInertia bool
	// TimeConstantS is the detumble law's rate decay time constant.
	TimeConstantS float64
}

// Sun-law alignment references.
const (
	AlignOrbitNormal = "orbit-normal"
	AlignNadir       = "nadir"
	AlignInertial    = "inertial"
	// AlignVelocity and AlignSun are the nadir law's references: the
	// velocity (LVLH) or the sun (yaw steering).
	AlignVelocity = "velocity"
	AlignSun      = "sun"
)

// Attitude is the pointing of a run: a Law, or a schedule of two laws.
type Attitude struct {
	Law
	InSunlight, InEclipse *Law // set only when Law.Name is LawSchedule
}

// Mode is a named attitude.
type Mode struct {
	Name     string
	Attitude Attitude
}

// Sensor is one sun sensor: its mount in body axes, its field of view, its
// kind's parameters and its error model (one-sigma values).
type Sensor struct {
	Name      string
	Kind      string
	Face      string // "+X" …, empty when the mount was a boresight vector
	Boresight r3.Vec // unit vector, body axes
	RefAxis   r3.Vec // unit vector ⟂ Boresight: the sensor's own x axis after tilt and clock
	// PositionM is where the sensor sits (body axes, m): given, or the
	// centre of its face on the bus outline. MountNormal is the outward
	// normal of the surface it sits on: it sees nothing at or behind that
	// plane.
	PositionM   r3.Vec
	MountNormal r3.Vec
	TiltRad     float64
	ClockRad    float64

	HalfAngleRad float64 // field of view half angle, in (0, π/2]
	Threshold    float64 // fraction of the full-sun normal response below which the reading is "no sun"
	FullScale    float64 // reading at full sun along the boresight
	ADCBits      int

	// Params are the kind's own keys in model units (rad, mm), as its entry
	// in the sensor-kind registry (illum/sensor) declares them.
	Params sensor.Params

	Errors SensorErrors
}

// SensorErrors are the one-sigma values of the error model.
type SensorErrors struct {
	DarkOffset1Sigma       float64 // fraction of full scale
	Gain1Sigma             float64 // fraction
	Noise1Sigma            float64 // fraction of full scale, per sample
	MisalignmentRad1Sigma  float64
	ApertureOffsetMM1Sigma float64
}

// Obstruction shapes.
const (
	ShapeRectangle = "rectangle"
	ShapeCylinder  = "cylinder"
)

// Obstruction is a body part that can shade a sensor. A rectangle is an
// axis-aligned box (one half extent may be zero for a flat panel); a cylinder
// runs from FromM to ToM with RadiusM.
type Obstruction struct {
	Name         string
	Shape        string
	CentreM      r3.Vec
	HalfExtentsM r3.Vec
	FromM, ToM   r3.Vec
	RadiusM      float64
}

// Layout is a named alternative sensor list.
type Layout struct {
	Name    string
	Sensors []Sensor
}

// Body holds the bus outline, the sensors flown, obstructions, alternative
// layouts and the candidate mounts a layout search may choose from.
type Body struct {
	// FormFactor is the CubeSat size named in the file ("" when none);
	// SizeM the outline's full extents along body X, Y, Z (m), a solid box
	// centred on the body origin that hides what lies behind it from every
	// sensor; zero when the file gives neither form_factor nor size_m.
	FormFactor   string
	SizeM        r3.Vec
	Sensors      []Sensor
	Obstructions []Obstruction
	Layouts      []Layout
	Candidates   []Sensor
	// Panels are the solar panels whose power the run follows (none: no
	// power figures).
	Panels []Panel
}

// Albedo models.
const (
	AlbedoNone    = albedo.NameNone
	AlbedoUniform = albedo.NameUniform
	AlbedoZonal   = albedo.NameZonal
	AlbedoGrid    = albedo.NameGrid
)

// Albedo selects the Earth-reflection model.
type Albedo struct {
	Model    string
	Value    float64 // uniform reflectance (also the zonal model's global mean)
	GridFile string  // absolute path (resolved against Dir), grid model only
	Cells    int     // number of equal-area cells of the visible cap
	// Onboard is the flight software's albedo model (albedo.onboard): its
	// prediction is subtracted from the cosine readings before the
	// estimators run a third time; nil without one.
	Onboard *Albedo
	// OnPanels adds the Earth albedo on each panel's front hemisphere to the
	// solar-array power (albedo.on_panels; the truth model only).
	OnPanels bool
}

// Label names the albedo model and its settings in one phrase ("zonal,
// global mean 0.30, 400 cells"), for summaries and reports.
func (a Albedo) Label() string {
	switch a.Model {
	case AlbedoNone:
		return "none"
	case AlbedoUniform:
		return fmt.Sprintf("uniform %.2f, %d cells", a.Value, a.Cells)
	case AlbedoZonal:
		return fmt.Sprintf("zonal, global mean %.2f, %d cells", a.Value, a.Cells)
	case AlbedoGrid:
		return fmt.Sprintf("grid %s, %d cells", filepath.Base(a.GridFile), a.Cells)
	}
	return a.Model
}

// SameModel reports whether b is the same albedo model as a, with the same
// settings: an on-board correction by the truth's own model is perfect by
// construction, up to the sensors' nonlinearities and gain errors.
func (a Albedo) SameModel(b Albedo) bool {
	return a.Model == b.Model && a.Value == b.Value && a.GridFile == b.GridFile && a.Cells == b.Cells
}

// Targets are the requirements a run is judged against; a zero value means
// "no target".
type Targets struct {
	MinValidFraction float64 // of sunlit time with a valid sun vector, in (0, 1]
	MaxErrorP95Rad   float64 // 95th percentile of the sun-vector error
	// MaxErrorP95UnitsRad bounds the p95 error reached by 95 % of the Monte
	// Carlo units (the 95th percentile over units of each unit's p95; a
	// unit without any valid estimate counts as the worst); needs
	// monte_carlo.units ≥ 2. Zero: no target.
	MaxErrorP95UnitsRad float64
	CoverageSensors     int     // k of "sky seen by at least k sensors"
	MinCoverage         float64 // fraction of the sky seen by at least CoverageSensors sensors
	MaxGap              Span    // longest sunlit interval without a valid sun vector
	SurviveOneFailure   bool    // targets must hold with any one sensor failed
	// NMinus1 is the single-failure study and its targets (targets.n_minus_1).
	NMinus1           NMinus1
	MinOrbitAvgPowerW float64 // orbit-average solar-array power (W), needs body.panels
	// Judge is the estimate the valid-share, p95-error and gap targets
	// (and those of n_minus_1) judge: JudgeUncorrected (the default) or
	// JudgeOnboardCorrected, the estimate from the readings after the
	// on-board albedo correction (needs albedo.onboard).
	Judge string
}

// The estimates targets.judge can name.
const (
	JudgeUncorrected      = "uncorrected"
	JudgeOnboardCorrected = "onboard-corrected"
)

// NMinus1 asks for the run to be simulated again with each sensor failed in
// turn (Set) and states targets judged on the worst single failure: the
// lowest valid share, the largest p95 error and the longest sunlit gap of
// the primary estimator over the failed layouts (zero: no target).
type NMinus1 struct {
	Set              bool
	MinValidFraction float64
	MaxErrorP95Rad   float64
	MaxGap           Span
	// Pairs runs every pair of sensors failed together too (reported, not
	// judged: the targets are single-failure targets).
	Pairs bool
}

// Validity says what counts as a trustworthy estimate: FalseSunBoundDeg is
// the error beyond which a valid estimate (or two-axis reading) in
// sunlight counts as a false sun; Gates holds the validity gate of every
// estimator run, by name.
type Validity struct {
	FalseSunBoundDeg float64
	Gates            map[string]Gate
}

// Gate is an estimator's validity gate: an estimate counts only when it
// uses at least MinSensors sensors whose normalised signals sum to at least
// MinTotalSignal and its fit residual is at most MaxResidual (0: no limit).
type Gate struct {
	MinSensors     int
	MinTotalSignal float64
	MaxResidual    float64
}

// MonteCarlo sets the number of error-model draws.
type MonteCarlo struct{ Units int }

// Budget gives the residual errors after calibration and the pointing-knowledge
// tolerance the budget is compared with; Set is false when the file has none.
type Budget struct {
	Set bool
	// Residuals are the stated residual errors after calibration: "" for
	// every kind, else per sensor kind (overriding "" source by source).
	// CalibratedErrors applies them.
	Residuals    map[string]Residuals
	ToleranceRad float64
}

// Residuals are the residual 1σ errors after calibration that a file
// states; Given says which of the five sources (ErrorSources order) it
// states.
type Residuals struct {
	Errors SensorErrors
	Given  [5]bool
}

// ErrorSources names the five fields of SensorErrors in file-key order.
var ErrorSources = [5]string{"dark_offset_1sigma", "gain_1sigma", "noise_1sigma", "misalignment_deg_1sigma", "aperture_offset_mm_1sigma"}

// CalibratedErrors returns the errors of sensor sc after calibration: for
// each source the residual stated for its kind, else the one stated for
// every kind, else its stated error unchanged (that source is not
// calibrated) — and zero wherever the sensor states no error for that
// source: calibration never adds an error the stated model does not have.
func (b Budget) CalibratedErrors(sc Sensor) SensorErrors {
	out := sc.Errors
	o := (&out).ptrs()
	stated := (&sc.Errors).ptrs()
	for i := range ErrorSources {
		if *stated[i] == 0 {
			continue
		}
		for _, k := range []string{sc.Kind, ""} {
			if r, ok := b.Residuals[k]; ok && r.Given[i] {
				*o[i] = *(&r.Errors).ptrs()[i]
				break
			}
		}
	}
	return out
}

// ptrs returns pointers to the five fields in ErrorSources order.
func (e *SensorErrors) ptrs() [5]*float64 {
	return [5]*float64{&e.DarkOffset1Sigma, &e.Gain1Sigma, &e.Noise1Sigma, &e.MisalignmentRad1Sigma, &e.ApertureOffsetMM1Sigma}
}

// Output sets the time-series decimation (keep every Decimate-th step) and the
// figures to draw.
type Output struct {
	Decimate int
	Figures  []string
}

// Record returns the whole resolved scenario as YAML with every default
// written out, for the run's record; loading it gives the same scenario.
func (s *Scenario) Record() []byte { return append([]byte(nil), s.record...) }
