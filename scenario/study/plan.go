package study

import (
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// Plan is everything `run` builds from a scenario before it simulates: the
// primary attitude's engine configuration and one per named mode, in file
// order. `check` builds the same plan, so a file check accepts is a file run
// accepts.
type Plan struct {
	Primary sim.Config
	Modes   []ModePlan
}

// ModePlan is the engine configuration of one named mode: the scenario's
// sensors, estimators, orbit and albedo under the mode's attitude.
type ModePlan struct {
	Name   string
	Config sim.Config
}

// Prepare builds the plan of a scenario: propagator, sun, attitude laws,
// sensors, obstructions, albedo model (reading a grid file) and estimators,
// for the primary attitude and every mode. An error names the field.
func Prepare(s *scenario.Scenario) (*Plan, error) {
	cfg, err := Config(s)
	if err != nil {
		return nil, err
	}
	if cfg.NewCorrection != nil {
		if err := onboardApplies(s, cfg.Array); err != nil {
			return nil, err
		}
	}
	p := &Plan{Primary: cfg}
	for i, m := range s.Modes {
		mc, err := ConfigFor(s, s.Body.Sensors, m.Attitude)
		if err != nil {
			return nil, fmt.Errorf("modes[%d] (%s): %w", i, m.Name, err)
		}
		// A mode changes the attitude only: its albedo models are the
		// primary's, so a long zonal run shares one set of zonal tables
		// (built once, 50–80 MB each) instead of one per mode.
		mc.NewAlbedo, mc.NewCorrection = cfg.NewAlbedo, cfg.NewCorrection
		p.Modes = append(p.Modes, ModePlan{Name: m.Name, Config: mc})
	}
	return p, nil
}

// Derived is what a user wants to know before a long run, computed from the
// plan without simulating it.
type Derived struct {
	// PeriodS is the Keplerian period of the mean semi-major axis.
	PeriodS float64
	// SemiMajorAxisKm, InclinationDeg and RAANDeg are the mean elements at
	// the epoch; for a sun-synchronous orbit the inclination comes from the
	// secular J2 condition and the RAAN from the LTAN.
	SemiMajorAxisKm, InclinationDeg, RAANDeg float64
	// SunSync is set for an orbit given by altitude and LTAN; SolarTime
	// then names the solar time the LTAN is read in ("mean": the mean sun's
	// right ascension; "apparent": the true sun, orbit.RAANFromLTANSolar).
	SunSync   bool
	LTANHours float64
	SolarTime string
	// BetaMinDeg and BetaMaxDeg bound the beta angle over the run, sampled
	// on the run's propagator and sun every BetaSampleS seconds.
	BetaMinDeg, BetaMaxDeg, BetaSampleS float64
	// Steps is the number of time steps of one unit, Units the number of
	// Monte Carlo units and Runs the number of simulations run makes (the
	// primary attitude and each mode).
	Steps, Units, Runs int
	// MemoryBytes is a rough estimate of run's peak memory (MemoryEstimate,
	// plus the recorded geometry of the single-failure study).
	MemoryBytes int64
	// FailedLayouts is the number of failed layouts the single-failure
	// study runs (targets.n_minus_1; 0 without it), FailedReplayed whether
	// they replay the recorded geometry (else each is a full run).
	FailedLayouts  int
	FailedReplayed bool
}

// betaSamples bounds the samples of the beta range.
const betaSamples = 20000

// Derive computes the derived values of a plan.
func Derive(s *scenario.Scenario, p *Plan) (Derived, error) {
	el, err := MeanElements(s)
	if err != nil {
		return Derived{}, err
	}
	cfg := &p.Primary
	d := Derived{PeriodS: orbit.Period(el.SemiMajorAxisKm), SemiMajorAxisKm: el.SemiMajorAxisKm,
		InclinationDeg: el.Inclination * 180 / math.Pi, RAANDeg: math.Mod(el.RAAN*180/math.Pi+360, 360),
		Steps: cfg.Steps(), Units: max(cfg.Units, 1), Runs: 1 + len(p.Modes)}
	if s.Orbit.Kind == scenario.OrbitSunSync {
		d.SunSync, d.LTANHours, d.SolarTime = true, s.Orbit.LTANHours, s.Orbit.LTANSolarTime
	}
	// Beta range: at most betaSamples samples, at least every 600 s
	// (beta moves by ≈ 1°/day, so 600 s resolves it to ≈ 0.01°) and never
	// coarser than the run's own step when the run is short.
	n := betaSamples
	dt := cfg.Duration / float64(n-1)
	if dt < 600 {
		dt = max(600, cfg.Step)
		n = int(cfg.Duration/dt) + 2
	}
	d.BetaSampleS = dt
	prop := cfg.NewPropagator()
	jd0 := ephem.JulianDateTT(cfg.Epoch)
	d.BetaMinDeg, d.BetaMaxDeg = math.Inf(1), math.Inf(-1)
	for k := range n {
		t := min(float64(k)*dt, cfg.Duration)
		st := prop.StateAt(t)
		u, _ := cfg.Sun.Position(jd0 + t/86400)
		β := math.Asin(max(-1, min(1, r3.Cos(r3.Cross(st.R, st.V), u)))) * 180 / math.Pi
		d.BetaMinDeg, d.BetaMaxDeg = min(d.BetaMinDeg, β), max(d.BetaMaxDeg, β)
	}
	d.MemoryBytes = MemoryEstimate(cfg, 0)
	if nm := s.Targets.NMinus1; nm.Set {
		n := len(s.Body.Sensors)
		d.FailedLayouts = n
		if nm.Pairs {
			d.FailedLayouts += n * (n - 1) / 2
		}
		tb := SingleFailureTraceBytes(cfg)
		d.FailedReplayed, d.MemoryBytes = tb > 0, d.MemoryBytes+tb
	}
	return d, nil
}

// Terms of MemoryEstimate, measured with /usr/bin/time -f %M on
// examples/tumbling-3u.yaml (6 h: 17.8 MB at 1 unit, 163 MB at 400, 590 MB
// at 1600 units; 50 units: 45 MB at 1 d, 115 MB at 10 d; again after the
// step-loop changes of December 2026: 62 MB at 1 d, 105 MB at 10 d, and
// 62 MB, 64 MB once only listed units kept their gaps). The term per step
// is what a unit whose gaps are listed (Config.GapListUnits, for gaps.csv)
// keeps: a tumbling layout gated tightly has hundreds of gaps a day. The
// other units, and the streaming statistics, are flat in the duration.
// The estimate errs high; it is not a bound.
const (
	memFixed        = 30 << 20  // the Go runtime, the program, the albedo model's cells
	memPerUnit      = 320 << 10 // one unit's streaming statistics (quantile bins in use)
	memPerListStep  = 20        // one listed unit's list of gaps, per step
	memPerSeriesCol = 9         // one time-series cell (value and its share of the row)
	// memPerPowerRow is the panels' power kept at each sample of a series
	// (time and watts, and the collector's headroom): with panels, 10, 30
	// and 90 days of examples/power-6u.yaml with --csv peaked at 65, 79 and
	// 100 MB, about 40 B more per sample.
	memPerPowerRow = 40
)

// SeriesRows is the number of time-series rows a run of cfg keeps in
// memory: the figures' short series, and the series unless it is written as
// the run goes (Config.SeriesSink, as run --csv does).
func SeriesRows(cfg *sim.Config) int {
	n := 0
	if cfg.SeriesStride > 0 && cfg.SeriesSink == nil {
		n += cfg.Steps()/cfg.SeriesStride + 1
	}
	if cfg.TimelineSpan > 0 && cfg.TimelineStride > 0 {
		n += int(cfg.TimelineSpan/cfg.Step)/cfg.TimelineStride + 1
	}
	return n
}

// MemoryEstimate is the one memory model of a run of cfg (run refuses a
// run above --max-memory-mib on it, check prints it): a fixed base, each
// unit's statistics, the listed units' gaps, seriesRows rows of time series
// (twelve columns and one per sensor), and the albedo tables the engine
// builds (sim.AlbedoTableBytes).
func MemoryEstimate(cfg *sim.Config, seriesRows int) int64 {
	units, steps := int64(max(cfg.Units, 1)), int64(cfg.Steps())
	cols := int64(12 + len(cfg.Viewers))
	listed := min(int64(cfg.GapListUnits), units)
	m := int64(memFixed) + units*memPerUnit + listed*memPerListStep*steps + int64(seriesRows)*cols*memPerSeriesCol
	if cfg.Panels != nil && cfg.SeriesStride > 0 {
		m += (steps/int64(cfg.SeriesStride) + 1) * memPerPowerRow
	}
	return m + sim.AlbedoTableBytes(cfg)
}

// onboardApplies refuses an on-board albedo correction that no sensor of
// the file can apply (CanCorrectAlbedo): the key would change nothing.
func onboardApplies(s *scenario.Scenario, body *sensor.Array) error {
	for i, sn := range body.Sensors() {
		if _, ok := sn.(sensor.AlbedoSubtracter); ok && i < len(s.Body.Sensors) && s.Body.Sensors[i].Threshold == 0 {
			// A dark sensor's corrected residue (the two albedo models'
			// difference, of order 1e-6 of full sun) would count it lit
			// or not by its sign, and a lit-only fit then takes back-facing
			// sensors as zero readings: the corrected error grew from 9° to
			// 19° in a test of a 1000- against a 2000-cell model.
			return fmt.Errorf("body.sensors[%d] (%s).threshold: 0 with albedo.onboard: the corrected residue of a sensor that sees no sun would decide by its sign whether it counts as lit; give a threshold above the prediction's error (for example 0.01 of full sun)", i, sn.Name())
		}
	}
	if subtracts(body) {
		return nil
	}
	if ok, err := CanCorrectAlbedo(s); ok || err != nil {
		return err
	}
	return fmt.Errorf("albedo.onboard: no sensor of the file can subtract a predicted albedo (the cosine kind can; the others are passed unchanged), so the correction would change nothing; remove albedo.onboard or add cosine sensors")
}

// CanCorrectAlbedo reports whether some sensor of the file (the body's,
// or a layout candidate) can subtract a predicted albedo from its reading
// (sensor.AlbedoSubtracter): only those are corrected on board.
func CanCorrectAlbedo(s *scenario.Scenario) (bool, error) {
	for _, list := range []struct {
		sensors []scenario.Sensor
		path    string
	}{{s.Body.Sensors, "body.sensors"}, {s.Body.Candidates, "body.candidates"}} {
		if len(list.sensors) == 0 {
			continue
		}
		arr, _, _, err := BuildSensors(s, list.sensors, list.path)
		if err != nil {
			return false, err
		}
		if subtracts(arr) {
			return true, nil
		}
	}
	return false, nil
}

func subtracts(arr *sensor.Array) bool {
	for _, sn := range arr.Sensors() {
		if _, ok := sn.(sensor.AlbedoSubtracter); ok {
			return true
		}
	}
	return false
}
