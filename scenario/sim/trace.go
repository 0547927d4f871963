package sim

import (
	"context"
	"fmt"
	"math/rand/v2"
	"unsafe"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sky"
)

// Trace is the recorded geometry of a run — every step's shadow, attitude,
// sun direction and each candidate sensor's albedo — which does not depend
// on which of the candidates fly. A layout search records it once per
// attitude mode and then scores many sensor subsets by replaying only the
// sensor stage, a small fraction of the cost of a full run.
type Trace struct {
	cfg     Config // Array, Viewers, Blocked, AlbedoResponse: all candidates
	geom    []stepGeom
	albedo  [][]sensor.Albedo // [step][candidate]; nil without albedo
	result  Result            // eclipses of the span
	sensors []sensor.Sensor
}

// NewTrace records the geometry of cfg for all of cfg.Array's sensors (the
// candidates). Memory grows with steps × candidates: meant for the short
// spans of a layout search (days, not years).
func NewTrace(ctx context.Context, cfg Config) (*Trace, error) {
	if err := cfg.Validate(); err != nil {
		return nil, err
	}
	if cfg.LawForUnit != nil {
		return nil, fmt.Errorf("sim: a trace needs one attitude for every unit (the law is redrawn per unit)")
	}
	steps := cfg.Steps()
	tr := &Trace{cfg: cfg, geom: make([]stepGeom, steps), sensors: cfg.Array.Sensors()}
	tr.result.Steps, tr.result.StepS, tr.result.DurationS = steps, cfg.Step, cfg.Duration
	tr.result.Eclipses, tr.result.EclipseStats = eclipses(&cfg)
	g, err := newGeometry(&cfg, cfg.Array, 0, nil)
	if err != nil {
		return nil, err
	}
	n := cfg.Array.Len()
	if cfg.NewAlbedo != nil {
		tr.albedo = make([][]sensor.Albedo, steps)
		flat := make([]sensor.Albedo, steps*n)
		for k := range tr.albedo {
			tr.albedo[k] = flat[k*n : (k+1)*n : (k+1)*n]
		}
	}
	scratch := make([]sensor.Albedo, n)
	for k := range steps {
		if k&1023 == 0 && ctx.Err() != nil {
			return nil, ctx.Err()
		}
		alb := scratch
		if tr.albedo != nil {
			alb = tr.albedo[k]
		}
		tr.geom[k] = g.step(k, alb)
	}
	return tr, nil
}

// TraceBytes is the memory NewTrace(cfg) keeps: every step's geometry and,
// with an albedo model, each candidate's albedo.
func TraceBytes(cfg *Config) int64 {
	per := int64(unsafe.Sizeof(stepGeom{}))
	if cfg.NewAlbedo != nil && cfg.Array != nil {
		per += int64(cfg.Array.Len()) * int64(unsafe.Sizeof(sensor.Albedo{}))
	}
	return int64(cfg.Steps()) * per
}

// Run scores the subset of candidates (indices into the trace's sensor
// list) with the given estimators over units Monte Carlo units, as Run would
// with only those sensors flown. The result's eclipses are the trace's.
func (tr *Trace) Run(ctx context.Context, subset []int, ests []sensor.Estimator, units int) (*Result, error) {
	if len(subset) == 0 {
		return nil, fmt.Errorf("sim: empty sensor subset")
	}
	if len(ests) == 0 {
		return nil, fmt.Errorf("sim: no estimator")
	}
	cfg := tr.cfg
	var ss []sensor.Sensor
	var viewers []sky.Viewer
	var blocked []func(dirBody r3.Vec) bool
	var normals []r3.Vec
	for _, i := range subset {
		if i < 0 || i >= len(tr.sensors) {
			return nil, fmt.Errorf("sim: candidate %d out of range [0, %d)", i, len(tr.sensors))
		}
		ss = append(ss, tr.sensors[i])
		if cfg.Viewers != nil {
			viewers = append(viewers, cfg.Viewers[i])
		}
		if cfg.Blocked != nil {
			blocked = append(blocked, cfg.Blocked[i])
		}
		if cfg.MountNormals != nil {
			normals = append(normals, cfg.MountNormals[i])
		}
	}
	arr, err := sensor.NewArray(ss...)
	if err != nil {
		return nil, err
	}
	cfg.Array, cfg.Viewers, cfg.Blocked, cfg.Estimators = arr, viewers, blocked, ests
	cfg.Gates = gatesFor(tr.cfg, ests)
	cfg.MountNormals = normals
	cfg.SeriesStride, cfg.SunTrackPoints = 0, 0
	// Subsets are scored by their point estimators; the filter is the
	// full run's.
	cfg.Filter = nil
	res := tr.result
	res.Units = nil
	albSub := make([]sensor.Albedo, len(subset))
	for u := range max(units, 1) {
		drawSrc, _ := unitSeed(cfg.Seed, u)
		ua := arr.Draw(rand.New(drawSrc))
		r := newReader(&cfg, ua, u, 0)
		vw := newViewer(&cfg, ua)
		for k := range tr.geom {
			if k&1023 == 0 && ctx.Err() != nil {
				return nil, ctx.Err()
			}
			if tr.albedo != nil {
				for j, i := range subset {
					albSub[j] = tr.albedo[k][i]
				}
			}
			r.step(k, &tr.geom[k], vw.at(&tr.geom[k], albSub))
		}
		r.acc.end(float64(len(tr.geom)) * cfg.Step)
		r.acc.finish()
		res.Units = append(res.Units, r.acc.result())
	}
	res.Nominal = res.Units[0]
	res.AcrossUnits = acrossUnits(res.Units)
	return &res, nil
}

// gatesFor gives each estimator the validity gate the trace's configuration
// set for an estimator of that name, else its default gate.
func gatesFor(c Config, ests []sensor.Estimator) []sensor.Gate {
	if c.Gates == nil {
		return nil
	}
	out := make([]sensor.Gate, len(ests))
	for j, e := range ests {
		out[j] = sensor.DefaultGate(e.Name())
		for i, ce := range c.Estimators {
			if ce.Name() == e.Name() {
				out[j] = c.Gates[i]
			}
		}
	}
	return out
}
