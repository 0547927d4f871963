package study

import (
	"context"
	"fmt"
	"math"
	"os"
	"slices"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// faces are the six cube faces of the single-failure layouts.
var faces = []string{"+X", "-X", "+Y", "-Y", "+Z", "-Z"}

// singleFailureScenario is a nadir-pointing cube of cosine sensors, one per
// face, plus a twin (same mount, no errors) of each face in twinned; no
// albedo, so every reading is exactly the cosine law and a duplicate sensor
// adds no information.
func singleFailureScenario(t *testing.T, twinned func(face string) bool, extra string) *scenario.Scenario {
	return singleFailureScenarioIn(t, "{law: nadir}", twinned, extra)
}

func singleFailureScenarioIn(t *testing.T, attitude string, twinned func(face string) bool, extra string) *scenario.Scenario {
	t.Helper()
	var b strings.Builder
	b.WriteString("duration: 6h\nstep: 30s\norbit: {altitude_km: 550, ltan: \"10:30\"}\nattitude: " + attitude + "\n")
	b.WriteString("estimators: [least-squares]\nalbedo: {model: none}\nbody:\n  sensors:\n")
	for _, f := range faces {
		b.WriteString("    - {name: \"css" + f + "\", kind: cosine, face: \"" + f + "\"}\n")
		if twinned(f) {
			b.WriteString("    - {name: \"twin" + f + "\", kind: cosine, face: \"" + f + "\"}\n")
		}
	}
	b.WriteString(extra)
	s, err := scenario.Parse([]byte(b.String()), "")
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func runSingleFailure(t *testing.T, s *scenario.Scenario) (sim.Headline, SingleFailure, Assessment) {
	t.Helper()
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	res, err := sim.Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	sf, err := RunSingleFailure(context.Background(), s, cfg)
	if err != nil {
		t.Fatal(err)
	}
	return res.Headline(), sf, Assess(s, cfg, res).WithSingleFailure(s, sf)
}

// Check (definition of redundancy): with a twin of every sensor on the same
// mount and no errors, failing any one sensor leaves the same set of
// directions measured by identical readings, so every failed layout gives
// exactly the unfailed valid share and longest gap, and the unfailed p95
// error to 1e-9°.
func TestSingleFailureOfTwinnedLayoutChangesNothing(t *testing.T) {
	s := singleFailureScenario(t, func(string) bool { return true }, "targets: {n_minus_1: {}}\n")
	h, sf, _ := runSingleFailure(t, s)
	if len(sf.Rows) != 12 {
		t.Fatalf("%d rows, want one per sensor (12)", len(sf.Rows))
	}
	t.Logf("unfailed: valid %.6f, gap %.0f s, p95 %.3g°", h.ValidFraction, h.LongestGapS, h.P95NoAlbedoDeg)
	if !(h.ValidFraction > 0.5) {
		t.Fatalf("unfailed valid share %.3f: the check needs a layout that works", h.ValidFraction)
	}
	for _, r := range sf.Rows {
		g := r.Headline
		if g.ValidFraction != h.ValidFraction || g.LongestGapS != h.LongestGapS || math.Abs(g.P95NoAlbedoDeg-h.P95NoAlbedoDeg) > 1e-9 {
			t.Errorf("%s failed: valid %.6f gap %.0f s p95 %.3g°, unfailed %.6f %.0f s %.3g°", r.Sensor,
				g.ValidFraction, g.LongestGapS, g.P95NoAlbedoDeg, h.ValidFraction, h.LongestGapS, h.P95NoAlbedoDeg)
		}
	}
}

// Check (definition of a single point of failure): when only the +X face
// lacks a twin, failing it leaves the directions where +X is lit with two
// lit faces, too few for the least-squares fit; it is the worst failure, with
// a lower valid share than the unfailed run, and every other failure changes
// nothing. Its n_minus_1 target fails and names it, its verdict agrees.
func TestSingleFailureNamesTheSensorWithoutTwin(t *testing.T) {
	s := singleFailureScenario(t, func(f string) bool { return f != "+X" }, "targets: {n_minus_1: {min_valid_fraction: 0.999, max_gap: 1h}}\n")
	h, sf, a := runSingleFailure(t, s)
	w := sf.Rows[sf.Worst]
	t.Logf("unfailed valid %.4f; worst %s failed: valid %.4f, gap %.0f s", h.ValidFraction, w.Sensor, w.Headline.ValidFraction, w.Headline.LongestGapS)
	if w.Sensor != "css+X" {
		t.Errorf("worst failure %s, want css+X", w.Sensor)
	}
	if !(w.Headline.ValidFraction < h.ValidFraction-0.01) {
		t.Errorf("css+X failed: valid %.4f, want well below the unfailed %.4f", w.Headline.ValidFraction, h.ValidFraction)
	}
	for i, r := range sf.Rows {
		if i != sf.Worst && r.Headline.ValidFraction != h.ValidFraction {
			t.Errorf("%s failed: valid %.6f, want the unfailed %.6f (its twin remains)", r.Sensor, r.Headline.ValidFraction, h.ValidFraction)
		}
	}
	c, ok := FindTarget(a.Targets, TargetNMinus1Valid)
	if !ok || c.Pass || c.Got != w.Headline.ValidFraction || !strings.Contains(c.Label, "css+X") {
		t.Errorf("n_minus_1 valid target %+v (found %v): want failed on %.4f naming css+X", c, ok, w.Headline.ValidFraction)
	}
	if g, ok := FindTarget(a.Targets, TargetNMinus1Gap); !ok || g.Got != w.Headline.LongestGapS {
		t.Errorf("n_minus_1 gap target %+v (found %v): want the worst gap %.0f s", g, ok, w.Headline.LongestGapS)
	}
	if a.Verdict.Met() {
		t.Errorf("verdict %q: want failed (the n_minus_1 valid target is missed)", a.Verdict.Text())
	}
}

// The trace replay (shared geometry) gives the numbers of a full run of the
// reduced sensor list, with realistic errors on (same seed, same draws of
// the remaining sensors).
func TestSingleFailureTraceMatchesFullRun(t *testing.T) {
	s := singleFailureScenario(t, func(string) bool { return false }, "targets: {n_minus_1: {}}\n")
	for i := range s.Body.Sensors {
		s.Body.Sensors[i].Errors = scenario.SensorErrors{DarkOffset1Sigma: 0.005, Gain1Sigma: 0.02, Noise1Sigma: 0.003, MisalignmentRad1Sigma: 0.01}
	}
	s.Albedo = scenario.Albedo{Model: scenario.AlbedoUniform, Value: 0.3, Cells: 200}
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	cfg.Units = 2
	sf, err := RunSingleFailure(context.Background(), s, cfg)
	if err != nil {
		t.Fatal(err)
	}
	for _, i := range []int{0, 4} {
		res, err := runWithout(context.Background(), s, cfg, i)
		if err != nil {
			t.Fatal(err)
		}
		got, want := sf.Rows[i].Headline, res.Headline()
		t.Logf("%s failed: trace valid %.6f p95 %.4f°, full run %.6f %.4f°", sf.Rows[i].Sensor, got.ValidFraction, got.P95AlbedoDeg, want.ValidFraction, want.P95AlbedoDeg)
		if got.ValidFraction != want.ValidFraction || got.LongestGapS != want.LongestGapS || math.Abs(got.P95AlbedoDeg-want.P95AlbedoDeg) > 1e-9 {
			t.Errorf("%s failed: trace %+v, full run %+v", sf.Rows[i].Sensor, got, want)
		}
	}
}

// A single-failure study the layout cannot have, or a target out of range,
// is refused naming the field.
func TestSingleFailureBadInputRefused(t *testing.T) {
	base := "orbit: {altitude_km: 550, ltan: \"10:30\"}\nbody:\n  sensors:\n    - {name: a, kind: cosine, face: \"+X\"}\n"
	for _, c := range []struct{ text, field string }{
		{base + "targets: {n_minus_1: {}}\n", "targets.n_minus_1"},
		{base + "    - {name: b, kind: cosine, face: \"-X\"}\ntargets: {n_minus_1: {min_valid_fraction: 1.5}}\n", "targets.n_minus_1.min_valid_fraction"},
		{base + "    - {name: b, kind: cosine, face: \"-X\"}\ntargets: {n_minus_1: {max_gap: -5m}}\n", "targets.n_minus_1.max_gap"},
		{base + "    - {name: b, kind: cosine, face: \"-X\"}\ntargets: {n_minus_1: {max_error: 3}}\n", "max_error"},
		{base + "    - {name: b, kind: cosine, face: \"-X\"}\ntargets: {n_minus_1: {also_pairs: true}}\n", "targets.n_minus_1.also_pairs"},
	} {
		_, err := scenario.Parse([]byte(c.text), "")
		if err == nil || !strings.Contains(err.Error(), c.field) {
			t.Errorf("%q: error %v, want one naming %s", c.text, err, c.field)
		}
	}
}

// A tumble draws its attitude per unit, so no trace is recorded: each failed
// layout is a full run, and the twinned layout still gives the unfailed
// numbers with any one sensor failed (definition of redundancy).
func TestSingleFailureOfTumbleRunsInFull(t *testing.T) {
	s := singleFailureScenarioIn(t, "{law: tumble, min_rate_deg_s: 1, max_rate_deg_s: 3}", func(string) bool { return true }, "targets: {n_minus_1: {}}\n")
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	if cfg.LawForUnit == nil || SingleFailureTraceBytes(&cfg) != 0 {
		t.Fatalf("a tumble: want a law per unit and no trace (trace bytes %d)", SingleFailureTraceBytes(&cfg))
	}
	h, sf, _ := runSingleFailure(t, s)
	t.Logf("tumble unfailed: valid %.4f gap %.0f s", h.ValidFraction, h.LongestGapS)
	for _, r := range sf.Rows {
		if r.Headline.ValidFraction != h.ValidFraction || r.Headline.LongestGapS != h.LongestGapS {
			t.Errorf("%s failed: valid %.6f gap %.0f s, unfailed %.6f %.0f s", r.Sensor, r.Headline.ValidFraction, r.Headline.LongestGapS, h.ValidFraction, h.LongestGapS)
		}
	}
}

// Check (definition of redundancy, pairs): in the twinned layout every pair
// but a sensor and its own twin leaves each face measured, so it gives the
// unfailed valid share; a face and its twin together never give more, and
// the worst pair is a face and its twin, with a lower valid share.
func TestPairFailureOfTwinnedLayoutNamesATwinPair(t *testing.T) {
	s := singleFailureScenario(t, func(string) bool { return true }, "targets: {n_minus_1: {also_pairs: true}}\n")
	h, sf, _ := runSingleFailure(t, s)
	if len(sf.Pairs) != 66 || sf.WorstPair < 0 {
		t.Fatalf("%d pairs (want 66 = 12·11/2), worst %d", len(sf.Pairs), sf.WorstPair)
	}
	w := sf.Pairs[sf.WorstPair]
	t.Logf("unfailed valid %.4f; worst pair %s: valid %.4f", h.ValidFraction, w.Sensor, w.Headline.ValidFraction)
	for _, p := range sf.Pairs {
		twins := strings.TrimPrefix(p.Failed[0], "css") == strings.TrimPrefix(p.Failed[1], "twin")
		switch {
		case !twins && p.Headline.ValidFraction != h.ValidFraction:
			t.Errorf("%s failed: valid %.6f, want the unfailed %.6f", p.Sensor, p.Headline.ValidFraction, h.ValidFraction)
		case twins && p.Headline.ValidFraction > h.ValidFraction:
			t.Errorf("%s failed (a face and its twin): valid %.6f, above the unfailed %.6f", p.Sensor, p.Headline.ValidFraction, h.ValidFraction)
		}
	}
	if !(w.Headline.ValidFraction < h.ValidFraction) {
		t.Errorf("worst pair %s: valid %.6f, want below the unfailed %.6f", w.Sensor, w.Headline.ValidFraction, h.ValidFraction)
	}
	if !strings.HasPrefix(w.Failed[0], "css") || strings.TrimPrefix(w.Failed[0], "css") != strings.TrimPrefix(w.Failed[1], "twin") {
		t.Errorf("worst pair %s: want a face and its twin", w.Sensor)
	}
}

// A timeline phase that ends when the sun has been seen by some sensors
// (until: sun_seen) is planned on the sensors that fly: with one failed,
// the phase can end later. The single-failure study must then re-plan the
// timeline for each failed layout instead of replaying the geometry
// planned with every sensor. The bundled mission example has such a phase
// (sun acquisition: 2 sensors for 5 min) and realistic sensor errors; each
// row must equal a run of the scenario with that sensor removed from
// body.sensors, and for at least one sensor that run must differ from the
// replay of the all-sensor geometry (else this test would not test it).
func TestSingleFailureReplansSunSeenTimeline(t *testing.T) {
	text, err := os.ReadFile("../../examples/mission-6u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	s, err := scenario.Parse(text, "mission-6u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	s.MonteCarlo.Units = 1
	// With -Z at the sun exactly three sensors see it (css-mz and the two
	// tilted on -Z; the side faces are edge-on): asking for three makes the
	// acquisition depend on each of them.
	acq := slices.IndexFunc(s.Timeline.Phases, func(p scenario.Phase) bool { return p.Until.Kind == scenario.UntilSunSeen })
	if acq < 0 {
		t.Fatal("the example has no phase ending on the sun seen")
	}
	s.Timeline.Phases[acq].Until.SeenSensors = 3
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	cfg.Workers = 2
	ctx := context.Background()
	sf, err := RunSingleFailure(ctx, s, cfg)
	if err != nil {
		t.Fatal(err)
	}
	tr, err := sim.NewTrace(ctx, cfg)
	if err != nil {
		t.Fatal(err)
	}
	differs := 0
	for i := range s.Body.Sensors {
		reduced := *s
		reduced.Body.Sensors = slices.Delete(slices.Clone(s.Body.Sensors), i, i+1)
		rc, err := Config(&reduced)
		if err != nil {
			t.Fatal(err)
		}
		rc.Units, rc.Workers, rc.Seed = cfg.Units, cfg.Workers, cfg.Seed
		res, err := sim.Run(ctx, rc.Lean())
		if err != nil {
			t.Fatal(err)
		}
		// The replays score the point estimators only (the gyro filter is
		// the full run's): compare without the filter's figures.
		pointOnly := func(h sim.Headline) string {
			h.FilterValidFraction, h.FilterP95ShadowDeg = 0, 0
			return fmt.Sprint(h)
		}
		want := pointOnly(res.Headline())
		if got := pointOnly(sf.Rows[i].Headline); got != want {
			t.Errorf("%s failed: study row\n%s\nrun without it\n%s", s.Body.Sensors[i].Name, got, want)
		}
		var subset []int
		for j := range s.Body.Sensors {
			if j != i {
				subset = append(subset, j)
			}
		}
		rep, err := tr.Run(ctx, subset, cfg.Estimators, cfg.Units)
		if err != nil {
			t.Fatal(err)
		}
		if pointOnly(rep.Headline()) != want {
			differs++
			t.Logf("%s failed: replanned valid %.4f gap %.0f s, replayed all-sensor timeline valid %.4f gap %.0f s", s.Body.Sensors[i].Name,
				res.Headline().ValidFraction, res.Headline().LongestGapS, rep.Headline().ValidFraction, rep.Headline().LongestGapS)
		}
	}
	if differs == 0 {
		t.Fatal("no failure changed the timeline: the case does not exercise the re-planning")
	}
}
