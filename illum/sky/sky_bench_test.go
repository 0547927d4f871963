package sky

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

func tenCones() []Viewer {
	lat, _ := Fibonacci(10)
	v := make([]Viewer, len(lat.Dirs))
	for i, d := range lat.Dirs {
		v[i] = NewCone(d, 60*math.Pi/180)
	}
	return v
}

var sinkResult Result
var sinkGrid Grid

func BenchmarkMap1Deg10Cones(b *testing.B) {
	v := tenCones()
	for b.Loop() {
		sinkGrid, _ = Map(v, 1)
	}
}

func BenchmarkCoverageDefault10Cones(b *testing.B) {
	v := tenCones()
	lat, _ := Fibonacci(DefaultPoints)
	for b.Loop() {
		sinkResult, _ = Coverage(v, lat)
	}
}

func BenchmarkObstructedSees(b *testing.B) {
	o := Obstructed{View: NewCone(r3.Vec{Z: 1}, 1.4), Obstacles: []Obstacle{
		Rectangle{Centre: r3.Vec{X: 0.3, Z: 0.1}, HalfU: r3.Vec{X: 0.1}, HalfV: r3.Vec{Y: 0.2}},
		Cylinder{A: r3.Vec{Y: 0.1}, B: r3.Vec{Y: 0.1, Z: 0.5}, Radius: 0.01},
	}}
	d := r3.Unit(r3.Vec{X: 0.2, Y: 0.1, Z: 1})
	b.ReportAllocs()
	n := 0
	for b.Loop() {
		if o.Sees(d) {
			n++
		}
	}
	_ = n
}
