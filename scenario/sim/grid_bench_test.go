package sim

import (
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/orbit"
)

// BenchmarkGridYear fills one year at 10 s (3.15 M steps) with the j2-mean
// state and the low-precision sun, as the step loop does: the sun from the
// 10-minute interpolation (sunCache) and, for comparison, evaluated every
// step.
func BenchmarkGridYear(b *testing.B) {
	el := orbit.Elements{SemiMajorAxisKm: 6928.137, Inclination: 1.7033, RAAN: 4.5}
	const steps = 365 * 8640
	jd0 := 2461406.5
	b.Run("interpolated-sun", func(b *testing.B) {
		p := orbit.NewJ2Mean(el)
		for b.Loop() {
			c := newSunCache(ephem.LowPrecision{}, jd0)
			var acc r3.Vec
			for k := range steps {
				t := float64(k) * 10
				s := p.StateAt(t)
				u, _ := c.at(t)
				acc = r3.Add(acc, r3.Add(s.R, u))
			}
			sink = acc
		}
	})
	b.Run("sun-every-step", func(b *testing.B) {
		p := orbit.NewJ2Mean(el)
		for b.Loop() {
			var acc r3.Vec
			for k := range steps {
				t := float64(k) * 10
				s := p.StateAt(t)
				u, _ := ephem.LowPrecision{}.Position(jd0 + t/86400)
				acc = r3.Add(acc, r3.Add(s.R, u))
			}
			sink = acc
		}
	})
}

var sink r3.Vec
