package sim

import (
	"context"

	"codeberg.org/sunsight/sunsight/illum/power"
)

// powerPass walks the whole grid once, in time order, with the nominal
// (unit 0) attitude and the same orbit, sun, shadow and attitude code as
// the sensor loop (geometry.step without albedo), and folds the array's
// power into the orbit figures. It allocates nothing per step.
func powerPass(ctx context.Context, cfg *Config) (*power.Summary, error) {
	c := *cfg
	c.NewAlbedo, c.NewCorrection, c.LawForUnit = nil, nil, nil
	g, err := newGeometry(&c, cfg.Array, 0, nil)
	if err != nil {
		return nil, err
	}
	steps := cfg.Steps()
	tr := power.NewTracker(cfg.Step, orbitPeriod(cfg.NewPropagator().StateAt(0)), cfg.Duration)
	for k := range steps {
		if k&4095 == 0 && ctx.Err() != nil {
			return nil, ctx.Err()
		}
		sg := g.step(k, nil)
		tr.Add(sg.t, cfg.Panels.Power(sg.sunBody, sg.direct))
	}
	s := tr.Finish()
	return &s, nil
}
