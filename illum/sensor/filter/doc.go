// Package filter is a gyro-aided sun-direction filter: an extended Kalman
// filter of the body-frame sun vector and the rate-gyro bias, propagated
// with the gyro between readings and updated with the readings of cosine
// and two-axis sun sensors, so the sun direction is still known through a
// gap in coverage and through eclipse. Gyro is the truth model of the gyro
// the engine reads; Filter is what flight software would run.
//
// # Model
//
// State x = (s, b): s the sun vector in body axes (its length the sun's
// relative intensity times the sensors' gain, ≈ 1 in full sun), b the
// gyro bias (rad/s, per body axis). The bias is estimated.
//
// Gyro (truth and filter alike): over a step Δt it outputs
// θ̃ = θ + b·Δt + σ_v·√Δt·n, θ the body rotation vector over the step
// (DeltaAngle of the attitudes at both ends), n standard normal: σ_v the
// angle random walk. The bias is a first-order Gauss–Markov process,
// b⁺ = φ·b + σ_b·√(1 − φ²)·w, φ = exp(−Δt/τ): σ_b the bias instability as
// a stationary 1σ and τ its correlation time (Crassidis & Junkins 2012,
// §7.2 and §3.6 for the Gauss–Markov form, from memory).
//
// Propagation, with θ̂ = θ̃ − b̂·Δt and R = exp(−[θ̂×]) (Rodrigues):
//
//	ŝ⁺ = R·ŝ,  b̂⁺ = φ·b̂
//	Φ = [[R, −Δt·[ŝ⁺×]], [0, φ·I]]
//	Q = [[σ_v²·Δt·(|ŝ⁺|²I − ŝ⁺ŝ⁺ᵀ) + σ_l²·Δt·ûûᵀ, 0], [0, σ_b²·(1 − φ²)·I]]
//	P⁺ = Φ·P·Φᵀ + Q
//
// with û = ŝ⁺/|ŝ⁺| and σ_l a random walk of the length (intensity).
//
// Readings, each a scalar Kalman update K = PHᵀ/S, S = HPHᵀ + r,
// x += K·y, P −= S·KKᵀ:
//
//   - cosine sensor of boresight n reading m above its threshold:
//     h(x) = n·s, H = [nᵀ, 0], y = m − n·ŝ (O'Keefe & Schaub 2014, coarse
//     sun sensor EKF, from memory);
//   - two-axis sensor (quadrant, digital) reading the unit direction d
//     with 1σ σ per axis: two scalars on the axes u₁, u₂ normal to ŝ,
//     h(x) = uⱼ·s/|s|, H = [uⱼᵀ/|ŝ|, 0], y = uⱼ·d.
//
// An innovation beyond Gate·√S (χ² of both axes together for a direction)
// is refused. The estimate is valid while its own 1σ direction
// uncertainty, √(tr((I − ûûᵀ)P_ss))/|ŝ|, is at most MaxSigma; the engine
// (re)starts it from the primary point estimate when it is not.
//
// # Assumptions
//
// The sun is fixed in inertial space over the run as far as the filter
// knows: its apparent motion, 360° a year = 0.041°/h (closed form), is
// left to the readings. A cosine sensor below its threshold gives no
// reading (the "not in this hemisphere" information is not used). The
// Jacobian takes the rotation over one step as small (the left Jacobian of
// the step's rotation is taken as I): the bias coupling is off by
// O(|θ|) for large turns per step. Readings are independent from step to
// step: a dark offset, gain error, misalignment or albedo that stays over
// many steps is an error the filter does not model, and its covariance is
// then optimistic; the engine adds the stated errors to r (see
// scenario/sim).
//
// # Accuracy
//
// With a perfect gyro and no readings the estimate follows the true
// body-frame sun of a torque-free tumble to 5e-14 rad over an orbit
// (TestPerfectGyroFollowsTumble, bound 1e-9). Covariance consistency:
// the mean NEES over 100 Monte Carlo units lies in its 95 % chi-square
// band at 29 of 30 checkpoints tumbling at 3°/s with 1 s steps, and at 30
// of 30 at 10°/s with 5 s steps, 50° a step (TestNEESWithinChiSquareBand).
//
// # References
//
//   - S. A. O'Keefe and H. Schaub, consider and extended Kalman filters of
//     the sun heading from coarse sun sensors, J. Astronaut. Sci. 61(1),
//     2014 (the cosine measurement model h = n·s; from memory).
//   - J. L. Crassidis and J. L. Junkins, Optimal Estimation of Dynamic
//     Systems, 2nd ed., CRC Press, 2012, ch. 3 and 7: the extended Kalman
//     filter, the gyro model of angle random walk and bias (from memory).
//   - Y. Bar-Shalom, X. R. Li and T. Kirubarajan, Estimation with
//     Applications to Tracking and Navigation, Wiley, 2001, §5.4.2: the
//     NEES test of filter consistency (from memory).
package filter
