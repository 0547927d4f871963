package budget

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"sort"
)

// ErrNoValid says a run left a Monte Carlo unit without any valid sun
// vector in sunlight: the budget has no figure for it.
var ErrNoValid = errors.New("no valid sun vector in sunlight")

// Source is one term of the error budget.
type Source int

// The error sources, in the order of the budget table before ranking.
const (
	DarkOffset Source = iota
	Gain
	Noise
	Quantisation
	Misalignment
	ApertureOffset // quadrant sensors only
	DigitalNoise   // digital sensors' stated accuracy
	Twist          // quadrant sensors' rotation about the boresight
	ShadeSize      // quadrant sensors' aperture side or wall distance per axis
	Albedo
	Temperature // the sensors' temperatures away from calibration (on/off)
	Centroid    // aperture-array sensors' centroid noise per spot
	MaskHeight  // aperture-array sensors' mask height
	NumSources
)

var sourceNames = [NumSources]string{"dark offset", "gain mismatch", "noise", "quantisation",
	"misalignment", "aperture offset", "digital accuracy", "twist", "shade size", "albedo", "temperature",
	"centroid noise", "mask height"}

// String names the source as the tables print it.
func (s Source) String() string {
	if s < 0 || s >= NumSources {
		return fmt.Sprintf("source(%d)", int(s))
	}
	return sourceNames[s]
}

// Scalable reports whether the source has a 1σ a tolerance search can vary
// (quantisation, albedo and temperature are switched on or off only).
func (s Source) Scalable() bool {
	return s != Quantisation && s != Albedo && s != Temperature && s >= 0 && s < NumSources
}

// Case is one Monte Carlo run of the budget: each source's stated value
// multiplied by Scale (0 switches the source off; quantisation and albedo
// are on for any Scale > 0).
type Case struct {
	Scale [NumSources]float64
	// Calibrated takes the sensors' error σ from the scenario's budget
	// residuals instead of the sensors' own values.
	Calibrated bool
	// Correction subtracts a uniform-albedo prediction from the cosine
	// readings, as simple flight software would.
	Correction bool
	// AtTemperature puts every sensor with a temperature coefficient (dark
	// signal or gain) at TempOffsetC from its calibration temperature, in
	// sunlight and eclipse alike; the others are unchanged.
	AtTemperature bool
	TempOffsetC   float64
}

// Only returns the case with one source at its stated value and every other off.
func Only(s Source) Case {
	var c Case
	c.Scale[s] = 1
	return c
}

// All returns the case with every source at scale 1.
func All() Case {
	var c Case
	for i := range c.Scale {
		c.Scale[i] = 1
	}
	return c
}

// AllOf returns the case with the listed sources at their stated values and
// every other off.
func AllOf(sources []Source) Case {
	var c Case
	for _, s := range sources {
		c.Scale[s] = 1
	}
	return c
}

// Metric is the sun-vector error of one run, per Monte Carlo unit: the
// primary estimator over sunlit samples with a valid estimate.
type Metric struct {
	UnitP95Deg []float64
	UnitRMSDeg []float64
}

// P95Deg is the mean over units of each unit's p95 error: the p95 of a
// typical unit.
func (m Metric) P95Deg() float64 { return mean(m.UnitP95Deg) }

// RMSDeg is the RMS error pooled over units (units weighted equally).
func (m Metric) RMSDeg() float64 {
	s := 0.0
	for _, v := range m.UnitRMSDeg {
		s += v * v
	}
	return math.Sqrt(s / float64(len(m.UnitRMSDeg)))
}

func mean(x []float64) float64 {
	s := 0.0
	for _, v := range x {
		s += v
	}
	return s / float64(len(x))
}

// RunFunc runs one case. Runs with the same seed must use the same random
// draws (common random numbers), so that scaling a σ scales the same draws.
type RunFunc func(ctx context.Context, c Case) (Metric, error)

// Term is one row of the budget.
type Term struct {
	Source Source
	P95Deg float64
	RMSDeg float64
}

// Interval is a two-sided confidence interval.
type Interval struct{ Lo, Hi float64 }

// Result is the error budget.
type Result struct {
	// Terms are the sources alone, largest p95 first.
	Terms []Term
	// All is every source together.
	All Term
	// RSSP95Deg and RSSRMSDeg are the root-sum-squares of the terms.
	RSSP95Deg, RSSRMSDeg float64
	// NonAdditiveP95Deg is All.P95Deg − RSSP95Deg, and NonAdditiveCI its
	// 95 % bootstrap interval over units (the same resampled units in every
	// run): an interval that holds zero means the budget adds in RSS within
	// sampling error. Both intervals are NaN below MinIntervalUnits units.
	NonAdditiveP95Deg float64
	NonAdditiveCI     Interval
	// NonAdditiveRMSDeg and NonAdditiveRMSCI are the same for the RMS error:
	// for independent zero-mean errors linear in their sources the variances
	// add, so the RMS budget is additive in RSS (closed form).
	NonAdditiveRMSDeg float64
	NonAdditiveRMSCI  Interval
	Units             int
}

// IntervalShown reports whether the budget has its bootstrap intervals (at
// least MinIntervalUnits units; else they are NaN).
func (r *Result) IntervalShown() bool { return !math.IsNaN(r.NonAdditiveCI.Lo) }

// MinIntervalUnits is the fewest Monte Carlo units from which the budget
// gives its 95 % bootstrap intervals (and the conclusion drawn from them).
// The percentile interval of a mean over n units uses the plug-in variance,
// smaller by (n−1)/n, and a normal quantile, so for normal units it covers
// about P(|t(n−1)| < 1.96·√((n−1)/n)) of the true value (closed form):
// 0.60 at 2 units (where the three distinct resamples make it the range of
// the two units, which holds the mean half the time), 0.85 at 5, 0.90 at 10,
// 0.92 at 16 (TestBootstrapCoverageByUnits). Ten is the first count at which
// a nominal 95 % interval covers at least 90 %: that floor is common
// practice, no source.
const MinIntervalUnits = 10

// bootstrapRounds is the number of bootstrap resamples (common practice, no
// source: 1000–2000 resamples are usual for a 95 % percentile interval).
const bootstrapRounds = 2000

// Decompose runs every source alone and the listed sources together, and
// forms the budget.
func Decompose(ctx context.Context, run RunFunc, sources []Source) (*Result, error) {
	if len(sources) == 0 {
		return nil, errors.New("budget: no error source to run")
	}
	alone := make([]Metric, len(sources))
	for i, s := range sources {
		m, err := run(ctx, Only(s))
		if err != nil {
			return nil, fmt.Errorf("budget: %s alone: %w", s, err)
		}
		alone[i] = m
	}
	all, err := run(ctx, AllOf(sources))
	if err != nil {
		return nil, fmt.Errorf("budget: all sources: %w", err)
	}
	r := &Result{All: Term{Source: -1, P95Deg: all.P95Deg(), RMSDeg: all.RMSDeg()}, Units: len(all.UnitP95Deg)}
	var s95, srms float64
	for i, s := range sources {
		if len(alone[i].UnitP95Deg) != r.Units {
			return nil, fmt.Errorf("budget: %s alone gave %d units, all sources %d", s, len(alone[i].UnitP95Deg), r.Units)
		}
		t := Term{Source: s, P95Deg: alone[i].P95Deg(), RMSDeg: alone[i].RMSDeg()}
		r.Terms = append(r.Terms, t)
		s95 += t.P95Deg * t.P95Deg
		srms += t.RMSDeg * t.RMSDeg
	}
	r.RSSP95Deg, r.RSSRMSDeg = math.Sqrt(s95), math.Sqrt(srms)
	r.NonAdditiveP95Deg = r.All.P95Deg - r.RSSP95Deg
	r.NonAdditiveRMSDeg = r.All.RMSDeg - r.RSSRMSDeg
	r.NonAdditiveCI, r.NonAdditiveRMSCI = Interval{math.NaN(), math.NaN()}, Interval{math.NaN(), math.NaN()}
	if r.Units >= MinIntervalUnits {
		r.NonAdditiveCI = bootstrapNonAdditive(alone, all, false, 1)
		r.NonAdditiveRMSCI = bootstrapNonAdditive(alone, all, true, 2)
	}
	sort.SliceStable(r.Terms, func(i, j int) bool { return r.Terms[i].P95Deg > r.Terms[j].P95Deg })
	return r, nil
}

// bootstrapNonAdditive resamples the units with replacement (Efron &
// Tibshirani 1993, An Introduction to the Bootstrap, ch. 13, percentile
// interval) and returns the 2.5 % and 97.5 % points of all − RSS(alone).
// With rms set it does the same for the pooled RMS error.
func bootstrapNonAdditive(alone []Metric, all Metric, rms bool, seed uint64) Interval {
	n := len(all.UnitP95Deg)
	rng := rand.New(rand.NewPCG(seed, 0x62756467))
	idx := make([]int, n)
	d := make([]float64, bootstrapRounds)
	for b := range d {
		for i := range idx {
			idx[i] = rng.IntN(n)
		}
		fig := func(m Metric) float64 {
			s := 0.0
			for _, i := range idx {
				if rms {
					s += m.UnitRMSDeg[i] * m.UnitRMSDeg[i]
				} else {
					s += m.UnitP95Deg[i]
				}
			}
			if rms {
				return math.Sqrt(s / float64(n))
			}
			return s / float64(n)
		}
		ss := 0.0
		for _, m := range alone {
			v := fig(m)
			ss += v * v
		}
		d[b] = fig(all) - math.Sqrt(ss)
	}
	slices.Sort(d)
	return Interval{Lo: d[int(0.025*float64(len(d)))], Hi: d[int(0.975*float64(len(d)))-1]}
}
