// Package study turns a resolved scenario into the engine's configuration
// and judges a run against the scenario's targets.
//
// # Model
//
// Config and ConfigFor map a scenario.Scenario onto the physics objects:
// the propagator (orbit), the sun model (ephem), the attitude law
// (orbit/attitude), the sensors and estimators (illum/sensor), the
// obstructions (illum/sky) and the albedo model (illum/albedo), and return a
// sim.Config. CheckTargets is the one target judge used by the summary, the
// report and the layout search. Prepare builds the plan of a run (the
// primary attitude and each mode) and is what both `check` and `run` call;
// Derive gives the values `check` prints (period, SSO inclination, RAAN
// from the LTAN in mean solar time, beta range sampled every 600 s, steps,
// a memory estimate fitted to measured peaks); Warnings flags a run outside
// the sun model's stated span, a TLE more than MaxTLEAgeDays from the run
// and a run shorter than one orbit. A TLE used at another epoch is carried
// there with the secular J2 rates (MeanElements). RunSingleFailure
// simulates the primary attitude again with each sensor (and, asked for,
// each pair) removed from the layout, replaying the recorded geometry
// (sim.Trace) when the attitude is not drawn per unit; CheckSingleFailure
// judges the n_minus_1 targets on the worst failure for each figure.
//
// # Assumptions
//
// A failed sensor is removed (it reads nothing, the estimators never see
// it); a sensor that fails stuck at a value is not modelled. The remaining
// sensors' error draws and noise are drawn afresh for the reduced layout,
// so failed runs compare with the unfailed one statistically, not draw by
// draw.
//
// Sun-synchronous orbits take their inclination from the secular J2 condition
// and their RAAN from the local time of the ascending node (see orbit).
//
// # Accuracy
//
// This package computes nothing of its own; the accuracy is that of the
// models it configures (see their doc.go).
//
// # References
//
// See the packages it configures.
package study
