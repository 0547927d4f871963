// Package layout finds the smallest set of sun sensors, chosen from candidate
// mounts, that meets a scenario's targets, ranks the alternatives and gives
// the trade-off front of sensor count, sky coverage and error.
//
// # Model
//
// Exact branch and bound over subsets of the candidates (include / exclude,
// in candidate order, at most MaxSensors chosen). The bound is the sky
// coverage: the fraction of a Fibonacci lattice of body directions seen by at
// least k sensors, on the lattice run judges the coverage target on
// (DefaultPoints = sky.DefaultPoints, 65 536 points), so a subset's coverage
// here is the number run prints for it and the chosen set passes run's
// coverage target. Each lattice point is kept as its visibility signature
// (the bit mask of the candidates that see it) and the points of one
// signature are counted together: the same counts as point by point, at a
// cost set by the cells the candidates cut the sky into. Adding a sensor never lowers a point's count, so the
// coverage of a subset is at most that of the subset plus every candidate not
// yet decided; a branch is pruned when even that cannot reach MinCoverage.
// The same holds for the worst single-failure coverage (for S ⊆ T and any t,
// T∖{t} ⊇ S∖{t}), which is the bound when SurviveOneFailure is set. Only
// subsets that pass the coverage target reach the injected, expensive
// Evaluate (the time simulation in every attitude mode); they are evaluated
// by increasing size, most coverage first, in parallel batches taken in list
// order. Every size below the answer is evaluated in full, so the answer is
// the fewest sensors; at that size the search stops once Top feasible subsets
// are found and every later subset whose coverage is within Resolution of
// the last of them has been scored (the order of work cannot tell them
// apart), and those are the ranked alternatives (ranked among themselves,
// not over every feasible subset of the size). The rank: larger margin
// first; equal margins by coverage, where coverages closer than Resolution
// tie (a chain of such steps is one tie, CoverageClass); ties by the smaller
// p95 error, then the larger coverage, then the order of work. The cost is set by
// how many subsets pass the coverage bound below the answer's size: a loose
// coverage target with strict time targets means many simulations.
// MaxEvaluations stops the work: a feasible subset found before the stop is
// still the fewest (every smaller size was evaluated in full), only the
// ranking is partial; with none found the search is incomplete, and
// Result.Untried counts the coverage-passing subsets it did not evaluate.
//
// # Assumptions
//
// Coverage is counted on the lattice, so a target of 1.0 means "every lattice
// point". SurviveOneFailure applies to the coverage target here; the time
// targets are judged on the full subset (the caller's Evaluate may do more).
// Above MaxCandidates candidates the search is refused rather than turned
// into a heuristic, so its answer is always exact for the lattice used.
//
// # Accuracy
//
// Exact on the lattice. With N points the count steps by 1/N, but the share
// of a region bounded by cone edges is only resolved to about Resolution(N)
// = 2·N^(−3/4) (4.9e-4 at 65 536 points, a mean spacing of 0.8°): measured
// on random spherical caps against the closed form (1 − cos θ)/2
// (TestResolutionBoundsCapError). A gap in the sky smaller than the spacing
// can be missed, and a coverage within Resolution of min_coverage could fall
// either side on the sky itself (the command says so). An analysis aid; a
// flight layout needs qualified verification.
//
// # References
//
//   - Land & Doig, "An automatic method of solving discrete programming
//     problems", Econometrica 28(3), 1960 (branch and bound), from memory.
//   - Closed form: the six face normals' farthest direction, a cube corner,
//     lies arccos(1/√3) = 54.7356° from the nearest face normal.
package layout
