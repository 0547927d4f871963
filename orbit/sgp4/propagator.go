package sgp4

import (
	"fmt"
	"math"
	"time"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/orbit"
	"gonum.org/v1/gonum/spatial/r3"
)

// JD1950 is the Julian date of 1949 December 31 00:00 UTC, the origin of
// SGP4's epoch days.
const JD1950 = 2433281.5

// EpochDays1950 returns the SGP4 epoch (days since JD 2433281.5) of a UTC
// instant.
func EpochDays1950(utc time.Time) float64 {
	return float64(utc.UnixNano())/86400e9 + 2440587.5 - JD1950
}

// frameStep is the spacing, in days, of the TT dates at which the TEME →
// EME2000 matrix is evaluated; a state uses the matrix of the nearest node.
// Precession (50″/yr) and nutation (largest rate 0.1″/day) move the frame by
// less than 0.005″ in half an hour, 0.2 m at GEO.
const frameStep = 1.0 / 48

// Propagator runs SGP4/SDP4 as an orbit.Propagator: StateAt(t) is the
// EME2000 state t seconds after the run epoch. Each Propagator owns its copy
// of the model (the resonance integrator keeps state), so give every worker
// its own.
type Propagator struct {
	m         Model
	offsetMin float64 // run epoch − element epoch, minutes
	jdTT0     float64
	node      float64
	mat       [3][3]float64
	hasMat    bool
}

// NewPropagator returns a propagator of m whose t = 0 is runEpoch (UTC).
func NewPropagator(m *Model, runEpoch time.Time) *Propagator {
	return &Propagator{m: *m, offsetMin: (EpochDays1950(runEpoch) - m.el.EpochDays1950) * 1440,
		jdTT0: ephem.JulianDateTT(runEpoch)}
}

// CheckSpan propagates from t0 to t1 seconds after the run epoch every ten
// minutes (and at t1) and returns the first SGP4 failure (decay, an
// eccentricity out of range), naming its time, so a run never meets one.
func (p *Propagator) CheckSpan(t0, t1 float64) error {
	m := p.m
	for t := t0; ; t += 600 {
		if t > t1 {
			t = t1
		}
		if _, _, err := m.Propagate(p.offsetMin + t/60); err != nil {
			return fmt.Errorf("%w at %.0f s after the run epoch (%.2f days after the element epoch)", err, t, (p.offsetMin+t/60)/1440)
		}
		if t == t1 {
			return nil
		}
	}
}

// StateAt returns the EME2000 state t seconds after the run epoch. Where
// SGP4 fails (which CheckSpan rules out for a run) the state is what the
// model returned, zero or the last decayed state.
func (p *Propagator) StateAt(t float64) orbit.State {
	r, v, _ := p.m.Propagate(p.offsetMin + t/60)
	jd := p.jdTT0 + t/86400
	node := math.Round(jd/frameStep) * frameStep
	if !p.hasMat || node != p.node {
		p.mat, p.node, p.hasMat = ephem.TEMEToEME2000(node), node, true
	}
	M := &p.mat
	return orbit.State{
		R: r3.Vec{X: M[0][0]*r[0] + M[0][1]*r[1] + M[0][2]*r[2], Y: M[1][0]*r[0] + M[1][1]*r[1] + M[1][2]*r[2], Z: M[2][0]*r[0] + M[2][1]*r[1] + M[2][2]*r[2]},
		V: r3.Vec{X: M[0][0]*v[0] + M[0][1]*v[1] + M[0][2]*v[2], Y: M[1][0]*v[0] + M[1][1]*v[1] + M[1][2]*v[2], Z: M[2][0]*v[0] + M[2][1]*v[1] + M[2][2]*v[2]},
	}
}

// Fill writes the states at t0 + k·dt into dst.
func (p *Propagator) Fill(dst []orbit.State, t0, dt float64) {
	for k := range dst {
		dst[k] = p.StateAt(t0 + float64(k)*dt)
	}
}
