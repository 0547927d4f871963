package orbit

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// Vallado 4th ed. (2013) Example 2-5 pp. 114–116 (RV2COE), μ = 398600.4418.
func TestConicFromStateVallado2_5(t *testing.T) {
	c := conicFromState(State{
		R: r3.Vec{X: 6524.834, Y: 6862.875, Z: 6448.296},
		V: r3.Vec{X: 4.901327, Y: 5.533756, Z: -1.976341},
	}, 398600.4418)
	a := c.SemiLatusRectumKm / (1 - c.Eccentricity*c.Eccentricity)
	check(t, "p", c.SemiLatusRectumKm, 11067.790, 0.02)
	check(t, "a", a, 36127.343, 0.01)
	check(t, "e", c.Eccentricity, 0.832853, 1e-6)
	check(t, "i°", c.Inclination/deg, 87.870, 0.005)
	check(t, "Ω°", c.RAAN/deg, 227.898, 0.005)
	check(t, "ω°", c.ArgPerigee/deg, 53.38, 0.01)
	check(t, "ν°", c.TrueAnomaly/deg, 92.335, 0.005)
}

// Vallado 4th ed. (2013) Example 2-6 p. 119 (COE2RV), μ = 398600.4418.
func TestStateFromConicVallado2_6(t *testing.T) {
	s := stateFromConic(Conic{11067.790, 0.83285, 87.87 * deg, 227.89 * deg, 53.38 * deg, 92.335 * deg}, 398600.4418)
	checkVec(t, "r", s.R, r3.Vec{X: 6525.368, Y: 6861.532, Z: 6449.119}, 1e-3)
	checkVec(t, "v", s.V, r3.Vec{X: 4.902279, Y: 5.533140, Z: -1.975710}, 1e-6)
}

// Curtis, Orbital Mechanics for Engineering Students, 3rd ed. (2014),
// Example 4.3 (Algorithm 4.2), μ = 398600; printed to 4 significant figures.
func TestConicFromStateCurtis4_3(t *testing.T) {
	const mu = 398600.0
	c := conicFromState(State{R: r3.Vec{X: -6045, Y: -3490, Z: 2500}, V: r3.Vec{X: -3.457, Y: 6.618, Z: 2.533}}, mu)
	h := math.Sqrt(c.SemiLatusRectumKm * mu)
	a := c.SemiLatusRectumKm / (1 - c.Eccentricity*c.Eccentricity)
	check(t, "h", h, 58310, 5)
	check(t, "i°", c.Inclination/deg, 153.2, 0.05)
	check(t, "Ω°", c.RAAN/deg, 255.3, 0.05)
	check(t, "e", c.Eccentricity, 0.1712, 5e-5)
	check(t, "ω°", c.ArgPerigee/deg, 20.07, 0.005)
	check(t, "θ°", c.TrueAnomaly/deg, 28.45, 0.005)
	check(t, "a", a, 8788, 0.5)
	// Curtis prints 2.278 h, computed from the rounded a = 8788 km; the
	// unrounded value is 2.2775 h, so allow one unit in the last digit.
	check(t, "T h", 2*math.Pi*math.Sqrt(a*a*a/mu)/3600, 2.278, 1e-3)
}

// Curtis 3rd ed. (2014) Example 4.7 (Algorithm 4.5, a hyperbola), μ = 398600.
func TestStateFromConicCurtis4_7(t *testing.T) {
	const mu = 398600.0
	s := stateFromConic(Conic{80000 * 80000 / mu, 1.4, 30 * deg, 40 * deg, 60 * deg, 30 * deg}, mu)
	checkVec(t, "r", s.R, r3.Vec{X: -4040, Y: 4815, Z: 3629}, 1)
	checkVec(t, "v", s.V, r3.Vec{X: -10.39, Y: -4.772, Z: 1.744}, 0.01)
}

// Round trips through the special cases (closed form: the two algorithms
// are inverses).
func TestElementsRoundTrip(t *testing.T) {
	for _, el := range []Elements{
		{7000, 0.01, 51.6 * deg, 30 * deg, 40 * deg, 50 * deg},
		{7000, 0, 51.6 * deg, 30 * deg, 0, 123 * deg},      // circular: M = u
		{8000, 0.2, 0, 0, 75 * deg, 300 * deg},             // equatorial: ω = ϖ
		{42164, 0, 0, 0, 0, 200 * deg},                     // circular equatorial: M = λ
		{26600, 0.74, 63.4 * deg, 350 * deg, 270 * deg, 1}, // high eccentricity
		{7000, 0.05, 180 * deg, 0, 10 * deg, 20 * deg},     // retrograde equatorial
	} {
		got, err := ElementsFromState(el.State())
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(got.SemiMajorAxisKm-el.SemiMajorAxisKm) > 1e-8*el.SemiMajorAxisKm ||
			math.Abs(got.Eccentricity-el.Eccentricity) > 1e-12 ||
			math.Abs(got.Inclination-el.Inclination) > 1e-12 ||
			math.Abs(wrapπ(got.RAAN-el.RAAN)) > 1e-10 ||
			math.Abs(wrapπ(got.ArgPerigee-el.ArgPerigee)) > 1e-9 ||
			math.Abs(wrapπ(got.MeanAnomaly-el.MeanAnomaly)) > 1e-9 {
			t.Errorf("round trip\n got %+v\nwant %+v", got, el)
		}
	}
}

func check(t *testing.T, name string, got, want, tol float64) {
	t.Helper()
	if math.Abs(got-want) > tol {
		t.Errorf("%s = %.9g, want %.9g ± %g", name, got, want, tol)
	}
}

func checkVec(t *testing.T, name string, got, want r3.Vec, tol float64) {
	t.Helper()
	d := r3.Sub(got, want)
	if math.Max(math.Abs(d.X), math.Max(math.Abs(d.Y), math.Abs(d.Z))) > tol {
		t.Errorf("%s = %+v, want %+v ± %g", name, got, want, tol)
	}
}
