package main

import (
	"fmt"
	"io"
	"math"
	"strconv"

	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// writeFilter prints the gyro-aided filter's section (nothing without a
// gyro_filter block).
func (o *runOutput) writeFilter(w io.Writer) {
	f := o.res.Nominal.Filter
	if f == nil {
		return
	}
	g := o.s.GyroFilter
	fmt.Fprintf(w, "\nGyro-aided filter (whole run, sunlit and eclipse; gyro %.2f°/√h angle random walk, %.1f°/h bias instability over %.0f s, bias estimated)\n",
		g.ARW*180/math.Pi*60, g.BiasSigma*180/math.Pi*3600, g.BiasTauS)
	fmt.Fprintf(w, "  valid %s of the run, %s of eclipse time (valid: its own 1σ within %.1f°); restarted %d time(s) from the primary estimate\n",
		pct(f.ValidFraction), pct(f.ValidShadowFraction), g.ValidSigma*180/math.Pi, f.Starts)
	fmt.Fprintf(w, "  error p95 %s (max %s); in eclipse p95 %s, against %s for the last point estimate held\n",
		deg(f.Err.P95Deg), deg(f.Err.MaxDeg), deg(f.ErrShadow.P95Deg), deg(f.HoldLastShadow.P95Deg))
	brk := "every one held"
	if !math.IsNaN(f.ShortestBreakS) {
		brk = fmt.Sprintf("the shortest break after %.0f s", f.ShortestBreakS)
	}
	fmt.Fprintf(w, "  spells without a valid point estimate: %d, held within %g° through %d (%s; longest held %.1f min)\n",
		f.Outages, f.HoldBoundDeg, f.OutagesHeld, brk, f.LongestHeldS/60)
}

// filterCSV is gyro_filter.csv: one row per unit written; nil without a
// filter.
func filterCSV(units []*sim.UnitResult) [][]string {
	if len(units) == 0 || units[0].Filter == nil {
		return nil
	}
	rows := [][]string{{"unit", "valid_fraction_of_run", "valid_fraction_of_shadow", "p50_error_deg", "p95_error_deg", "max_error_deg",
		"p95_error_in_shadow_deg", "p95_held_estimate_error_in_shadow_deg", "outages", "outages_held", "shortest_break_s",
		"longest_held_s", "starts", "hold_bound_deg"}}
	for _, u := range units {
		f := u.Filter
		rows = append(rows, []string{strconv.Itoa(u.Unit), ff(f.ValidFraction, 6), ff(f.ValidShadowFraction, 6), ff(f.Err.P50Deg, 4),
			ff(f.Err.P95Deg, 4), ff(f.Err.MaxDeg, 4), ff(f.ErrShadow.P95Deg, 4), ff(f.HoldLastShadow.P95Deg, 4),
			strconv.Itoa(f.Outages), strconv.Itoa(f.OutagesHeld), ff(f.ShortestBreakS, 1), ff(f.LongestHeldS, 1),
			strconv.Itoa(f.Starts), ff(f.HoldBoundDeg, 3)})
	}
	return rows
}
