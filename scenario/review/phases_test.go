package review

import (
	"math"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	plan "codeberg.org/sunsight/sunsight/orbit/timeline"
	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// With a gyro_filter block the report's timeline table has the filter's
// columns, filled from each phase's span of the run's filter; without one
// it has none. Every row, "not reached" included, has the header's width.
func TestPhasesTableCarriesTheFilter(t *testing.T) {
	s, err := scenario.Load(filepath.Join("..", "..", "examples", "mission-6u.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	spans := []plan.Span{{Name: "deployment", Phase: 0, Start: 0, End: 1800, Met: true}, {Name: "detumble", Phase: 1, Start: 1800, End: 3600}}
	ph := study.Phases{Reached: 2, Phases: []study.PhaseResult{
		{Span: spans[0], Samples: 180, Filter: &sim.FilterSpanStats{Samples: 180, ValidFraction: 0.75, ValidShadowFraction: math.NaN(),
			Err: sim.ErrorStats{N: 135, P95Deg: 3.25}, ErrShadow: sim.ErrorStats{P95Deg: math.NaN()}}},
		{Span: spans[1], Samples: 180, Filter: &sim.FilterSpanStats{Samples: 180, ValidFraction: 1, ValidShadowFraction: 1,
			Err: sim.ErrorStats{N: 180, P95Deg: 4.5}, ErrShadow: sim.ErrorStats{N: 60, P95Deg: 1.125}}},
	}}
	for _, filt := range []bool{true, false} {
		s.GyroFilter.Set = filt
		var r plots.Report
		AddPhases(&r, s, ph)
		tb := r.Tables[0]
		if got := slices.Contains(tb.Header, "Filter p95 (°)"); got != filt {
			t.Errorf("filter %v: header %v", filt, tb.Header)
		}
		for _, row := range tb.Rows {
			if len(row) != len(tb.Header) {
				t.Errorf("filter %v: row %v for a header of %d", filt, row, len(tb.Header))
			}
		}
		if !filt {
			continue
		}
		n := len(tb.Header)
		if got := strings.Join(tb.Rows[0][n-3:], " "); got != "75.0 3.25 "+study.Missing {
			t.Errorf("deployment filter cells %q", got)
		}
		if got := strings.Join(tb.Rows[1][n-3:], " "); got != "100.0 4.50 1.12" && got != "100.0 4.50 1.13" {
			t.Errorf("detumble filter cells %q", got)
		}
		if tb.Rows[len(tb.Rows)-1][1] != "not reached" {
			t.Errorf("last row %v", tb.Rows[len(tb.Rows)-1])
		}
	}
}
