package study

import (
	"context"
	"os"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// benchSingleFailure loads the bundled 6U example (seven sensors, uniform
// albedo) shortened to 12 h with the single-failure study on.
func benchSingleFailure(b *testing.B) (*scenario.Scenario, sim.Config) {
	text, err := os.ReadFile("../../examples/nadir-6u-sso.yaml")
	if err != nil {
		b.Fatal(err)
	}
	s, err := scenario.Parse(text, "../../examples")
	if err != nil {
		b.Fatal(err)
	}
	s.Duration = scenario.Span(12 * 3600e9)
	s.Targets.NMinus1.Set = true
	cfg, err := Config(s)
	if err != nil {
		b.Fatal(err)
	}
	return s, cfg
}

// The study as run makes it: the geometry recorded once, each failed layout
// replaying only its sensor readings. Compare with the full runs below in
// one invocation: go test ./scenario/study -run - -bench SingleFailure
func BenchmarkSingleFailureTrace(b *testing.B) {
	s, cfg := benchSingleFailure(b)
	for b.Loop() {
		if _, err := RunSingleFailure(context.Background(), s, cfg); err != nil {
			b.Fatal(err)
		}
	}
}

// The same failed layouts, each a full run of the reduced sensor list.
func BenchmarkSingleFailureFullRuns(b *testing.B) {
	s, cfg := benchSingleFailure(b)
	for b.Loop() {
		for i := range s.Body.Sensors {
			if _, err := runWithout(context.Background(), s, cfg, i); err != nil {
				b.Fatal(err)
			}
		}
	}
}

// One unfailed run of the same scenario, for scale.
func BenchmarkSingleFailureBaseRun(b *testing.B) {
	_, cfg := benchSingleFailure(b)
	for b.Loop() {
		if _, err := sim.Run(context.Background(), cfg); err != nil {
			b.Fatal(err)
		}
	}
}
