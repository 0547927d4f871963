// Package budget splits the sun-vector error of a layout into its sources,
// finds how large each source's 1σ may grow before a target is missed, and
// shows what calibration and a simple albedo correction buy.
//
// The core (Decompose, FindTolerance, Sensitivity) works over an injected
// RunFunc, so it can be tested on closed-form budgets; Runner supplies the
// RunFunc of a scenario through the seeded Monte Carlo of package sim. The
// orbit, sun, shadow, attitude and albedo do not depend on the error values,
// so the Runner records them once (sim.Trace) and reads each case's sensors
// on them (sim.Trace.RunArray; equal to a full run of the case,
// TestSharedGeometryEqualsFullRuns); a case with an albedo correction, an
// attitude drawn per unit or a geometry over 256 MiB runs in full.
//
// # Model
//
// A run is the scenario's Monte Carlo with each error source's stated 1σ
// multiplied by a scale (0 = off): dark offset, gain mismatch, noise,
// quantisation (on/off), misalignment, aperture offset, twist and shade
// size (quadrant sensors), digital-sensor accuracy and albedo (on/off). The figure of a run is, for
// the primary estimator over sunlit samples with a valid estimate, the mean
// over units of each unit's p95 error (the p95 of a typical unit) and the
// RMS pooled over units. The budget runs each source alone and all
// together, ranks the sources and compares the root-sum-square of the terms
// with the all-together figure; the gap's 95 % interval comes from a
// percentile bootstrap over units (Efron & Tibshirani 1993, An Introduction
// to the Bootstrap, ch. 13), resampling the same units in every run.
//
// Temperature is a term switched on or off: off, every sensor with a dark
// signal or gain coefficient reads as at its calibration temperature. The
// calibration range (FindTemperatureRange) moves every such sensor alike,
// sunlit and eclipse, from its calibration temperature in 10 °C steps each
// way up to ±100 °C and bisects the first step that misses the target to
// 0.5 °C: the span of temperatures over which the ground calibration keeps
// the p95 target. Since the readings depend on a dark signal D and the
// offset ΔT only through D·(2^(ΔT/T₂) − 1), halving D moves the hot end to
// where that product is the same (TestCalibrationRangeFollowsTheDoublingRule).
//
// A tolerance is found by bisection on one source's scale with the others at
// their stated values, to 1 % of the bracket, then re-run at the returned
// scale and at 1.1 × it. Every run draws the same standard-normal numbers
// (common random numbers, seeded per unit by sim), so the figure is a
// smooth function of the scale and the bisection converges. A scale at
// which some unit gives no valid sun vector at all (ErrNoValid: a quadrant
// twisted or offset out of its linear range) counts as missing the target.
//
// # Assumptions
//
//   - The budget's runs are capped at DefaultMaxDurationS (6 h) unless told
//     otherwise: a fixed attitude's statistics settle within a few orbits,
//     but seasonal effects (beta angle, eclipse season) are not covered.
//   - A source whose scale is searched but that no sensor states is scaled
//     against a reference σ (common practice, no source).
//   - The p95 terms are not additive in general: per-unit biases (dark
//     offset, gain, misalignment) and per-sample noise combine non-linearly
//     in a percentile, and the estimator's validity threshold clips. Only the
//     RMS of independent errors linear in their sources adds in RSS (closed
//     form); the output shows both.
//   - The albedo correction subtracts the prediction of the scenario's
//     on-board model (albedo.onboard; without one, a uniform model of the
//     truth's value) from the cosine readings in signal units with the
//     nominal gain, through the engine's corrected readings
//     (sim.Config.NewCorrection); two-axis sensors are not corrected. When
//     that model is the truth's own, the correction is perfect by
//     construction but for gain mismatch and ADC rounding, and the budget
//     says so.
//
// # Accuracy
//
// Sampling error: the bootstrap interval is given from MinIntervalUnits (10)
// units on; below that a nominal 95 % percentile interval holds the true
// value well under 90 % of the time (closed form for normal units, see
// MinIntervalUnits), so neither it nor a conclusion is given. With
// 16 units the p95 of a typical unit carries a few per cent of sampling
// error. A tolerance is accurate to 1 % of the scale plus that sampling
// error; it is an analysis aid, and a flight decision needs qualified
// verification of the hardware.
//
// # References
//
//   - B. Efron, R. J. Tibshirani, An Introduction to the Bootstrap, Chapman &
//     Hall 1993, ch. 13 (percentile interval).
//   - Variances of independent errors add (closed form); small errors of a
//     least-squares estimate are linear in the reading errors (closed form).
package budget
