// Package sensor models body-mounted sun sensors, their error models and the
// sun-vector estimators. Every vector is in body axes; angles in radians.
//
// A Mount places a sensor (FaceMount: face, tilt toward a named axis, clock
// about the boresight; VectorMount: explicit boresight and reference). Three
// kinds implement Sensor: Cosine (photodiode), Quadrant (four cells under a
// square aperture) and Digital (aperture over a detector array). An Array
// holds the flown set; Array.Read fills a caller-owned []Reading for one
// instant and the estimators (EstimatorByName: least-squares,
// opposite-pairs, two-axis, combined) turn it into an Estimate. Draw gives
// one simulated unit with its errors drawn from a seeded rand.Rand.
//
// # Model
//
// Cosine: reading = gain·(S·R(θ☉)·[in FOV] + E_alb)/S_ref + dark + noise,
// clipped to [0, full scale] and quantised to 2^bits levels, with
// R(θ) = cos θ times an optional measured roll-off table (gonum
// interp.PiecewiseLinear). E_alb is the albedo model's response-weighted
// irradiance ∫L·R(θ)dω (Wertz 1978 ch. 6–7, from memory).
//
// Quadrant: the aperture (side w, height h, offset o) projects a square
// spot of side w centred at o − h·(tan αx, tan αy); each cell (side c, gap g)
// gets S·cos θ times its lit area over w². X = [(A+D)−(B+C)]/Σ and
// Y = [(C+D)−(A+B)]/Σ separate into one-axis ratios (l−r)/(l+r) of the lit
// lengths, which are inverted through the nominal geometry by bisection.
// While the spot straddles the gap and stays on the detector,
// X = 2h·tan αx/(w − g) (closed form; 2h·tan α/w with no gap). The FOV is
// where the spot still touches a cell; where it lies on one side only the
// ratio is ±1 and the reading is flagged Saturated and not Valid. A spot
// narrower than the gap leaves an insensitive zone round the boresight (no
// light on any cell, then straight to one cell); a spot wider than the
// detector leaves a dead zone where X stays 0.
//
// Digital: the centroid in the tangent plane (tan αx, tan αy) of the sun
// (weight S·cos θ, when above MinIrradiance) and of the albedo mean
// direction (weight E_alb, only when E_alb ≥ AlbedoThreshold and in the
// FOV), plus Gaussian noise of the stated σ on each axis angle. Albedo alone
// above the threshold produces a false sun, as real detectors can.
//
// Seeing the sun (SeesSun): a sensor sees the sun where the nominal unit,
// with its error model off and no albedo, gives a valid reading from direct
// sun at 1361 W/m² — a cosine or digital signal at or above its threshold,
// a quadrant reading it would invert — and never below MinSeenSignal (10⁻⁶
// of full sun). Coverage shares count exactly that, so a sun edge-on to a
// sensor (cos 90° ≈ 10⁻¹⁷, with either sign after rounding) is not seen.
// The irradiance is fixed at 1 AU so that sky coverage and time coverage
// count the same directions; the ±3.4 % seasonal change of the solar
// irradiance would move a cosine sensor's 5 % threshold edge by ±0.1°.
//
// Validity gate (Gate): every estimate counts as available only when the
// estimator found one, it uses at least MinSensors sensors, their signals
// sum to at least MinSignal, and its fit Residual is at most MaxResidual.
// The residual is the RMS of m − n·x over the readings of a cosine fit
// (normalised signal; Σm² − x·b at the least-squares solution, since
// NᵀNx = b) and the RMS chord between each two-axis direction and the
// estimate. DefaultGate: each estimator's own minimum of sensors, half of
// full sun summed over a cosine fit (a 1 AU sun on a box's lit faces sums to
// |sx| + |sy| + |sz| ≥ 1; albedo alone gives a sensor at most ρ·(R/r)² of
// full sun), no residual limit (common practice, no source). Combined lets
// its cosine part join only through CosineGate.
//
// Estimators: LeastSquares ŝ ∝ (NᵀN)⁻¹Nᵀm over lit cosine sensors (≥ 3,
// condition of NᵀN ≤ 100, eigenvalues by Smith 1961); OppositePairs
// ŝ ∝ (Σaaᵀ)⁻¹Σa(m₊ − m₋) over opposed pairs; TwoAxis the 1/σ²-weighted
// mean of two-axis directions; Combined adds the least-squares direction
// with a stated coarse σ.
//
// # Assumptions
//
//   - The albedo on a quadrant or digital sensor is a point source in its
//     mean arrival direction carrying the whole response-weighted
//     irradiance; an extended Earth spreads the light, so the cell split and
//     centroid pull are approximations (first order in the albedo ratio).
//     When that direction's spot misses the cells, a quadrant splits the
//     albedo evenly over its four cells.
//   - Lit-only least squares is biased when a dark sensor is lit by albedo
//     alone: the clipped cosine max(0, n·s) is not linear, and such a sensor
//     enters with a normal that points away from the sun. For s = (1,1,1)/√3
//     and 0.1 S on −Z the error is 18.97° against 4.95° for the pair
//     difference (own closed-form calculation, see the tests).
//   - The pair difference m₊ − m₋ = a·s holds only for ideal cosine
//     sensors with 90° half-angle; roll-off or narrower cones bias it.
//   - The estimators know only the nominal mounts and geometry; drawn
//     misalignments, offsets, gains and aperture offsets appear as errors.
//   - The digital sensor's noise is white per reading; no bias or
//     calibration residual beyond the misalignment.
//
// # Accuracy
//
// The models are ideal geometry: no Fresnel loss unless given as roll-off,
// no diffraction, no edge penumbra of the spot, no temperature effects.
// Results are an analysis aid for choosing a layout, not a substitute for
// calibrated unit data; flight hardware needs qualified verification.
// The tests check the closed forms to 1e-12 rad, least squares on noiseless
// readings to 1e-9 rad, and noise statistics within 4 standard errors.
//
// # References
//
//   - J. R. Wertz (ed.), Spacecraft Attitude Determination and Control,
//     Reidel 1978, ch. 6–7 (sun sensor models; from memory).
//   - O. K. Smith, "Eigenvalues of a symmetric 3×3 matrix", Comm. ACM 4(4),
//     168 (1961) (from memory).
//   - Quadrant transfer X = 2h·tan α/w: closed form from the geometry above.
package sensor
