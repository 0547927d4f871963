package sim

import (
	"context"
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/power"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// A +Z panel with +Z pointed at the sun gives A·η·f·S(r)·(lit share) at every
// step (closed form); the test sums that product independently, with the
// public shadow function and the sun model, and checks the run's mean and
// its zero power in umbra.
func TestPowerSunPointingClosedForm(t *testing.T) {
	cfg := referenceCase(t, 1, false)
	cfg.Law = attitude.Sun{}
	const a, eta, f = 0.06, 0.30, 0.9
	arr, err := power.NewArray(power.Panel{Name: "top", Normal: r3.Vec{Z: 1}, AreaM2: a, Efficiency: eta, PackingFactor: f})
	if err != nil {
		t.Fatal(err)
	}
	cfg.Panels = arr
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	p := res.Power
	// Independent sum: S₀(AU/r)²·lit per step, each sample standing for one
	// step up to the run's end.
	prop := cfg.NewPropagator()
	jd0 := ephem.JulianDateTT(cfg.Epoch)
	var sum float64
	n := cfg.Steps()
	for k := range n {
		tt := float64(k) * cfg.Step
		u, d := cfg.Sun.Position(jd0 + tt/86400)
		lit, _ := illum.ShadowConical(prop.StateAt(tt).R, r3.Scale(d, u))
		q := ephem.AUKm / d
		sum += ephem.SolarIrradiance1AU * q * q * lit * math.Min(cfg.Step, cfg.Duration-tt)
	}
	want := a * eta * f * sum / cfg.Duration
	if math.Abs(p.MeanW-want) > 1e-9*want {
		t.Errorf("orbit-average power %.9f W, closed form %.9f W", p.MeanW, want)
	}
	t.Logf("sun-pointing 0.06 m² panel: orbit average %.6f W (closed form %.6f W, relative %.1e), peak %.4f W, %d orbits, %.4f Wh per orbit (worst %.4f), longest no-power %.0f s, gap %.4f Wh",
		p.MeanW, want, (p.MeanW-want)/want, p.PeakW, p.Orbits, p.OrbitMeanWh, p.OrbitWorstWh, p.LongestNoPowerS, p.GapEnergyWh)
	if p.LongestNoPowerS < 0.9*res.EclipseStats.MaxS || p.LongestNoPowerS > res.EclipseStats.MaxS+cfg.Step {
		t.Errorf("longest no-power span %.0f s against the longest eclipse %.0f s", p.LongestNoPowerS, res.EclipseStats.MaxS)
	}
	if p.Orbits < 14 || !(p.OrbitWorstWh <= p.OrbitMeanWh) {
		t.Errorf("%d orbits, worst %g Wh, mean %g Wh", p.Orbits, p.OrbitWorstWh, p.OrbitMeanWh)
	}
}

// sunAt is a sun at 1 AU in a fixed ECI direction.
type sunAt struct{ u r3.Vec }

func (s sunAt) Position(float64) (r3.Vec, float64) { return s.u, ephem.AUKm }

// Body-fixed panels in nadir pointing on a circular two-body orbit, sun
// fixed at β above the orbit plane, cylindrical shadow. With u the orbit
// angle from the subsolar point, the zenith (−Z) panel sees cos β·cos u on
// the day side, so its orbit average is E·A·η·f·cos β/π; the along-track
// (+X) panel sees −cos β·sin u for u in (π, 2π) less the shadow (π−α, π+α),
// cos α = √(1 − R²/r²)/cos β, so its average is E·A·η·f·cos β·(1 + cos α)/(2π)
// (closed forms, integrals of the cosine law over the orbit).
func TestPowerNadirBodyPanelsClosedForm(t *testing.T) {
	const a = orbit.RadiusEarthKm + 550
	el := orbit.Elements{SemiMajorAxisKm: a, Inclination: 51.6 * math.Pi / 180, RAAN: 0.3}
	s0 := orbit.NewTwoBody(el).StateAt(0)
	p := r3.Unit(s0.R)
	h := r3.Unit(r3.Cross(s0.R, s0.V))
	period := orbit.Period(a)
	for _, betaDeg := range []float64{0, 20, 55} {
		beta := betaDeg * math.Pi / 180
		cfg := referenceCase(t, 1, false)
		cfg.NewPropagator = func() orbit.Propagator { return orbit.NewTwoBody(el) }
		cfg.Sun = sunAt{r3.Add(r3.Scale(math.Cos(beta), p), r3.Scale(math.Sin(beta), h))}
		cfg.Cylindrical = true
		cfg.Step = period / 3600
		cfg.Duration = 3 * period
		const area, eta, f = 0.08, 0.3, 0.9
		for _, c := range []struct {
			name   string
			normal r3.Vec
			want   float64
		}{
			{"zenith", r3.Vec{Z: -1}, math.Cos(beta) / math.Pi},
			{"along-track", r3.Vec{X: 1}, func() float64 {
				ca := math.Sqrt(1-(illum.EarthRadiusKm/a)*(illum.EarthRadiusKm/a)) / math.Cos(beta)
				if ca >= 1 {
					ca = 1 // no eclipse: the whole half orbit is lit
					return math.Cos(beta) * 2 / (2 * math.Pi)
				}
				return math.Cos(beta) * (1 + ca) / (2 * math.Pi)
			}()},
		} {
			arr, err := power.NewArray(power.Panel{Name: c.name, Normal: c.normal, AreaM2: area, Efficiency: eta, PackingFactor: f})
			if err != nil {
				t.Fatal(err)
			}
			cfg.Panels = arr
			res, err := Run(context.Background(), cfg)
			if err != nil {
				t.Fatal(err)
			}
			want := ephem.SolarIrradiance1AU * area * eta * f * c.want
			got := res.Power.MeanW
			if rel := (got - want) / want; math.Abs(rel) > 1e-3 {
				t.Errorf("β %g°, %s panel: orbit average %.5f W, closed form %.5f W (relative %.2e)", betaDeg, c.name, got, want, rel)
			} else {
				t.Logf("β %g°, %s panel: orbit average %.5f W, closed form %.5f W (relative %.2e)", betaDeg, c.name, got, want, rel)
			}
		}
	}
}

// BenchmarkReferenceDayPower runs one day at 10 s of the bench reference
// case without albedo, without and with six body panels judged at their
// centres and sampled over their areas (the power pass runs beside the
// sensor loop).
func BenchmarkReferenceDayPower(b *testing.B) {
	var panels []power.Panel
	for _, n := range []r3.Vec{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}, {Z: 1}, {Z: -1}} {
		panels = append(panels, power.Panel{Name: "p", Normal: n, AreaM2: 0.08, Efficiency: 0.3, PackingFactor: 0.9})
	}
	arr, err := power.NewArray(panels...)
	if err != nil {
		b.Fatal(err)
	}
	// The same six panels sampled over their area (8 × 8 points each) and
	// shaded by the 6U outline.
	box := []sky.Obstacle{sky.Box{Half: r3.Vec{X: 0.1132, Y: 0.05, Z: 0.183}}}
	var sized []power.Panel
	for _, p := range panels {
		c := r3.Vec{X: p.Normal.X * 0.1132, Y: p.Normal.Y * 0.05, Z: p.Normal.Z * 0.183}
		p.LitShare = sky.NewPlate(c, p.Normal, 0.1, 0.2, box).LitShare
		sized = append(sized, p)
	}
	sampled, err := power.NewArray(sized...)
	if err != nil {
		b.Fatal(err)
	}
	for _, with := range []*power.Array{nil, arr, sampled} {
		name := "sensors"
		switch with {
		case arr:
			name = "sensors+panels"
		case sampled:
			name = "sensors+sampled-panels"
		}
		b.Run(name, func(b *testing.B) {
			cfg := referenceCase(b, 1, false)
			cfg.Workers = 1
			cfg.Panels = with
			for b.Loop() {
				if _, err := Run(context.Background(), cfg); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// The power pass's step (geometry, then every panel with its obstruction
// test through the bus outline) allocates nothing.
func TestPowerStepAllocatesNothing(t *testing.T) {
	cfg := referenceCase(t, 1, false)
	box := sky.Box{Half: r3.Vec{X: 0.113, Y: 0.05, Z: 0.183}}
	o := sky.Obstructed{Position: r3.Vec{X: 0.3, Z: -0.183}, Face: r3.Vec{Z: -1}, Obstacles: []sky.Obstacle{box}}
	arr, err := power.NewArray(power.Panel{Name: "wing", Normal: r3.Vec{Z: -1}, AreaM2: 0.08, Efficiency: 0.3, PackingFactor: 0.9, LitShare: sky.NewPlate(o.Position, o.Face, 0.3, 0.2, o.Obstacles).LitShare},
		power.Panel{Name: "side", Normal: r3.Vec{X: 1}, AreaM2: 0.08, Efficiency: 0.3, PackingFactor: 0.9})
	if err != nil {
		t.Fatal(err)
	}
	cfg.Panels = arr
	g, err := newGeometry(&cfg, cfg.Array, 0, albedoTables{})
	if err != nil {
		t.Fatal(err)
	}
	tr := power.NewTracker(cfg.Step, 5700, cfg.Duration)
	k := 0
	g.step(0, nil, nil)
	if n := testing.AllocsPerRun(2000, func() {
		sg := g.step(k%1000, nil, nil)
		tr.Add(sg.t, cfg.Panels.Power(sg.sunBody, sg.direct))
		k++
	}); n != 0 {
		t.Errorf("%g allocations per power step", n)
	}
}

// The power series sits on the time series' samples, is zero in umbra
// (property: no light, no power) and its per-orbit means add up to the
// energy per orbit.
func TestPowerSeriesOnTheSeriesSamples(t *testing.T) {
	cfg := referenceCase(t, 0.5, false)
	cfg.SeriesStride = 7
	arr, err := power.NewArray(power.Panel{Name: "zenith", Normal: r3.Vec{Z: -1}, AreaM2: 0.08, Efficiency: 0.3, PackingFactor: 0.9},
		power.Panel{Name: "side", Normal: r3.Vec{X: 1}, AreaM2: 0.03, Efficiency: 0.3, PackingFactor: 0.9})
	if err != nil {
		t.Fatal(err)
	}
	cfg.Panels = arr
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	s, p := res.Nominal.Series, res.PowerSeries
	if p == nil || len(p.T) != len(s.T) || len(p.W) != len(s.T) {
		t.Fatalf("power series %+v against %d series samples", p, len(s.T))
	}
	umbra := 0
	for i := range s.T {
		if p.T[i] != s.T[i] {
			t.Fatalf("sample %d at %g s, series at %g s", i, p.T[i], s.T[i])
		}
		if s.Region[i] == illum.Umbra {
			umbra++
			if p.W[i] != 0 {
				t.Errorf("umbra at %g s: %g W", s.T[i], p.W[i])
			}
		}
	}
	if umbra == 0 {
		t.Fatal("no umbra sample: the check saw nothing")
	}
	sum := 0.0
	for _, w := range res.Power.PerOrbitW {
		sum += w
	}
	if n := len(res.Power.PerOrbitW); n != res.Power.Orbits || n == 0 ||
		math.Abs(sum/float64(n)*res.Power.PeriodS/3600-res.Power.OrbitMeanWh) > 1e-9*res.Power.OrbitMeanWh {
		t.Errorf("%d orbit means (sum %g W) against %d orbits of %g Wh", n, sum, res.Power.Orbits, res.Power.OrbitMeanWh)
	}
	cfg.SeriesStride = 0
	if res, err = Run(context.Background(), cfg); err != nil || res.PowerSeries != nil {
		t.Errorf("no series asked: power series %v, %v", res.PowerSeries, err)
	}
}

// Albedo on the panels: a nadir-facing panel in nadir pointing sees the
// sun only near the terminator, so with albedo.on_panels its power is
// mostly the Earth's reflected light. The added power equals A·η·f times
// the albedo model's irradiance on a 90° cosine view of the panel's normal
// (the same integral the sensors use, checked against numpy in
// illum/albedo), and never exceeds A·η·f·ρ·S(r)·(R/r)², the irradiance
// under a fully lit Lambertian Earth filling the nadir hemisphere (closed
// form); without the key the sum is the direct sun only.
func TestPanelAlbedoPower(t *testing.T) {
	cfg := referenceCase(t, 0.25, true)
	cfg.SeriesStride = 1
	const area, eta, f = 0.08, 0.3, 0.9
	arr, err := power.NewArray(power.Panel{Name: "nadir", Normal: r3.Vec{Z: 1}, AreaM2: area, Efficiency: eta, PackingFactor: f})
	if err != nil {
		t.Fatal(err)
	}
	cfg.Panels = arr
	direct, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	cfg.PanelAlbedo = true
	withAlb, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	if !(withAlb.Power.MeanW > direct.Power.MeanW+0.1) {
		t.Fatalf("nadir panel: %.4f W with albedo, %.4f W without", withAlb.Power.MeanW, direct.Power.MeanW)
	}
	// Independent sum of the albedo model on the panel's view.
	m, err := cfg.NewAlbedo()
	if err != nil {
		t.Fatal(err)
	}
	prop := cfg.NewPropagator()
	jd0, jdUT0 := ephem.JulianDateTT(cfg.Epoch), ephem.JulianDateUT1(cfg.Epoch)
	out := make([]albedo.Result, 1)
	r := orbit.RadiusEarthKm + 550
	bound := area * eta * f * 0.3 * ephem.SolarIrradiance1AU * 1.04 * (illum.EarthRadiusKm / r) * (illum.EarthRadiusKm / r)
	worst := 0.0
	for i, tt := range withAlb.PowerSeries.T {
		st := prop.StateAt(tt)
		u, d := cfg.Sun.Position(jd0 + tt/86400)
		m.Irradiance(out, st.R, u, d, ephem.GMST(jdUT0+tt/86400), jd0+tt/86400, []albedo.Sensor{{Normal: r3.Scale(-1/r3.Norm(st.R), st.R), HalfAngle: math.Pi / 2}})
		got := withAlb.PowerSeries.W[i] - direct.PowerSeries.W[i]
		want := area * eta * f * out[0].Irradiance
		worst = math.Max(worst, math.Abs(got-want))
		if got > bound {
			t.Fatalf("t %.0f s: albedo power %.4f W above the full-disc bound %.4f W", tt, got, bound)
		}
	}
	if worst > 1e-3*bound {
		t.Errorf("albedo power against the model's irradiance on the panel: worst difference %.3g W (bound %.3g W)", worst, bound)
	}
	t.Logf("nadir panel: %.4f W direct only, %.4f W with albedo; worst difference from the model's irradiance %.2g W; bound %.3f W",
		direct.Power.MeanW, withAlb.Power.MeanW, worst, bound)
}
