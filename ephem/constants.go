package ephem

// Astronomical constants. Earth constants live in package orbit.
const (
	// AUKm is the astronomical unit in km, fixed by IAU 2012 Resolution B2
	// (from memory) as 149 597 870 700 m. meeus's base.AU is the older
	// 149 597 870 km and is not used.
	AUKm = 149597870.700

	// SolarRadiusKm is the radius of the solar photosphere used for the
	// shadow cones, 696 000 km (Montenbruck & Gill 2000, Satellite Orbits,
	// §3.4.2, from memory; the IAU 2015 Resolution B3 nominal value is
	// 695 700 km, from memory — the 0.04 % difference moves a LEO penumbra
	// boundary by well under a second).
	SolarRadiusKm = 696000.0

	// SolarIrradiance1AU is the total solar irradiance at 1 AU in W/m²:
	// Kopp & Lean 2011, GRL 38, L01706, measured 1360.8 ± 0.5 W/m² at the
	// 2008 solar minimum, rounded to the IAU 2015 Resolution B3 nominal
	// 1361 W/m² (from memory). Scale by (1 AU / r)² for the distance
	// (±3.4 % over the year).
	SolarIrradiance1AU = 1361.0

	// ObliquityJ2000Rad is the mean obliquity of the ecliptic at J2000.0,
	// 23°26′21.448″ = 84381.448″ (IAU 1976, Lieske et al. 1977; Meeus 1998
	// (22.2) p. 147).
	ObliquityJ2000Rad = 84381.448 * arcsec

	// AberrationMeeusArcsec is the constant of the annual aberration in
	// longitude for the sun, 20.4898″ at 1 AU (Meeus 1998 (25.10) p. 167),
	// divided by the distance in AU at use.
	AberrationMeeusArcsec = 20.4898
)
