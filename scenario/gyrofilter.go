package scenario

// fileGyroFilter is the gyro_filter block: the gyro-aided sun-direction
// filter run beside the point estimators. Its presence turns it on.
type fileGyroFilter struct {
	AngleRandomWalkDegRtH *float64 `yaml:"angle_random_walk_deg_rt_h,omitempty"`
	BiasInstabilityDegH   *float64 `yaml:"bias_instability_deg_h,omitempty"`
	BiasTimeS             *float64 `yaml:"bias_time_s,omitempty"`
	CosineSigma           *float64 `yaml:"cosine_sigma,omitempty"`
	StartSigmaDeg         *float64 `yaml:"start_sigma_deg,omitempty"`
	ValidSigmaDeg         *float64 `yaml:"valid_sigma_deg,omitempty"`
	GateSigma             *float64 `yaml:"gate_sigma,omitempty"`
	HoldBoundDeg          *float64 `yaml:"hold_bound_deg,omitempty"`
}

// GyroFilter is the gyro-aided filter of a scenario (Set false: none), in
// the code's units. The gyro flown and the gyro the filter assumes share
// the stated errors.
type GyroFilter struct {
	Set bool
	// ARW is the angle random walk (rad/√s); BiasSigma the bias
	// instability as a stationary 1σ (rad/s), BiasTauS its correlation
	// time (s).
	ARW, BiasSigma, BiasTauS float64
	// CosineSigma is the allowance (normalised signal) added to a cosine
	// reading's stated errors.
	CosineSigma float64
	// StartSigma, ValidSigma (rad): the 1σ of a start from a point
	// estimate and the 1σ up to which the estimate is valid.
	StartSigma, ValidSigma float64
	// Gate is the innovation gate in σ (0: none).
	Gate float64
	// HoldBoundDeg is the error bound (deg) of the hold time.
	HoldBoundDeg float64
}

// Defaults of the gyro_filter block: a MEMS-class rate gyro of 0.3°/√h
// angle random walk and 10°/h bias instability over 600 s, a 2 % of full
// sun allowance per cosine reading, and a 5σ innovation gate (common
// practice, no source); start at 5°, valid and holding within 10°.
const (
	defaultARWDegRtH    = 0.3
	defaultBiasDegH     = 10
	defaultBiasTimeS    = 600
	defaultCosineSigma  = 0.02
	defaultStartSigmaDg = 5
	defaultValidSigmaDg = 10
	defaultGateSigma    = 5
	defaultHoldBoundDeg = 10
)

func (r *resolver) gyroFilter(f *fileGyroFilter) GyroFilter {
	if f == nil {
		return GyroFilter{}
	}
	const p = "gyro_filter."
	arw := setDefault(&f.AngleRandomWalkDegRtH, defaultARWDegRtH)
	bias := setDefault(&f.BiasInstabilityDegH, defaultBiasDegH)
	tau := setDefault(&f.BiasTimeS, defaultBiasTimeS)
	cs := setDefault(&f.CosineSigma, defaultCosineSigma)
	start := setDefault(&f.StartSigmaDeg, defaultStartSigmaDg)
	valid := setDefault(&f.ValidSigmaDeg, defaultValidSigmaDg)
	gate := setDefault(&f.GateSigma, defaultGateSigma)
	hold := setDefault(&f.HoldBoundDeg, defaultHoldBoundDeg)
	r.rangeCheck(p+"angle_random_walk_deg_rt_h", arw, arwRange, " °/√h")
	r.rangeCheck(p+"bias_instability_deg_h", bias, biasRange, " °/h (1σ of the bias)")
	r.rangeCheck(p+"bias_time_s", tau, biasTimeRange, " s")
	r.rangeCheck(p+"cosine_sigma", cs, fractionRange, " (normalised signal; 1 = full sun)")
	r.rangeCheck(p+"start_sigma_deg", start, filterSigmaRange, " degrees")
	r.rangeCheck(p+"valid_sigma_deg", valid, filterSigmaRange, " degrees")
	if start > valid {
		r.fail(p+"start_sigma_deg", "value %g is above valid_sigma_deg %g; allowed start_sigma_deg ≤ valid_sigma_deg (a start must count as valid)", start, valid)
	}
	r.rangeCheck(p+"gate_sigma", gate, gateSigmaRange, " (0: no gate)")
	r.rangeCheck(p+"hold_bound_deg", hold, boundRange, " degrees")
	if hold == 180 {
		r.fail(p+"hold_bound_deg", "value 180 is out of range; allowed (0, 180) degrees")
	}
	return GyroFilter{Set: true, ARW: arw * deg / 60, BiasSigma: bias * deg / 3600, BiasTauS: tau,
		CosineSigma: cs, StartSigma: start * deg, ValidSigma: valid * deg, Gate: gate, HoldBoundDeg: hold}
}
