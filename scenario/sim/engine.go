package sim

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"reflect"
	"runtime"
	"sync"
	"sync/atomic"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/power"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/internal/vecmath"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// Config is everything one simulation needs, already built into physics
// objects. The scenario package fills it from a scenario file.
type Config struct {
	Epoch    time.Time
	Duration float64 // s
	Step     float64 // s

	// NewPropagator returns a fresh propagator positioned at the epoch; it is
	// called once per simulated unit and once for the eclipse search, since
	// numerical propagators keep state.
	NewPropagator func() orbit.Propagator
	Sun           ephem.Sun
	// Cylindrical selects the cylindrical shadow instead of the conical one,
	// for the sampled fractions and the eclipse events alike.
	Cylindrical bool
	Law         attitude.Law
	// LawForUnit, when set, gives each Monte Carlo unit its own attitude
	// (for example a tumble with its own tip-off draw); unit 0 must get Law.
	LawForUnit func(u int) attitude.Law

	// Array is the nominal sensor layout; Viewers[i] says whether sensor i
	// sees a body direction (field of view and obstructions). When Viewers is
	// nil the sensors' own SeesSun is used (signal from direct sun above
	// threshold).
	Array   *sensor.Array
	Viewers []sky.Viewer
	// Blocked[i], when set, says whether the body blocks sensor i's view
	// of a body direction (its Hidden: the mounting plane and the
	// obstructions): its direct sunlight and its albedo are cut there. Nil
	// means nothing is in the way.
	Blocked []*sky.Obstructed

	// NewAlbedo returns a fresh albedo model (models keep scratch buffers);
	// nil means no albedo. AlbedoResponse[i] is sensor i's angular response
	// for the albedo integral (zero value: cosine).
	NewAlbedo      func() (*albedo.Model, error)
	AlbedoResponse []albedo.Response
	// MountNormals[i], when not zero, is the outward normal (body axes) of
	// the surface sensor i sits on: the albedo integral of a sensor whose
	// cone reaches behind that plane is clipped by it. Nil: no clipping.
	MountNormals []r3.Vec

	// NewCorrection, when set with NewAlbedo, is the on-board albedo
	// model: the flight software subtracts its prediction from the
	// realistic readings of the sensors that take it (AlbedoSubtracter:
	// the cosine kind) and the estimators run a third time on the result,
	// beside the readings without albedo and with it (EstimatorStats.
	// Corrected). The prediction is made on the true position, sun and
	// attitude: the residual isolates the model's error from navigation
	// errors. Two-axis sensors pass uncorrected.
	NewCorrection func() (*albedo.Model, error)
	// NoAlbedoTable turns off the precomputed albedo table that long
	// nadir-pointing runs with a uniform albedo use instead of the cell
	// integral (see albedotable.go).
	NoAlbedoTable bool
	// onePiece runs the grid as one piece from the epoch (tests: the
	// reference the pieces must equal).
	onePiece bool

	// Estimators are run side by side on the same readings; the first one is
	// the primary, used for validity gaps and the time series.
	Estimators []sensor.Estimator
	// Gates[j] is the validity gate estimator j's estimates pass (minimum
	// sensors, minimum total signal, maximum fit residual); nil lets every
	// estimate the estimators find through.
	Gates []sensor.Gate
	// FalseSunBoundDeg is the error (deg) beyond which a valid estimate or
	// a valid two-axis reading in sunlight counts as a false sun; 0 means
	// DefaultFalseSunBoundDeg.
	FalseSunBoundDeg float64

	// Seed drives every random draw. Units is the number of simulated units
	// of the sensor error models (1 = the nominal unit with noise only if
	// the error model has noise). Workers bounds the parallel units (0 =
	// GOMAXPROCS).
	Seed    uint64
	Units   int
	Workers int
	// GapListUnits is the number of units, from unit 0, whose sunlit gaps
	// are kept as a list (EstimatorStats.Gaps, for a table of gaps); the
	// other units keep their number, longest and lengths in memory flat in
	// the duration.
	GapListUnits int

	// SeriesStride > 0 keeps every SeriesStride-th step of unit 0 as a time
	// series; SunTrackPoints bounds the body-frame sun track kept for unit 0.
	SeriesStride   int
	SunTrackPoints int
	// SeriesSink, when set with SeriesStride > 0, receives unit 0's time
	// series as the run goes, piece by piece in time order, each piece
	// once, with the panels' power at its samples (nil without Panels);
	// the result then keeps no series (Nominal.Series nil), so memory
	// stays flat in the duration. It is called from one goroutine at a
	// time; an error it returns ends the run with that error. A piece is
	// the sink's only during the call (the engine reuses it). With
	// Panels the power pass runs before the step loop, so that each piece
	// has its power.
	SeriesSink func(piece *Series, powerW []float64) error
	// TimelineSpan > 0 keeps, besides the series, a short series of unit 0
	// over its first TimelineSpan seconds, one step in TimelineStride: what
	// a timeline figure shows, so the review needs neither a full series
	// nor a second run.
	TimelineSpan   float64
	TimelineStride int
	// Season, when set, asks for the eclipse-season table of the orbit
	// (Result.Season), with the run's sun and shadow models.
	Season *SeasonRequest

	// Filter, when set, runs the gyro-aided sun-direction filter beside
	// the estimators (UnitResult.Filter). A filter runs forward from the
	// epoch, so each unit then runs in one piece.
	Filter *FilterConfig

	// Panels, when set, are the solar panels whose power is followed over
	// the run with the nominal attitude (Result.Power).
	Panels *power.Array
	// PanelAlbedo adds to the panels' power the Earth albedo on each panel's
	// front hemisphere (the run's albedo model, cosine response); false: the
	// direct sun only.
	PanelAlbedo bool

	// Progress, when not nil, is called from the unit-0 loop with the
	// fraction done; it must be cheap.
	Progress func(done float64)
}

// Lean returns a copy of c that keeps nothing for figures or files (no
// series, sun track, short series, season table or list of gaps) and reports no
// progress: the extra runs of a study (phases, single failures, replays),
// whose figures come from the primary run.
func (c Config) Lean() Config {
	c.SeriesStride, c.SunTrackPoints, c.TimelineSpan, c.TimelineStride, c.Season, c.Progress = 0, 0, 0, 0, nil, nil
	c.SeriesSink = nil
	c.GapListUnits = 0
	return c
}

// DefaultFalseSunBoundDeg is the default false-sun bound: 20°, well beyond
// the few degrees of albedo bias of a coarse sensor, so an estimate that far
// off points the spacecraft at the wrong thing (common practice, no source).
const DefaultFalseSunBoundDeg = 20.0

func (c *Config) falseSunBoundDeg() float64 {
	if c.FalseSunBoundDeg > 0 {
		return c.FalseSunBoundDeg
	}
	return DefaultFalseSunBoundDeg
}

// Validate checks the fields a caller can get wrong.
func (c *Config) Validate() error {
	switch {
	case c.NewPropagator == nil:
		return errors.New("sim: no propagator")
	case c.Sun == nil:
		return errors.New("sim: no sun model")
	case c.Law == nil:
		return errors.New("sim: no attitude law")
	case c.Array == nil || c.Array.Len() == 0:
		return errors.New("sim: no sensors")
	case !(c.Step > 0) || !(c.Duration >= c.Step):
		return fmt.Errorf("sim: step %g s and duration %g s: need 0 < step ≤ duration", c.Step, c.Duration)
	case !(c.FalseSunBoundDeg >= 0 && c.FalseSunBoundDeg < 180):
		return fmt.Errorf("sim: false-sun bound %g°: want [0°, 180°) (0 = default %g°)", c.FalseSunBoundDeg, DefaultFalseSunBoundDeg)
	case c.Gates != nil && len(c.Gates) != len(c.Estimators):
		return fmt.Errorf("sim: %d validity gates for %d estimators", len(c.Gates), len(c.Estimators))
	case len(c.Estimators) == 0:
		return errors.New("sim: no estimator")
	case c.Viewers != nil && len(c.Viewers) != c.Array.Len():
		return fmt.Errorf("sim: %d viewers for %d sensors", len(c.Viewers), c.Array.Len())
	case c.Blocked != nil && len(c.Blocked) != c.Array.Len():
		return fmt.Errorf("sim: %d obstruction tests for %d sensors", len(c.Blocked), c.Array.Len())
	case c.MountNormals != nil && len(c.MountNormals) != c.Array.Len():
		return fmt.Errorf("sim: %d mount normals for %d sensors", len(c.MountNormals), c.Array.Len())
	case c.AlbedoResponse != nil && len(c.AlbedoResponse) != c.Array.Len():
		return fmt.Errorf("sim: %d albedo responses for %d sensors", len(c.AlbedoResponse), c.Array.Len())
	}
	if c.Filter != nil {
		if err := c.Filter.Validate(); err != nil {
			return err
		}
	}
	if c.GapListUnits < 0 {
		return fmt.Errorf("sim: %d units with a list of gaps: want ≥ 0", c.GapListUnits)
	}
	if c.TimelineSpan > 0 && c.TimelineStride < 1 {
		return fmt.Errorf("sim: timeline stride %d: want ≥ 1 with a timeline span", c.TimelineStride)
	}
	if c.Season != nil {
		if err := c.Season.validate(); err != nil {
			return err
		}
	}
	for _, g := range c.Gates {
		if err := g.Validate(); err != nil {
			return fmt.Errorf("sim: %w", err)
		}
	}
	return nil
}

// Steps is the number of grid points t = 0, Step, … < Duration (the end is
// included when it falls on the grid).
func (c *Config) Steps() int {
	return int(math.Floor(c.Duration/c.Step+1e-9)) + 1
}

// chunkSteps is the length of the pieces the time grid is cut into so that
// one long unit runs on several cores. The cut is fixed (it does not depend
// on the number of workers) and the pieces are merged in time order, so the
// numbers are the same whatever the parallelism.
const chunkSteps = 1 << 15

// noiseBlockSteps is the length of the blocks of steps whose noise draws
// come from one stream seeded by (seed, unit, block): a chunk can start its
// noise without drawing the earlier steps'.
const noiseBlockSteps = 4096

// task is one chunk [k0, k1) of the grid of units [u0, u1). When every
// unit flies the same attitude their geometry (orbit, sun, shadow,
// attitude, albedo) is the same, so one task computes it once per step and
// reads each unit's sensors on it.
type task struct {
	u0, u1, chunk int
	k0, k1        int
	// stream, set on the task of the first piece of unit 0 when the series
	// is written as the run goes, takes that piece's series as it grows:
	// nothing comes before it, so it need not wait for its merge (a run in
	// one piece, with a gyro filter, then keeps no series either).
	stream func(*Series) error
}

// Run simulates every unit and gathers the result. It stops early with the
// context's error when ctx is cancelled.
func Run(ctx context.Context, cfg Config) (*Result, error) {
	if err := cfg.Validate(); err != nil {
		return nil, err
	}
	units := max(cfg.Units, 1)
	workers := cfg.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	steps := cfg.Steps()
	chunk := chunkSteps
	// A numerical integration runs forward from the epoch: the pieces
	// start from forks of one integration (forks.go). A filter runs
	// forward too, from its own state: one piece.
	var integ *integration
	if num, ok := cfg.NewPropagator().(orbit.Restarter); ok && !cfg.onePiece {
		integ = newIntegration(num, chunk, cfg.Step)
	}
	if cfg.Filter != nil || cfg.onePiece {
		chunk = steps
	}
	nChunks := (steps + chunk - 1) / chunk

	res := &Result{Steps: steps, StepS: cfg.Step, DurationS: cfg.Duration, FalseSunBoundDeg: cfg.falseSunBoundDeg()}
	eclDone := make(chan struct{})
	go func() {
		res.Eclipses, res.EclipseStats = eclipses(&cfg)
		if cfg.Season != nil {
			res.Season = season(&cfg)
		}
		close(eclDone)
	}()
	// A series written as the run goes (SeriesSink) runs until a piece
	// fails to be written: the run is then stopped.
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	streaming := cfg.SeriesSink != nil && cfg.SeriesStride > 0
	powDone := make(chan error, 1)
	switch {
	case cfg.Panels != nil && streaming:
		// The pieces of a streamed series carry their power: the power
		// pass goes first.
		var err error
		if res.Power, res.PowerSeries, res.PowerTimeline, err = powerPass(ctx, &cfg); err != nil {
			return nil, err
		}
		powDone <- nil
	case cfg.Panels != nil:
		go func() {
			var err error
			res.Power, res.PowerSeries, res.PowerTimeline, err = powerPass(ctx, &cfg)
			powDone <- err
		}()
	default:
		powDone <- nil
	}

	sets := 1 // geometries computed per step
	if cfg.LawForUnit != nil {
		sets = units
	}
	tables := newAlbedoTables(&cfg, steps, sets)
	res.AlbedoTable = tables.truth != nil
	res.albedoBoresight = tables.truth != nil && tables.truth.bore != nil

	// Each unit's errors are drawn once, before its chunks run.
	arrays := make([]*sensor.Array, units)
	for u := range units {
		drawSrc, _ := unitSeed(cfg.Seed, u)
		arrays[u] = cfg.Array.Draw(rand.New(drawSrc))
	}
	// Each unit's pieces are folded into its running accumulator as soon as
	// they are next in time order, so memory stays flat in the duration: at
	// most about one piece per worker waits for an earlier one.
	merged := make([]*orderedMerge, units)
	for u := range merged {
		merged[u] = &orderedMerge{pending: map[int]*unitAcc{}}
	}
	// sink hands a piece of unit 0's series to Config.SeriesSink, in time
	// order, from one goroutine at a time (the first piece's worker while
	// that piece runs, then the ordered merge); its first error stops the
	// run and is the run's error.
	var sink func(*Series) error
	var sinkErr error
	if streaming {
		rows := 0
		sink = func(piece *Series) error {
			if sinkErr != nil {
				return sinkErr
			}
			var w []float64
			if pw := res.PowerSeries; pw != nil {
				if rows+len(piece.T) > len(pw.W) {
					sinkErr = fmt.Errorf("sim: the power series has %d samples, the time series at least %d", len(pw.W), rows+len(piece.T))
					cancel()
					return sinkErr
				}
				w = pw.W[rows : rows+len(piece.T)]
			}
			rows += len(piece.T)
			if err := cfg.SeriesSink(piece, w); err != nil {
				sinkErr = err
				cancel()
			}
			return sinkErr
		}
		merged[0].sink = sink
	}
	// Units share a task's geometry unless the attitude is drawn per unit.
	// With fewer pieces than workers the units are split into groups so
	// every core has work (the numbers do not depend on the grouping: each
	// unit's draws and noise are its own).
	group := 1
	if cfg.LawForUnit == nil {
		group = units
		if nChunks < workers {
			group = (units + workers/nChunks - 1) / (workers / nChunks)
		}
	}
	var firstErr error
	var mu sync.Mutex
	var done atomic.Int64
	next := make(chan task)
	var wg sync.WaitGroup
	nTasks := nChunks * ((units + group - 1) / group)
	for range min(workers, nTasks) {
		wg.Go(func() {
			for tk := range next {
				as, err := runChunk(ctx, &cfg, arrays, tk, &done, units*steps, tables, integ)
				mu.Lock()
				if err != nil && firstErr == nil {
					firstErr = err
				}
				mu.Unlock()
				if err == nil {
					for i, a := range as {
						merged[tk.u0+i].add(tk.chunk, a)
					}
				}
			}
		})
	}
feed:
	for u0 := 0; u0 < units; u0 += group {
		for c := range nChunks {
			tk := task{u0: u0, u1: min(u0+group, units), chunk: c, k0: c * chunk, k1: min((c+1)*chunk, steps)}
			if c == 0 && u0 == 0 {
				tk.stream = sink
			}
			select {
			case next <- tk:
			case <-ctx.Done():
				break feed
			}
		}
	}
	close(next)
	wg.Wait()
	<-eclDone
	powErr := <-powDone
	if sinkErr != nil {
		return nil, sinkErr
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	if firstErr != nil {
		return nil, firstErr
	}
	if powErr != nil {
		return nil, powErr
	}
	unitRes := make([]*UnitResult, units)
	for u := range units {
		a := merged[u].acc
		if a == nil || merged[u].next != nChunks {
			return nil, fmt.Errorf("sim: unit %d: %d of %d pieces merged", u, merged[u].next, nChunks)
		}
		a.finish()
		unitRes[u] = a.result()
	}
	res.Units = unitRes
	res.Nominal = unitRes[0]
	res.AcrossUnits = acrossUnits(unitRes)
	return res, nil
}

// orderedMerge folds the pieces of one unit's grid into one accumulator in
// time order, whatever order they finish in (the numbers do not depend on
// the number of workers).
type orderedMerge struct {
	mu      sync.Mutex
	acc     *unitAcc
	next    int // index of the next piece to fold in
	pending map[int]*unitAcc
	// sink, when set, takes each piece's time series in time order instead
	// of the accumulator (Config.SeriesSink).
	sink func(*Series) error
}

// add hands over piece c.
func (m *orderedMerge) add(c int, a *unitAcc) {
	m.mu.Lock()
	defer m.mu.Unlock()
	m.pending[c] = a
	for {
		p, ok := m.pending[m.next]
		if !ok {
			return
		}
		delete(m.pending, m.next)
		if m.sink != nil && p.series != nil {
			m.sink(p.series) // an error is kept by the sink and ends the run
			p.series = nil
		}
		if m.acc == nil {
			m.acc = p
		} else {
			m.acc.merge(p)
			p.release()
		}
		m.next++
	}
}

// unitSeed derives the seed of unit u's error draws and noise from the run
// seed, so a unit's numbers do not depend on the number of workers.
func unitSeed(seed uint64, u int) (draw, noise *rand.PCG) {
	return rand.NewPCG(seed, uint64(2*u+1)), rand.NewPCG(seed, uint64(2*u+2))
}

// seedNoise restarts the noise stream for the block of steps holding k.
func seedNoise(src *rand.PCG, seed uint64, u, k int) {
	src.Seed(seed^0x9e3779b97f4a7c15, uint64(u)<<32|uint64(k/noiseBlockSteps))
}

// eclipses runs the event search of illum over the whole span with the same
// propagator, sun and shadow model as the step loop.
func eclipses(cfg *Config) ([]illum.Eclipse, illum.Stats) {
	p := rewindable(cfg.NewPropagator)
	sun := newSunCache(cfg.Sun, ephem.JulianDateTT(cfg.Epoch))
	g := func(t float64) (r3.Vec, r3.Vec) {
		s := p.StateAt(t)
		u, d := sun.at(t)
		return s.R, r3.Scale(d, u)
	}
	// The search samples every 60 s whatever the run's step: it refines
	// each event to 1 ms and finds grazing passes shorter than its step
	// (illum.FindEclipses).
	ecl := illum.FindEclipsesModel(cfg.shadowModel(), g, 0, cfg.Duration, eclipseSearchStepS)
	s0 := p.StateAt(0)
	period := orbitPeriod(s0)
	return ecl, illum.EclipseStats(ecl, 0, cfg.Duration, period)
}

// shadowModel is the shadow geometry of both the step loop and the event
// search, so fractions and events agree.
func (c *Config) shadowModel() illum.ShadowModel {
	if c.Cylindrical {
		return illum.Cylindrical
	}
	return illum.Conical
}

// eclipseSearchStepS is the sampling step of the eclipse event search.
const eclipseSearchStepS = 60

// orbitPeriod is the osculating period of a state (two-body energy).
func orbitPeriod(s orbit.State) float64 {
	r, v := vecmath.Norm(s.R), vecmath.Norm(s.V)
	a := 1 / (2/r - v*v/orbit.MuEarth)
	if !(a > 0) {
		return math.NaN()
	}
	return orbit.Period(a)
}

// UnitsAlike reports whether every Monte Carlo unit of cfg is certain to
// give unit 0's numbers: no attitude drawn per unit, no gyro filter (its
// gyro noise is drawn per unit), two units drawn from different streams
// equal field by field, and no sensor whose reading depends on the noise
// stream (read along its boresight at a tenth, three tenths and six
// tenths of a 1 AU sun, below full scale, on two different streams). A false answer only means the draws could differ.
func (c *Config) UnitsAlike() bool {
	if c.LawForUnit != nil || c.Filter != nil || c.Array == nil {
		return false
	}
	a, b := c.Array.Draw(rand.New(rand.NewPCG(1, 2))), c.Array.Draw(rand.New(rand.NewPCG(3, 4)))
	if !reflect.DeepEqual(a, b) {
		return false
	}
	// Below full scale, where a saturated reading would hide the noise.
	for _, s := range a.Sensors() {
		sun := s.Mount().Boresight()
		for _, f := range []float64{0.1, 0.3, 0.6} {
			r1 := s.Read(sun, f*ephem.SolarIrradiance1AU, sensor.Albedo{}, rand.New(rand.NewPCG(5, 6)))
			r2 := s.Read(sun, f*ephem.SolarIrradiance1AU, sensor.Albedo{}, rand.New(rand.NewPCG(7, 8)))
			if r1 != r2 {
				return false
			}
		}
	}
	return true
}
