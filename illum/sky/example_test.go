package sky_test

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/sky"
)

// Six sensors of 60° half-angle on the faces of a cube-shaped body: the
// whole sphere is seen by at least one, about 47 % by two and 2.6 % by
// three (testdata/six_cones.csv: 1, 0.47356, 0.02644). By symmetry each
// sensor alone sees one sixth of the rest, so losing any one leaves
// 1 − (1 − 0.47356)/6 = 0.91226 seen (closed form from the reference).
func ExampleCoverage() {
	deg := math.Pi / 180
	var v []sky.Viewer
	for _, a := range []r3.Vec{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}, {Z: 1}, {Z: -1}} {
		v = append(v, sky.NewCone(a, 60*deg))
	}
	lat, _ := sky.Fibonacci(sky.DefaultPoints)
	r, _ := sky.Coverage(v, lat)
	fmt.Printf("seen by >=1: %.3f, >=2: %.3f, >=3: %.3f\n", r.AtLeast[1], r.AtLeast[2], r.AtLeast[3])
	fmt.Printf("one failed, >=1: %.3f\n", r.WorstOneFailed[1])
	// Output:
	// seen by >=1: 1.000, >=2: 0.474, >=3: 0.026
	// one failed, >=1: 0.912
}

// A sensor on the +Z face under a deployed panel edge.
func ExampleObstructed() {
	deg := math.Pi / 180
	cone := sky.NewCone(r3.Vec{Z: 1}, 80*deg)
	panel := sky.Rectangle{Centre: r3.Vec{X: 0.3, Z: 0.1}, HalfU: r3.Vec{X: 0.1}, HalfV: r3.Vec{Y: 0.2}}
	hidden := sky.Obstructed{View: cone, Position: r3.Vec{}, Obstacles: []sky.Obstacle{panel}}
	fmt.Println(hidden.Sees(r3.Vec{Z: 1}), hidden.Sees(r3.Unit(r3.Vec{X: 1, Z: 0.33})))
	// Output:
	// true false
}
