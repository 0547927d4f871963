package review

import (
	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// AddSingleFailure adds the single-failure study (targets.n_minus_1) to a
// report built by Report: its table, and its targets judged with the run's
// so the verdict banner is the summary's and the JSON record's.
func AddSingleFailure(r *plots.Report, s *scenario.Scenario, cfg sim.Config, res *sim.Result, sf study.SingleFailure) {
	a := study.Assess(s, cfg, res).WithSingleFailure(s, sf)
	r.Verdict = verdictOf(a.Targets)
	h := res.Headline()
	corr := s.Albedo.Onboard != nil
	t := plots.Table{Title: "Single failure over time (" + h.Estimator + ", primary attitude)",
		Header: []string{"Failed sensor", "Valid (% of sunlit)", "Longest gap (s)", "p95 no albedo (°)", "p95 albedo (°)"},
		Note: "Each sensor removed in turn and the run simulated again; worst: lowest valid share, then largest p95, then longest gap, on the " +
			study.JudgedFigures(s, h).What + " estimate the targets judge."}
	if corr {
		t.Header = append(t.Header, "Valid corrected (% of sunlit)", "Longest gap corrected (s)", "p95 corrected (°)")
		t.Note += " Corrected: after the on-board albedo correction."
	}
	filt := s.GyroFilter.Set
	if filt {
		t.Header = append(t.Header, "Filter valid (% of run)", "Filter p95 (°)", "Filter p95 in eclipse (°)")
		t.Note += " Filter: the gyro-aided filter on the sensors left, over the whole run, sunlit and eclipse."
	}
	row := func(name string, g sim.Headline) []string {
		r := []string{name, pct(g.ValidFraction), num(g.LongestGapS, 0), num(g.P95NoAlbedoDeg, 2), num(g.P95AlbedoDeg, 2)}
		if corr {
			r = append(r, pct(g.ValidFractionCorrected), num(g.LongestGapCorrectedS, 0), num(g.P95CorrectedDeg, 2))
		}
		if filt {
			r = append(r, pct(g.FilterValidFraction), num(g.FilterP95Deg, 2), num(g.FilterP95ShadowDeg, 2))
		}
		return r
	}
	t.Rows = append(t.Rows, row("none", h))
	for i, f := range sf.Rows {
		name := f.Sensor
		if i == sf.Worst {
			name += " (worst)"
		}
		t.Rows = append(t.Rows, row(name, f.Headline))
	}
	if sf.WorstPair >= 0 {
		w := sf.Pairs[sf.WorstPair]
		t.Rows = append(t.Rows, row(w.Sensor+" (worst pair)", w.Headline))
	}
	r.Tables = append(r.Tables, t)
}
