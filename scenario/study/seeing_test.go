package study

import (
	"context"
	"math"
	"os"
	"testing"

	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

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
	for _, axis := range []r3.Vec{{Y: 1}, {Z: 1}, {X: 1, Y: 1, Z: 1}} {
		for _, a := range []float64{1e-9, -1e-9} {
			u := run(r3.NewRotation(a, axis))
			for k := 1; k <= 3; k++ {
				if d := math.Abs(u.SeenAtLeast[k] - ref.SeenAtLeast[k]); d > 1e-3 {
					t.Errorf("turned %g rad about %v: seen by ≥ %d %.4f, unturned %.4f", a, axis, k, u.SeenAtLeast[k], ref.SeenAtLeast[k])
				}
			}
			for i := range u.Sensors {
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

// validity.false_sun_bound_deg reaches the engine: in the dawn-dusk example
// least squares, fed by albedo on the sensors away from the sun, is valid
// far from the sun; a bound of 179° counts none of it.
func TestFalseSunBoundKey(t *testing.T) {
	share := func(bound string) float64 {
		text, err := os.ReadFile("../../examples/dawn-dusk-12u.yaml")
		if err != nil {
			t.Fatal(err)
		}
		s, err := scenario.Parse(append(text, []byte("validity: {false_sun_bound_deg: "+bound+"}\n")...), "../../examples")
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
		if res.FalseSunBoundDeg != s.Validity.FalseSunBoundDeg {
			t.Errorf("bound %g° in the result, %g° in the file", res.FalseSunBoundDeg, s.Validity.FalseSunBoundDeg)
		}
		for _, e := range res.Nominal.Estimators {
			if e.Name == "least-squares" {
				return e.WrongFraction
			}
		}
		t.Fatal("no least-squares estimator")
		return 0
	}
	at20, at179 := share("20"), share("179")
	t.Logf("least squares valid beyond 20°: %.4f of sunlit time; beyond 179°: %.4f", at20, at179)
	if !(at20 > 0.05) || at179 != 0 {
		t.Errorf("beyond-bound share %.4f at 20°, %.4f at 179°", at20, at179)
	}
}
