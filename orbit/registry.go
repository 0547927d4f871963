package orbit

import (
	"fmt"
	"strings"
)

// Restarter is a propagator that integrates forward from its epoch
// (J2Numeric): going back in time restarts it, and it can restart from any
// state. A caller asks for this capability, never for a concrete type.
type Restarter interface {
	Propagator
	// InitialState is the state at t = 0.
	InitialState() State
	// Restart returns a fresh propagator of the same kind and options
	// whose t = 0 state is s.
	Restart(s State) (Restarter, error)
	// Earliest is the earliest t served without integrating again: a
	// caller going back in time restarts only before it.
	Earliest() float64
	// Fork returns a copy in the current state of the integration: asked
	// the same times, it gives bit for bit what this one would. Pieces of
	// a time grid run on several cores from forks of one integration.
	Fork() Restarter
}

// PropagatorInfo is the registry entry of one propagator: its name in the
// scenario file, what it models and its published source (the report's
// models table and check print both), and its builder.
type PropagatorInfo struct {
	Name   string
	Model  string
	Source string
	// New returns the factory of fresh propagators started from the mean
	// elements (one per Monte Carlo unit or worker); nil when FromTLE.
	New func(mean Elements) (func() Propagator, error)
	// NewFromState returns the factory started from an osculating EME2000
	// state at the epoch (an orbit given as a state or as osculating
	// elements); nil when FromTLE.
	NewFromState func(osc State) (func() Propagator, error)
	// FromTLE says the propagator starts from a two-line element set (its
	// builder is orbit/sgp4's, given the TLE).
	FromTLE bool
	// FromFile says the propagator interpolates an ephemeris file (its
	// builder is orbit/ccsds's, given the file).
	FromFile bool
}

// EphemerisPropagator is the name of the propagator that interpolates an
// orbit ephemeris file.
const EphemerisPropagator = "ephemeris-file"

// propagators is the registry, in the order names are listed.
var propagators = []PropagatorInfo{
	{Name: "two-body", Model: "Keplerian two-body motion",
		Source: "closed form; D. A. Vallado, Fundamentals of Astrodynamics and Applications, 4th ed., 2013",
		New: func(el Elements) (func() Propagator, error) {
			return func() Propagator { return NewTwoBody(el) }, nil
		},
		NewFromState: func(osc State) (func() Propagator, error) {
			el, err := ElementsFromState(osc)
			if err != nil {
				return nil, err
			}
			return func() Propagator { return NewTwoBody(el) }, nil
		}},
	{Name: "j2-mean", Model: "mean elements with the secular J2 rates of RAAN, argument of perigee and mean anomaly to second order in J2, no short-period terms",
		Source: "Y. Kozai, AJ 64, 367, 1959; Vallado 4th ed. 2013, §9.6",
		New: func(el Elements) (func() Propagator, error) {
			return func() Propagator { return NewJ2Mean(el) }, nil
		},
		NewFromState: func(osc State) (func() Propagator, error) {
			el, err := ElementsFromState(osc)
			if err != nil {
				return nil, err
			}
			mean := OsculatingToMean(el)
			return func() Propagator { return NewJ2Mean(mean) }, nil
		}},
	{Name: "j2-numeric", Model: "Cowell integration of point mass + J2 with adaptive Dormand–Prince 5(4), started from the osculating state of the mean elements",
		Source: "J. R. Dormand and P. J. Prince, A family of embedded Runge-Kutta formulae, J. Comput. Appl. Math. 6, 19–26, 1980",
		New:    newJ2NumericFactory,
		NewFromState: func(osc State) (func() Propagator, error) {
			el, err := ElementsFromState(osc)
			if err != nil {
				return nil, err
			}
			opt := NumericOptions{}.withDefaults(el.SemiMajorAxisKm)
			if _, err := NewJ2NumericFromState(osc, opt); err != nil {
				return nil, err
			}
			return func() Propagator { q, _ := NewJ2NumericFromState(osc, opt); return q }, nil
		}},
	{Name: EphemerisPropagator, Model: "states of a CCSDS OEM interpolated by its Lagrange or Hermite polynomials", FromFile: true,
		Source: "CCSDS 502.0-B-2 Orbit Data Messages"},
	{Name: "sgp4", Model: "SGP4/SDP4 from the mean elements of a TLE, TEME rotated to EME2000", FromTLE: true,
		Source: "F. R. Hoots and R. L. Roehrich, Spacetrack Report No. 3, 1980; D. A. Vallado et al., Revisiting Spacetrack Report #3, AIAA 2006-6753"},
}

// newJ2NumericFactory converts the mean elements to an osculating state once;
// each fresh propagator restarts from that state.
func newJ2NumericFactory(el Elements) (func() Propagator, error) {
	p, err := NewJ2Numeric(el, NumericOptions{})
	if err != nil {
		return nil, err
	}
	// Every propagator starts alike, from the osculating state: handing
	// the first caller p itself (started from the elements) made a run's
	// last bits depend on whether it was the first in the process, and the
	// flag that decided it was shared by the goroutines that call the
	// factory.
	s0, opt := p.InitialState(), p.Options()
	return func() Propagator {
		q, _ := NewJ2NumericFromState(s0, opt)
		return q
	}, nil
}

// Propagators lists the registered propagators.
func Propagators() []PropagatorInfo { return append([]PropagatorInfo(nil), propagators...) }

// PropagatorNames lists the registered propagator names.
func PropagatorNames() []string {
	out := make([]string, len(propagators))
	for i, p := range propagators {
		out[i] = p.Name
	}
	return out
}

// LookupPropagator returns the registry entry of a propagator.
func LookupPropagator(name string) (PropagatorInfo, error) {
	for _, p := range propagators {
		if p.Name == name {
			return p, nil
		}
	}
	return PropagatorInfo{}, fmt.Errorf("orbit: propagator %q is not one of %s", name, strings.Join(PropagatorNames(), ", "))
}
