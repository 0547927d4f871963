package attitude

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
)

var sinkRotation r3.Rotation

func BenchmarkAttitude(b *testing.B) {
	s := orbit.State{R: r3.Vec{X: 6878, Y: 10}, V: r3.Vec{Y: 7.6, Z: 0.3}}
	sun := r3.Unit(r3.Vec{X: 1, Y: 2, Z: 0.5})
	laws := []struct {
		name string
		law  Law
	}{
		{"nadir", Nadir{}},
		{"sun", Sun{}},
		{"sun-spin", Sun{SpinRate: 0.1}},
		{"inertial", InertialFromEuler(Seq321, 0.1, 0.2, 0.3)},
		{"spin", Spin{Axis: unitY, Rate: math.Pi / 30}},
		{"tumble", NewTumble(1, 0.17)},
		{"isotropic", Isotropic{Seed: 1}},
		{"schedule", Schedule{Sunlit: Sun{}, Eclipse: Inertial{}}},
	}
	for _, l := range laws {
		b.Run(l.name, func(b *testing.B) {
			b.ReportAllocs()
			t := 0.0
			for b.Loop() {
				sinkRotation = At(l.law, t, s, sun, false)
				t += 10
			}
		})
	}
}
