package ephem_test

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"github.com/soniakeys/meeus/v3/nutation"
)

// Meeus, Astronomical Algorithms, 2nd ed. 1998, Example 47.a p. 342: on
// 1992 April 12, 0h TD (JDE 2448724.5) the Moon is at λ = 133.162655°,
// β = −3.229126°, Δ = 368409.7 km, equatorial horizontal parallax
// π = 0.991990°; with Δψ and ε of date, apparent α = 134.688470°,
// δ = 13.768368°. The apparent place is printed to five decimals: Meeus
// rounds Δψ and ε of date to six (+0.004610°, 23.440636°), the full IAU
// 1980 series of nutation.Nutation differs in the sixth decimal.
func ExampleMoonEclipticOfDate() {
	const jde = 2448724.5
	λ, β, Δ := ephem.MoonEclipticOfDate(jde)
	fmt.Printf("λ = %.6f°  β = %.6f°  Δ = %.1f km\n", λ*180/math.Pi, β*180/math.Pi, Δ)
	fmt.Printf("π = %.6f°\n", math.Asin(6378.14/Δ)*180/math.Pi) // Meeus p. 337, his Earth radius
	// Apparent place: nutation in longitude and the true obliquity (Meeus ch. 22, (13.3), (13.4)).
	Δψ, Δε := nutation.Nutation(jde)
	ε := nutation.MeanObliquity(jde).Rad() + Δε.Rad()
	λa := λ + Δψ.Rad()
	α := math.Atan2(math.Sin(λa)*math.Cos(ε)-math.Tan(β)*math.Sin(ε), math.Cos(λa))
	δ := math.Asin(math.Sin(β)*math.Cos(ε) + math.Cos(β)*math.Sin(ε)*math.Sin(λa))
	fmt.Printf("α = %.5f°  δ = %.5f°\n", α*180/math.Pi, δ*180/math.Pi)
	// Output:
	// λ = 133.162655°  β = -3.229126°  Δ = 368409.7 km
	// π = 0.991990°
	// α = 134.68847°  δ = 13.76837°
}

// radec is the vector of length d at right ascension α and declination δ (deg).
func radec(αDeg, δDeg, d float64) r3.Vec {
	α, δ := αDeg*math.Pi/180, δDeg*math.Pi/180
	return r3.Vec{X: d * math.Cos(δ) * math.Cos(α), Y: d * math.Cos(δ) * math.Sin(α), Z: d * math.Sin(δ)}
}

// Meeus 1998, Example 48.a p. 347: on 1992 April 12, 0h TD, with the Moon
// at α = 134.6885°, δ = 13.7684°, Δ = 368410 km and the sun at
// α0 = 20.6579°, δ0 = 8.6964°, R = 149971520 km, the phase angle is
// i = 69.0756° and the illuminated fraction k = 0.6786.
func ExampleMoonIlluminatedFraction() {
	moon := radec(134.6885, 13.7684, 368410)
	sun := radec(20.6579, 8.6964, 149971520)
	fmt.Printf("i = %.4f°\n", ephem.MoonPhaseAngle(moon, sun)*180/math.Pi)
	fmt.Printf("k = %.4f\n", ephem.MoonIlluminatedFraction(moon, sun))
	// The same from sunsight's own Moon and Meeus sun in EME2000.
	mu, md := ephem.Moon{}.Position(2448724.5)
	su, sd := ephem.Meeus{}.Position(2448724.5)
	fmt.Printf("k = %.3f (own models)\n", ephem.MoonIlluminatedFraction(r3.Scale(md, mu), r3.Scale(sd, su)))
	// Output:
	// i = 69.0756°
	// k = 0.6786
	// k = 0.679 (own models)
}
