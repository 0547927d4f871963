package sim

import (
	"context"
	"fmt"
	"math"

	"codeberg.org/sunsight/sunsight/illum/power"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sky"
)

// powerPass walks the whole grid once, in time order, with the nominal
// (unit 0) attitude and the same orbit, sun, shadow and attitude code as
// the sensor loop (geometry.step; with PanelAlbedo the albedo model on each
// panel's front hemisphere, cosine response, else no albedo), and folds the array's
// power into the orbit figures; with a time series it also keeps the power
// at the series' samples, and with a timeline span at the short series'. It allocates nothing per step.
func powerPass(ctx context.Context, cfg *Config) (*power.Summary, *PowerSeries, *PowerSeries, error) {
	c := *cfg
	c.NewCorrection, c.LawForUnit, c.AlbedoResponse, c.MountNormals = nil, nil, nil, nil
	arr := cfg.Array
	var albBody []sensor.Albedo
	var albIrr []float64
	if cfg.PanelAlbedo && cfg.NewAlbedo != nil {
		var err error
		if arr, err = panelViews(cfg.Panels); err != nil {
			return nil, nil, nil, err
		}
		albBody = make([]sensor.Albedo, arr.Len())
		albIrr = make([]float64, arr.Len())
	} else {
		c.NewAlbedo = nil
	}
	g, err := newGeometry(&c, arr, 0, albedoTables{})
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
		sg := g.step(k, albBody, nil)
		p := cfg.Panels.Power(sg.sunBody, sg.direct)
		if albIrr != nil {
			for i := range albBody {
				albIrr[i] = albBody[i].Irradiance
			}
			p += cfg.Panels.AlbedoPower(albIrr)
		}
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

// panelViews stands each panel in for a cosine sensor of its normal and a
// 90° half angle, so the geometry's albedo model gives the albedo
// irradiance on its plane (W/m²). The body's shading of albedo rays is not
// modelled.
func panelViews(a *power.Array) (*sensor.Array, error) {
	var ss []sensor.Sensor
	for _, p := range a.Panels {
		u, _ := sky.PlateAxes(p.Normal)
		m, err := sensor.VectorMount(p.Normal, u)
		if err != nil {
			return nil, fmt.Errorf("sim: panel %q: %w", p.Name, err)
		}
		c, err := sensor.NewCosine(sensor.CosineSpec{Name: p.Name, Mount: m, HalfAngle: math.Pi / 2})
		if err != nil {
			return nil, fmt.Errorf("sim: panel %q: %w", p.Name, err)
		}
		ss = append(ss, c)
	}
	return sensor.NewArray(ss...)
}
