package sim

import (
	"context"

	"codeberg.org/sunsight/sunsight/illum/power"
)

// powerPass walks the whole grid once, in time order, with the nominal
// (unit 0) attitude and the same orbit, sun, shadow and attitude code as
// the sensor loop (geometry.step without albedo), and folds the array's
// power into the orbit figures; with a time series it also keeps the power
// at the series' samples, and with a timeline span at the short series'. It allocates nothing per step.
func powerPass(ctx context.Context, cfg *Config) (*power.Summary, *PowerSeries, *PowerSeries, error) {
	c := *cfg
	c.NewAlbedo, c.NewCorrection, c.LawForUnit = nil, nil, nil
	g, err := newGeometry(&c, cfg.Array, 0, albedoTables{})
	if err != nil {
		return nil, nil, nil, err
	}
	steps := cfg.Steps()
	var ser *PowerSeries
	stride := cfg.SeriesStride
	if stride > 0 {
		n := (steps-1)/stride + 1
		ser = &PowerSeries{T: make([]float64, 0, n), W: make([]float64, 0, n)}
	}
	var short *PowerSeries
	if cfg.TimelineSpan > 0 {
		n := int(cfg.TimelineSpan/cfg.Step)/cfg.TimelineStride + 1
		short = &PowerSeries{T: make([]float64, 0, n), W: make([]float64, 0, n)}
	}
	tr := power.NewTracker(cfg.Step, orbitPeriod(cfg.NewPropagator().StateAt(0)), cfg.Duration)
	for k := range steps {
		if k&4095 == 0 && ctx.Err() != nil {
			return nil, nil, nil, ctx.Err()
		}
		sg := g.step(k, nil, nil)
		p := cfg.Panels.Power(sg.sunBody, sg.direct)
		tr.Add(sg.t, p)
		if ser != nil && k%stride == 0 {
			ser.T = append(ser.T, sg.t)
			ser.W = append(ser.W, p)
		}
		if short != nil && sg.t <= cfg.TimelineSpan && k%cfg.TimelineStride == 0 {
			short.T = append(short.T, sg.t)
			short.W = append(short.W, p)
		}
	}
	s := tr.Finish()
	return &s, ser, short, nil
}
