package orbit

import "math"

// Earth constants. The propagators, the J2 rates and the sun-synchronous
// helpers all use these values, so a check that mixes them stays consistent.
const (
	// MuEarth is the Earth's gravitational parameter GM including the
	// atmosphere, km³/s². WGS 84, NIMA TR8350.2 3rd ed. (2000), Table 3.1.
	MuEarth = 398600.4418

	// RadiusEarthKm is the WGS 84 equatorial radius (semi-major axis of the
	// ellipsoid), km. NIMA TR8350.2 3rd ed. (2000), Table 3.1.
	RadiusEarthKm = 6378.137

	// J2 is the Earth's second zonal harmonic, unnormalised. It is
	// J2 = −√5·C̄20 with the EGM96 tide-free C̄20 = −0.484165371736e-3
	// (from memory, coefficient not rechecked against the EGM96 file);
	// √5·0.484165371736e-3 = 1.0826267e-3. Other models (WGS 84 ellipsoid,
	// EGM2008, zero-tide) differ by ≤ 1e-8, which moves a sun-synchronous
	// inclination by less than 0.001°.
	J2 = 1.08262668e-3

	// EarthRotationRate is the WGS 84 mean angular velocity of the Earth,
	// rad/s. NIMA TR8350.2 3rd ed. (2000), Table 3.1.
	EarthRotationRate = 7.292115e-5

	// SunMeanMotion is the rate of the mean sun's right ascension, rad/s:
	// 0.9856474°/day, the coefficient of the Astronomical Almanac's
	// low-precision mean longitude of the sun (L = 280.460° + 0.9856474° n,
	// section C). It is the same rate as ephem.MeanSunRA2000 uses, so a
	// sun-synchronous orbit built here keeps its LTAN there; it equals
	// 360° per 365.24220 days (one tropical year).
	SunMeanMotion = 0.9856474 * math.Pi / 180 / 86400
)
