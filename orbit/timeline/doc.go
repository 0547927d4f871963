// Package timeline plans a mission timeline: a sequence of phases, each
// flying an attitude law (orbit/attitude) until an end condition, with
// eigen-axis slews between them, and turns the plan into one attitude law
// whose segments tile the run.
//
// # Model
//
// A phase ends after a stated time (its slew included), when its law's
// body rate falls below a bound (a law with a rate decay, attitude.Detumble:
// the closed-form time τ·ln(ω₀/ω_b)), once the direct sun has been seen by
// at least N sensors at every step of the run's grid for a stated time
// while in full sun, or at the next shadow entry or exit (the shadow passes
// the caller gives, penumbra included). The last phase lasts to the end of
// the run; a phase whose condition is not met before the run ends is cut
// there and the later phases are not reached. A phase may hold the
// attitude it had at shadow entry until shadow exit; it then returns to its
// law by a rest-to-rest eigen-axis slew within the same limits, found as a
// slew into a phase is (for nadir, about the angle the law turned during the
// shadow and the slew). A return slew still under way at the phase's end
// hands over to the next phase there; a shadow entered during one is held
// from the slew's end.
//
// A slew is a rest-to-rest rotation about a fixed eigen-axis with a
// bang–coast–bang angle profile: accelerate at α to the rate limit ω,
// coast, brake at α; T = θ/ω + ω/α when θ ≥ ω²/α, else T = 2√(θ/α) and the
// rate peaks at √(αθ) (closed form; B. Wie, Space Vehicle Dynamics and
// Control, 2nd ed., AIAA 2008, §7.3, from memory). The slew's end attitude
// is the next law's attitude at the slew's end, found by fixed-point
// iteration on the slew time (a moving target such as nadir).
//
// A detumble phase that follows a law knowing its body rate (a fixed-axis
// tumble) starts from the attitude and rate that law left.
//
// # Assumptions
//
// Kinematic only: no actuator torque model beyond the slew limits, no
// settling, no control error; a slew ends at rest relative to inertial
// space and then follows its target's own motion (a step of at most the
// target's rate at hand-over). End conditions are decided on the nominal
// geometry (no sensor errors, no albedo), once for the whole run: every
// Monte Carlo unit flies the same timeline.
//
// # Accuracy
//
// Slew times are the closed form to rounding; the slew's hand-over to a
// moving target is solved to 1e-7 s of slew time. Sun-seen conditions are
// decided on the run's step grid, so they end at most one step late.
//
// # References
//
// B. Wie, Space Vehicle Dynamics and Control, 2nd ed., AIAA, 2008, §7.3
// (rest-to-rest eigen-axis manoeuvres; from memory). Detumble decay: see
// attitude.Detumble.
package timeline
