package review

import (
	"math"
	"strings"
	"testing"
	"time"

	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// The timeline caption states the run's own largest error (the headline's
// "Largest error", every step of unit 0), never the largest of the thinned
// samples the figure draws: the mission timeline of mission-6u over 12 h at
// 10 s steps draws one step in 3, and its drawn peak sits below the run's.
// The figures compared are the run's own (closed: the same statistics the
// headline row prints).
func TestTimelineCaptionStatesTheRunsPeak(t *testing.T) {
	s, cfg, res := shortRun(t, "mission-6u.yaml", 12*time.Hour, 1)
	if cfg.TimelineStride < 2 {
		t.Fatalf("stride %d: the case must thin the series", cfg.TimelineStride)
	}
	figs, err := Figures(s, cfg, res, []string{FigTimeline})
	if err != nil {
		t.Fatal(err)
	}
	tells := figs[0].Tells
	e := &res.Nominal.Estimators[0]
	run := num(e.ErrAlbedo.MaxDeg, 2) + "°"
	if !strings.Contains(tells, "error peaks at "+run) {
		t.Errorf("caption %q does not state the run's largest error %s", tells, run)
	}
	if corr := num(e.Corrected.Err.MaxDeg, 2) + "°"; !strings.Contains(tells, corr+" after the on-board albedo correction") {
		t.Errorf("caption %q does not state the run's largest corrected error %s", tells, corr)
	}
	tl, _ := timeline(cfg, res)
	drawn := peakOf(tl.ErrAlbedoDeg)
	if !(drawn < e.ErrAlbedo.MaxDeg) {
		t.Fatalf("drawn peak %.3f°, run %.3f°: the case no longer shows the thinning", drawn, e.ErrAlbedo.MaxDeg)
	}
	for _, p := range []int{1, 2} {
		if d := num(drawn, p) + "°"; strings.Contains(tells, d) && !strings.Contains(tells, "drawn") {
			t.Errorf("caption %q states the drawn peak %s as if it were the run's", tells, d)
		}
	}
	if !strings.Contains(tells, "one step in 3") {
		t.Errorf("caption %q does not say the figure draws one step in 3", tells)
	}
}

// In the three-orbit timeline the caption's "in these orbits" figure is
// the exact peak of those orbits when every step is drawn (nadir-6u-sso
// at its own step), and the run's largest error is stated beside it.
func TestThreeOrbitCaptionPeak(t *testing.T) {
	s, cfg, res := shortRun(t, "nadir-6u-sso.yaml", 12*time.Hour, 1)
	if cfg.TimelineStride != 1 {
		t.Fatalf("stride %d, want every step drawn", cfg.TimelineStride)
	}
	figs, err := Figures(s, cfg, res, []string{FigTimeline})
	if err != nil {
		t.Fatal(err)
	}
	tells := figs[0].Tells
	e := &res.Nominal.Estimators[0]
	mx := e.ErrAlbedo.MaxDeg
	if math.IsNaN(mx) || e.ErrAlbedo.N == 0 {
		mx = e.ErrNoAlbedo.MaxDeg
	}
	if run := num(mx, 2) + "°"; !strings.Contains(tells, "error peaks at "+run) {
		t.Errorf("caption %q does not state the run's largest error %s", tells, run)
	}
	tl, _ := timeline(cfg, res)
	orbits := peakOf(tl.ErrAlbedoDeg)
	if math.IsNaN(orbits) {
		orbits = peakOf(tl.ErrNoAlbedoDeg)
	}
	if !(orbits <= mx) {
		t.Errorf("peak of the orbits shown %.3f° above the run's %.3f°", orbits, mx)
	}
	if o := "in these orbits it peaks at " + num(orbits, 2) + "°"; !strings.Contains(tells, o) {
		t.Errorf("caption %q lacks %q", tells, o)
	}
}

// A thinned three-orbit figure (a short step) says its orbit peak is of the
// drawn samples, and still states the run's largest error first.
func TestThinnedOrbitCaptionSaysDrawn(t *testing.T) {
	tl := plotsTimeline([]float64{1, 4, 2})
	e := statsWithMax(9.5)
	tells := timelineTells(tl, e, 3, false, figureTargets{})
	for _, w := range []string{"error peaks at 9.50°", "in these orbits the largest drawn sample (one step in 3) is 4.00°"} {
		if !strings.Contains(tells, w) {
			t.Errorf("caption %q lacks %q", tells, w)
		}
	}
}

func plotsTimeline(errNo []float64) plots.Timeline {
	tl := plots.Timeline{ErrNoAlbedoDeg: errNo, ValidShare: 1}
	for i := range errNo {
		tl.T = append(tl.T, float64(i))
	}
	return tl
}

func statsWithMax(mx float64) *sim.EstimatorStats {
	return &sim.EstimatorStats{ErrNoAlbedo: sim.ErrorStats{N: 3, MaxDeg: mx}, ErrAlbedo: sim.ErrorStats{MaxDeg: math.NaN()}}
}

// The error figure marks the run's own p95 of each series (the caption's
// figure), not the p95 of the quantiles it draws.
func TestErrorFigureMarksTheRunsP95(t *testing.T) {
	_, _, res := shortRun(t, "nadir-6u-sso.yaml", 4*time.Hour, 1)
	d, ok := errorDist(res)
	if !ok || len(d.Series) != 2 {
		t.Fatalf("%d series", len(d.Series))
	}
	e := &res.Nominal.Estimators[0]
	for k, want := range []float64{e.ErrNoAlbedo.P95Deg, e.ErrAlbedo.P95Deg} {
		if p := d.Series[k].P95Deg; p == nil || *p != want {
			t.Errorf("%s: p95 %v, want the run's %g", d.Series[k].Label, p, want)
		}
	}
}

// Eclipses too many to shade are said to be unshaded, not described as
// shaded.
func TestCaptionSaysEclipsesUnshaded(t *testing.T) {
	tl := plotsTimeline([]float64{1, 2, 3})
	for i := range 200 {
		tl.Umbra = append(tl.Umbra, plots.Interval{Start: float64(i) / 100, End: float64(i)/100 + 0.001})
	}
	// The shading sentence is added by the figure builder.
	if tl.ShadesEclipses() {
		t.Fatal("200 spans shaded")
	}
	if s := shadingText(tl); !strings.Contains(s, "not shaded") {
		t.Errorf("caption %q", s)
	}
}
