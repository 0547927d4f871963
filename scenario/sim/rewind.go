package sim

import (
	"codeberg.org/sunsight/sunsight/orbit"
)

// rewindable returns a propagator that serves requests going a little back
// in time cheaply. The eclipse search refines each event inside one grid
// step: the integrator serves that from the steps it keeps (Earliest). A
// request before them would restart it from the epoch; checkpoints every
// checkpointS seconds let it restart from the latest one instead.
// Closed-form propagators are returned as they are.
func rewindable(newProp func() orbit.Propagator) orbit.Propagator {
	p := newProp()
	num, ok := p.(orbit.Restarter)
	if !ok {
		return p
	}
	return &checkpointed{cur: num, checks: []checkpoint{{0, num.InitialState()}}}
}

const checkpointS = 3600

type checkpoint struct {
	t float64
	s orbit.State
}

// checkpointed wraps a forward integrator with restart points.
type checkpointed struct {
	cur    orbit.Restarter
	t0     float64 // time of cur's epoch
	last   float64 // latest time served
	checks []checkpoint
}

func (c *checkpointed) StateAt(t float64) orbit.State {
	if t < c.last && t-c.t0 < c.cur.Earliest() {
		// Restart from the latest checkpoint at or before t.
		i := len(c.checks) - 1
		for i > 0 && c.checks[i].t > t {
			i--
		}
		ck := c.checks[i]
		p, err := c.cur.Restart(ck.s)
		if err != nil {
			panic("sim: restart of a valid orbit failed: " + err.Error())
		}
		c.cur, c.t0 = p, ck.t
		c.checks = c.checks[:i+1]
	}
	s := c.cur.StateAt(t - c.t0)
	c.last = t
	if lastCk := c.checks[len(c.checks)-1].t; t-lastCk >= checkpointS {
		c.checks = append(c.checks, checkpoint{t, s})
	}
	return s
}

func (c *checkpointed) Fill(dst []orbit.State, t0, dt float64) {
	for k := range dst {
		dst[k] = c.StateAt(t0 + float64(k)*dt)
	}
}

// Rewindable is rewindable for callers outside the engine that ask for
// states a little back in time (an event search, a planner).
func Rewindable(newProp func() orbit.Propagator) orbit.Propagator { return rewindable(newProp) }
