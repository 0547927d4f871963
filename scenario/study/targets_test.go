package study

import (
	"math"
	"strings"
	"testing"
	"time"

	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// The verdict counts the checks of the one target judge and names the
// failed ones (closed form: counting).
func TestJudgeVerdict(t *testing.T) {
	s := &scenario.Scenario{}
	s.Targets.MinValidFraction = 0.95
	s.Targets.MaxErrorP95Rad = 5 * math.Pi / 180
	s.Targets.MaxGap = scenario.Span(10 * time.Minute)
	h := sim.Headline{Estimator: "combined", ValidFraction: 0.962, P95NoAlbedoDeg: 2.1, P95AlbedoDeg: 15.29, LongestGapS: 110}
	checks := CheckTargets(s, h, sky.Result{})
	v := Judge(checks)
	if v.Total != 3 || v.Failed != 1 || v.Met() || v.Status() != "failed" {
		t.Fatalf("verdict %+v, want 1 of 3 failed", v)
	}
	if len(v.FailedKeys) != 1 || v.FailedKeys[0] != TargetErrorP95 {
		t.Errorf("failed keys %v, want [%s]", v.FailedKeys, TargetErrorP95)
	}
	if got := v.Text(); got != "1 of 3 targets failed: p95 sun-vector error (combined)" {
		t.Errorf("text %q", got)
	}
	gap, _ := FindTarget(checks, TargetGap)
	if gap.Required != "≤ 600 s" || gap.Value != "110 s" {
		t.Errorf("gap target in mixed units: required %q, value %q (want seconds both)", gap.Required, gap.Value)
	}

	h.P95AlbedoDeg = 4
	if v := Judge(CheckTargets(s, h, sky.Result{})); !v.Met() || v.Text() != "all 3 targets met" || v.Status() != "met" {
		t.Errorf("all met: %+v %q", v, v.Text())
	}
	h.P95AlbedoDeg, h.P95NoAlbedoDeg = math.NaN(), math.NaN()
	c, _ := FindTarget(CheckTargets(s, h, sky.Result{}), TargetErrorP95)
	if c.Pass || c.Value != Missing {
		t.Errorf("undefined p95: pass %v value %q, want a failure shown as %q", c.Pass, c.Value, Missing)
	}
	// The units target: its own limit, on the units figure; units without
	// any valid estimate (+Inf) fail it, shown as undefined.
	s.Targets = scenario.Targets{MaxErrorP95UnitsRad: 5 * math.Pi / 180}
	for _, c := range []struct {
		units float64
		pass  bool
		value string
	}{{4.99, true, "4.99°"}, {5.01, false, "5.01°"}, {math.Inf(1), false, Missing}, {math.NaN(), false, Missing}} {
		h.UnitsP95Deg = c.units
		u, ok := FindTarget(CheckTargets(s, h, sky.Result{}), TargetErrorP95Units)
		if !ok || u.Pass != c.pass || u.Value != c.value {
			t.Errorf("units p95 %v: check %+v (found %v); want pass %v, value %q", c.units, u, ok, c.pass, c.value)
		}
	}
	if v := Judge(nil); !v.Met() || v.Status() != "no-targets" || !strings.Contains(v.Text(), "no targets") {
		t.Errorf("no targets: %+v %q", v, v.Text())
	}
}
