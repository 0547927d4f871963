// Package ccsds reads and writes the CCSDS orbit and attitude ephemeris
// messages in their KVN (keyword = value) form, so a run can start from a
// flight-dynamics ephemeris or replay an attitude history, and hand its own
// orbit and attitude to other tools.
//
// # Model
//
// OEM (CCSDS 502.0-B-2, Orbit Data Messages): header, one or more segments
// of metadata and state lines "epoch x y z vx vy vz" (km, km/s); states are
// interpolated with the Lagrange polynomial of the file's
// INTERPOLATION_DEGREE through the nearest degree+1 states, or with the
// Hermite polynomial through positions and velocities. AEM (CCSDS
// 504.0-B-1, Attitude Data Messages): quaternion lines "epoch q1 q2 q3 qc"
// (QUATERNION_TYPE LAST) or "epoch qc q1 q2 q3" (FIRST), turned into the
// tool's convention (EME2000 → body, A2B); a plain CSV
// time_utc,qx,qy,qz,qw is read the same way.
//
// # Assumptions
//
// Supported: CENTER_NAME EARTH, REF_FRAME EME2000 (OEM) and REF_FRAME_A
// EME2000 with a SC_BODY_n body frame (AEM), TIME_SYSTEM UTC, quaternion
// attitude. Refused with a message naming the line: other frames, centres
// and time systems, covariance sections, Euler-angle, spin and rate
// attitude types, non-unit quaternions (beyond 1e-6), epochs that do not
// increase. The XML forms are not read.
//
// # Accuracy
//
// A 60 s OEM of a 550 km orbit written from j2-numeric and read back
// reproduces it between samples within 0.04 mm (Lagrange, degree 7) and
// 0.02 mm (Hermite), far inside the 1 m target; at a sample the state is
// returned exactly. Written quaternions read back bit for bit (17
// significant digits), so a replayed run gives the same coverage figures.
//
// # References
//
//   - CCSDS 502.0-B-2, Orbit Data Messages, Blue Book, 2009.
//   - CCSDS 504.0-B-1, Attitude Data Messages, Blue Book, 2008.
package ccsds
