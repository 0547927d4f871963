package study

import (
	"fmt"
	"math"

	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/sgp4"
	"codeberg.org/sunsight/sunsight/scenario"
)

// sgp4Factory builds SGP4/SDP4 propagators of the scenario's TLE, checking
// that the element set propagates over the whole run (no decay, no
// eccentricity out of range) before any work starts.
func sgp4Factory(s *scenario.Scenario) (func() orbit.Propagator, error) {
	t := s.Orbit.TLE
	if t == nil {
		return nil, fmt.Errorf("orbit.propagator: sgp4 propagates the mean elements of a TLE; allowed with orbit.tle only (use two-body, j2-mean or j2-numeric for other orbits)")
	}
	el := sgp4.Elements{EpochDays1950: sgp4.EpochDays1950(t.Epoch), MeanMotion: t.MeanMotionRevDay * 2 * math.Pi / 1440,
		Eccentricity: t.Eccentricity, Inclination: t.InclinationRad, RAAN: t.RAANRad, ArgPerigee: t.ArgPerigeeRad,
		MeanAnomaly: t.MeanAnomalyRad, BStar: t.BStar}
	m, err := sgp4.New(el, sgp4.WGS72)
	if err != nil {
		return nil, fmt.Errorf("orbit.tle: %w", err)
	}
	if err := sgp4.NewPropagator(m, s.Epoch).CheckSpan(0, s.Duration.Seconds()); err != nil {
		return nil, fmt.Errorf("orbit.tle: %w; allowed a run the element set survives (shorten duration or use a newer TLE)", err)
	}
	return func() orbit.Propagator { return sgp4.NewPropagator(m, s.Epoch) }, nil
}
