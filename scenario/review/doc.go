// Package review turns one run into the design-review figures and the HTML
// report: it fills the plain tables of package plots (sky map, timeline,
// year view, error distribution, gaps) from a scenario, the simulation
// configuration the run used and its result, and judges the headline
// figures against the scenario's targets.
//
// # Model
//
// Review computes no physics of its own after the run: Request asks the run
// (sim.Config) for what the named figures need, and Figures builds those
// figures, and no other, from the result alone:
//
//   - sky map: sky.Map of the run's viewers on 2° cells, boresights from
//     the sensor mounts, the sun and nadir track the run kept;
//   - timeline: the short series the run kept over its first three orbits
//     (sim.Config.TimelineSpan), eclipse spans from the run's eclipse search;
//   - year view: the run's season table (sim.Config.Season: illum.YearTable
//     over the epoch's calendar year with the run's sun and shadow models),
//     on a J2 secular (j2-mean) propagator of the scenario's mean elements
//     whatever propagator the run used, so the year stays fast;
//   - coverage targets: sky.Coverage on the Fibonacci lattice of
//     sky.DefaultPoints points.
//
// # Assumptions
//
// The primary estimator is the first one listed. The "realistic" p95 error
// is the one with albedo when an albedo model is set, else the one without.
// Pass/fail compares the shown value with the target at full precision; a
// value that is NaN (no valid sample) fails its target.
//
// # Accuracy
//
// Figures and tables show the run's numbers unchanged (rounded for
// display). The year view samples one orbit per day, so it can miss the
// first or last day of an eclipse season. The report is an analysis aid,
// not flight verification: flight hardware needs qualified verification.
//
// # References
//
// The model sources the report lists are those of the packages used:
// J. Meeus, "Astronomical Algorithms", 2nd ed., 1998, ch. 25; O. Montenbruck
// and E. Gill, "Satellite Orbits", 2000, §3.4; D. D. V. Bhanderi and T. Bak,
// "Modeling Earth albedo for satellites in Earth orbit", AIAA GNC 2005;
// R. Knocke, J. Ries and B. Tapley, AIAA 88-4292, 1988; ECSS-E-ST-10-04C.
package review
