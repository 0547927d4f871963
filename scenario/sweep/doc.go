// Package sweep runs one scenario many times with some of its keys changed:
// altitudes, local times of the node, epochs, layouts, modes or any other
// field of the scenario file. It builds the cases, runs them on a worker pool,
// keeps one result file per finished case so a killed or sharded sweep can
// resume or be merged, and assembles the sweep table.
//
// # Model
//
// A case is the scenario file with each varied key set to one value. The
// edit is made on the YAML node tree (go.yaml.in/yaml/v3) and the edited tree
// is checked with scenario.ParseNode, so every key of the schema can be swept
// and every case is checked with the messages of a plain scenario file: a key
// of the user's file is cited by its line there, a value the sweep set by the
// --vary that set it. The
// special keys "layout" (a name from body.layouts, replacing body.sensors)
// and "mode" (a name from modes, replacing attitude) are applied first.
// Values are ranges "lo:hi:step" (end included when on the grid), or comma
// lists. Axes combine as a cross product (the first axis varies slowest), or,
// with Zip, pairwise.
//
// Each case's seed is derived from the scenario seed and the case index by
// the SplitMix64 finaliser (Steele, Lea & Flood 2014, OOPSLA, from memory),
// so results do not depend on the worker count or the shard.
//
// # Assumptions
//
// A case file records the case's inputs and a SHA-256 of its resolved
// scenario; resuming refuses a folder whose plan or case files disagree.
// Cases run with one simulation worker each; the pool runs GOMAXPROCS cases.
//
// # Accuracy
//
// The sweep adds no numerical error: each case is one sim.Run. The table
// prints floats with six decimals; the case files keep full precision.
// The figures are an analysis aid; flight decisions need qualified
// verification of the numbers behind them.
//
// # References
//
//   - Steele, Lea & Flood, "Fast splittable pseudorandom number generators",
//     OOPSLA 2014 (SplitMix64 finaliser constants), from memory.
package sweep
