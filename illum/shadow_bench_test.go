package illum

import (
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// orbitDay samples the 550 km 10:30 sun-synchronous orbit of the season
// tests every 10 s for a day: a realistic mix of day side, night side and
// shadow edges (about a third of the samples in shadow).
func orbitDay() (sat, sun []r3.Vec) {
	orb := sso(550, 10.5)
	for t := 0.0; t < 86400; t += 10 {
		sat = append(sat, orb.pos(t))
		sun = append(sun, almanacSun(t))
	}
	return sat, sun
}

var sinkLit float64

// BenchmarkShadowConicalOrbit compares the fast and the exact conical
// shadow, per call, on the same samples.
func BenchmarkShadowConicalOrbit(b *testing.B) {
	sat, sun := orbitDay()
	undecided := 0
	for i := range sat {
		if _, ok := clearRegion(sat[i], sun[i]); !ok {
			undecided++
		}
	}
	for _, c := range []struct {
		name string
		f    func(r3.Vec, r3.Vec) (float64, Region)
	}{
		{"fast", ShadowConical},
		{"exact", shadowConicalExact},
	} {
		b.Run(c.name, func(b *testing.B) {
			var sum float64
			i := 0
			for b.Loop() {
				lit, _ := c.f(sat[i], sun[i])
				sum += lit
				if i++; i == len(sat) {
					i = 0
				}
			}
			sinkLit = sum
			b.ReportMetric(float64(undecided)/float64(len(sat)), "undecided/sample")
		})
	}
}
