package orbit_test

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
)

const deg = math.Pi / 180

// Vallado, Fundamentals of Astrodynamics and Applications, 4th ed. 2013,
// Example 2-1 p. 66: M = 235.4°, e = 0.4 give E = 220.512074767522°.
func ExampleEccentricAnomaly_vallado() {
	E := orbit.EccentricAnomaly(235.4*deg, 0.4)
	fmt.Printf("E = %.6f°\n", E/deg)
	// Output: E = 220.512075°
}

// Vallado 2013, Example 2-5 pp. 114–116 (RV2COE): the orbit of a state
// vector. Published: p = 11067.790 km, e = 0.832853, i = 87.870°,
// Ω = 227.898°, ω = 53.38°, ν = 92.335° (printed here to the digits the
// computation and the book agree on: i to 0.01°, p to 0.1 km).
func ExampleConicFromState() {
	c := orbit.ConicFromState(orbit.State{
		R: r3.Vec{X: 6524.834, Y: 6862.875, Z: 6448.296},
		V: r3.Vec{X: 4.901327, Y: 5.533756, Z: -1.976341},
	})
	fmt.Printf("p = %.1f km, e = %.6f, i = %.2f°, Ω = %.3f°, ω = %.2f°, ν = %.3f°\n",
		c.SemiLatusRectumKm, c.Eccentricity, c.Inclination/deg, c.RAAN/deg, c.ArgPerigee/deg, c.TrueAnomaly/deg)
	// Output: p = 11067.8 km, e = 0.832853, i = 87.87°, Ω = 227.898°, ω = 53.38°, ν = 92.335°
}

// Vallado 2013, Example 2-6 p. 119 (COE2RV): the state of an orbit.
// Published: r = (6525.368, 6861.532, 6449.119) km,
// v = (4.902279, 5.533140, −1.975710) km/s.
func ExampleStateFromConic() {
	s := orbit.StateFromConic(orbit.Conic{SemiLatusRectumKm: 11067.790, Eccentricity: 0.83285, Inclination: 87.87 * deg,
		RAAN: 227.89 * deg, ArgPerigee: 53.38 * deg, TrueAnomaly: 92.335 * deg})
	fmt.Printf("r = (%.3f, %.3f, %.3f) km\nv = (%.6f, %.6f, %.6f) km/s\n", s.R.X, s.R.Y, s.R.Z, s.V.X, s.V.Y, s.V.Z)
	// Output:
	// r = (6525.368, 6861.532, 6449.119) km
	// v = (4.902279, 5.533140, -1.975710) km/s
}
