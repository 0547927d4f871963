package scenario

import (
	"context"
	"path/filepath"
	"testing"

	"sunsight/scenario/sim"
)

// Every bundled example builds and runs (a few orbits).
func TestExamplesBuildAndRun(t *testing.T) {
	files, _ := filepath.Glob("../examples/*.yaml")
	if len(files) < 3 {
		t.Fatalf("found %d examples", len(files))
	}
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			s, err := Load(f)
			if err != nil {
				t.Fatal(err)
			}
			cfg, err := s.Config()
			if err != nil {
				t.Fatal(err)
			}
			cfg.Duration = 3 * 3600
			cfg.Units = 1
			res, err := sim.Run(context.Background(), cfg)
			if err != nil {
				t.Fatal(err)
			}
			u := res.Nominal
			t.Logf("sunlit %.3f seen %.3f/%.3f/%.3f eclipses %d", u.SunlitFraction, u.SeenAtLeast[1], u.SeenAtLeast[2], u.SeenAtLeast[3], len(res.Eclipses))
			for _, e := range u.Estimators {
				t.Logf("  %-15s valid %.3f p95 no-alb %.2f alb %.2f", e.Name, e.ValidFraction, e.ErrNoAlbedo.P95Deg, e.ErrAlbedo.P95Deg)
			}
		})
	}
}
