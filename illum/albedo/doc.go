// Package albedo computes the sunlight reflected by the Earth (albedo) onto
// small flat sensors on a spacecraft: the irradiance each sensor sees, the
// mean direction the light comes from, and how much of its field of view the
// sunlit Earth fills. The simulation loop calls Model.Irradiance every step,
// or, with a uniform albedo, the precomputed LocalTable (nadir pointing on a
// circular orbit) or BoresightTable (any attitude); the models of
// NewTableFactory read zonal albedo from shared BoresightTables.
//
// # Model
//
// The Earth is a sphere of radius Rₑ = 6378.137 km (WGS 84 semi-major axis)
// whose surface reflects diffusely (Lambert). A surface element at P with
// outward normal N̂ and reflectivity ρ(P), lit by the sun from direction ŝ,
// has radiance
//
//	L = ρ S (N̂·ŝ)/π   where N̂·ŝ > 0, else 0                (Lambert's law)
//
// with S = S₀ (AU/d)², S₀ = 1361 W/m² (Kopp & Lean 2011), AU from IAU 2012 B2.
// A sensor with boresight n̂, cone half-angle H and relative response R(θ)
// receives
//
//	E = ∫_{θ < H} L(ω) R(θ) dω
//	  = ∫_{visible ∩ sunlit} ρ S (N̂·ŝ)(N̂·ê) R(θ) / (π d²) dA
//
// (the cell-sum formulation of Bhanderi & Bak, "Modeling Earth albedo for
// satellites in Earth orbit", AIAA GNC 2005, from memory), ê the unit vector
// from P to the spacecraft, d the range, cos θ = n̂·(−ê). For a cosine sensor
// (R = cos θ) E is the irradiance on the sensor plane. With L = 1/π everywhere
// (no sun) the same sum is the plate-to-sphere view factor; Model.ViewFactor
// exposes it.
//
// The integral is a sum over n cells of equal solid angle that tile the cone
// of directions meeting the Earth (nadir angle ≤ asin(Rₑ/r)): one polar cell
// and rings after Leopardi's recursive zonal equal-area rule. The cells live
// in a frame whose z axis points at the spacecraft; they are built once for
// an orbit radius and then only the sun and the sensor normals are rotated
// into that frame each step (six dot products per vector), never the cells.
// Each cell stores its solid angle and the solid-angle means of the arrival
// direction and of the surface normal (Gauss–Legendre in the radius with a
// substitution for the √ behaviour at the limb); both factors of the
// integrand are linear in these, so a cell wholly lit and wholly in view is
// summed exactly in each factor. Per step, one pass over the cells gives each
// lit one its radiance (shared by all sensors); each sensor then sums its
// cone. The cells form rings of one nadir angle, and on a ring the cosine to
// a boresight is k·cos(φ − ψ) − n_z·cos α, so the cells a cone can reach lie
// on one arc of azimuths: each sensor visits only those arcs (widened by
// 1e-6 rad, threshold lowered by 1e-12), in cell order, and still applies
// the exact test, so the sum has the same terms in the same order as a sum
// over every cell and the same bits (TestWindowsMatchEveryCell). Cells that the cone edge cuts are weighted by the mean of R over
// the part inside, taking cos θ uniform over ±(√a/2)·sin θ (a the cell's
// solid angle).
//
// A sensor split into cells (Sensor.Cells, a four-quadrant sun sensor) is
// summed through each cell's own response instead of a cone: every lit
// Earth cell, at its mean arrival direction d in the sensor frame (X, Y,
// Normal), adds w·CellResponse(d)[i] to detector cell i, so each part of the
// Earth lights the cells its own spot (or the wall's shadow) leaves lit
// (midpoint rule; the cell responses are continuous, so no edge weighting).
// Result.Cells holds the four sums and Irradiance their total. The tables
// hold cones only and refuse such sensors; the engine integrates them beside
// a table.
//
// Reflectivity models: Uniform (default 0.30, ECSS-E-ST-10-04C Annex F.5.1
// design mean; Stephens et al. 2015, Rev. Geophys. 53, give ≈ 0.29); Zonal,
// the second-degree Legendre fit in latitude with a seasonal first-degree term
// of Knocke, Ries & Tapley 1988 (AIAA 88-4292) as reproduced in
// ECSS-E-ST-10-04C Annex F.5 (coefficients from memory, KnockeZonal); Grid, a
// latitude × longitude CSV map (year-round or monthly, see Grid), looked up at
// the nearest cell with Earth-fixed longitude = right ascension − GMST; or any
// type implementing Reflectance. The grid's row and column are found without
// asin and atan2 where that is safe: the row from a table over 8192 bins of
// sin φ (a bin whose ends, widened by 1e-12, fall in one row), the column
// from an interpolated atan (error ≤ 7.7e-8 rad, TestFastAtan2) when the
// longitude lies more than 1e-6 rad from every column edge; elsewhere asin
// and atan2 decide. The cell is always the one the trigonometric lookup
// gives (TestGridLookupMatchesTrig), so the results are the same bits. A
// Zonal profile that cannot leave [0, 1] at any latitude and season (closed
// form; Knocke's cannot) skips its clamp.
//
// LocalTable replaces the cell integral by a table when its result depends on
// the sun direction alone: a Uniform reflectance, one orbit radius (a
// circular orbit) and sensors fixed in a frame whose +Z axis points to nadir
// (a nadir-pointing spacecraft; the x and y axes are free). The visible cap
// is then symmetric about nadir, so each sensor's Result is a function of the
// sun direction in that frame, and E scales with (AU/d)². NewLocalTable forms
// the cell sum of Model.Irradiance (the same cells and sensor sums, so the
// table inherits their accuracy; along a column of fixed sun azimuth a lit
// cell's weight is linear in the sine and cosine of the polar angle, so the
// sums over the column are running sums fed where each cell's lit run
// starts and ends: the nodes equal the integral to rounding,
// TestLocalTableNodesAreTheIntegral) on a grid of the sun's polar angle from nadir and its
// azimuth, step resDeg (default 1°), with half the polar step from 70° to
// 110° from nadir, where the terminator passes under the spacecraft and the
// mean direction turns fastest. Each node keeps E, the three components of
// E·Dir and Fill; a lookup interpolates them bilinearly and renormalises
// E·Dir. With the sun below the horizon of every visible point (polar angle
// from nadir ≤ 90° − λ, cos λ = Rₑ/r) the result is exactly zero, and those
// grid rows are not integrated. The 1° table for six sensors holds 221 × 360
// nodes (19 MB); the build runs on up to GOMAXPROCS goroutines.
//
// A sensor may carry the outward normal of the surface it sits on
// (Sensor.Plane): cells at or behind that plane are left out of its sum, so
// a tilted sensor whose cone reaches behind its face gets only the Earth in
// front of it (cell centres decide; a cell straddling the plane counts
// whole or not at all).
//
// # Assumptions
//
//   - Spherical Earth, no atmosphere: no twilight, no limb brightening, no
//     specular glint; the terminator is the great circle N̂·ŝ = 0.
//   - Lambertian reflection. Real reflection is anisotropic (forward scatter
//     over oceans, clouds); Lambert is the usual design assumption, not truth.
//   - The sun is at infinity for directions (one ŝ for all cells); its
//     distance only scales S.
//   - Latitude is geocentric, taken from the EME2000 z axis: precession of the
//     pole since J2000 (≈ 0.36° by 2026) and polar motion are ignored, which
//     is far below the resolution of any zonal or gridded albedo map.
//   - No shadowing of the sensor by the spacecraft itself and no Earth
//     infrared; the caller's obstruction model handles the former.
//   - Altitude changes (eccentric orbits, J2 short-period motion): the cells
//     are rebuilt, not scaled, whenever the orbit radius differs by more than
//     Config.RebuildKm (default 0.25 km) from the radius they were built for;
//     in between the geometry of the build radius is used. Measured
//     (TestDriftWithinRebuildTolerance): a 0.25 km drift changes E by up to
//     about 6e-4 for a sensor that sees only the limb (1 km: 2e-3), as the
//     edge of the disc moves by tan η·dr/r. A rebuild reuses its memory and
//     costs about as much as one six-sensor call (see the benchmarks).
//   - A Model keeps scratch space and is not safe for concurrent use; make
//     one per goroutine.
//   - LocalTable: uniform reflectance only (NewLocalTable refuses others),
//     the radius it was built for, and sensors fixed in the nadir frame. For
//     another attitude, or a zonal or gridded map, call Model.Irradiance. The
//     radius matters: against the integral at r + Δr, the 550 km table is off
//     by up to 7.5e-4 of a sensor's peak for |Δr| = 1 km, 3.7e-3 for 5 km and
//     7.4e-3 for 10 km (relative 4 % where E is 1 % of the peak;
//     TestLocalTableRadiusDrift). A "circular" orbit under J2 with a frozen
//     eccentricity of 1e-3 swings by about ±7 km: check |r − RadiusKm()|
//     against this budget before trusting the table for such an orbit.
//   - BoresightTable: any attitude, a uniform reflectance and one cone
//     (half-angle and response) per table. With a uniform Earth the albedo on
//     a cone depends only on the sun's angle from nadir θs, the boresight's
//     angle from nadir θn and the azimuth φ between them (mirror-symmetric in
//     φ), and on the orbit radius. NewBoresightTable forms Model.Irradiance's
//     cell sum at every node (θs on
//     LocalTable's polar grid at DefaultBoresightSunResDeg = 1.5°, θn and φ
//     at DefaultBoresightStepDeg = 3°, θn only as far as the Earth's disc plus
//     the cone reaches): a lit cell's weight is linear in (sin θs, cos θs) over
//     the run of θs nodes where it is lit, so each node's sums over all θs
//     are running sums of its cells' cone weights, fed where each cell's run
//     starts and ends (the nodes equal the integral to float32 rounding,
//     TestBoresightTableNodesAreTheIntegral). It stores E and E·Dir as
//     float32 and interpolates
//     linearly in θs, θn, φ and the radius. Against the cell integral at
//     random radii between nodes 25 km apart, random attitudes and suns
//     (TestBoresightTableMatchesIntegral): a 90° cone at 400 km within
//     3.5e-4 of the peak and 0.43° in direction (where E ≥ 1 % of the peak),
//     a 30° cone at 700 km within 3.6e-3 and 0.6° (the boresight step
//     dominates; narrow cones are the worst). Radii within BoresightSlackKm
//     (1 km) beyond the end nodes take the end values. About 12 MB per radius
//     for a 90° cone; one radius of a 60° cone at 550 km builds in about
//     0.05 s of CPU at the default 2000 cells (BenchmarkBoresightTableBuild;
//     26× less than one integral per θs node, measured side by side).
//     SharedBoresightTable keeps uniform tables for the process, keyed by
//     the bits of all they depend on (at most 64 MiB, the least recently
//     asked for dropped first): the short runs of a season build them once.
//   - Zonal BoresightTable: a Zonal profile that never leaves [0, 1] (the
//     clamp would break what follows; Knocke's stays inside) is a quadratic
//     in s = N̂·P̂ (P̂ the pole): ρ = (A0 − A2/2) + A1 s + (3A2/2) s², so
//     its cell sum is Σₖ cₖ Iₖ, with Iₖ the cell sums for the ten
//     "reflectances" 1, Nᵢ, NᵢNⱼ of the cell's mean normal in the local
//     frame (functions of the local geometry alone, so the same three angles
//     serve) and cₖ from the season's A1 and the pole in the sun frame
//     (BoresightTable.Season; the mirror flips P_y). Exact before
//     interpolation; the table keeps E and the vector sum of E·u per
//     channel, ten times the memory of a uniform one (51–83 MB per radius
//     for 30°–90° cones) and builds in about 0.27 s of wall time on two
//     cores for a 60° cone at 550 km (BenchmarkZonalBoresightTableBuild).
//     NewTableFactory gives models that share one table per cone at the
//     altitude of a circular orbit (within BoresightSlackKm; other steps,
//     cell sensors and sensors with a mounting plane integrate); the
//     scenario builder uses it for zonal runs of at least 50 000 steps on
//     j2-mean or two-body orbits.
//
// # Accuracy
//
// Numerical accuracy against an independent brute-force integration over the
// solid angle (testdata/gen_albedo_ref.py, numpy, 4000 × 4000 points,
// converged to < 1e-6 relative for the hemispherical sensor and < 2e-4 for
// the 60° cone, see testdata/gen_albedo_ref.log): 312 cases at 400, 550 and
// 800 km, solar zenith 0…100°, tilts 0…120°, three azimuths, uniform ρ = 0.30.
// Worst error over the cases with E ≥ 1 % of ρS (4.1 W/m²); below that floor
// the worst absolute error is given (TestConvergence prints this table):
//
//	cells   hemispherical (90°)        60° cone
//	  250   1.31 %    0.21 W/m²        2.99 %
//	  500   0.44 %    0.08 W/m²        0.88 %
//	 1000   0.19 %    0.03 W/m²        0.49 %
//	 1500   0.19 %    0.03 W/m²        0.37 %
//	 3000   0.077 %   0.012 W/m²       0.16 %
//	 6000   0.040 %   0.007 W/m²       0.11 %
//	12000   0.019 %   0.003 W/m²       0.068 %
//
// DefaultCells is 2000: on every field of view from 10° to 90° at 400 km
// with the sun 80°, 90° (horizon) and 100° from the sub-satellite zenith
// (testdata/gen_albedo_fov.py, the same brute force, 54 cases) the worst
// relative error is 0.69 % at 1000 cells (40° cone; 0.65 % at 70°), 0.50 %
// at 1500, 0.41 % at 2000, 0.30 % at 3000 — the cone edge crossing the lit
// cap converges slowly (TestDefaultResolutionEveryFieldOfView).
//
// The worst cases are plates tilted 120° from nadir that see only the limb.
// Mean arrival direction: worst 0.11° (hemispherical) and 0.25° (60° cone).
// Knocke zonal albedo (45 cases at 550 km, spacecraft latitude 0/45/80°,
// testdata/albedo_zonal_ref.csv): worst 0.095 %, direction 0.07°.
// Cell sensors against an independent numpy integral of the same quadrant
// responses over the solid angle (testdata/gen_quadrant_ref.py, 3000 × 3000
// directions, converged to 3e-7; 90 cases: an aperture sensor, an aperture
// wider than the detector and a 30° shade wall, 550 km, solar zenith
// 20…85°, tilts 0…75°, two azimuths and clock angles): worst 0.56 % per cell
// at DefaultCells (0.10 % at 6000 cells), TestQuadrantAlbedoAgainstNumpy. A
// cosine over the circumscribed cone, used before, overstated the quadrant's
// albedo 1.23–1.40×.
//
// View factor against the closed forms of Howell's catalogue (plane element to
// sphere, full and partial view) at 400/550/800 km, tilts 0…150°: worst
// 7.8e-5 relative at the default resolution (absolute 5e-6 where the plate
// sees only a sliver of the limb).
//
// LocalTable (default 1° grid, DefaultCells) against Model.Irradiance run
// in EME2000 at random spacecraft positions and local x/y axes, 10⁴ random sun
// directions, six face cosine sensors (TestLocalTableAgainstModel):
//
//	      worst |ΔE|            rel where E ≥ 1 %   Dir where E ≥ 1 %
//	km    of the sensor's peak  of the peak         of the peak
//	400   9.6e-5 (0.030 W/m²)   0.88 %              0.24°
//	550   8.0e-5 (0.022 W/m²)   0.69 %              0.20°
//	800   6.5e-5 (0.016 W/m²)   0.56 %              0.14°
//
// The worst cases lie with the sun 80°…100° from nadir. With the terminator
// near the limb (the sun within 15° of the dark limit) the worst is 6e-5 of
// the peak, 0.36 % relative and 0.08° in direction. Where E is below 1 % of the
// peak (under 0.03 W/m² for the cases met) the direction can be off by tens
// of degrees: it is the direction of a vanishing sliver. Fill is within 5e-3
// (the cell count is a step function of the sun direction). Against the numpy
// brute force of testdata/albedo_ref.csv, a 2.5° table stays within the
// model's own errors (worst 0.50 % relative, 0.25°;
// TestLocalTableAgainstReference). Error falls as the square of the step:
// 0.5° divides the errors by about 4, at four times the memory and build time.
//
// The shortcuts of the integral (each sensor's ring arcs, the binned grid
// row and column, the zonal clamp skipped where it cannot act) change no
// result: they are tested bit for bit against the plain sum over every cell
// and the trigonometric lookup, and 30-day runs with uniform, zonal and
// gridded albedo write the same JSON with and without them. Gridded maps
// have no table: every step is the cell integral, with the errors above.
//
// The zonal BoresightTable (Knocke's profile, default grids) against the
// cell integral of the same model at random positions, suns, boresights
// and dates over a year, 4000 cases each (TestZonalBoresightTableMatchesIntegral;
// E ≥ 1 % of the sample's peak for the relative and direction errors):
//
//	cone, km    worst |ΔE| of peak   rel        Dir
//	90°, 400    3.9e-4               1.1 %      0.40°
//	60°, 550    2.0e-3               3.4 %      0.34°
//	30°, 700    3.5e-3               9.9 %      0.54°
//
// the same order as the uniform BoresightTable (1.5 % and 16 % relative for
// the 90° and 30° cones in TestBoresightTableMatchesIntegral): the
// boresight step of 3° dominates, and the worst relative errors sit where
// the cone edge crosses a thin lit crescent. On 30-day runs of the bench's
// inertial and nadir scenarios with Knocke albedo the figures move by up
// to 0.06° in the p99 error and 3e-4 in the albedo-only valid shares;
// an on-board correction with the same model goes the same route and
// leaves the same residual as with the integral.
//
// These figures bound the numerical error of the model only. The physical
// error of a Lambertian model with a mean or zonal albedo against the real,
// cloudy Earth is far larger: instantaneous albedo under a sensor ranges from
// about 0.05 (open ocean) to 0.6 or more (cloud, ice) (ECSS-E-ST-10-04C Annex
// F.5.1), so a single-step albedo irradiance can be wrong by a factor of two.
// Use the results to compare layouts and bound errors, not as a prediction of
// a flight reading; flight hardware needs qualified verification.
//
// Speed: one call for six hemispherical sensors at the default resolution
// does not allocate. Measured on a shared 2-core machine under load (median
// of 6 runs, go test -bench, one run, before the arcs of the ring windows
// and the grid lookups above): uniform 22 µs, zonal 29 µs, demo grid
// 103 µs (asin and atan2 per lit cell), a geometry rebuild 28 µs, uniform at
// 6000 cells 136 µs, against 15.5 µs for the calibration loop in
// albedo_bench_test.go (ratios 1.4, 1.9, 6.6, 1.8 and 8.8). The cost is
// linear in cells × sensors; a sensor whose cone misses the disc costs
// nothing. Along an orbit (BenchmarkOrbitSteps: six 60° cones of an
// inertial body, 550 km, eclipses included, per step), before → after the
// ring windows and the grid lookups: uniform 19.0 → 13.5 µs, zonal 26.5 →
// 15.3 µs, demo grid 85 → 36–40 µs (separate runs of a loaded machine).
// With the cell integral every step, a 30-day inertial run at 10 s
// (bench/month-inertial-albedo-zonal.yaml and -grid.yaml, /usr/bin/time)
// takes about 5 s of CPU with zonal and 11 s with the demo grid (before
// the arcs and lookups: 6–7 s and 20 s), against 0.5 s with uniform albedo
// on the boresight table and 0.2 s without albedo, measured back to back.
// With the shared zonal tables (BenchmarkOrbitSteps/zonal-tables) a zonal
// step costs 1.5–3.1 µs against 15–18 µs for the integral in the same run,
// and the 30-day inertial zonal run takes 0.7 s of CPU instead of about 5 s
// (the scenario builder picks the tables for it).
//
// LocalTable lookup for six sensors (BenchmarkLocalTable, one run of 4,
// medians): 250 ns with the sun on the lit side and 140 ns averaged over a
// 550 km orbit with β = 29°, against 16 µs for Model.Irradiance in the same
// run (ratios about 1/65 and 1/115), without allocation. The 1° build takes
// about 0.12 s of CPU on one core (BenchmarkLocalTable/build, whole test
// process; 26× less than one integral per node, measured side by side).
//
// # References
//
//   - D. D. V. Bhanderi and T. Bak, "Modeling Earth albedo for satellites in
//     Earth orbit", AIAA Guidance, Navigation, and Control Conference, 2005
//     (cell-sum formulation; from memory).
//   - J. R. Howell, "A Catalog of Radiation Heat Transfer Configuration
//     Factors", plane element to sphere (entry number from memory).
//   - P. Leopardi, "A partition of the unit sphere into regions of equal area
//     and small diameter", Electron. Trans. Numer. Anal. 25 (2006) 309–327
//     (from memory).
//   - J. R. Knocke, J. C. Ries and B. D. Tapley, "Earth radiation pressure
//     effects on satellites", AIAA 88-4292 (1988) (from memory), as reproduced
//     in ECSS-E-ST-10-04C, Space environment (2008), Annex F.5.
//   - G. Kopp and J. L. Lean, "A new, lower value of total solar irradiance",
//     Geophys. Res. Lett. 38 (2011) L01706.
//   - IAU 2012 Resolution B2 (astronomical unit).
//   - G. L. Stephens et al., "The albedo of Earth", Rev. Geophys. 53 (2015).
//   - NIMA TR8350.2, "Department of Defense World Geodetic System 1984",
//     3rd ed. (2000) (Rₑ; from memory).
package albedo
