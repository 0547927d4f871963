package study

import (
	"codeberg.org/sunsight/sunsight/scenario"
	"context"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// Every bundled example builds and runs (a few orbits).
func TestExamplesBuildAndRun(t *testing.T) {
	eachBuildsAndRuns(t, "../../examples/*.yaml", 3, func(t *testing.T, res *sim.Result) {
		u := res.Nominal
		t.Logf("sunlit %.3f seen %.3f/%.3f/%.3f eclipses %d", u.SunlitFraction, u.SeenAtLeast[1], u.SeenAtLeast[2], u.SeenAtLeast[3], len(res.Eclipses))
		for _, e := range u.Estimators {
			t.Logf("  %-15s valid %.3f p95 no-alb %.2f alb %.2f", e.Name, e.ValidFraction, e.ErrNoAlbedo.P95Deg, e.ErrAlbedo.P95Deg)
		}
	})
}

// eachBuildsAndRuns loads, builds and runs three hours of one unit of
// every scenario file the pattern matches, of which there must be at least
// least, and hands each result to check.
func eachBuildsAndRuns(t *testing.T, pattern string, least int, check func(*testing.T, *sim.Result)) {
	files, _ := filepath.Glob(pattern)
	if len(files) < least {
		t.Fatalf("%s: found %d files, want at least %d", pattern, len(files), least)
	}
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			s, err := scenario.Load(f)
			if err != nil {
				t.Fatal(err)
			}
			cfg, err := Config(s)
			if err != nil {
				t.Fatal(err)
			}
			cfg.Duration, cfg.Units = 3*3600, 1
			res, err := sim.Run(context.Background(), cfg)
			if err != nil {
				t.Fatal(err)
			}
			check(t, res)
		})
	}
}

// The dawn-dusk example points +X at the sun: with ideal sensors the
// quadrant sensors on +X see it on their boresight and the two-axis estimate
// is exact to its inversion (closed form: the sun stays on the pointing axis).
func TestDawnDuskSunPointingIdeal(t *testing.T) {
	s, err := scenario.Load("../../examples/dawn-dusk-12u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	cfg.Duration = 6 * 3600
	cfg.Units = 1
	cfg.SeriesStride = 1
	res, err := sim.Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	ser := res.Nominal.Series
	for i := range ser.T {
		if ser.Region[i] == illum.Sunlit && (math.Abs(ser.SunBodyEl[i]) > 1e-6 || math.Abs(ser.SunBodyAz[i]) > 1e-6) {
			t.Fatalf("sample %d: sun at az %.6f° el %.6f° in body axes, want +X (0°, 0°)", i, ser.SunBodyAz[i], ser.SunBodyEl[i])
		}
	}
	for _, e := range res.Nominal.Estimators {
		if e.Name == "two-axis" && !(e.ErrNoAlbedo.P95Deg < 0.05) {
			t.Errorf("two-axis p95 without albedo %.4f°, want ≈ 0", e.ErrNoAlbedo.P95Deg)
		}
	}
}

// A sun-pointing law can align its second axis to the orbit normal, nadir
// or a fixed inertial direction; the aligned axis then lies as close to that
// reference as the sun line allows (closed form: it is the reference's
// component perpendicular to the sun, normalised).
func TestSunLawAlignReferences(t *testing.T) {
	base := "name: t\nepoch: \"2026-03-20T00:00:00Z\"\nduration: 2h\nstep: 60s\norbit: {altitude_km: 550, ltan: \"10:30\"}\n" +
		"body:\n  sensors:\n    - {name: a, kind: cosine, face: \"+Z\"}\n"
	for _, c := range []struct{ law, bad string }{
		{"attitude: {law: sun, align_to: nadir}\n", ""},
		{"attitude: {law: sun, align_to: inertial, align_inertial: [0, 0, 2]}\n", ""},
		{"attitude: {law: sun, rate_deg_s: 2}\n", ""},
		{"attitude: {law: sun, align_to: inertial}\n", "attitude.align_inertial"},
		{"attitude: {law: sun, align_to: moon}\n", "attitude.align_to"},
		{"attitude: {law: nadir, align_to: nadir}\n", "attitude.align_to"},
	} {
		s, err := scenario.Parse([]byte(base+c.law), ".")
		if c.bad != "" {
			if err == nil || !strings.Contains(err.Error(), c.bad) {
				t.Errorf("%q: error %v, want one naming %s", c.law, err, c.bad)
			}
			continue
		}
		if err != nil {
			t.Fatalf("%q: %v", c.law, err)
		}
		cfg, err := Config(s)
		if err != nil {
			t.Fatal(err)
		}
		if _, err := sim.Run(context.Background(), cfg); err != nil {
			t.Fatal(err)
		}
	}
}

// Every benchmark scenario of bench/ loads, builds and runs a few orbits,
// so that bench/run.sh does not fail half way on a scenario that went stale.
func TestBenchScenariosBuildAndRun(t *testing.T) {
	eachBuildsAndRuns(t, "../../bench/*.yaml", 10, func(*testing.T, *sim.Result) {})
}
