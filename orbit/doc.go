// Package orbit holds the Earth constants, Kepler's equation, the
// element ↔ state conversions, three propagators (two-body, secular J2 on
// mean elements, numerical point mass + J2) and the sun-synchronous, LTAN and
// LVLH helpers that the rest of sunsight builds on.
//
// # Model
//
//   - Kepler's equation by Newton's method from Danby's start
//     (EccentricAnomaly); element ↔ state by Vallado's RV2COE/COE2RV
//     (ConicFromState, StateFromConic, Elements.State, ElementsFromState),
//     with the argument of latitude, true longitude of perigee and true
//     longitude for circular and equatorial orbits.
//   - TwoBody: the Keplerian ellipse, exact up to round-off.
//   - J2Mean: MEAN elements moved by the secular J2 rates of RAAN, argument
//     of perigee and mean anomaly to second order in J2 (Brouwer 1959's J2²
//     secular terms; first order: Kozai 1959, Vallado 4th ed. §9.6). Node
//     rate against a 30-day j2-numeric fit: −0.0007 % for a 550 km SSO
//     (first order alone: +0.084 %), −0.025 % for e = 0.74 at the critical
//     inclination. StateAt returns the Keplerian state of the mean
//     elements at t, WITHOUT short-period terms (common practice for
//     coverage and eclipse analysis).
//   - J2Numeric: Cowell integration of point mass + J2 with an adaptive
//     Dormand–Prince 5(4) scheme (Dormand & Prince 1980) and its 4th-order
//     dense output (Hairer, Nørsett & Wanner 1993). It starts from the
//     osculating state of the given mean elements (MeanToOsculating).
//     The dense output of the last 16 steps is kept, so a time a little
//     before the latest one (an event search refining a boundary) is
//     served without integrating again, bit for bit what a forward
//     integration gives there.
//   - OsculatingToMean / MeanToOsculating: first-order J2 mean elements in
//     Kozai's sense (orbit average of the osculating elements), computed by
//     numerical averaging over one period in equinoctial elements, and its
//     inverse by fixed-point iteration. See OsculatingToMean.
//   - SunSyncInclination, J2Rates, Period, RAANFromLTAN/LTANFromRAAN (mean
//     sun), LVLH.
//
// # Assumptions
//
// Inertial frame EME2000; the Earth's field is point mass + J2 only (no J3+,
// drag, sun/moon, radiation pressure). Elements are elliptic, 0 ≤ e < 1,
// and not retrograde-equatorial for the mean↔osculating conversion (its
// equinoctial elements are singular at i = 180°). Time t is seconds since the
// propagator's epoch. LTAN is local MEAN solar time.
//
// # Accuracy
//
// TwoBody conserves energy and angular momentum to 1e-10 relative over 100
// orbits (tests). J2Numeric agrees with an independent scipy DOP853
// integration of the same equations to the figures in numeric_test.go
// (metres over 3 days). J2Mean places a LEO satellite within roughly
// 10–20 km of the true J2 orbit because it omits short-period terms (km-level
// in radius, tens of km along-track over days from the J2² mean-motion term);
// that is adequate for sun visibility, eclipse fractions and albedo geometry,
// but NOT for ground-track, conjunction or link timing work. Real orbits also
// decay and feel J3, drag and third bodies: over weeks these move the node
// and the along-track position far more than the differences here. This is
// an analysis aid; flight decisions need qualified tools and verification.
//
// # References
//
//   - NIMA TR8350.2, Department of Defense World Geodetic System 1984, 3rd ed. (2000).
//   - D. A. Vallado, Fundamentals of Astrodynamics and Applications, 4th ed. (2013).
//   - H. D. Curtis, Orbital Mechanics for Engineering Students, 3rd ed. (2014).
//   - J. Meeus, Astronomical Algorithms, 2nd ed. (1998), ch. 30.
//   - Y. Kozai, "The motion of a close earth satellite", AJ 64, 367 (1959).
//   - D. Brouwer, "Solution of the problem of artificial satellite theory
//     without drag", AJ 64, 378 (1959).
//   - J. R. Dormand, P. J. Prince, "A family of embedded Runge–Kutta
//     formulae", J. Comput. Appl. Math. 6(1), 19–26 (1980).
//   - E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential
//     Equations I, 2nd ed. (1993), §II.4–II.6.
//   - J. M. A. Danby, "The solution of Kepler's equation III", Celest. Mech.
//     40, 303 (1987) (from memory).
package orbit
