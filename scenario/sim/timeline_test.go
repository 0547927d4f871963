package sim

import (
	"context"
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/power"
	"codeberg.org/sunsight/sunsight/orbit"
)

// The timeline series is the head of the full series: the same samples, at
// its own stride, up to its span, across the pieces a long run is cut into
// (definition).
func TestTimelineIsTheSeriesHead(t *testing.T) {
	cfg := referenceCase(t, 0.5, false)
	cfg.Step = 1
	cfg.SeriesStride = 1
	cfg.TimelineSpan, cfg.TimelineStride = 40000, 7
	cfg.Workers = 2
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	if res.Steps <= chunkSteps || cfg.TimelineSpan <= chunkSteps*cfg.Step {
		t.Fatalf("%d steps, span %g s: the timeline does not cross a piece boundary", res.Steps, cfg.TimelineSpan)
	}
	full, tl := res.Nominal.Series, res.Nominal.Timeline
	if tl == nil {
		t.Fatal("no timeline kept")
	}
	want := 0
	for k, tk := range full.T {
		if k%7 != 0 || tk > cfg.TimelineSpan {
			continue
		}
		if want >= len(tl.T) {
			t.Fatalf("timeline ends at sample %d (t = %g s); the series goes on to t = %g s", want, tl.T[len(tl.T)-1], tk)
		}
		row := func(s *Series, i int) string {
			return fmt.Sprint(s.T[i], s.Region[i], s.Lit[i], s.Seen[i], s.Valid[i], s.ErrNoDeg[i], s.ErrAlbDeg[i], s.ErrCorrDeg[i], s.BetaDeg[i],
				s.SunBodyAz[i], s.SunBodyEl[i], s.SignalsAt(i))
		}
		if a, b := row(tl, want), row(full, k); a != b {
			t.Fatalf("timeline sample %d:\n%s\nseries step %d:\n%s", want, a, k, b)
		}
		want++
	}
	if want != len(tl.T) || want != 40000/7+1 {
		t.Errorf("timeline has %d samples, series gives %d, want %d", len(tl.T), want, 40000/7+1)
	}
}

// A run without a timeline span keeps none.
func TestNoTimelineUnlessAsked(t *testing.T) {
	cfg := referenceCase(t, 0.1, false)
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	if res.Nominal.Timeline != nil || res.Season != nil {
		t.Errorf("timeline %v, season of %d rows without asking", res.Nominal.Timeline != nil, len(res.Season))
	}
	cfg.TimelineSpan = 600
	if _, err := Run(context.Background(), cfg); err == nil {
		t.Error("timeline span without a stride accepted")
	}
	// A lean copy (the extra runs of a study) keeps nothing of it.
	cfg.TimelineStride, cfg.SeriesStride, cfg.SunTrackPoints = 1, 1, 100
	cfg.Season = &SeasonRequest{NewPropagator: cfg.NewPropagator, Days: 1, PeriodS: 5700}
	cfg.Progress = func(float64) {}
	if l := cfg.Lean(); l.TimelineSpan != 0 || l.TimelineStride != 0 || l.SeriesStride != 0 || l.SunTrackPoints != 0 || l.Season != nil || l.Progress != nil {
		t.Errorf("lean copy keeps %+v", l)
	}
}

// The season table follows the run's shadow model: on a circular orbit
// under a fixed sun every day's cylindrical shadow lasts the closed form
// (cylinderShadowS) to 0.5 s, with no penumbra, and lies between the
// conical umbra and shadow of the same day (the cones bracket the
// cylinder, closed form); the beta angle is the one the orbit was built
// with. Days before the epoch are allowed.
func TestSeasonFollowsTheRunShadowModel(t *testing.T) {
	const alt, βdeg = 550.0, 20.0
	a := orbit.RadiusEarthKm + alt
	rows := map[bool][]float64{}
	for _, cyl := range []bool{true, false} {
		cfg := betaCase(t, alt, βdeg, cyl)
		cfg.Duration = 600
		el := orbit.Elements{SemiMajorAxisKm: a, Inclination: βdeg * math.Pi / 180, RAAN: math.Pi / 2}
		cfg.Season = &SeasonRequest{NewPropagator: func() orbit.Propagator { return orbit.NewTwoBody(el) },
			StartS: -86400, Days: 3, PeriodS: orbit.Period(a)}
		res, err := Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		if len(res.Season) != 3 || res.Season[0].T != -86400 {
			t.Fatalf("season of %d rows from %v", len(res.Season), res.Season)
		}
		for _, r := range res.Season {
			if math.Abs(r.Beta*180/math.Pi-βdeg) > 1e-6 {
				t.Errorf("day %d: beta %.6f°, want %g°", r.Day, r.Beta*180/math.Pi, βdeg)
			}
			rows[cyl] = append(rows[cyl], r.UmbraS, r.ShadowS)
		}
	}
	want := cylinderShadowS(a, orbit.Period(a), βdeg*math.Pi/180)
	for d := range 3 {
		cu, cs := rows[true][2*d], rows[true][2*d+1]
		ku, ks := rows[false][2*d], rows[false][2*d+1]
		if math.Abs(cs-want) > 0.5 || cu != cs {
			t.Errorf("day %d: cylindrical umbra %.2f s, shadow %.2f s, want both %.2f s", d, cu, cs, want)
		}
		if !(ku < cs && cs < ks) {
			t.Errorf("day %d: cylinder %.2f s outside the conical umbra %.2f s … shadow %.2f s", d, cs, ku, ks)
		}
	}
}

// With panels the short series carries the array power at its own samples:
// the same values as the full power series there (definition).
func TestPowerTimelineOnTheTimelineSamples(t *testing.T) {
	cfg := referenceCase(t, 0.2, false)
	cfg.SeriesStride = 1
	cfg.TimelineSpan, cfg.TimelineStride = 5000, 3
	arr, err := power.NewArray(power.Panel{Name: "zenith", Normal: r3.Vec{Z: -1}, AreaM2: 0.08, Efficiency: 0.3, PackingFactor: 0.9})
	if err != nil {
		t.Fatal(err)
	}
	cfg.Panels = arr
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	tl, p, full := res.Nominal.Timeline, res.PowerTimeline, res.PowerSeries
	if tl == nil || p == nil || len(p.T) != len(tl.T) || len(p.W) != len(tl.T) {
		t.Fatalf("short power series %v against a timeline of %v", p != nil, tl != nil)
	}
	lit := 0
	for i := range p.T {
		k := 3 * i
		if p.T[i] != tl.T[i] || p.T[i] != full.T[k] || p.W[i] != full.W[k] {
			t.Fatalf("sample %d: %g s %g W; timeline %g s; series %g s %g W", i, p.T[i], p.W[i], tl.T[i], full.T[k], full.W[k])
		}
		if p.W[i] > 0 {
			lit++
		}
	}
	if lit == 0 {
		t.Error("no power in the first 5000 s: the check saw nothing")
	}
}
