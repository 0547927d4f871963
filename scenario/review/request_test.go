package review

import (
	"context"
	"path/filepath"
	"slices"
	"strings"
	"sync/atomic"
	"testing"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/plots/figures"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// countingSun counts the sun positions asked for.
type countingSun struct {
	ephem.Sun
	n *atomic.Int64
}

func (c countingSun) Position(jdTT float64) (r3.Vec, float64) {
	c.n.Add(1)
	return c.Sun.Position(jdTT)
}

// countingPropagator counts the states asked for after the epoch.
type countingPropagator struct {
	orbit.Propagator
	n *atomic.Int64
}

func (c countingPropagator) StateAt(t float64) orbit.State {
	if t != 0 {
		c.n.Add(1)
	}
	return c.Propagator.StateAt(t)
}

func (c countingPropagator) Fill(dst []orbit.State, t0, dt float64) {
	c.n.Add(int64(len(dst)))
	c.Propagator.Fill(dst, t0, dt)
}

// The review builds every figure and the report from a run's result
// alone: once the run is done, neither the run's propagators nor its sun
// are asked for anything but the epoch state (no second run, no second
// physics pipeline for the year view).
func TestReviewBuildsFromTheResultAlone(t *testing.T) {
	s, err := scenario.Load(filepath.Join("..", "..", "examples", "nadir-6u-sso.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	s.Duration = scenario.Span(6 * time.Hour)
	cfg, err := study.Config(s)
	if err != nil {
		t.Fatal(err)
	}
	if err := Request(s, &cfg, figures.Names()); err != nil {
		t.Fatal(err)
	}
	var sunCalls, states atomic.Int64
	cfg.Sun = countingSun{cfg.Sun, &sunCalls}
	for _, np := range []*func() orbit.Propagator{&cfg.NewPropagator, &cfg.Season.NewPropagator} {
		inner := *np
		*np = func() orbit.Propagator { return countingPropagator{inner(), &states} }
	}
	res, err := sim.Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	if sunCalls.Load() == 0 || states.Load() == 0 {
		t.Fatalf("the counters saw nothing of the run (sun %d, states %d)", sunCalls.Load(), states.Load())
	}
	sunCalls.Store(0)
	states.Store(0)
	figs, err := Figures(s, cfg, res, figures.Names())
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Report(s, cfg, res, figs, Provenance{Input: "test.yaml"}); err != nil {
		t.Fatal(err)
	}
	if n, m := sunCalls.Load(), states.Load(); n != 0 || m != 0 {
		t.Errorf("the review asked for %d sun positions and %d orbit states after the run", n, m)
	}
	var got []string
	for _, f := range figs {
		got = append(got, f.Name)
	}
	for _, want := range []string{FigSky, FigTimeline, FigYear, FigError} {
		if !slices.Contains(got, want) {
			t.Errorf("figures %v lack %s", got, want)
		}
	}
}

// Only the requested figures are built: a run (with panels, so every
// figure can be drawn) asked for one figure keeps
// only what that figure needs, and Figures draws that one alone (building
// any other would fail on the data the run did not keep).
func TestOnlyRequestedFiguresAreBuilt(t *testing.T) {
	s, err := scenario.Load(filepath.Join("..", "..", "examples", "power-6u.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	s.Duration = scenario.Span(3 * time.Hour)
	for _, name := range figures.Names() {
		cfg, err := study.Config(s)
		if err != nil {
			t.Fatal(err)
		}
		if err := Request(s, &cfg, []string{name}); err != nil {
			t.Fatal(err)
		}
		if (cfg.TimelineSpan > 0) != (name == FigTimeline || name == FigPower) || (cfg.Season != nil) != (name == FigYear) || (cfg.SunTrackPoints > 0) != (name == FigSky) {
			t.Errorf("%s: the run is asked for a timeline %v, a season %v, a sun track %v", name, cfg.TimelineSpan > 0, cfg.Season != nil, cfg.SunTrackPoints > 0)
		}
		res, err := sim.Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		figs, err := Figures(s, cfg, res, []string{name})
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		drawn := name != FigGaps || res.Nominal.Estimators[0].NumGaps > 0
		if want := map[bool]int{true: 1, false: 0}[drawn]; len(figs) != want || (want == 1 && figs[0].Name != name) {
			t.Errorf("asked for %s: got %d figures %v", name, len(figs), figs)
		}
		if name == FigTimeline {
			if _, err := Figures(s, cfg, res, []string{FigYear}); err == nil || !strings.Contains(err.Error(), "season") {
				t.Errorf("a year figure from a run that kept no season: error %v", err)
			}
		}
	}
	if _, err := Figures(nil, sim.Config{}, nil, []string{"skymap"}); err == nil {
		t.Error("no scenario: no error")
	}
	if err := Request(s, &sim.Config{}, []string{"skymap"}); err == nil || !strings.Contains(err.Error(), `"skymap"`) {
		t.Errorf("unknown figure name: error %v", err)
	}
}

// Every catalogue figure has a builder, and every builder a catalogue entry.
func TestEveryFigureHasABuilder(t *testing.T) {
	for _, n := range figures.Names() {
		if builders[n] == nil {
			t.Errorf("figure %q has no builder", n)
		}
	}
	if len(builders) != len(figures.Names()) {
		t.Errorf("%d builders for %d catalogue figures", len(builders), len(figures.Names()))
	}
}

// The report notes a figure left out only when it was asked for: a run
// without a valid estimate or a gap has no error and no gap figure.
func TestSkippedNotesOnlyRequestedFigures(t *testing.T) {
	res := &sim.Result{Nominal: &sim.UnitResult{Estimators: []sim.EstimatorStats{{Name: "least-squares"}}}}
	if n := Skipped(res, figures.Names()); len(n) != 2 {
		t.Errorf("all figures asked for: notes %q, want the error and gap notes", n)
	}
	if n := Skipped(res, []string{FigSky, FigTimeline}); len(n) != 0 {
		t.Errorf("neither error nor gaps asked for: notes %q", n)
	}
	if n := Skipped(res, []string{FigGaps}); len(n) != 1 || !strings.Contains(n[0], "gap") {
		t.Errorf("gaps asked for: notes %q", n)
	}
}
