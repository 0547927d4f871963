package filter

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// Settings are the filter's model of the gyro and of the sun vector.
type Settings struct {
	// ARW is the gyro's angle random walk, 1σ per axis (rad/√s).
	ARW float64
	// BiasSigma is the stationary 1σ per axis of the gyro bias (rad/s),
	// the bias instability of the gyro's data sheet, and BiasTau (s, > 0)
	// the correlation time of its first-order Gauss–Markov drift.
	BiasSigma, BiasTau float64
	// LengthRate is the random walk of the sun vector's length (1/√s): the
	// cosine readings scale with the sun's intensity (distance, penumbra,
	// gain), which the length of the state absorbs.
	LengthRate float64
	// StartSigma is the 1σ per axis (rad) of the direction a start takes
	// from a point estimate, StartLengthSigma that of its length.
	StartSigma, StartLengthSigma float64
	// MaxSigma (rad) is the filter's own 1σ direction uncertainty up to
	// which its estimate counts as valid; beyond it a point estimate
	// restarts it.
	MaxSigma float64
	// Gate (in σ of the innovation; 0: none) rejects a reading whose
	// innovation is larger: a false sun does not pull the estimate.
	Gate float64
}

// Validate checks the settings.
func (s Settings) Validate() error {
	for _, f := range []struct {
		name string
		v    float64
	}{{"angle random walk", s.ARW}, {"bias sigma", s.BiasSigma}, {"length rate", s.LengthRate},
		{"start length sigma", s.StartLengthSigma}, {"gate", s.Gate}} {
		if !(f.v >= 0) || math.IsInf(f.v, 0) {
			return fmt.Errorf("filter: %s = %g: want a finite value ≥ 0", f.name, f.v)
		}
	}
	if !(s.BiasTau > 0) || math.IsInf(s.BiasTau, 0) {
		return fmt.Errorf("filter: bias correlation time = %g s: want a finite value > 0", s.BiasTau)
	}
	if !(s.StartSigma > 0 && s.StartSigma < math.Pi/2) {
		return fmt.Errorf("filter: start sigma = %g rad: want (0, π/2)", s.StartSigma)
	}
	if !(s.MaxSigma > 0 && s.MaxSigma < math.Pi/2) {
		return fmt.Errorf("filter: valid sigma = %g rad: want (0, π/2)", s.MaxSigma)
	}
	return nil
}

// mat6 is a 6×6 matrix; the state is (s, b): the body-frame sun vector and
// the gyro bias.
type mat6 [6][6]float64

// Filter is the extended Kalman filter of the body-frame sun vector and the
// gyro bias. The zero value is not usable: build it with New. It allocates
// nothing after New.
type Filter struct {
	set     Settings
	s, b    r3.Vec
	p       mat6
	started bool
}

// New returns a filter that has not started.
func New(s Settings) (*Filter, error) {
	if err := s.Validate(); err != nil {
		return nil, err
	}
	return &Filter{set: s}, nil
}

// Started reports whether the filter holds an estimate.
func (f *Filter) Started() bool { return f.started }

// Start sets the estimate to the unit direction dir (length 1, bias 0) with
// the start covariance.
func (f *Filter) Start(dir r3.Vec) {
	d := r3.Unit(dir)
	f.s, f.b = d, r3.Vec{}
	f.p = mat6{}
	a, l := f.set.StartSigma*f.set.StartSigma, f.set.StartLengthSigma*f.set.StartLengthSigma
	dv := vec(d)
	for i := range 3 {
		for j := range 3 {
			id := 0.0
			if i == j {
				id = 1
			}
			f.p[i][j] = a*(id-dv[i]*dv[j]) + l*dv[i]*dv[j]
		}
		f.p[3+i][3+i] = f.set.BiasSigma * f.set.BiasSigma
	}
	f.started = true
}

// Propagate advances the estimate over a step of dt seconds in which the
// gyro measured the body rotation vector theta (rad, the integrated rate):
//
//	ŝ⁺ = exp(−[θ̂×]) ŝ,  θ̂ = θ − b̂·Δt,  b̂⁺ = φ·b̂,  φ = exp(−Δt/τ)
//	P⁺ = Φ P Φᵀ + Q,  Φ = [[R, −Δt[ŝ⁺×]], [0, φI]]
//	Q = [[σ_v²Δt(|ŝ⁺|²I − ŝ⁺ŝ⁺ᵀ) + σ_l²Δt·ûûᵀ, 0], [0, σ_b²(1 − φ²)I]]
func (f *Filter) Propagate(theta r3.Vec, dt float64) {
	if !f.started {
		return
	}
	th := r3.Sub(theta, r3.Scale(dt, f.b))
	R := rotationMatrix(th)
	s := mulVec(&R, f.s)
	phi := math.Exp(-dt / f.set.BiasTau)
	// Φ = [[R, C], [0, φI]] with C = −Δt[s⁺×]; by blocks of P = [[S, X],
	// [Xᵀ, B]]: A = R·S + C·Xᵀ, D = R·X + C·B, then ΦPΦᵀ = [[A·Rᵀ + D·Cᵀ,
	// φD], [φDᵀ, φ²B]] (a quarter of the products of the full 6×6 form).
	var C, S, X, B [3][3]float64
	cx := cross(s)
	for i := range 3 {
		for j := range 3 {
			C[i][j] = -dt * cx[i][j]
			S[i][j] = f.p[i][j]
			X[i][j] = f.p[i][3+j]
			B[i][j] = f.p[3+i][3+j]
		}
	}
	var A, D [3][3]float64
	for i := range 3 {
		for j := range 3 {
			var a, d float64
			for k := range 3 {
				a += R[i][k]*S[k][j] + C[i][k]*X[j][k]
				d += R[i][k]*X[k][j] + C[i][k]*B[k][j]
			}
			A[i][j], D[i][j] = a, d
		}
	}
	var out mat6
	for i := range 3 {
		for j := i; j < 3; j++ {
			var v float64
			for k := range 3 {
				v += A[i][k]*R[j][k] + D[i][k]*C[j][k]
			}
			out[i][j], out[j][i] = v, v
			out[3+i][3+j], out[3+j][3+i] = phi*phi*B[i][j], phi*phi*B[i][j]
		}
		for j := range 3 {
			out[i][3+j], out[3+j][i] = phi*D[i][j], phi*D[i][j]
		}
	}
	v2 := f.set.ARW * f.set.ARW * dt
	l2 := f.set.LengthRate * f.set.LengthRate * dt
	n2 := r3.Norm2(s)
	sv, uv := vec(s), [3]float64{}
	if n2 > 0 {
		n := math.Sqrt(n2)
		uv = [3]float64{s.X / n, s.Y / n, s.Z / n}
	}
	for i := range 3 {
		for j := range 3 {
			out[i][j] += -v2*sv[i]*sv[j] + l2*uv[i]*uv[j]
		}
		out[i][i] += v2 * n2
		out[3+i][3+i] += f.set.BiasSigma * f.set.BiasSigma * (1 - phi*phi)
	}
	f.p = out
	f.s = s
	f.b = r3.Scale(phi, f.b)
}

// Cosine processes the reading z of a cosine sensor of boresight n (body
// axes, unit; z in normalised signal, 1σ sigma): h(x) = n·s. It returns
// false when the reading was gated out or the filter has not started.
func (f *Filter) Cosine(n r3.Vec, z, sigma float64) bool {
	if !f.started {
		return false
	}
	return f.scalar(n, z-r3.Dot(n, f.s), sigma*sigma)
}

// Direction processes a measured unit direction d (body axes) of 1σ sigma
// (rad) per axis: two scalar readings u₁·d and u₂·d on axes normal to the
// estimate, h(x) = uⱼ·s/|s|, linearised at the estimate before the
// update. It returns false when gated out or not started.
func (f *Filter) Direction(d r3.Vec, sigma float64) bool {
	if !f.started {
		return false
	}
	l := r3.Norm(f.s)
	if !(l > 0) {
		return false
	}
	sh := r3.Scale(1/l, f.s)
	if r3.Dot(d, sh) <= 0 {
		return false
	}
	u1, u2 := normals(sh)
	h1, h2 := r3.Scale(1/l, u1), r3.Scale(1/l, u2)
	y1, y2 := r3.Dot(u1, d), r3.Dot(u2, d)
	r := sigma * sigma
	if f.set.Gate > 0 {
		// Both axes are judged together (χ² with 2 degrees of freedom
		// against the gate² of one): a far direction is refused whole.
		s1 := quad3(&f.p, h1) + r
		s2 := quad3(&f.p, h2) + r
		if y1*y1/s1+y2*y2/s2 > f.set.Gate*f.set.Gate {
			return false
		}
	}
	s0 := f.s
	f.scalarAlways(h1, y1, r)
	f.scalarAlways(h2, y2-r3.Dot(h2, r3.Sub(f.s, s0)), r)
	return true
}

// scalar applies one scalar reading of innovation y, variance r and
// H = [h, 0], with the innovation gate.
func (f *Filter) scalar(h r3.Vec, y, r float64) bool {
	if f.set.Gate > 0 {
		if S := quad3(&f.p, h) + r; y*y > f.set.Gate*f.set.Gate*S {
			return false
		}
	}
	f.scalarAlways(h, y, r)
	return true
}

// scalarAlways is the Kalman update K = PHᵀ/S, x += K·y, P −= S·KKᵀ.
func (f *Filter) scalarAlways(h r3.Vec, y, r float64) {
	var ph [6]float64
	for i := range 6 {
		ph[i] = f.p[i][0]*h.X + f.p[i][1]*h.Y + f.p[i][2]*h.Z
	}
	S := h.X*ph[0] + h.Y*ph[1] + h.Z*ph[2] + r
	if !(S > 0) {
		return
	}
	f.s = r3.Add(f.s, r3.Scale(y/S, r3.Vec{X: ph[0], Y: ph[1], Z: ph[2]}))
	f.b = r3.Add(f.b, r3.Scale(y/S, r3.Vec{X: ph[3], Y: ph[4], Z: ph[5]}))
	for i := range 6 {
		for j := i; j < 6; j++ {
			v := f.p[i][j] - ph[i]*ph[j]/S
			f.p[i][j], f.p[j][i] = v, v
		}
	}
}

// Sun returns the estimated unit sun direction (body axes); zero before
// the start.
func (f *Filter) Sun() r3.Vec {
	if !f.started {
		return r3.Vec{}
	}
	return r3.Unit(f.s)
}

// Vector returns the estimated sun vector (its length the relative
// intensity) and gyro bias (rad/s).
func (f *Filter) Vector() (s, b r3.Vec) { return f.s, f.b }

// Covariance returns the 6×6 covariance of (s, b).
func (f *Filter) Covariance() [6][6]float64 { return f.p }

// Sigma returns the filter's own 1σ of the direction (rad): the square
// root of the covariance of s across the estimate, over |s|²; +Inf before
// the start.
func (f *Filter) Sigma() float64 {
	if !f.started {
		return math.Inf(1)
	}
	l2 := r3.Norm2(f.s)
	if !(l2 > 0) {
		return math.Inf(1)
	}
	u := r3.Scale(1/math.Sqrt(l2), f.s)
	tr := f.p[0][0] + f.p[1][1] + f.p[2][2]
	return math.Sqrt(max(tr-quad3(&f.p, u), 0) / l2)
}

// Valid reports whether the estimate counts: started and Sigma ≤ MaxSigma.
func (f *Filter) Valid() bool { return f.started && f.Sigma() <= f.set.MaxSigma }

// quad3 is hᵀP_ss h.
func quad3(p *mat6, h r3.Vec) float64 {
	return h.X*(p[0][0]*h.X+p[0][1]*h.Y+p[0][2]*h.Z) +
		h.Y*(p[1][0]*h.X+p[1][1]*h.Y+p[1][2]*h.Z) +
		h.Z*(p[2][0]*h.X+p[2][1]*h.Y+p[2][2]*h.Z)
}

// vec is v as an array, for index loops.
func vec(v r3.Vec) [3]float64 { return [3]float64{v.X, v.Y, v.Z} }

// cross is the matrix [v×] with [v×]w = v × w.
func cross(v r3.Vec) [3][3]float64 {
	return [3][3]float64{{0, -v.Z, v.Y}, {v.Z, 0, -v.X}, {-v.Y, v.X, 0}}
}

func mulVec(m *[3][3]float64, v r3.Vec) r3.Vec {
	return r3.Vec{
		X: m[0][0]*v.X + m[0][1]*v.Y + m[0][2]*v.Z,
		Y: m[1][0]*v.X + m[1][1]*v.Y + m[1][2]*v.Z,
		Z: m[2][0]*v.X + m[2][1]*v.Y + m[2][2]*v.Z,
	}
}

// rotationMatrix is exp(−[θ×]): how a vector fixed in inertial space
// appears in body axes after the body turned by the rotation vector θ
// (Rodrigues' formula; series below 1e-4 rad).
func rotationMatrix(th r3.Vec) [3][3]float64 {
	a := r3.Norm(th)
	var s, c float64 // sin a / a and (1 − cos a)/a²
	if a < 1e-4 {
		a2 := a * a
		s, c = 1-a2/6, 0.5-a2/24
	} else {
		s, c = math.Sin(a)/a, (1-math.Cos(a))/(a*a)
	}
	K := cross(th)
	var m [3][3]float64
	for i := range 3 {
		for j := range 3 {
			kk := 0.0
			for k := range 3 {
				kk += K[i][k] * K[k][j]
			}
			id := 0.0
			if i == j {
				id = 1
			}
			m[i][j] = id - s*K[i][j] + c*kk
		}
	}
	return m
}

// normals returns two unit vectors normal to the unit u and to each other.
func normals(u r3.Vec) (r3.Vec, r3.Vec) {
	a := r3.Vec{X: 1}
	if math.Abs(u.X) > 0.6 {
		a = r3.Vec{Y: 1}
	}
	u1 := r3.Unit(r3.Cross(u, a))
	return u1, r3.Cross(u, u1)
}
