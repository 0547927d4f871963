package sensor

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// Readings of six noisy cosine sensors plus one estimate, per step.
func BenchmarkCubeStep(b *testing.B) {
	for _, c := range []struct {
		name string
		est  Estimator
	}{{"least-squares", LeastSquares{}}, {"opposite-pairs", OppositePairs{}}} {
		b.Run(c.name, func(b *testing.B) {
			a := cube(b, Errors{NoiseSigma: 0.003, ADCBits: 12, FullScale: 1.2})
			r := make([]Reading, a.Len())
			alb := make([]Albedo, a.Len())
			alb[5] = Albedo{Irradiance: 200, Dir: r3.Vec{Z: -1}}
			rng := rand.New(rand.NewPCG(1, 2))
			s := r3.Unit(r3.Vec{X: 0.4, Y: 0.5, Z: 0.7})
			b.ReportAllocs()
			for b.Loop() {
				a.Read(r, s, SolarConstant, alb, rng)
				_ = c.est.Estimate(a, r)
			}
		})
	}
}

// One quadrant reading (two bisection inversions).
func BenchmarkQuadrantRead(b *testing.B) {
	q := quad(b, 2, 1, 2, 0.1, Errors{NoiseSigma: 0.001})
	rng := rand.New(rand.NewPCG(1, 2))
	s := sunAt(0.2, -0.3)
	b.ReportAllocs()
	for b.Loop() {
		_ = q.Read(s, SolarConstant, Albedo{}, rng)
	}
}
