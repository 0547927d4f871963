package filter

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// One step as the engine runs it: a gyro propagation, six cosine readings
// and a two-axis reading.
func step(f *Filter, g *Gyro, rng *rand.Rand, s r3.Vec) {
	f.Propagate(g.Measure(r3.Vec{X: 0.01, Y: -0.02, Z: 0.03}, 1, rng), 1)
	for _, n := range cube {
		f.Cosine(n, r3.Dot(n, s), 0.01)
	}
	f.Direction(s, 0.001)
}

// started is a started filter, its gyro, their random source and the sun.
func started() (*Filter, *Gyro, *rand.Rand, r3.Vec) {
	f, _ := New(settings())
	rng := rand.New(rand.NewPCG(1, 1))
	g := NewGyro(1e-4, 1e-5, 300, rng)
	s := r3.Unit(r3.Vec{X: 1, Y: 2, Z: 3})
	f.Start(s)
	return f, &g, rng, s
}

func TestStepAllocatesNothing(t *testing.T) {
	f, g, rng, s := started()
	if n := testing.AllocsPerRun(100, func() { step(f, g, rng, s) }); n != 0 {
		t.Errorf("a filter step allocates %.0f times", n)
	}
}

func BenchmarkFilterStep(b *testing.B) {
	f, g, rng, s := started()
	for b.Loop() {
		step(f, g, rng, s)
	}
}
