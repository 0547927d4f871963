// Package illum decides whether the sun shines on a satellite: the Earth's
// shadow (cylindrical and conical), eclipse events and their statistics, the
// beta angle, and day-by-day eclipse-season tables.
//
// It takes positions and sun vectors (km, geocentric, EME2000) or a Geometry
// callback, and imports no other sunsight package, so any propagator and any
// solar ephemeris can drive it.
//
// # Model
//
// Cylindrical shadow: a point is dark when r·ŝ < 0 and its distance from the
// shadow axis is below Rₑ (Vallado, Fundamentals of Astrodynamics and
// Applications, 4th ed. 2013, Algorithm 34; from memory).
//
// Conical shadow: seen from the satellite the sun is a disc of angular radius
// a = asin(R☉/|r☉ − r|) and the Earth one of radius b = asin(Rₑ/|r|), their
// centres c apart. The visible fraction ν of the solar disc is 1 for
// c ≥ a + b, 0 for c ≤ b − a (umbra), 1 − b²/a² for c ≤ a − b (annular), and
// 1 − A/(πa²) in between, A being the overlap (lens) area of the two discs
// taken flat in angle space (Montenbruck & Gill, Satellite Orbits,
// Springer 2000, §3.4.2; equation numbers not checked). The true sun
// distance is used; R☉ = 696 000 km, Rₑ = 6378.137 km (WGS 84).
//
// Eclipse events: the margins c − (a + b) (penumbra) and c − (b − a) (umbra)
// are continuous in time. FindEclipses samples them on a grid, brackets each
// sign change and refines it with Brent's method (Brent 1973, ch. 4) to
// EventTolS = 1 ms. Where three samples of one sign show a local extremum, a
// golden-section search between the outer samples tells whether a pass
// shorter than the step (a grazing penumbral pass) hides there. In the
// cylindrical model (Finder.Model = Cylindrical) the one margin is
// θ − asin(Rₑ/|r|), θ the angle between r and −ŝ, negative exactly where
// ShadowCylindrical is dark; its eclipses have umbra = shadow. Checked
// against T·2·acos(√(1−(R/r)²)/cos β)/(2π) for a circular orbit
// (elementary geometry) to < 1 ms.
//
// Beta angle: β = asin(ĥ·ŝ), ĥ = r × v / |r × v|; the element form from
// inclination, RAAN, the sun's ecliptic longitude and the obliquity, β* =
// asin(Rₑ/a) and the circular-orbit eclipse fraction
// f = (1/π) acos(√(h² + 2Rₑh)/((Rₑ + h) cos β)) are closed forms (Rickman,
// NASA TFAWS 2014, "Introduction to On-Orbit Thermal Environments"; Gilmore,
// Spacecraft Thermal Control Handbook Vol. I, 2nd ed. 2002, ch. 2; both from
// memory).
//
// Seasons: YearTable examines, for each day, the two orbits that follow the
// day's start: beta angle at the start, umbra and total shadow time of the
// first complete eclipse, and an eclipse-free flag.
//
// # Assumptions
//
//   - The Earth is a sphere of radius 6378.137 km with no atmosphere.
//   - The discs are flat in angle space (a and b are the angular radii); the
//     error is of order a²·b, far below the other effects here.
//   - The caller's sun vector fixes aberration and light time: illum applies
//     none. A geometric and an apparent sun differ by ≈ 20″ (aberration),
//     which moves shadow boundaries by well under 0.1 s in LEO (own estimate).
//   - YearTable's one orbit per day stands for the whole day; the first and
//     last days of an eclipse season are resolved to a day, and a grazing
//     season edge may flip between neighbouring days.
//
// # Accuracy
//
// Event times match an independent numpy/ERFA/scipy reference
// (testdata/gen_eclipse_ref.py) to < 0.3 ms at grid steps of 10, 60 and
// 300 s. The physics is coarser than that:
//
//   - Oblateness: the polar radius is 21.4 km smaller than the equatorial
//     one. At β = 0 a 400 km satellite approaches the shadow edge at
//     ≈ 2.6 km/s (7.67 km/s × cos 70.2°, closed form), so a terminator
//     crossing near a pole comes up to ≈ 8 s early or late; at mid latitudes
//     a few seconds (own estimate).
//   - Atmosphere: refraction and absorption in the lowest ≈ 30–50 km blur
//     the shadow edge and dim the sun gradually; entry and exit in LEO are
//     uncertain by ≈ 5–15 s and the light in "umbra" is not exactly zero
//     (own estimate from the same approach rate; from memory).
//   - Near β* the shadow boundary is crossed at a grazing angle and all of
//     the above grow; a predicted short eclipse may or may not occur.
//
// This is an analysis aid: power, thermal and sensor decisions for flight
// hardware need qualified tools and margins on these figures.
//
// # References
//
//   - O. Montenbruck, E. Gill, Satellite Orbits: Models, Methods and
//     Applications, Springer 2000, §3.4.2 (shadow function).
//   - R. P. Brent, Algorithms for Minimization without Derivatives,
//     Prentice-Hall 1973, ch. 4 (zero finder; transcribed from memory).
//   - J. Kiefer, Sequential minimax search for a maximum, Proc. AMS 4 (1953)
//     (golden-section search).
//   - S. L. Rickman, Introduction to On-Orbit Thermal Environments, NASA
//     TFAWS short course, 2014 (beta angle, eclipse fraction; from memory).
//   - D. G. Gilmore (ed.), Spacecraft Thermal Control Handbook, Vol. I,
//     2nd ed., Aerospace Press 2002, ch. 2 (from memory).
//   - D. A. Vallado, Fundamentals of Astrodynamics and Applications, 4th ed.,
//     Microcosm 2013, Algorithm 34 (cylindrical shadow; from memory).
//   - NIMA TR8350.2, Department of Defense World Geodetic System 1984,
//     3rd ed., 2000 (Rₑ; from memory).
package illum
