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
	t := plots.Table{Title: "Single failure over time (" + h.Estimator + ", primary attitude)",
		Header: []string{"Failed sensor", "Valid (% of sunlit)", "Longest gap (s)", "p95 no albedo (°)", "p95 albedo (°)"},
		Note:   "Each sensor removed in turn and the run simulated again; worst: lowest valid share, then largest p95, then longest gap."}
	row := func(name string, g sim.Headline) []string {
		return []string{name, pct(g.ValidFraction), num(g.LongestGapS, 0), num(g.P95NoAlbedoDeg, 2), num(g.P95AlbedoDeg, 2)}
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
