package properties

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/power"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// casePanels is a panel on each of the six faces and a canted plate off the
// +X face, sampled over its area and shaded by the case's bus outline and
// obstructions; areas and efficiencies are multiplied by kA and kEta.
func casePanels(c *runCase, kA, kEta float64) *power.Array {
	obs := study.Obstacles(c.b.s)
	half := r3.Scale(0.5, c.b.s.Body.SizeM)
	var ps []power.Panel
	for _, n := range []r3.Vec{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}, {Z: 1}, {Z: -1}} {
		ps = append(ps, power.Panel{Name: "face", Normal: n, AreaM2: 0.03 * kA, Efficiency: 0.3 * kEta, PackingFactor: 0.9})
	}
	n := r3.Unit(r3.Vec{X: 0.8, Z: -0.6})
	at := r3.Add(r3.Vec{X: half.X + 0.05}, r3.Scale(0.01, n))
	ps = append(ps, power.Panel{Name: "canted", Normal: n, AreaM2: 0.02 * kA, Efficiency: 0.28 * kEta, PackingFactor: 0.85,
		LitShare: sky.NewPlate(at, n, 0.2, 0.1, obs).LitShare})
	arr, err := power.NewArray(ps...)
	if err != nil {
		c.t.Fatal(err)
	}
	return arr
}

// Array power is zero at every umbra sample (no light, no power), never
// negative, and linear in the panel areas and efficiencies: areas ×2.5 and
// efficiencies ×0.6 scale the orbit average, the peak and every orbit's
// mean by 1.5 (closed form of the cosine law), with the same attitude,
// shadow and shading.
func checkPowerUmbraAndLinear(c *runCase) (f failures) {
	runWith := func(kA, kEta float64) *sim.Result {
		_, r := c.rerun(func(b *built) bool {
			cfg := b.cfg
			cfg.Units = 1
			cfg.SeriesStride = 1
			cfg.Panels = casePanels(c, kA, kEta)
			b.cfg = cfg
			return true
		})
		return r
	}
	a, b := runWith(1, 1), runWith(2.5, 0.6)
	s, p := a.Nominal.Series, a.PowerSeries
	if p == nil || len(p.W) != len(s.T) {
		f.addf("power series missing or of %d samples for %d", len(p.W), len(s.T))
		return f
	}
	for i := range s.T {
		switch {
		case p.W[i] < 0 || math.IsNaN(p.W[i]):
			f.addf("t %.0f s: power %g W", s.T[i], p.W[i])
		case s.Region[i] == illum.Umbra && p.W[i] != 0:
			f.addf("t %.0f s in umbra: power %g W", s.T[i], p.W[i])
		}
		if q := b.PowerSeries.W[i]; math.Abs(q-1.5*p.W[i]) > 1e-12*(1+p.W[i]) {
			f.addf("t %.0f s: %g W with areas ×2.5 and efficiencies ×0.6, want 1.5 × %g W", s.T[i], q, p.W[i])
		}
	}
	pa, pb := a.Power, b.Power
	for _, v := range [][2]float64{{pa.MeanW, pb.MeanW}, {pa.PeakW, pb.PeakW}} {
		if math.Abs(v[1]-1.5*v[0]) > 1e-12*(1+v[0]) {
			f.addf("orbit average or peak %g W scaled to %g W, want ×1.5", v[0], v[1])
		}
	}
	for i := range pa.PerOrbitW {
		if math.Abs(pb.PerOrbitW[i]-1.5*pa.PerOrbitW[i]) > 1e-12*(1+pa.PerOrbitW[i]) {
			f.addf("orbit %d: %g W scaled to %g W, want ×1.5", i+1, pa.PerOrbitW[i], pb.PerOrbitW[i])
		}
	}
	return f
}
