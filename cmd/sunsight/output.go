package main

import (
	"bytes"
	"codeberg.org/sunsight/sunsight/scenario/study"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"reflect"
	"strconv"
	"strings"
	"time"
	"unicode/utf8"

	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/internal/atomicfile"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// schemaVersion numbers the layout of the JSON record.
const schemaVersion = 1

// runOutput formats one run for people (summary), machines (JSON) and
// spreadsheets (CSV).
type runOutput struct {
	s       *scenario.Scenario
	cfg     *sim.Config
	res     *sim.Result
	version string
	// assessed is the run judged once (study.Assess); cov, covErr and
	// targets are its parts.
	assessed study.Assessment
	cov      sky.Result
	covErr   error
	targets  []study.TargetCheck
	// allUnits writes every Monte Carlo unit into the per-unit CSV tables
	// (run --all-units); otherwise the nominal unit only.
	allUnits bool
	// modes are the scenario's named modes, run beside the primary
	// attitude (modes.go).
	modes []modeOutput
	// warnings are study.Warnings of the run (notes.go).
	warnings []string
	// phases are the per-phase figures of a timeline run (timeline.go).
	phases *study.Phases
	// series is series.csv, written as the run went (nil without --csv).
	series *seriesFile
}

func newRunOutput(s *scenario.Scenario, cfg *sim.Config, res *sim.Result, version string) *runOutput {
	o := &runOutput{s: s, cfg: cfg, res: res, version: version}
	o.warnings = study.Warnings(s, res)
	if cfg.Units > 1 && cfg.UnitsAlike() {
		o.warnings = append(o.warnings, fmt.Sprintf("%d Monte Carlo units, but nothing is drawn per unit (no sensor has a drawn error or noise): every unit gives unit 0's numbers; give the sensors an errors block for a spread over units", cfg.Units))
	}
	o.assessed = study.Assess(s, *cfg, res)
	o.cov, o.covErr, o.targets = o.assessed.Coverage, o.assessed.CoverageErr, o.assessed.Targets
	return o
}

// num is a float that encodes NaN and ±Inf as JSON null, with a fixed
// number of significant digits so records diff cleanly.
type num float64

func (n num) MarshalJSON() ([]byte, error) {
	v := float64(n)
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return []byte("null"), nil
	}
	return strconv.AppendFloat(nil, v, 'g', 10, 64), nil
}

// jsonFields turns a struct of floats, ints, strings and bools into an
// ordered JSON object using its json tags (NaN-safe).
type jsonFields struct{ v any }

func (j jsonFields) MarshalJSON() ([]byte, error) {
	rv := reflect.ValueOf(j.v)
	rt := rv.Type()
	var b bytes.Buffer
	b.WriteByte('{')
	for i := range rt.NumField() {
		f := rt.Field(i)
		tag := f.Tag.Get("json")
		if tag == "" || !f.IsExported() {
			continue
		}
		if b.Len() > 1 {
			b.WriteByte(',')
		}
		key, _ := json.Marshal(tag)
		b.Write(key)
		b.WriteByte(':')
		var val any = rv.Field(i).Interface()
		if x, ok := val.(float64); ok {
			val = num(x)
		}
		enc, err := json.Marshal(val)
		if err != nil {
			return nil, err
		}
		b.Write(enc)
	}
	b.WriteByte('}')
	return b.Bytes(), nil
}

type jsonErr struct {
	N       int  `json:"n"`
	Mean    num  `json:"mean_deg"`
	RMS     num  `json:"rms_deg"`
	P50     num  `json:"p50_deg"`
	P95     num  `json:"p95_deg"`
	P99     num  `json:"p99_deg"`
	Max     num  `json:"max_deg"`
	Defined bool `json:"defined"`
}

func errJSON(e sim.ErrorStats) jsonErr {
	return jsonErr{N: e.N, Mean: num(e.MeanDeg), RMS: num(e.RMSDeg), P50: num(e.P50Deg), P95: num(e.P95Deg),
		P99: num(e.P99Deg), Max: num(e.MaxDeg), Defined: e.N > 0}
}

type jsonEstimator struct {
	Name              string  `json:"name"`
	Valid             num     `json:"valid_fraction"`
	ValidNoAlbedo     num     `json:"valid_fraction_no_albedo"`
	Gaps              int     `json:"sunlit_gaps"`
	LongestGapS       num     `json:"longest_gap_s"`
	LongestAtS        num     `json:"longest_gap_start_s"`
	ErrNoAlbedo       jsonErr `json:"error_no_albedo"`
	ErrAlbedo         jsonErr `json:"error_albedo"`
	AlbedoPart        jsonErr `json:"albedo_part"`
	FalseSun          num     `json:"false_sun_fraction_of_umbra"`
	FalseSunFromNadir jsonErr `json:"false_sun_from_nadir"`
	AlbedoOnly        num     `json:"valid_only_with_albedo_fraction_of_sunlit"`
	BeyondBound       num     `json:"valid_beyond_false_sun_bound_fraction_of_sunlit"`
	// Corrected is the estimator on the readings corrected by the on-board
	// albedo model (albedo.onboard); absent without one.
	Corrected *jsonCorrected `json:"onboard_corrected,omitempty"`
}

// jsonCorrected is sim.CorrectedStats: validity and error to the truth of
// the corrected readings, and the albedo part the correction leaves.
type jsonCorrected struct {
	Valid    num     `json:"valid_fraction"`
	Err      jsonErr `json:"error_onboard_corrected"`
	Residual jsonErr `json:"residual_albedo_part"`
}

// onboardRecord states the on-board albedo model against the truth's, and
// what the corrected figures mean (study.OnboardNote).
type onboardRecord struct {
	Truth     string `json:"truth_albedo_model"`
	Onboard   string `json:"onboard_albedo_model"`
	SameModel bool   `json:"same_model_as_truth"`
	Note      string `json:"note"`
}

type jsonSensor struct {
	Name   string `json:"name"`
	InView num    `json:"in_view_fraction"`
	Peak   num    `json:"peak_signal"`
	// The largest single output the full scale applies to (a quadrant's
	// largest cell).
	PeakOutput num `json:"peak_output"`
	Saturated  num `json:"saturated_fraction"`
	FalseSun   num `json:"false_sun_fraction_of_umbra"`
	// A cosine sensor gives no direction: its beyond-bound share is null.
	AlbedoOnly  num `json:"valid_only_with_albedo_fraction_of_sunlit"`
	BeyondBound num `json:"valid_beyond_false_sun_bound_fraction_of_sunlit"`
	// Shares of all time; blinded is null for a sensor without a blinding
	// rule that can act.
	MoonInView     num `json:"moon_in_view_fraction"`
	LitEarthInView num `json:"lit_earth_in_view_fraction"`
	Blinded        num `json:"blinded_fraction"`
}

type jsonUnit struct {
	Unit       int             `json:"unit"`
	Sunlit     num             `json:"sunlit_fraction"`
	Penumbra   num             `json:"penumbra_fraction"`
	Umbra      num             `json:"umbra_fraction"`
	Seen1      num             `json:"seen_by_1_fraction"`
	Seen2      num             `json:"seen_by_2_fraction"`
	Seen3      num             `json:"seen_by_3_fraction"`
	FalseSun   num             `json:"false_sun_fraction_of_umbra"`
	BetaMinDeg num             `json:"beta_min_deg"`
	BetaMaxDeg num             `json:"beta_max_deg"`
	Sensors    []jsonSensor    `json:"sensors"`
	Estimators []jsonEstimator `json:"estimators"`
	// GyroFilter is the gyro-aided filter's figures (gyro_filter block).
	GyroFilter *jsonFilter `json:"gyro_filter,omitempty"`
}

// jsonFilter is sim.FilterStats: shares and errors over the whole run and
// over eclipse, and the outages of the primary point estimate it held.
type jsonFilter struct {
	Valid          num     `json:"valid_fraction_of_run"`
	ValidShadow    num     `json:"valid_fraction_of_shadow"`
	Err            jsonErr `json:"error"`
	ErrShadow      jsonErr `json:"error_in_shadow"`
	HoldLastShadow jsonErr `json:"held_estimate_error_in_shadow"`
	Outages        int     `json:"outages"`
	OutagesHeld    int     `json:"outages_held"`
	ShortestBreakS num     `json:"shortest_break_s"`
	LongestHeldS   num     `json:"longest_held_s"`
	Starts         int     `json:"starts"`
	HoldBoundDeg   num     `json:"hold_bound_deg"`
}

func filterJSON(f *sim.FilterStats) *jsonFilter {
	if f == nil {
		return nil
	}
	return &jsonFilter{Valid: num(f.ValidFraction), ValidShadow: num(f.ValidShadowFraction), Err: errJSON(f.Err),
		ErrShadow: errJSON(f.ErrShadow), HoldLastShadow: errJSON(f.HoldLastShadow), Outages: f.Outages, OutagesHeld: f.OutagesHeld,
		ShortestBreakS: num(f.ShortestBreakS), LongestHeldS: num(f.LongestHeldS), Starts: f.Starts, HoldBoundDeg: num(f.HoldBoundDeg)}
}

type jsonEclipse struct {
	StartS      num  `json:"penumbra_start_s"`
	UmbraStartS num  `json:"umbra_start_s"`
	UmbraEndS   num  `json:"umbra_end_s"`
	EndS        num  `json:"penumbra_end_s"`
	Cut         bool `json:"cut_by_span"`
}

func unitJSON(u *sim.UnitResult) jsonUnit {
	j := jsonUnit{Unit: u.Unit, Sunlit: num(u.SunlitFraction), Penumbra: num(u.PenumbraFraction), Umbra: num(u.UmbraFraction),
		Seen1: num(u.SeenAtLeast[1]), Seen2: num(u.SeenAtLeast[2]), Seen3: num(u.SeenAtLeast[3]), FalseSun: num(u.FalseSunFraction),
		BetaMinDeg: num(u.BetaMinDeg), BetaMaxDeg: num(u.BetaMaxDeg), GyroFilter: filterJSON(u.Filter)}
	for _, s := range u.Sensors {
		j.Sensors = append(j.Sensors, jsonSensor{s.Name, num(s.InViewFraction), num(s.PeakSignal), num(s.PeakOutput), num(s.SaturatedFraction), num(s.FalseSunFraction),
			num(s.AlbedoOnlyFraction), num(s.WrongFraction), num(s.MoonInViewFraction), num(s.LitEarthInViewFraction), num(s.BlindedFraction)})
	}
	for _, e := range u.Estimators {
		j.Estimators = append(j.Estimators, jsonEstimator{Name: e.Name, Valid: num(e.ValidFraction), ValidNoAlbedo: num(e.ValidFractionNoAlbedo),
			Gaps: e.NumGaps, LongestGapS: num(e.LongestGapS), LongestAtS: num(e.LongestAtS), ErrNoAlbedo: errJSON(e.ErrNoAlbedo),
			ErrAlbedo: errJSON(e.ErrAlbedo), AlbedoPart: errJSON(e.AlbedoPart), FalseSun: num(e.FalseSunFraction),
			FalseSunFromNadir: errJSON(e.FalseSunFromNadir), AlbedoOnly: num(e.AlbedoOnlyFraction), BeyondBound: num(e.WrongFraction)})
		if k := e.Corrected; k != nil {
			j.Estimators[len(j.Estimators)-1].Corrected = &jsonCorrected{num(k.ValidFraction), errJSON(k.Err), errJSON(k.ResidualPart)}
		}
	}
	return j
}

// runRecord is the whole JSON document of a run (run --json, run.json in
// the --csv folder). It is the one owner of the record's layout: the JSON
// Schema docs/schema/run.schema.json is generated from these types and every
// name is listed in docs/data-dictionary.md (both checked by tests).
type runRecord struct {
	SchemaVersion int                `json:"schema_version"`
	Tool          toolRecord         `json:"tool"`
	Scenario      scenarioRecord     `json:"scenario"`
	Run           runInfoRecord      `json:"run"`
	Headline      headlineRecord     `json:"headline"`
	EclipseStats  eclipseStatsRecord `json:"eclipse_stats"`
	Eclipses      []jsonEclipse      `json:"eclipses"`
	Units         []jsonUnit         `json:"units"`
	AcrossUnits   []acrossRecord     `json:"across_units"`
	SkyCoverage   *skyRecord         `json:"sky_coverage,omitempty"`
	// OnboardAlbedo is the on-board albedo model (albedo.onboard).
	OnboardAlbedo *onboardRecord       `json:"onboard_albedo,omitempty"`
	Power         *powerRecord         `json:"power,omitempty"`
	Targets       []study.TargetRecord `json:"targets"`
	Verdict       verdictRecord        `json:"verdict"`
	Modes         []modeRecord         `json:"modes,omitempty"`
	// SingleFailure is the single-failure study (targets.n_minus_1).
	SingleFailure *singleFailureRecord `json:"single_failure,omitempty"`
	// Timeline is the mission timeline's phases with their own figures.
	Timeline []phaseRecord `json:"timeline,omitempty"`
	// Warnings are study.Warnings of the run (sun model span, TLE age, a
	// run shorter than one orbit); TumbleDraws the drawn tumbles per unit.
	Warnings    []string            `json:"warnings"`
	TumbleDraws []tumbleDrawsRecord `json:"tumble_draws,omitempty"`
}

type toolRecord struct {
	Name    string `json:"name"`
	Version string `json:"version"`
}

// scenarioRecord names the scenario; the seed is a string (a 64-bit value
// that JSON numbers in JavaScript and jq would round).
type scenarioRecord struct {
	Name   string `json:"name"`
	Seed   string `json:"seed"`
	Record string `json:"record"`
}

type runInfoRecord struct {
	Epoch            string `json:"epoch"`
	DurationS        num    `json:"duration_s"`
	StepS            num    `json:"step_s"`
	Steps            int    `json:"steps"`
	Units            int    `json:"units"`
	FalseSunBoundDeg num    `json:"false_sun_bound_deg"`
}

// headlineRecord is sim.Headline under its json names, NaN as null.
type headlineRecord struct{ h sim.Headline }

func (h headlineRecord) MarshalJSON() ([]byte, error) { return jsonFields{h.h}.MarshalJSON() }

type eclipseStatsRecord struct {
	Count           int `json:"eclipses"`
	MeanS           num `json:"mean_s"`
	MaxS            num `json:"max_s"`
	TotalS          num `json:"total_s"`
	MeanUmbraS      num `json:"mean_umbra_s"`
	MaxUmbraS       num `json:"max_umbra_s"`
	ShadowFraction  num `json:"shadow_fraction"`
	PerOrbit        num `json:"eclipses_per_orbit"`
	ShadowPerOrbitS num `json:"shadow_per_orbit_s"`
	LongestSunlitS  num `json:"longest_sunlit_s"`
	LongestShadowS  num `json:"longest_shadow_s"`
}

type acrossRecord struct {
	Estimator        string `json:"estimator"`
	P50OfUnitP95Deg  num    `json:"p50_of_unit_p95_error_deg"`
	P95OfUnitP95Deg  num    `json:"p95_of_unit_p95_error_deg"`
	WorstUnitP95Deg  num    `json:"worst_unit_p95_error_deg"`
	MinValidFraction num    `json:"min_valid_fraction"`
	UnitP95Deg       []num  `json:"unit_p95_error_deg"`
	// UnitsWithoutEstimate counts the units without any valid estimate
	// (null in unit_p95_error_deg); the quantiles count them as the worst.
	UnitsWithoutEstimate int `json:"units_without_estimate"`
	// P95OfUnitP95CorrectedDeg: after the on-board albedo correction.
	P95OfUnitP95CorrectedDeg num `json:"p95_of_unit_p95_error_onboard_corrected_deg"`
	// The false suns over the units: units with one in umbra, and the
	// largest shares of any unit.
	UnitsWithFalseSun       int `json:"units_with_false_sun_in_umbra"`
	WorstFalseSunFraction   num `json:"worst_unit_false_sun_fraction_of_umbra"`
	WorstAlbedoOnlyFraction num `json:"worst_unit_albedo_only_fraction"`
	WorstWrongFraction      num `json:"worst_unit_wrong_fraction"`
}

// skyRecord is the layout's sky coverage: the share of the body-frame sky
// seen by at least 1, 2, 3 sensors, and the same with the worst one failed.
type skyRecord struct {
	Points     int `json:"points"`
	Seen1      num `json:"sky_seen_by_1_fraction"`
	Seen2      num `json:"sky_seen_by_2_fraction"`
	Seen3      num `json:"sky_seen_by_3_fraction"`
	OneFailed1 num `json:"sky_seen_by_1_one_failed_fraction"`
	OneFailed2 num `json:"sky_seen_by_2_one_failed_fraction"`
	OneFailed3 num `json:"sky_seen_by_3_one_failed_fraction"`
}

// powerRecord is the solar-array power over the run (nominal attitude).
type powerRecord struct {
	MeanW           num `json:"orbit_average_power_w"`
	PeakW           num `json:"peak_power_w"`
	Orbits          int `json:"whole_orbits"`
	OrbitMeanWh     num `json:"energy_per_orbit_mean_wh"`
	OrbitWorstWh    num `json:"energy_per_orbit_worst_wh"`
	LongestNoPowerS num `json:"longest_no_power_s"`
	GapEnergyWh     num `json:"eclipse_energy_gap_wh"`
}

type verdictRecord struct {
	Status        string   `json:"status"`
	Targets       int      `json:"targets"`
	Failed        int      `json:"failed"`
	FailedTargets []string `json:"failed_targets"`
	Text          string   `json:"text"`
	// Judge is the estimate the sun-vector targets judge (targets.judge).
	Judge string `json:"judge"`
}

type modeRecord struct {
	Mode     string               `json:"mode"`
	Primary  bool                 `json:"primary"`
	Headline headlineRecord       `json:"headline"`
	Targets  []study.TargetRecord `json:"targets"`
}

// record builds the JSON document of the run.
func (o *runOutput) record() runRecord {
	r := o.res
	ecl := []jsonEclipse{}
	for _, e := range r.Eclipses {
		ecl = append(ecl, jsonEclipse{num(e.PenumbraStart), num(e.UmbraStart), num(e.UmbraEnd), num(e.PenumbraEnd), e.StartCut || e.EndCut})
	}
	units := []jsonUnit{}
	for _, u := range r.Units {
		units = append(units, unitJSON(u))
	}
	across := []acrossRecord{}
	for _, a := range r.AcrossUnits {
		p := make([]num, len(a.UnitP95Deg))
		for i, v := range a.UnitP95Deg {
			p[i] = num(v)
		}
		across = append(across, acrossRecord{a.Name, num(a.P50OfUnitP95Deg), num(a.P95OfUnitP95Deg), num(a.WorstUnitP95Deg),
			num(a.MinValidFraction), p, a.UnitsWithoutEstimate, num(a.P95OfUnitP95CorrectedDeg),
			a.UnitsWithFalseSun, num(a.WorstFalseSunFraction), num(a.WorstAlbedoOnlyFraction), num(a.WorstWrongFraction)})
	}
	es := r.EclipseStats
	v := study.Judge(o.allTargets())
	rec := runRecord{
		SchemaVersion: schemaVersion,
		Tool:          toolRecord{"sunsight", o.version},
		Scenario:      scenarioRecord{o.s.Name, strconv.FormatInt(int64(o.s.Seed), 10), string(o.s.Record())},
		Run: runInfoRecord{o.s.Epoch.Format(time.RFC3339), num(r.DurationS), num(r.StepS), r.Steps, len(r.Units),
			num(r.FalseSunBoundDeg)},
		Headline: headlineRecord{r.Headline()},
		EclipseStats: eclipseStatsRecord{es.Count, num(es.MeanS), num(es.MaxS), num(es.TotalS), num(es.MeanUmbraS),
			num(es.MaxUmbraS), num(es.ShadowFraction), num(es.EclipsesPerOrbit), num(es.ShadowPerOrbitS),
			num(es.LongestSunlitS), num(es.LongestShadowS)},
		Eclipses:    ecl,
		Units:       units,
		AcrossUnits: across,
		Targets:     study.Records(o.targets),
		Verdict:     verdictRecord{v.Status(), v.Total, v.Failed, append([]string{}, v.FailedKeys...), v.Text(), o.s.Targets.Judge},
	}
	if o.covErr == nil {
		c := o.cov
		rec.SkyCoverage = &skyRecord{c.Points, num(c.AtLeast[1]), num(c.AtLeast[2]), num(c.AtLeast[3]),
			num(c.WorstOneFailed[1]), num(c.WorstOneFailed[2]), num(c.WorstOneFailed[3])}
	}
	if ob := o.s.Albedo.Onboard; ob != nil {
		rec.OnboardAlbedo = &onboardRecord{o.s.Albedo.Label(), ob.Label(), o.s.Albedo.SameModel(*ob), study.OnboardNote(o.s)}
	}
	if p := r.Power; p != nil {
		rec.Power = &powerRecord{num(p.MeanW), num(p.PeakW), p.Orbits, num(p.OrbitMeanWh), num(p.OrbitWorstWh),
			num(p.LongestNoPowerS), num(p.GapEnergyWh)}
	}
	if len(o.modes) > 0 {
		rec.Modes = o.modesJSON()
	}
	rec.SingleFailure = o.singleFailureJSON()
	rec.Timeline = o.timelineJSON()
	o.notesJSON(&rec)
	return rec
}

func (o *runOutput) jsonBytes() ([]byte, error) {
	var b bytes.Buffer
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false) // "<=" stays readable
	enc.SetIndent("", "  ")
	if err := enc.Encode(o.record()); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

func (o *runOutput) writeJSON(w io.Writer) error {
	b, err := o.jsonBytes()
	if err != nil {
		return err
	}
	_, err = w.Write(b)
	return err
}

func pct(f float64) string {
	if math.IsNaN(f) {
		return "     " + study.Missing
	}
	return fmt.Sprintf("%5.1f %%", 100*f)
}

func deg(f float64) string {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return study.Missing
	}
	return fmt.Sprintf("%.2f°", f)
}

// writeSummary prints the readable summary table.
func (o *runOutput) writeSummary(w io.Writer) {
	s, r, u := o.s, o.res, o.res.Nominal
	fmt.Fprintf(w, "sunsight run: %s\n", s.Name)
	fmt.Fprintf(w, "  %s for %s at %s steps (%d samples), seed %d, %d unit(s)\n", s.Epoch.Format(time.RFC3339), s.Duration, s.Step, r.Steps, s.Seed, len(r.Units))
	a, e := s.Orbit.SemiMajorAxisKm, s.Orbit.Eccentricity
	if el, err := study.MeanElements(s); err == nil {
		a, e = el.SemiMajorAxisKm, el.Eccentricity // mean values for every kind (a file or a state too)
	}
	fmt.Fprintf(w, "  orbit %s, a = %.1f km (mean altitude %.0f km), e = %.4f; propagator %s; sun %s; %s shadow; attitude %s; albedo %s\n",
		s.Orbit.Kind, a, a-orbit.RadiusEarthKm, e,
		s.Orbit.Propagator, s.SunModel, s.Shadow, s.Attitude.Name, albedoLabel(s))
	if s.Orbit.Kind == scenario.OrbitSunSync {
		if el, err := study.MeanElements(s); err == nil {
			fmt.Fprintf(w, "  sun-synchronous: inclination %.3f°, RAAN %.3f° (EME2000) from LTAN %s %s solar time\n",
				el.Inclination*180/math.Pi, el.RAAN*180/math.Pi, scenario.FormatLocalTime(s.Orbit.LTANHours), s.Orbit.LTANSolarTime)
		}
	}
	o.writeNotes(w)
	es := r.EclipseStats
	fmt.Fprintf(w, "\nIllumination\n")
	fmt.Fprintf(w, "  sunlit %s   penumbra %s   umbra %s   beta %.1f° to %.1f°\n", pct(u.SunlitFraction), pct(u.PenumbraFraction), pct(u.UmbraFraction), u.BetaMinDeg, u.BetaMaxDeg)
	switch {
	case es.Count > 0 && es.Complete == 0:
		// Means and maxima are over complete eclipses: there are none.
		fmt.Fprintf(w, "  eclipses %d, all cut by the run's ends: %.1f min of shadow in the run, longest sunlit spell %.1f min\n",
			es.Count, es.TotalS/60, es.LongestSunlitS/60)
	case es.Count > 0:
		cut := ""
		if n := es.Count - es.Complete; n > 0 {
			cut = fmt.Sprintf(" (%d cut by the run's ends, not in the mean and longest)", n)
		}
		fmt.Fprintf(w, "  eclipses %d%s: mean %.1f min, longest %.1f min (umbra %.1f min), longest sunlit spell %.1f min\n",
			es.Count, cut, es.MeanS/60, es.MaxS/60, es.MaxUmbraS/60, es.LongestSunlitS/60)
	default:
		fmt.Fprintf(w, "  no eclipse in the span\n")
	}
	fmt.Fprintf(w, "\nSun in the field of view (share of sunlit time)\n")
	fmt.Fprintf(w, "  by >=1 sensor %s   >=2 %s   >=3 %s\n", pct(u.SeenAtLeast[1]), pct(u.SeenAtLeast[2]), pct(u.SeenAtLeast[3]))
	if o.covErr == nil {
		c := o.cov
		fmt.Fprintf(w, "  sky coverage of the layout: >=1 %s   >=2 %s   >=3 %s   (any one sensor failed: >=1 %s)\n",
			pct(c.AtLeast[1]), pct(c.AtLeast[2]), pct(c.AtLeast[3]), pct(c.WorstOneFailed[1]))
	}
	fmt.Fprintf(w, "\nSun-vector estimate (sunlit time; errors to the true sun)\n")
	// The false suns have a table of their own below (a "false sun"
	// column here, of umbra time alone, read as "no false suns" beside
	// estimates valid but far off in sunlight).
	fmt.Fprintf(w, "  %-16s %8s %9s %13s %11s %12s %9s\n", "estimator", "valid", "max gap", "p95 no albedo", "p95 albedo", "albedo part", "max")
	for _, e := range u.Estimators {
		mx := e.ErrNoAlbedo.MaxDeg
		if e.ErrAlbedo.N > 0 {
			mx = e.ErrAlbedo.MaxDeg
		}
		fmt.Fprintf(w, "  %-16s %8s %7.0f s %13s %11s %12s %9s\n", e.Name, pct(e.ValidFraction), e.LongestGapS,
			deg(e.ErrNoAlbedo.P95Deg), deg(e.ErrAlbedo.P95Deg), deg(e.AlbedoPart.P95Deg), deg(mx))
	}
	o.writeFilter(w)
	o.writeOnboard(w)
	fmt.Fprintf(w, "\nFalse suns (share of sunlit time; umbra: share of umbra time)\n")
	fmt.Fprintf(w, "  %-16s %22s %22s %10s\n", "estimator", "valid only with albedo", fmt.Sprintf("valid, > %g° off", r.FalseSunBoundDeg), "umbra")
	for _, e := range u.Estimators {
		fmt.Fprintf(w, "  %-16s %22s %22s %10s\n", e.Name, pct(e.AlbedoOnlyFraction), pct(e.WrongFraction), pct(e.FalseSunFraction))
	}
	fmt.Fprintf(w, "  (umbra: a valid estimate with no direct sun; from albedo it cannot happen on a spherical Earth, only from sensor errors)\n")
	if len(r.AcrossUnits) > 0 {
		fmt.Fprintf(w, "\nMonte Carlo over %d units (p95 error of each unit)\n", len(r.Units))
		for _, a := range r.AcrossUnits {
			fmt.Fprintf(w, "  %-16s median %s   reached by 95 %% of units %s   worst %s   lowest validity %s\n", a.Name,
				deg(a.P50OfUnitP95Deg), deg(a.P95OfUnitP95Deg), deg(a.WorstUnitP95Deg), pct(a.MinValidFraction))
			if a.UnitsWithoutEstimate > 0 {
				fmt.Fprintf(w, "  %-16s (%d of %d units never had a valid estimate: they count as the worst, — where they decide)\n", "",
					a.UnitsWithoutEstimate, len(r.Units))
			}
			if a.UnitsWithFalseSun > 0 || a.WorstAlbedoOnlyFraction > 0 || a.WorstWrongFraction > 0 {
				fmt.Fprintf(w, "  %-16s worst unit: false sun in umbra %s (%d of %d units have one), valid only with albedo %s, valid > %g° off %s\n", "",
					pct(a.WorstFalseSunFraction), a.UnitsWithFalseSun, len(r.Units), pct(a.WorstAlbedoOnlyFraction), r.FalseSunBoundDeg, pct(a.WorstWrongFraction))
			}
		}
	}
	fmt.Fprintf(w, "\nSensors (signal 1 = normal sun at 1 AU)\n  %-14s %9s %12s %15s %10s %10s %12s %12s\n", "sensor", "in view", "peak signal", "full scale", "saturated",
		"umbra lit", "albedo only", fmt.Sprintf("> %g° off", r.FalseSunBoundDeg))
	for i, sn := range u.Sensors {
		// A kind without a converter model has no full scale and cannot
		// saturate.
		fs, sat := "—", "—"
		if i < len(s.Body.Sensors) && s.Body.Sensors[i].FullScale > 0 {
			f := s.Body.Sensors[i].FullScale
			fs, sat = fmt.Sprintf("%.2f (%+.0f %%)", f, 100*(1-sn.PeakOutput/f)), pct(sn.SaturatedFraction)
		}
		fmt.Fprintf(w, "  %-14s %9s %12.3f %15s %10s %10s %12s %12s\n", sn.Name, pct(sn.InViewFraction), sn.PeakSignal, fs, sat,
			pct(sn.FalseSunFraction), pct(sn.AlbedoOnlyFraction), pct(sn.WrongFraction))
	}
	fmt.Fprintf(w, "  (full scale: ADC range, with the margin left above the largest output — a quadrant's largest cell, whose peak signal is\n")
	fmt.Fprintf(w, "   the sum of four —, — for a kind without one; saturated: share of sunlit time\n")
	fmt.Fprintf(w, "   at full scale; umbra lit: share of umbra time above threshold;")
	fmt.Fprintf(w, " albedo only: share of sunlit time valid only because of albedo;\n   off: a two-axis direction that far from the sun)\n")
	writeBodiesInView(w, u.Sensors)
	for _, sn := range o.cfg.Array.Sensors() {
		if q, ok := sn.(*sensor.Quadrant); ok {
			fmt.Fprintf(w, "  %s: %s\n", q.Name(), sensor.ViewText(q))
		}
	}
	o.writePower(w)
	o.writeTimeline(w)
	o.writeModes(w)
	o.writeSingleFailure(w)
	if len(o.targets) > 0 {
		fmt.Fprintf(w, "\nTargets (the verdict is the last line)\n")
		width := 0
		for _, t := range o.targets {
			width = max(width, utf8.RuneCountInString(t.Label))
		}
		for _, t := range o.targets {
			verdict := "FAIL"
			if t.Pass {
				verdict = "pass"
			}
			fmt.Fprintf(w, "  %-4s %-*s required %-10s got %s\n", verdict, width, t.Label, t.Required, t.Value)
		}
	}
	fmt.Fprintf(w, "\nAn analysis aid, not flight verification: flight hardware needs qualified verification.\n")
}

// writeOnboard prints the estimators on the readings corrected by the
// on-board albedo model beside the uncorrected ones, and what they mean.
func (o *runOutput) writeOnboard(w io.Writer) {
	ob := o.s.Albedo.Onboard
	if ob == nil {
		return
	}
	fmt.Fprintf(w, "\nOn-board albedo correction (on-board %s; truth %s)\n", ob.Label(), o.s.Albedo.Label())
	fmt.Fprintf(w, "  %-16s %8s %11s %10s %14s %12s %14s\n", "estimator", "valid", "valid corr.", "p95 albedo", "p95 corrected", "albedo part", "residual part")
	for _, e := range o.res.Nominal.Estimators {
		k := e.Corrected
		if k == nil {
			continue
		}
		fmt.Fprintf(w, "  %-16s %8s %11s %10s %14s %12s %14s\n", e.Name, pct(e.ValidFraction), pct(k.ValidFraction),
			deg(e.ErrAlbedo.P95Deg), deg(k.Err.P95Deg), deg(e.AlbedoPart.P95Deg), deg(k.ResidualPart.P95Deg))
	}
	for _, line := range wrapText(study.OnboardNote(o.s), 100) {
		fmt.Fprintf(w, "  %s\n", line)
	}
	fmt.Fprintf(w, "  (residual part: angle between the corrected estimate and the one without albedo)\n")
}

// wrapText breaks text into lines of at most width characters at spaces.
func wrapText(text string, width int) []string {
	var lines []string
	line := ""
	for _, word := range strings.Fields(text) {
		if line != "" && len([]rune(line))+1+len([]rune(word)) > width {
			lines = append(lines, line)
			line = ""
		}
		if line != "" {
			line += " "
		}
		line += word
	}
	if line != "" {
		lines = append(lines, line)
	}
	return lines
}

func albedoLabel(s *scenario.Scenario) string {
	switch s.Albedo.Model {
	case scenario.AlbedoUniform:
		return fmt.Sprintf("uniform %.2f", s.Albedo.Value)
	case scenario.AlbedoGrid:
		return "grid " + filepath.Base(s.Albedo.GridFile)
	}
	return s.Albedo.Model
}

func ff(v float64, prec int) string {
	if math.IsNaN(v) {
		return ""
	}
	return strconv.FormatFloat(v, 'f', prec, 64)
}

func csvBytes(rows [][]string) ([]byte, error) {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	if err := w.WriteAll(rows); err != nil {
		return nil, err
	}
	w.Flush()
	return b.Bytes(), w.Error()
}

// utc is the UTC time of t seconds after the epoch, empty when t is undefined.
func (o *runOutput) utc(t float64) string { return utcOf(o.s.Epoch, t) }

// utcOf is the UTC time of t seconds after epoch, empty when t is undefined.
func utcOf(epoch time.Time, t float64) string {
	if math.IsNaN(t) {
		return ""
	}
	return epoch.Add(time.Duration(t * float64(time.Second))).UTC().Format("2006-01-02T15:04:05.000Z")
}

// writeCSV writes the time series, eclipses, estimators and sensors tables,
// the resolved scenario and the JSON record into dir.
func (o *runOutput) writeCSV(dir string) error {
	r := o.res
	files := map[string][][]string{}
	if o.series != nil {
		if err := o.series.place(dir); err != nil {
			return fmt.Errorf("series.csv: %w", err)
		}
	}
	ecl := [][]string{{"penumbra_start_utc", "penumbra_start_s", "umbra_start_s", "umbra_end_s", "penumbra_end_s", "duration_s", "umbra_s", "cut_by_span"}}
	for _, e := range r.Eclipses {
		ecl = append(ecl, []string{o.utc(e.PenumbraStart),
			ff(e.PenumbraStart, 3), ff(e.UmbraStart, 3), ff(e.UmbraEnd, 3), ff(e.PenumbraEnd, 3), ff(e.Duration(), 3),
			ff(e.UmbraDuration(), 3), strconv.FormatBool(e.StartCut || e.EndCut)})
	}
	files["eclipses.csv"] = ecl
	// Per-unit tables: the nominal unit (unit 0), or every unit with
	// --all-units; the unit column is always there.
	units := r.Units
	if !o.allUnits && len(units) > 1 {
		units = units[:1]
	}
	est := [][]string{{"unit", "estimator", "valid_fraction", "longest_gap_s", "mean_error_no_albedo_deg", "p50_error_no_albedo_deg",
		"p95_error_no_albedo_deg", "p99_error_no_albedo_deg", "max_error_no_albedo_deg",
		"mean_error_albedo_deg", "p50_error_albedo_deg", "p95_error_albedo_deg", "p99_error_albedo_deg", "max_error_albedo_deg",
		"p95_albedo_part_deg", "false_sun_fraction_of_umbra",
		"valid_only_with_albedo_fraction_of_sunlit", "valid_beyond_false_sun_bound_fraction_of_sunlit",
		"valid_fraction_onboard_corrected", "p95_error_onboard_corrected_deg", "max_error_onboard_corrected_deg", "p95_residual_albedo_part_deg"}}
	sens := [][]string{{"unit", "sensor", "in_view_fraction", "peak_signal", "saturated_fraction", "false_sun_fraction_of_umbra",
		"valid_only_with_albedo_fraction_of_sunlit", "valid_beyond_false_sun_bound_fraction_of_sunlit",
		"moon_in_view_fraction", "lit_earth_in_view_fraction", "blinded_fraction", "peak_output"}}
	gaps := [][]string{{"unit", "estimator", "gap_start_utc", "gap_start_s", "gap_end_s", "gap_s"}}
	for _, un := range units {
		ui := strconv.Itoa(un.Unit)
		for _, e := range un.Estimators {
			a, b := e.ErrNoAlbedo, e.ErrAlbedo
			est = append(est, []string{ui, e.Name, ff(e.ValidFraction, 6), ff(e.LongestGapS, 1), ff(a.MeanDeg, 4), ff(a.P50Deg, 4), ff(a.P95Deg, 4), ff(a.P99Deg, 4), ff(a.MaxDeg, 4),
				ff(b.MeanDeg, 4), ff(b.P50Deg, 4), ff(b.P95Deg, 4), ff(b.P99Deg, 4), ff(b.MaxDeg, 4), ff(e.AlbedoPart.P95Deg, 4), ff(e.FalseSunFraction, 6),
				ff(e.AlbedoOnlyFraction, 6), ff(e.WrongFraction, 6)})
			// Empty without an on-board albedo model.
			kv, kp, km, kr := math.NaN(), math.NaN(), math.NaN(), math.NaN()
			if k := e.Corrected; k != nil {
				kv, kp, km, kr = k.ValidFraction, k.Err.P95Deg, k.Err.MaxDeg, k.ResidualPart.P95Deg
			}
			row := &est[len(est)-1]
			*row = append(*row, ff(kv, 6), ff(kp, 4), ff(km, 4), ff(kr, 4))
			for k, g := range e.Gaps {
				t0 := math.NaN()
				if k < len(e.GapStartS) {
					t0 = e.GapStartS[k]
				}
				gaps = append(gaps, []string{ui, e.Name, o.utc(t0), ff(t0, 1), ff(t0+g, 1), ff(g, 1)})
			}
		}
		for _, s := range un.Sensors {
			sens = append(sens, []string{ui, s.Name, ff(s.InViewFraction, 6), ff(s.PeakSignal, 5), ff(s.SaturatedFraction, 6), ff(s.FalseSunFraction, 6),
				ff(s.AlbedoOnlyFraction, 6), ff(s.WrongFraction, 6), ff(s.MoonInViewFraction, 6), ff(s.LitEarthInViewFraction, 6), ff(s.BlindedFraction, 6), ff(s.PeakOutput, 5)})
		}
	}
	files["estimators.csv"] = est
	files["sensors.csv"] = sens
	files["gaps.csv"] = gaps
	if rows := filterCSV(units); rows != nil {
		files["gyro_filter.csv"] = rows
	}
	if len(o.modes) > 0 {
		files["modes.csv"] = o.modesCSV()
	}
	if rows := o.singleFailureCSV(); rows != nil {
		files["single_failure.csv"] = rows
	}
	if rows := o.timelineCSV(); rows != nil {
		files["timeline.csv"] = rows
	}
	if d := o.drawsCSV(); d != nil {
		files["tumble_draws.csv"] = d
	}
	if p := r.Power; p != nil {
		rows := [][]string{{"orbit", "orbit_start_s", "orbit_start_utc", "orbit_mean_power_w", "orbit_energy_wh"}}
		for i, w := range p.PerOrbitW {
			t0 := float64(i) * p.PeriodS
			rows = append(rows, []string{strconv.Itoa(i + 1), ff(t0, 1), o.utc(t0), ff(w, 4), ff(w*p.PeriodS/3600, 4)})
		}
		files["power_orbits.csv"] = rows
	}

	for name, rows := range files {
		b, err := csvBytes(rows)
		if err != nil {
			return err
		}
		if err := atomicfile.Write(filepath.Join(dir, name), b); err != nil {
			return err
		}
	}
	if err := atomicfile.Write(filepath.Join(dir, "scenario.resolved.yaml"), o.s.Record()); err != nil {
		return err
	}
	b, err := o.jsonBytes()
	if err != nil {
		return err
	}
	return atomicfile.Write(filepath.Join(dir, "run.json"), b)
}

// writePower prints the solar-array power section (nothing without panels).
func (o *runOutput) writePower(w io.Writer) {
	p := o.res.Power
	if p == nil {
		return
	}
	var area float64
	for _, pn := range o.s.Body.Panels {
		area += pn.AreaM2
	}
	alb := "no albedo on the panels"
	if o.s.Albedo.OnPanels {
		alb = "with albedo on the panels"
	}
	fmt.Fprintf(w, "\nSolar-array power (%d panels, %.4g m², %s attitude; %s)\n", len(o.s.Body.Panels), area, o.s.Attitude.Name, alb)
	fmt.Fprintf(w, "  orbit average %.2f W   peak %.2f W\n", p.MeanW, p.PeakW)
	if p.Orbits > 0 {
		fmt.Fprintf(w, "  energy per orbit: mean %.2f Wh, worst %.2f Wh (%d whole orbits)\n", p.OrbitMeanWh, p.OrbitWorstWh, p.Orbits)
	} else {
		fmt.Fprintf(w, "  energy per orbit: %s (the run holds no whole orbit)\n", study.Missing)
	}
	fmt.Fprintf(w, "  longest span without power %.1f min; a constant load of the orbit average draws %.2f Wh from the battery across it\n",
		p.LongestNoPowerS/60, p.GapEnergyWh)
}
