package timeline

import "math"

// Limits bound a slew: the largest body rate (rad/s) and angular
// acceleration (rad/s²) about the eigen-axis.
type Limits struct {
	RateRadS, AccelRadS2 float64
}

// Duration returns the time of a rest-to-rest bang–coast–bang slew through
// θ (rad): θ/ω + ω/α when θ ≥ ω²/α (accelerate to the rate limit, coast,
// brake), else 2√(θ/α) (accelerate half way, brake; the rate limit is never
// reached). Closed form (Wie 2008 §7.3, from memory).
func (l Limits) Duration(θ float64) float64 {
	ω, α := l.RateRadS, l.AccelRadS2
	if θ <= 0 {
		return 0
	}
	if θ >= ω*ω/α {
		return θ/ω + ω/α
	}
	return 2 * math.Sqrt(θ/α)
}

// AngleAt returns the angle turned t seconds into the slew through θ,
// clamped to [0, θ] outside [0, Duration(θ)].
func (l Limits) AngleAt(θ, t float64) float64 {
	T := l.Duration(θ)
	switch {
	case t <= 0 || θ <= 0:
		return 0
	case t >= T:
		return θ
	}
	α := l.AccelRadS2
	ta := min(l.RateRadS/α, T/2) // end of the acceleration arc
	switch {
	case t <= ta:
		return 0.5 * α * t * t
	case t >= T-ta:
		r := T - t
		return θ - 0.5*α*r*r
	}
	return 0.5*α*ta*ta + l.RateRadS*(t-ta)
}
