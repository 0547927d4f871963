package season

import (
	"context"
	"errors"
	"fmt"
	"math"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"
	"time"

	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/study"
	"codeberg.org/sunsight/sunsight/scenario/sweep"
)

// Options set a worst-season study.
type Options struct {
	// SpanS is the span scanned from the scenario's epoch (s).
	SpanS float64
	// Cases is the number of coarse cases, spread evenly over the span.
	Cases int
	// CaseS is each case's duration (s).
	CaseS float64
	// Refine is the number of refined cases on each side of a coarse
	// worst, at Δ/(Refine+1) spacing, Δ the coarse spacing.
	Refine int
	// EclipseAboveS is the stated eclipse duration of the distribution
	// (the share of orbits with a longer eclipse).
	EclipseAboveS float64
}

// DefaultOptions are a year in 24 one-day cases, refined 3 cases each side,
// and 30 min as the stated eclipse duration (common practice, no source).
func DefaultOptions() Options {
	return Options{SpanS: 365 * 86400, Cases: 24, CaseS: 86400, Refine: 3, EclipseAboveS: 1800}
}

// Validate checks the options.
func (o Options) Validate() error {
	switch {
	case !(o.SpanS > 0):
		return fmt.Errorf("season: span %g s: want a positive span", o.SpanS)
	case o.Cases < 2 || o.Cases > 10000:
		return fmt.Errorf("season: %d cases: want 2 to 10000", o.Cases)
	case !(o.CaseS > 0) || o.CaseS > o.SpanS:
		return fmt.Errorf("season: case duration %g s: want 0 < case ≤ span", o.CaseS)
	case o.Refine < 0 || o.Refine > 100:
		return fmt.Errorf("season: %d refined cases: want 0 to 100", o.Refine)
	case !(o.EclipseAboveS >= 0):
		return fmt.Errorf("season: eclipse duration %g s: want ≥ 0", o.EclipseAboveS)
	}
	return nil
}

// Case is one short run of the scan, OffsetS after the scenario's epoch.
type Case struct {
	OffsetS float64
	Epoch   time.Time
	Refined bool
	sweep.Outcome
	// Judged are the case's figures the targets judge (targets.judge):
	// its valid share, p95 error (with albedo when modelled) and longest
	// gap, uncorrected or after the on-board albedo correction. The worst
	// cases are ranked on them.
	Judged study.Judged
}

// Criteria of the worst season.
const (
	WorstValid   = "lowest valid share"
	WorstP95     = "largest p95 error"
	WorstEclipse = "longest eclipse"
)

// Worst is the worst case found for one criterion.
type Worst struct {
	Criterion string
	Case      int // index into Result.Cases; -1 when no case defines it
}

// Result is a worst-season study.
type Result struct {
	Options Options
	Cases   []Case // in time order
	Worst   []Worst
	Eclipse Distribution
}

// worse reports whether case a is worse than b for a criterion; undefined
// values (NaN) are never worse.
func worse(criterion string, a, b Case) bool {
	switch criterion {
	case WorstValid:
		return a.Judged.ValidFraction < b.Judged.ValidFraction
	case WorstP95:
		return a.Judged.P95Deg > b.Judged.P95Deg || math.IsNaN(b.Judged.P95Deg) && !math.IsNaN(a.Judged.P95Deg)
	}
	return a.Headline.EclipseMaxMin > b.Headline.EclipseMaxMin
}

func worstOf(criterion string, cases []Case) int {
	w := -1
	for i, c := range cases {
		if criterion == WorstP95 && math.IsNaN(c.Judged.P95Deg) {
			continue
		}
		if w < 0 || worse(criterion, c, cases[w]) {
			w = i
		}
	}
	return w
}

// CaseScenario returns the scenario moved offsetS seconds after its epoch
// for durationS: a sun-synchronous orbit keeps its LTAN and a TLE is carried
// to the new epoch (as the build step does), mean elements are carried by
// the secular J2 rates (orbit.J2Mean), or by the mean motion alone for the
// two-body propagator. Orbits given as osculating states or
// an ephemeris file cannot be moved.
func CaseScenario(s *scenario.Scenario, offsetS, durationS float64) (*scenario.Scenario, error) {
	offsetS = math.Round(offsetS) // whole seconds, as the epoch moves
	c := *s
	c.Epoch = s.Epoch.Add(time.Duration(offsetS) * time.Second)
	c.Duration = scenario.Span(time.Duration(math.Round(durationS)) * time.Second)
	if c.Step > c.Duration {
		c.Step = c.Duration
	}
	o := &c.Orbit
	switch {
	case o.Kind == scenario.OrbitSunSync || o.Kind == scenario.OrbitTLE:
	case o.Kind == scenario.OrbitFile || o.Kind == scenario.OrbitState || o.Osculating:
		return nil, errors.New("season: orbit: the scan moves the epoch, which needs mean elements, an LTAN or a TLE (not an osculating state or an ephemeris file)")
	default:
		el, err := study.MeanElements(s)
		if err != nil {
			return nil, err
		}
		if s.Orbit.Propagator == "two-body" {
			// Kepler's third law: only the mean anomaly moves.
			el.MeanAnomaly += offsetS * math.Sqrt(orbit.MuEarth/(el.SemiMajorAxisKm*el.SemiMajorAxisKm*el.SemiMajorAxisKm))
		} else {
			el = orbit.NewJ2Mean(el).MeanElementsAt(offsetS)
		}
		o.Kind = scenario.OrbitKeplerian
		o.SemiMajorAxisKm, o.Eccentricity, o.InclinationRad = el.SemiMajorAxisKm, el.Eccentricity, el.Inclination
		o.RAANRad, o.ArgPerigeeRad, o.MeanAnomalyRad = wrap(el.RAAN), wrap(el.ArgPerigee), wrap(el.MeanAnomaly)
	}
	return &c, nil
}

func wrap(x float64) float64 {
	x = math.Mod(x, 2*math.Pi)
	if x < 0 {
		x += 2 * math.Pi
	}
	return x
}

// Run scans the span with short cases, refines around the worst of each
// criterion, and computes the eclipse distribution of the whole span.
func Run(ctx context.Context, s *scenario.Scenario, opt Options, progress func(done, total int)) (*Result, error) {
	if err := opt.Validate(); err != nil {
		return nil, err
	}
	r := &Result{Options: opt}
	Δ := opt.SpanS / float64(opt.Cases)
	total := opt.Cases + 3*2*opt.Refine
	// The eclipse distribution of the span runs beside the cases.
	type eclipses struct {
		d   Distribution
		err error
	}
	eclDone := make(chan eclipses, 1)
	go func() {
		d, err := Eclipses(s, opt.SpanS, opt.EclipseAboveS)
		eclDone <- eclipses{d, err}
	}()
	// runAll runs the cases at offsets offs (none already run, none twice)
	// on every core and appends them in the order of offs: each case is a
	// run of its own, so the order they finish in changes nothing.
	var mu sync.Mutex
	done := 0
	runAll := func(offs []float64, refined bool) error {
		cases := make([]Case, len(offs))
		errs := make([]error, len(offs))
		var next atomic.Int64
		var wg sync.WaitGroup
		for range min(runtime.GOMAXPROCS(0), len(offs)) {
			wg.Go(func() {
				for {
					i := int(next.Add(1) - 1)
					if i >= len(offs) || ctx.Err() != nil {
						return
					}
					cs, err := CaseScenario(s, offs[i], opt.CaseS)
					if err != nil {
						errs[i] = err
						return
					}
					out, err := sweep.RunCase(ctx, cs, uint64(s.Seed))
					if err != nil {
						errs[i] = fmt.Errorf("season: case at %s: %w", cs.Epoch.Format(time.RFC3339), err)
						return
					}
					cases[i] = Case{OffsetS: offs[i], Epoch: cs.Epoch, Refined: refined, Outcome: out, Judged: study.JudgedFigures(cs, out.Headline)}
					mu.Lock()
					done++
					if progress != nil {
						progress(done, total)
					}
					mu.Unlock()
				}
			})
		}
		wg.Wait()
		if err := ctx.Err(); err != nil {
			return err
		}
		for _, err := range errs {
			if err != nil {
				return err
			}
		}
		r.Cases = append(r.Cases, cases...)
		return nil
	}
	// seen reports whether a case at off is run or listed already.
	seen := func(off float64, listed []float64) bool {
		for _, c := range r.Cases {
			if math.Abs(c.OffsetS-off) < 0.5 {
				return true
			}
		}
		for _, o := range listed {
			if math.Abs(o-off) < 0.5 {
				return true
			}
		}
		return false
	}
	fail := func(err error) (*Result, error) {
		<-eclDone
		return nil, err
	}
	last := opt.SpanS - opt.CaseS // the last start that keeps a case inside the span
	var offs []float64
	for k := range opt.Cases {
		if off := min(float64(k)*Δ, last); !seen(off, offs) {
			offs = append(offs, off)
		}
	}
	if err := runAll(offs, false); err != nil {
		return fail(err)
	}
	coarse := append([]Case(nil), r.Cases...)
	offs = offs[:0]
	for _, crit := range []string{WorstValid, WorstP95, WorstEclipse} {
		w := worstOf(crit, coarse)
		if w < 0 {
			continue
		}
		for j := -opt.Refine; j <= opt.Refine; j++ {
			off := coarse[w].OffsetS + float64(j)*Δ/float64(opt.Refine+1)
			if j == 0 || off < 0 || off > last || seen(off, offs) {
				continue
			}
			offs = append(offs, off)
		}
	}
	if err := runAll(offs, true); err != nil {
		return fail(err)
	}
	slices.SortFunc(r.Cases, func(a, b Case) int { return compare(a.OffsetS, b.OffsetS) })
	for _, crit := range []string{WorstValid, WorstP95, WorstEclipse} {
		r.Worst = append(r.Worst, Worst{Criterion: crit, Case: worstOf(crit, r.Cases)})
	}
	e := <-eclDone
	if e.err != nil {
		return nil, e.err
	}
	r.Eclipse = e.d
	return r, nil
}

func compare(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}
