package attitude

import (
	"fmt"
	"math"
	"sync"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
)

// Inertia is a rigid body's inertia tensor in body axes, kg·m², row-major
// and symmetric (J[i][j] = J[j][i]).
type Inertia [3][3]float64

// Check returns an error unless J is symmetric, positive definite and its
// principal moments satisfy the triangle inequalities I₁ + I₂ ≥ I₃ of a
// real body (Wertz 1978 §16.1, from memory; a mass distribution gives
// I₁ + I₂ − I₃ = 2∫z² dm ≥ 0).
func (J Inertia) Check() error {
	for i := range 3 {
		for j := range 3 {
			if math.IsNaN(J[i][j]) || math.IsInf(J[i][j], 0) {
				return fmt.Errorf("attitude: inertia element [%d][%d] = %g is not a finite number", i, j, J[i][j])
			}
			if J[i][j] != J[j][i] {
				return fmt.Errorf("attitude: inertia tensor is not symmetric ([%d][%d] = %g, [%d][%d] = %g)", i, j, J[i][j], j, i, J[j][i])
			}
		}
	}
	p, ok := J.Principal()
	if !ok || !(p[0] > 0) {
		return fmt.Errorf("attitude: inertia tensor is not positive definite (principal moments %.4g, %.4g, %.4g kg·m²)", p[0], p[1], p[2])
	}
	if p[0]+p[1] < p[2]*(1-1e-9) {
		return fmt.Errorf("attitude: principal moments %.4g + %.4g < %.4g kg·m² break the triangle inequality no real body breaks", p[0], p[1], p[2])
	}
	return nil
}

// Principal returns the principal moments in increasing order.
func (J Inertia) Principal() ([3]float64, bool) {
	var es mat.EigenSym
	if !es.Factorize(mat.NewSymDense(3, []float64{J[0][0], J[0][1], J[0][2], J[1][0], J[1][1], J[1][2], J[2][0], J[2][1], J[2][2]}), false) {
		return [3]float64{}, false
	}
	v := es.Values(nil)
	return [3]float64{v[0], v[1], v[2]}, true
}

func (J *Inertia) mul(w r3.Vec) r3.Vec {
	return r3.Vec{
		X: J[0][0]*w.X + J[0][1]*w.Y + J[0][2]*w.Z,
		Y: J[1][0]*w.X + J[1][1]*w.Y + J[1][2]*w.Z,
		Z: J[2][0]*w.X + J[2][1]*w.Y + J[2][2]*w.Z,
	}
}

// inverse returns J⁻¹ (J positive definite, checked by Check).
func (J Inertia) inverse() Inertia {
	a, b, c := J[0][0], J[0][1], J[0][2]
	d, e, f := J[1][0], J[1][1], J[1][2]
	g, h, i := J[2][0], J[2][1], J[2][2]
	det := a*(e*i-f*h) - b*(d*i-f*g) + c*(d*h-e*g)
	return Inertia{
		{(e*i - f*h) / det, (c*h - b*i) / det, (b*f - c*e) / det},
		{(f*g - d*i) / det, (a*i - c*g) / det, (c*d - a*f) / det},
		{(d*h - e*g) / det, (b*g - a*h) / det, (a*e - b*d) / det},
	}
}

// FreeTumble is the torque-free motion of an asymmetric rigid body:
// Euler's equations J·ω̇ = −ω × (J·ω) for the body rates ω (body axes) and
// the kinematics Ȧ = −[ω×]·A of the attitude A = body ← ECI, as a
// quaternion q̇ = −½ (0, ω) ⊗ q (Wertz 1978 §16.1–16.2 and Markley &
// Crassidis 2014 §3.3, from memory). There is no closed form in elementary
// functions for the attitude of an asymmetric body, so FreeTumble
// integrates both with the classical fourth-order Runge–Kutta method at a
// fixed step of freeStepRad / |ω| (at most freeMaxStepS) from t = 0,
// renormalising q after each step. The rotational kinetic energy ½ωᵀJω and
// the inertial angular momentum Aᵀ·J·ω are its invariants; the tests hold
// both to 1e-9 relative over a day.
//
// Attitude may be called with any t; calls with increasing t continue from
// the last one, and checkpoints every freeCheckpointSteps steps let an
// earlier t restart close by. A FreeTumble is safe for concurrent use.
type FreeTumble struct {
	Q0    r3.Rotation // body ← ECI at t = 0
	Rate0 r3.Vec      // body rates at t = 0, rad/s
	J     Inertia

	jinv Inertia
	h    float64

	mu     sync.Mutex
	cur    freeState
	checks []freeState // checks[k] is the state at t = k·freeCheckpointSteps·h
}

type freeState struct {
	t float64
	q quat.Number
	w r3.Vec
}

const (
	// freeStepRad is the rotation per integration step. RK4's local error
	// grows as (|ω|h)⁵, so 5e-3 rad keeps the invariants to ≈ 1e-11 over a
	// day at 10°/s (measured by TestFreeTumbleInvariants).
	freeStepRad = 5e-3
	// freeMaxStepS bounds the step of a slow tumble.
	freeMaxStepS = 1.0
	// freeCheckpointSteps is the spacing of the stored restart states.
	freeCheckpointSteps = 4096
)

// NewFreeTumble returns the torque-free motion of a body of inertia J from
// attitude q0 (body ← ECI) and body rates w0 (rad/s). J must pass Check.
func NewFreeTumble(q0 r3.Rotation, w0 r3.Vec, J Inertia) (*FreeTumble, error) {
	if err := J.Check(); err != nil {
		return nil, err
	}
	q := quat.Number(offsetOrIdentity(q0))
	q = quat.Scale(1/quat.Abs(q), q)
	f := &FreeTumble{Q0: r3.Rotation(q), Rate0: w0, J: J, jinv: J.inverse(), h: freeMaxStepS}
	if w := r3.Norm(w0); w > 0 {
		f.h = min(freeMaxStepS, freeStepRad/w)
	}
	f.cur = freeState{q: q, w: w0}
	f.checks = []freeState{f.cur}
	return f, nil
}

// Clone returns a FreeTumble of the same motion with its own cursor: each
// worker of a run takes one. (The checkpoints are copied.)
func (f *FreeTumble) Clone() *FreeTumble {
	f.mu.Lock()
	defer f.mu.Unlock()
	c := &FreeTumble{Q0: f.Q0, Rate0: f.Rate0, J: f.J, jinv: f.jinv, h: f.h, cur: f.cur}
	c.checks = append([]freeState(nil), f.checks...)
	return c
}

// deriv returns ω̇ and q̇.
func (f *FreeTumble) deriv(q quat.Number, w r3.Vec) (quat.Number, r3.Vec) {
	dw := f.jinv.mul(r3.Scale(-1, r3.Cross(w, f.J.mul(w))))
	dq := quat.Scale(-0.5, quat.Mul(quat.Number{Imag: w.X, Jmag: w.Y, Kmag: w.Z}, q))
	return dq, dw
}

// rk4 advances (q, w) by dt.
func (f *FreeTumble) rk4(q quat.Number, w r3.Vec, dt float64) (quat.Number, r3.Vec) {
	q1, w1 := f.deriv(q, w)
	q2, w2 := f.deriv(quat.Add(q, quat.Scale(dt/2, q1)), r3.Add(w, r3.Scale(dt/2, w1)))
	q3, w3 := f.deriv(quat.Add(q, quat.Scale(dt/2, q2)), r3.Add(w, r3.Scale(dt/2, w2)))
	q4, w4 := f.deriv(quat.Add(q, quat.Scale(dt, q3)), r3.Add(w, r3.Scale(dt, w3)))
	qs := quat.Add(quat.Add(q1, q4), quat.Scale(2, quat.Add(q2, q3)))
	ws := r3.Add(r3.Add(w1, w4), r3.Scale(2, r3.Add(w2, w3)))
	q = quat.Add(q, quat.Scale(dt/6, qs))
	return quat.Scale(1/quat.Abs(q), q), r3.Add(w, r3.Scale(dt/6, ws))
}

// State returns the attitude (body ← ECI) and body rates at t ≥ 0.
func (f *FreeTumble) State(t float64) (r3.Rotation, r3.Vec) {
	f.mu.Lock()
	defer f.mu.Unlock()
	if t < f.cur.t {
		k := min(int(t/(f.h*freeCheckpointSteps)), len(f.checks)-1)
		f.cur = f.checks[max(k, 0)]
	}
	for f.cur.t+f.h <= t {
		n := int(math.Round(f.cur.t/f.h)) + 1
		f.cur.q, f.cur.w = f.rk4(f.cur.q, f.cur.w, f.h)
		f.cur.t = float64(n) * f.h
		if n%freeCheckpointSteps == 0 && n/freeCheckpointSteps == len(f.checks) {
			f.checks = append(f.checks, f.cur)
		}
	}
	q, w := f.cur.q, f.cur.w
	if dt := t - f.cur.t; dt > 0 {
		q, w = f.rk4(q, w, dt)
	}
	return r3.Rotation(q), w
}

// Attitude implements Law.
func (f *FreeTumble) Attitude(t float64, _ orbit.State, _ r3.Vec) r3.Rotation {
	q, _ := f.State(t)
	return q
}

// Energy returns the rotational kinetic energy ½ωᵀJω (J) of body rates w.
func (J *Inertia) Energy(w r3.Vec) float64 { return 0.5 * r3.Dot(w, J.mul(w)) }

// Momentum returns the angular momentum J·ω in ECI axes for attitude A
// (body ← ECI) and body rates w (kg·m²/s).
func (J *Inertia) Momentum(A r3.Rotation, w r3.Vec) r3.Vec {
	return Inverse(A).Rotate(J.mul(w))
}
