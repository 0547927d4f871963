package review

import (
	"path/filepath"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
)

// The year view follows the scenario's shadow choice: with shadow:
// cylindrical every day's shadow time equals its umbra time and lies
// between the conical umbra and the conical shadow of the same day
// (the cones bracket the cylinder, closed form).
func TestYearTableFollowsShadowChoice(t *testing.T) {
	s, err := scenario.Load(filepath.Join("..", "..", "examples", "nadir-6u-sso.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	s.Shadow = "conical"
	con, err := YearTable(s, 0, 30)
	if err != nil {
		t.Fatal(err)
	}
	s.Shadow = "cylindrical"
	cyl, err := YearTable(s, 0, 30)
	if err != nil {
		t.Fatal(err)
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
