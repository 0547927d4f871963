package sim

import (
	"context"
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/power"
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
	// Independent sum: S₀(AU/r)²·lit per step.
	prop := cfg.NewPropagator()
	jd0 := ephem.JulianDateTT(cfg.Epoch)
	var sum float64
	n := cfg.Steps()
	for k := range n {
		tt := float64(k) * cfg.Step
		u, d := cfg.Sun.Position(jd0 + tt/86400)
		lit, _ := illum.ShadowConical(prop.StateAt(tt).R, r3.Scale(d, u))
		q := ephem.AUKm / d
		sum += ephem.SolarIrradiance1AU * q * q * lit
	}
	want := a * eta * f * sum / float64(n)
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
