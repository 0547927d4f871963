// Package sim is the simulation loop of sunsight: it streams a uniform time
// grid through propagation, sun, shadow, attitude, sensor readings (with and
// without Earth albedo), sun-vector estimation and streaming accumulators.
//
// # Model
//
// At each step t (seconds since the epoch): the propagator gives the state in
// EME2000; the sun comes from the configured ephemeris, evaluated every
// 600 s and interpolated linearly between (error ≤ 2e-9 rad, 5 m; see
// suncache.go); the shadow is conical (visible fraction of the solar disc)
// or cylindrical; the attitude law gives body ← ECI (schedules are told
// whether the spacecraft is in eclipse); each sensor is read twice on the
// same noise draws — without albedo and with the albedo irradiance of
// illum/albedo on its own field of view — and every configured estimator
// turns each set of readings into a sun direction. The errors are angles to
// the true body-frame sun. Eclipse events come from illum.FindEclipsesModel on
// the same propagator, sun and shadow model (one code path for eclipses), so
// a cylindrical run has cylindrical fractions, events and durations alike.
//
// With Config.Filter the gyro-aided filter of illum/sensor/filter runs
// beside the estimators on the realistic readings (gyrofilter.go): the gyro
// output of each step is the rotation between the attitudes at its ends
// (filter.DeltaAngle) plus the gyro's bias and angle random walk, drawn from
// a stream of their own; the filter restarts from the primary estimate when
// it is not valid, and when it has stayed more than 30° from a valid primary
// estimate for three steps (the monitor: unmodelled albedo can pull it off
// while its own covariance stays small; filterMonitorSteps). Its shares and errors run over every sample, sunlit or
// not, and the last valid primary estimate held in body axes through shadow
// is kept beside it for comparison (TestFilterHoldsThroughEclipse: 3.7° p95
// in eclipse against 168° held, tumbling at 1°/s with realistic errors).
// A cosine reading's 1σ for the filter is the sensor's stated noise, dark
// offset, gain and misalignment at full sun and its quantisation step/√12,
// with FilterConfig.CosineSigma, in quadrature. With FilterConfig.SpanStarts
// (the phases of a mission timeline) the nominal unit's figures are also
// split over those spans, the filter running on across them
// (FilterStats.Spans): a phase's figures then include the state it brought
// in, as in flight, which a run of the phase alone would not.
//
// What the design review draws is kept by the run itself, when asked: a time
// series of unit 0 (Config.SeriesStride), a short one over the first
// seconds (Config.TimelineSpan), the body-frame sun and nadir track, and
// the eclipse-season table of the orbit over any span of days
// (Config.Season: illum.YearTable on the propagator the request gives, with
// the run's sun and shadow models), so nothing is run twice.
//
// "Sunlit" time means the full solar disc is visible; penumbra time is
// counted apart. Coverage ("seen by ≥ k sensors") is taken on the true sun
// direction; validity and errors use the estimators on the readings.
//
// Coverage counts a sensor as seeing the sun where its nominal reading from
// direct sun is valid (sensor.Sensor.SeesSun) and neither the surface it
// sits on nor the bus nor an obstruction hides it (Config.Viewers); the same
// mounting plane and obstacles cut the sensor's direct sun and its albedo
// (when the albedo's mean arrival direction is hidden) in the readings
// (Config.Blocked).
//
// False suns. Three measures, per estimator and per sensor: (1) the share
// of sunlit time with a valid estimate (reading) that is invalid from the
// same readings without albedo — valid only because of albedo, exactly 0
// without an albedo model; (2) the share of sunlit time with a valid
// estimate (two-axis reading) more than Config.FalseSunBoundDeg (default
// 20°) from the sun; (3) the share of umbra time with a valid estimate. For
// a spherical Earth without atmosphere (3) can come only from sensor errors
// (dark offsets, noise), never from albedo: no sunlit ground is visible from
// inside the cylindrical shadow, and the conical umbra lies inside it.
// Proof (closed form): let ŝ be the sun direction and the spacecraft at
// r = −a·ŝ + ρ with a > 0 and ρ ⟂ ŝ, |ρ| < R (inside the cylinder). A
// ground point P (|P| = R) is sunlit when P·ŝ > 0 and visible when it lies
// above the spacecraft's horizon, (r − P)·P > 0, i.e. P·r > R². For a
// sunlit P, P·r = −a·(P·ŝ) + P·ρ < P·ρ ≤ R·|ρ| < R², so no sunlit point
// is visible. In angles: the visible cap reaches acos(R/|r|) from the
// sub-spacecraft point and the lit hemisphere 90° from the subsolar point,
// and inside the shadow these two points are more than 90° + acos(R/|r|)
// apart. Measure (3) is kept for models where that fails (an oblate Earth,
// light scattered by the atmosphere, a reflectance model with a limb); the
// sunlit measures (1) and (2) are the ones that fire.
//
// A time series (Config.SeriesStride) is kept in the result, or handed
// piece by piece in time order to Config.SeriesSink as the pieces are
// folded (memory flat in the duration; with panels the power pass then
// runs first, so each piece carries its power).
//
// Long runs are cut into fixed chunks of 32768 steps that run in parallel;
// each unit's chunks are folded into its accumulator in time order as soon
// as they are next (memory flat in the duration: at most about one chunk
// per worker waits); noise is reseeded per block of 4096 steps from (seed,
// unit, block) and each unit's error draws from (seed, unit), so results do
// not depend on the number of workers. A numerical integration
// (orbit.Restarter: j2-numeric) runs once from the epoch and each chunk
// starts from a fork of it taken before its first step (forks.go): the
// chunks see bit for bit the states of the one integration. Monte Carlo units are independent
// draws of the sensors' error models; when they share one attitude law
// (Config.LawForUnit unset) the geometry of a step — orbit, sun, shadow,
// attitude, albedo, on the nominal mounts — is computed once and every
// unit's sensors are read on it; so are the parts of the reading that do
// not depend on a unit's errors (the body's blocking of the sun and of the
// albedo, coverage). A layout of cosine sensors reads each sensor without
// and with albedo in one pass on one noise draw (sensor.Cosine.ReadPair,
// equal bit for bit to two reads on the same noise). A Trace records the
// geometry of every step for replays: a subset of the candidates (layout
// search, single failure) or the whole layout with other error values
// (Trace.RunArray: the cases of an error budget), units shared out over the
// workers.
//
// Orbit states are filled by blocks of 1024 steps (Propagator.Fill; for
// j2-mean a recurrence within 1e-7 km of the per-step StateAt over a year,
// orbit.TestJ2MeanFillMatchesStateAt). A nadir law gives its attitude
// matrix directly (attitude.RowsLaw; the default axes written out, bit for
// bit the general path). A layout of cosine sensors is read through a
// sensor.CosineBank: each unit's drawn boresights, gains, offsets and
// converter as plain values, one loop, no interface call per sensor, bit
// for bit the sensors' own reads. The view of a step (sun blocked, albedo
// past the body, coverage, the Moon and the lit Earth in each cone) is
// taken once for all units of a task and its counts are added to each
// unit at the end of the task; a cosine sensor's viewer is not asked when
// the sun is outside its cone. A task runs in blocks of 256 steps: the
// geometry and the view of the whole block first, then each unit reads its
// sensors over the block (its accumulators stay in cache), each unit
// seeing the same steps in the same order. A cosine bank copies a
// sensor's reading without albedo when it gets none, so a step without
// albedo on any sensor has the same readings with and without it: the
// estimate with albedo is then the one without (estimators are functions
// of the readings), not computed again. None of this changes a number: the outputs
// of the bundled examples and bench cases are the same bytes as before. With a uniform albedo the cell
// integral is replaced by a table on long runs: the LVLH table
// (albedo.LocalTable) for nadir pointing on a circular orbit with at most 8
// sensors, else one albedo.BoresightTable per kind of cone over a few orbit
// radii (any attitude, j2-numeric, small eccentricity; steps whose radius
// leaves the tables are integrated). Both agree with the integral within
// the bounds of their tests (TestAgainstNumpyReference for the reference
// case through either table, TestBoresightTableRunMatchesIntegral for a
// tumble: error statistics within 0.05°).
//
// The Moon and the Earth in view: every step takes the Moon (ephem.Moon,
// interpolated like the sun, between knots 1800 s apart: within 2.9e-7 rad
// and 48 m, TestCachesMatchTheirEphemerides) less the spacecraft position,
// and counts per sensor (nominal mount, once per step for all units) the
// steps with some of the Moon's disc inside the cone (sensor.Bodies:
// half-angle + Moon angular radius from the boresight), not wholly behind
// the Earth's disc, in front of the mounting plane and clear of the body's
// obstructions; and the steps with some of the Earth's disc inside the cone
// (half-angle + asin(R/r)) and in front of the mounting plane while the
// sub-satellite point is sunlit (r·ŝ > 0, the rule chosen for "lit Earth":
// the Earth under the spacecraft is in daylight), for a sensor with
// obstructions beyond its mounting plane (a bus it looks along) with the
// Earth's point deepest in the cone, the one nearest the boresight, clear
// of them (the rule chosen for an extended Earth). A Moon or lit Earth so
// hidden, or a Moon behind the mounting plane, does not blind. A sensor with a blinding
// rule (sensor.Blindable, the digital kind) has its readings dropped at the
// steps the rule names, before the estimators see them; the sun coverage
// shares stay geometric.
//
// On-board albedo correction (Config.NewCorrection, the scenario's
// albedo.onboard): a second albedo model, the flight software's, is
// evaluated on the same step, sensors and route (a table when one serves
// it), blocked by the body by the same rule as the truth's; each cosine
// sensor's realistic reading has its prediction subtracted in signal units
// with the nominal gain (sensor.AlbedoSubtracter: s − E/S_ref, clipped at
// 0, the threshold applied again) and the estimators run a third time on
// the result (EstimatorStats.Corrected: validity, error to the true sun,
// and the angle to the estimate without albedo — the albedo part the
// correction leaves). Two-axis sensors pass uncorrected. The prediction
// uses the true position and attitude, so the residual is the model's
// error and the sensors' own (gain mismatch, ADC rounding, saturation,
// thresholds), not a navigation error. With the truth's own model and
// linear readings the residual is zero to rounding (≤ 1e-6°,
// study.TestOnboardSameModelRemovesAlbedoPart): perfect by construction,
// which the outputs say.
//
// # Assumptions
//
// Rigid body; attitude laws are kinematic (no dynamics or control error);
// sun and albedo light are parallel rays at the spacecraft; a reading's
// albedo part is the response-weighted irradiance integrated over the
// sensor's field of view.
//
// # Accuracy
//
// Statistics stream in constant memory: moments as sums about a shift
// (the first value; Chan, Golub & LeVeque 1983, from memory), quantiles
// from a histogram resolving ±0.07 % of the value, gaps as their number, the
// longest and a histogram of their lengths in whole steps (bounded by the
// number of distinct lengths, at most √(2N) on N steps), and as a list of
// every gap only for the units Config.GapListUnits names. The reference case agrees with an independent
// numpy computation (bench/reference.py) to 0.1 percentage point in every
// fraction and 0.05° in every error statistic (reference_test.go).
//
// # References
//
// Chan, Golub & LeVeque (1983), "Algorithms for computing the sample
// variance: analysis and recommendations", Am. Stat. 37(3):242–247 (shifted
// sums and their merge), from memory.
package sim
