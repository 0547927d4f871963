// Package sky measures how much of the sphere of directions, in body axes,
// a set of sensors sees, and what deployed panels, antennas and booms hide.
//
// # Model
//
// Directions are sampled with the Fibonacci (golden-spiral) lattice, each
// point standing for an equal area 4π/N (default N = 65536, spacing 0.81°).
// Coverage counts the viewers that see each point and reports the fractions
// seen by ≥ 1, 2 and 3 viewers, and for each viewer removed in turn the same
// fractions, their minimum and the critical viewer (single failure, N−1).
// Map gives an azimuth/elevation grid of counts (cells of 1°, 2°, …; each
// cell sampled at its centre, weighted by its solid angle) for plots.
//
// Viewers are anything with Sees(dirBody) bool, so the sensor package's
// field-of-view tests plug in directly; Cone is a plain circular field of
// view. Obstacles are Rectangle (a flat plate given by centre and two half-
// extent vectors), Cylinder (a solid rod about a segment) and Box (a solid
// axis-aligned box: the bus outline); Obstructed wraps a Viewer, its mount
// position, the outward normal of the surface it sits on and the obstacles
// into a Viewer. A sensor never sees a direction at or behind its mounting
// plane (d·n ≤ 0), whatever its field of view: a +X sensor tilted 45° with
// an 80° half-angle sees 32.9 % of the sky, not the 41.3 % of its bare cone.
// From a point on a face of a convex bus the box hides exactly the space
// behind that face; it hides more from a sensor standing off the bus (on a
// boom or a deployed panel) or beside a protrusion.
//
// Plate is a flat surface (a solar panel) sampled at the centres of 8 × 8
// equal cells (NewPlate, in-plane axes from PlateAxes): its LitShare is the
// share of the points from which a direction is above the plate's plane and
// meets no obstacle, the share of the plate the sun reaches. A plate under
// a box that covers half of it is half lit with the sun overhead
// (TestPlateHalfShadowedByBox; the shadow's moves with the sun's tilt follow
// the closed-form interval to one sample column, 1/8).
//
// # Assumptions
//
// The sun (and each albedo ray) is at infinity: a direction is hidden when
// the ray from the sensor's mount point meets an obstacle, with no
// penumbra from the sun's 0.27° radius and no partial shading of a sensor's
// aperture. Obstacles are opaque and do not reflect light. Positions are in
// any one length unit.
//
// # Accuracy
//
// Fractions from the lattice carry a sampling error of order 1/N for zonal
// regions and a few times that at tilted field-of-view edges: measured
// 1.4e-4 for single cones and 1.6e-4 for six face cones at N = 65536.
// Thresholds such as "full coverage" are decided on the sample points, so
// a hole narrower than the lattice spacing can be missed; check a critical
// layout at a larger N or analytically. These are geometric fields of
// view: a real sensor's usable field is narrower near its edge (reduced
// signal, glint, albedo), so coverage from here is an upper bound and not a
// substitute for qualification of the flight layout.
//
// # References
//
//   - González, Á. (2010). Measurement of areas on a sphere using Fibonacci
//     and latitude–longitude lattices. Math. Geosci. 42, 49–64 (from memory).
//   - Wertz, J. R. (ed.) (1978). Spacecraft Attitude Determination and
//     Control, ch. 7 — five two-axis sensors of ≥ 63.5° half-angle cover the
//     sphere (from memory; the bipyramid layout's covering radius is
//     arctan 2 = 63.435°, closed form, checked in the tests).
//   - Press, W. H. et al. (2007). Numerical Recipes, 3rd ed., §5.6 — stable
//     quadratic roots (from memory).
package sky
