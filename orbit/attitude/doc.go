// Package attitude gives the spacecraft attitude laws of sunsight and the
// rotation helpers they need: quaternion ↔ direction-cosine matrix,
// named Euler sequences (3-2-1, 3-1-3) and TRIAD.
//
// An attitude is an r3.Rotation A with A.Rotate(vECI) = v in body axes
// (body ← ECI), as DEVELOPERS.md fixes.
//
// # Model
//
// Laws (each a value type; the zero value of every axis field is the
// default named below):
//   - Nadir: LVLH pointing, +Z to nadir and +X toward velocity by default,
//     optional fixed offset rotation; with YawToSun the second axis is
//     turned toward the sun instead (yaw steering: the sun stays in the
//     plane of the two body axes, TRIAD with the sun as the second vector).
//   - Sun: +Z to the sun, +X toward the orbit normal (or nadir, or an
//     inertial direction), optional spin about the sun line.
//   - Inertial: a fixed quaternion, or Euler angles in a named sequence.
//   - Spin: a body axis (default +Z) held on an inertial axis, turning at a
//     constant rate from an initial phase.
//   - Tumble: a seeded random initial attitude and constant body rates
//     about an isotropic axis, of magnitude uniform in [min, max]
//     (DrawTumble; tip-off rates are typically up to about 10°/s, common
//     practice, no source); A(t) = exp(−ωt/2) ⊗ A₀: a fixed-axis spin.
//   - FreeTumble: torque-free motion of a rigid body of inertia tensor J
//     from a drawn start: Euler's equations J·ω̇ = −ω × J·ω with the
//     kinematics q̇ = −½ (0, ω) ⊗ q (Wertz 1978 §16.1–16.2; Markley &
//     Crassidis 2014 §3.3), integrated by classical RK4 at a step of
//     0.005 rad of rotation, with restart checkpoints.
//   - Detumble: a body whose rate decays as ω₀·e^(−t/τ) about a fixed body
//     axis, the linear-regime behaviour of a B-dot detumbling controller
//     (Stickler & Alfriend 1976; Avanzini & Giulietti 2012; from memory),
//     chosen over a B-dot law with a dipole field because the tool has no
//     geomagnetic field model and a stated time constant is what a
//     controller analysis gives; it turns θ(t) = ω₀τ(1 − e^(−t/τ)).
//   - Isotropic: an independent uniform random attitude at each time
//     (Shoemake 1992), a pure function of (seed, t).
//   - Schedule: one law in sunlight and one in eclipse. The loop passes the
//     eclipse state as a bool through EclipseAware / At; nothing allocates.
//
// Two-vector laws are built with TRIAD: the primary body axis is matched
// exactly, the secondary as closely as the primary allows. When the
// secondary reference is parallel to the primary (for example β = ±90° with
// the orbit-normal reference) a fixed perpendicular of the primary is used.
//
// # Assumptions
//
// Attitude is kinematic: no actuators, no control error, no settling. The
// tumble law keeps the body rate constant, which solves Euler's equations
// only for spin about a principal axis or equal moments of inertia; real
// tumbling nutates, which FreeTumble models for a given inertia (no
// torques at all: no gravity gradient, drag, magnetic or flexible-body
// damping, so no flat spin develops over a long run). Random numbers come from math/rand/v2 PCG seeded by the
// caller, with SplitMix64 mixing of the seeds.
//
// # Accuracy
//
// Axis alignments hold to 1e-12 (measured ≤ 1e-15); DCM and Euler round
// trips to 1e-12 rad away from gimbal lock (measured ≤ 2e-13 rad). These
// are idealised attitudes: a flight attitude-control system points with
// errors of 0.1° to several degrees, which this package does not model, so
// sensor-coverage margins near a field-of-view edge need that error added
// before any flight decision; this is an analysis aid, not qualified
// flight software.
//
// FreeTumble keeps the rotational kinetic energy and the inertial angular
// momentum to ≤ 3e-11 relative over a day at 1–20°/s, and an axisymmetric
// body's rates to ≤ 1e-10 rad/s of the closed form over six hours
// (freebody_test.go). It costs about 0.3 µs per 0.005 rad of rotation,
// about 1 s of CPU per unit-day at 10°/s.
//
// # References
//
//   - Shepperd, S. W. (1978). Quaternion from rotation matrix. J. Guidance
//     and Control 1(3), 223–224 (from memory).
//   - Black, H. D. (1964). A passive system for determining the attitude of
//     a satellite. AIAA J. 2(7), 1350–1351 — TRIAD (from memory).
//   - Shoemake, K. (1992). Uniform random rotations. Graphics Gems III,
//     124–132 (from memory).
//   - Wertz, J. R. (ed.) (1978). Spacecraft Attitude Determination and
//     Control, App. E — frame rotations; §16.1–16.2 — Euler's equations
//     and torque-free motion (from memory).
//   - Schaub, H. & Junkins, J. L. (2018). Analytical Mechanics of Space
//     Systems, 4th ed., §3.2 — 3-2-1 and 3-1-3 matrices (from memory).
//   - Markley, F. L. & Crassidis, J. L. (2014). Fundamentals of Spacecraft
//     Attitude Determination and Control, §3.3 — quaternion kinematics and
//     Euler's equations of a rigid body (from memory).
//   - Steele, G., Lea, D. & Flood, C. (2014). Fast splittable pseudorandom
//     number generators. OOPSLA — SplitMix64 (from memory).
package attitude
