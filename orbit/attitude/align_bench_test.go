package attitude

import (
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
)

// triadNadir and triadSun are the laws as built before alignAxes, for the
// comparison below.
type (
	triadNadir struct{ Nadir }
	triadSun   struct{ Sun }
)

func (l triadNadir) Attitude(_ float64, s orbit.State, _ r3.Vec) r3.Rotation {
	return nadirTriad(l.Nadir, s)
}

func (l triadSun) Attitude(t float64, s orbit.State, sunDir r3.Vec) r3.Rotation {
	return sunTriad(l.Sun, t, s, sunDir)
}

// BenchmarkNadirSunPaths compares, in one run, the laws with the TRIAD
// path they used before, called through the Law interface as the
// simulation loop calls them (it type-asserts EclipseAware once, outside
// the loop; At would add its assertion to every call).
func BenchmarkNadirSunPaths(b *testing.B) {
	s := orbit.State{R: r3.Vec{X: 6878, Y: 10}, V: r3.Vec{Y: 7.6, Z: 0.3}}
	sun := r3.Unit(r3.Vec{X: 1, Y: 2, Z: 0.5})
	custom := Nadir{NadirAxis: r3.Vec{Y: -1}, VelocityAxis: unitZ}
	offset := Nadir{Offset: FromEuler(Seq321, 0, 0.1, 0)}
	for _, c := range []struct {
		name string
		law  Law
	}{
		{"nadir/new", Nadir{}},
		{"nadir/triad", triadNadir{Nadir{}}},
		{"nadir-custom/new", custom},
		{"nadir-custom/triad", triadNadir{custom}},
		{"nadir-offset/new", offset},
		{"nadir-offset/triad", triadNadir{offset}},
		{"sun/new", Sun{}},
		{"sun/triad", triadSun{Sun{}}},
	} {
		b.Run(c.name, func(b *testing.B) {
			t := 0.0
			for b.Loop() {
				sinkRotation = c.law.Attitude(t, s, sun)
				t += 10
			}
		})
	}
}
