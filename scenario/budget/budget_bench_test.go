package budget

import (
	"context"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
)

// BenchmarkBootstrap is the bootstrap of a budget with 8 sources and 64 units.
func BenchmarkBootstrap(b *testing.B) {
	w := make([]float64, 64)
	for i := range w {
		w[i] = 1 + 0.01*float64(i%7)
	}
	run := fakeRun([NumSources]float64{Noise: 0.3, Gain: 0.2, DarkOffset: 0.1, Misalignment: 0.4, Albedo: 1}, w)
	srcs := []Source{Noise, Gain, DarkOffset, Misalignment, Albedo}
	for b.Loop() {
		if _, err := Decompose(context.Background(), run, srcs); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkRunCase compares one budget case without and with albedo (the
// albedo integral dominates a budget's cost).
func BenchmarkRunCase(b *testing.B) {
	s, err := scenario.Load("testdata/inertial-4css.yaml")
	if err != nil {
		b.Fatal(err)
	}
	r, err := NewRunner(s, Options{Units: 4})
	if err != nil {
		b.Fatal(err)
	}
	for _, bc := range []struct {
		name string
		c    Case
	}{{"noise-only", Only(Noise)}, {"all-with-albedo", All()}} {
		b.Run(bc.name, func(b *testing.B) {
			for b.Loop() {
				if _, err := r.Run(context.Background(), bc.c); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
