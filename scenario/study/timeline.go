package study

import (
	"context"
	"fmt"
	"math"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
	"codeberg.org/sunsight/sunsight/orbit/timeline"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// buildTimeline plans the scenario's mission timeline (the timeline key)
// on the run's orbit, sun, shadow passes and the given sensors' fields of
// view, and returns it as one attitude law.
func buildTimeline(s *scenario.Scenario, newProp func() orbit.Propagator, sun ephem.Sun, viewers []sky.Viewer) (*timeline.Timeline, error) {
	tl := s.Timeline
	var phases []timeline.Phase
	for i, ph := range tl.Phases {
		path := fmt.Sprintf("timeline.phases[%d] (%s).attitude", i, ph.Name)
		// A random law is drawn once from the scenario seed: every Monte
		// Carlo unit flies the same timeline.
		law, err := buildLaw(s, ph.Law, path)
		if err != nil {
			return nil, err
		}
		p := timeline.Phase{Name: ph.Name, Law: law, Slew: ph.Slew, HoldInEclipse: ph.HoldInEclipse}
		if d, ok := law.(attitude.Detumble); ok {
			tau := d.Tau
			p.Continue = func(q r3.Rotation, w r3.Vec) attitude.Law { return attitude.Detumble{Q0: q, Rate: w, Tau: tau} }
		}
		u := ph.Until
		switch u.Kind {
		case scenario.UntilElapsed:
			p.End = timeline.End{Kind: timeline.EndAfter, AfterS: u.ElapsedS}
		case scenario.UntilRateBelow:
			p.End = timeline.End{Kind: timeline.EndRateBelow, RateRadS: u.RateRadS}
		case scenario.UntilSunSeen:
			p.End = timeline.End{Kind: timeline.EndSunSeen, SeenForS: u.SeenForS, SeenSensors: u.SeenSensors}
		case scenario.UntilEclipseEntry:
			p.End = timeline.End{Kind: timeline.EndEclipseEntry}
		case scenario.UntilEclipseExit:
			p.End = timeline.End{Kind: timeline.EndEclipseExit}
		}
		phases = append(phases, p)
	}
	D, step := s.Duration.Seconds(), s.Step.Seconds()
	prop := sim.Rewindable(newProp) // the event search refines back in time
	jd0 := ephem.JulianDateTT(s.Epoch)
	sunAt := func(t float64) r3.Vec { u, _ := sun.Position(jd0 + t/86400); return u }
	g := func(t float64) (r3.Vec, r3.Vec) {
		u, d := sun.Position(jd0 + t/86400)
		return prop.StateAt(t).R, r3.Scale(d, u)
	}
	var shadows [][2]float64
	for _, e := range illum.FindEclipsesModel(ShadowModel(s), g, 0, D, 60) {
		shadows = append(shadows, [2]float64{e.PenumbraStart, e.PenumbraEnd})
	}
	seen := func(b r3.Vec) int {
		n := 0
		for _, v := range viewers {
			if v.Sees(b) {
				n++
			}
		}
		return n
	}
	// The planner asks for states out of order (slew targets ahead of the
	// scan, holds back at shadow entry).
	plan := sim.Rewindable(newProp)
	env := timeline.Env{DurationS: D, StepS: step, State: plan.StateAt, Sun: sunAt, Shadows: shadows, Seen: seen}
	p, err := timeline.Build(phases, timeline.Limits{RateRadS: tl.SlewRateRadS, AccelRadS2: tl.SlewAccelRadS2}, env)
	if err != nil {
		return nil, fmt.Errorf("timeline: %w", err)
	}
	return p, nil
}

// Phases are the per-phase figures of a timeline run.
type Phases struct {
	// Reached is the number of phases the run reaches.
	Reached int
	Phases  []PhaseResult
}

// filterSpanStarts are the times of the first sample of each span (the
// samples SpanSamples gives it), for the gyro-aided filter's per-span
// figures: an empty span starts where the next one does.
func filterSpanStarts(spans []timeline.Span, steps int, step float64) []float64 {
	out := make([]float64, len(spans))
	for i := range spans {
		k0, _ := SpanSamples(spans, i, steps, step)
		out[i] = float64(min(k0, steps)) * step
	}
	return out
}

// PhaseResult is one span of the timeline (a phase or the slew into one)
// run on its own: the run's step grid restricted to the span.
type PhaseResult struct {
	Span timeline.Span
	// Samples is the number of the run's samples in the span (t in
	// [start, end), the run's last sample with the last span): over all
	// spans they add up to the run's samples.
	Samples int
	// Result is the span's run; nil with fewer than two samples. It runs
	// no gyro-aided filter: a filter carries its state across the spans,
	// so its figures are the primary run's over the span (Filter).
	Result *sim.Result
	// Filter is the nominal unit's gyro-aided filter over the span in the
	// primary run (sim.FilterStats.Spans); nil without a filter.
	Filter *sim.FilterSpanStats
}

// Headline returns the span's headline figures (NaN without a run), the
// filter's from the primary run over the span (NaN without a filter).
func (p PhaseResult) Headline() sim.Headline {
	n := math.NaN()
	h := sim.Headline{SunlitFraction: n, Seen1: n, Seen2: n, Seen3: n, ValidFraction: n, LongestGapS: n,
		P95NoAlbedoDeg: n, P95AlbedoDeg: n, P95AlbedoPartDeg: n, MaxErrorDeg: n}
	if p.Result != nil {
		h = p.Result.Headline()
	}
	h.FilterValidFraction, h.FilterP95Deg, h.FilterP95ShadowDeg = n, n, n
	if f := p.Filter; f != nil {
		h.FilterValidFraction, h.FilterP95Deg, h.FilterP95ShadowDeg = f.ValidFraction, f.Err.P95Deg, f.ErrShadow.P95Deg
	}
	return h
}

// TimelineOf returns the planned timeline a configuration flies (nil when
// its attitude is not a timeline).
func TimelineOf(cfg sim.Config) *timeline.Timeline {
	tl, _ := cfg.Law.(*timeline.Timeline)
	return tl
}

// SpanSamples returns the indices [k0, k1] of the run's samples in span i
// of spans over a run of steps samples at step seconds (k1 < k0 when none).
func SpanSamples(spans []timeline.Span, i, steps int, step float64) (k0, k1 int) {
	k0 = int(math.Ceil(spans[i].Start/step - 1e-9))
	k1 = int(math.Ceil(spans[i].End/step-1e-9)) - 1
	if i == len(spans)-1 {
		k1 = steps - 1
	}
	return k0, min(k1, steps-1)
}

// RunPhases runs each span of the timeline cfg flies on its own stretch of
// the run's step grid (same units, seed and models), for the per-phase
// figures; the gyro-aided filter's come from primary, the run of cfg
// (its nominal unit's FilterStats.Spans).
func RunPhases(ctx context.Context, cfg sim.Config, primary *sim.Result) (Phases, error) {
	tl := TimelineOf(cfg)
	if tl == nil {
		return Phases{}, nil
	}
	out := Phases{Reached: tl.Reached}
	steps := cfg.Steps()
	var spans []sim.FilterSpanStats
	if cfg.Filter != nil {
		if primary == nil || primary.Nominal.Filter == nil || len(primary.Nominal.Filter.Spans) != len(tl.Spans) {
			return out, fmt.Errorf("study: the timeline's filter figures need the primary run's filter over its %d spans", len(tl.Spans))
		}
		spans = primary.Nominal.Filter.Spans
	}
	for i, sp := range tl.Spans {
		k0, k1 := SpanSamples(tl.Spans, i, steps, cfg.Step)
		pr := PhaseResult{Span: sp, Samples: max(0, k1-k0+1)}
		if spans != nil {
			pr.Filter = &spans[i]
		}
		if k1 > k0 {
			c := cfg
			c.Filter = nil // the primary run's, over the span
			t0 := float64(k0) * cfg.Step
			c.Epoch = cfg.Epoch.Add(time.Duration(math.Round(t0 * 1e9)))
			c.Duration = float64(k1-k0) * cfg.Step
			newProp := cfg.NewPropagator
			c.NewPropagator = func() orbit.Propagator { return shifted{newProp(), t0} }
			c.Law = shiftedLaw{tl, t0}
			c = c.Lean()
			res, err := sim.Run(ctx, c)
			if err != nil {
				return out, fmt.Errorf("timeline phase %s: %w", sp.Name, err)
			}
			pr.Result = res
		}
		out.Phases = append(out.Phases, pr)
	}
	return out, nil
}

// shifted is a propagator whose time origin is t0 seconds after another's.
type shifted struct {
	p  orbit.Propagator
	t0 float64
}

func (s shifted) StateAt(t float64) orbit.State         { return s.p.StateAt(s.t0 + t) }
func (s shifted) Fill(dst []orbit.State, t, dt float64) { s.p.Fill(dst, s.t0+t, dt) }

// shiftedLaw is the timeline seen from t0 seconds after its origin.
type shiftedLaw struct {
	tl *timeline.Timeline
	t0 float64
}

func (l shiftedLaw) Attitude(t float64, s orbit.State, sun r3.Vec) r3.Rotation {
	return l.tl.Attitude(l.t0+t, s, sun)
}
