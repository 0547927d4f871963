package study

import (
	"math"
	"strings"
	"testing"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

const tumbleBase = "duration: 2h\nstep: 10s\nseed: 3\norbit: {altitude_km: 500, inclination_deg: 51.6}\n" +
	"body:\n  sensors:\n    - {name: a, kind: cosine, face: \"+X\"}\n    - {name: b, kind: cosine, face: \"-X\"}\n" +
	"    - {name: c, kind: cosine, face: \"+Y\"}\n    - {name: d, kind: cosine, face: \"-Y\"}\n" +
	"monte_carlo: {units: 12}\nalbedo: {model: none}\n"

func parse(t *testing.T, text string) *scenario.Scenario {
	t.Helper()
	s, err := scenario.Parse([]byte(text), "")
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// A tip-off band of 5–10°/s gives every unit a rate in the band (the old
// draw, uniform on [0, max], gave unit 0 of a "10°/s" study 1.93°/s), the
// axes are unit vectors spread over the sphere, and the run flies exactly
// the draws reported.
func TestTumbleBandDraws(t *testing.T) {
	s := parse(t, tumbleBase+"attitude: {law: tumble, min_rate_deg_s: 5, max_rate_deg_s: 10}\n")
	draws := TumbleDraws(s, s.Attitude, 12)
	if len(draws) != 12 {
		t.Fatalf("%d draws", len(draws))
	}
	var mean r3.Vec
	for _, d := range draws {
		if d.RateDegS < 5 || d.RateDegS > 10 || math.Abs(r3.Norm(d.AxisBody)-1) > 1e-12 || d.TorqueFree {
			t.Errorf("unit %d: %.3f°/s about %v (torque-free %v)", d.Unit, d.RateDegS, d.AxisBody, d.TorqueFree)
		}
		mean = r3.Add(mean, d.AxisBody)
	}
	// Isotropic axes: the mean of 12 unit vectors has |m| ≈ 1/√12 ≈ 0.29
	// (each component has variance 1/3); 0.75 is far out in the tail.
	if r3.Norm(mean)/12 > 0.75 {
		t.Errorf("axes bunch: mean %v", r3.Scale(1.0/12, mean))
	}
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	for _, d := range draws {
		l := cfg.LawForUnit(d.Unit)
		a0, a1 := l.Attitude(0, orbit.State{}, r3.Vec{}), l.Attitude(1, orbit.State{}, r3.Vec{})
		if got := rotAngle(a0, a1) * 180 / math.Pi; math.Abs(got-d.RateDegS) > 1e-9 {
			t.Errorf("unit %d flies %.6f°/s, reported %.6f°/s", d.Unit, got, d.RateDegS)
		}
	}
}

// With an inertia tensor the tumble is torque-free motion of that body:
// the same draws give other visibility than the fixed-axis spin, and a bad
// tensor is refused by the build with the key named.
func TestTumbleInertiaIsUsed(t *testing.T) {
	run := func(extra string) *sim.Result {
		t.Helper()
		s := parse(t, tumbleBase+"attitude: {law: tumble, min_rate_deg_s: 5, max_rate_deg_s: 10"+extra+"}\n")
		return runScenario(t, s)
	}
	fixed := run("")
	free := run(", inertia_kg_m2: [0.03, 0.032, 0.008, 0.001, -0.0005, 0.0008]")
	a, b := fixed.Nominal.SeenAtLeast[2], free.Nominal.SeenAtLeast[2]
	t.Logf("seen by ≥2, unit 0: fixed-axis %.4f, torque-free %.4f", a, b)
	if a == b {
		t.Errorf("inertia changed nothing: seen by ≥2 %.4f both", a)
	}
	s := parse(t, tumbleBase+"attitude: {law: tumble, inertia_kg_m2: [0.01, 0.01, 0.05]}\n")
	if _, err := Config(s); err == nil || !strings.Contains(err.Error(), "attitude.inertia_kg_m2") || !strings.Contains(err.Error(), "triangle") {
		t.Errorf("broken triangle inequality: %v", err)
	}
}

// rotAngle is the angle of the rotation from a to b, rad.
func rotAngle(a, b r3.Rotation) float64 {
	d := a.Real*b.Real + a.Imag*b.Imag + a.Jmag*b.Jmag + a.Kmag*b.Kmag
	return 2 * math.Acos(math.Min(1, math.Abs(d)))
}

// Warnings: epochs outside the sun model's stated span, a TLE far from the
// run, a run shorter than one orbit and a step too long for the orbit; none
// for a plain 2026 day.
func TestWarnings(t *testing.T) {
	base := "orbit: {altitude_km: 500, inclination_deg: 51.6}\nbody:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n"
	for _, c := range []struct{ text, want string }{
		{"epoch: \"2026-03-20T00:00:00Z\"\n" + base, ""},
		{"epoch: \"1800-03-20T00:00:00Z\"\n" + base, "leaves 1950–2050"},
		{"epoch: \"2050-12-31T00:00:00Z\"\nduration: 2d\n" + base, "the run (2050 to 2051)"},
		{"epoch: \"2099-03-20T00:00:00Z\"\nsun_model: meeus\n" + base, ""},
		{"epoch: \"2026-03-20T00:00:00Z\"\nduration: 45m\n" + base, "shorter than one orbit (94.6 min)"},
		// 94.6 min / 30 = 189 s: a 180 s step passes, 200 s does not.
		{"epoch: \"2026-03-20T00:00:00Z\"\nstep: 180s\n" + base, ""},
		{"epoch: \"2026-03-20T00:00:00Z\"\nstep: 200s\n" + base, "samples each orbit (94.6 min) at fewer than 30 points"},
	} {
		ws := Warnings(parse(t, c.text), nil)
		got := strings.Join(ws, "; ")
		if (c.want == "") != (len(ws) == 0) || !strings.Contains(got, c.want) {
			t.Errorf("%q: warnings %q, want %q", c.text, got, c.want)
		}
	}
}

// A TLE used at another epoch is carried there with the secular J2 rates:
// the position at the later epoch equals the position reached by a run
// from the TLE's own epoch (same propagator), and a TLE 18 years from the
// run is flagged.
func TestTLEEpochCarriedAndAged(t *testing.T) {
	const l1 = "1 25544U 98067A   08264.51782528 -.00002182  00000-0 -11606-4 0  2927"
	const l2 = "2 25544  51.6416 247.4627 0006703 130.5360 325.0288 15.72125391563537"
	body := "body:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n"
	own := parse(t, "orbit:\n  tle: [\""+l1+"\", \""+l2+"\"]\n"+body)
	later := own.Orbit.TLE.Epoch.Add(36 * time.Hour)
	moved := parse(t, "epoch: \""+later.Format(time.RFC3339Nano)+"\"\norbit:\n  tle: [\""+l1+"\", \""+l2+"\"]\n"+body)
	p0, err := NewPropagator(own)
	if err != nil {
		t.Fatal(err)
	}
	p1, err := NewPropagator(moved)
	if err != nil {
		t.Fatal(err)
	}
	dt := later.Sub(own.Orbit.TLE.Epoch).Seconds()
	if d := r3.Norm(r3.Sub(p0().StateAt(dt).R, p1().StateAt(0).R)); d > 1e-3 {
		t.Errorf("carried TLE is %.3f km off the propagated one", d)
	}
	if ws := Warnings(moved, nil); len(ws) != 0 {
		t.Errorf("1.5 days from the TLE: %v", ws)
	}
	old := parse(t, "epoch: \"2026-06-01T00:00:00Z\"\norbit:\n  tle: [\""+l1+"\", \""+l2+"\"]\n"+body)
	if ws := strings.Join(Warnings(old, nil), ";"); !strings.Contains(ws, "days from the run (more than 14)") {
		t.Errorf("2008 TLE in 2026: %q", ws)
	}
}
