package orbit

import (
	"fmt"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// NumericOptions tunes the Cowell integration of J2Numeric. Zero fields take
// the defaults noted.
type NumericOptions struct {
	// RelTol is the relative local error tolerance (default 1e-11).
	RelTol float64
	// AbsTolKm is the absolute local error tolerance, used for the position
	// (km) and the velocity (km/s) components alike (default 1e-9).
	AbsTolKm float64
	// MaxStepS caps the step (default a twentieth of the period).
	MaxStepS float64
	// PointMassOnly switches J2 off (a check against the two-body solution).
	// The elements are then taken as osculating.
	PointMassOnly bool
}

func (o NumericOptions) withDefaults(aKm float64) NumericOptions {
	if o.RelTol <= 0 {
		o.RelTol = 1e-11
	}
	if o.AbsTolKm <= 0 {
		o.AbsTolKm = 1e-9
	}
	if o.MaxStepS <= 0 {
		o.MaxStepS = Period(aKm) / 20
	}
	return o
}

// J2Numeric integrates the point-mass plus J2 equations of motion in
// Cartesian coordinates (Cowell's method) with an adaptive Dormand–Prince
// 5(4) scheme and dense output at the requested times.
type J2Numeric struct {
	initial State
	h0      float64
	rk      *dopri5
	opt     NumericOptions
}

// NewJ2Numeric returns the Cowell propagator of MEAN elements: it starts
// from the osculating state MeanToOsculating(mean) gives, so that its
// long-term node and perigee motion matches J2Mean of the same elements.
func NewJ2Numeric(mean Elements, opt NumericOptions) (*J2Numeric, error) {
	if err := mean.Validate(); err != nil {
		return nil, err
	}
	if opt.RelTol < 0 || opt.AbsTolKm < 0 || opt.MaxStepS < 0 {
		return nil, fmt.Errorf("orbit: numeric tolerances and step cap must not be negative")
	}
	osc := mean
	if !opt.PointMassOnly {
		osc = MeanToOsculating(mean)
	}
	return newJ2NumericState(osc.State(), mean.SemiMajorAxisKm, opt), nil
}

// NewJ2NumericFromState returns the Cowell propagator started from an
// osculating state s at t = 0 (no mean-element conversion).
func NewJ2NumericFromState(s State, opt NumericOptions) (*J2Numeric, error) {
	c := ConicFromState(s)
	if c.Eccentricity >= 1 {
		return nil, ErrNotElliptic
	}
	if vecmath.Norm(s.R) < RadiusEarthKm {
		return nil, fmt.Errorf("orbit: initial position is inside the Earth")
	}
	a := c.SemiLatusRectumKm / (1 - c.Eccentricity*c.Eccentricity)
	return newJ2NumericState(s, a, opt), nil
}

func newJ2NumericState(s State, aKm float64, opt NumericOptions) *J2Numeric {
	opt = opt.withDefaults(aKm)
	j2 := !opt.PointMassOnly
	f := func(_ float64, y *vec6, dy *vec6) {
		acc := accelJ2(r3.Vec{X: y[0], Y: y[1], Z: y[2]}, j2)
		dy[0], dy[1], dy[2] = y[3], y[4], y[5]
		dy[3], dy[4], dy[5] = acc.X, acc.Y, acc.Z
	}
	h0 := Period(aKm) / 1000
	return &J2Numeric{initial: s, h0: h0, opt: opt, rk: newDopri5(f, 0, pack(s), h0, opt.RelTol, opt.AbsTolKm, opt.MaxStepS)}
}

// Options returns the integration options in force (defaults filled in), so
// a caller can start another integration of the same orbit from a state.
func (p *J2Numeric) Options() NumericOptions { return p.opt }

// InitialState returns the osculating state at t = 0.
func (p *J2Numeric) InitialState() State { return p.initial }

// Restart implements Restarter: a fresh integrator with the same options
// started from s.
func (p *J2Numeric) Restart(s State) (Restarter, error) { return NewJ2NumericFromState(s, p.opt) }

// StateAt returns the state at t ≥ 0. Increasing t continues the
// integration; a t before the current step is served from the dense output
// of the steps kept (see Earliest), or restarts the integration from the
// epoch when it lies before them. A negative t is a programming error and
// panics.
func (p *J2Numeric) StateAt(t float64) State {
	if t < 0 {
		panic("orbit: J2Numeric.StateAt needs t ≥ 0")
	}
	var y vec6
	if t < p.rk.t {
		if p.rk.atPast(t, &y) {
			return unpack(&y)
		}
		p.rk.reset(0, pack(p.initial), p.h0)
	}
	p.rk.advanceTo(t, &y)
	return unpack(&y)
}

// Earliest implements Restarter: the earliest time StateAt serves without
// integrating again from the epoch (the start of the oldest step kept).
func (p *J2Numeric) Earliest() float64 { return p.rk.earliest() }

// Fork implements Restarter: a copy of the integration as it stands (the
// steps taken do not depend on the times asked, so the copy continues it
// bit for bit).
func (p *J2Numeric) Fork() Restarter {
	c := *p
	rk := *p.rk
	c.rk = &rk
	return &c
}

// Fill writes the states at t0 + k·dt into dst.
func (p *J2Numeric) Fill(dst []State, t0, dt float64) {
	for k := range dst {
		dst[k] = p.StateAt(t0 + float64(k)*dt)
	}
}

// Steps returns the number of accepted and rejected integration steps so far.
func (p *J2Numeric) Steps() (accepted, rejected int) { return p.rk.steps, p.rk.reject }

func pack(s State) vec6 { return vec6{s.R.X, s.R.Y, s.R.Z, s.V.X, s.V.Y, s.V.Z} }

func unpack(y *vec6) State {
	return State{R: r3.Vec{X: y[0], Y: y[1], Z: y[2]}, V: r3.Vec{X: y[3], Y: y[4], Z: y[5]}}
}
