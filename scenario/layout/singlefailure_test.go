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
