// Package ephem converts UTC to the time scales sunsight needs and gives
// the geocentric direction and distance of the sun and of the Moon in
// EME2000.
//
// # Model
//
// Time: UTC → TAI through the IERS leap-second table (TAIMinusUTC), TAI →
// TT by the fixed 32.184 s, and Julian dates from the Unix day count
// (JulianDateTT). UT1 is taken equal to UTC (JulianDateUT1). GMST is the
// IAU 1982 expression (GMST; Meeus 1998 (12.4), Vallado 2013 eq. 3-47).
//
// Frames: EME2000 is the mean equator and equinox of J2000.0. Vectors of
// date are brought to it by IAU 1976 precession (Lieske et al. 1977,
// angles ζ, z, θ). MeanSunRA2000 gives the EME2000 right ascension of the
// mean sun, for turning a local time of the ascending node into a RAAN.
//
// Sun: two models implement Sun, chosen with SunByName.
//   - "low-precision" (LowPrecision): the Astronomical Almanac's
//     low-precision formulas (L, g, λ, ε, R), mean equator and equinox of
//     date, precessed to EME2000.
//   - "meeus" (Meeus): Meeus 1998 ch. 25 low-accuracy theory through
//     github.com/soniakeys/meeus/v3 (solar.True2000, solar.Radius), rotated
//     into EME2000 by the J2000 obliquity.
//
// Moon: Moon.Position is Meeus 1998 ch. 47 (the principal terms of
// ELP-2000/82) through github.com/soniakeys/meeus/v3/moonposition: λ, β
// and Δ on the mean ecliptic and equinox of date, turned to the mean
// equator of date by the mean obliquity (Meeus (22.2)) and precessed to
// EME2000 like the sun. MoonPhaseAngle and MoonIlluminatedFraction are
// Meeus ch. 48 ((48.2), (48.3), (48.1) through base.Illuminated) from
// geocentric vectors; MoonRadiusKm is the IAU mean radius.
//
// Both sun models return the apparent direction (annual aberration included,
// about 20.5″: the AA mean longitude carries it and Meeus gets
// −20.4898″/R added), which is the direction a sun sensor on a spacecraft
// near the Earth sees. The spacecraft's own orbital velocity adds up to
// v/c ≈ 5″ at 7.5 km/s, which is not modelled. Nutation (< 20″) is not applied: the frame is the mean one.
// Distances are geometric, in km with AUKm.
//
// # Assumptions
//
//   - UT1 = UTC (|UT1 − UTC| < 0.9 s, at most 0.0038° of Earth rotation).
//   - After 2017-01-01 ΔAT = 37 s is held (no later leap second is known
//     to the table); before 1972 ΔAT = 10 s is held, which is wrong by up
//     to 8.6 s of time.
//   - TDB = TT (they differ by < 2 ms).
//   - Geocentric sun: the parallax of a LEO spacecraft (≤ 8000 km / 1 AU
//     ≈ 11″) is left to the caller, who has the spacecraft position.
//   - The frame bias between ICRS/GCRS and EME2000 (≈ 0.02″) is ignored.
//   - The Moon is geocentric: from a spacecraft at r its direction differs
//     by up to asin(r/Δ) (about 1° in LEO, 6° at GEO); the caller subtracts
//     the spacecraft position. Nutation (< 20″) is not applied.
//
// # Accuracy
//
// Measured against IAU SOFA/ERFA (eraEpv00 + eraAb, 400 epochs 2000–2050,
// testdata/gen_sun_erfa.py), worst case: low-precision 0.0101° in
// direction and 8.1e-5 AU in distance; meeus 0.0091° and 7.8e-5 AU; the
// two models agree to 0.0077°. The AA states 0.01° for 1950–2050; outside that
// span errors grow. GMST agrees with eraGmst82 to 0.001″ and the IAU 1976
// precession matrix with eraPmat76 to 3e-16. A sun left on the equinox of
// date would be off by 0.36° in 2025: the tests check that they catch it.
//
// This is an analysis aid for sensor-layout studies. Flight software and
// hardware need a qualified ephemeris and verification.
//
// # References
//
//   - The Astronomical Almanac, section C, "Low-precision formulas for the
//     Sun" (any recent year), from memory; also Vallado 2013 Algorithm 29.
//   - J. Meeus, Astronomical Algorithms, 2nd ed., Willmann-Bell 1998:
//     ch. 7 (Julian day), ch. 12 (sidereal time, eq. 12.4), ch. 21
//     (precession, eq. 21.2–21.4), ch. 22 (obliquity, eq. 22.2), ch. 25
//     (solar coordinates), ch. 47 (position of the Moon, Example 47.a),
//     ch. 48 (illuminated fraction, Example 48.a).
//   - B. A. Archinal et al., "Report of the IAU Working Group on
//     Cartographic Coordinates and Rotational Elements: 2015", Celest.
//     Mech. Dyn. Astr. 130:22 (2018) (mean lunar radius 1737.4 km).
//   - D. A. Vallado, Fundamentals of Astrodynamics and Applications, 4th
//     ed., Microcosm 2013: eqs. 3-40–3-47, Example 3-5, Example 5-1.
//   - J. H. Lieske, T. Lederle, W. Fricke, B. Morando, "Expressions for
//     the precession quantities based upon the IAU (1976) system of
//     astronomical constants", A&A 58, 1–16 (1977).
//   - IERS Bulletin C (leap seconds); IAU 2012 Resolution B2 (au).
//   - G. Kopp, J. L. Lean, "A new, lower value of total solar irradiance",
//     GRL 38, L01706 (2011).
//   - O. Montenbruck, E. Gill, Satellite Orbits, Springer 2000, §3.4
//     (solar radius for shadows), from memory.
//   - IAU SOFA / ERFA (pyerfa 2.0.0.1, Debian python3-erfa) and astropy
//     5.2.1 (Debian python3-astropy) as the reference libraries of the tests.
package ephem
