package study

import (
	"fmt"

	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// Assessment is a run judged once, for every output (summary, JSON, CSV,
// sweep table, report): its headline figures, the sky coverage of its
// sensors, the target checks and the verdict.
type Assessment struct {
	Headline sim.Headline
	// Coverage is the body-frame sky coverage on the Fibonacci lattice of
	// sky.DefaultPoints points (zero when CoverageErr is set, or when it was
	// not needed, see AssessTargets).
	Coverage    sky.Result
	CoverageErr error
	Targets     []TargetCheck
	Verdict     Verdict
	// SingleFailure is the single-failure study (nil when the scenario asks
	// for none); its n_minus_1 targets are in Targets.
	SingleFailure *SingleFailure
}

// WithSingleFailure adds the single-failure study and its n_minus_1 targets
// to the assessment and judges the verdict again.
func (a Assessment) WithSingleFailure(s *scenario.Scenario, sf SingleFailure) Assessment {
	a.SingleFailure = &sf
	a.Targets = append(append([]TargetCheck(nil), a.Targets...), CheckSingleFailure(s, sf)...)
	a.Verdict = Judge(a.Targets)
	return a
}

// Assess computes the sky coverage of the run's sensors and judges the
// scenario's targets on the run.
func Assess(s *scenario.Scenario, cfg sim.Config, res *sim.Result) Assessment {
	return assess(s, cfg, res, true)
}

// AssessTargets is Assess computing the sky coverage only when a coverage
// target needs it (a sweep's many cases).
func AssessTargets(s *scenario.Scenario, cfg sim.Config, res *sim.Result) Assessment {
	return assess(s, cfg, res, s.Targets.MinCoverage > 0 && s.Targets.CoverageSensors > 0)
}

func assess(s *scenario.Scenario, cfg sim.Config, res *sim.Result, coverage bool) Assessment {
	var a Assessment
	if coverage {
		lat, err := sky.Fibonacci(sky.DefaultPoints)
		if err == nil {
			a.Coverage, err = sky.Coverage(Viewers(cfg), lat)
		}
		if err != nil {
			a.Coverage, a.CoverageErr = sky.Result{}, fmt.Errorf("study: sky coverage: %w", err)
		}
	}
	return a.Mode(s, res)
}

// Mode is the assessment of another run of the same sensors (a mode: the
// coverage does not depend on the attitude).
func (a Assessment) Mode(s *scenario.Scenario, res *sim.Result) Assessment {
	out := Assessment{Headline: res.Headline(), Coverage: a.Coverage, CoverageErr: a.CoverageErr}
	out.Targets = CheckTargets(s, out.Headline, out.Coverage)
	out.Verdict = Judge(out.Targets)
	return out
}

// Viewers returns the sky viewers of a run's sensors: the configuration's
// (field of view and obstructions), else each sensor's own view of the sun.
func Viewers(cfg sim.Config) []sky.Viewer {
	if cfg.Viewers != nil {
		return cfg.Viewers
	}
	var v []sky.Viewer
	for _, sn := range cfg.Array.Sensors() {
		v = append(v, sky.ViewerFunc(sn.SeesSun))
	}
	return v
}
