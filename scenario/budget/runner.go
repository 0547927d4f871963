package budget

import (
	"context"
	"fmt"
	"math"
	"sync"

	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// DefaultMaxDurationS caps the budget's runs (6 h, about four low orbits):
// a budget runs tens of Monte Carlo cases, and the error statistics of a
// fixed attitude settle within a few orbits (common practice, no source).
const DefaultMaxDurationS = 6 * 3600

// Reference σ used as the unit of a search when no sensor states a value
// (common practice, no source: typical coarse-sensor figures).
var referenceSigma = [NumSources]float64{
	DarkOffset: 0.005, Gain: 0.01, Noise: 0.005, Misalignment: 0.2 * math.Pi / 180,
	ApertureOffset: 0.02, DigitalNoise: 0.1 * math.Pi / 180, Twist: 1 * math.Pi / 180, ShadeSize: 0.02,
	Centroid: 0.1, MaskHeight: 0.02,
}

// tinySigma stands for "no error" in a source held in a kind parameter
// (a digital sensor's stated accuracy), whose model needs a σ > 0.
const tinySigma = 1e-12

// sourceNamed returns the source the budget table prints as name.
func sourceNamed(name string) (Source, bool) {
	for s, n := range sourceNames {
		if n == name {
			return Source(s), true
		}
	}
	return 0, false
}

// sigmaOf is a sensor's 1σ of a source it offers: from its kind parameter
// when the source lives there, else from the errors block e.
func sigmaOf(sc scenario.Sensor, e scenario.SensorErrors, src Source, es sensor.ErrorSource) float64 {
	if es.Param != "" {
		return sc.Params.Num[es.Param]
	}
	switch src {
	case DarkOffset:
		return e.DarkOffset1Sigma
	case Gain:
		return e.Gain1Sigma
	case Noise:
		return e.Noise1Sigma
	case Misalignment:
		return e.MisalignmentRad1Sigma
	case ApertureOffset:
		return e.ApertureOffsetMM1Sigma
	}
	return 0
}

// Options set the runs of a Runner.
type Options struct {
	Units        int     // Monte Carlo units; 0 = the scenario's (at least 2)
	MaxDurationS float64 // 0 = DefaultMaxDurationS; < 0 = the scenario's full span
	Workers      int     // 0 = GOMAXPROCS
}

// Runner runs budget cases of one scenario: its layout and attitude.
type Runner struct {
	s         *scenario.Scenario
	units     int
	durationS float64
	shortened bool
	workers   int
	unit      [NumSources]float64 // σ of scale 1 per source (largest stated, or reference)
	stated    [NumSources]bool
	present   [NumSources]bool
	traceOnce sync.Once
	trace     *sim.Trace // the geometry the cases share; nil: each runs in full
}

// NewRunner prepares the runs of s.
func NewRunner(s *scenario.Scenario, o Options) (*Runner, error) {
	if o.Units < 0 {
		return nil, fmt.Errorf("budget: units %d: want ≥ 1", o.Units)
	}
	r := &Runner{s: s, units: o.Units, workers: o.Workers, durationS: s.Duration.Seconds()}
	if r.units == 0 {
		r.units = max(s.MonteCarlo.Units, 2)
	}
	maxD := o.MaxDurationS
	if maxD == 0 {
		maxD = DefaultMaxDurationS
	}
	if maxD > 0 && r.durationS > maxD {
		r.durationS, r.shortened = maxD, true
	}
	for _, sc := range s.Body.Sensors {
		info, _ := sensor.LookupKind(sc.Kind)
		for _, es := range info.Sources {
			src, ok := sourceNamed(es.Name)
			if !ok {
				return nil, fmt.Errorf("budget: sensor kind %q offers error source %q, which the budget does not know", sc.Kind, es.Name)
			}
			r.present[src] = true
			if src == Quantisation && sc.ADCBits > 0 {
				r.stated[Quantisation] = true
			}
			if src == Temperature && sensor.HasThermalCoefficient(sc.Params) {
				r.stated[Temperature] = true
			}
			r.unit[src] = max(r.unit[src], sigmaOf(sc, sc.Errors, src, es))
		}
	}
	for i := range r.unit {
		r.stated[i] = r.stated[i] || r.unit[i] > 0
		if r.unit[i] == 0 {
			r.unit[i] = referenceSigma[i]
		}
	}
	r.present[Albedo] = s.Albedo.Model != scenario.AlbedoNone && s.Albedo.Model != ""
	r.stated[Albedo] = r.present[Albedo]
	return r, nil
}

// Thermal reports whether some sensor's readings depend on its temperature
// (the calibration range is then searched).
func (r *Runner) Thermal() bool {
	for _, sc := range r.s.Body.Sensors {
		if sensor.HasThermalCoefficient(sc.Params) {
			return true
		}
	}
	return false
}

// CalibrationC returns the calibration temperature shared by every sensor
// with a temperature coefficient, nil when they differ or there is none.
func (r *Runner) CalibrationC() *float64 {
	var out *float64
	for _, sc := range r.s.Body.Sensors {
		if !sensor.HasThermalCoefficient(sc.Params) {
			continue
		}
		c := sc.Params.Num["calibration_temperature_c"]
		if out != nil && *out != c {
			return nil
		}
		out = &c
	}
	return out
}

// Sources returns the sources that apply to the layout and have a stated
// value (the budget's rows).
func (r *Runner) Sources() []Source {
	var out []Source
	for s := range NumSources {
		if r.present[s] && r.stated[s] {
			out = append(out, s)
		}
	}
	return out
}

// Sigma returns the 1σ of src at a scale, in the source's display unit
// (fraction of full scale, deg or mm) and that unit's name.
func (r *Runner) Sigma(src Source, scale float64) (float64, string) {
	v := r.unit[src] * scale
	switch src {
	case Misalignment, DigitalNoise, Twist:
		return v * 180 / math.Pi, "deg"
	case ApertureOffset, ShadeSize, MaskHeight:
		return v, "mm"
	case Centroid:
		return v, "px"
	case DarkOffset, Noise:
		return v, "of full scale"
	case Gain:
		return v, "relative"
	}
	return v, ""
}

// DurationS is the simulated span of each run; Shortened reports that it
// is shorter than the scenario's.
func (r *Runner) DurationS() float64 { return r.durationS }

// Shortened reports whether the runs cover less than the scenario's span.
func (r *Runner) Shortened() bool { return r.shortened }

// scaled returns a σ scaled against the source's unit: a sensor that
// states a value keeps its proportion to the largest one.
func (r *Runner) scaled(src Source, own, k float64) float64 {
	if !r.stated[src] {
		return k * r.unit[src]
	}
	return k * own
}

// sensors returns the layout with the case's error values.
func (r *Runner) sensors(c Case) []scenario.Sensor {
	list := make([]scenario.Sensor, len(r.s.Body.Sensors))
	for i, sc := range r.s.Body.Sensors {
		e := sc.Errors
		if c.Calibrated {
			// Per kind and per source; never an error the sensor
			// does not state (scenario.Budget.CalibratedErrors).
			e = r.s.Budget.CalibratedErrors(sc)
		}
		sc.Errors = scenario.SensorErrors{
			DarkOffset1Sigma:       r.scaled(DarkOffset, e.DarkOffset1Sigma, c.Scale[DarkOffset]),
			Gain1Sigma:             r.scaled(Gain, e.Gain1Sigma, c.Scale[Gain]),
			Noise1Sigma:            r.scaled(Noise, e.Noise1Sigma, c.Scale[Noise]),
			MisalignmentRad1Sigma:  r.scaled(Misalignment, e.MisalignmentRad1Sigma, c.Scale[Misalignment]),
			ApertureOffsetMM1Sigma: r.scaled(ApertureOffset, e.ApertureOffsetMM1Sigma, c.Scale[ApertureOffset]),
		}
		if !(c.Scale[Quantisation] > 0) {
			sc.ADCBits = 0
		}
		switch {
		case !sensor.HasThermalCoefficient(sc.Params):
		case c.AtTemperature:
			sc.Params = sensor.AtTemperatureOffset(sc.Params, c.TempOffsetC)
		case !(c.Scale[Temperature] > 0):
			sc.Params = sensor.AtTemperatureOffset(sc.Params, 0) // as calibrated
		}
		info, _ := sensor.LookupKind(sc.Kind)
		for _, es := range info.Sources {
			if src, ok := sourceNamed(es.Name); ok && es.Param != "" {
				v := r.scaled(src, sc.Params.Num[es.Param], c.Scale[src])
				sc.Params = sc.Params.WithNumber(es.Param, max(v, tinySigma))
			}
		}
		list[i] = sc
	}
	return list
}

// Config builds the simulation of one case.
func (r *Runner) Config(c Case) (sim.Config, error) {
	cfg, err := r.baseConfig(c)
	if err != nil {
		return cfg, err
	}
	if !(c.Scale[Albedo] > 0) {
		cfg.NewAlbedo = nil
	}
	// The correction case uses the scenario's on-board model
	// (albedo.onboard) through the engine's corrected readings; a scenario
	// without one is corrected by a uniform model of the truth's value.
	if !c.Correction || cfg.NewAlbedo == nil {
		cfg.NewCorrection = nil
	}
	if c.Correction && cfg.NewAlbedo != nil && cfg.NewCorrection == nil {
		a := r.s.Albedo.Value
		acfg := albedo.Config{Reflectance: albedo.Uniform{Albedo: a}, Cells: r.s.Albedo.Cells,
			AltitudeKm: r.s.Orbit.SemiMajorAxisKm - orbit.RadiusEarthKm}
		if r.s.Orbit.Eccentricity > 0 {
			acfg.AltitudeKm = 0
		}
		if _, err := albedo.New(acfg); err != nil {
			return cfg, fmt.Errorf("budget: albedo correction: %w", err)
		}
		cfg.NewCorrection = func() (*albedo.Model, error) { return albedo.New(acfg) }
	}
	return cfg, cfg.Validate()
}

// baseConfig is the simulation of one case with the scenario's albedo and
// no correction.
func (r *Runner) baseConfig(c Case) (sim.Config, error) {
	cfg, err := study.ConfigFor(r.s, r.sensors(c), r.s.Attitude)
	if err != nil {
		return cfg, err
	}
	cfg.Duration = r.durationS
	cfg.Units = r.units
	cfg.Workers = r.workers
	cfg.SeriesStride = 0
	cfg.SunTrackPoints = 0
	return cfg, nil
}

// Run implements RunFunc for the scenario. The cases share one recorded
// geometry (orbit, sun, shadow, attitude and albedo do not depend on the
// error values), each case's sensors read on it, unless traceFor says the
// case must run in full.
func (r *Runner) Run(ctx context.Context, c Case) (Metric, error) {
	cfg, err := r.Config(c)
	if err != nil {
		return Metric{}, err
	}
	var res *sim.Result
	if tr := r.traceFor(ctx, c, &cfg); tr != nil {
		res, err = tr.RunArray(ctx, cfg.Array, cfg.NewAlbedo != nil, cfg.Units)
	} else {
		res, err = sim.Run(ctx, cfg)
	}
	if err != nil {
		return Metric{}, err
	}
	return metricOf(res)
}

// maxTraceBytes bounds the geometry the cases share (sim.TraceBytes); a
// longer span runs every case in full.
const maxTraceBytes = 256 << 20

// traceFor returns the geometry every case shares, recorded at the first
// call, or nil when case c runs in full: an attitude drawn per unit (no
// two units share a geometry), an albedo correction (the trace holds no
// corrected albedo) or a span whose geometry exceeds maxTraceBytes. A
// trace integrates the albedo at every step, as a run of the default 6 h
// span does (its tables pay off only on longer runs).
func (r *Runner) traceFor(ctx context.Context, c Case, cfg *sim.Config) *sim.Trace {
	if c.Correction || cfg.LawForUnit != nil {
		return nil
	}
	r.traceOnce.Do(func() {
		base, err := r.baseConfig(c)
		if err != nil || sim.TraceBytes(&base) > maxTraceBytes {
			return
		}
		base.NewCorrection = nil             // as Config leaves every case without a correction
		r.trace, _ = sim.NewTrace(ctx, base) // nil on error: the cases run in full
	})
	return r.trace
}

// metricOf takes the primary estimator's realistic error of every unit.
func metricOf(res *sim.Result) (Metric, error) {
	var m Metric
	for _, u := range res.Units {
		e := &u.Estimators[0]
		st := e.ErrNoAlbedo
		if e.ErrAlbedo.N > 0 {
			st = e.ErrAlbedo
		}
		if e.Corrected != nil {
			st = e.Corrected.Err
		}
		if st.N == 0 {
			return m, fmt.Errorf("budget: unit %d: %w from %s; the layout or attitude cannot give a budget", u.Unit, ErrNoValid, e.Name)
		}
		m.UnitP95Deg = append(m.UnitP95Deg, st.P95Deg)
		m.UnitRMSDeg = append(m.UnitRMSDeg, st.RMSDeg)
	}
	return m, nil
}
