package illum

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// Closed-form beta angles (REFERENCE checks re-derived by hand from the
// formula of Rickman TFAWS 2014, from memory; ε = 23.439°).
func TestBetaAngleElementsValues(t *testing.T) {
	const ε = 23.439 * deg
	for _, c := range []struct{ i, Ω, Γ, want float64 }{
		{51.6, 0, 0, 0},
		{51.6, 0, 90, 23.439 - 51.6}, // β = ε − i
		{51.6, 90, 90, 14.305},       // asin(sin ε cos i)
		{97.4, 90, 0, 82.600},        // asin(sin i)
	} {
		got := BetaAngleElements(c.i*deg, c.Ω*deg, c.Γ*deg, ε) / deg
		if math.Abs(got-c.want) > 5e-4 {
			t.Errorf("i=%g Ω=%g Γ=%g: β = %.4f°, want %.3f°", c.i, c.Ω, c.Γ, got, c.want)
		}
	}
}

// The vector form from r, v agrees with the element form at random
// geometries, and does not depend on the position in the orbit (closed form).
func TestBetaAngleVectorVsElements(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	const ε = 23.4392911 * deg
	worst := 0.0
	for range 1000 {
		orb := circular{a: 7000, inc: rng.Float64() * math.Pi, raan: rng.Float64() * 2 * math.Pi}
		Γ := rng.Float64() * 2 * math.Pi
		sε, cε := math.Sincos(ε)
		sun := r3.Vec{X: math.Cos(Γ), Y: math.Sin(Γ) * cε, Z: math.Sin(Γ) * sε}
		tt := rng.Float64() * 6000
		r := orb.pos(tt)
		v := r3.Scale(1/0.001, r3.Sub(orb.pos(tt+0.0005), orb.pos(tt-0.0005)))
		got := BetaAngle(r, v, r3.Scale(1.5e8, sun))
		want := BetaAngleElements(orb.inc, orb.raan, Γ, ε)
		worst = math.Max(worst, math.Abs(got-want))
	}
	if worst > 1e-9 {
		t.Errorf("vector vs element beta: worst %.2e rad", worst)
	}
}

func ExampleBetaCritical() {
	// β* at 400 km: the Earth's angular radius seen from the orbit.
	fmt.Printf("%.3f°\n", BetaCritical(EarthRadiusKm+400)/deg)
	// Output: 70.218°
}

func ExampleEclipseFractionCircular() {
	// 400 km circular orbit, β = 0: fraction of the orbit in shadow
	// (cylindrical), then the eclipse length with a two-body period.
	a := EarthRadiusKm + 400
	f := EclipseFractionCircular(400, 0)
	T := 2 * math.Pi * math.Sqrt(a*a*a/398600.4418)
	fmt.Printf("%.4f %.2f min\n", f, f*T/60)
	// Output: 0.3901 36.11 min
}
