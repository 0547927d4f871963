package properties

import (
	"fmt"
	"math"

	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// The gyro-aided filter's figures are consistent (definitions): shares in
// [0, 1] and equal to their sample counts, percentiles ordered, held
// outages no more than the outages, no spell longer than the run; without
// a gyro_filter block there are none.
func checkFilterFigures(c *runCase) (f failures) {
	for _, u := range c.res.Units {
		g := u.Filter
		if !c.b.s.GyroFilter.Set {
			if g != nil {
				f.addf("unit %d: filter figures without a gyro_filter block", u.Unit)
			}
			continue
		}
		if g == nil {
			f.addf("unit %d: no filter figures with a gyro_filter block", u.Unit)
			continue
		}
		shadow := int(math.Round((1 - u.SunlitFraction) * float64(u.Samples)))
		for _, v := range []float64{g.ValidFraction, g.ValidShadowFraction} {
			if v < 0 || v > 1 {
				f.addf("unit %d: filter valid share %g outside [0, 1]", u.Unit, v)
			}
		}
		if got, want := g.Err.N, int(math.Round(g.ValidFraction*float64(u.Samples))); got != want {
			f.addf("unit %d: %d filter error samples, %d valid samples", u.Unit, got, want)
		}
		if shadow > 0 {
			if got, want := g.ErrShadow.N, int(math.Round(g.ValidShadowFraction*float64(shadow))); got != want {
				f.addf("unit %d: %d filter error samples in shadow, %d valid shadow samples", u.Unit, got, want)
			}
		}
		if g.HoldLastShadow.N > shadow {
			f.addf("unit %d: held estimate over %d shadow samples of %d", u.Unit, g.HoldLastShadow.N, shadow)
		}
		for name, e := range map[string]sim.ErrorStats{"error": g.Err, "error in shadow": g.ErrShadow, "held estimate": g.HoldLastShadow} {
			if e.N > 0 && !(e.P50Deg <= e.P95Deg && e.P95Deg <= e.P99Deg && e.P99Deg <= e.MaxDeg && e.MaxDeg <= 180) {
				f.addf("unit %d: filter %s percentiles not ordered: %+v", u.Unit, name, e)
			}
		}
		if g.OutagesHeld > g.Outages {
			f.addf("unit %d: %d outages held of %d", u.Unit, g.OutagesHeld, g.Outages)
		}
		dur := c.b.cfg.Duration
		if g.LongestHeldS > dur+1e-9 || g.ShortestBreakS > dur+1e-9 {
			f.addf("unit %d: longest held %g s or shortest break %g s beyond the run's %g s", u.Unit, g.LongestHeldS, g.ShortestBreakS, dur)
		}
	}
	return f
}

// Turning the filter off changes none of the point estimators' figures: it
// reads the same readings and draws its gyro from a stream of its own.
func checkFilterLeavesEstimators(c *runCase) (f failures) {
	if c.b.cfg.Filter == nil {
		return f
	}
	_, res := c.rerun(func(b *built) bool {
		b.cfg.Filter = nil
		return true
	})
	for i, u := range res.Units {
		for j, e := range u.Estimators {
			a := c.res.Units[i].Estimators[j]
			if fmt.Sprint(a.ValidFraction, a.ErrNoAlbedo, a.ErrAlbedo, a.NumGaps, a.GapLengths) != fmt.Sprint(e.ValidFraction, e.ErrNoAlbedo, e.ErrAlbedo, e.NumGaps, e.GapLengths) {
				f.addf("unit %d %s: figures change when the filter is turned off", u.Unit, e.Name)
			}
		}
	}
	return f
}
