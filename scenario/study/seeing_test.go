package study

import (
	"context"
	"math"
	"os"
	"testing"

	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// nudged turns a law's attitude by a fixed small body rotation.
type nudged struct {
	law attitude.Law
	q   r3.Rotation
}

func (n nudged) Attitude(t float64, s orbit.State, sun r3.Vec) r3.Rotation {
	return r3.Rotation(quat.Mul(quat.Number(n.q), quat.Number(n.law.Attitude(t, s, sun))))
}

// Seeing the sun is a reading above threshold, not an angle comparison that
// rounding decides: the dawn-dusk example holds the sun exactly on body +X,
// 90° from the four side sensors, and turning the attitude by ±1e-9 rad
// about any axis leaves the ≥ 1/2/3 shares and every sensor's in-view share
// unchanged to 0.1 point.
func TestDawnDuskSeeingIsRobustToRounding(t *testing.T) {
	s, err := scenario.Load("../../examples/dawn-dusk-12u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	run := func(q r3.Rotation) *sim.UnitResult {
		cfg, err := Config(s)
		if err != nil {
			t.Fatal(err)
		}
		cfg.Duration, cfg.Units = 6*3600, 1
		if q != (r3.Rotation{}) {
			cfg.Law, cfg.LawForUnit = nudged{law: cfg.Law, q: q}, nil
		}
		res, err := sim.Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		return res.Nominal
	}
	ref := run(r3.Rotation{})
	t.Logf("seen by ≥1/2/3: %.4f %.4f %.4f", ref.SeenAtLeast[1], ref.SeenAtLeast[2], ref.SeenAtLeast[3])
	worst := 0.0
	defer func() { t.Logf("largest change of a share over six turns: %.4f points", 100*worst) }()
	for _, axis := range []r3.Vec{{Y: 1}, {Z: 1}, {X: 1, Y: 1, Z: 1}} {
		for _, a := range []float64{1e-9, -1e-9} {
			u := run(r3.NewRotation(a, axis))
			for k := 1; k <= 3; k++ {
				worst = math.Max(worst, math.Abs(u.SeenAtLeast[k]-ref.SeenAtLeast[k]))
				if d := math.Abs(u.SeenAtLeast[k] - ref.SeenAtLeast[k]); d > 1e-3 {
					t.Errorf("turned %g rad about %v: seen by ≥ %d %.4f, unturned %.4f", a, axis, k, u.SeenAtLeast[k], ref.SeenAtLeast[k])
				}
			}
			for i := range u.Sensors {
				worst = math.Max(worst, math.Abs(u.Sensors[i].InViewFraction-ref.Sensors[i].InViewFraction))
				if d := math.Abs(u.Sensors[i].InViewFraction - ref.Sensors[i].InViewFraction); d > 1e-3 {
					t.Errorf("turned %g rad about %v: %s in view %.4f, unturned %.4f", a, axis, u.Sensors[i].Name, u.Sensors[i].InViewFraction, ref.Sensors[i].InViewFraction)
				}
			}
		}
	}
	// The side sensors are edge-on to the sun: a reading of cos 90° is no sun.
	for _, ss := range ref.Sensors[2:] {
		if ss.InViewFraction != 0 {
			t.Errorf("%s: edge-on to the sun, in view %.4f of sunlit time", ss.Name, ss.InViewFraction)
		}
	}
}

// dawnDusk runs six hours of the dawn-dusk example with extra file text.
func dawnDusk(t *testing.T, extra string) (*scenario.Scenario, *sim.Result) {
	t.Helper()
	text, err := os.ReadFile("../../examples/dawn-dusk-12u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	s, err := scenario.Parse(append(text, []byte(extra)...), "../../examples")
	if err != nil {
		t.Fatal(err)
	}
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	cfg.Duration = 6 * 3600
	res, err := sim.Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	return s, res
}

func estimatorStats(t *testing.T, res *sim.Result, name string) sim.EstimatorStats {
	t.Helper()
	for _, e := range res.Nominal.Estimators {
		if e.Name == name {
			return e
		}
	}
	t.Fatalf("no %s estimator", name)
	return sim.EstimatorStats{}
}

// validity.false_sun_bound_deg reaches the engine: in the dawn-dusk example,
// with its validity gate opened, least squares is fed by albedo on the
// sensors away from the sun and valid far from it; a bound of 179° counts
// none of it.
func TestFalseSunBoundKey(t *testing.T) {
	open := "validity:\n  gates: {least-squares: {min_total_signal: 0}}\n  false_sun_bound_deg: "
	share := func(bound string) float64 {
		s, res := dawnDusk(t, open+bound+"\n")
		if res.FalseSunBoundDeg != s.Validity.FalseSunBoundDeg {
			t.Errorf("bound %g° in the result, %g° in the file", res.FalseSunBoundDeg, s.Validity.FalseSunBoundDeg)
		}
		return estimatorStats(t, res, "least-squares").WrongFraction
	}
	at20, at179 := share("20"), share("179")
	t.Logf("least squares valid beyond 20°: %.4f of sunlit time; beyond 179°: %.4f", at20, at179)
	if !(at20 > 0.05) || at179 != 0 {
		t.Errorf("beyond-bound share %.4f at 20°, %.4f at 179°", at20, at179)
	}
}

// The validity gate keeps a fit driven by albedo out of the availability:
// in the dawn-dusk example no cosine sensor faces the sun, and least
// squares on the albedo-lit ones is 120° off. Its default gate (signals
// summing to half of full sun) refuses all of it; opened, it is "valid" a
// quarter of sunlit time; each gate key on its own has an effect.
func TestValidityGateRefusesAlbedoFits(t *testing.T) {
	_, def := dawnDusk(t, "")
	_, opened := dawnDusk(t, "validity: {gates: {least-squares: {min_total_signal: 0}}}\n")
	d, o := estimatorStats(t, def, "least-squares"), estimatorStats(t, opened, "least-squares")
	t.Logf("least squares: valid %.4f with the default gate, %.4f opened (p95 %.1f°, beyond 20° %.4f)",
		d.ValidFraction, o.ValidFraction, o.ErrAlbedo.P95Deg, o.WrongFraction)
	if d.ValidFraction != 0 || d.WrongFraction != 0 {
		t.Errorf("default gate: valid %.4f, beyond 20° %.4f; want 0", d.ValidFraction, d.WrongFraction)
	}
	if !(o.ValidFraction > 0.1 && o.ErrAlbedo.P95Deg > 90) {
		t.Errorf("opened gate: valid %.4f at p95 %.1f°; the case proves nothing", o.ValidFraction, o.ErrAlbedo.P95Deg)
	}
	// The combination keeps its two-axis answer and drops the cosine part.
	if c := estimatorStats(t, def, "combined"); !(c.ValidFraction > 0.99 && c.ErrAlbedo.P95Deg < 5) {
		t.Errorf("combined: valid %.4f p95 %.2f°", c.ValidFraction, c.ErrAlbedo.P95Deg)
	}
	for _, key := range []string{"min_sensors: 5", "max_residual: 0.001"} {
		_, r := dawnDusk(t, "validity: {gates: {least-squares: {min_total_signal: 0, "+key+"}}}\n")
		if v := estimatorStats(t, r, "least-squares").ValidFraction; !(v < o.ValidFraction) {
			t.Errorf("%s: valid %.4f, no lower than the open gate's %.4f", key, v, o.ValidFraction)
		}
	}
}

// The scenario file's default gates are the engine's.
func TestDefaultGatesAgree(t *testing.T) {
	for _, name := range sensor.EstimatorNames() {
		g := scenario.DefaultGate(name)
		want := sensor.DefaultGate(name)
		if got := (sensor.Gate{MinSensors: g.MinSensors, MinSignal: g.MinTotalSignal, MaxResidual: g.MaxResidual}); got != want {
			t.Errorf("%s: scenario default %+v, engine default %+v", name, got, want)
		}
	}
}
