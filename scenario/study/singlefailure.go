package study

import (
	"context"
	"errors"
	"fmt"
	"math"
	"runtime"
	"slices"
	"strings"
	"sync"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// FailedSensor is the run simulated again with one sensor (or a pair)
// failed, removed from the layout: the headline figures of its primary
// estimator.
type FailedSensor struct {
	Sensor   string   // the failed sensor's name ("a + b" for a pair)
	Failed   []string // the failed sensors' names
	Headline sim.Headline
}

// SingleFailure is the single-failure study of a run: one row per sensor,
// in body.sensors order, and the worst of them; with n_minus_1.also_pairs
// one row per pair of sensors too.
type SingleFailure struct {
	Rows []FailedSensor
	// Worst indexes the worst single failure: the lowest valid share, then
	// the largest p95 error, then the longest gap, on the figures the
	// targets judge (targets.judge).
	Worst int
	// Pairs are the pairs failed together (i < j in body.sensors order),
	// WorstPair the worst of them (-1 without pairs).
	Pairs     []FailedSensor
	WorstPair int
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
// the geometry would take more than maxTraceBytes, and when the attitude is
// a timeline with a phase that ends on the sun seen (SensorPlannedTimeline):
// that timeline is planned anew on the sensors left.
func RunSingleFailure(ctx context.Context, s *scenario.Scenario, base sim.Config) (SingleFailure, error) {
	sensors := s.Body.Sensors
	if len(sensors) < 2 {
		return SingleFailure{}, fmt.Errorf("study: the single-failure study needs at least 2 sensors, the body has %d", len(sensors))
	}
	sf := SingleFailure{WorstPair: -1}
	var tr *sim.Trace
	if _, replan := SensorPlannedTimeline(s, s.Attitude); SingleFailureTraceBytes(&base) > 0 && !replan {
		var err error
		if tr, err = sim.NewTrace(ctx, base); err != nil {
			return sf, fmt.Errorf("single-failure study: %w", err)
		}
	}
	fail := func(failed ...int) (FailedSensor, error) {
		f := FailedSensor{}
		for _, i := range failed {
			f.Failed = append(f.Failed, sensors[i].Name)
		}
		f.Sensor = strings.Join(f.Failed, " + ")
		var res *sim.Result
		var err error
		if tr != nil {
			subset := make([]int, 0, len(sensors))
			for j := range sensors {
				if !slices.Contains(failed, j) {
					subset = append(subset, j)
				}
			}
			res, err = tr.RunWithFilter(ctx, subset, base.Estimators, base.Units)
		} else {
			res, err = runWithout(ctx, s, base, failed...)
		}
		if err != nil {
			return f, fmt.Errorf("single-failure study, %s failed: %w", f.Sensor, err)
		}
		f.Headline = res.Headline()
		return f, nil
	}
	// The failed layouts: each sensor, then (also_pairs) each pair.
	var sets [][]int
	for i := range sensors {
		sets = append(sets, []int{i})
	}
	if s.Targets.NMinus1.Pairs {
		for i := range sensors {
			for j := i + 1; j < len(sensors); j++ {
				sets = append(sets, []int{i, j})
			}
		}
	}
	// A trace is read-only once recorded: its replays run in parallel. A
	// full run is parallel inside, so those run one after the other.
	workers := 1
	if tr != nil {
		workers = base.Workers
		if workers <= 0 {
			workers = runtime.GOMAXPROCS(0)
		}
	}
	out := make([]FailedSensor, len(sets))
	errs := make([]error, len(sets))
	next := make(chan int)
	var wg sync.WaitGroup
	for range min(workers, len(sets)) {
		wg.Go(func() {
			for k := range next {
				out[k], errs[k] = fail(sets[k]...)
			}
		})
	}
	for k := range sets {
		next <- k
	}
	close(next)
	wg.Wait()
	if err := errors.Join(errs...); err != nil {
		return sf, err
	}
	sf.Rows = out[:len(sensors)]
	sf.Worst = worstFailure(s, sf.Rows)
	if s.Targets.NMinus1.Pairs {
		sf.Pairs = out[len(sensors):]
		sf.WorstPair = worstFailure(s, sf.Pairs)
	}
	return sf, nil
}

// SensorPlannedTimeline reports whether att is a timeline whose planning
// depends on the sensors that fly: a phase that ends when the sun has been
// seen by some of them (until: sun_seen). It returns that phase's index.
// A replay of geometry planned with other sensors would then be wrong.
func SensorPlannedTimeline(s *scenario.Scenario, att scenario.Attitude) (phase int, ok bool) {
	if att.Name != scenario.LawTimeline {
		return -1, false
	}
	for i, p := range s.Timeline.Phases {
		if p.Until.Kind == scenario.UntilSunSeen {
			return i, true
		}
	}
	return -1, false
}

// runWithout is a full run of the primary attitude without the failed
// sensors (indices into body.sensors).
func runWithout(ctx context.Context, s *scenario.Scenario, base sim.Config, failed ...int) (*sim.Result, error) {
	var rest []scenario.Sensor
	for j, sn := range s.Body.Sensors {
		if !slices.Contains(failed, j) {
			rest = append(rest, sn)
		}
	}
	cfg, err := ConfigFor(s, rest, s.Attitude)
	if err != nil {
		return nil, err
	}
	cfg.Units, cfg.Workers, cfg.Seed = base.Units, base.Workers, base.Seed
	cfg = cfg.Lean()
	return sim.Run(ctx, cfg)
}

// worstFailure returns the index of the worst row (WorseFailure).
func worstFailure(s *scenario.Scenario, rows []FailedSensor) int {
	w := 0
	for i := range rows {
		if WorseFailure(s, rows[i], rows[w]) {
			w = i
		}
	}
	return w
}

// WorseFailure reports whether failure a is worse than b on the figures
// the targets of s judge (targets.judge: uncorrected or on-board
// corrected): a lower valid share, then a larger p95 error (an undefined
// one is the worst), then a longer gap.
func WorseFailure(s *scenario.Scenario, a, b FailedSensor) bool {
	ja, jb := JudgedFigures(s, a.Headline), JudgedFigures(s, b.Headline)
	if ja.ValidFraction != jb.ValidFraction {
		return ja.ValidFraction < jb.ValidFraction
	}
	pa, pb := orInf(ja.P95Deg), orInf(jb.P95Deg)
	if pa != pb {
		return pa > pb
	}
	return ja.LongestGapS > jb.LongestGapS
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
