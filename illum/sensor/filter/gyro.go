package filter

import (
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/spatial/r3"
)

// Gyro is the truth model of a three-axis rate-integrating gyro: over a
// step of Δt it outputs the body rotation vector θ plus b·Δt plus angle
// random walk, θ̃ = θ + b·Δt + σ_v·√Δt·n, and its bias drifts as a
// first-order Gauss–Markov process of stationary 1σ σ_b and correlation
// time τ, b⁺ = φ·b + σ_b·√(1 − φ²)·w (φ = exp(−Δt/τ); n, w standard
// normal per axis). The bias starts from its stationary distribution.
type Gyro struct {
	ARW, BiasSigma, BiasTau float64
	bias                    r3.Vec
}

// NewGyro returns a gyro whose starting bias is drawn from rng (one draw
// per axis, always three).
func NewGyro(arw, biasSigma, biasTau float64, rng *rand.Rand) Gyro {
	g := Gyro{ARW: arw, BiasSigma: biasSigma, BiasTau: biasTau}
	g.bias = r3.Scale(biasSigma, normal3(rng))
	return g
}

// Bias returns the current bias (rad/s).
func (g *Gyro) Bias() r3.Vec { return g.bias }

// Measure returns the gyro output for a step of dt in which the body turned
// by theta, and advances the bias. rng nil gives a noise-free output (the
// bias still applies). It allocates nothing.
func (g *Gyro) Measure(theta r3.Vec, dt float64, rng *rand.Rand) r3.Vec {
	out := r3.Add(theta, r3.Scale(dt, g.bias))
	if rng == nil {
		return out
	}
	if g.ARW > 0 {
		out = r3.Add(out, r3.Scale(g.ARW*math.Sqrt(dt), normal3(rng)))
	}
	if g.BiasSigma > 0 {
		phi := math.Exp(-dt / g.BiasTau)
		g.bias = r3.Add(r3.Scale(phi, g.bias), r3.Scale(g.BiasSigma*math.Sqrt(1-phi*phi), normal3(rng)))
	}
	return out
}

func normal3(rng *rand.Rand) r3.Vec {
	if rng == nil {
		return r3.Vec{}
	}
	x := rng.NormFloat64()
	y := rng.NormFloat64()
	return r3.Vec{X: x, Y: y, Z: rng.NormFloat64()}
}

// DeltaAngle returns the rotation vector θ (rad) that takes the body axes
// of attitude a to those of attitude b, both given as the rows of their
// body ← ECI matrices: b·aᵀ = exp(−[θ×]), so a vector fixed in inertial
// space seen in a's axes as v is seen in b's as exp(−[θ×])v. The angle
// must be below π (a step shorter than half a turn).
func DeltaAngle(a, b [3]r3.Vec) r3.Vec {
	// D = b·aᵀ, D[i][j] = b_i·a_j.
	var D [3][3]float64
	for i := range 3 {
		for j := range 3 {
			D[i][j] = r3.Dot(b[i], a[j])
		}
	}
	// vee of the skew part of D = exp(−[θ×]) is −sin|θ|·θ/|θ|.
	v := r3.Vec{X: (D[2][1] - D[1][2]) / 2, Y: (D[0][2] - D[2][0]) / 2, Z: (D[1][0] - D[0][1]) / 2}
	sn := r3.Norm(v)
	cs := (D[0][0] + D[1][1] + D[2][2] - 1) / 2
	ang := math.Atan2(sn, cs)
	if sn < 1e-12 {
		return r3.Scale(-1, v) // sin a ≈ a
	}
	return r3.Scale(-ang/sn, v)
}
