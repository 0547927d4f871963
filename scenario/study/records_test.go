package study

import (
	"encoding/json"
	"math"
	"testing"
	"time"

	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// The numeric target records carry the operator, the limit and the value in
// the stated unit, and a margin in that unit that is positive exactly when
// the target is met (closed form: subtraction); an undefined value is null.
func TestTargetRecords(t *testing.T) {
	s := &scenario.Scenario{}
	s.Targets.MinValidFraction = 0.95
	s.Targets.MaxErrorP95Rad = 5 * math.Pi / 180
	s.Targets.MaxGap = scenario.Span(10 * time.Minute)
	h := sim.Headline{Estimator: "combined", ValidFraction: 0.962, P95NoAlbedoDeg: 2.1, P95AlbedoDeg: 15.29, LongestGapS: 110}
	want := map[string]struct {
		op, unit      string
		req, val, mrg float64
		pass          bool
	}{
		TargetValid:    {OpAtLeast, UnitFraction, 0.95, 0.962, 0.012, true},
		TargetErrorP95: {OpAtMost, UnitDeg, 5, 15.29, -10.29, false},
		TargetGap:      {OpAtMost, UnitSeconds, 600, 110, 490, true},
	}
	recs := Records(CheckTargets(s, h, sky.Result{}))
	if len(recs) != len(want) {
		t.Fatalf("%d records, want %d", len(recs), len(want))
	}
	for _, r := range recs {
		w := want[r.Key]
		if r.Op != w.op || r.Unit != w.unit || math.Abs(r.Required-w.req) > 1e-9 || r.Value == nil ||
			math.Abs(*r.Value-w.val) > 1e-9 || math.Abs(*r.Margin-w.mrg) > 1e-9 || r.Pass != w.pass || (*r.Margin >= 0) != r.Pass {
			t.Errorf("%s: %+v (value %v margin %v), want %+v", r.Key, r, *r.Value, *r.Margin, w)
		}
	}
	h.P95AlbedoDeg, h.P95NoAlbedoDeg = math.NaN(), math.NaN()
	c, _ := FindTarget(CheckTargets(s, h, sky.Result{}), TargetErrorP95)
	b, err := json.Marshal(c.Record())
	if err != nil {
		t.Fatal(err)
	}
	if got := string(b); got != `{"key":"error-p95","label":"p95 sun-vector error (combined)","op":"\u003c=","required":5,"value":null,"unit":"deg","pass":false,"margin":null}` {
		t.Errorf("undefined p95 record: %s", got)
	}
}
