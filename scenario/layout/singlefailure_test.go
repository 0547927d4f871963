package layout

import (
	"context"
	"os"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
)

// The layout search does not judge targets.n_minus_1: it refuses the block
// rather than ignore it.
func TestEvaluatorRefusesSingleFailureTargets(t *testing.T) {
	b, err := os.ReadFile("../../examples/layout-6u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	s, err := scenario.Parse(b, "../../examples")
	if err != nil {
		t.Fatal(err)
	}
	s.Targets.NMinus1.Set = true
	if _, err := Evaluator(context.Background(), s); err == nil || !strings.Contains(err.Error(), "targets.n_minus_1") {
		t.Errorf("error %v, want one naming targets.n_minus_1", err)
	}
}

// A timeline phase that ends on the sun seen is planned on the sensors that
// fly, so one timeline planned with every candidate would not be the
// subset's: the search refuses it, naming the phase, rather than replay it.
func TestEvaluatorRefusesSensorPlannedTimeline(t *testing.T) {
	b, err := os.ReadFile("../../examples/mission-6u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	s, err := scenario.Parse(b, "../../examples")
	if err != nil {
		t.Fatal(err)
	}
	s.Targets.NMinus1 = scenario.NMinus1{}
	s.Body.Candidates = s.Body.Sensors
	_, err = Evaluator(context.Background(), s)
	if err == nil || !strings.Contains(err.Error(), "timeline.phases[2] (sun acquisition).until") {
		t.Errorf("error %v, want one naming timeline.phases[2] (sun acquisition).until", err)
	}
}
