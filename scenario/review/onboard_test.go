package review

import (
	"context"
	"math"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// The report carries the on-board correction's table, with the run's own
// residual and the plain statement of what it means, and its models row,
// when the scenario has an on-board albedo model; neither without one.
func TestReportShowsTheOnboardCorrection(t *testing.T) {
	s, err := scenario.Load(filepath.Join("..", "..", "examples", "nadir-6u-sso.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	s.Duration = scenario.Span(2 * time.Hour)
	if _, ok := onboardTable(s, nil); ok {
		t.Error("an on-board table without albedo.onboard")
	}
	ob := s.Albedo
	s.Albedo.Onboard = &ob // the truth's own model
	cfg, err := study.Config(s)
	if err != nil {
		t.Fatal(err)
	}
	res, err := sim.Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	ot, ok := onboardTable(s, res)
	if !ok || len(ot.Rows) != len(s.Estimators) {
		t.Fatalf("on-board table %v rows for %d estimators", ot.Rows, len(s.Estimators))
	}
	want := num(res.Nominal.Estimators[0].Corrected.ResidualPart.P95Deg, 2)
	if ot.Rows[0][6] != want {
		t.Errorf("residual of the primary %q, want %s", ot.Rows[0][6], want)
	}
	if !strings.Contains(ot.Note, "perfect by construction") || !strings.Contains(ot.Note, "two-axis sensors pass uncorrected") {
		t.Errorf("note %q", ot.Note)
	}
	found := false
	for _, a := range ModelsAndSources(s) {
		found = found || strings.HasPrefix(a.Model, "Albedo on board")
	}
	if !found {
		t.Error("no on-board albedo row in the models table")
	}
}

// The timeline figure draws the on-board corrected error when the scenario
// has an on-board model (mission-6u: a uniform model against a zonal
// truth), sample for sample the run's short series, and says its peak;
// without one (nadir-6u-sso) it has no such series.
func TestTimelineDrawsTheOnboardCorrectedError(t *testing.T) {
	_, cfg, res := shortRun(t, "mission-6u.yaml", 3*time.Hour, 1)
	tl, err := timeline(cfg, res)
	if err != nil {
		t.Fatal(err)
	}
	ser := res.Nominal.Timeline
	if len(tl.ErrCorrectedDeg) != len(tl.T) {
		t.Fatalf("%d corrected errors for %d samples", len(tl.ErrCorrectedDeg), len(tl.T))
	}
	finite := 0
	for i, v := range tl.ErrCorrectedDeg {
		if !(v == ser.ErrCorrDeg[i] || math.IsNaN(v) && math.IsNaN(ser.ErrCorrDeg[i])) {
			t.Fatalf("sample %d: drawn %g°, series %g°", i, v, ser.ErrCorrDeg[i])
		}
		if !math.IsNaN(v) {
			finite++
		}
	}
	if finite < len(tl.T)/3 {
		t.Errorf("corrected error on %d of %d samples", finite, len(tl.T))
	}
	if tells := timelineTells(tl, &res.Nominal.Estimators[0], cfg.TimelineStride, true, figureTargets{}); !strings.Contains(tells, "after the on-board albedo correction") {
		t.Errorf("caption %q", tells)
	}
	_, cfg, res = shortRun(t, "nadir-6u-sso.yaml", 2*time.Hour, 1)
	if tl, err = timeline(cfg, res); err != nil || tl.ErrCorrectedDeg != nil {
		t.Errorf("without albedo.onboard: %d corrected errors (%v)", len(tl.ErrCorrectedDeg), err)
	}
}
