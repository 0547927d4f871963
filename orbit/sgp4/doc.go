// Package sgp4 propagates two-line element sets with SGP4 (near-Earth,
// period below 225 min) and SDP4 (deep space), the models TLEs are fitted
// with, and turns the result from TEME into EME2000 for the rest of the
// tool.
//
// # Model
//
// The analytic general-perturbation theory of Hoots & Roehrich (1980):
// secular and periodic J2, J3, J4 terms, a power-law atmosphere through B*,
// and for deep-space orbits the lunar-solar secular and periodic terms and
// the geopotential resonances of 12 h and 24 h orbits (integrated by the
// Euler–Maclaurin steps of 720 min of the published code). The code follows
// the corrected version of Vallado, Crawford, Hujsak & Kelso (2006) in its
// "improved" operation mode (GMST from the IAU 1982 formula, the Lyddane
// choice on the perturbed inclination at 0.2 rad), with the WGS 72
// constants TLEs are made with. The output frame of SGP4 is TEME of date
// (true equator, mean equinox); Propagator rotates it to EME2000 with
// ephem.TEMEToEME2000 (IAU 1976 precession, IAU 1980 nutation).
//
// # Assumptions
//
// The element set is a TLE: mean elements in the Kozai form of the mean
// motion, fitted by the same theory. Elements from other sources (osculating
// states, another theory's mean elements) are not SGP4 elements. UTC is
// used as the time of the element epoch and of the run (the published
// code's convention); UT1 − UTC (≤ 0.9 s) is ignored in the GMST of the
// deep-space resonance terms.
//
// # Accuracy
//
// Against the paper's published verification output (tcppver.out, 666
// states of its 33 element sets) and against Debian's python3-sgp4 (an
// implementation of the same code) over every sample of the test spans:
// worst 4 mm in position and 0.002 mm/s in velocity, and the same failures
// (decay, eccentricity out of range) at the same times.
// The model itself is good to about a kilometre at the element epoch,
// growing by a few kilometres per day for LEO (Vallado et al. 2006 §I);
// a TLE weeks old can be tens of kilometres off.
//
// # References
//
//   - Hoots, F. R. & Roehrich, R. L. (1980). Models for Propagation of
//     NORAD Element Sets. Spacetrack Report No. 3.
//   - Vallado, D. A., Crawford, P., Hujsak, R. & Kelso, T. S. (2006).
//     Revisiting Spacetrack Report #3. AIAA 2006-6753 (its verification
//     element sets are testdata's input).
package sgp4
