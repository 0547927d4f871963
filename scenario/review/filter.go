package review

import (
	"fmt"
	"math"
	"slices"

	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// filterModel and filterSource are the models-table row of the
// gyro-aided filter.
const (
	filterModel  = "extended Kalman filter of the body-frame sun vector and the gyro bias (estimated), propagated with the rate gyro, updated with every valid cosine and two-axis reading"
	filterSource = "cosine measurement model: O'Keefe & Schaub, J. Astronaut. Sci. 61(1), 2014; EKF and gyro model (angle random walk, Gauss–Markov bias): Crassidis & Junkins, Optimal Estimation of Dynamic Systems, 2nd ed., 2012, ch. 3 and 7 (both from memory)"
)

// filterTable states the gyro-aided filter's figures beside the point
// estimators' (nominal unit; the worst unit's eclipse p95 with several).
// It is absent without a gyro_filter block.
func filterTable(s *scenario.Scenario, res *sim.Result) (plots.Table, bool) {
	f := res.Nominal.Filter
	if f == nil {
		return plots.Table{}, false
	}
	g := s.GyroFilter
	const toDeg = 180 / math.Pi
	t := plots.Table{Title: "Gyro-aided filter beside the point estimators (same readings; whole run, sunlit and eclipse)",
		Header: []string{"quantity", "value"},
		Note: fmt.Sprintf("Gyro %.2f°/√h angle random walk and %.1f°/h bias instability (1σ, drifting over %.0f s), the bias estimated; "+
			"valid while the filter's own 1σ is within %.1f°, restarted from the primary point estimate when not. "+
			"Its readings are taken as independent from step to step: dark offsets, gain errors, misalignment and albedo that last "+
			"are not in its model, so its own 1σ is optimistic; the errors here are against the true sun. "+
			"The held point estimate is exact where the attitude law keeps the sun still in body axes (sun or inertial pointing); "+
			"in flight that attitude would itself be held with the same gyro.",
			g.ARW*toDeg*60, g.BiasSigma*toDeg*3600, g.BiasTauS, g.ValidSigma*toDeg)}
	brk := "every one held"
	if !math.IsNaN(f.ShortestBreakS) {
		brk = num(f.ShortestBreakS, 0) + " s"
	}
	t.Rows = [][]string{
		{"valid (% of the run / % of eclipse time)", pct(f.ValidFraction) + " / " + pct(f.ValidShadowFraction)},
		{"error p95 / max, whole run (deg)", num(f.Err.P95Deg, 2) + " / " + num(f.Err.MaxDeg, 2)},
		{"error p95 in eclipse (deg)", num(f.ErrShadow.P95Deg, 2)},
		{"last point estimate held through eclipse, p95 (deg)", num(f.HoldLastShadow.P95Deg, 2)},
		{fmt.Sprintf("spells without a valid point estimate / held within %g°", f.HoldBoundDeg), fmt.Sprintf("%d / %d", f.Outages, f.OutagesHeld)},
		{fmt.Sprintf("shortest time to leave %g° in such a spell", f.HoldBoundDeg), brk},
		{"longest spell held whole (min)", num(f.LongestHeldS/60, 1)},
	}
	if len(res.Units) > 1 {
		var p []float64
		for _, u := range res.Units {
			if u.Filter != nil && u.Filter.ErrShadow.N > 0 {
				p = append(p, u.Filter.ErrShadow.P95Deg)
			}
		}
		if len(p) > 0 {
			t.Rows = append(t.Rows, []string{fmt.Sprintf("error p95 in eclipse, worst of %d units (deg)", len(res.Units)), num(slices.Max(p), 2)})
		}
	}
	return t, true
}
