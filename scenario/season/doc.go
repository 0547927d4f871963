// Package season finds the worst season of a scenario over a span (a year
// by default) and the eclipse distribution of its orbit.
//
// # Model
//
// The scan runs the scenario as short cases whose epochs are spread evenly
// over the span, then refines around the coarse worst of each criterion —
// lowest valid share, largest p95 error (with albedo when modelled),
// longest eclipse — with cases at a fraction of the coarse spacing either
// side. Each case is a full run (sweep.RunCase) of the scenario moved in
// time: a sun-synchronous orbit keeps its LTAN, a TLE is carried to the new
// epoch as the build step does, mean elements are carried by the secular J2
// rates (or by the mean motion alone for the two-body propagator). The
// cases run on every core, the coarse ones first, then the refined ones,
// each phase kept in its order (TestScanSameOnOneCore); the span's eclipse
// distribution runs beside them.
//
// The eclipse distribution follows the scenario's own propagator, sun and
// shadow over the whole span: the event search of the run (60 s sampling,
// events to 1 ms), orbits from one orbit noon (the point nearest the sun,
// v·ŝ = 0 going negative, placed by linear interpolation) to the next, so that an eclipse, centred
// half an orbit away, never straddles two; each orbit's shadow time is the
// penumbra entry to exit of its eclipses. It gives the share of orbits
// without eclipse, the share with more shadow than a stated duration and a
// histogram of shadow time per calendar month.
//
// # Assumptions
//
// The scan samples the span: a worst case between samples narrower than the
// refined spacing can be missed (the eclipse distribution has no such gap).
// Cases are short runs; figures that need a long run (a rare gap) need
// longer cases. Osculating states and ephemeris files are not moved.
//
// # Accuracy
//
// For a circular orbit in the cylindrical shadow each orbit's shadow time
// agrees with the closed form T·acos(√(h² + 2Rh)/((R + h) cos β))/π at the
// orbit's beta angle to ≤ 1.4 s over a year (TestEclipseDistributionClosedForm,
// 500 km at 51.6° and 700 km dawn-dusk), and the eclipse-free orbits are
// those with |β| ≥ asin(R/(R + h)) away from 0.1° of the limit.
//
// # References
//
// Eclipse of a circular orbit versus beta angle: J. R. Wertz (ed.),
// Spacecraft Attitude Determination and Control, Reidel 1978, §3.5; D. A.
// Vallado, Fundamentals of Astrodynamics and Applications, 4th ed., 2013,
// §5.3 (both from memory); the same form as illum.EclipseFractionCircular.
package season
