package albedo

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// A mounting plane cuts the light from behind it: a plane along the
// boresight of a cone of ≤ 90° cuts nothing (but the edge cells' partial
// weights behind it, 1e-4 of the whole at most); the two half-spaces
// of any plane split a sensor's irradiance between them (clipped by n plus
// clipped by −n equals the whole, to rounding); and over the subsolar point
// a nadir plate cut by a vertical plane through nadir gets half of its
// albedo (mirror symmetry, closed form; the cell layout is symmetric to
// the sum's accuracy).
func TestMountingPlaneClipsTheIntegral(t *testing.T) {
	m, _ := New(Config{Cells: 4000})
	r := r3.Vec{X: EarthRadiusKm + 550}
	sun := r3.Vec{X: 1}
	tilt := r3.Unit(r3.Vec{X: -1, Y: 0.8, Z: 0.3})
	cases := []Sensor{
		{Normal: r3.Vec{X: -1}, HalfAngle: math.Pi / 2},
		{Normal: tilt, HalfAngle: 80 * math.Pi / 180},
		{Normal: r3.Unit(r3.Vec{X: -1, Z: 1}), HalfAngle: math.Pi / 2},
	}
	// Planes in general position: no cell centre lies on them.
	planes := []r3.Vec{r3.Unit(r3.Vec{X: 1e-9, Y: 1, Z: 0.013}), r3.Unit(r3.Vec{X: -0.2, Y: 1, Z: -0.4}), r3.Unit(r3.Vec{X: 0.3, Y: -0.017, Z: 1})}
	out := make([]Result, 1)
	at := func(s Sensor) float64 {
		m.Irradiance(out, r, sun, AUKm, 0, 2451545, []Sensor{s})
		return out[0].Irradiance
	}
	for i, s := range cases {
		whole := at(s)
		own := s
		own.Plane = s.Normal
		// Only the partial weights of cells straddling a 90° cone's edge,
		// whose centres lie behind the plane, may go.
		if got := at(own); math.Abs(got-whole) > 1e-4*whole || got > whole {
			t.Errorf("case %d: the boresight's own plane changes %g to %g", i, whole, got)
		}
		for _, n := range planes {
			a, b := s, s
			a.Plane, b.Plane = n, r3.Scale(-1, n)
			ea, eb := at(a), at(b)
			if math.Abs(ea+eb-whole) > 1e-9*whole || ea > whole || eb > whole {
				t.Errorf("case %d, plane %v: %g + %g, whole %g", i, n, ea, eb, whole)
			}
		}
	}
	half := cases[0]
	half.Plane = planes[0]
	if whole, got := at(cases[0]), at(half); math.Abs(got/whole-0.5) > 0.005 {
		t.Errorf("nadir plate cut through nadir: %.4f of the whole, want 0.5", got/whole)
	} else {
		t.Logf("nadir plate cut through nadir: %.5f of the whole", got/whole)
	}
}
