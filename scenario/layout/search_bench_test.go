package layout

import (
	"context"
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// BenchmarkSearch20 is the search cost alone (Evaluate is free) over 20
// candidates: the six faces and 14 tilted mounts, 70° cones, ≥ 2 coverage.
func BenchmarkSearch20(b *testing.B) {
	axes := append([]r3.Vec(nil), faces...)
	for i := range 14 {
		θ := 2 * math.Pi * float64(i) / 14
		axes = append(axes, r3.Vec{X: math.Cos(θ), Y: math.Sin(θ), Z: 0.5 * math.Cos(3*θ)})
	}
	p := Problem{Viewers: cones(axes, 70), CoverageSensors: 2, MinCoverage: 0.9, MaxSensors: 6, Evaluate: always}
	for b.Loop() {
		if _, err := Search(context.Background(), p); err != nil {
			b.Fatal(err)
		}
	}
}
