package layout

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strings"

	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// Evaluator returns the EvaluateFunc of a scenario: it scores a subset of
// body.candidates in the scenario's attitude and in every
// mode, and judges min_valid_fraction, max_error_p95_deg and max_gap. The
// geometry of each mode (orbit, sun, shadow, attitude, every candidate's
// albedo) is recorded once in a sim.Trace; a subset then costs only its
// sensor readings. A random attitude (tumble) uses the nominal draw for every
// unit here.
func Evaluator(ctx context.Context, s *scenario.Scenario) (EvaluateFunc, error) {
	if s.Targets.NMinus1.Set {
		return nil, errors.New("layout: targets.n_minus_1: the layout search does not judge single failures; remove the block here and run the chosen layout with it")
	}
	atts := []scenario.Mode{{Name: "attitude", Attitude: s.Attitude}}
	atts = append(atts, s.Modes...)
	traces := make([]*sim.Trace, len(atts))
	configs := make([]sim.Config, len(atts))
	for mi, m := range atts {
		if i, ok := study.SensorPlannedTimeline(s, m.Attitude); ok {
			return nil, fmt.Errorf("layout: mode %s: timeline.phases[%d] (%s).until: the phase ends when the sun is seen, so its timeline depends on the layout, but the search replays one timeline planned with every candidate; give that phase an elapsed or eclipse end for the search, then run the chosen layout with it",
				m.Name, i, s.Timeline.Phases[i].Name)
		}
		cfg, err := study.ConfigFor(s, s.Body.Candidates, m.Attitude)
		if err != nil {
			return nil, fmt.Errorf("layout: mode %s: %w", m.Name, err)
		}
		cfg.LawForUnit = nil
		if traces[mi], err = sim.NewTrace(ctx, cfg); err != nil {
			return nil, fmt.Errorf("layout: mode %s: %w", m.Name, err)
		}
		configs[mi] = cfg
	}
	// The traces are read-only from here on: subsets are scored in parallel.
	return func(ctx context.Context, subset []int) (Score, error) {
		sc := Score{Meets: true, Margin: math.Inf(1), P95Deg: math.NaN()}
		var detail []string
		for mi, m := range atts {
			res, err := traces[mi].Run(ctx, subset, configs[mi].Estimators, configs[mi].Units)
			if err != nil {
				return sc, err
			}
			h := res.Headline()
			p95 := h.P95AlbedoDeg
			if math.IsNaN(p95) {
				p95 = h.P95NoAlbedoDeg
			}
			if math.IsNaN(sc.P95Deg) || p95 > sc.P95Deg {
				sc.P95Deg = p95
			}
			// The time targets, judged as everywhere else; coverage is the
			// search's own bound.
			for _, c := range study.CheckTargets(s, h, sky.Result{}) {
				if c.Key == study.TargetCoverage || c.Key == study.TargetCoverageOneFailed {
					continue
				}
				sc.Meets = sc.Meets && c.Pass
				sc.Margin = min(sc.Margin, c.Margin)
			}
			detail = append(detail, fmt.Sprintf("%s: valid %.3f, p95 %.2f°, gap %.0f s", m.Name, h.ValidFraction, p95, h.LongestGapS))
		}
		if math.IsInf(sc.Margin, 1) {
			sc.Margin = 0
		}
		sc.Detail = strings.Join(detail, "; ")
		return sc, nil
	}, nil
}
