// Package sensor models body-mounted sun sensors, their error models and the
// sun-vector estimators. Every vector is in body axes; angles in radians.
//
// A Mount places a sensor (FaceMount: face, tilt toward a named axis, clock
// about the boresight; VectorMount: explicit boresight and reference). Four
// kinds implement Sensor: Cosine (photodiode), Quadrant (four cells under a
// square aperture, or beside a shade wall), Digital (a stated accuracy) and
// ApertureArray (a digital sensor from its geometry). An Array
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
// Quadrant, two shade geometries (kinds quadrant and quadrant-wall), both
// with four square cells of side c (A top-left, B top-right, C bottom-right,
// D bottom-left). Aperture: a square aperture of side w at height h, offset
// o, projects a spot of side w centred at o − h·(tan αx, tan αy); each cell
// (gap g) gets S·cos θ times its lit area over w². Wall: a cross-shaped wall
// of height H stands in the gaps, the cells' inner edges a distance d from
// it; its shadow covers [o − H·tan α, o] along each axis, the full length of
// the cells, so a cell's lit area is the product of its lit lengths; each
// cell gets S·cos θ times its lit area over 4c². X = [(A+D)−(B+C)]/Σ and
// Y = [(C+D)−(A+B)]/Σ separate into one-axis ratios (l−r)/(l+r) of the lit
// lengths, inverted through the nominal geometry: aperture
// X = 2h·tan αx/(w − g) while the spot straddles the gap and stays on the
// detector (closed form; bisection beyond, for a spot wider than the
// detector); wall X = −s/(2c − s) with s = H·tan α − d the shadow's reach
// into the near cell (closed form). The wall's transfer is flat, X = 0,
// inside the dead zone |tan α| < d/H: atan(d/H) is its half-angle (30° for
// d/H = tan 30°); an aperture wider than the detector has one of
// atan((w − 2c − g)/2h).
//
// Validity gate of a quadrant (what a flight algorithm checks, margins as
// keys): no sun when the cell sum is below the threshold or a cell is at
// full scale; each axis' |X| must lie within the calibrated linear range
// less imbalance_margin (aperture: the spot straddling the gap, for a spot
// wider than a cell also after its outer edge leaves the detector, the far
// cell wholly lit and X = (c − l)/(c + l) still rising to 1; wall: until the
// shadow covers the near cell), and
// |X| < 1; the cell sum must lie within ±signal_margin of the sum the
// nominal geometry expects for a sun at the reference irradiance in the
// measured direction (rejects a partial spot, penumbra and readings swamped
// by albedo). A reading outside is no sun, never an edge-of-range direction.
// An axis with |X| ≤ dead_zone_imbalance in a geometry with a dead zone
// reports the boresight along it (straight-above, biased by up to the
// dead-zone half-angle, with Reading.Sigma = atan(tan δ/√3) so the weighted
// estimators trust it less) or no sun (dead_zone: no-sun). The ranges:
// LinearHalfAngle (valid readings), DetectionHalfAngle (light on a cell;
// 90° for a wall), DeadZoneHalfAngle (the flat part) and
// DeadZoneReadHalfAngle (where |X| ≤ dead_zone_imbalance, the zone the
// readings take the dead-zone rule in, and the δ of its Reading.Sigma), per
// sensor axis; ViewText prints them. A geometry without a dead zone refuses
// the dead-zone keys; one that can never give a valid reading (w ≤ g) is
// refused. half_angle_deg is refused for both quadrant kinds: their view
// follows from the geometry. Error sources: per-cell dark offsets and gains,
// noise, ADC, misalignment, aperture or wall offset, a twist about the
// boresight drawn per unit, and a shade that is not square: the aperture
// side (or the wall distance) drawn per unit and per axis
// (shade_size_mm_1sigma), while the flight software inverts with the
// nominal one, so an aperture's tangent scales by (w − g)/(w' − g) and a
// wall's shifts by (d' − d)/H (elementary geometry). Sigma:
// accuracy_deg_1sigma when stated, else derived from the error model to
// first order (derivedSigma: slope of the transfer times the imbalance
// error, in quadrature with misalignment, twist, offset and shade size). Albedo: the albedo model integrates the cells' own
// responses (CellResponse) over the lit Earth and delivers Albedo.Cells.
//
// Digital: the centroid in the tangent plane (tan αx, tan αy) of the sun
// (weight S·cos θ, when above MinIrradiance) and of the albedo mean
// direction (weight E_alb, only when E_alb ≥ AlbedoThreshold, the key
// albedo_ignore_below times S, default 0.3 S, and in the FOV), plus Gaussian
// noise of the stated σ on each axis angle. Albedo alone above the threshold
// produces a false sun, as real detectors can.
//
// Aperture array (ApertureArray, kind aperture-array): N small apertures in
// a mask at height h, spanning a square of side A, over a square detector of
// side D and pixel pitch p. A sun at (tan αx, tan αy) moves every spot by
// −h·(tan αx, tan αy) (pinhole geometry, closed form); the reading is valid
// while the whole pattern is on the detector, |tan α| ≤ (D − A)/(2h) per
// axis, and S·cos θ reaches the threshold. The software inverts the mean
// spot displacement with the nominal h, after centroid noise of
// p·σc/(h·√N) on each tan α (mean of N independent centroids of σc pixels;
// σ on the angle is cos² α times that). Drawn per unit: misalignment, a
// twist about the boresight, a mask offset δ per axis (a bias atan(δ/h) on
// the boresight, and the field's edge moved by δ) and a mask height h'
// (tan α read as tan α·h'/h). Albedo never moves the reading: the sun's
// radiance (2.0·10⁷ W/m²/sr) is about 4.6·10⁴ times a white Lambertian
// Earth's under a zenith sun (S/π = 433 W/m²/sr; closed form), so a
// thresholded centroid finds the sun's spot alone.
//
// Blinding (Blindable, BlindRule): a digital sensor's reading is dropped —
// invalid, not biased — while some of the Moon's disc is inside its cone
// (half-angle + the Moon's angular radius from the boresight of the unit as
// mounted, not hidden by the Earth) with an illuminated fraction above
// moon_blind_lit_fraction, or while the sub-satellite point is sunlit and
// the Earth's disc (angular radius asin(R/r)) reaches more than
// lit_earth_blind_depth_deg inside the cone (depth = half-angle + asin(R/r)
// − angle from the boresight to nadir; a depth of half-angle + 90° or more,
// which no orbit reaches, is refused). The defaults, 1 and 180°, can never
// be exceeded: the rule is off until a file sets a threshold, and the
// albedo centroid bias above stays the model of a sensor without one.
// Bodies holds the Moon and Earth geometry of a step; MoonInCone and
// LitEarthInCone are also the rules of the engine's Moon- and lit-Earth-in-
// view shares.
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
// On-board albedo correction (AlbedoSubtracter, the cosine kind): the flight
// software subtracts a predicted albedo irradiance E from a reading with the
// nominal gain, s' = s − E/S_ref (Cosine.SubtractAlbedo), clipped at 0 (a
// remainder within 4 ulp of s is 0: a perfect prediction leaves no rounding
// residue a zero threshold would count), valid when s was and s' reaches
// the threshold. With no gain mismatch and no ADC it returns the reading
// without albedo (closed form, TestCosineSubtractAlbedoUndoesTheAlbedo);
// with an ADC the two differ by at most one step
// (TestCosineSubtractAlbedoWithQuantisation).
//
// Validity gate (Gate): every estimate counts as available only when the
// estimator found one, it uses at least MinSensors sensors, their signals
// sum to at least MinSignal, and its fit Residual is at most MaxResidual.
// The residual is the RMS of m − n·x over the readings of a cosine fit
// (normalised signal; Σm² − x·b at the least-squares solution, since
// NᵀNx = b) and the RMS chord between each two-axis direction and the
// estimate. DefaultGate: each estimator's own minimum of sensors, half of
// full sun summed over a cosine fit (a 1 AU sun on a box's lit faces sums to
// |sx| + |sy| + |sz| ≥ 1; albedo alone gives one sensor at most ρ·(R/r)² of
// full sun, but several sensors facing the Earth add up, about 0.61 over
// five faces at 400 km, so the gate does not stop every albedo-only fit), no
// residual limit (common practice, no source). Combined lets
// its cosine part join only through CosineGate.
//
// Estimators: LeastSquares ŝ ∝ (NᵀN)⁻¹Nᵀm over lit cosine sensors (≥ 3,
// condition of NᵀN ≤ 100, eigenvalues by Smith 1961); OppositePairs
// ŝ ∝ (Σaaᵀ)⁻¹Σa(m₊ − m₋) over opposed pairs; TwoAxis the 1/σ²-weighted
// mean of two-axis directions; Combined adds the least-squares direction
// with a stated coarse σ.
//
// Temperature (cosine and quadrant kinds, Thermal): the sensor sits at
// temperature_sunlit_c in sunlight and temperature_eclipse_c in umbra,
// linear in the lit share of the solar disc through the penumbra (no
// thermal lag). Against its ground calibration at calibration_temperature_c
// a reading takes the gain factor 1 + k·(T − Tcal) (gain_tempco_pct_per_c)
// and the added dark signal D·(2^((T − Tcal)/T₂) − 1): the dark signal D at
// the calibration (dark_signal_at_calibration), which the calibration
// removes, doubles every T₂ = dark_doubling_c (10 °C: application-note rule
// of thumb, common practice, no source); on every cell alike for a
// quadrant. A model whose keys cannot act (temperatures off calibration
// with no dark signal or coefficient, or the reverse) is refused.
//
// # Assumptions
//
//   - The albedo on a digital sensor is a point source in its mean arrival
//     direction carrying the whole response-weighted irradiance (first order
//     in the albedo ratio). A quadrant gets it cell by cell through the
//     nominal geometry's cell responses (the drawn misalignment, twist,
//     offset and shade size of a unit do not move its albedo; second order); without
//     Albedo.Cells it falls back to the mean direction's lit proportions,
//     and to nothing when that direction lights no cell.
//   - A shade wall is thin and long enough to shade the full length of the
//     cells; its shadow band has sharp edges (no penumbra of the solar
//     disc, 0.27° half-width) and no reflection off the wall.
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
//   - Blinding drops the reading instead of biasing it: the centroid model
//     has no photometry of a Moon spot (the full Moon gives about 2.5e-6 of
//     the sun's irradiance, magnitude −12.7 against −26.7, from memory) or of
//     stray Earth light on the detector, and a unit that cannot tell them
//     from the sun is assumed to flag the frame (common practice, no
//     source). The thresholds are the user's statement of the unit's
//     stray-light behaviour; no default is claimed for real hardware. The
//     field of view of the rule is the cone of HalfAngle (a square field's
//     circumscribed cone), the Earth a sphere without atmosphere.
//
// # Accuracy
//
// The models are ideal geometry: no Fresnel loss unless given as roll-off,
// no diffraction, no edge penumbra of the spot; temperature only as the
// stated per-phase values, dark-signal doubling and gain coefficient (no
// thermal lag, no per-cell dark-current spread).
// Results are an analysis aid for choosing a layout, not a substitute for
// calibrated unit data; flight hardware needs qualified verification.
// The tests check the closed forms to 1e-12 rad, least squares on noiseless
// readings to 1e-9 rad, and noise statistics within 4 standard errors.
// Quadrant checks: cell areas of both geometries with gap and offsets
// against hand-worked elementary geometry to 1e-12; the wall's dead zone
// atan(d/H) = 30.000000000000° for d/H = tan 30°; inversion outside the dead
// zone to 1e-9 rad; with realistic errors (dark 0.002, noise 0.001, gain
// 1 %, misalignment 0.1°) 0 of 10 000 readings outside the dead zone beyond
// 3σ/cos θ of the derived σ (0.585°). Continuity: dark offsets and noise of
// 0.0005 of full sun over 30 random scenarios per kind change the p95 by at
// most 0.18° (cosine), 0.51° (aperture), 0.84° (wall), 0.08° (digital) and
// the valid share by at most 0.2 points (TestContinuityUnderSmallErrors);
// before the gate a quadrant went from 0.02° to 26.5°. A sun that stays
// on a gate's edge for a whole run (a fixed inertial attitude) still flips
// validity on a 0.01° shift: any threshold does. Albedo through the cell
// responses: see the albedo package (worst 0.56 % per cell against numpy).
//
// # References
//
//   - J. R. Wertz (ed.), Spacecraft Attitude Determination and Control,
//     Reidel 1978, ch. 6–7 (sun sensor models; from memory).
//   - O. K. Smith, "Eigenvalues of a symmetric 3×3 matrix", Comm. ACM 4(4),
//     168 (1961) (from memory).
//   - Quadrant transfers X = 2h·tan α/(w − g) (aperture) and X = −s/(2c − s),
//     dead zone atan(d/H) (wall): closed forms of elementary geometry above;
//     a 30° dead zone for a hobby four-quadrant shade is common practice, no
//     source.
package sensor
