// Package scenario turns a scenario file into a validated, unit-converted and
// defaulted Go value (Scenario); a separate build step maps it onto the
// physics objects of orbit, orbit/attitude, ephem and illum.
//
// # Model
//
// A scenario file is YAML with our own plain keys, units in the key names
// (altitude_km, half_angle_deg, rate_deg_s). Load/Parse read it in three
// passes: the text is parsed into a yaml.Node tree; a walker checks every key
// and scalar against the schema (file.go), so that each error names the key
// path, line, column, the value and what is allowed; the tree is then decoded
// with KnownFields(true), defaults are filled in place (resolve.go keeps all
// of them in one const block) and cross-field rules are checked. Scenario
// values use the boundary units: radians, km, seconds (Span), unit vectors in
// body axes (r3.Vec). Record prints the defaulted file back as YAML.
//
// Span extends Go's duration syntax with d = 24 h and w = 7 d; years and
// months are refused as calendar-ambiguous. Local times of the node read
// "10:30", "10.5h" or "157.5deg". Epochs are RFC 3339 in UTC.
//
// A TLE's two lines are read as mean elements for a starting point: its
// inclination, RAAN, eccentricity, argument of perigee, mean anomaly and mean
// motion, with a = (μ/n²)^(1/3), μ = 398600.4418 km³/s² (WGS 84).
//
// # Assumptions
//
// Sensor mounts: a face mount's boresight is the face normal n tilted by τ
// toward an axis t ⟂ n, b = n cos τ + t sin τ; its reference axis is
// t cos τ − n sin τ turned by clock_deg about b. A boresight-vector mount takes
// the body axis least aligned with b, made perpendicular, as reference axis.
// A sun-synchronous orbit is carried as altitude + LTAN: the build step
// derives inclination and RAAN. Estimators left out default to all that the
// sensor kinds allow (least-squares with ≥ 3 cosine sensors, opposite-pairs
// when cosine sensors make three opposed pairs on axes that are not
// coplanar (it has no estimate otherwise), two-axis with a quadrant or
// digital sensor, combined with both). Default sensor parameters (threshold
// 0.05, 12-bit ADC, cosine field 90°, others 60°, quadrant 1.0 mm shade over
// 2.0 mm cells with 0.1 mm gap, digital 0.5° 1σ) are common practice, no
// source; error models default to none, which makes results optimistic.
//
// # Accuracy
//
// A TLE holds SGP4 (Kozai) mean elements; using them as two-body or J2 mean
// elements is a starting point only, good to kilometres after a day, not an
// SGP4 propagation. Results of any scenario are an analysis aid: flight
// hardware needs qualified verification.
//
// # References
//
//   - Hoots, F. R., Roehrich, R. L. (1980), Spacetrack Report No. 3, and
//     Vallado, D. A. et al. (2006), "Revisiting Spacetrack Report #3", AIAA
//     2006-6753: TLE columns, checksum and the 57/56 two-digit year rule (from
//     memory).
//   - NIMA TR8350.2, 3rd ed. (2000), WGS 84: μ = 398600.4418 km³/s²,
//     Rₑ = 6378.137 km.
//   - RFC 3339 (2002), date and time on the Internet.
package scenario
