package study

import (
	"fmt"

	"codeberg.org/sunsight/sunsight/illum/sensor/filter"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// lengthRate is the random walk (1/√s) of the filter's sun-vector length:
// the cosine readings follow the sun's intensity (penumbra, distance,
// albedo), which the length absorbs; 0.01/√s lets it move by 0.1 in
// 100 s (common practice, no source).
const lengthRate = 0.01

// startLengthSigma is the 1σ of the length at a start (the intensity of a
// point estimate is not known): 0.1 of full sun (common practice, no
// source).
const startLengthSigma = 0.1

// FilterConfig is the scenario's gyro-aided filter for the engine; nil when
// the scenario has no gyro_filter block.
func FilterConfig(s *scenario.Scenario) *sim.FilterConfig {
	g := s.GyroFilter
	if !g.Set {
		return nil
	}
	return &sim.FilterConfig{
		Settings: filter.Settings{ARW: g.ARW, BiasSigma: g.BiasSigma, BiasTau: g.BiasTauS, LengthRate: lengthRate,
			StartSigma: g.StartSigma, StartLengthSigma: startLengthSigma, MaxSigma: g.ValidSigma, Gate: g.Gate},
		CosineSigma: g.CosineSigma, HoldBoundDeg: g.HoldBoundDeg,
	}
}

// filterWarnings says when the body turned further in one step than the
// filter's covariance was checked at (any unit).
func filterWarnings(res *sim.Result) []string {
	if res == nil {
		return nil
	}
	worst := 0.0
	for _, u := range res.Units {
		if u.Filter != nil {
			worst = max(worst, u.Filter.MaxStepTurnDeg)
		}
	}
	if worst <= sim.MaxCheckedStepTurnDeg {
		return nil
	}
	return []string{fmt.Sprintf("the body turns up to %.0f° in one step, beyond the %.0f° a step at which the gyro-aided filter's covariance was checked: its figures may be optimistic; shorten the step",
		worst, sim.MaxCheckedStepTurnDeg)}
}
