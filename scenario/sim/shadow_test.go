package sim

import (
	"context"
	"math"
	"testing"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// fixedSun is a sun that does not move: +X at 1 au.
type fixedSun struct{}

func (fixedSun) Position(float64) (r3.Vec, float64) { return r3.Vec{X: 1}, ephem.AUKm }

// betaCase is a circular two-body orbit whose normal makes the angle 90° − β
// with a fixed sun on +X: inclination β and RAAN 90° give ĥ·ŝ = sin β.
func betaCase(t *testing.T, altKm, βdeg float64, cylindrical bool) Config {
	t.Helper()
	a := orbit.RadiusEarthKm + altKm
	el := orbit.Elements{SemiMajorAxisKm: a, Inclination: βdeg * math.Pi / 180, RAAN: math.Pi / 2}
	return Config{
		Epoch: time.Date(2027, 1, 1, 0, 0, 0, 0, time.UTC), Duration: 4 * orbit.Period(a), Step: 10,
		NewPropagator: func() orbit.Propagator { return orbit.NewTwoBody(el) },
		Sun:           fixedSun{}, Cylindrical: cylindrical,
		Law:        attitude.Inertial{},
		Array:      faceArray(t, 60),
		Estimators: []sensor.Estimator{sensor.LeastSquares{}},
		Seed:       1, Units: 1,
	}
}

// cylinderShadowS is the cylindrical shadow time of a circular orbit of
// radius r and period T at beta angle β: T·2·acos(√(1−(R/r)²)/cos β)/(2π),
// 0 above β* = asin(R/r) (elementary geometry: the satellite at orbit angle
// u from the anti-sun side is dark when cos u·cos β > √(1−(R/r)²)).
func cylinderShadowS(r, T, β float64) float64 {
	c := math.Sqrt(1-(illum.EarthRadiusKm/r)*(illum.EarthRadiusKm/r)) / math.Cos(β)
	if c >= 1 {
		return 0
	}
	return T * 2 * math.Acos(c) / (2 * math.Pi)
}

// With shadow: cylindrical the eclipse events (not only the sampled
// fractions) follow the cylinder: every complete eclipse lasts the closed
// form to ≤ 0.5 s, has no penumbra, and the event total matches the sampled
// umbra fraction to one step per event.
func TestCylindricalEventsMatchClosedForm(t *testing.T) {
	worst := 0.0
	for _, c := range []struct{ alt, βdeg float64 }{{400, 0}, {550, 20}, {600, 45}, {800, 60}, {1200, 30}} {
		cfg := betaCase(t, c.alt, c.βdeg, true)
		res, err := Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		a := orbit.RadiusEarthKm + c.alt
		want := cylinderShadowS(a, orbit.Period(a), c.βdeg*math.Pi/180)
		n := 0
		for _, e := range res.Eclipses {
			if !e.Complete() {
				continue
			}
			n++
			d := e.Duration() - want
			worst = math.Max(worst, math.Abs(d))
			if math.Abs(d) > 0.5 {
				t.Errorf("%g km β %g°: eclipse %.3f s, closed form %.3f s", c.alt, c.βdeg, e.Duration(), want)
			}
			if e.UmbraDuration() != e.Duration() {
				t.Errorf("%g km β %g°: cylindrical eclipse with a penumbra: umbra %.3f s of %.3f s", c.alt, c.βdeg, e.UmbraDuration(), e.Duration())
			}
		}
		if n < 3 {
			t.Errorf("%g km β %g°: %d complete eclipses in four orbits", c.alt, c.βdeg, n)
		}
		if res.Nominal.PenumbraFraction != 0 {
			t.Errorf("%g km β %g°: penumbra fraction %g in the cylindrical model", c.alt, c.βdeg, res.Nominal.PenumbraFraction)
		}
		sampled := res.Nominal.UmbraFraction * cfg.Duration
		if d := math.Abs(sampled - res.EclipseStats.TotalUmbraS); d > float64(res.EclipseStats.Count)*cfg.Step {
			t.Errorf("%g km β %g°: sampled umbra %.0f s, events %.0f s", c.alt, c.βdeg, sampled, res.EclipseStats.TotalUmbraS)
		}
	}
	t.Logf("worst |event duration − closed form| = %.2e s", worst)
}

// The conical run keeps the conical events: the engine returns exactly what
// illum.FindEclipses (checked against the ERFA/scipy reference in illum)
// finds on the same geometry, with a penumbra on each side of the umbra that
// brackets the cylinder.
func TestConicalEventsAreTheConicalSearch(t *testing.T) {
	cfg := betaCase(t, 550, 20, false)
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	p := cfg.NewPropagator()
	g := func(tt float64) (r3.Vec, r3.Vec) { return p.StateAt(tt).R, r3.Vec{X: ephem.AUKm} }
	want := illum.FindEclipses(g, 0, cfg.Duration, eclipseSearchStepS)
	if len(want) != len(res.Eclipses) {
		t.Fatalf("%d eclipses, illum finds %d", len(res.Eclipses), len(want))
	}
	a := orbit.RadiusEarthKm + 550
	cyl := cylinderShadowS(a, orbit.Period(a), 20*math.Pi/180)
	for i, e := range res.Eclipses {
		if math.Abs(e.PenumbraStart-want[i].PenumbraStart) > 1e-6 || math.Abs(e.UmbraEnd-want[i].UmbraEnd) > 1e-6 {
			t.Errorf("eclipse %d: %+v, illum %+v", i, e, want[i])
		}
		if e.Complete() && !(e.UmbraDuration() < cyl && cyl < e.Duration()) {
			t.Errorf("eclipse %d: umbra %.2f s, cylinder %.2f s, shadow %.2f s", i, e.UmbraDuration(), cyl, e.Duration())
		}
	}
}

// A gap never exceeds the run: one sensor alone never gives a least-squares
// estimate, so the whole run (a day, no eclipse at β 80°) is one gap of
// exactly the run's length, for a duration on and off the step grid.
func TestLongestGapIsAtMostTheRun(t *testing.T) {
	for _, dur := range []float64{86400, 86395} {
		cfg := betaCase(t, 550, 80, false)
		cfg.Duration = dur
		m, _ := sensor.FaceMount(sensor.FacePlusX, 0, sensor.FaceNone, 0)
		c, err := sensor.NewCosine(sensor.CosineSpec{Name: "only", Mount: m, HalfAngle: math.Pi / 2, Threshold: 0.05})
		if err != nil {
			t.Fatal(err)
		}
		if cfg.Array, err = sensor.NewArray(c); err != nil {
			t.Fatal(err)
		}
		res, err := Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		if len(res.Eclipses) != 0 {
			t.Fatalf("eclipses at β 80°: %d", len(res.Eclipses))
		}
		if g := res.Nominal.Estimators[0].LongestGapS; g != dur {
			t.Errorf("run %.0f s: longest gap %.0f s, want the run's length", dur, g)
		}
	}
}
