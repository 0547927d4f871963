package study

import (
	"context"
	"fmt"
	"math"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// FailedSensor is the run simulated again with one sensor failed (removed
// from the layout): the headline figures of its primary estimator.
type FailedSensor struct {
	Sensor   string // the failed sensor's name
	Headline sim.Headline
}

// P95Deg is the failed run's p95 error as the targets judge it: with albedo
// when an albedo model is set, else without.
func (f FailedSensor) P95Deg() float64 { return headlineP95(f.Headline) }

// SingleFailure is the single-failure study of a run: one row per sensor,
// in body.sensors order, and the worst of them.
type SingleFailure struct {
	Rows []FailedSensor
	// Worst indexes the worst single failure: the lowest valid share, then
	// the largest p95 error, then the longest gap.
	Worst int
}

// maxTraceBytes bounds the recorded geometry of the single-failure study;
// a longer run replays no trace but runs each failed layout in full.
const maxTraceBytes = 256 << 20

// SingleFailureTraceBytes is the memory RunSingleFailure keeps beside the
// run (the recorded geometry; 0 when each failed layout is run in full).
func SingleFailureTraceBytes(base *sim.Config) int64 {
	if base.LawForUnit != nil {
		return 0
	}
	if b := sim.TraceBytes(base); b <= maxTraceBytes {
		return b
	}
	return 0
}

// RunSingleFailure simulates the scenario's primary attitude once per
// sensor with that sensor failed, as base (the primary configuration, with
// its units and workers) would run. Without a per-unit attitude draw the
// geometry is recorded once (sim.Trace) and each failed layout costs only
// its sensor readings; a tumble redraws the attitude per unit, so each
// failed layout is then a full run of the reduced sensor list, as it is when
// the geometry would take more than maxTraceBytes.
func RunSingleFailure(ctx context.Context, s *scenario.Scenario, base sim.Config) (SingleFailure, error) {
	sensors := s.Body.Sensors
	if len(sensors) < 2 {
		return SingleFailure{}, fmt.Errorf("study: the single-failure study needs at least 2 sensors, the body has %d", len(sensors))
	}
	var sf SingleFailure
	var tr *sim.Trace
	if SingleFailureTraceBytes(&base) > 0 {
		var err error
		if tr, err = sim.NewTrace(ctx, base); err != nil {
			return sf, fmt.Errorf("single-failure study: %w", err)
		}
	}
	for i := range sensors {
		var res *sim.Result
		var err error
		if tr != nil {
			subset := make([]int, 0, len(sensors)-1)
			for j := range sensors {
				if j != i {
					subset = append(subset, j)
				}
			}
			res, err = tr.Run(ctx, subset, base.Estimators, base.Units)
		} else {
			res, err = runWithout(ctx, s, base, i)
		}
		if err != nil {
			return sf, fmt.Errorf("single-failure study, sensor %s failed: %w", sensors[i].Name, err)
		}
		sf.Rows = append(sf.Rows, FailedSensor{Sensor: sensors[i].Name, Headline: res.Headline()})
	}
	sf.Worst = worstFailure(sf.Rows)
	return sf, nil
}

// runWithout is a full run of the primary attitude without sensor i.
func runWithout(ctx context.Context, s *scenario.Scenario, base sim.Config, i int) (*sim.Result, error) {
	rest := append(append([]scenario.Sensor(nil), s.Body.Sensors[:i]...), s.Body.Sensors[i+1:]...)
	cfg, err := ConfigFor(s, rest, s.Attitude)
	if err != nil {
		return nil, err
	}
	cfg.Units, cfg.Workers, cfg.Seed = base.Units, base.Workers, base.Seed
	cfg.SeriesStride, cfg.SunTrackPoints, cfg.Progress = 0, 0, nil
	return sim.Run(ctx, cfg)
}

// worstFailure returns the index of the worst row: lowest valid share, then
// largest p95 (an undefined p95 is the worst), then longest gap.
func worstFailure(rows []FailedSensor) int {
	worse := func(a, b FailedSensor) bool {
		if a.Headline.ValidFraction != b.Headline.ValidFraction {
			return a.Headline.ValidFraction < b.Headline.ValidFraction
		}
		pa, pb := orInf(a.P95Deg()), orInf(b.P95Deg())
		if pa != pb {
			return pa > pb
		}
		return a.Headline.LongestGapS > b.Headline.LongestGapS
	}
	w := 0
	for i := range rows {
		if worse(rows[i], rows[w]) {
			w = i
		}
	}
	return w
}

func orInf(v float64) float64 {
	if math.IsNaN(v) {
		return math.Inf(1)
	}
	return v
}

// headlineP95 is the p95 error the targets judge: with albedo when defined.
func headlineP95(h sim.Headline) float64 {
	if !math.IsNaN(h.P95AlbedoDeg) {
		return h.P95AlbedoDeg
	}
	return h.P95NoAlbedoDeg
}
