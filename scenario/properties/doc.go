// Package properties holds the random-scenario property suite: the
// invariants of the project's list of properties, asserted on random
// scenarios drawn with a fixed seed (internal/randscenario) and on the
// models directly where a closed form is more natural. It has no code of
// its own outside its tests.
//
// # Model
//
// Each case draws a scenario file, writes it as YAML and runs it through
// the user's path: scenario.Parse, study.Config, sim.Run. Every invariant
// compares the run with something independent of it: a definition (shares
// ordered, fractions summing to one), a second run of a transformed file
// (a sensor removed, the step halved, the layout rotated with the
// attitude, the attitude perturbed by 1e-9 rad, the errors made small), a
// closed form (cylindrical shadow duration, the 54.7356° six-face
// coverage, the view factor of a sphere), or a second computation (sky
// coverage against time coverage under an isotropic attitude).
//
// A failing case prints its scenario as YAML: save it to a file and replay
// it with `sunsight run FILE`, or rerun the one case with
// `go test ./scenario/properties -run 'TestRandomScenarios/case017'`.
// SUNSIGHT_PROPERTY_CASES sets the number of cases (default 48) and
// SUNSIGHT_PROPERTY_SEED the suite seed (default 1) for a longer soak.
//
// # Assumptions
//
// An invariant still broken on the main line for a reason tracked in an
// open issue is listed in knownFailures with the issue number: where it
// fails, the case is skipped with the issue and the drawn numbers; where it
// holds, it is checked like any other.
//
// # Accuracy
//
// Tolerances are stated beside each invariant: rounding (1e-12), one
// sample of the time grid per event or transition, or 4σ of a binomial
// share.
//
// # References
//
// The invariants and their sources are listed in the project's list of
// properties; closed forms are cited beside each test.
package properties
