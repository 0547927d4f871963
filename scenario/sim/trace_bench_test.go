package sim

import (
	"context"
	"testing"
)

// BenchmarkTraceRun scores four of six candidates over a recorded day
// (8641 steps at 10 s, uniform albedo), the unit of work of a layout search.
func BenchmarkTraceRun(b *testing.B) {
	cfg := referenceCase(b, 1, true)
	tr, err := NewTrace(context.Background(), cfg)
	if err != nil {
		b.Fatal(err)
	}
	subset := []int{0, 1, 4, 5}
	for b.Loop() {
		if _, err := tr.Run(context.Background(), subset, cfg.Estimators, 1); err != nil {
			b.Fatal(err)
		}
	}
}
