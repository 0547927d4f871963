package review

import (
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/plots/figures"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// Named is one figure of a run: Name is the file stem ("sky", "timeline",
// …), Title the heading shown in the report.
type Named struct {
	Name, Title string
	Chart       *plots.Chart
	// Tells is the figure's message in one sentence, with the run's
	// numbers (the first line of its caption in the report).
	Tells string
}

// Figure names, in report order (the catalogue of package figures).
const (
	FigSky      = figures.Sky
	FigTimeline = figures.Timeline
	FigYear     = figures.Year
	FigError    = figures.Error
	FigGaps     = figures.Gaps
	FigPower    = figures.Power
)

// SkyCellDeg is the cell size of the sky coverage map.
const SkyCellDeg = 2.0

// TimelineOrbits is the number of orbits the timeline shows.
const TimelineOrbits = 3

// missionPoints bounds the samples the timeline of a mission timeline
// shows over the whole run.
const missionPoints = 1200

// timelinePoints bounds the samples the timeline keeps: every step of three
// orbits at 3 s steps and more, so a tumble's flicker is drawn as it was
// sampled (never finer than the run's step).
const timelinePoints = 6000

// sunTrackPoints bounds the sun and nadir track the sky map shows.
const sunTrackPoints = 4000

// cdfPoints is the number of points read from the error quantiles.
const cdfPoints = 400

// Request sets on cfg what the named figures need from the run, so that
// Figures later builds them from the result alone, without running the
// engine or a model again: the sun and nadir track (sky), a short series
// over the first TimelineOrbits orbits (timeline, and power with panels),
// and the eclipse-season
// table of the epoch's calendar year from a j2-mean orbit of the mean
// elements (year). Call it before sim.Run.
func Request(s *scenario.Scenario, cfg *sim.Config, names []string) error {
	if err := checkNames(names); err != nil {
		return err
	}
	if slices.Contains(names, FigSky) {
		cfg.SunTrackPoints = sunTrackPoints
	}
	if slices.Contains(names, FigTimeline) || slices.Contains(names, FigPower) {
		span := min(TimelineOrbits*periodOf(*cfg), cfg.Duration)
		cfg.TimelineSpan = span
		cfg.TimelineStride = max(1, int(math.Ceil(span/cfg.Step/timelinePoints)))
		if study.TimelineOf(*cfg) != nil {
			// A mission timeline is shown whole, with its phases, thinned
			// to about missionPoints samples so the figure stays small in
			// the report.
			cfg.TimelineSpan = cfg.Duration
			cfg.TimelineStride = max(1, cfg.Steps()/missionPoints)
		}
	}
	if slices.Contains(names, FigYear) {
		el, err := study.MeanElements(s)
		if err != nil {
			return fmt.Errorf("review: year figure: %w", err)
		}
		jan1 := time.Date(s.Epoch.Year(), time.January, 1, 0, 0, 0, 0, time.UTC)
		days := time.Date(s.Epoch.Year()+1, time.January, 1, 0, 0, 0, 0, time.UTC).Sub(jan1).Hours() / 24
		cfg.Season = &sim.SeasonRequest{NewPropagator: func() orbit.Propagator { return orbit.NewJ2Mean(el) },
			StartS: jan1.Sub(s.Epoch).Seconds(), Days: int(math.Round(days)), PeriodS: orbit.Period(el.SemiMajorAxisKm)}
	}
	return nil
}

// checkNames refuses a figure name the catalogue does not list.
func checkNames(names []string) error {
	for _, n := range names {
		if !slices.Contains(figures.Names(), n) {
			return fmt.Errorf("review: figure %q is not one of %s", n, strings.Join(figures.Names(), ", "))
		}
	}
	return nil
}

// figureInput is what every figure builder reads: the run and its one
// assessment.
type figureInput struct {
	s   *scenario.Scenario
	cfg sim.Config
	res *sim.Result
	cap plots.Caption
	a   study.Assessment
	tg  figureTargets
}

// builder draws one figure; drawn is false when the run has nothing to show
// in it (Skipped says why).
type builder func(in *figureInput) (f Named, drawn bool, err error)

// builders holds the builder of every catalogue figure
// (TestEveryFigureHasABuilder).
var builders = map[string]builder{
	FigSky: skyFigure, FigTimeline: timelineFigure, FigYear: yearFigure, FigError: errorFigure, FigGaps: gapsFigure,
	FigPower: powerFigure,
}

// Figures builds the named figures of a run, in report order, and no
// other: cfg is the sim.Config the run used (its Array/Viewers give the sky
// map and boresights) after Request with the same names, res its result.
// Nothing is computed again: the timeline reads the run's short series, the
// year view its season table. A run with no gap has no gap figure (see
// Skipped).
func Figures(s *scenario.Scenario, cfg sim.Config, res *sim.Result, names []string) ([]Named, error) {
	if err := checkInputs(s, cfg, res); err != nil {
		return nil, err
	}
	if err := checkNames(names); err != nil {
		return nil, err
	}
	a := study.Assess(s, cfg, res)
	in := &figureInput{s: s, cfg: cfg, res: res, cap: captionOf(s, cfg, res), a: a, tg: targetsOf(s, a)}
	var out []Named
	for _, name := range figures.Names() {
		if !slices.Contains(names, name) {
			continue
		}
		f, drawn, err := builders[name](in)
		if err != nil {
			return nil, fmt.Errorf("review: %s figure: %w", name, err)
		}
		if drawn {
			f.Name = name
			out = append(out, f)
		}
	}
	return out, nil
}

func skyFigure(in *figureInput) (Named, bool, error) {
	s, cfg, res := in.s, in.cfg, in.res
	sm, err := skyMap(s, cfg, res)
	if err != nil {
		return Named{}, false, err
	}
	sc := in.cap
	sc.Model = "Viewing convention: the body-frame sphere seen from outside, like a globe: +Z up, azimuth from +X toward +Y " +
		"increasing to the right, −X on both side edges; equal areas look equal (Hammer projection). " + sc.Model
	if n := len(res.Nominal.SunTrack); n > 0 && cfg.SunTrackPoints > 0 {
		every := float64(max(cfg.Steps()/cfg.SunTrackPoints, 1)) * cfg.Step
		sc.Assumptions = fmt.Sprintf("sun track and nadir of the nominal unit (unit 0): %d sunlit samples, one every %s (a fast rotation can alias); ", n,
			scenario.Span(every*1e9)) + sc.Assumptions
	}
	c, err := sm.Plot(sc)
	return Named{Title: "Sky coverage in body axes: sensors seeing each sun direction", Chart: c, Tells: skyTells(in.a, res, sm)}, true, err
}

func timelineFigure(in *figureInput) (Named, bool, error) {
	tl, err := timeline(in.cfg, in.res)
	if err != nil {
		return Named{}, false, err
	}
	tl.ErrorTarget, tl.ValidTarget = in.tg.errP95, in.tg.valid
	tl.ValidShare = in.res.Nominal.Estimators[0].ValidFraction
	tl.StepsPerSample = in.cfg.TimelineStride
	c, err := tl.Plot(in.cap)
	title := fmt.Sprintf("Timeline of the first %d orbits: sensors seeing the sun, validity, error", TimelineOrbits)
	if len(tl.Phases) > 0 {
		title = "Mission timeline over the whole run: phases, sensors seeing the sun, validity, error"
	}
	whole := len(tl.Phases) > 0 || in.cfg.TimelineSpan >= in.cfg.Duration
	return Named{Title: title, Chart: c, Tells: timelineTells(tl, &in.res.Nominal.Estimators[0], in.cfg.TimelineStride, whole, in.tg)}, true, err
}

func yearFigure(in *figureInput) (Named, bool, error) {
	s, res := in.s, in.res
	yv, err := yearView(res)
	if err != nil {
		return Named{}, false, err
	}
	yv.Year = s.Epoch.Year()
	d0 := float64(s.Epoch.YearDay()) + float64(s.Epoch.Hour()*3600+s.Epoch.Minute()*60+s.Epoch.Second())/86400
	yv.Run = plots.Interval{Start: d0, End: d0 + res.DurationS/86400}
	yc := in.cap
	yc.Model = fmt.Sprintf("calendar year %d; ", s.Epoch.Year()) + "j2-mean orbit from the mean elements (for speed), " + s.SunModel + " sun, " + s.Shadow + " shadow; one orbit examined per day"
	yc.Assumptions = "no attitude or sensors involved; eclipse minutes of the first complete eclipse of the day"
	c, err := yv.Plot(yc)
	return Named{Title: "Beta angle and eclipse minutes per orbit over one year", Chart: c, Tells: yearTells(yv)}, true, err
}

func errorFigure(in *figureInput) (Named, bool, error) {
	ed, ok := errorDist(in.res)
	if !ok {
		return Named{}, false, nil
	}
	ed.Target = in.tg.errP95
	c, err := ed.Plot(in.cap)
	e := &in.res.Nominal.Estimators[0]
	return Named{Title: "Sun-vector error distribution of the primary estimator (" + e.Name + ")", Chart: c, Tells: errorTells(e, in.tg)}, true, err
}

func gapsFigure(in *figureInput) (Named, bool, error) {
	g, ok := gaps(in.res)
	if !ok {
		return Named{}, false, nil
	}
	g.StepS, g.Target = in.res.StepS, in.tg.gap
	c, err := g.Plot(in.cap)
	return Named{Title: "Sunlit gaps without a valid sun vector (" + in.res.Nominal.Estimators[0].Name + ")", Chart: c, Tells: gapsTells(g)}, true, err
}

// verdictText is " — target ≤ 5.00°: FAIL" or "" without a target.
func verdictText(t *plots.Target) string {
	if t == nil {
		return ""
	}
	v := "pass"
	if !t.Pass {
		v = "FAIL"
	}
	return " (target " + t.Label + ": " + v + ")"
}

// timelineTells is the timeline's message. The peak it states is the run's
// own largest error (unit 0, every step: the headline's "Largest error"),
// not the largest of the samples the figure draws, which are one step in
// cfg.TimelineStride; the peak of the three orbits shown is added when they
// are a part of the run, said to be of the drawn samples when thinned.
func timelineTells(tl plots.Timeline, e *sim.EstimatorStats, stride int, whole bool, tg figureTargets) string {
	mx, drawn := e.ErrAlbedo.MaxDeg, peakOf(tl.ErrAlbedoDeg)
	if e.ErrAlbedo.N == 0 {
		mx, drawn = e.ErrNoAlbedo.MaxDeg, peakOf(tl.ErrNoAlbedoDeg)
	}
	t := fmt.Sprintf("Over the whole run the sun vector is valid %.1f %% of sunlit time%s and the error peaks at %s°",
		100*tl.ValidShare, verdictText(tg.valid), num(mx, 2))
	if k := e.Corrected; k != nil && tl.ErrCorrectedDeg != nil {
		t += fmt.Sprintf(" (%s° after the on-board albedo correction)", num(k.Err.MaxDeg, 2))
	}
	if tg.errP95 != nil {
		t += fmt.Sprintf(", against a p95 target of %s", tg.errP95.Label)
	}
	switch {
	case whole && stride > 1:
		t += fmt.Sprintf("; the figure draws one step in %d, so its peaks can sit below the run's", stride)
	case !whole && stride > 1:
		t += fmt.Sprintf("; in these orbits the largest drawn sample (one step in %d) is %s°", stride, num(drawn, 2))
	case !whole:
		t += fmt.Sprintf("; in these orbits it peaks at %s°", num(drawn, 2))
	}
	return t + ". " + shadingText(tl)
}

// shadingText says how the timeline marks the eclipses.
func shadingText(tl plots.Timeline) string {
	if !tl.ShadesEclipses() {
		return "Eclipses are not shaded: too many to draw at this scale."
	}
	return "Shaded: umbra (dark) and penumbra (light)."
}

// peakOf is the largest finite value of ys, NaN without one.
func peakOf(ys []float64) float64 {
	peak := math.NaN()
	for _, v := range ys {
		if !math.IsNaN(v) && !(v <= peak) {
			peak = v
		}
	}
	return peak
}

func yearTells(y plots.YearView) string {
	lo, hi, ecl, free := math.Inf(1), math.Inf(-1), 0.0, 0
	for i := range y.Day {
		lo, hi = min(lo, y.BetaDeg[i]), max(hi, y.BetaDeg[i])
		ecl = max(ecl, y.EclipseMin[i])
		if y.EclipseFree[i] {
			free++
		}
	}
	return fmt.Sprintf("In %d the beta angle ranges %.0f° … %.0f° and eclipses last up to %.0f min per orbit (one orbit examined a day); %d days are eclipse-free. "+
		"The blue band marks this run (days %.0f–%.0f): a run outside the worst season does not show the worst case.",
		y.Year, lo, hi, ecl, free, math.Floor(y.Run.Start), math.Ceil(y.Run.End))
}

func errorTells(e *sim.EstimatorStats, tg figureTargets) string {
	if e.ErrAlbedo.N == 0 {
		return fmt.Sprintf("95 %% of valid estimates are within %s°%s (no albedo modelled).", num(e.ErrNoAlbedo.P95Deg, 2), verdictText(tg.errP95))
	}
	return fmt.Sprintf("95 %% of valid estimates are within %s° with albedo%s and %s° without: the Earth's reflected light is what moves the curve right.",
		num(e.ErrAlbedo.P95Deg, 2), verdictText(tg.errP95), num(e.ErrNoAlbedo.P95Deg, 2))
}

func gapsTells(g plots.Gaps) string {
	return fmt.Sprintf("%d sunlit gaps without a valid sun vector; the longest lasts %.0f s%s.", g.Number(), g.LongestS, verdictText(g.Target))
}

// figureTargets are the scenario's targets in the units of the figures,
// with the verdicts of the one target judge (study.CheckTargets).
type figureTargets struct {
	errP95 *plots.Target // deg
	valid  *plots.Target // fraction
	gap    *plots.Target // s
	power  *plots.Target // W
}

func targetsOf(s *scenario.Scenario, a study.Assessment) figureTargets {
	checks := a.Targets
	var out figureTargets
	mk := func(key string, v float64) *plots.Target {
		c, ok := study.FindTarget(checks, key)
		if !ok {
			return nil
		}
		return &plots.Target{Value: v, Label: c.Required, Got: c.Value, Pass: c.Pass}
	}
	out.errP95 = mk(study.TargetErrorP95, degOf(s.Targets.MaxErrorP95Rad))
	out.valid = mk(study.TargetValid, s.Targets.MinValidFraction)
	out.gap = mk(study.TargetGap, s.Targets.MaxGap.Seconds())
	out.power = mk(study.TargetPower, s.Targets.MinOrbitAvgPowerW)
	return out
}

// Skipped says which of the named figures a run leaves out and why, for the
// report (a figure not asked for needs no note).
func Skipped(res *sim.Result, names []string) []string {
	var out []string
	if res == nil || res.Nominal == nil || len(res.Nominal.Estimators) == 0 {
		return nil
	}
	e := &res.Nominal.Estimators[0]
	if _, ok := errorDist(res); !ok && slices.Contains(names, FigError) {
		out = append(out, fmt.Sprintf("No error distribution: the primary estimator %s formed no valid sun vector in sunlight.", e.Name))
	}
	if _, ok := gaps(res); !ok && slices.Contains(names, FigGaps) {
		out = append(out, fmt.Sprintf("No gap figure: the primary estimator %s had a valid sun vector throughout the sunlit time.", e.Name))
	}
	return out
}

func checkInputs(s *scenario.Scenario, cfg sim.Config, res *sim.Result) error {
	switch {
	case s == nil:
		return errors.New("review: no scenario")
	case res == nil || res.Nominal == nil:
		return errors.New("review: no run result")
	case len(res.Nominal.Estimators) == 0:
		return errors.New("review: the run has no estimator result")
	case cfg.Array == nil || cfg.Array.Len() == 0:
		return errors.New("review: the run configuration has no sensors")
	}
	return nil
}

// viewers returns the run's viewers, or the sensors' own fields of view.
func viewers(cfg sim.Config) []sky.Viewer { return study.Viewers(cfg) }

func degOf(rad float64) float64 { return rad * 180 / math.Pi }

// azEl returns the body azimuth (from +X toward +Y) and elevation (toward
// +Z) of a direction, deg.
func azEl(v r3.Vec) (az, el float64) {
	u := r3.Unit(v)
	return degOf(math.Atan2(u.Y, u.X)), degOf(math.Asin(max(-1, min(1, u.Z))))
}

func skyMap(s *scenario.Scenario, cfg sim.Config, res *sim.Result) (plots.SkyMap, error) {
	g, err := sky.Map(viewers(cfg), SkyCellDeg)
	if err != nil {
		return plots.SkyMap{}, err
	}
	var m plots.SkyMap
	for a := range g.NAz {
		m.AzDeg = append(m.AzDeg, (float64(a)+0.5)*g.CellDeg)
	}
	for e := range g.NEl {
		m.ElDeg = append(m.ElDeg, -90+(float64(e)+0.5)*g.CellDeg)
		m.Counts = append(m.Counts, append([]int(nil), g.Counts[e*g.NAz:(e+1)*g.NAz]...))
	}
	for _, sn := range cfg.Array.Sensors() {
		az, el := azEl(sn.Mount().Boresight())
		m.Boresights = append(m.Boresights, plots.Marker{Name: sn.Name(), AzDeg: az, ElDeg: el})
	}
	for _, v := range res.Nominal.SunTrack {
		az, el := azEl(v)
		m.SunTrack = append(m.SunTrack, plots.Point{AzDeg: az, ElDeg: el})
	}
	for _, v := range res.Nominal.NadirTrack {
		az, el := azEl(v)
		m.Nadir = append(m.Nadir, plots.Point{AzDeg: az, ElDeg: el})
	}
	m.EarthRadiusDeg = earthRadiusDeg(cfg)
	for _, o := range s.Body.Obstructions {
		c := o.CentreM
		if o.Shape == scenario.ShapeCylinder {
			c = r3.Scale(0.5, r3.Add(o.FromM, o.ToM))
		}
		if r3.Norm(c) == 0 {
			continue
		}
		az, el := azEl(c)
		m.Obstructions = append(m.Obstructions, plots.Marker{Name: o.Name, AzDeg: az, ElDeg: el})
	}
	return m, nil
}

// earthRadiusDeg is the angular radius of the Earth seen from the orbit's
// mean radius (spherical Earth: asin(R⊕/r)).
func earthRadiusDeg(cfg sim.Config) float64 {
	st := cfg.NewPropagator().StateAt(0)
	r, v := r3.Norm(st.R), r3.Norm(st.V)
	a := 1 / (2/r - v*v/orbit.MuEarth)
	return degOf(math.Asin(min(1, orbit.RadiusEarthKm/a)))
}

// skyTells is the sky map's message with the run's numbers.
func skyTells(a study.Assessment, res *sim.Result, m plots.SkyMap) string {
	if a.CoverageErr != nil {
		return ""
	}
	cov := a.Coverage
	u := res.Nominal
	t := fmt.Sprintf("%.1f %% of body directions are blind (no sensor sees the sun there) and %.1f %% are seen by ≥ 2 sensors; "+
		"along this run's sun track the sun was seen by ≥ 1 sensor %.1f %% of sunlit time.",
		100*(1-cov.AtLeast[1]), 100*cov.AtLeast[2], 100*u.SeenAtLeast[1])
	if len(m.Nadir) > 0 {
		var sum r3.Vec
		for _, v := range res.Nominal.NadirTrack {
			sum = r3.Add(sum, v)
		}
		if r3.Norm(sum) > 0.99*float64(len(res.Nominal.NadirTrack)) {
			t += fmt.Sprintf(" The Earth fills a %.0f° disc around %s: sensors facing it get albedo.", m.EarthRadiusDeg, axisText(nearestAxis(r3.Unit(sum))))
		} else {
			t += fmt.Sprintf(" The Earth (%.0f° radius) moves over the body sphere (dots: nadir over the run).", m.EarthRadiusDeg)
		}
	}
	return t
}

// nearestAxis snaps a direction to a body axis when within 1°.
func nearestAxis(v r3.Vec) r3.Vec {
	for _, a := range []r3.Vec{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}, {Z: 1}, {Z: -1}} {
		if r3.Dot(v, a) > math.Cos(math.Pi/180) {
			return a
		}
	}
	return v
}

// periodOf is the orbit period from the run's initial state (two-body).
func periodOf(cfg sim.Config) float64 {
	st := cfg.NewPropagator().StateAt(0)
	r, v := r3.Norm(st.R), r3.Norm(st.V)
	a := 1 / (2/r - v*v/orbit.MuEarth)
	return orbit.Period(a)
}

func timeline(cfg sim.Config, res *sim.Result) (plots.Timeline, error) {
	mission := study.TimelineOf(cfg)
	ser := res.Nominal.Timeline
	if ser == nil || len(ser.T) < 2 {
		return plots.Timeline{}, errors.New("the run kept no timeline series (review.Request sets it before the run)")
	}
	span := cfg.TimelineSpan
	var tl plots.Timeline
	if mission != nil {
		for _, sp := range mission.Spans {
			tl.Phases = append(tl.Phases, plots.PhaseSpan{Name: sp.Name, Start: sp.Start, End: sp.End, Slew: sp.Slew})
		}
	}
	for i, t := range ser.T {
		if t > span {
			break
		}
		tl.T = append(tl.T, t)
		tl.SensorsSeeing = append(tl.SensorsSeeing, ser.Seen[i])
		tl.Valid = append(tl.Valid, ser.Valid[i])
		tl.ErrNoAlbedoDeg = append(tl.ErrNoAlbedoDeg, ser.ErrNoDeg[i])
		if cfg.NewAlbedo != nil {
			tl.ErrAlbedoDeg = append(tl.ErrAlbedoDeg, ser.ErrAlbDeg[i])
		}
		if cfg.NewCorrection != nil {
			tl.ErrCorrectedDeg = append(tl.ErrCorrectedDeg, ser.ErrCorrDeg[i])
		}
	}
	tl.Umbra, tl.Penumbra = shadowSpans(res.Eclipses, tl.T[len(tl.T)-1])
	return tl, nil
}

// yearView is the run's season table: the epoch's calendar year (1 January
// to 31 December, as Request asks for it), so the axis reads as day of year
// whatever the epoch.
func yearView(res *sim.Result) (plots.YearView, error) {
	if len(res.Season) == 0 {
		return plots.YearView{}, errors.New("the run kept no season table (review.Request sets it before the run)")
	}
	var y plots.YearView
	for _, r := range res.Season {
		y.Day = append(y.Day, float64(r.Day+1))
		y.BetaDeg = append(y.BetaDeg, degOf(r.Beta))
		y.EclipseMin = append(y.EclipseMin, r.ShadowS/60)
		y.EclipseFree = append(y.EclipseFree, r.EclipseFree)
	}
	return y, nil
}

func errorDist(res *sim.Result) (plots.ErrorDist, bool) {
	e := &res.Nominal.Estimators[0]
	var d plots.ErrorDist
	// Quantiles at equal probability steps are an equal-weight sample of
	// the distribution, which is what ErrSeries takes.
	// The p95 marked is the run's own (the caption's and the headline's),
	// not the p95 of those quantiles.
	if x, _ := e.ErrorCDF(cdfPoints, false); len(x) > 0 {
		p95 := e.ErrNoAlbedo.P95Deg
		d.Series = append(d.Series, plots.ErrSeries{Label: "without albedo", ErrorsDeg: x, P95Deg: &p95})
	}
	if x, _ := e.ErrorCDF(cdfPoints, true); len(x) > 0 {
		p95 := e.ErrAlbedo.P95Deg
		d.Series = append(d.Series, plots.ErrSeries{Label: "with albedo", ErrorsDeg: x, P95Deg: &p95})
	}
	if len(res.AcrossUnits) > 0 {
		d.UnitP95Deg = append([]float64(nil), res.AcrossUnits[0].UnitP95Deg...)
	}
	return d, len(d.Series) > 0
}

func gaps(res *sim.Result) (plots.Gaps, bool) {
	e := &res.Nominal.Estimators[0]
	g := plots.Gaps{LongestS: e.LongestGapS}
	for _, l := range e.GapLengths {
		g.DurationsS = append(g.DurationsS, float64(l.Steps)*res.StepS)
		g.Counts = append(g.Counts, l.Count)
	}
	return g, e.NumGaps > 0
}

// WritePlots writes every figure as dir/NAME.FORMAT for each format ("png",
// "svg", "pdf"). Each file is written through a temporary file and renamed,
// so a failure leaves no partial file; formats are checked before anything
// is written.
func WritePlots(dir string, figs []Named, formats []string) error {
	if len(formats) == 0 {
		return errors.New("review: no plot format given; use png, svg or pdf")
	}
	for _, f := range formats {
		switch strings.ToLower(f) {
		case "png", "svg", "pdf":
		default:
			return fmt.Errorf("review: plot format %q is not one of png, svg, pdf", f)
		}
	}
	if st, err := os.Stat(dir); err != nil || !st.IsDir() {
		return fmt.Errorf("review: plot folder %q does not exist or is not a folder; create it first", dir)
	}
	for _, fig := range figs {
		for _, f := range formats {
			f = strings.ToLower(f)
			path := filepath.Join(dir, fig.Name+"."+f)
			if err := plots.Save(fig.Chart, path, f); err != nil {
				return fmt.Errorf("review: writing %s: %w", path, err)
			}
		}
	}
	return nil
}
