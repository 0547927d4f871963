// Package power computes the electrical power of body-fixed solar panels
// from the same geometry the sun sensors see: the sun direction in body
// axes, the direct solar irradiance at the spacecraft (already scaled by
// the lit fraction of the solar disc from the shadow model) and, per panel,
// whether the body hides the sun from it.
//
// # Model
//
// Each panel i is a flat plate with outward unit normal n̂ᵢ (body axes),
// area Aᵢ (m²), cell efficiency ηᵢ and packing factor fᵢ (share of the
// panel area covered by cells). With the sun unit vector ŝ in body axes and
// the direct irradiance E = S(r)·ν, S(r) = S₀·(1 AU / r)², S₀ = 1361 W/m²
// (ephem.SolarIrradiance1AU, Kopp & Lean 2011, GRL 38 L01706) and ν the lit
// fraction of the solar disc, the instantaneous power is
//
//	P = Σᵢ E·Aᵢ·ηᵢ·fᵢ·max(0, n̂ᵢ·ŝ)·[sun not hidden from panel i]
//
// (Wertz & Larson, Space Mission Analysis and Design, 3rd ed., 1999,
// §11.4, the cosine law of a flat array, from memory).
//
// # Assumptions
//
//   - Cells at a fixed efficiency: no temperature coefficient, no
//     degradation, no angle-of-incidence loss beyond cos θ (cover-glass
//     reflection), no string or converter losses. A temperature
//     coefficient is not accepted as an input.
//   - Earth infrared on the panels is not counted; Earth albedo is counted
//     only when asked (AlbedoPower: A·η·f times the albedo irradiance on
//     the panel's plane, which the engine takes from the albedo model on a
//     90° cosine view of the panel normal, not shaded by the body).
//   - Obstruction by the bus, the declared obstructions and the other
//     panels is the panel's lit share, from the caller (scenario/study):
//     a panel with its sides given is sampled at 8 × 8 equal cells
//     (illum/sky Plate), one without them is judged at its centre (wholly
//     lit or wholly shaded). Rays are parallel; the current of a partly
//     shaded string is taken as proportional to its lit area (no bypass
//     diode or series-string mismatch model).
//
// # Accuracy
//
// Exact for the stated model (closed form); the orbit figures are sums on
// the run's time grid (each sample standing for one step up to the run's
// end), whose error is of the order of one step's share of an eclipse
// edge: 4e-4 relative at 3600 steps per orbit for an along-track panel that
// is lit at shadow exit, 3e-7 for a zenith panel (TestPowerNadirBodyPanelsClosedForm
// in scenario/sim).
// Against an independent numpy integration of body panels in nadir
// pointing (ERFA sun, two-body orbit, its own conical shadow; three orbits,
// seven panel normals, one period each) the orbit averages agree within
// 1.9e-4 relative at a 1 s step with the Meeus sun
// (TestPowerNadirPanelsAgainstNumpy in scenario/sim).
//
// # References
//
//   - G. Kopp and J. L. Lean, "A new, lower value of total solar
//     irradiance", Geophys. Res. Lett. 38, L01706 (2011): S₀ = 1360.8 W/m².
//   - A. Cauchy's surface-area formula: the projected area of a convex body
//     averaged over all directions is a quarter of its surface area (used
//     as a check, TestCauchyMeanProjectedArea).
//   - J. R. Wertz and W. J. Larson (eds.), Space Mission Analysis and
//     Design, 3rd ed., Microcosm 1999, ch. 11.4 (from memory).
package power
