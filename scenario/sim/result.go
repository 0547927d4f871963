package sim

import (
	"math"
	"slices"
	"sort"

	"gonum.org/v1/gonum/spatial/r3"
	"gonum.org/v1/gonum/stat"

	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/power"
	"codeberg.org/sunsight/sunsight/illum/sensor"
)

// Result is the outcome of a run: the eclipses of the orbit, the nominal
// unit's figures, and, with several units, the spread across units.
type Result struct {
	Steps        int
	StepS        float64
	DurationS    float64
	Eclipses     []illum.Eclipse
	EclipseStats illum.Stats
	// Season is the eclipse-season table asked for by Config.Season (nil
	// otherwise).
	Season      []illum.DayRow
	Nominal     *UnitResult   // unit 0
	Units       []*UnitResult // all units, Units[0] == Nominal
	AcrossUnits []AcrossUnits // one per estimator; empty with one unit
	// FalseSunBoundDeg is the error beyond which a valid estimate counts
	// as a false sun (EstimatorStats.WrongFraction).
	FalseSunBoundDeg float64
	// AlbedoTable says the albedo came from a precomputed table (uniform
	// albedo: the LVLH table for nadir pointing on a circular orbit, else
	// the boresight tables) rather than the cell integral at every step.
	AlbedoTable bool
	// Power is the solar-array power over the run (nominal attitude); nil
	// without panels.
	Power *power.Summary
	// PowerSeries is the array power at the time-series samples (every
	// SeriesStride-th step, the times of Nominal.Series); nil without panels
	// or without a series.
	PowerSeries *PowerSeries
	// PowerTimeline is the array power at the short series' samples
	// (Nominal.Timeline); nil without panels or without a timeline span.
	PowerTimeline *PowerSeries

	albedoBoresight bool // the table is the boresight one (tests)
}

// ErrorStats summarises an angle error in degrees. N = 0 means no sample
// (the other fields are then NaN).
type ErrorStats struct {
	N                                               int
	MeanDeg, RMSDeg, P50Deg, P95Deg, P99Deg, MaxDeg float64
}

// UnitResult holds one simulated unit's figures. Fractions of "sunlit time"
// count samples in full sun (no part of the solar disc hidden).
type UnitResult struct {
	Unit                                            int
	Samples                                         int
	SunlitFraction, PenumbraFraction, UmbraFraction float64
	// SeenAtLeast[k] is the fraction of sunlit time with the sun in the
	// unobstructed field of view of at least k sensors (index 0 unused).
	SeenAtLeast [4]float64
	Sensors     []SensorStats
	Estimators  []EstimatorStats
	// FalseSunFraction is the fraction of umbra time during which at least
	// one sensor reads "sun" (a valid reading) although no direct sun reaches
	// it: from a dark offset or noise, never from albedo for a spherical
	// Earth without atmosphere (see the package doc).
	FalseSunFraction float64
	BetaMinDeg       float64
	BetaMaxDeg       float64
	// Filter holds the gyro-aided filter's figures; nil without one.
	Filter *FilterStats
	Series *Series // unit 0 only, when asked for
	// Timeline is the short series of unit 0 over Config.TimelineSpan,
	// when asked for.
	Timeline *Series
	SunTrack []r3.Vec // body-frame sun directions in sunlight (unit 0)
	// NadirTrack is the body-frame nadir (unit 0) at the same stride as
	// SunTrack, sunlit or not: where the Earth sits in body axes.
	NadirTrack []r3.Vec
}

// SensorStats are one sensor's figures.
type SensorStats struct {
	Name string
	// InViewFraction is the fraction of sunlit time with the sun in view.
	InViewFraction float64
	// PeakSignal is the largest reading (normalised signal, with albedo when
	// modelled); SaturatedFraction the fraction of sunlit time at full
	// scale.
	PeakSignal        float64
	SaturatedFraction float64
	// PeakOutput is the largest single output the converter's full scale
	// applies to: a quadrant's largest cell (its signal is the sum of
	// four), the signal for the other kinds.
	PeakOutput float64
	// FalseSunFraction is the fraction of umbra time above threshold.
	FalseSunFraction float64
	// MoonInViewFraction is the fraction of all time with some of the
	// Moon's disc inside the sensor's cone (half-angle + the Moon's angular
	// radius from the boresight), not hidden by the Earth, in front of its
	// mounting plane and clear of the body's obstructions.
	// LitEarthInViewFraction is the fraction of all time with some of the
	// Earth's disc inside the cone (half-angle + asin(R/r) from the
	// boresight, in front of the mounting plane) while the sub-satellite
	// point is sunlit. Both use the nominal mount.
	MoonInViewFraction, LitEarthInViewFraction float64
	// BlindedFraction is the fraction of all time the kind's blinding rule
	// dropped the reading (NaN for a sensor without a rule that can act).
	BlindedFraction float64
	// AlbedoOnlyFraction is the fraction of sunlit time with a valid
	// reading that would not be valid without albedo; WrongFraction, for a
	// two-axis sensor, the fraction of sunlit time with a valid direction
	// more than the false-sun bound from the sun (NaN for a cosine sensor,
	// which gives no direction).
	AlbedoOnlyFraction, WrongFraction float64
}

// EstimatorStats are one estimator's figures. "With albedo" readings are the
// realistic ones when an albedo model is set; without one they equal the
// no-albedo readings and the albedo fields are empty.
type EstimatorStats struct {
	Name string
	// ValidFraction is the fraction of sunlit time with a valid estimate
	// from the realistic readings; ValidFractionNoAlbedo from readings
	// without albedo.
	ValidFraction         float64
	ValidFractionNoAlbedo float64
	// NumGaps is the number of sunlit spells without a valid estimate,
	// GapLengths the histogram of their lengths in steps. Gaps lists each
	// spell's duration (s) and GapStartS its start (s since the epoch),
	// only for the units Config.GapListUnits names (nil for the others).
	NumGaps     int
	GapLengths  []RunLength
	Gaps        []float64
	GapStartS   []float64
	LongestGapS float64
	LongestAtS  float64
	// Errors to the true sun direction, over sunlit valid samples.
	ErrNoAlbedo ErrorStats
	ErrAlbedo   ErrorStats
	// AlbedoPart is the angle between the estimates with and without
	// albedo, where both are valid: the error albedo alone adds.
	AlbedoPart ErrorStats
	// FalseSunFraction is the fraction of umbra time with a valid estimate
	// (a sun reported where there is none); FalseSunFromNadir is the angle
	// of that false sun from nadir.
	FalseSunFraction  float64
	FalseSunFromNadir ErrorStats
	// AlbedoOnlyFraction is the fraction of sunlit time with an estimate
	// valid only because of albedo (invalid from the same readings without
	// it): exactly 0 without an albedo model. WrongFraction is the fraction
	// of sunlit time with a valid estimate more than the false-sun bound
	// (Result.FalseSunBoundDeg) from the sun. Both are false suns that can
	// fire in sunlight, where the umbra measure cannot for a spherical
	// Earth (see the package doc).
	AlbedoOnlyFraction, WrongFraction float64
	// Corrected holds the figures of the readings after the on-board
	// albedo model's prediction is subtracted (Config.NewCorrection); nil
	// without an on-board model.
	Corrected *CorrectedStats

	errNo, errAlb *Quantiles // for CDF figures
}

// CorrectedStats are one estimator's figures on the readings corrected by
// the on-board albedo model, against the same truth as the others.
type CorrectedStats struct {
	// ValidFraction is the fraction of sunlit time with a valid estimate
	// from the corrected readings (a correction can push a sensor below its
	// threshold or fail a gate).
	ValidFraction float64
	// LongestGapS is the longest sunlit interval without a valid estimate
	// from the corrected readings (s).
	LongestGapS float64
	// Err is the error to the true sun direction over sunlit valid samples.
	Err ErrorStats
	// ResidualPart is the angle between the corrected estimate and the
	// estimate without albedo, where both are valid: the albedo error the
	// correction leaves (AlbedoPart is the same before correction). It is
	// zero to rounding when the on-board model is the truth's own and the
	// readings are linear (no ADC, no saturation): perfect by construction.
	ResidualPart ErrorStats
}

// ErrorCDF returns up to n points of the error CDF (degrees, fraction),
// with albedo when withAlbedo is set.
func (e *EstimatorStats) ErrorCDF(n int, withAlbedo bool) (x, f []float64) {
	q := e.errNo
	if withAlbedo {
		q = e.errAlb
	}
	if q == nil {
		return nil, nil
	}
	return q.CDF(n)
}

// PowerSeries is the solar-array power sampled with the time series.
type PowerSeries struct {
	T []float64 // s since the epoch
	W []float64 // array power (W)
}

// Series is a decimated time series of unit 0 for figures and CSV files.
type Series struct {
	T         []float64 // s since the epoch
	Region    []illum.Region
	Lit       []float64 // visible fraction of the solar disc
	Seen      []int     // sensors with the sun in view
	Valid     []bool    // primary estimator, realistic readings
	ErrNoDeg  []float64 // NaN where invalid or not sunlit
	ErrAlbDeg []float64
	// ErrCorrDeg is the error of the primary estimator on the readings
	// corrected by the on-board albedo model (Config.NewCorrection); NaN
	// where invalid, not sunlit, or without an on-board model.
	ErrCorrDeg []float64
	BetaDeg    []float64
	SunBodyAz  []float64 // deg, body frame
	SunBodyEl  []float64
	// Signal holds the realistic signal of every sensor at every sample,
	// sample after sample (len(SensorName) values each, one array rather
	// than a slice per sample); SignalsAt cuts out one sample's.
	Signal     []float64
	SensorName []string
}

// SignalsAt returns the sensors' signals at sample i (a view into Signal).
func (s *Series) SignalsAt(i int) []float64 {
	n := len(s.SensorName)
	return s.Signal[i*n : (i+1)*n : (i+1)*n]
}

// AcrossUnits is the Monte Carlo spread of one estimator over the units.
type AcrossUnits struct {
	Name string
	// P95OfUnitP95Deg is the p95 error reached by 95 % of units (the 95th
	// percentile over units of each unit's p95 error), with albedo when
	// modelled; WorstUnitP95Deg the largest. A unit without any valid
	// estimate has no p95 (NaN in UnitP95Deg) and counts as the worst
	// (+Inf) in these quantiles, so they are +Inf when such units make the
	// quantile.
	P50OfUnitP95Deg, P95OfUnitP95Deg, WorstUnitP95Deg float64
	MinValidFraction                                  float64
	UnitP95Deg                                        []float64
	// UnitsWithoutEstimate counts the units that never had a valid
	// estimate in sunlight.
	UnitsWithoutEstimate int
	// P95OfUnitP95CorrectedDeg is the same p95 over units of each unit's
	// p95 error after the on-board albedo correction (NaN without an
	// on-board model), units without a valid corrected estimate counted
	// as the worst.
	P95OfUnitP95CorrectedDeg float64
	// The false suns over the units (each unit's EstimatorStats figures):
	// UnitsWithFalseSun counts the units with a valid estimate at some
	// umbra sample, WorstFalseSunFraction is the largest share of umbra
	// time, WorstAlbedoOnlyFraction and WorstWrongFraction the largest
	// shares of sunlit time valid only with albedo and valid beyond the
	// false-sun bound. Unit 0 alone can hide them: its errors are one draw.
	UnitsWithFalseSun                                                  int
	WorstFalseSunFraction, WorstAlbedoOnlyFraction, WorstWrongFraction float64
}

func errorStats(m *Moments, q *Quantiles) ErrorStats {
	if m.N == 0 {
		n := math.NaN()
		return ErrorStats{MeanDeg: n, RMSDeg: n, P50Deg: n, P95Deg: n, P99Deg: n, MaxDeg: n}
	}
	return ErrorStats{N: m.N, MeanDeg: m.Mean(), RMSDeg: m.RMS(), P50Deg: q.Quantile(0.5),
		P95Deg: q.Quantile(0.95), P99Deg: q.Quantile(0.99), MaxDeg: m.Max}
}

// estAcc accumulates one estimator.
type estAcc struct {
	validAlb, validNo int
	gaps              *Spells
	mNo, mAlb, mPart  Moments
	qNo, qAlb, qPart  *Quantiles
	falseSun          int
	mFalse            Moments
	qFalse            *Quantiles
	// Sunlit samples valid only with albedo, and valid with an error above
	// the false-sun bound.
	albedoOnly, wrong int
	// The corrected readings (nil quantiles without an on-board model).
	validCorr     int
	gapsCorr      *Spells
	mCorr, mResid Moments
	qCorr, qResid *Quantiles
}

// unitAcc accumulates one unit's figures in constant memory (except the
// gap list, bounded by the number of gaps, and the optional series).
type unitAcc struct {
	cfg                       *Config
	albedo, corrected         bool
	listGaps                  bool // keep the list of gaps (Config.GapListUnits)
	samples, sunlit, pen, umb int
	seenAtLeast               [4]int
	inView                    []int
	moonInView                []int
	litEarthInView            []int
	blinded                   []int
	canBlind                  []bool
	peak                      []float64
	cellPeak                  []float64 // largest cell, for the sensors with cells (hasCells)
	hasCells                  []bool
	saturated                 []int
	falseSunSensor            []int
	falseSunAny               int
	sensorAlbedoOnly          []int // sunlit, valid only with albedo
	sensorWrong               []int // sunlit, a two-axis direction beyond the bound
	twoAxis                   []bool
	boundDeg                  float64
	est                       []estAcc
	betaMin, betaMax          float64 // extremes of sin β
	series                    *Series
	timeline                  *Series
	track                     []r3.Vec
	nadirTrack                []r3.Vec
	trackStride               int
	unit                      int
	k0                        int // first step of the piece accumulated
	names                     []string
	// primary is the primary estimator's realistic gated estimate of the
	// last step (the filter starts from it); filter the filter's figures.
	primary sensor.Estimate
	filter  *FilterStats
}

func newUnitAcc(cfg *Config, arr *sensor.Array, withAlbedo, corrected, first, listGaps bool, t0 float64) *unitAcc {
	n := arr.Len()
	a := &unitAcc{cfg: cfg, albedo: withAlbedo, corrected: corrected, listGaps: listGaps, inView: make([]int, n), peak: make([]float64, n),
		cellPeak: make([]float64, n), hasCells: make([]bool, n),
		moonInView: make([]int, n), litEarthInView: make([]int, n), blinded: make([]int, n), canBlind: make([]bool, n),
		saturated: make([]int, n), falseSunSensor: make([]int, n), est: make([]estAcc, len(cfg.Estimators)),
		sensorAlbedoOnly: make([]int, n), sensorWrong: make([]int, n), twoAxis: make([]bool, n),
		boundDeg: cfg.falseSunBoundDeg(), betaMin: math.Inf(1), betaMax: math.Inf(-1)}
	for i, s := range arr.Sensors() {
		a.names = append(a.names, s.Name())
		a.twoAxis[i] = s.Kind() != sensor.KindCosine
		a.hasCells[i] = s.Kind() == sensor.KindQuadrant || s.Kind() == sensor.KindQuadrantWall
		b, ok := s.(sensor.Blindable)
		a.canBlind[i] = ok && b.Blinding()
	}
	for i := range a.est {
		a.est[i] = estAcc{gaps: NewSpells(t0, cfg.Step, listGaps), qNo: NewQuantiles(), qAlb: NewQuantiles(), qPart: NewQuantiles(), qFalse: NewQuantiles()}
		if corrected {
			a.est[i].qCorr, a.est[i].qResid = NewQuantiles(), NewQuantiles()
			a.est[i].gapsCorr = NewSpells(t0, cfg.Step, false)
		}
	}
	if first {
		if cfg.SeriesStride > 0 {
			a.series = &Series{SensorName: a.names}
		}
		if cfg.TimelineSpan > 0 && t0 <= cfg.TimelineSpan {
			a.timeline = &Series{SensorName: a.names}
		}
		if cfg.SunTrackPoints > 0 {
			a.trackStride = max(cfg.Steps()/cfg.SunTrackPoints, 1)
		}
	}
	return a
}

// step folds one sample in. readAlb is ignored without an albedo model,
// readCorr (the readings corrected on board) without an on-board model.
func (a *unitAcc) step(k int, t float64, region illum.Region, lit float64, seen int, sunBody, nadirBody r3.Vec,
	sinBeta float64, readNo, readAlb, readCorr []sensor.Reading, same bool, arr *sensor.Array, ests []sensor.Estimator) {
	a.samples++
	sunlit := region == illum.Sunlit
	switch region {
	case illum.Sunlit:
		a.sunlit++
	case illum.Umbra:
		a.umb++
	default:
		a.pen++
	}
	// Extremes of sin β (monotonic in β); the arcsine is taken once at the end.
	if sinBeta < a.betaMin {
		a.betaMin = sinBeta
	}
	if sinBeta > a.betaMax {
		a.betaMax = sinBeta
	}
	for k := 1; k <= 3 && sunlit; k++ {
		if seen >= k {
			a.seenAtLeast[k]++
		}
	}
	real := readNo
	if a.albedo {
		real = readAlb
	}
	anyFalse := false
	for i := range real {
		r := &real[i]
		if r.Signal > a.peak[i] {
			a.peak[i] = r.Signal
		}
		if a.hasCells[i] {
			a.cellPeak[i] = max(a.cellPeak[i], r.Cells[0], r.Cells[1], r.Cells[2], r.Cells[3])
		}
		if r.Saturated && sunlit {
			a.saturated[i]++
		}
		if region == illum.Umbra && r.Valid {
			a.falseSunSensor[i]++
			anyFalse = true
		}
		if sunlit && r.Valid {
			if a.albedo && !readNo[i].Valid {
				a.sensorAlbedoOnly[i]++
			}
			if a.twoAxis[i] && degOf(angleBetween(r.Dir, sunBody)) > a.boundDeg {
				a.sensorWrong[i]++
			}
		}
	}
	if anyFalse {
		a.falseSunAny++
	}
	var errNoDeg, errAlbDeg, errCorrDeg = math.NaN(), math.NaN(), math.NaN()
	var primaryValid bool
	// Readings the albedo left unchanged, bit for bit (same: the caller
	// knows it): every estimator gives the same estimate on both, so the
	// estimate with albedo, its error and its angle to the one without
	// (exactly 0) are taken from the first.
	same = same && a.albedo
	for j, e := range ests {
		ea := &a.est[j]
		var gate sensor.Gate
		if a.cfg.Gates != nil {
			gate = a.cfg.Gates[j]
		}
		eNo := gate.Apply(e.Estimate(arr, readNo))
		eAlb := eNo
		if a.albedo && !same {
			eAlb = gate.Apply(e.Estimate(arr, readAlb))
		}
		if sunlit {
			ea.gaps.Observe(t, !eAlb.Valid)
			dNo := math.NaN()
			if eNo.Valid {
				ea.validNo++
				dNo = degOf(angleBetween(eNo.Dir, sunBody))
				ea.mNo.Add(dNo)
				ea.qNo.Add(dNo)
				if j == 0 {
					errNoDeg = dNo
				}
			}
			if eAlb.Valid {
				ea.validAlb++
				if !eNo.Valid {
					ea.albedoOnly++
				}
				d := dNo // without albedo, or on the same readings, the two estimates are one
				if a.albedo && !same {
					d = degOf(angleBetween(eAlb.Dir, sunBody))
				}
				if d > a.boundDeg {
					ea.wrong++
				}
				if a.albedo {
					ea.mAlb.Add(d)
					ea.qAlb.Add(d)
					if j == 0 {
						errAlbDeg = d
					}
					if eNo.Valid {
						p := 0.0 // angleBetween of a vector with itself: atan2(0, 1) = 0
						if !same {
							p = degOf(angleBetween(eAlb.Dir, eNo.Dir))
						}
						ea.mPart.Add(p)
						ea.qPart.Add(p)
					}
				}
			}
			if a.corrected {
				if d := ea.corrected(t, gate.Apply(e.Estimate(arr, readCorr)), eNo, sunBody); j == 0 {
					errCorrDeg = d
				}
			}
		} else {
			ea.gaps.Observe(t, false)
			if a.corrected {
				ea.gapsCorr.Observe(t, false)
			}
			if region == illum.Umbra && eAlb.Valid {
				ea.falseSun++
				d := degOf(angleBetween(eAlb.Dir, nadirBody))
				ea.mFalse.Add(d)
				ea.qFalse.Add(d)
			}
		}
		if j == 0 {
			primaryValid = eAlb.Valid && sunlit
			a.primary = eAlb
		}
	}
	if a.trackStride > 0 && k%a.trackStride == 0 {
		if sunlit {
			a.track = append(a.track, sunBody)
		}
		a.nadirTrack = append(a.nadirTrack, nadirBody)
	}
	if s := a.series; s != nil && k%a.cfg.SeriesStride == 0 {
		s.add(t, region, lit, seen, primaryValid, errNoDeg, errAlbDeg, errCorrDeg, sinBeta, sunBody, real)
	}
	if s := a.timeline; s != nil && t <= a.cfg.TimelineSpan && k%a.cfg.TimelineStride == 0 {
		s.add(t, region, lit, seen, primaryValid, errNoDeg, errAlbDeg, errCorrDeg, sinBeta, sunBody, real)
	}
}

// add appends one sample (it allocates: series are kept for figures and
// files, not in the measured loop).
func (s *Series) add(t float64, region illum.Region, lit float64, seen int, valid bool, errNoDeg, errAlbDeg, errCorrDeg, sinBeta float64,
	sunBody r3.Vec, real []sensor.Reading) {
	s.T = append(s.T, t)
	s.Region = append(s.Region, region)
	s.Lit = append(s.Lit, lit)
	s.Seen = append(s.Seen, seen)
	s.Valid = append(s.Valid, valid)
	s.ErrNoDeg = append(s.ErrNoDeg, errNoDeg)
	s.ErrAlbDeg = append(s.ErrAlbDeg, errAlbDeg)
	s.ErrCorrDeg = append(s.ErrCorrDeg, errCorrDeg)
	s.BetaDeg = append(s.BetaDeg, degOf(math.Asin(sinBeta)))
	s.SunBodyAz = append(s.SunBodyAz, degOf(math.Atan2(sunBody.Y, sunBody.X)))
	s.SunBodyEl = append(s.SunBodyEl, degOf(math.Asin(max(-1, min(1, sunBody.Z)))))
	for i := range real {
		s.Signal = append(s.Signal, real[i].Signal)
	}
}

// reserve makes room for n samples in all, so that appending up to n
// allocates nothing more.
func (s *Series) reserve(n int) {
	if n <= cap(s.T) {
		return
	}
	more := n - len(s.T)
	s.T = slices.Grow(s.T, more)
	s.Region = slices.Grow(s.Region, more)
	s.Lit = slices.Grow(s.Lit, more)
	s.Seen = slices.Grow(s.Seen, more)
	s.Valid = slices.Grow(s.Valid, more)
	s.ErrNoDeg = slices.Grow(s.ErrNoDeg, more)
	s.ErrAlbDeg = slices.Grow(s.ErrAlbDeg, more)
	s.ErrCorrDeg = slices.Grow(s.ErrCorrDeg, more)
	s.BetaDeg = slices.Grow(s.BetaDeg, more)
	s.SunBodyAz = slices.Grow(s.SunBodyAz, more)
	s.SunBodyEl = slices.Grow(s.SunBodyEl, more)
	s.Signal = slices.Grow(s.Signal, more*len(s.SensorName))
}

// reset empties the series, keeping its arrays for the next samples.
func (s *Series) reset() {
	s.T, s.Region, s.Lit, s.Seen, s.Valid = s.T[:0], s.Region[:0], s.Lit[:0], s.Seen[:0], s.Valid[:0]
	s.ErrNoDeg, s.ErrAlbDeg, s.ErrCorrDeg, s.BetaDeg = s.ErrNoDeg[:0], s.ErrAlbDeg[:0], s.ErrCorrDeg[:0], s.BetaDeg[:0]
	s.SunBodyAz, s.SunBodyEl, s.Signal = s.SunBodyAz[:0], s.SunBodyEl[:0], s.Signal[:0]
}

// extend appends the samples of the next piece of the same series.
func (s *Series) extend(t *Series) {
	s.T = append(s.T, t.T...)
	s.Region = append(s.Region, t.Region...)
	s.Lit = append(s.Lit, t.Lit...)
	s.Seen = append(s.Seen, t.Seen...)
	s.Valid = append(s.Valid, t.Valid...)
	s.ErrNoDeg = append(s.ErrNoDeg, t.ErrNoDeg...)
	s.ErrAlbDeg = append(s.ErrAlbDeg, t.ErrAlbDeg...)
	s.ErrCorrDeg = append(s.ErrCorrDeg, t.ErrCorrDeg...)
	s.BetaDeg = append(s.BetaDeg, t.BetaDeg...)
	s.SunBodyAz = append(s.SunBodyAz, t.SunBodyAz...)
	s.SunBodyEl = append(s.SunBodyEl, t.SunBodyEl...)
	s.Signal = append(s.Signal, t.Signal...)
}

// corrected folds in a sunlit sample's estimate from the corrected
// readings, beside the estimate without albedo eNo, and returns its error
// (deg; NaN when invalid).
func (ea *estAcc) corrected(t float64, eCorr, eNo sensor.Estimate, sunBody r3.Vec) float64 {
	ea.gapsCorr.Observe(t, !eCorr.Valid)
	if !eCorr.Valid {
		return math.NaN()
	}
	ea.validCorr++
	d := degOf(angleBetween(eCorr.Dir, sunBody))
	ea.mCorr.Add(d)
	ea.qCorr.Add(d)
	if eNo.Valid {
		p := degOf(angleBetween(eCorr.Dir, eNo.Dir))
		ea.mResid.Add(p)
		ea.qResid.Add(p)
	}
	return d
}

// end closes the accumulator's piece of grid at tEnd.
func (a *unitAcc) end(tEnd float64) {
	for i := range a.est {
		a.est[i].gaps.End(tEnd)
		if a.corrected {
			a.est[i].gapsCorr.End(tEnd)
		}
	}
}

// merge folds in the accumulator of the next piece of the same unit's grid.
func (a *unitAcc) merge(b *unitAcc) {
	a.samples += b.samples
	a.sunlit += b.sunlit
	a.pen += b.pen
	a.umb += b.umb
	for k := range a.seenAtLeast {
		a.seenAtLeast[k] += b.seenAtLeast[k]
	}
	for i := range a.inView {
		a.inView[i] += b.inView[i]
		a.moonInView[i] += b.moonInView[i]
		a.litEarthInView[i] += b.litEarthInView[i]
		a.blinded[i] += b.blinded[i]
		a.peak[i] = max(a.peak[i], b.peak[i])
		a.cellPeak[i] = max(a.cellPeak[i], b.cellPeak[i])
		a.saturated[i] += b.saturated[i]
		a.falseSunSensor[i] += b.falseSunSensor[i]
		a.sensorAlbedoOnly[i] += b.sensorAlbedoOnly[i]
		a.sensorWrong[i] += b.sensorWrong[i]
	}
	a.falseSunAny += b.falseSunAny
	a.betaMin = min(a.betaMin, b.betaMin)
	a.betaMax = max(a.betaMax, b.betaMax)
	for j := range a.est {
		x, y := &a.est[j], &b.est[j]
		x.validAlb += y.validAlb
		x.validNo += y.validNo
		x.gaps.Merge(y.gaps)
		x.mNo.Merge(&y.mNo)
		x.mAlb.Merge(&y.mAlb)
		x.mPart.Merge(&y.mPart)
		x.qNo.Merge(y.qNo)
		x.qAlb.Merge(y.qAlb)
		x.qPart.Merge(y.qPart)
		x.falseSun += y.falseSun
		x.albedoOnly += y.albedoOnly
		x.wrong += y.wrong
		x.mFalse.Merge(&y.mFalse)
		x.qFalse.Merge(y.qFalse)
		if a.corrected {
			x.validCorr += y.validCorr
			x.gapsCorr.Merge(y.gapsCorr)
			x.mCorr.Merge(&y.mCorr)
			x.mResid.Merge(&y.mResid)
			x.qCorr.Merge(y.qCorr)
			x.qResid.Merge(y.qResid)
		}
	}
	if a.series != nil && b.series != nil {
		// Grown once to the whole run's rows, not by doubling as the
		// pieces arrive (a year at 10 s keeps 3 M rows).
		steps, stride := a.cfg.Steps(), a.cfg.SeriesStride
		a.series.reserve((steps + stride - 1) / stride)
		a.series.extend(b.series)
	}
	if a.timeline != nil && b.timeline != nil {
		a.timeline.extend(b.timeline)
	}
	a.track = append(a.track, b.track...)
	a.nadirTrack = append(a.nadirTrack, b.nadirTrack...)
}

// release recycles the quantile bins of an accumulator already merged into
// another one.
func (a *unitAcc) release() {
	for j := range a.est {
		e := &a.est[j]
		e.qNo.release()
		e.qAlb.release()
		e.qPart.release()
		e.qFalse.release()
		if a.corrected {
			e.qCorr.release()
			e.qResid.release()
		}
	}
}

// finish completes the merged accumulator of a whole unit.
func (a *unitAcc) finish() {
	for i := range a.est {
		a.est[i].gaps.Finish()
		if a.corrected {
			a.est[i].gapsCorr.Finish()
		}
	}
}

func frac(n, d int) float64 {
	if d == 0 {
		return math.NaN()
	}
	return float64(n) / float64(d)
}

func (a *unitAcc) result() *UnitResult {
	r := &UnitResult{
		Unit: a.unit, Samples: a.samples,
		SunlitFraction: frac(a.sunlit, a.samples), PenumbraFraction: frac(a.pen, a.samples),
		UmbraFraction: frac(a.umb, a.samples), FalseSunFraction: frac(a.falseSunAny, a.umb),
		BetaMinDeg: degOf(math.Asin(a.betaMin)), BetaMaxDeg: degOf(math.Asin(a.betaMax)),
		Series: a.series, Timeline: a.timeline, SunTrack: a.track, NadirTrack: a.nadirTrack, Filter: a.filter,
	}
	for k := 1; k <= 3; k++ {
		r.SeenAtLeast[k] = frac(a.seenAtLeast[k], a.sunlit)
	}
	for i, name := range a.names {
		r.Sensors = append(r.Sensors, SensorStats{Name: name, InViewFraction: frac(a.inView[i], a.sunlit),
			PeakSignal: a.peak[i], SaturatedFraction: frac(a.saturated[i], a.sunlit),
			FalseSunFraction: frac(a.falseSunSensor[i], a.umb), AlbedoOnlyFraction: frac(a.sensorAlbedoOnly[i], a.sunlit),
			MoonInViewFraction: frac(a.moonInView[i], a.samples), LitEarthInViewFraction: frac(a.litEarthInView[i], a.samples),
			BlindedFraction: math.NaN(), WrongFraction: math.NaN(), PeakOutput: a.peak[i]})
		if a.hasCells[i] {
			r.Sensors[i].PeakOutput = a.cellPeak[i]
		}
		if a.canBlind[i] {
			r.Sensors[i].BlindedFraction = frac(a.blinded[i], a.samples)
		}
		if a.twoAxis[i] {
			r.Sensors[i].WrongFraction = frac(a.sensorWrong[i], a.sunlit)
		}
	}
	for j, e := range a.cfg.Estimators {
		ea := &a.est[j]
		es := EstimatorStats{Name: e.Name(), ValidFraction: frac(ea.validAlb, a.sunlit),
			ValidFractionNoAlbedo: frac(ea.validNo, a.sunlit), NumGaps: ea.gaps.N, GapLengths: ea.gaps.Lengths,
			LongestGapS: ea.gaps.Longest, LongestAtS: ea.gaps.LongestAt,
			ErrNoAlbedo: errorStats(&ea.mNo, ea.qNo), ErrAlbedo: errorStats(&ea.mAlb, ea.qAlb),
			AlbedoPart: errorStats(&ea.mPart, ea.qPart), FalseSunFraction: frac(ea.falseSun, a.umb),
			FalseSunFromNadir: errorStats(&ea.mFalse, ea.qFalse), errNo: ea.qNo, errAlb: ea.qAlb,
			AlbedoOnlyFraction: frac(ea.albedoOnly, a.sunlit), WrongFraction: frac(ea.wrong, a.sunlit)}
		if !a.albedo {
			es.errAlb = nil
		}
		if a.corrected {
			es.Corrected = &CorrectedStats{ValidFraction: frac(ea.validCorr, a.sunlit), LongestGapS: ea.gapsCorr.Longest,
				Err: errorStats(&ea.mCorr, ea.qCorr), ResidualPart: errorStats(&ea.mResid, ea.qResid)}
		}
		if a.listGaps {
			es.Gaps, es.GapStartS = ea.gaps.Durations, ea.gaps.Starts
		}
		r.Estimators = append(r.Estimators, es)
	}
	return r
}

// realisticP95 is the p95 error of the readings the spacecraft would get.
func (e *EstimatorStats) realisticP95() float64 {
	if e.ErrAlbedo.N > 0 {
		return e.ErrAlbedo.P95Deg
	}
	return e.ErrNoAlbedo.P95Deg
}

func acrossUnits(units []*UnitResult) []AcrossUnits {
	if len(units) < 2 {
		return nil
	}
	var out []AcrossUnits
	for j := range units[0].Estimators {
		au := AcrossUnits{Name: units[0].Estimators[j].Name, MinValidFraction: math.Inf(1), P95OfUnitP95CorrectedDeg: math.NaN()}
		var corr []float64
		for _, u := range units {
			e := &u.Estimators[j]
			p := e.realisticP95()
			au.UnitP95Deg = append(au.UnitP95Deg, p)
			if math.IsNaN(p) {
				au.UnitsWithoutEstimate++
			}
			au.MinValidFraction = min(au.MinValidFraction, e.ValidFraction)
			if e.FalseSunFraction > 0 {
				au.UnitsWithFalseSun++
			}
			au.WorstFalseSunFraction = max(au.WorstFalseSunFraction, e.FalseSunFraction)
			au.WorstAlbedoOnlyFraction = max(au.WorstAlbedoOnlyFraction, e.AlbedoOnlyFraction)
			au.WorstWrongFraction = max(au.WorstWrongFraction, e.WrongFraction)
			if e.Corrected != nil {
				corr = append(corr, e.Corrected.Err.P95Deg)
			}
		}
		s := worstFirstMissing(au.UnitP95Deg)
		au.P50OfUnitP95Deg = stat.Quantile(0.5, stat.Empirical, s, nil)
		au.P95OfUnitP95Deg = stat.Quantile(0.95, stat.Empirical, s, nil)
		au.WorstUnitP95Deg = s[len(s)-1]
		if len(corr) == len(units) {
			au.P95OfUnitP95CorrectedDeg = stat.Quantile(0.95, stat.Empirical, worstFirstMissing(corr), nil)
		}
		out = append(out, au)
	}
	return out
}

// worstFirstMissing returns the values sorted, a missing one (NaN: a unit
// without any valid estimate) as +Inf: it reached no error bound at all.
// The quantiles over units take them by the one definition the project
// uses, gonum's stat.Empirical (the smallest value with at least p·N
// values at or below it), as plots uses for its p95 marks.
func worstFirstMissing(v []float64) []float64 {
	s := make([]float64, len(v))
	for i, x := range v {
		if math.IsNaN(x) {
			x = math.Inf(1)
		}
		s[i] = x
	}
	sort.Float64s(s)
	return s
}
