package review

import (
	"codeberg.org/sunsight/sunsight/scenario/study"
	"fmt"
	"math"
	"strings"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// orbitText describes the orbit in a few words.
func orbitText(s *scenario.Scenario) string {
	o := s.Orbit
	inc := o.InclinationRad
	if el, err := study.MeanElements(s); err == nil {
		inc = el.Inclination
	}
	switch o.Kind {
	case scenario.OrbitSunSync:
		return fmt.Sprintf("%.0f km sun-synchronous, LTAN %s (i %.2f°)", o.AltitudeKm, scenario.FormatLocalTime(o.LTANHours), degOf(inc))
	case scenario.OrbitCircular:
		return fmt.Sprintf("%.0f km circular, i %.2f°", o.AltitudeKm, degOf(inc))
	}
	return fmt.Sprintf("a %.1f km, e %.4f, i %.2f° (%s)", o.SemiMajorAxisKm, o.Eccentricity, degOf(inc), o.Kind)
}

func axisText(v r3.Vec) string {
	for _, c := range []struct {
		n string
		v r3.Vec
	}{{"+X", r3.Vec{X: 1}}, {"-X", r3.Vec{X: -1}}, {"+Y", r3.Vec{Y: 1}}, {"-Y", r3.Vec{Y: -1}}, {"+Z", r3.Vec{Z: 1}}, {"-Z", r3.Vec{Z: -1}}} {
		if r3.Norm(r3.Sub(v, c.v)) < 1e-9 {
			return c.n
		}
	}
	return fmt.Sprintf("(%.2f, %.2f, %.2f)", v.X, v.Y, v.Z)
}

func lawText(l scenario.Law) string {
	switch l.Name {
	case scenario.LawNadir:
		return "nadir pointing (" + axisText(l.PointAxis) + " to nadir)"
	case scenario.LawSun:
		return "sun pointing (" + axisText(l.PointAxis) + " to the sun)"
	case scenario.LawSpin:
		return fmt.Sprintf("spin about %s at %.2f °/s", axisText(l.SpinAxis), degOf(l.RateRadS))
	case scenario.LawTumble:
		return fmt.Sprintf("tumbling (rates up to %.1f °/s)", degOf(l.MaxRateRadS))
	case scenario.LawInertial:
		return "inertial pointing"
	case scenario.LawIsotropic:
		return "isotropic (every attitude equally likely)"
	}
	return l.Name
}

func attitudeText(a scenario.Attitude) string {
	if a.Name == scenario.LawSchedule && a.InSunlight != nil && a.InEclipse != nil {
		return lawText(*a.InSunlight) + " in sunlight, " + lawText(*a.InEclipse) + " in eclipse"
	}
	return lawText(a.Law)
}

// albedoText is the albedo model in a few words, from its registry entry.
func albedoText(s *scenario.Scenario) string {
	m, err := albedo.LookupModel(s.Albedo.Model)
	if err != nil {
		return s.Albedo.Model
	}
	return m.Brief(s.Albedo.Value)
}

func hasErrorModels(s *scenario.Scenario) bool {
	for _, sn := range s.Body.Sensors {
		e := sn.Errors
		if e.DarkOffset1Sigma > 0 || e.Gain1Sigma > 0 || e.Noise1Sigma > 0 || e.MisalignmentRad1Sigma > 0 ||
			e.ApertureOffsetMM1Sigma > 0 {
			return true
		}
		info, _ := sensor.LookupKind(sn.Kind)
		for _, es := range info.Sources {
			if es.Param != "" && sn.Params.Num[es.Param] > 0 {
				return true
			}
		}
	}
	return false
}

func captionOf(s *scenario.Scenario, cfg sim.Config, res *sim.Result) plots.Caption {
	c := plots.Caption{
		Scenario: fmt.Sprintf("%s — %s, %s, %s from %s UTC at %s steps", s.Name, orbitText(s), attitudeText(s.Attitude),
			scenario.Span(math.Round(res.DurationS)*1e9), s.Epoch.Format("2006-01-02 15:04"), scenario.Span(res.StepS*1e9)),
		Model: fmt.Sprintf("%s orbit, %s sun, %s shadow, %s", s.Orbit.Propagator, s.SunModel, s.Shadow, albedoText(s)),
	}
	a := fmt.Sprintf("%d sensors, primary estimator %s", cfg.Array.Len(), res.Nominal.Estimators[0].Name)
	if hasErrorModels(s) {
		a += fmt.Sprintf(", sensor error models on, %d unit(s), seed %d", len(res.Units), s.Seed)
	} else {
		a += ", ideal sensors (no error model)"
	}
	c.Assumptions = a + "; analysis aid, not flight verification"
	return c
}

// figures of merit, formatted; an undefined value prints study.Missing.
func pct(f float64) string {
	if math.IsNaN(f) {
		return study.Missing
	}
	return fmt.Sprintf("%.1f", 100*f)
}

func num(v float64, prec int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return study.Missing
	}
	return fmt.Sprintf("%.*f", prec, v)
}

// wrongShare is the share of valid estimates more than the run's false-sun
// bound (validity.false_sun_bound_deg) off the sun: the engine's
// WrongFraction (of sunlit time) over the valid fraction; NaN when no
// estimate was valid.
func wrongShare(e *sim.EstimatorStats) float64 {
	if !(e.ValidFraction > 0) {
		return math.NaN()
	}
	return e.WrongFraction / e.ValidFraction
}

// wrongFlag is the warning of an estimator that is valid but wrong: more
// than 5 % of its valid estimates lie beyond the false-sun bound, so its
// valid share must not be read as a share of good estimates (5 %: common
// practice, no source; it matches the p95 every error figure quotes).
func wrongFlag(e *sim.EstimatorStats, boundDeg float64) string {
	w := wrongShare(e)
	if !(w > 0.05) {
		return ""
	}
	return fmt.Sprintf("valid but wrong: %.0f %% of its valid estimates are more than %g° off the sun", 100*w, boundDeg)
}

// Provenance says where a report comes from: the input file and its
// SHA-256, the tool version and VCS revision, and when it was made.
type Provenance struct {
	Input       string // path of the scenario file as given
	InputSHA256 string // hex
	Version     string // module version
	Revision    string // VCS revision ("" when not recorded)
	Generated   time.Time
}

func (p Provenance) fields(seed int64) []plots.Field {
	or := func(v string) string {
		if v == "" {
			return study.Missing
		}
		return v
	}
	gen := study.Missing
	if !p.Generated.IsZero() {
		gen = p.Generated.UTC().Format("2006-01-02 15:04 UTC")
	}
	return []plots.Field{
		{Name: "Date", Value: gen},
		{Name: "Input", Value: or(p.Input)},
		{Name: "Input SHA-256", Value: or(p.InputSHA256)},
		{Name: "Tool", Value: "sunsight " + or(p.Version)},
		{Name: "Revision", Value: or(p.Revision)},
		{Name: "Seed", Value: fmt.Sprint(seed)},
	}
}

func verdict(ok bool) *bool { return &ok }

// Report builds the design-review report of a run: headline figures judged
// against the scenario's targets, the mount table, every figure, the
// estimators side by side, the models with their sources, and the scenario
// as run. version names the tool build.
func Report(s *scenario.Scenario, cfg sim.Config, res *sim.Result, figs []Named, prov Provenance) (plots.Report, error) {
	if err := checkInputs(s, cfg, res); err != nil {
		return plots.Report{}, err
	}
	r := plots.Report{
		Title:          "Sun sensor design review: " + s.Name,
		Provenance:     prov.fields(s.Seed),
		ScenarioRecord: string(s.Record()),
		Mounts:         mounts(s, cfg),
	}
	hl, checks, err := headline(s, cfg, res)
	if err != nil {
		return r, err
	}
	r.Headline = hl
	r.Verdict = verdictOf(checks)
	cap := captionOf(s, cfg, res)
	for _, f := range figs {
		if f.Chart == nil {
			return r, fmt.Errorf("review: figure %q has no chart", f.Name)
		}
		// The caption is set as HTML text under the figure (it reflows);
		// the figure itself is drawn without it.
		svg, err := f.Chart.Uncaptioned().SVG()
		if err != nil {
			return r, fmt.Errorf("review: figure %q: %w", f.Name, err)
		}
		c := f.Chart.Caption
		if c == (plots.Caption{}) {
			c = cap
		}
		fig := plots.Figure{Title: f.Title, Caption: f.Tells, Lines: c.Lines(), SVG: svg}
		if len(f.Chart.Panels) > 2 {
			fig.Shape = "tall"
		}
		r.Figures = append(r.Figures, fig)
	}
	r.Assumptions = assumptions(s)
	r.Tables = append(r.Tables, estimatorTable(res))
	if ot, ok := onboardTable(s, res); ok {
		r.Tables = append(r.Tables, ot)
	}
	if ft, ok := filterTable(s, res); ok {
		r.Tables = append(r.Tables, ft)
	}
	r.Tables = append(r.Tables, sensorTable(s, cfg, res), bodiesTable(res))
	r.Notes = append(r.Notes, Skipped(res, s.Output.Figures)...)
	for _, w := range study.Warnings(s, res) {
		r.Notes = append(r.Notes, "Warning: "+w+".")
	}
	r.Notes = append(r.Notes,
		"Coverage figures are fractions of the whole body-frame sphere (Fibonacci lattice of "+fmt.Sprint(sky.DefaultPoints)+
			" points); visibility figures are fractions of the run's sunlit time.",
		"This report is an analysis aid for design trades. Flight hardware and software need qualified verification before any flight decision.")
	return r, nil
}

func mounts(s *scenario.Scenario, cfg sim.Config) []plots.MountRow {
	byName := map[string]scenario.Sensor{}
	for _, sn := range s.Body.Sensors {
		byName[sn.Name] = sn
	}
	var out []plots.MountRow
	for _, row := range cfg.Array.Rows() {
		face := row.Face
		if sc, ok := byName[row.Name]; ok {
			face = sc.Face
			if face == "" {
				face = "vector"
			}
			if sc.TiltRad != 0 {
				face += fmt.Sprintf(", tilt %.1f°", degOf(sc.TiltRad))
			}
		}
		az, el := azEl(r3.Vec{X: row.Boresight[0], Y: row.Boresight[1], Z: row.Boresight[2]})
		half := row.FOVDeg
		if row.LinearDeg > 0 {
			half = row.LinearDeg // a quadrant: where its readings can be valid, per axis (see the sensor table's note)
		}
		out = append(out, plots.MountRow{Name: row.Name, Kind: string(row.Kind), Face: face, AzDeg: az, ElDeg: el, HalfAngleDeg: half})
	}
	return out
}

// realisticP95 is the p95 error of the readings the spacecraft would get:
// with albedo when modelled.
func realisticP95(e *sim.EstimatorStats) (float64, string) {
	if e.ErrAlbedo.N > 0 {
		return e.ErrAlbedo.P95Deg, "with albedo"
	}
	return e.ErrNoAlbedo.P95Deg, "no albedo modelled"
}

// verdictOf is the report banner of the target checks (study.Judge).
func verdictOf(checks []study.TargetCheck) plots.Verdict {
	v := study.Judge(checks)
	out := plots.Verdict{Status: v.Status(), Text: v.Text()}
	if v.Failed > 0 {
		out.Text = fmt.Sprintf("%d of %d targets failed", v.Failed, v.Total)
	}
	for _, c := range checks {
		if !c.Pass {
			out.Failed = append(out.Failed, fmt.Sprintf("%s: got %s, required %s", c.Label, c.Value, c.Required))
		}
	}
	return out
}

func headline(s *scenario.Scenario, cfg sim.Config, res *sim.Result) ([]plots.HeadlineRow, []study.TargetCheck, error) {
	// The figures and verdicts come from the run's one assessment.
	a := study.Assess(s, cfg, res)
	if a.CoverageErr != nil {
		return nil, nil, fmt.Errorf("review: %w", a.CoverageErr)
	}
	h, cov, checks := a.Headline, a.Coverage, a.Targets
	t := s.Targets
	e := &res.Nominal.Estimators[0]
	judge := func(r *plots.HeadlineRow, key string) {
		if c, ok := study.FindTarget(checks, key); ok {
			r.Target, r.Pass = c.Required, verdict(c.Pass)
		}
	}
	row := func(label, value, unit string) plots.HeadlineRow {
		return plots.HeadlineRow{Label: label, Value: value, Unit: unit}
	}
	rows := []plots.HeadlineRow{
		row("Sunlit time", pct(h.SunlitFraction), "% of run"),
		row("Eclipses in the run", fmt.Sprint(h.Eclipses), "count"),
	}
	if h.Eclipses > 0 {
		rows = append(rows, row("Eclipse duration, mean / longest", num(h.EclipseMeanMin, 1)+" / "+num(h.EclipseMaxMin, 1), "min"))
	}
	rows = append(rows,
		row("Beta angle range", num(h.BetaMinDeg, 1)+" … "+num(h.BetaMaxDeg, 1), "deg"),
		row("Sun in view of ≥ 1 sensor", pct(h.Seen1), "% of sunlit time"),
		row("Sun in view of ≥ 2 sensors", pct(h.Seen2), "% of sunlit time"),
		row("Sun in view of ≥ 3 sensors", pct(h.Seen3), "% of sunlit time"),
	)

	valid := row("Valid sun vector ("+e.Name+")", pct(e.ValidFraction), "% of sunlit time")
	valid.Flag = wrongFlag(e, res.FalseSunBoundDeg)
	judge(&valid, study.TargetValid)
	rows = append(rows, valid)

	p95, which := realisticP95(e)
	errRow := row("Sun-vector error p95 ("+which+")", num(p95, 2), "deg")
	judge(&errRow, study.TargetErrorP95)
	rows = append(rows, errRow, row("Sun-vector error p95 without albedo", num(e.ErrNoAlbedo.P95Deg, 2), "deg"))
	if e.AlbedoPart.N > 0 {
		rows = append(rows, row("Error added by albedo p95", num(e.AlbedoPart.P95Deg, 2), "deg"))
	}
	rows = append(rows, row("Largest error", num(h.MaxErrorDeg, 2), "deg"))
	if cfg.NewAlbedo != nil {
		rows = append(rows, row("Valid only because of albedo (false sun)", pct(e.AlbedoOnlyFraction), "% of sunlit time"))
	}
	rows = append(rows, row(fmt.Sprintf("Valid but more than %g° off (false sun)", res.FalseSunBoundDeg), pct(e.WrongFraction), "% of sunlit time"))
	// Sensor errors light the umbra measure with or without albedo (which
	// alone cannot, on a spherical Earth).
	rows = append(rows, row("False sun in umbra (no direct sun)", pct(e.FalseSunFraction), "% of umbra time"))
	if len(res.AcrossUnits) > 0 {
		au := res.AcrossUnits[0]
		if au.UnitsWithFalseSun > 0 {
			rows = append(rows, row(fmt.Sprintf("False sun in umbra, worst of %d units (%d have one)", len(res.Units), au.UnitsWithFalseSun),
				pct(au.WorstFalseSunFraction), "% of umbra time"))
		}
		u := row(fmt.Sprintf("p95 error reached by 95 %% of %d units (%s)", len(res.Units), which), num(au.P95OfUnitP95Deg, 2), "deg")
		if study.JudgedFigures(s, h).Corrected {
			u.Label = fmt.Sprintf("p95 error reached by 95 %% of %d units (on-board corrected)", len(res.Units))
			u.Value = num(au.P95OfUnitP95CorrectedDeg, 2)
		}
		if au.UnitsWithoutEstimate > 0 {
			u.Flag = fmt.Sprintf("%d of %d units never had a valid estimate; they count as the worst", au.UnitsWithoutEstimate, len(res.Units))
		}
		judge(&u, study.TargetErrorP95Units)
		rows = append(rows, u)
	}

	gap := row("Longest sunlit gap", num(e.LongestGapS, 0), "s")
	judge(&gap, study.TargetGap)
	rows = append(rows, gap)

	k := t.CoverageSensors
	if k < 1 || k > sky.MaxLevel {
		k = 0
	}
	for lvl := 1; lvl <= sky.MaxLevel; lvl++ {
		c := row(fmt.Sprintf("Sky directions in view of ≥ %d sensor(s)", lvl), pct(cov.AtLeast[lvl]), "% of sphere")
		if lvl == k {
			judge(&c, study.TargetCoverage)
		}
		rows = append(rows, c)
	}
	if k > 0 {
		crit := study.Missing
		if i := cov.Critical[k]; i >= 0 && i < cfg.Array.Len() {
			crit = cfg.Array.Sensors()[i].Name()
		}
		f := row(fmt.Sprintf("Sky directions in view of ≥ %d with the worst sensor failed (%s)", k, crit), pct(cov.WorstOneFailed[k]), "% of sphere")
		judge(&f, study.TargetCoverageOneFailed)
		rows = append(rows, f)
	}
	if pw := res.Power; pw != nil {
		avg := row("Solar-array power, orbit average (nominal attitude)", num(pw.MeanW, 2), "W")
		judge(&avg, study.TargetPower)
		rows = append(rows, avg,
			row("Energy per whole orbit, mean / worst", num(pw.OrbitMeanWh, 2)+" / "+num(pw.OrbitWorstWh, 2), "Wh"),
			row("Longest span without power; orbit-average load drawn across it", num(pw.LongestNoPowerS/60, 1)+" min; "+num(pw.GapEnergyWh, 2), "min; Wh"))
	}
	return rows, checks, nil
}

// estimatorTable lists the estimators side by side on the same readings.
func estimatorTable(res *sim.Result) plots.Table {
	t := plots.Table{Title: "Sun-vector estimators side by side (same readings)",
		Header: []string{"estimator", "valid (% of sunlit)", "valid without albedo (% of sunlit)", "p95 without albedo (deg)",
			"p95 with albedo (deg)", "albedo part p95 (deg)", fmt.Sprintf("valid but > %g° off (%% of valid)", res.FalseSunBoundDeg),
			"longest gap (s)", "gaps (count)", "p95 reached by 95 % of units (deg)"},
		Note: fmt.Sprintf("— : not defined for this run (no albedo model, one unit, or no valid estimate). ⚠ marks an estimator valid but wrong: more than 5 %% of its valid estimates lie more than %g° off the sun (validity.false_sun_bound_deg).", res.FalseSunBoundDeg)}
	for j, e := range res.Nominal.Estimators {
		name := e.Name
		if j == 0 {
			name += " (primary)"
		}
		units := study.Missing
		if j < len(res.AcrossUnits) {
			units = num(res.AcrossUnits[j].P95OfUnitP95Deg, 2)
		}
		with, part := study.Missing, study.Missing
		if e.ErrAlbedo.N > 0 {
			with, part = num(e.ErrAlbedo.P95Deg, 2), num(e.AlbedoPart.P95Deg, 2)
		}
		wrong := pct(wrongShare(&e))
		if wrongFlag(&e, res.FalseSunBoundDeg) != "" {
			name = "⚠ " + name
			wrong = "⚠ " + wrong
		}
		t.Rows = append(t.Rows, []string{name, pct(e.ValidFraction), pct(e.ValidFractionNoAlbedo), num(e.ErrNoAlbedo.P95Deg, 2),
			with, part, wrong, num(e.LongestGapS, 0), fmt.Sprint(e.NumGaps), units})
	}
	return t
}

// sensorTable lists each sensor's time in view, peak signal against its full
// scale, saturation and false sun.
func sensorTable(s *scenario.Scenario, cfg sim.Config, res *sim.Result) plots.Table {
	t := plots.Table{Title: "Sensors (signal 1 = normal sun at 1 AU)",
		Header: []string{"sensor", "sun in view (% of sunlit)", "peak signal (1 AU sun)", "full scale (1 AU sun)", "margin above largest output (%)", "saturated (% of sunlit)", "false sun (% of umbra)",
			"valid only with albedo (% of sunlit)", fmt.Sprintf("direction > %g° off (%% of sunlit)", res.FalseSunBoundDeg)}}
	for i, sn := range res.Nominal.Sensors {
		// A kind without a converter model has no full scale and cannot
		// saturate.
		fs, margin, sat := study.Missing, study.Missing, study.Missing
		if i < len(s.Body.Sensors) && s.Body.Sensors[i].FullScale > 0 {
			f := s.Body.Sensors[i].FullScale
			fs, margin, sat = num(f, 2), fmt.Sprintf("%.0f", 100*(1-sn.PeakOutput/f)), pct(sn.SaturatedFraction)
		}
		t.Rows = append(t.Rows, []string{sn.Name, pct(sn.InViewFraction), num(sn.PeakSignal, 3), fs, margin,
			sat, pct(sn.FalseSunFraction), pct(sn.AlbedoOnlyFraction), pct(sn.WrongFraction)})
	}
	// Four-quadrant sensors: where their readings can be valid (the
	// validity gate), where light still reaches a cell, and the dead zone.
	var views []string
	for _, sn := range cfg.Array.Sensors() {
		if q, ok := sn.(*sensor.Quadrant); ok {
			views = append(views, q.Name()+": "+sensor.ViewText(q))
		}
	}
	if len(views) > 0 {
		t.Note = "Four-quadrant sensors report no sun outside their calibrated linear range or when the cell sum is off the expected one; " +
			"in a dead zone they read straight above (or no sun). " + strings.Join(views, ". ") + "."
	}
	return t
}

func assumptions(s *scenario.Scenario) []plots.Assumption {
	return append(ModelsAndSources(s), errorModelRows(s)...)
}

// ModelsAndSources lists the models a scenario uses with their published
// sources, read from the model registries: orbit, sun, shadow, attitude,
// albedo, the sensor kinds flown and the estimators.
func ModelsAndSources(s *scenario.Scenario) []plots.Assumption {
	var out []plots.Assumption
	add := func(model, what, source string) {
		out = append(out, plots.Assumption{Model: model, Source: strings.TrimPrefix(what+"; "+source, "; ")})
	}
	if p, err := orbit.LookupPropagator(s.Orbit.Propagator); err == nil {
		add("Orbit: "+p.Name, p.Model, p.Source)
	}
	if m, err := ephem.LookupSunModel(s.SunModel); err == nil {
		add("Sun: "+m.Name, m.Model, m.Source)
	}
	add("Moon", ephem.MoonModel, ephem.MoonSource)
	if m, err := illum.LookupShadow(s.Shadow); err == nil {
		add("Shadow: "+m.Name, m.Model, m.Source)
	}
	for _, l := range lawsOf(s) {
		add("Attitude: "+l.Name, l.Model, l.Source)
	}
	if s.Timeline.Set {
		add("Attitude: timeline", "phases in turn, each ending after a time, at a rate bound, once the sun is held or at a shadow entry or exit; rest-to-rest eigen-axis slews with a bang–coast–bang profile",
			"closed form; B. Wie, Space Vehicle Dynamics and Control, 2nd ed., AIAA 2008, §7.3 (from memory)")
	}
	if m, err := albedo.LookupModel(s.Albedo.Model); err == nil {
		add("Albedo: "+m.Describe(s.Albedo.Value, s.Albedo.Cells), "", m.Source)
	}
	if ob := s.Albedo.Onboard; ob != nil {
		if m, err := albedo.LookupModel(ob.Model); err == nil {
			add("Albedo on board: "+m.Describe(ob.Value, ob.Cells), onboardModel, m.Source)
		}
	}
	seen := map[string]bool{}
	for _, sn := range s.Body.Sensors {
		if k, ok := sensor.LookupKind(sn.Kind); ok && !seen[sn.Kind] {
			seen[sn.Kind] = true
			add("Sensor kind: "+sn.Kind, k.Doc, k.Source)
		}
	}
	for _, name := range s.Estimators {
		if e, err := sensor.LookupEstimator(name); err == nil {
			add("Estimator: "+e.Name, e.Model, e.Source)
		}
	}
	if s.GyroFilter.Set {
		add("Estimator: gyro-aided filter", filterModel, filterSource)
	}
	return out
}

// lawsOf lists the registry entries of the scenario's attitude laws (both
// of a schedule, each distinct law of a timeline's phases).
func lawsOf(s *scenario.Scenario) []attitude.LawInfo {
	var out []attitude.LawInfo
	laws := []*scenario.Law{&s.Attitude.Law, s.Attitude.InSunlight, s.Attitude.InEclipse}
	for i := range s.Timeline.Phases {
		laws = append(laws, &s.Timeline.Phases[i].Law)
	}
	seen := map[string]bool{}
	for _, l := range laws {
		if l == nil || seen[l.Name] {
			continue
		}
		seen[l.Name] = true
		if info, err := attitude.LookupLaw(l.Name); err == nil {
			out = append(out, info)
		}
	}
	return out
}

func errorModelRows(s *scenario.Scenario) []plots.Assumption {
	var out []plots.Assumption
	if hasErrorModels(s) {
		out = append(out, plots.Assumption{Model: fmt.Sprintf("Sensors: error models on (%d Monte Carlo unit(s))", max(s.MonteCarlo.Units, 1)),
			Source: "one-sigma values from the scenario file (user supplied)"})
	} else {
		out = append(out, plots.Assumption{Model: "Sensors: ideal (no error model)", Source: "common practice, no source: errors come from geometry and albedo only"})
	}
	out = append(out, plots.Assumption{Model: "Year view: j2-mean orbit, one orbit per day", Source: "secular J2 drift as above; eclipse search to 1 ms"})
	return append(out, viewAssumptions(s)...)
}

// viewAssumptions states what a sensor sees and what counts as a valid sun:
// the mounting plane and bus outline, seeing as a reading above threshold,
// the estimators' validity gates and the false-sun measures.
func viewAssumptions(s *scenario.Scenario) []plots.Assumption {
	bus := "no bus outline given: only each sensor's mounting plane and the listed obstructions hide the sky"
	if b := s.Body.SizeM; b != (r3.Vec{}) {
		name := "box"
		if s.Body.FormFactor != "" {
			name = s.Body.FormFactor
		}
		bus = fmt.Sprintf("bus outline %s, %.1f × %.1f × %.1f mm, hides the sky behind it from every sensor, traced from each sensor's position", name, 1e3*b.X, 1e3*b.Y, 1e3*b.Z)
	}
	var gates []string
	for _, e := range s.Estimators {
		g := s.Validity.Gates[e]
		lim := "no residual limit"
		if g.MaxResidual > 0 {
			lim = fmt.Sprintf("residual ≤ %g", g.MaxResidual)
		}
		sig := "no signal floor"
		if g.MinTotalSignal > 0 {
			sig = fmt.Sprintf("signals summing to ≥ %g of full sun", g.MinTotalSignal)
		}
		gates = append(gates, fmt.Sprintf("%s: ≥ %d sensor(s), %s, %s", e, g.MinSensors, sig, lim))
	}
	return []plots.Assumption{
		{Model: "Field of view: no sensor sees behind the surface it sits on; " + bus,
			Source: "ray casting from each sensor's position (closed form); checked against an independent numpy Monte Carlo to 0.01 point"},
		{Model: "Sun seen: the sensor's own reading from direct sun, errors off, above its threshold (never below 1e-6 of full sun)",
			Source: "definition; an edge-on sun is not seen, whatever the rounding"},
		{Model: "Validity gates: " + strings.Join(gates, "; "),
			Source: "defaults: each estimator's own minimum; half of full sun for cosine fits, since a sun on a box's lit faces sums to ≥ 1 (closed form) (common practice, no source)"},
		{Model: fmt.Sprintf("False suns: valid only because of albedo, or valid more than %g° from the sun (shares of sunlit time); valid in umbra (share of umbra time)", s.Validity.FalseSunBoundDeg),
			Source: "on a spherical Earth no sunlit ground is visible from inside the cylindrical shadow (closed form), so the umbra share comes from sensor errors only"},
	}
}
