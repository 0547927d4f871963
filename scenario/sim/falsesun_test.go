package sim

import (
	"context"
	"math"
	"testing"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// A constructed false sun: the spacecraft points +X at the sun and carries
// a cosine sensor and a digital sensor on its anti-sun face -X. Direct sun
// never reaches them; over the day side they look straight at the lit Earth
// and albedo alone drives them above threshold. The albedo-only shares must
// equal the share of sunlit samples in which the albedo model puts the
// sensor's albedo at or above its threshold (counted here from the models
// directly, outside the step loop); the two-axis estimate, pointing at the
// Earth, is then also more than 20° off. With albedo off every one of these
// measures is exactly 0.
func TestFalseSunFromAlbedoAlone(t *testing.T) {
	const thr = 0.02
	epoch := time.Date(2026, 3, 20, 0, 0, 0, 0, time.UTC)
	el := orbit.Elements{SemiMajorAxisKm: orbit.RadiusEarthKm + 500, Inclination: 0.3}
	anti, _ := sensor.VectorMount(r3.Vec{X: -1}, r3.Vec{})
	cos, err := sensor.NewCosine(sensor.CosineSpec{Name: "css-anti", Mount: anti, HalfAngle: math.Pi / 2, Threshold: thr})
	if err != nil {
		t.Fatal(err)
	}
	dig, err := sensor.NewDigital(sensor.DigitalSpec{Name: "dss-anti", Mount: anti, HalfAngle: 60 * math.Pi / 180, Sigma: 1e-3,
		MinIrradiance: 0.1 * sensor.SolarConstant, AlbedoThreshold: thr * sensor.SolarConstant})
	if err != nil {
		t.Fatal(err)
	}
	arr, err := sensor.NewArray(cos, dig)
	if err != nil {
		t.Fatal(err)
	}
	newAlb := func() (*albedo.Model, error) {
		return albedo.New(albedo.Config{Reflectance: albedo.Uniform{Albedo: 0.3}})
	}
	cfg := Config{
		Epoch: epoch, Duration: 4 * 5700, Step: 20,
		NewPropagator: func() orbit.Propagator { return orbit.NewTwoBody(el) },
		Sun:           ephem.LowPrecision{}, Law: attitude.Sun{SunAxis: r3.Vec{X: 1}, SecondaryAxis: r3.Vec{Z: 1}},
		Array: arr, AlbedoResponse: []albedo.Response{{}, {}}, NewAlbedo: newAlb,
		Estimators: []sensor.Estimator{sensor.TwoAxis{}}, Seed: 1, Units: 1,
	}
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	// The expected shares, from the propagator, sun, shadow and albedo
	// models alone.
	prop, m := cfg.NewPropagator(), func() *albedo.Model { m, _ := newAlb(); return m }()
	jd0, jdUT0 := ephem.JulianDateTT(epoch), ephem.JulianDateUT1(epoch)
	var sunlit, cosLit, digLit int
	out := make([]albedo.Result, 2)
	for k := range cfg.Steps() {
		tk := float64(k) * cfg.Step
		st := prop.StateAt(tk)
		u, d := cfg.Sun.Position(jd0 + tk/86400)
		if _, reg := illum.ShadowConical(st.R, r3.Scale(d, u)); reg != illum.Sunlit {
			continue
		}
		sunlit++
		n := r3.Scale(-1, u)
		m.Irradiance(out, st.R, u, d, ephem.GMST(jdUT0+tk/86400), jd0+tk/86400,
			[]albedo.Sensor{{Normal: n, HalfAngle: math.Pi / 2}, {Normal: n, HalfAngle: 60 * math.Pi / 180}})
		if out[0].Irradiance/sensor.SolarConstant >= thr {
			cosLit++
		}
		if out[1].Irradiance >= thr*sensor.SolarConstant {
			digLit++
		}
	}
	wantCos, wantDig := float64(cosLit)/float64(sunlit), float64(digLit)/float64(sunlit)
	u := res.Nominal
	e := u.Estimators[0]
	t.Logf("bound %g°: two-axis albedo-only %.4f, beyond bound %.4f; css %.4f (expected %.4f), dss %.4f / %.4f (expected %.4f)",
		res.FalseSunBoundDeg, e.AlbedoOnlyFraction, e.WrongFraction, u.Sensors[0].AlbedoOnlyFraction, wantCos,
		u.Sensors[1].AlbedoOnlyFraction, u.Sensors[1].WrongFraction, wantDig)
	if !(wantDig > 0.1) {
		t.Fatalf("the constructed case lights the digital sensor in %.3f of sunlit time: it proves nothing", wantDig)
	}
	oneSample := 1.5 / float64(sunlit)
	for _, c := range []struct {
		what      string
		got, want float64
	}{
		{"two-axis valid only with albedo", e.AlbedoOnlyFraction, wantDig},
		{"two-axis valid beyond 20°", e.WrongFraction, wantDig},
		{"cosine valid only with albedo", u.Sensors[0].AlbedoOnlyFraction, wantCos},
		{"digital valid only with albedo", u.Sensors[1].AlbedoOnlyFraction, wantDig},
		{"digital valid beyond 20°", u.Sensors[1].WrongFraction, wantDig},
	} {
		if math.Abs(c.got-c.want) > oneSample {
			t.Errorf("%s: %.5f of sunlit time, expected %.5f", c.what, c.got, c.want)
		}
	}
	if !math.IsNaN(u.Sensors[0].WrongFraction) {
		t.Errorf("a cosine sensor gives no direction, yet its beyond-bound share is %g", u.Sensors[0].WrongFraction)
	}
	if res.FalseSunBoundDeg != DefaultFalseSunBoundDeg {
		t.Errorf("bound %g°, want the default %g°", res.FalseSunBoundDeg, DefaultFalseSunBoundDeg)
	}

	cfg.NewAlbedo = nil
	res, err = Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	u = res.Nominal
	for _, v := range []float64{u.Estimators[0].AlbedoOnlyFraction, u.Estimators[0].WrongFraction,
		u.Sensors[0].AlbedoOnlyFraction, u.Sensors[1].AlbedoOnlyFraction, u.Sensors[1].WrongFraction} {
		if v != 0 {
			t.Errorf("albedo off: a false-sun share is %g, want exactly 0", v)
		}
	}
}
