package sim

import (
	"context"
	"fmt"
	"math/rand/v2"
	"runtime"
	"sync"
	"sync/atomic"
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
	pred    [][]sensor.Albedo // the on-board model's prediction; nil without one
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
	g, err := newGeometry(&cfg, cfg.Array, 0, albedoTables{})
	if err != nil {
		return nil, err
	}
	n := cfg.Array.Len()
	if cfg.NewAlbedo != nil {
		tr.albedo = perStep(steps, n)
		if cfg.NewCorrection != nil {
			tr.pred = perStep(steps, n)
		}
	}
	scratch := make([]sensor.Albedo, n)
	for k := range steps {
		if k&1023 == 0 && ctx.Err() != nil {
			return nil, ctx.Err()
		}
		alb, pred := scratch, scratch
		if tr.albedo != nil {
			alb = tr.albedo[k]
		}
		if tr.pred != nil {
			pred = tr.pred[k]
		}
		tr.geom[k] = g.step(k, alb, pred)
	}
	return tr, nil
}

// perStep returns steps rows of n albedo values over one backing array.
func perStep(steps, n int) [][]sensor.Albedo {
	rows := make([][]sensor.Albedo, steps)
	flat := make([]sensor.Albedo, steps*n)
	for k := range rows {
		rows[k] = flat[k*n : (k+1)*n : (k+1)*n]
	}
	return rows
}

// TraceBytes is the memory NewTrace(cfg) keeps: every step's geometry and,
// with an albedo model, each candidate's albedo (and the on-board model's
// prediction of it).
func TraceBytes(cfg *Config) int64 {
	per := int64(unsafe.Sizeof(stepGeom{}))
	if cfg.NewAlbedo != nil && cfg.Array != nil {
		per += int64(cfg.Array.Len()) * int64(unsafe.Sizeof(sensor.Albedo{}))
		if cfg.NewCorrection != nil {
			per += int64(cfg.Array.Len()) * int64(unsafe.Sizeof(sensor.Albedo{}))
		}
	}
	return int64(cfg.Steps()) * per
}

// Run scores the subset of candidates (indices into the trace's sensor
// list) with the given estimators over units Monte Carlo units, as Run would
// with only those sensors flown, without the gyro-aided filter (a layout
// search scores by the point estimators). The result's eclipses are the
// trace's.
func (tr *Trace) Run(ctx context.Context, subset []int, ests []sensor.Estimator, units int) (*Result, error) {
	return tr.run(ctx, subset, ests, units, false)
}

// RunWithFilter is Run with the trace's gyro-aided filter (Config.Filter)
// flown on the subset's readings, as Run would fly it: the single-failure
// study reports the filter of each reduced layout.
func (tr *Trace) RunWithFilter(ctx context.Context, subset []int, ests []sensor.Estimator, units int) (*Result, error) {
	return tr.run(ctx, subset, ests, units, true)
}

func (tr *Trace) run(ctx context.Context, subset []int, ests []sensor.Estimator, units int, withFilter bool) (*Result, error) {
	if len(subset) == 0 {
		return nil, fmt.Errorf("sim: empty sensor subset")
	}
	if len(ests) == 0 {
		return nil, fmt.Errorf("sim: no estimator")
	}
	cfg := tr.cfg
	var ss []sensor.Sensor
	var viewers []sky.Viewer
	var blocked []*sky.Obstructed
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
	if !withFilter {
		cfg.Filter = nil
	}
	return tr.replay(ctx, &cfg, subset, units, 1)
}

// RunArray replays the whole layout with another array of the same sensors
// (the candidates in order, same kinds, mounts and fields of view, other
// error models: a case of an error budget), as Run would with that array
// flown. withAlbedo false replays without albedo. The units are shared out
// over the trace's workers; each unit's numbers are its own, so the result
// does not depend on their number.
func (tr *Trace) RunArray(ctx context.Context, arr *sensor.Array, withAlbedo bool, units int) (*Result, error) {
	if arr == nil || arr.Len() != len(tr.sensors) {
		return nil, fmt.Errorf("sim: replay with another array: want the %d sensors of the trace", len(tr.sensors))
	}
	for i, s := range arr.Sensors() {
		c := tr.sensors[i]
		if s.Kind() != c.Kind() || s.Mount().Boresight() != c.Mount().Boresight() || s.HalfAngle() != c.HalfAngle() {
			return nil, fmt.Errorf("sim: replay with another array: sensor %d (%s) differs from the trace's %s in kind, mount or field of view", i, s.Name(), c.Name())
		}
	}
	if withAlbedo && tr.albedo == nil {
		return nil, fmt.Errorf("sim: replay with albedo of a trace recorded without")
	}
	cfg := tr.cfg
	cfg.Array = arr
	if !withAlbedo {
		cfg.NewAlbedo, cfg.NewCorrection = nil, nil
	}
	cfg.Filter = nil // a budget case scores the point estimators
	all := make([]int, arr.Len())
	for i := range all {
		all[i] = i
	}
	return tr.replay(ctx, &cfg, all, units, cfg.Workers)
}

// replay reads units Monte Carlo units of cfg.Array, whose sensor j is the
// trace's candidate subset[j], over the recorded geometry, on up to workers
// goroutines (≤ 0: GOMAXPROCS). A layout search replays many subsets at
// once and asks for one each.
func (tr *Trace) replay(ctx context.Context, cfg *Config, subset []int, units, workers int) (*Result, error) {
	*cfg = cfg.Lean()
	res := tr.result
	units = max(units, 1)
	res.Units = make([]*UnitResult, units)
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	var next atomic.Int64
	var wg sync.WaitGroup
	errs := make([]error, units)
	for range min(workers, units) {
		wg.Go(func() {
			albSub := make([]sensor.Albedo, len(subset))
			predSub := make([]sensor.Albedo, len(subset))
			for {
				u := int(next.Add(1) - 1)
				if u >= units {
					return
				}
				drawSrc, _ := unitSeed(cfg.Seed, u)
				ua := cfg.Array.Draw(rand.New(drawSrc))
				r := newReader(cfg, ua, u, 0)
				vw := newViewer(cfg, ua)
				for k := range tr.geom {
					if k&1023 == 0 && ctx.Err() != nil {
						errs[u] = ctx.Err()
						return
					}
					if tr.albedo != nil && cfg.NewAlbedo != nil {
						for j, i := range subset {
							albSub[j] = tr.albedo[k][i]
						}
					}
					if tr.pred != nil && cfg.NewCorrection != nil {
						for j, i := range subset {
							predSub[j] = tr.pred[k][i]
						}
					}
					r.step(k, &tr.geom[k], vw.at(&tr.geom[k], albSub, predSub))
				}
				vw.addCounts(r.acc)
				r.acc.end(float64(len(tr.geom)) * cfg.Step)
				if r.filt != nil {
					r.acc.filter = r.filt.result(float64(len(tr.geom)) * cfg.Step)
				}
				r.acc.finish()
				res.Units[u] = r.acc.result()
			}
		})
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	if err := ctx.Err(); err != nil {
		return nil, err
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
