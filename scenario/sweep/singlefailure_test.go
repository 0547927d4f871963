package sweep

import (
	"context"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

const singleFailureCase = "duration: 2h\nstep: 30s\norbit: {altitude_km: 550, ltan: \"10:30\"}\nattitude: {law: nadir}\n" +
	"estimators: [least-squares]\nbody:\n  sensors:\n" +
	"    - {name: a, kind: cosine, face: \"+X\"}\n    - {name: b, kind: cosine, face: \"-X\"}\n" +
	"    - {name: c, kind: cosine, face: \"+Y\"}\n    - {name: d, kind: cosine, face: \"-Y\"}\n" +
	"    - {name: e, kind: cosine, face: \"+Z\"}\n    - {name: f, kind: cosine, face: \"-Z\"}\n" +
	"targets: {n_minus_1: {min_valid_fraction: 0.99}}\n"

// A sweep case judges targets.n_minus_1 as run does (a six-face cube
// loses directions with any face failed: the 99 % target fails).
func TestCaseJudgesSingleFailure(t *testing.T) {
	s, err := scenario.Parse([]byte(singleFailureCase), "")
	if err != nil {
		t.Fatal(err)
	}
	out, err := RunCase(context.Background(), s, 1)
	if err != nil {
		t.Fatal(err)
	}
	c, ok := study.FindTarget(out.Targets, study.TargetNMinus1Valid)
	t.Logf("%+v", c)
	if !ok || c.Pass {
		t.Errorf("targets %+v: want %s judged and failed", out.Targets, study.TargetNMinus1Valid)
	}
}
