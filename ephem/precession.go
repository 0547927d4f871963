package ephem

import "math"

// deg and arcsec are one degree and one second of arc in radians.
const (
	deg    = math.Pi / 180
	arcsec = deg / 3600
)

// mat3 is a 3×3 rotation matrix, row-major, kept as a value so the step
// loop does not allocate.
type mat3 [3][3]float64

// precessionJ2000ToDate returns the IAU 1976 precession matrix P that
// takes a vector from the mean equator and equinox of J2000 to the mean
// equator and equinox of the date T (TT centuries from J2000):
// P = R3(−z)·R2(θ)·R3(−ζ) (Lieske et al. 1977; Meeus 1998 (21.2), (21.4)
// p. 134; Vallado 2013 eq. 3-89 p. 228). Checked against ERFA eraPmat76.
func precessionJ2000ToDate(T float64) mat3 {
	// Lieske et al. 1977, fixed epoch J2000 (Meeus 1998 (21.2) p. 134).
	ζ := T * (2306.2181 + T*(0.30188+T*0.017998)) * arcsec
	z := T * (2306.2181 + T*(1.09468+T*0.018203)) * arcsec
	θ := T * (2004.3109 + T*(-0.42665-T*0.041833)) * arcsec
	sζ, cζ := math.Sincos(ζ)
	sz, cz := math.Sincos(z)
	sθ, cθ := math.Sincos(θ)
	return mat3{
		{cζ*cz*cθ - sζ*sz, -sζ*cz*cθ - cζ*sz, -cz * sθ},
		{cζ*sz*cθ + sζ*cz, -sζ*sz*cθ + cζ*cz, -sz * sθ},
		{cζ * sθ, -sζ * sθ, cθ},
	}
}

// mulTrans returns Mᵀ·v, which for a precession matrix takes a vector of
// date back to J2000.
func (m *mat3) mulTrans(x, y, z float64) (float64, float64, float64) {
	return m[0][0]*x + m[1][0]*y + m[2][0]*z,
		m[0][1]*x + m[1][1]*y + m[2][1]*z,
		m[0][2]*x + m[1][2]*y + m[2][2]*z
}

// MeanSunRA2000 returns, in radians in [0, 2π), the right ascension in
// the EME2000 frame of the mean sun at the TT Julian date jdTT.
//
// The mean sun is the fictitious sun that moves uniformly along the
// equator; its right ascension on the mean equator and equinox of date is
// the Astronomical Almanac's mean longitude of the sun,
//
//	L = 280.460° + 0.9856474° n,  n = JD − 2451545.0
//
// (AA section C, low-precision formulas for the sun; this L includes
// aberration). The point at RA = L on the mean equator of date is then
// precessed to J2000 by IAU 1976 precession, because the propagator's
// frame is EME2000: leaving it of date would put the node about 0.35° off
// in 2025 (50.3″/yr of general precession).
//
// It is used to turn a local time of the ascending node (LTAN, on mean
// solar time) into a RAAN: Ω = α_mean + 15°/h·(LTAN − 12 h) (common
// practice, no source here). The mean sun differs from the true sun by
// the equation of time (up to about 4°, i.e. 16 min of LTAN).
func MeanSunRA2000(jdTT float64) float64 {
	n := jdTT - JDJ2000
	// AA low-precision mean longitude, section C (Michalsky 1988 form).
	L := math.Mod(280.460+0.9856474*n, 360) * (math.Pi / 180)
	c, s := math.Cos(L), math.Sin(L)
	P := precessionJ2000ToDate(CenturiesTT(jdTT))
	x, y, _ := P.mulTrans(c, s, 0)
	α := math.Atan2(y, x)
	if α < 0 {
		α += 2 * math.Pi
	}
	return α
}
