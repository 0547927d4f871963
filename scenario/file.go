package scenario

import "reflect"

// The file* types mirror the YAML keys one to one. Load decodes into them,
// fills the defaults in place (so that Record can print every default), checks
// them and converts them into the exported types of scenario.go.

type fileScenario struct {
	Name       string          `yaml:"name"`
	Epoch      string          `yaml:"epoch"`
	Duration   Span            `yaml:"duration"`
	Step       Span            `yaml:"step"`
	Seed       *int64          `yaml:"seed,omitempty"`
	Orbit      fileOrbit       `yaml:"orbit"`
	SunModel   string          `yaml:"sun_model"`
	Shadow     string          `yaml:"shadow"`
	Attitude   fileAttitude    `yaml:"attitude,omitempty"`
	Modes      []fileMode      `yaml:"modes,omitempty"`
	Timeline   *fileTimeline   `yaml:"timeline,omitempty"`
	Body       fileBody        `yaml:"body"`
	Estimators []string        `yaml:"estimators"`
	Albedo     fileAlbedo      `yaml:"albedo"`
	Validity   fileValidity    `yaml:"validity"`
	GyroFilter *fileGyroFilter `yaml:"gyro_filter,omitempty"`
	Targets    *fileTargets    `yaml:"targets,omitempty"`
	MonteCarlo fileMonteCarlo  `yaml:"monte_carlo"`
	Budget     *fileBudget     `yaml:"budget,omitempty"`
	Output     fileOutput      `yaml:"output"`
}

type fileOrbit struct {
	AltitudeKm      *float64   `yaml:"altitude_km,omitempty"`
	LTAN            string     `yaml:"ltan,omitempty"`
	LTANSolarTime   string     `yaml:"ltan_solar_time,omitempty"`
	SemiMajorAxisKm *float64   `yaml:"semi_major_axis_km,omitempty"`
	Eccentricity    *float64   `yaml:"eccentricity,omitempty"`
	InclinationDeg  *float64   `yaml:"inclination_deg,omitempty"`
	RAANDeg         *float64   `yaml:"raan_deg,omitempty"`
	ArgPerigeeDeg   *float64   `yaml:"arg_perigee_deg,omitempty"`
	MeanAnomalyDeg  *float64   `yaml:"mean_anomaly_deg,omitempty"`
	TLE             []string   `yaml:"tle,omitempty"`
	State           *fileState `yaml:"state,omitempty"`
	ElementSet      string     `yaml:"element_set,omitempty"`
	EphemerisFile   string     `yaml:"ephemeris_file,omitempty"`
	Propagator      string     `yaml:"propagator"`
}

// fileState is an osculating EME2000 state at the epoch.
type fileState struct {
	PositionKm  []float64 `yaml:"position_km"`
	VelocityKmS []float64 `yaml:"velocity_km_s"`
}

type fileLaw struct {
	Law            string    `yaml:"law,omitempty"`
	PointAxis      string    `yaml:"point_axis,omitempty"`
	AlignAxis      string    `yaml:"align_axis,omitempty"`
	AlignTo        string    `yaml:"align_to,omitempty"`
	AlignInertial  []float64 `yaml:"align_inertial,omitempty"`
	RollOffsetDeg  *float64  `yaml:"roll_offset_deg,omitempty"`
	PitchOffsetDeg *float64  `yaml:"pitch_offset_deg,omitempty"`
	YawOffsetDeg   *float64  `yaml:"yaw_offset_deg,omitempty"`
	ClockDeg       *float64  `yaml:"clock_deg,omitempty"`
	Quaternion     []float64 `yaml:"quaternion,omitempty"`
	EulerDeg       []float64 `yaml:"euler_deg,omitempty"`
	EulerSequence  string    `yaml:"euler_sequence,omitempty"`
	SpinAxis       string    `yaml:"spin_axis,omitempty"`
	RateDegS       *float64  `yaml:"rate_deg_s,omitempty"`
	MaxRateDegS    *float64  `yaml:"max_rate_deg_s,omitempty"`
	MinRateDegS    *float64  `yaml:"min_rate_deg_s,omitempty"`
	InertiaKgM2    []float64 `yaml:"inertia_kg_m2,omitempty"`
	File           string    `yaml:"file,omitempty"`
	TimeConstant   *Span     `yaml:"time_constant,omitempty"`
}

type fileAttitude struct {
	fileLaw    `yaml:",inline"`
	InSunlight *fileLaw `yaml:"in_sunlight,omitempty"`
	InEclipse  *fileLaw `yaml:"in_eclipse,omitempty"`
}

// IsZero reports an attitude with no key given (a timeline scenario's), so
// the record leaves the attitude out (the YAML encoder's omitempty).
func (a fileAttitude) IsZero() bool { return reflect.ValueOf(a).IsZero() }

type fileMode struct {
	Name         string `yaml:"name"`
	fileAttitude `yaml:",inline"`
}

// fileTimeline is a mission timeline: phases flown in turn.
type fileTimeline struct {
	SlewRateDegS   *float64    `yaml:"slew_rate_deg_s,omitempty"`
	SlewAccelDegS2 *float64    `yaml:"slew_accel_deg_s2,omitempty"`
	Phases         []filePhase `yaml:"phases"`
}

type filePhase struct {
	Name          string     `yaml:"name"`
	Attitude      fileLaw    `yaml:"attitude"`
	Slew          bool       `yaml:"slew"`
	DuringEclipse string     `yaml:"during_eclipse"`
	Until         *fileUntil `yaml:"until,omitempty"`
}

// fileUntil is a phase's end condition: exactly one of its keys
// (sun_seen_sensors goes with sun_seen_for).
type fileUntil struct {
	Elapsed        *Span    `yaml:"elapsed,omitempty"`
	RateBelowDegS  *float64 `yaml:"rate_below_deg_s,omitempty"`
	SunSeenFor     *Span    `yaml:"sun_seen_for,omitempty"`
	SunSeenSensors *int     `yaml:"sun_seen_sensors,omitempty"`
	Eclipse        string   `yaml:"eclipse,omitempty"`
}

type fileErrors struct {
	DarkOffset1Sigma       float64 `yaml:"dark_offset_1sigma"`
	Gain1Sigma             float64 `yaml:"gain_1sigma"`
	Noise1Sigma            float64 `yaml:"noise_1sigma"`
	MisalignmentDeg1Sigma  float64 `yaml:"misalignment_deg_1sigma"`
	ApertureOffsetMM1Sigma float64 `yaml:"aperture_offset_mm_1sigma"`
}

// fileSensor is one sensor entry: the keys every kind has, the kind's own
// keys (declared by its registry entry in illum/sensor, decoded by
// UnmarshalYAML) and the errors block. The record prints them in that order.
type fileSensor struct {
	sensorKeys
	Params map[string]any // kind key → float64, string or [][]float64
	Errors *fileErrors
}

type sensorKeys struct {
	Name         string    `yaml:"name"`
	Kind         string    `yaml:"kind"`
	Face         string    `yaml:"face,omitempty"`
	TiltDeg      *float64  `yaml:"tilt_deg,omitempty"`
	TiltToward   string    `yaml:"tilt_toward,omitempty"`
	ClockDeg     *float64  `yaml:"clock_deg,omitempty"`
	Boresight    []float64 `yaml:"boresight,omitempty"`
	PositionM    []float64 `yaml:"position_m"`
	HalfAngleDeg *float64  `yaml:"half_angle_deg,omitempty"`
	Threshold    *float64  `yaml:"threshold,omitempty"`
	FullScale    *float64  `yaml:"full_scale,omitempty"`
	ADCBits      *int      `yaml:"adc_bits,omitempty"`
}

type fileObstruction struct {
	Name         string    `yaml:"name"`
	Shape        string    `yaml:"shape"`
	CentreM      []float64 `yaml:"centre_m,omitempty"`
	HalfExtentsM []float64 `yaml:"half_extents_m,omitempty"`
	FromM        []float64 `yaml:"from_m,omitempty"`
	ToM          []float64 `yaml:"to_m,omitempty"`
	RadiusM      *float64  `yaml:"radius_m,omitempty"`
}

type fileLayout struct {
	Name    string       `yaml:"name"`
	Sensors []fileSensor `yaml:"sensors"`
}

type fileBody struct {
	FormFactor   string            `yaml:"form_factor,omitempty"`
	SizeM        []float64         `yaml:"size_m,omitempty"`
	Sensors      []fileSensor      `yaml:"sensors"`
	Obstructions []fileObstruction `yaml:"obstructions,omitempty"`
	Layouts      []fileLayout      `yaml:"layouts,omitempty"`
	Candidates   []fileSensor      `yaml:"candidates,omitempty"`
	Panels       []filePanel       `yaml:"panels,omitempty"`
}

type fileAlbedo struct {
	fileAlbedoModel `yaml:",inline"`
	// Onboard is the flight software's albedo model, whose prediction is
	// subtracted from the cosine readings before a third, corrected run of
	// the estimators (absent: no on-board correction).
	Onboard *fileAlbedoModel `yaml:"onboard,omitempty"`
	// OnPanels adds the albedo on each solar panel to its power.
	OnPanels bool `yaml:"on_panels,omitempty"`
}

type fileAlbedoModel struct {
	Model    string   `yaml:"model"`
	Value    *float64 `yaml:"value,omitempty"`
	GridFile string   `yaml:"grid_file,omitempty"`
	Cells    int      `yaml:"cells"`
}

type fileTargets struct {
	MinValidFraction *float64 `yaml:"min_valid_fraction,omitempty"`
	MaxErrorP95Deg   *float64 `yaml:"max_error_p95_deg,omitempty"`
	// MaxErrorP95UnitsDeg bounds the p95 error reached by 95 % of the
	// Monte Carlo units (needs monte_carlo.units ≥ 2).
	MaxErrorP95UnitsDeg *float64     `yaml:"max_error_p95_units_deg,omitempty"`
	CoverageSensors     *int         `yaml:"coverage_sensors,omitempty"`
	MinCoverage         *float64     `yaml:"min_coverage,omitempty"`
	MaxGap              *Span        `yaml:"max_gap,omitempty"`
	SurviveOneFailure   bool         `yaml:"survive_one_failure"`
	NMinus1             *fileNMinus1 `yaml:"n_minus_1,omitempty"`
	MinOrbitAvgPowerW   *float64     `yaml:"min_orbit_average_power_w,omitempty"`
	// Judge names the estimate the sun-vector targets judge: uncorrected
	// (default) or onboard-corrected (needs albedo.onboard).
	Judge string `yaml:"judge,omitempty"`
}

// fileNMinus1 asks for the single-failure study (each sensor failed in
// turn, simulated over time) and states its targets, judged on the worst
// single failure; an empty block runs the study without targets.
type fileNMinus1 struct {
	MinValidFraction *float64 `yaml:"min_valid_fraction,omitempty"`
	MaxErrorP95Deg   *float64 `yaml:"max_error_p95_deg,omitempty"`
	MaxGap           *Span    `yaml:"max_gap,omitempty"`
	AlsoPairs        bool     `yaml:"also_pairs"`
}

type fileValidity struct {
	FalseSunBoundDeg *float64            `yaml:"false_sun_bound_deg,omitempty"`
	Gates            map[string]fileGate `yaml:"gates,omitempty"`
}

type fileGate struct {
	MinSensors     *int     `yaml:"min_sensors,omitempty"`
	MinTotalSignal *float64 `yaml:"min_total_signal,omitempty"`
	MaxResidual    *float64 `yaml:"max_residual,omitempty"`
}

type fileMonteCarlo struct {
	Units int `yaml:"units"`
}

type fileBudget struct {
	Calibrated   fileCalibrated `yaml:"calibrated"`
	ToleranceDeg float64        `yaml:"tolerance_deg"`
}

// fileCalibrated holds the residual errors after calibration: the keys at
// its top apply to every sensor kind, a kind's own block overrides them for
// that kind.
type fileCalibrated struct {
	fileErrors `yaml:",inline"`
	Cosine     *fileErrors `yaml:"cosine,omitempty"`
	Quadrant   *fileErrors `yaml:"quadrant,omitempty"`
	Digital    *fileErrors `yaml:"digital,omitempty"`
}

type fileOutput struct {
	Decimate int      `yaml:"decimate"`
	Figures  []string `yaml:"figures"`
}
