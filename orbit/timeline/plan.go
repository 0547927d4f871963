package timeline

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// EndKind is the condition that ends a phase.
type EndKind int

const (
	// EndRunEnd: the phase lasts until the end of the run.
	EndRunEnd EndKind = iota
	// EndAfter: the phase lasts End.AfterS seconds (its slew included).
	EndAfter
	// EndRateBelow: the phase ends when its law's body rate falls to
	// End.RateRadS (a law with a rate decay: Detumble).
	EndRateBelow
	// EndSunSeen: the phase ends once the direct sun has been seen by at
	// least End.SeenSensors sensors, in full sun, at every step for
	// End.SeenForS seconds.
	EndSunSeen
	// EndEclipseEntry and EndEclipseExit: the phase ends at the next
	// shadow entry (or exit) after it starts.
	EndEclipseEntry
	EndEclipseExit
)

// End is a phase's end condition.
type End struct {
	Kind        EndKind
	AfterS      float64
	RateRadS    float64
	SeenForS    float64
	SeenSensors int
}

// Phase is one entry of a mission timeline.
type Phase struct {
	Name string
	Law  attitude.Law
	// Continue, when set and the previous phase's law knows its body rate
	// (BodyRater), replaces Law with a law started from the attitude and
	// rate the previous phase left (a detumble following a tumble).
	Continue func(q r3.Rotation, rate r3.Vec) attitude.Law
	End      End
	// HoldInEclipse keeps the attitude of shadow entry until shadow exit,
	// then returns to the law by an eigen-axis slew within the limits.
	HoldInEclipse bool
	// Slew turns the spacecraft from the previous phase's last attitude
	// onto this phase's law by an eigen-axis slew within the limits.
	Slew bool
}

// BodyRater is a law that knows its body rates (rad/s) at t.
type BodyRater interface {
	BodyRate(t float64) r3.Vec
}

// RateDecayer is a law whose body rate falls to a bound at a known time.
type RateDecayer interface {
	TimeToRate(bound float64) float64
}

// Env is what the planner needs of the run: its span and step grid, the
// orbit, the sun, the shadow passes and the sensors.
type Env struct {
	DurationS, StepS float64
	State            func(t float64) orbit.State
	Sun              func(t float64) r3.Vec // unit, ECI
	// Shadows are the shadow passes (penumbra included), [start, end) in
	// seconds since the epoch, in time order.
	Shadows [][2]float64
	// Seen returns how many sensors see the direct sun from the body
	// direction sunBody (fields of view and obstructions).
	Seen func(sunBody r3.Vec) int
}

// Span is one stretch of the planned timeline: a phase, or the slew into
// it.
type Span struct {
	Name  string
	Phase int // index of the phase (the target phase for a slew)
	Slew  bool
	// Start and End are seconds since the epoch; spans tile [0, duration].
	Start, End float64
	// Met says the end condition was met; false when the run ended first
	// (or for a phase without an end condition).
	Met bool
	// SlewAngleRad is the eigen-axis angle of a slew.
	SlewAngleRad float64
	// ReturnSlews counts the slews back onto the phase's law after its
	// held shadow passes; ReturnSlewMaxRad and ReturnSlewMaxS are the
	// largest angle and the longest time among them.
	ReturnSlews                      int
	ReturnSlewMaxRad, ReturnSlewMaxS float64
}

// ErrRateBelow says a rate end condition was set on a law without a rate
// decay.
var ErrRateBelow = errors.New("timeline: the rate end condition needs a law whose rate decays (detumble)")

// Build plans the phases over env with slews at lim. The spans tile
// [0, env.DurationS] exactly and the timeline's segments likewise.
func Build(phases []Phase, lim Limits, env Env) (*Timeline, error) {
	if len(phases) == 0 {
		return nil, errors.New("timeline: no phase")
	}
	if !(env.DurationS > 0) || !(env.StepS > 0) {
		return nil, fmt.Errorf("timeline: duration %g s and step %g s: both must be positive", env.DurationS, env.StepS)
	}
	b := builder{env: env, lim: lim, tl: &Timeline{}}
	p := b.tl
	p.Phases = len(phases)
	t := 0.0
	var prevLaw attitude.Law
	prevLawStart := 0.0
	for i, ph := range phases {
		if t >= env.DurationS {
			break
		}
		p.Reached++
		law := ph.Law
		if ph.Continue != nil && i > 0 {
			if r, ok := prevLaw.(BodyRater); ok {
				st := env.State(t)
				law = ph.Continue(b.attitudeAt(t, st), r.BodyRate(t-prevLawStart))
			}
		}
		if ph.End.Kind == EndRateBelow {
			if _, ok := law.(RateDecayer); !ok {
				return nil, fmt.Errorf("phase %d (%s): %w", i, ph.Name, ErrRateBelow)
			}
		}
		start := t
		if ph.Slew && i > 0 {
			a0 := b.attitudeAt(t, env.State(t))
			axis, θ, T, err := b.slewTo(a0, law, start, t)
			if err != nil {
				return nil, fmt.Errorf("phase %d (%s): %w", i, ph.Name, err)
			}
			if θ > 1e-9 {
				end := min(t+T, env.DurationS)
				b.add(Segment{Start: t, End: end, Phase: len(p.Spans), Kind: Slew, Q: a0, Axis: axis, Angle: θ, Limits: lim})
				p.Spans = append(p.Spans, Span{Name: "slew to " + ph.Name, Phase: i, Slew: true, Start: t, End: end,
					Met: end < env.DurationS, SlewAngleRad: θ})
				t = end
				if t >= env.DurationS {
					p.Reached-- // the run ends in the slew: the phase itself is never flown
					break
				}
			}
		}
		end, met := b.end(ph, law, start, t)
		if end > env.DurationS || !met {
			end, met = env.DurationS, false
		}
		if ph.End.Kind == EndRunEnd {
			met = false
		}
		if i == len(phases)-1 {
			// The last phase's law carries on to the end of the run
			// after its end condition is met.
			end = env.DurationS
		}
		p.Spans = append(p.Spans, Span{Name: ph.Name, Phase: i, Start: t, End: end, Met: met})
		if err := b.fly(len(p.Spans)-1, law, start, t, end, ph.HoldInEclipse); err != nil {
			return nil, fmt.Errorf("phase %d (%s): %w", i, ph.Name, err)
		}
		t = end
		prevLaw, prevLawStart = law, start
	}
	return p, nil
}

type builder struct {
	env  Env
	lim  Limits
	tl   *Timeline
	last Segment // the last segment added (an empty one while none is kept)
}

func (b *builder) add(s Segment) {
	if s.End > s.Start {
		b.tl.Segments = append(b.tl.Segments, s)
		b.last = s
	} else if len(b.tl.Segments) == 0 {
		b.last = s
	}
}

// attitudeAt is the attitude the segments built so far give at t (the
// last one's, continued, at or after its end).
func (b *builder) attitudeAt(t float64, st orbit.State) r3.Rotation {
	return b.last.attitude(t, st, b.env.Sun(t))
}

// slewTo finds the eigen-axis slew from a0 at t onto law (time origin
// lawStart): the target is the law's attitude at the slew's end, found by
// fixed-point iteration on the slew time. A target turning slower than the
// slew rate limit (nadir: one turn per orbit) settles to a microsecond in a
// few iterations; one turning faster cannot be caught (ErrSlewCatch).
func (b *builder) slewTo(a0 r3.Rotation, law attitude.Law, lawStart, t float64) (axis r3.Vec, θ, T float64, err error) {
	target := func(tt float64) r3.Rotation { return law.Attitude(tt-lawStart, b.env.State(tt), b.env.Sun(tt)) }
	axis, θ = eigen(a0, target(t))
	T = b.lim.Duration(θ)
	for range 200 {
		if t+T >= b.env.DurationS {
			return axis, θ, T, nil // the run ends during the slew
		}
		a, th := eigen(a0, target(t+T))
		nt := b.lim.Duration(th)
		if math.Abs(nt-T) < 1e-7 {
			return a, th, nt, nil
		}
		T = nt
	}
	return axis, θ, T, ErrSlewCatch
}

// ErrSlewCatch says a slew's target attitude moves too fast to be caught
// within the slew limits.
var ErrSlewCatch = errors.New("timeline: the slew cannot catch the attitude of the law it turns to (it moves about as fast as the slew rate limit or faster)")

// end returns when phase ph (law started at lawStart, flown from t) ends,
// and whether its condition is met before the run ends.
func (b *builder) end(ph Phase, law attitude.Law, lawStart, t float64) (float64, bool) {
	D := b.env.DurationS
	switch ph.End.Kind {
	case EndAfter:
		return lawStart + ph.End.AfterS, lawStart+ph.End.AfterS <= D
	case EndRateBelow:
		e := max(t, lawStart+law.(RateDecayer).TimeToRate(ph.End.RateRadS))
		return e, e <= D
	case EndEclipseEntry, EndEclipseExit:
		for _, s := range b.env.Shadows {
			e := s[0]
			if ph.End.Kind == EndEclipseExit {
				e = s[1]
			}
			if e > t && e <= D {
				return e, true
			}
		}
		return D, false
	case EndSunSeen:
		return b.sunSeen(ph, law, lawStart, t)
	}
	return D, false
}

// sunSeen scans the run's step grid from t for the first time the sun has
// been seen by enough sensors, in full sun, at every step for the stated
// time.
func (b *builder) sunSeen(ph Phase, law attitude.Law, lawStart, t float64) (float64, bool) {
	env := b.env
	k0 := int(math.Ceil(t/env.StepS - 1e-9))
	n := int(math.Floor(env.DurationS/env.StepS + 1e-9))
	from := math.NaN()
	sh := 0
	for k := k0; k <= n; k++ {
		tk := float64(k) * env.StepS
		for sh < len(env.Shadows) && env.Shadows[sh][1] <= tk {
			sh++
		}
		ok := !(sh < len(env.Shadows) && env.Shadows[sh][0] <= tk)
		if ok {
			st := env.State(tk)
			sun := env.Sun(tk)
			q := law.Attitude(tk-lawStart, st, sun)
			ok = env.Seen(q.Rotate(sun)) >= ph.End.SeenSensors
		}
		switch {
		case !ok:
			from = math.NaN()
		case math.IsNaN(from):
			from = tk
		}
		if ok && tk-from >= ph.End.SeenForS-1e-9 {
			return tk, true
		}
	}
	return env.DurationS, false
}

// fly adds the segments of a phase flown from t to end: its law, held at
// the shadow-entry attitude through each shadow pass when hold is set and
// then slewed back onto the law (rest to rest, within the limits; cut at
// end). A shadow entered during a return slew is held from the slew's end.
func (b *builder) fly(span int, law attitude.Law, lawStart, t, end float64, hold bool) error {
	if !hold {
		b.add(Segment{Start: t, End: end, Phase: span, Kind: Fly, Law: law, LawStart: lawStart})
		return nil
	}
	sp := &b.tl.Spans[span]
	for _, s := range b.env.Shadows {
		if s[1] <= t || s[0] >= end {
			continue
		}
		h0, h1 := max(t, s[0]), min(end, s[1])
		b.add(Segment{Start: t, End: h0, Phase: span, Kind: Fly, Law: law, LawStart: lawStart})
		q := law.Attitude(h0-lawStart, b.env.State(h0), b.env.Sun(h0))
		b.add(Segment{Start: h0, End: h1, Phase: span, Kind: Hold, Q: q})
		t = h1
		if h1 >= end {
			break
		}
		axis, θ, T, err := b.slewTo(q, law, lawStart, h1)
		if err != nil {
			return fmt.Errorf("return slew after the shadow pass ending at %.1f s: %w", h1, err)
		}
		if θ <= 1e-9 {
			continue
		}
		t = min(h1+T, end)
		b.add(Segment{Start: h1, End: t, Phase: span, Kind: Slew, Q: q, Axis: axis, Angle: θ, Limits: b.lim})
		sp.ReturnSlews++
		sp.ReturnSlewMaxRad = max(sp.ReturnSlewMaxRad, θ)
		sp.ReturnSlewMaxS = max(sp.ReturnSlewMaxS, t-h1)
	}
	b.add(Segment{Start: t, End: end, Phase: span, Kind: Fly, Law: law, LawStart: lawStart})
	return nil
}
