package study

import (
	"context"
	"math"
	"os"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// The power target is judged by the one judge: met above the limit, failed
// below it and failed (shown as Missing) when no power was computed.
func TestPowerTargetJudged(t *testing.T) {
	s := &scenario.Scenario{}
	s.Targets.MinOrbitAvgPowerW = 20
	for _, c := range []struct {
		got  float64
		pass bool
	}{{25, true}, {19.99, false}, {math.NaN(), false}} {
		ch, ok := FindTarget(CheckTargets(s, sim.Headline{OrbitAvgPowerW: c.got}, sky.Result{}), TargetPower)
		if !ok || ch.Pass != c.pass || ch.Unit != UnitWatts || ch.Op != OpAtLeast {
			t.Errorf("power %g W: %+v, want pass %v", c.got, ch, c.pass)
		}
		if math.IsNaN(c.got) && ch.Value != Missing {
			t.Errorf("no power: value %q, want %q", ch.Value, Missing)
		}
	}
}

func panelScenario(t *testing.T, extra string) (*scenario.Scenario, error) {
	t.Helper()
	data, err := os.ReadFile("../../examples/power-6u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	return scenario.Parse([]byte(strings.Replace(string(data), "  panels:", "  panels:"+extra, 1)), "../../examples")
}

// Bad panel input is refused with the field named; a temperature
// coefficient is not a key (refused, not ignored).
func TestPanelKeysRefused(t *testing.T) {
	for extra, field := range map[string]string{
		"\n    - {name: t, face: \"+Y\", area_m2: 0.01, efficiency: 0.3, temperature_coefficient: -0.002}": "temperature_coefficient",
		"\n    - {name: t, face: \"+Y\", area_m2: 0, efficiency: 0.3}":                                     "area_m2",
		"\n    - {name: t, face: \"+Y\", area_m2: 0.01, efficiency: 1.3}":                                  "efficiency",
		"\n    - {name: t, face: \"+Y\", area_m2: 0.01}":                                                   "efficiency",
		"\n    - {name: t, face: \"+Y\", normal: [0, 1, 0], area_m2: 0.01, efficiency: 0.3}":               "face",
		"\n    - {name: t, face: \"+Q\", area_m2: 0.01, efficiency: 0.3}":                                  "face",
		"\n    - {name: t, normal: [0, 0, 0], area_m2: 0.01, efficiency: 0.3}":                             "normal",
		"\n    - {name: body-px, face: \"+Y\", area_m2: 0.01, efficiency: 0.3}":                            "name",
		"\n    - {name: t, face: \"+Y\", area_m2: 0.01, efficiency: 0.3, packing_factor: 0}":               "packing_factor",
		"\n    - {name: t, normal: [0, 0, -1], position_m: [0, 0, 0.1], area_m2: 0.01, efficiency: 0.3}":   "position_m",
	} {
		_, err := panelScenario(t, extra)
		if err == nil || !strings.Contains(err.Error(), field) {
			t.Errorf("%s: error %v, want one naming %s", extra, err, field)
		}
	}
	data, _ := os.ReadFile("../../examples/power-6u.yaml")
	txt := string(data)
	i, j := strings.Index(txt, "  panels:"), strings.Index(txt, "albedo:")
	if _, err := scenario.Parse([]byte(txt[:i]+txt[j:]), "../../examples"); err == nil || !strings.Contains(err.Error(), "min_orbit_average_power_w") {
		t.Errorf("power target without panels: error %v", err)
	}
}

// Panels listed in the scenario reach the engine: an added wing adds power.
func TestPanelKeysHaveEffect(t *testing.T) {
	run := func(extra string) *sim.Result {
		s, err := panelScenario(t, extra)
		if err != nil {
			t.Fatal(err)
		}
		s.Duration = scenario.Span(6 * 3600e9)
		s.Albedo.Model = scenario.AlbedoNone
		cfg, err := Config(s)
		if err != nil {
			t.Fatal(err)
		}
		res, err := sim.Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		return res
	}
	base := run("")
	more := run("\n    - {name: extra, normal: [0, 0, -1], position_m: [0.6, 0, -0.183], area_m2: 0.0828, efficiency: 0.295, packing_factor: 0.9}")
	if !(more.Power.MeanW > base.Power.MeanW) {
		t.Fatalf("extra wing: %g W, base %g W", more.Power.MeanW, base.Power.MeanW)
	}
	t.Logf("base %.4f W, with a third wing %.4f W", base.Power.MeanW, more.Power.MeanW)
}

// A zenith wing whose centre sits behind an obstruction is shaded: the
// obstruction geometry of the sensors applies to panels.
func TestPanelShadedByObstruction(t *testing.T) {
	s := &scenario.Scenario{}
	s.Body.SizeM = r3.Vec{X: 0.2263, Y: 0.1, Z: 0.366}
	s.Body.Panels = []scenario.Panel{{Name: "side", Normal: r3.Vec{X: 1}, PositionM: r3.Vec{X: 0.11315}, AreaM2: 0.08, Efficiency: 0.3, PackingFactor: 1}}
	arr, err := Panels(s)
	if err != nil {
		t.Fatal(err)
	}
	open := arr.Power(r3.Unit(r3.Vec{X: 1, Z: 0.2}), 1361)
	s.Body.Obstructions = []scenario.Obstruction{{Name: "plate", Shape: scenario.ShapeRectangle, CentreM: r3.Vec{X: 0.3}, HalfExtentsM: r3.Vec{Y: 0.2, Z: 0.2}}}
	arr, err = Panels(s)
	if err != nil {
		t.Fatal(err)
	}
	if shaded := arr.Power(r3.Unit(r3.Vec{X: 1, Z: 0.2}), 1361); !(open > 0) || shaded != 0 {
		t.Errorf("open %g W, behind a plate %g W; want > 0 and 0", open, shaded)
	}
}
