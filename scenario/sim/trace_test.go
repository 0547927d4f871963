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
	cfg.NoAlbedoTable = true // a trace integrates the albedo; so does the run compared
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

// RunWithFilter flies the gyro-aided filter on the subset's readings: the
// figures, the filter's included, are those of a full run with only that
// subset flown (same gyro draws); Run scores without the filter.
func TestTraceRunWithFilterEqualsFullRun(t *testing.T) {
	cfg := referenceCase(t, 0.5, true)
	cfg.Units = 2
	cfg.NoAlbedoTable = true
	cfg.Filter = filterConfig()
	// Least squares first: the filter starts from the primary estimate,
	// and opposite pairs gives none with a face sensor failed.
	cfg.Estimators = []sensor.Estimator{sensor.LeastSquares{}, sensor.OppositePairs{}}
	cfg.Array = faceArray(t, 90) // three faces in the sun: least squares valid with one failed
	tr, err := NewTrace(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	subset := []int{0, 1, 2, 4, 5} // -Y failed
	got, err := tr.RunWithFilter(context.Background(), subset, cfg.Estimators, cfg.Units)
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
	if got.Nominal.Filter == nil || got.Nominal.Filter.Err.N == 0 {
		t.Fatalf("the replay flew no filter: %+v", got.Nominal.Filter)
	}
	for u := range got.Units {
		if a, b := fmt.Sprintf("%+v", *got.Units[u].Filter), fmt.Sprintf("%+v", *want.Units[u].Filter); a != b {
			t.Fatalf("unit %d: replayed filter\n%s\nfull run\n%s", u, a, b)
		}
		got.Units[u].Filter, want.Units[u].Filter = nil, nil // compared; showUnits prints the pointer
	}
	if a, b := showUnits(got), showUnits(want); a != b {
		t.Fatalf("replay differs from the full run:\n%s\n%s", a, b)
	}
	plain, err := tr.Run(context.Background(), subset, cfg.Estimators, cfg.Units)
	if err != nil {
		t.Fatal(err)
	}
	if plain.Nominal.Filter != nil {
		t.Error("Run flew the filter")
	}
}

// Replaying the whole layout with another error model (a budget case) gives
// the figures of a full run with that array, with and without albedo, on one
// and two workers; an array of other mounts is refused.
func TestTraceRunArrayEqualsFullRun(t *testing.T) {
	cfg := referenceCase(t, 0.5, true)
	cfg.Units = 3
	cfg.NoAlbedoTable = true // a trace integrates the albedo; so does the run compared
	tr, err := NewTrace(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	noisy := noisyFaceArray(t, 60)
	for _, withAlbedo := range []bool{true, false} {
		full := cfg
		full.Array = noisy
		if !withAlbedo {
			full.NewAlbedo = nil
		}
		want, err := Run(context.Background(), full)
		if err != nil {
			t.Fatal(err)
		}
		for _, w := range []int{1, 2} {
			tr.cfg.Workers = w
			got, err := tr.RunArray(context.Background(), noisy, withAlbedo, cfg.Units)
			if err != nil {
				t.Fatal(err)
			}
			if a, b := showUnits(got), showUnits(want); a != b {
				t.Fatalf("albedo %v, %d workers: replay differs from the full run:\n%s\n%s", withAlbedo, w, a, b)
			}
		}
	}
	if _, err := tr.RunArray(context.Background(), noisyFaceArray(t, 70), true, 1); err == nil {
		t.Fatal("an array with other fields of view was replayed")
	}
}
