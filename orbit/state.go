package orbit

import "gonum.org/v1/gonum/spatial/r3"

// State is a position and velocity in the EME2000 inertial frame.
type State struct {
	R r3.Vec // position, km
	V r3.Vec // velocity, km/s
}

// Elements are classical Keplerian elements. Angles are in radians.
// For circular orbits ArgPerigee is 0 and MeanAnomaly holds the argument of
// latitude; for equatorial orbits RAAN is 0 and ArgPerigee (or MeanAnomaly,
// when also circular) is measured from the x axis (true longitude).
type Elements struct {
	SemiMajorAxisKm float64
	Eccentricity    float64
	Inclination     float64
	RAAN            float64
	ArgPerigee      float64
	MeanAnomaly     float64
}

// Propagator gives the spacecraft state at t seconds after its epoch.
type Propagator interface {
	// StateAt returns the state at t seconds after the epoch. Calls with
	// increasing t are cheap; a call backwards in time may restart.
	StateAt(t float64) State
	// Fill writes the states at t0, t0+dt, t0+2dt, ... into dst.
	Fill(dst []State, t0, dt float64)
}
