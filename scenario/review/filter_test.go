package review

import (
	"strings"
	"testing"
	"time"
)

// The report carries the filter's table and its models row when the
// scenario flies a gyro_filter block, and neither without it; the table
// shows the run's own numbers.
func TestReportShowsTheFilter(t *testing.T) {
	s, _, res := shortRun(t, "tumbling-3u.yaml", 3*time.Hour, 2)
	ft, ok := filterTable(s, res)
	if !ok {
		t.Fatal("no filter table for a scenario with a gyro_filter block")
	}
	want := num(res.Nominal.Filter.ErrShadow.P95Deg, 2)
	if !strings.Contains(strings.Join(ft.Rows[2], " "), want) {
		t.Errorf("eclipse p95 row %q does not show %s", ft.Rows[2], want)
	}
	found := false
	for _, a := range ModelsAndSources(s) {
		found = found || strings.Contains(a.Model, "gyro-aided filter")
	}
	if !found {
		t.Error("no gyro-aided filter row in the models table")
	}
	s2, _, res2 := shortRun(t, "nadir-6u-sso.yaml", time.Hour, 1)
	if _, ok := filterTable(s2, res2); ok {
		t.Error("a filter table without a gyro_filter block")
	}
}
