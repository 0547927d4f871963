package attitude

import (
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"sunsight/orbit"
)

// BenchmarkNadirSunPaths compares, in one run, the laws' attitude with the
// TRIAD path they used before (alignPair, then the offset).
func BenchmarkNadirSunPaths(b *testing.B) {
	s := orbit.State{R: r3.Vec{X: 6878, Y: 10}, V: r3.Vec{Y: 7.6, Z: 0.3}}
	sun := r3.Unit(r3.Vec{X: 1, Y: 2, Z: 0.5})
	custom := Nadir{NadirAxis: r3.Vec{Y: -1}, VelocityAxis: unitZ}
	for _, c := range []struct {
		name string
		f    func() r3.Rotation
	}{
		{"nadir/new", func() r3.Rotation { return Nadir{}.Attitude(0, s, sun) }},
		{"nadir/triad", func() r3.Rotation { return nadirTriad(Nadir{}, s) }},
		{"nadir-custom/new", func() r3.Rotation { return custom.Attitude(0, s, sun) }},
		{"nadir-custom/triad", func() r3.Rotation { return nadirTriad(custom, s) }},
		{"sun/new", func() r3.Rotation { return Sun{}.Attitude(0, s, sun) }},
		{"sun/triad", func() r3.Rotation { return sunTriad(Sun{}, 0, s, sun) }},
	} {
		b.Run(c.name, func(b *testing.B) {
			for b.Loop() {
				sinkRotation = c.f()
			}
		})
	}
}
