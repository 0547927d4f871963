package study

import (
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
		"\n    - {name: t, face: \"+Y\", size_m: [0.1], efficiency: 0.3}":                                  "size_m",
		"\n    - {name: t, face: \"+Y\", size_m: [0.1, -0.2], efficiency: 0.3}":                            "size_m[1]",
		"\n    - {name: t, face: \"+Y\", size_m: [0.1, 0.2], area_m2: 0.03, efficiency: 0.3}":              "area_m2",
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
		return runScenario(t, s)
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

// A 0.2 m square zenith panel beside the bus with a known box (a
// body.obstructions rectangle with half extents) over its +X half: the sun
// straight above lights half of it, so half the power; the same box beside
// it casts no shadow.
func TestPanelHalfShadowedByBox(t *testing.T) {
	s := &scenario.Scenario{}
	s.Body.SizeM = r3.Vec{X: 0.2263, Y: 0.1, Z: 0.366}
	s.Body.Panels = []scenario.Panel{{Name: "wing", Normal: r3.Vec{Z: -1}, PositionM: r3.Vec{X: 0.3, Z: -0.183}, SizeM: [2]float64{0.2, 0.2},
		AreaM2: 0.04, Efficiency: 0.3, PackingFactor: 1}}
	sun := r3.Vec{Z: -1}
	arr, err := Panels(s)
	if err != nil {
		t.Fatal(err)
	}
	open := arr.Power(sun, 1361)
	if want := 1361 * 0.04 * 0.3; math.Abs(open-want) > 1e-9 {
		t.Fatalf("open panel %g W, want %g W", open, want)
	}
	box := scenario.Obstruction{Name: "box", Shape: scenario.ShapeRectangle, CentreM: r3.Vec{X: 0.35, Z: -0.3}, HalfExtentsM: r3.Vec{X: 0.05, Y: 0.2, Z: 0.02}}
	s.Body.Obstructions = []scenario.Obstruction{box}
	if arr, err = Panels(s); err != nil {
		t.Fatal(err)
	}
	if got := arr.Power(sun, 1361); math.Abs(got-open/2) > 1e-9 {
		t.Errorf("box over half the panel: %g W, want half of %g W", got, open)
	}
	box.CentreM.Y = 0.35 // beside the panel (its y runs ±0.1 m)
	s.Body.Obstructions = []scenario.Obstruction{box}
	if arr, err = Panels(s); err != nil {
		t.Fatal(err)
	}
	if got := arr.Power(sun, 1361); got != open {
		t.Errorf("box beside the panel: %g W, want %g W", got, open)
	}
}

// Panels shade each other: a wing deployed from the top edge of the +X
// face, coplanar with the zenith face, hides part of the +X body panel from
// a sun high over +X; given without its sides (size_m) the wing casts no
// shadow, and the zenith panel never shades the wing.
func TestPanelsShadeEachOther(t *testing.T) {
	s := &scenario.Scenario{}
	s.Body.SizeM = r3.Vec{X: 0.2263, Y: 0.1, Z: 0.366}
	body := scenario.Panel{Name: "body-px", Normal: r3.Vec{X: 1}, PositionM: r3.Vec{X: 0.11315}, SizeM: [2]float64{0.1, 0.366},
		AreaM2: 0.0366, Efficiency: 0.3, PackingFactor: 1}
	wing := scenario.Panel{Name: "wing", Normal: r3.Vec{Z: -1}, PositionM: r3.Vec{X: 0.11315 + 0.183, Z: -0.183}, SizeM: [2]float64{0.366, 0.1},
		AreaM2: 0.0366, Efficiency: 0.3, PackingFactor: 1}
	sun := r3.Unit(r3.Vec{X: 1, Z: -1}) // 45° up from +X toward zenith
	s.Body.Panels = []scenario.Panel{body, wing}
	arr, err := Panels(s)
	if err != nil {
		t.Fatal(err)
	}
	alone := 1361 * 0.0366 * 0.3 * r3.Dot(sun, r3.Vec{X: 1})
	got := arr.Panels[0].Power(sun, 1361)
	// At 45° the wing (0.366 m out) shades the top 0.366 m of the face, the
	// whole 0.366 m face: nothing of it is lit.
	if got != 0 {
		t.Errorf("body panel under the wing at 45°: %g W, want 0 W", got)
	}
	low := r3.Unit(r3.Vec{X: 1, Z: -0.5}) // 26.6° up: the wing shades the top 0.183 m, half the face
	if got := arr.Panels[0].Power(low, 1361); math.Abs(got-0.5*1361*0.0366*0.3*r3.Dot(low, r3.Vec{X: 1})) > 1e-9 {
		t.Errorf("body panel, sun 26.6° up: %g W, want half of %g W", got, 1361*0.0366*0.3*r3.Dot(low, r3.Vec{X: 1}))
	}
	if w := arr.Panels[1].Power(sun, 1361); math.Abs(w-1361*0.0366*0.3*r3.Dot(sun, r3.Vec{Z: -1})) > 1e-9 {
		t.Errorf("wing: %g W, want it unshaded", w)
	}
	s.Body.Panels[1].SizeM = [2]float64{}
	if arr, err = Panels(s); err != nil {
		t.Fatal(err)
	}
	if got := arr.Panels[0].Power(sun, 1361); math.Abs(got-alone) > 1e-9 {
		t.Errorf("wing without its sides: body panel %g W, want %g W unshaded", got, alone)
	}
}

// size_m gives the area (the product of the sides) and makes a panel a
// shading rectangle: the two wings of the example, given their sides,
// shade the ±X body panels when the sun is high, and the run's power drops.
func TestPanelSizeHasEffect(t *testing.T) {
	run := func(wings string) (*scenario.Scenario, *sim.Result) {
		data, err := os.ReadFile("../../examples/power-6u.yaml")
		if err != nil {
			t.Fatal(err)
		}
		txt := string(data)
		i := strings.Index(txt, "    - {name: wing-px")
		j := strings.Index(txt, "albedo:")
		s, err := scenario.Parse([]byte(txt[:i]+wings+txt[j:]), "../../examples")
		if err != nil {
			t.Fatal(err)
		}
		s.Duration = scenario.Span(3 * 3600e9)
		s.Albedo.Model = scenario.AlbedoNone
		res := runScenario(t, s)
		return s, res
	}
	const centre = "    - {name: wing-px, normal: [0, 0, -1], position_m: [0.296, 0, -0.183], area_m2: 0.0828, efficiency: 0.295, packing_factor: 0.9}\n" +
		"    - {name: wing-mx, normal: [0, 0, -1], position_m: [-0.296, 0, -0.183], area_m2: 0.0828, efficiency: 0.295, packing_factor: 0.9}\n"
	const sized = "    - {name: wing-px, normal: [0, 0, -1], position_m: [0.296, 0, -0.183], size_m: [0.366, 0.226230], efficiency: 0.295, packing_factor: 0.9}\n" +
		"    - {name: wing-mx, normal: [0, 0, -1], position_m: [-0.296, 0, -0.183], size_m: [0.366, 0.226230], efficiency: 0.295, packing_factor: 0.9}\n"
	_, a := run(centre)
	s, b := run(sized)
	if w := s.Body.Panels[4]; w.SizeM != [2]float64{0.366, 0.22623} || math.Abs(w.AreaM2-0.366*0.22623) > 1e-12 {
		t.Errorf("sized wing: %+v", w)
	}
	if !(b.Power.MeanW < a.Power.MeanW) {
		t.Errorf("sized wings: %.4f W, centre-only wings %.4f W; want less (the wings shade the ±X body panels)", b.Power.MeanW, a.Power.MeanW)
	}
	t.Logf("orbit average: wings judged at their centre %.4f W, sampled wings shading the body panels %.4f W", a.Power.MeanW, b.Power.MeanW)
}

// albedo.on_panels reaches the power: the demo's Earth-facing body panels
// gain the reflected light; refused without an albedo model or panels.
func TestAlbedoOnPanelsKey(t *testing.T) {
	data, err := os.ReadFile("../../examples/power-6u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	run := func(txt string) *sim.Result {
		s, err := scenario.Parse([]byte(txt), "../../examples")
		if err != nil {
			t.Fatal(err)
		}
		s.Duration = scenario.Span(3 * 3600e9)
		return runScenario(t, s)
	}
	txt := string(data)
	on := strings.Replace(txt, "  value: 0.30\n", "  value: 0.30\n  on_panels: true\n", 1)
	if on == txt {
		t.Fatal("the example's albedo block changed: the test cannot add the key")
	}
	a, b := run(txt), run(on)
	if !(b.Power.MeanW > a.Power.MeanW) {
		t.Errorf("albedo on the panels: %.4f W, without %.4f W; want more", b.Power.MeanW, a.Power.MeanW)
	}
	t.Logf("orbit average %.4f W direct only, %.4f W with albedo on the panels", a.Power.MeanW, b.Power.MeanW)
	for name, txt := range map[string]string{
		"no albedo model": strings.Replace(on, "  model: uniform\n", "  model: none\n", 1),
		"no panels": func() string {
			i, j := strings.Index(on, "  panels:"), strings.Index(on, "albedo:")
			k := strings.Index(on, "targets:")
			return on[:i] + on[j:k]
		}(),
	} {
		if _, err := scenario.Parse([]byte(txt), "../../examples"); err == nil || !strings.Contains(err.Error(), "albedo.on_panels") {
			t.Errorf("%s: error %v, want one naming albedo.on_panels", name, err)
		}
	}
}
