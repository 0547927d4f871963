package review

import (
	"context"
	"path/filepath"
	"testing"
	"time"

	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// The year view (the run's season table) follows the scenario's shadow choice: with shadow:
// cylindrical every day's shadow time equals its umbra time and lies
// between the conical umbra and the conical shadow of the same day
// (the cones bracket the cylinder, closed form).
func TestYearViewFollowsShadowChoice(t *testing.T) {
	s, err := scenario.Load(filepath.Join("..", "..", "examples", "nadir-6u-sso.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	s.Duration = scenario.Span(10 * time.Minute)
	season := func(shadow string) []illum.DayRow {
		s.Shadow = shadow
		cfg, err := study.Config(s)
		if err != nil {
			t.Fatal(err)
		}
		if err := Request(s, &cfg, []string{FigYear}); err != nil {
			t.Fatal(err)
		}
		cfg.Season.Days = 30
		res, err := sim.Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		return res.Season
	}
	con, cyl := season("conical"), season("cylindrical")
	if len(con) != 30 || len(cyl) != 30 {
		t.Fatalf("season tables of %d and %d days, want 30", len(con), len(cyl))
	}
	for d := range cyl {
		c, k := cyl[d], con[d]
		if c.EclipseFree {
			continue
		}
		if c.UmbraS != c.ShadowS {
			t.Errorf("day %d: cylindrical umbra %.2f s, shadow %.2f s", d, c.UmbraS, c.ShadowS)
		}
		if !(k.UmbraS < c.ShadowS && c.ShadowS < k.ShadowS) {
			t.Errorf("day %d: cylinder %.2f s outside conical umbra %.2f s … shadow %.2f s", d, c.ShadowS, k.UmbraS, k.ShadowS)
		}
	}
}
