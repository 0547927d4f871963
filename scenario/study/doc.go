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
// report and the layout search.
//
// # Assumptions
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
