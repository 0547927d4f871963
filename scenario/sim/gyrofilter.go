package sim

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sensor/filter"
	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// FilterConfig runs the gyro-aided sun-direction filter (illum/sensor/filter)
// beside the point estimators, on the same realistic readings. The gyro
// flown (the truth) and the gyro the filter assumes have the same stated
// errors: Settings.ARW, BiasSigma and BiasTau.
type FilterConfig struct {
	Settings filter.Settings
	// CosineSigma (normalised signal) is added in quadrature to the 1σ the
	// filter gives a cosine reading beyond the sensor's own stated errors
	// (noise, dark offset, gain, misalignment, quantisation): an allowance
	// for albedo and for errors that last longer than a step.
	CosineSigma float64
	// HoldBoundDeg is the error (deg) up to which the filter's estimate
	// counts as holding through a spell without a valid point estimate.
	HoldBoundDeg float64
	// SpanStarts, when set, splits the nominal unit's figures over spans
	// of the run (the phases of a mission timeline): span i holds the
	// samples from SpanStarts[i] (s since the epoch, the time of its first
	// sample) to the next span's start, the last one to the end of the run
	// (FilterStats.Spans). The filter itself runs on across them, as it
	// would in flight.
	SpanStarts []float64
}

// spanTolS is the tolerance (s) of a sample time against a span start:
// far below any step, far above the rounding of t = k·step.
const spanTolS = 1e-6

// Validate checks the configuration.
func (c *FilterConfig) Validate() error {
	if err := c.Settings.Validate(); err != nil {
		return fmt.Errorf("sim: %w", err)
	}
	if !(c.CosineSigma >= 0) || math.IsInf(c.CosineSigma, 0) {
		return fmt.Errorf("sim: filter cosine sigma %g: want a finite value ≥ 0", c.CosineSigma)
	}
	if c.Settings.StartSigma > c.Settings.MaxSigma {
		return fmt.Errorf("sim: filter start sigma %g rad above its valid sigma %g rad: a start would never be valid", c.Settings.StartSigma, c.Settings.MaxSigma)
	}
	if !(c.HoldBoundDeg > 0 && c.HoldBoundDeg < 180) {
		return fmt.Errorf("sim: filter hold bound %g°: want (0°, 180°)", c.HoldBoundDeg)
	}
	for i, t := range c.SpanStarts {
		if math.IsNaN(t) || math.IsInf(t, 0) || t < 0 || i > 0 && t < c.SpanStarts[i-1] {
			return fmt.Errorf("sim: filter span start %d at %g s: want finite, ≥ 0 and not before the one before", i, t)
		}
	}
	return nil
}

// FilterStats are the filter's figures for one unit. Unlike the point
// estimators' (sunlit time), its shares and errors run over the whole run:
// holding the sun through eclipse is what it is for.
type FilterStats struct {
	// ValidFraction is the share of all samples with a valid filter
	// estimate; ValidShadowFraction that of the samples in eclipse
	// (penumbra or umbra; NaN without any).
	ValidFraction, ValidShadowFraction float64
	// Err is the error to the true sun over every valid sample; ErrShadow
	// over those in eclipse.
	Err, ErrShadow ErrorStats
	// HoldLastShadow is, for comparison, the error in eclipse of the last
	// valid primary point estimate held as it was (body axes): what the
	// point estimator alone gives through eclipse without a gyro.
	HoldLastShadow ErrorStats
	// Outages are the spells without a valid primary point estimate
	// (sunlit or not) after the filter's first start; OutagesHeld those through which the filter stayed
	// valid and within HoldBoundDeg of the sun. ShortestBreakS is the
	// shortest time from an outage's start until the filter left the bound
	// (NaN when every outage was held); LongestHeldS the longest outage
	// held whole.
	Outages, OutagesHeld         int
	ShortestBreakS, LongestHeldS float64
	// Starts counts the (re)starts of the filter from a point estimate.
	Starts       int
	HoldBoundDeg float64
	// MaxStepTurnDeg is the largest body rotation over one step (deg):
	// the filter's linearisation is checked up to 50° a step.
	MaxStepTurnDeg float64
	// Spans are the figures of each span of FilterConfig.SpanStarts, for
	// the nominal unit (unit 0) only; nil without spans.
	Spans []FilterSpanStats
}

// FilterSpanStats are the filter's figures over the samples of one span of
// the run (FilterConfig.SpanStarts), the filter running on from the spans
// before.
type FilterSpanStats struct {
	// Samples is the number of samples in the span.
	Samples int
	// ValidFraction and ValidShadowFraction are the valid shares of the
	// span's samples and of those in eclipse (NaN without any).
	ValidFraction, ValidShadowFraction float64
	// Err and ErrShadow are the errors over the span's valid samples and
	// over those in eclipse.
	Err, ErrShadow ErrorStats
}

// spanAcc accumulates one span of the filter's figures.
type spanAcc struct {
	samples, valid, shadow, validShadow int
	mErr, mShadow                       Moments
	qErr, qShadow                       *Quantiles
}

// MaxCheckedStepTurnDeg is the largest body turn per step at which the
// filter's covariance was checked consistent (the NEES test of
// illum/sensor/filter at 10°/s and 5 s steps).
const MaxCheckedStepTurnDeg = 50.0

// gyroFilter is one unit's filter, its gyro and its accumulator.
type gyroFilter struct {
	cfg      *FilterConfig
	f        *filter.Filter
	gyro     filter.Gyro
	rng      *rand.Rand
	cosine   []bool
	sigma    []float64 // 1σ per reading: normalised signal (cosine) or rad
	boresite []r3.Vec
	prev     bodyMatrix
	prevT    float64
	started  bool // a step has been seen
	disagree int  // steps in a row far from a valid point estimate

	// accumulator: the whole run, then the held point estimate
	all                        spanAcc
	mHold                      Moments
	qHold                      *Quantiles
	lastDir                    r3.Vec
	haveLast                   bool
	inOutage, broken           bool
	outStart                   float64
	outages, held, starts      int
	shortestBreak, longestHeld float64
	maxTurn                    float64   // rad
	spans                      []spanAcc // unit 0 with span starts
	span                       int       // the span of the last sample
}

// newGyroFilter builds unit u's filter; its gyro draws come from their own
// stream, so the readings' noise is the same with the filter on or off.
func newGyroFilter(cfg *Config, nominal *sensor.Array, u int) *gyroFilter {
	fc := cfg.Filter
	f, err := filter.New(fc.Settings)
	if err != nil {
		panic(err) // Validate checked the settings
	}
	rng := rand.New(rand.NewPCG(cfg.Seed^0x6a09e667f3bcc908, uint64(u)))
	g := &gyroFilter{cfg: fc, f: f, rng: rng, all: newSpanAcc(), qHold: NewQuantiles(),
		gyro:          filter.NewGyro(fc.Settings.ARW, fc.Settings.BiasSigma, fc.Settings.BiasTau, rng),
		shortestBreak: math.Inf(1)}
	if u == 0 && len(fc.SpanStarts) > 0 {
		g.spans = make([]spanAcc, len(fc.SpanStarts))
		for i := range g.spans {
			g.spans[i] = newSpanAcc()
		}
	}
	for _, s := range nominal.Sensors() {
		g.boresite = append(g.boresite, s.Mount().Boresight())
		c, isCos := s.(*sensor.Cosine)
		g.cosine = append(g.cosine, isCos)
		if isCos {
			g.sigma = append(g.sigma, cosineSigma(c.Spec().Errors, fc.CosineSigma))
		} else {
			g.sigma = append(g.sigma, s.Sigma())
		}
	}
	return g
}

// The filter's monitor (common practice, no source): the filter is started
// again from the point estimate after filterMonitorSteps steps in a row
// more than filterDisagreeRad from a valid point estimate. Readings it does
// not model, albedo on the faces toward the Earth above all, can pull it
// far off while its innovations stay small (101° p95 in a nadir phase with
// uniform albedo before the monitor, 29° with it:
// TestFilterRestartsWhenItLeavesTheSensors). Three steps: one noisy step is
// not a divergence; 30°: beyond the coarse point estimates' own errors with
// albedo in the bundled examples. In eclipse there is no point estimate
// and the filter holds on the gyro.
const (
	filterMonitorSteps = 3
	filterDisagreeRad  = 30 * math.Pi / 180
)

// minDirSigma is the least 1σ (rad) the filter gives a two-axis direction:
// 0.001°, a floor against a zero variance from a sensor stated perfect
// (common practice, no source).
const minDirSigma = 1e-3 * math.Pi / 180

// cosineSigma is the 1σ of one cosine reading (normalised signal): noise,
// dark offset, gain and misalignment at full sun (sin δ ≈ δ), the
// quantisation step over √12 (uniform), and the allowance, in quadrature,
// never below 1e-4 (a floor against a zero variance).
func cosineSigma(e sensor.Errors, extra float64) float64 {
	v := e.NoiseSigma*e.NoiseSigma + e.DarkSigma*e.DarkSigma + e.GainSigma*e.GainSigma +
		e.MisalignSigma*e.MisalignSigma + extra*extra
	if e.ADCBits > 0 {
		q := e.FullScale / float64(uint64(1)<<e.ADCBits)
		v += q * q / 12
	}
	return max(math.Sqrt(v), 1e-4)
}

// step advances the filter to step k and folds it in: gyro propagation
// from the previous step, the valid realistic readings, a (re)start from
// the primary point estimate prim when the filter is not valid. It
// allocates nothing.
func (g *gyroFilter) step(sg *stepGeom, read []sensor.Reading, prim sensor.Estimate) {
	if g.started {
		dt := sg.t - g.prevT
		th := filter.DeltaAngle(g.prev, sg.body)
		g.maxTurn = max(g.maxTurn, vecmath.Norm(th))
		g.f.Propagate(g.gyro.Measure(th, dt, g.rng), dt)
	}
	g.prev, g.prevT, g.started = sg.body, sg.t, true
	if !g.f.Valid() && prim.Valid {
		g.f.Start(prim.Dir)
		g.starts++
	} else if g.f.Started() {
		for i := range read {
			r := &read[i]
			if !r.Valid {
				continue
			}
			if g.cosine[i] {
				g.f.Cosine(g.boresite[i], r.Signal, g.sigma[i])
			} else {
				g.f.Direction(r.Dir, max(g.sigma[i], r.Sigma, minDirSigma))
			}
		}
		// The monitor: far from a valid point estimate step after step,
		// the filter has left what the sensors say, whatever its
		// covariance claims; it starts again from the point estimate.
		if prim.Valid && g.f.Valid() && angleBetween(g.f.Sun(), prim.Dir) > filterDisagreeRad {
			g.disagree++
		} else {
			g.disagree = 0
		}
		if g.disagree >= filterMonitorSteps {
			g.disagree = 0
			g.f.Start(prim.Dir)
			g.starts++
		}
	}
	shadow := sg.region != illum.Sunlit
	valid := g.f.Valid()
	errDeg := math.Inf(1)
	if valid {
		errDeg = degOf(angleBetween(g.f.Sun(), sg.sunBody))
	}
	g.all.add(valid, shadow, errDeg)
	if g.spans != nil {
		g.addToSpan(sg.t, valid, shadow, errDeg)
	}
	if prim.Valid {
		g.lastDir, g.haveLast = prim.Dir, true
	} else if shadow && g.haveLast {
		d := degOf(angleBetween(g.lastDir, sg.sunBody))
		g.mHold.Add(d)
		g.qHold.Add(d)
	}
	// Outages of the primary point estimate.
	switch {
	case !prim.Valid && !g.inOutage && g.f.Started():
		g.inOutage, g.broken, g.outStart = true, false, sg.t
		g.outages++
		fallthrough
	case !prim.Valid && g.inOutage:
		if !g.broken && !(errDeg <= g.cfg.HoldBoundDeg) {
			g.broken = true
			g.shortestBreak = min(g.shortestBreak, sg.t-g.outStart)
		}
	case g.inOutage:
		g.closeOutage(sg.t)
	}
}

// addToSpan folds a sample at t into its span (samples come in time order).
func (g *gyroFilter) addToSpan(t float64, valid, shadow bool, errDeg float64) {
	starts := g.cfg.SpanStarts
	for g.span+1 < len(starts) && t >= starts[g.span+1]-spanTolS {
		g.span++
	}
	g.spans[g.span].add(valid, shadow, errDeg)
}

// newSpanAcc returns an empty accumulator.
func newSpanAcc() spanAcc { return spanAcc{qErr: NewQuantiles(), qShadow: NewQuantiles()} }

// add folds in one sample: in eclipse or not, the filter valid or not, and
// its error when valid.
func (sp *spanAcc) add(valid, shadow bool, errDeg float64) {
	sp.samples++
	if shadow {
		sp.shadow++
	}
	if valid {
		sp.valid++
		sp.mErr.Add(errDeg)
		sp.qErr.Add(errDeg)
		if shadow {
			sp.validShadow++
			sp.mShadow.Add(errDeg)
			sp.qShadow.Add(errDeg)
		}
	}
}

// closeOutage ends the running outage at t.
func (g *gyroFilter) closeOutage(t float64) {
	g.inOutage = false
	if !g.broken {
		g.held++
		g.longestHeld = max(g.longestHeld, t-g.outStart)
	}
}

// result closes the run at tEnd and returns the figures.
func (g *gyroFilter) result(tEnd float64) *FilterStats {
	if g.inOutage {
		g.closeOutage(tEnd)
	}
	a := &g.all
	s := &FilterStats{ValidFraction: frac(a.valid, a.samples), ValidShadowFraction: frac(a.validShadow, a.shadow),
		Err: errorStats(&a.mErr, a.qErr), ErrShadow: errorStats(&a.mShadow, a.qShadow), HoldLastShadow: errorStats(&g.mHold, g.qHold),
		Outages: g.outages, OutagesHeld: g.held, ShortestBreakS: g.shortestBreak, LongestHeldS: g.longestHeld,
		Starts: g.starts, HoldBoundDeg: g.cfg.HoldBoundDeg, MaxStepTurnDeg: degOf(g.maxTurn)}
	if math.IsInf(s.ShortestBreakS, 1) {
		s.ShortestBreakS = math.NaN()
	}
	for i := range g.spans {
		sp := &g.spans[i]
		s.Spans = append(s.Spans, FilterSpanStats{Samples: sp.samples, ValidFraction: frac(sp.valid, sp.samples),
			ValidShadowFraction: frac(sp.validShadow, sp.shadow), Err: errorStats(&sp.mErr, sp.qErr), ErrShadow: errorStats(&sp.mShadow, sp.qShadow)})
	}
	return s
}
