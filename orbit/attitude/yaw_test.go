package attitude

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
)

// Yaw steering (by definition): +Z stays on nadir exactly and the yaw turns
// the sun into the body XZ plane, on the +X side; the pointing of +Z is the
// same as plain nadir pointing.
func TestNadirYawSteering(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 9))
	unit := func() r3.Vec {
		return r3.Unit(r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()})
	}
	for range 200 {
		s := orbit.State{R: r3.Scale(7000, unit()), V: r3.Scale(7.5, unit())}
		sun := unit()
		for _, l := range []RowsLaw{Nadir{YawToSun: true}, Nadir{YawToSun: true, NadirAxis: r3.Vec{X: -1}, VelocityAxis: r3.Vec{Y: 1}}} {
			n := l.(Nadir)
			q := l.Attitude(0, s, sun)
			nb := q.Rotate(r3.Scale(-1/r3.Norm(s.R), s.R))
			if d := r3.Norm(r3.Sub(nb, orDefault(n.NadirAxis, unitZ))); d > 1e-12 {
				t.Fatalf("nadir off the nadir axis by %g", d)
			}
			sb := q.Rotate(sun)
			normal := r3.Cross(orDefault(n.NadirAxis, unitZ), orDefault(n.VelocityAxis, unitX))
			if c := r3.Dot(sb, normal); math.Abs(c) > 1e-12 {
				t.Fatalf("sun %g out of the plane of the two axes", c)
			}
			if r3.Dot(sb, orDefault(n.VelocityAxis, unitX)) < -1e-12 {
				t.Fatalf("sun on the −align side")
			}
			// Rows is the matrix of Attitude.
			m, want := l.Rows(0, s, sun), RowsOf(q)
			for i := range 3 {
				if d := r3.Norm(r3.Sub(m[i], want[i])); d > 1e-12 {
					t.Fatalf("Rows row %d off by %g", i, d)
				}
			}
		}
	}
}
