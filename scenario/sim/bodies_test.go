package sim

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/internal/vecmath"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// bodiesEpoch is the epoch of the Moon and Earth cases (a waxing Moon,
// illuminated fraction about 0.6).
var bodiesEpoch = time.Date(2026, 3, 27, 0, 0, 0, 0, time.UTC)

// cosineAt is an ideal cosine sensor of half-angle halfDeg with the given
// boresight (body axes).
func cosineAt(t testing.TB, name string, bore r3.Vec, halfDeg float64) sensor.Sensor {
	t.Helper()
	m, err := sensor.VectorMount(bore, r3.Vec{})
	if err != nil {
		t.Fatal(err)
	}
	c, err := sensor.NewCosine(sensor.CosineSpec{Name: name, Mount: m, HalfAngle: halfDeg * math.Pi / 180, Threshold: 0.05})
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// bodiesCase is a circular two-body orbit at altKm, inclination 51.6°,
// flown with law by the given sensors for duration s at a 30 s step.
func bodiesCase(t testing.TB, altKm float64, law attitude.Law, duration float64, ss ...sensor.Sensor) Config {
	t.Helper()
	arr, err := sensor.NewArray(ss...)
	if err != nil {
		t.Fatal(err)
	}
	el := orbit.Elements{SemiMajorAxisKm: orbit.RadiusEarthKm + altKm, Inclination: 51.6 * math.Pi / 180, RAAN: 0.7}
	return Config{Epoch: bodiesEpoch, Duration: duration, Step: 30,
		NewPropagator: func() orbit.Propagator { return orbit.NewTwoBody(el) },
		Sun:           ephem.LowPrecision{}, Law: law, Array: arr,
		Estimators: []sensor.Estimator{sensor.LeastSquares{}}, Units: 1, Seed: 1}
}

func runBodies(t *testing.T, cfg Config) *UnitResult {
	t.Helper()
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	return res.Nominal
}

// subSatelliteLitShare counts, by its definition, the steps of cfg with the
// sub-satellite point sunlit (r·ŝ > 0), straight from the propagator and
// the sun model.
func subSatelliteLitShare(cfg Config) float64 {
	p := cfg.NewPropagator()
	jd0 := ephem.JulianDateTT(cfg.Epoch)
	n, lit := cfg.Steps(), 0
	for k := range n {
		t := float64(k) * cfg.Step
		u, _ := cfg.Sun.Position(jd0 + t/86400)
		if r3.Dot(p.StateAt(t).R, u) > 0 {
			lit++
		}
	}
	return float64(lit) / float64(n)
}

// The lit Earth is in view of a sensor exactly when its boresight is within
// half-angle + asin(R/r) of nadir (closed-form Earth angular radius, R =
// 6378.137 km): in nadir pointing a sensor just inside that angle sees it
// whenever the sub-satellite point is lit, one just outside and a zenith
// sensor never.
func TestLitEarthInViewClosedForm(t *testing.T) {
	const alt, half = 550.0, 30.0
	ρ := math.Asin(illum.EarthRadiusKm/(orbit.RadiusEarthKm+alt)) * 180 / math.Pi // 67.0°
	tilt := func(deg float64) r3.Vec {
		s, c := math.Sincos(deg * math.Pi / 180)
		return r3.Vec{X: s, Z: c} // +Z is nadir
	}
	cfg := bodiesCase(t, alt, attitude.Nadir{}, 86400,
		cosineAt(t, "nadir", r3.Vec{Z: 1}, half),
		cosineAt(t, "inside", tilt(half+ρ-0.5), half),
		cosineAt(t, "outside", tilt(half+ρ+0.5), half),
		cosineAt(t, "zenith", r3.Vec{Z: -1}, half))
	u := runBodies(t, cfg)
	want := subSatelliteLitShare(cfg)
	t.Logf("Earth angular radius %.3f°; sub-satellite point lit %.5f of the time", ρ, want)
	for i, w := range []float64{want, want, 0, 0} {
		s := u.Sensors[i]
		t.Logf("%-8s lit Earth in view %.5f", s.Name, s.LitEarthInViewFraction)
		if s.LitEarthInViewFraction != w {
			t.Errorf("%s: lit Earth in view %.6f, want %.6f", s.Name, s.LitEarthInViewFraction, w)
		}
	}
	// A circular orbit spends half its time over the day side (closed form,
	// symmetry of the terminator): within a step per orbit.
	if math.Abs(want-0.5) > 2*cfg.Step/5700 {
		t.Errorf("sub-satellite lit share %.5f, want 0.5", want)
	}
}

// moonTopo is the unit vector from the spacecraft to the Moon and the
// Moon's angular radius, straight from ephem.Moon (no interpolation).
func moonTopo(jd float64, r r3.Vec) (r3.Vec, float64) {
	u, d := ephem.Moon{}.Position(jd)
	rel := r3.Sub(r3.Scale(d, u), r)
	n := vecmath.Norm(rel)
	return r3.Scale(1/n, rel), math.Asin(ephem.MoonRadiusKm / n)
}

// A sensor held on the Moon sees it whenever the Earth does not hide it; the
// share of such steps, counted from the ephemeris by the rule's definition,
// is the engine's.
func TestMoonInViewOfAMoonPointingSensor(t *testing.T) {
	jd0 := ephem.JulianDateTT(bodiesEpoch)
	mid, _ := ephem.Moon{}.Position(jd0 + 0.5)
	// Inertial identity attitude: body axes are EME2000 axes.
	cfg := bodiesCase(t, 550, attitude.Inertial{}, 86400, cosineAt(t, "moon", mid, 10), cosineAt(t, "anti", r3.Scale(-1, mid), 60))
	u := runBodies(t, cfg)
	p := cfg.NewPropagator()
	seen := 0
	for k := range cfg.Steps() {
		tt := float64(k) * cfg.Step
		r := p.StateAt(tt).R
		m, ρM := moonTopo(jd0+tt/86400, r)
		nadir := r3.Scale(-1/vecmath.Norm(r), r)
		ρE := math.Asin(illum.EarthRadiusKm / vecmath.Norm(r))
		if angleBetween(m, nadir)+ρM > ρE {
			seen++
		}
	}
	want := float64(seen) / float64(cfg.Steps())
	t.Logf("Moon in view %.5f (Earth hides it %.3f of the time), anti-Moon sensor %.5f", u.Sensors[0].MoonInViewFraction, 1-want, u.Sensors[1].MoonInViewFraction)
	if math.Abs(u.Sensors[0].MoonInViewFraction-want) > 1.5/float64(cfg.Steps()) {
		t.Errorf("Moon in view %.6f, want %.6f", u.Sensors[0].MoonInViewFraction, want)
	}
	if !(want > 0.5 && want < 0.9) {
		t.Errorf("the Earth hides the Moon %.3f of the time: the case is not testing occultation", 1-want)
	}
	if u.Sensors[1].MoonInViewFraction != 0 {
		t.Errorf("anti-Moon sensor: Moon in view %.6f, want 0", u.Sensors[1].MoonInViewFraction)
	}
}

// Property: a sensor that never points within half-angle + the Moon's
// angular radius of the Moon has a Moon share of 0, and one with a share
// above 0 came that close at some step (random boresights, half-angles,
// orbits and inertial attitudes, fixed seed; the minimum angle is taken
// from the ephemeris at every step).
func TestMoonShareZeroWhenNeverPointedAtIt(t *testing.T) {
	rng := rand.New(rand.NewPCG(19, 2))
	jd0 := ephem.JulianDateTT(bodiesEpoch)
	zero, some := 0, 0
	for c := range 40 {
		q := attitude.UniformRotation(rng)
		bore := vecmath.Unit(r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()})
		half := 5 + 80*rng.Float64()
		alt := 400 + 35000*rng.Float64()*rng.Float64()
		cfg := bodiesCase(t, alt, attitude.Inertial{Q: q}, 2*86400, cosineAt(t, "s", bore, half))
		cfg.Step = 120
		u := runBodies(t, cfg)
		p := cfg.NewPropagator()
		A := attitudeRot(q)
		boreECI := A.toECI(bore)
		margin := math.Inf(1) // min over steps of angle − (half + ρM), rad
		for k := range cfg.Steps() {
			tt := float64(k) * cfg.Step
			m, ρM := moonTopo(jd0+tt/86400, p.StateAt(tt).R)
			margin = math.Min(margin, angleBetween(boreECI, m)-(half*math.Pi/180+ρM))
		}
		share := u.Sensors[0].MoonInViewFraction
		name := fmt.Sprintf("case %d (alt %.0f km, half %.1f°, closest %.3f° beyond the cone)", c, alt, half, margin*180/math.Pi)
		switch {
		case margin > 1e-6 && share != 0:
			t.Errorf("%s: Moon share %.6f, want 0", name, share)
		case share > 0 && margin > 0:
			t.Errorf("%s: Moon share %.6f without ever coming within the cone", name, share)
		}
		if margin > 0 {
			zero++
		} else if share > 0 {
			some++
		}
	}
	t.Logf("%d cases never within the cone, %d with the Moon in view", zero, some)
	if zero < 5 || some < 5 {
		t.Errorf("the draw does not exercise both sides: %d never within, %d in view", zero, some)
	}
}

// digitalAt is an ideal digital sensor of half-angle halfDeg with the given
// boresight (body axes) and blinding rule.
func digitalAt(t testing.TB, name string, bore r3.Vec, halfDeg float64, rule sensor.BlindRule) sensor.Sensor {
	t.Helper()
	m, err := sensor.VectorMount(bore, r3.Vec{})
	if err != nil {
		t.Fatal(err)
	}
	d, err := sensor.NewDigital(sensor.DigitalSpec{Name: name, Mount: m, HalfAngle: halfDeg * math.Pi / 180, Sigma: 1e-3,
		MinIrradiance: 0.05 * sensor.SolarConstant, AlbedoThreshold: 0.3 * sensor.SolarConstant, Blind: rule})
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// The blinding rule drops a digital sensor's readings exactly at the steps
// its thresholds name: with the lit-Earth depth at 0 a sensor whose cone
// always holds part of the Earth is blinded whenever the sub-satellite
// point is lit; with the Moon rule at 0 a sensor on the Moon is blinded
// whenever it has the Moon in view; with the rules off nothing changes.
func TestDigitalBlindingRule(t *testing.T) {
	const alt = 550.0
	ρ := math.Asin(illum.EarthRadiusKm/(orbit.RadiusEarthKm+alt)) * 180 / math.Pi
	// Boresight 90° from nadir (+Y, along the orbit normal), half-angle 40°:
	// the Earth reaches ρ + 40° − 90° ≈ 17° inside the cone.
	side := r3.Vec{Y: 1}
	depth := ρ + 40 - 90
	earth := func(d float64) sensor.BlindRule {
		return sensor.BlindRule{Earth: true, EarthDepthAbove: d * math.Pi / 180}
	}
	cfg := bodiesCase(t, alt, attitude.Nadir{}, 86400,
		digitalAt(t, "off", side, 40, sensor.BlindRule{}),
		digitalAt(t, "shallow", side, 40, earth(depth-1)),
		digitalAt(t, "deep", side, 40, earth(depth+1)))
	u := runBodies(t, cfg)
	lit := u.Sensors[0].LitEarthInViewFraction
	t.Logf("Earth %.2f° inside the cone; lit Earth in view %.5f; blinded: shallow %.5f, deep %.5f", depth, lit, u.Sensors[1].BlindedFraction, u.Sensors[2].BlindedFraction)
	if !math.IsNaN(u.Sensors[0].BlindedFraction) {
		t.Errorf("rule off: blinded fraction %v, want NaN (no rule)", u.Sensors[0].BlindedFraction)
	}
	if u.Sensors[1].BlindedFraction != lit || !(lit > 0.4) {
		t.Errorf("depth %.2f° > threshold: blinded %.6f, want the lit-Earth share %.6f", depth, u.Sensors[1].BlindedFraction, lit)
	}
	if u.Sensors[2].BlindedFraction != 0 {
		t.Errorf("depth %.2f° < threshold: blinded %.6f, want 0", depth, u.Sensors[2].BlindedFraction)
	}

	// The Moon: inertial attitude, the sensor on the Moon; the estimate
	// (from this one sensor) is valid only when neither the Earth hides the
	// sun nor the rule drops the reading.
	jd0 := ephem.JulianDateTT(bodiesEpoch)
	mid, _ := ephem.Moon{}.Position(jd0 + 0.5)
	cfgM := bodiesCase(t, alt, attitude.Inertial{}, 86400,
		digitalAt(t, "moon-off", mid, 20, sensor.BlindRule{}),
		digitalAt(t, "moon-any", mid, 20, sensor.BlindRule{Moon: true}),
		digitalAt(t, "moon-full", mid, 20, sensor.BlindRule{Moon: true, MoonLitAbove: 0.95}))
	um := runBodies(t, cfgM)
	inView := um.Sensors[0].MoonInViewFraction
	t.Logf("Moon in view %.5f; blinded: any %.5f, above 0.95 lit %.5f", inView, um.Sensors[1].BlindedFraction, um.Sensors[2].BlindedFraction)
	if um.Sensors[1].BlindedFraction != inView || !(inView > 0.5) {
		t.Errorf("Moon rule at 0: blinded %.6f, want the Moon-in-view share %.6f", um.Sensors[1].BlindedFraction, inView)
	}
	if um.Sensors[2].BlindedFraction != 0 {
		t.Errorf("a Moon lit about 0.6 blinded a sensor whose threshold is 0.95: %.6f", um.Sensors[2].BlindedFraction)
	}
}

// The step loop allocates nothing with the Moon and the Earth followed and
// a blinding rule in force.
func TestBodiesStepAllocatesNothing(t *testing.T) {
	cfg := bodiesCase(t, 550, attitude.Nadir{}, 3600,
		digitalAt(t, "d", r3.Vec{Y: 1}, 40, sensor.BlindRule{Earth: true, Moon: true}), cosineAt(t, "c", r3.Vec{Z: 1}, 60))
	g, err := newGeometry(&cfg, cfg.Array, 0, albedoTables{})
	if err != nil {
		t.Fatal(err)
	}
	r := newReader(&cfg, cfg.Array, 0, 0)
	vw := newViewer(&cfg, cfg.Array)
	alb := make([]sensor.Albedo, cfg.Array.Len())
	k := 0
	if n := testing.AllocsPerRun(2000, func() {
		sg := g.step(k%cfg.Steps(), alb, nil)
		r.blind(&sg.bodies, vw.at(&sg, alb, nil))
		k++
	}); n != 0 {
		t.Errorf("%v allocations per step", n)
	}
}

// The viewer's Moon and lit-Earth flags are sensor.Bodies.MoonInCone and
// LitEarthInCone, which it writes out over the sensors: the same flags on
// random bodies (near-edge cases included by drawing the angular radii up
// to 60°) and cones from 5° to 90°, with and without mounting planes.
func TestViewerBodiesFlagsAreTheRules(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	unit := func() r3.Vec {
		return r3.Unit(r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()})
	}
	var ss []sensor.Sensor
	for i := range 8 {
		ss = append(ss, cosineAt(t, fmt.Sprintf("c%d", i), unit(), 5+float64(i)*12))
	}
	arr, err := sensor.NewArray(ss...)
	if err != nil {
		t.Fatal(err)
	}
	cfg := Config{Array: arr}
	faces := make([]r3.Vec, arr.Len())
	for i := range faces {
		if i%2 == 0 {
			faces[i] = unit()
		}
	}
	cfg.MountNormals = faces
	vw := newViewer(&cfg, arr)
	var in, lit int
	for range 20000 {
		var g stepGeom
		b := &g.bodies
		b.MoonDir, b.NadirDir = unit(), unit()
		b.MoonSin, b.EarthSin = math.Sin(rng.Float64()*math.Pi/3), math.Sin(rng.Float64()*math.Pi/3)
		b.MoonCos, b.EarthCos = math.Sqrt(1-b.MoonSin*b.MoonSin), math.Sqrt(1-b.EarthSin*b.EarthSin)
		b.MoonHidden, b.EarthLit = rng.IntN(4) == 0, rng.IntN(4) != 0
		v := vw.at(&g, nil, nil)
		for i, c := range vw.cone {
			if v.moonIn[i] != b.MoonInCone(c, faces[i]) || v.litEarthIn[i] != b.LitEarthInCone(c, faces[i]) {
				t.Fatalf("sensor %d: viewer Moon %v Earth %v, rules %v %v", i, v.moonIn[i], v.litEarthIn[i], b.MoonInCone(c, faces[i]), b.LitEarthInCone(c, faces[i]))
			}
			if v.moonIn[i] {
				in++
			}
			if v.litEarthIn[i] {
				lit++
			}
		}
	}
	if in == 0 || lit == 0 {
		t.Fatalf("cases not reached: Moon in a cone %d, lit Earth in a cone %d", in, lit)
	}
}
