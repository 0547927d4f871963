package timeline

import (
	"math"

	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// SegmentKind says how a segment of the timeline points the spacecraft.
type SegmentKind int

const (
	// Fly follows the phase's attitude law.
	Fly SegmentKind = iota
	// Hold keeps a fixed attitude (the law's at eclipse entry).
	Hold
	// Slew turns about a fixed eigen-axis from one attitude to the next.
	Slew
)

// Segment is a stretch [Start, End) of the timeline flown one way.
type Segment struct {
	Start, End float64
	Phase      int // index of the phase span it belongs to
	Kind       SegmentKind
	// Law and LawStart: a Fly segment evaluates Law at t − LawStart.
	Law      attitude.Law
	LawStart float64
	// Q is the held attitude (Hold) or the slew's start (Slew).
	Q r3.Rotation
	// Axis and Angle are the slew's eigen-axis (unit, of the quaternion
	// that takes Q to the end attitude by left product) and angle (rad).
	Axis   r3.Vec
	Angle  float64
	Limits Limits
}

// Timeline is a planned mission timeline: an attitude law made of
// segments that tile [0, duration], and the phase spans they belong to.
type Timeline struct {
	Segments []Segment
	Spans    []Span
	// Reached is the number of phases the run reaches, of Phases; later
	// ones are never flown (an end condition not met before the run ended).
	Reached, Phases int
}

// find returns the index of the segment containing t (the last one at or
// after its end), by bisection, allocating nothing.
func (tl *Timeline) find(t float64) int {
	lo, hi := 0, len(tl.Segments)-1
	for lo < hi {
		mid := (lo + hi + 1) / 2
		if tl.Segments[mid].Start <= t {
			lo = mid
		} else {
			hi = mid - 1
		}
	}
	return lo
}

// Attitude implements attitude.Law.
func (tl *Timeline) Attitude(t float64, s orbit.State, sunDir r3.Vec) r3.Rotation {
	return tl.Segments[tl.find(t)].attitude(t, s, sunDir)
}

// SegmentAt returns the segment flown at t.
func (tl *Timeline) SegmentAt(t float64) Segment { return tl.Segments[tl.find(t)] }

func (g *Segment) attitude(t float64, s orbit.State, sunDir r3.Vec) r3.Rotation {
	switch g.Kind {
	case Hold:
		return g.Q
	case Slew:
		φ := g.Limits.AngleAt(g.Angle, t-g.Start)
		return turn(g.Q, g.Axis, φ)
	}
	return g.Law.Attitude(t-g.LawStart, s, sunDir)
}

// turn returns q turned by φ about axis: R(φ) ⊗ q, with R(φ) =
// (cos φ/2, sin φ/2·axis).
func turn(q r3.Rotation, axis r3.Vec, φ float64) r3.Rotation {
	sn, c := math.Sincos(φ / 2)
	r := quat.Number{Real: c, Imag: sn * axis.X, Jmag: sn * axis.Y, Kmag: sn * axis.Z}
	return r3.Rotation(quat.Mul(r, quat.Number(q)))
}

// eigen returns the axis and angle in [0, π] of the rotation that takes a
// to b by left product (b = R ⊗ a).
func eigen(a, b r3.Rotation) (r3.Vec, float64) {
	r := quat.Mul(quat.Number(b), quat.Conj(quat.Number(a)))
	if r.Real < 0 {
		r = quat.Scale(-1, r)
	}
	v := r3.Vec{X: r.Imag, Y: r.Jmag, Z: r.Kmag}
	n := r3.Norm(v)
	if n < 1e-15 {
		return r3.Vec{Z: 1}, 0
	}
	return r3.Scale(1/n, v), 2 * math.Atan2(n, r.Real)
}
