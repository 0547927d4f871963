package attitude

import (
	"fmt"
	"math"
	"sort"

	"codeberg.org/sunsight/sunsight/orbit"
	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"
)

// Replay plays back a sampled attitude history (an AEM or an attitude table
// from a simulation or telemetry): at a sample time it returns that sample
// exactly, between two samples the spherical linear interpolation of their
// quaternions (Shoemake 1985, SIGGRAPH, "Animating rotation with quaternion
// curves"; from memory), the shorter way round.
type Replay struct {
	T []float64     // seconds after the run epoch, increasing
	Q []quat.Number // unit quaternions of body ← ECI
}

// NewReplay checks that the samples cover [0, duration] seconds.
func NewReplay(t []float64, q []quat.Number, duration float64) (*Replay, error) {
	if len(t) < 2 || len(t) != len(q) {
		return nil, fmt.Errorf("attitude: a replay needs at least two samples, one quaternion each")
	}
	if t[0] > 1e-6 || t[len(t)-1] < duration-1e-6 {
		return nil, fmt.Errorf("attitude: the attitude history covers %.3f s to %.3f s after the run epoch; allowed a history covering the run [0, %.0f s]", t[0], t[len(t)-1], duration)
	}
	return &Replay{T: t, Q: q}, nil
}

// Attitude returns the interpolated attitude at t.
func (l *Replay) Attitude(t float64, _ orbit.State, _ r3.Vec) r3.Rotation {
	k := sort.SearchFloat64s(l.T, t) // first sample ≥ t
	if k < len(l.T) && l.T[k] == t {
		return r3.Rotation(l.Q[k])
	}
	k = max(1, min(k, len(l.T)-1))
	u := (t - l.T[k-1]) / (l.T[k] - l.T[k-1])
	return r3.Rotation(slerp(l.Q[k-1], l.Q[k], u))
}

// slerp interpolates unit quaternions a → b by u ∈ [0, 1].
func slerp(a, b quat.Number, u float64) quat.Number {
	d := a.Real*b.Real + a.Imag*b.Imag + a.Jmag*b.Jmag + a.Kmag*b.Kmag
	if d < 0 {
		b, d = quat.Scale(-1, b), -d
	}
	if d > 1-1e-12 {
		q := quat.Add(quat.Scale(1-u, a), quat.Scale(u, b))
		return quat.Scale(1/quat.Abs(q), q)
	}
	θ := math.Acos(min(1, d))
	s := math.Sin(θ)
	return quat.Add(quat.Scale(math.Sin((1-u)*θ)/s, a), quat.Scale(math.Sin(u*θ)/s, b))
}
