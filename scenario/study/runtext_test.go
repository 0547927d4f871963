package study

import (
	"context"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// runText parses a scenario text, builds it as run does and runs it.
func runText(t *testing.T, text string) *sim.Result {
	t.Helper()
	s, err := scenario.Parse([]byte(text), ".")
	if err != nil {
		t.Fatal(err)
	}
	return runScenario(t, s)
}

// runScenario builds a parsed scenario as run does and runs it.
func runScenario(t *testing.T, s *scenario.Scenario) *sim.Result {
	t.Helper()
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	res, err := sim.Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	return res
}
