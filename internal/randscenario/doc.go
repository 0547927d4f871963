// Package randscenario draws random, valid scenario files for the property
// suite (scenario/properties and the CLI's property tests).
//
// # Model
//
// A draw is a File: plain structs that mirror the scenario file's keys and
// marshal to YAML, so every property runs through the same path a user's
// file takes (YAML → scenario.Parse → study.Config → sim.Run). Each draw
// comes from its own random stream seeded by (suite seed, case index), so
// one case can be replayed alone and adding cases changes none of the
// earlier ones. The draws cover orbits from 300 km to GEO (circular,
// sun-synchronous, eccentric Keplerian, TLE), every attitude law, every
// sensor kind with and without error models, every albedo model, both
// shadow models, obstructions and random layouts; the run is kept short
// (about 400 to 1500 steps).
//
// The structs are written here from the documented keys, not taken from
// the scenario package, so that the parser is exercised as a second path.
//
// # Assumptions
//
// The ranges drawn are those a CubeSat study uses (common practice, no
// source); they stay inside the limits the scenario file accepts.
//
// # Accuracy
//
// Not applicable: the package computes no physics.
//
// # References
//
// TLE column layout: Hoots & Roehrich 1980, Spacetrack Report No. 3 (from
// memory), restated by Vallado et al. 2006, AIAA 2006-6753.
package randscenario
