package review

import (
	"math"
	"testing"
	"time"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// The headline row "p95 error reached by 95 % of N units" carries a
// verdict only under its own target (targets.max_error_p95_units_deg), and
// that verdict is one of the checks the banner and the exit status count:
// a row the verdict does not count never shows a pass or a failure
// (closed form: the row's value against limits just beyond and short of it).
func TestUnitsRowJudgedOnlyByItsTarget(t *testing.T) {
	s, cfg, res := shortRun(t, "nadir-6u-sso.yaml", 3*time.Hour, 4)
	au := res.AcrossUnits[0]
	if math.IsNaN(au.P95OfUnitP95Deg) || math.IsInf(au.P95OfUnitP95Deg, 0) {
		t.Fatalf("units p95 %v; the test needs a defined value", au.P95OfUnitP95Deg)
	}
	rad := au.P95OfUnitP95Deg * math.Pi / 180
	rowAndCheck := func() (pass *bool, counted bool) {
		rows, checks, err := headline(s, cfg, res)
		if err != nil {
			t.Fatal(err)
		}
		_, counted = study.FindTarget(checks, study.TargetErrorP95Units)
		return rowByPrefix(t, rows, "p95 error reached by 95 % of 4 units").Pass, counted
	}
	// The nominal p95 target alone, set below the units figure: the row
	// shows no verdict.
	s.Targets = scenario.Targets{MaxErrorP95Rad: rad * 0.5}
	if p, counted := rowAndCheck(); p != nil || counted {
		t.Errorf("max_error_p95_deg alone: row verdict %v, counted %v; want none", p, counted)
	}
	for _, c := range []struct {
		lim  float64
		pass bool
	}{{rad * 1.001, true}, {rad * 0.999, false}} {
		s.Targets = scenario.Targets{MaxErrorP95UnitsRad: c.lim}
		p, counted := rowAndCheck()
		if p == nil || *p != c.pass || !counted {
			t.Errorf("limit %.4f° for %.4f°: row verdict %v, counted %v; want %v, counted", c.lim*180/math.Pi, au.P95OfUnitP95Deg, p, counted, c.pass)
		}
	}
}
