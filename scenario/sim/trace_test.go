package sim

import (
	"context"
	"fmt"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/illum/sensor"
)

// showUnits prints unit results with %v (NaN equals NaN there).
func showUnits(r *Result) string {
	var b strings.Builder
	for _, u := range r.Units {
		uc := *u
		uc.Estimators = nil
		fmt.Fprintf(&b, "%+v\n", uc)
		for _, e := range u.Estimators {
			e.errNo, e.errAlb = nil, nil
			fmt.Fprintf(&b, "%+v\n", e)
		}
	}
	return b.String()
}

// Replaying a subset of the candidates over a recorded trace gives the same
// figures as a full run with only that subset flown.
func TestTraceReplayEqualsFullRun(t *testing.T) {
	cfg := referenceCase(t, 0.5, true)
	cfg.Units = 2
	tr, err := NewTrace(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	subset := []int{0, 1, 4, 5} // ±X, ±Z
	got, err := tr.Run(context.Background(), subset, cfg.Estimators, cfg.Units)
	if err != nil {
		t.Fatal(err)
	}
	var ss []sensor.Sensor
	for _, i := range subset {
		ss = append(ss, cfg.Array.Sensors()[i])
	}
	full := cfg
	if full.Array, err = sensor.NewArray(ss...); err != nil {
		t.Fatal(err)
	}
	want, err := Run(context.Background(), full)
	if err != nil {
		t.Fatal(err)
	}
	if a, b := showUnits(got), showUnits(want); a != b {
		t.Fatalf("replay differs from the full run:\n%s\n%s", a, b)
	}
	if fmt.Sprint(got.Headline()) != fmt.Sprint(want.Headline()) {
		t.Fatal("headlines differ")
	}
}
