package study

import (
	"context"
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit/attitude"
	"codeberg.org/sunsight/sunsight/orbit/timeline"
	"codeberg.org/sunsight/sunsight/scenario"
)

// timelineScenario is an invented 6U from tumbling deployment to nadir
// science.
const timelineScenario = `
epoch: "2026-06-01T00:00:00Z"
duration: 8h
step: 10s
orbit: {altitude_km: 525, ltan: "13:30"}
timeline:
  slew_rate_deg_s: 1.5
  slew_accel_deg_s2: 0.05
  phases:
    - {name: deployment, attitude: {law: tumble, min_rate_deg_s: 6, max_rate_deg_s: 8}, until: {elapsed: 30m}}
    - {name: detumble, attitude: {law: detumble, time_constant: 40m}, until: {rate_below_deg_s: 0.3}}
    - {name: acquisition, attitude: {law: sun, point_axis: "-Z"}, slew: true, until: {sun_seen_for: 5m}}
    - {name: safe, attitude: {law: sun, point_axis: "-Z"}, until: {eclipse: exit}}
    - {name: science, attitude: {law: nadir}, slew: true, during_eclipse: hold}
body:
  form_factor: 6U
  sensors:
    - {name: px, kind: cosine, face: "+X", errors: {dark_offset_1sigma: 0.005, noise_1sigma: 0.003}}
    - {name: mx, kind: cosine, face: "-X", errors: {dark_offset_1sigma: 0.005, noise_1sigma: 0.003}}
    - {name: py, kind: cosine, face: "+Y", errors: {dark_offset_1sigma: 0.005, noise_1sigma: 0.003}}
    - {name: my, kind: cosine, face: "-Y", errors: {dark_offset_1sigma: 0.005, noise_1sigma: 0.003}}
    - {name: pz, kind: cosine, face: "+Z", errors: {dark_offset_1sigma: 0.005, noise_1sigma: 0.003}}
    - {name: mz, kind: cosine, face: "-Z", errors: {dark_offset_1sigma: 0.005, noise_1sigma: 0.003}}
albedo: {model: uniform, value: 0.3}
`

// The scenario's timeline: the detumble continues the drawn tumble and
// ends at the closed-form time, each slew takes the bang–coast–bang time of
// its angle, and the spans' samples add up to the run's (phases tile the
// run exactly).
func TestTimelineScenario(t *testing.T) {
	s, err := scenario.Parse([]byte(timelineScenario), ".")
	if err != nil {
		t.Fatal(err)
	}
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	tl := TimelineOf(cfg)
	if tl == nil || tl.Reached != 5 {
		t.Fatalf("timeline %+v: want 5 phases reached", tl)
	}
	// Detumble from the tumble the seed draws (TumbleDraws, unit 0):
	// 30 min + τ·ln(ω₀/ω_b) (closed form).
	tum := attitude.DrawTumble(uint64(s.Seed), 6*math.Pi/180, 8*math.Pi/180)
	want := 1800 + 2400*math.Log(r3.Norm(tum.Rate)/(0.3*math.Pi/180))
	if d := tl.Spans[1]; d.Name != "detumble" || math.Abs(d.End-want) > 1e-6 {
		t.Errorf("detumble ends at %.6f s, want %.6f", d.End, want)
	}
	lim := timeline.Limits{RateRadS: 1.5 * math.Pi / 180, AccelRadS2: 0.05 * math.Pi / 180}
	slews := 0
	for _, sp := range tl.Spans {
		if sp.Slew {
			slews++
			if got, want := sp.End-sp.Start, lim.Duration(sp.SlewAngleRad); math.Abs(got-want) > 1e-9 {
				t.Errorf("%s: %g s, want the bang–coast–bang %g s", sp.Name, got, want)
			}
		}
	}
	if slews != 2 {
		t.Errorf("%d slews, want 2", slews)
	}
	ph, err := RunPhases(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for i, p := range ph.Phases {
		n += p.Samples
		if i > 0 && p.Span.Start != ph.Phases[i-1].Span.End {
			t.Errorf("span %d starts at %g, previous ends at %g", i, p.Span.Start, ph.Phases[i-1].Span.End)
		}
	}
	if n != cfg.Steps() {
		t.Errorf("spans hold %d samples, the run %d", n, cfg.Steps())
	}
	if last := ph.Phases[len(ph.Phases)-1]; last.Span.End != cfg.Duration || last.Result == nil {
		t.Errorf("last span %+v", last.Span)
	}
	// Sun pointing puts the -Z sensor alone on the sun: seen by ≥ 2 never
	// (cosine sensors of 90° half angle see it at exactly 90° no more).
	for _, p := range ph.Phases {
		if p.Span.Name == "safe" {
			if h := p.Headline(); h.Seen1 != 1 || h.Seen2 != 0 {
				t.Errorf("safe phase seen ≥1 %g, ≥2 %g; want 1 and 0", h.Seen1, h.Seen2)
			}
		}
	}
}
