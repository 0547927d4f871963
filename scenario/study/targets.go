package study

import (
	"fmt"
	"math"
	"strings"

	"codeberg.org/sunsight/sunsight/scenario"

	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// Missing is the one mark for a value that is not defined (no valid sample,
// no target, not modelled); summary, report and tables all print it.
const Missing = "—"

// Target keys name the requirements a scenario can state.
const (
	TargetValid             = "valid"               // min_valid_fraction
	TargetErrorP95          = "error-p95"           // max_error_p95_deg
	TargetErrorP95Units     = "error-p95-units"     // max_error_p95_units_deg
	TargetCoverage          = "coverage"            // coverage_sensors + min_coverage
	TargetCoverageOneFailed = "coverage-one-failed" // the same with survive_one_failure
	TargetGap               = "gap"                 // max_gap
	TargetPower             = "orbit-average-power" // min_orbit_average_power_w
	// The targets of n_minus_1, judged on the worst single failure.
	TargetNMinus1Valid    = "n-minus-1-valid"     // n_minus_1.min_valid_fraction
	TargetNMinus1ErrorP95 = "n-minus-1-error-p95" // n_minus_1.max_error_p95_deg
	TargetNMinus1Gap      = "n-minus-1-gap"       // n_minus_1.max_gap
)

// TargetCheck is one requirement of the scenario's targets judged against a
// run: what was required, what the run gave, the verdict and the margin
// (positive when met with room; relative for the error and the gap,
// absolute for fractions).
type TargetCheck struct {
	Key      string
	Label    string
	Required string
	Value    string
	Pass     bool
	Margin   float64
	// The same in numbers: Got Op Limit (Op ">=" or "<="), both in Unit
	// ("fraction", "deg", "s" or "W"); Got is NaN when the figure is undefined.
	Op         string
	Limit, Got float64
	Unit       string
}

// Units of the numeric target records.
const (
	UnitFraction = "fraction"
	UnitDeg      = "deg"
	UnitSeconds  = "s"
	UnitWatts    = "W"
)

// TargetRecord is a judged target as every machine-readable output writes
// it (run JSON, sweep case files): numbers, not display strings. Value and
// Margin are null when the figure is undefined; Margin is in Unit, positive
// when the target is met with room.
type TargetRecord struct {
	Key      string   `json:"key"`
	Label    string   `json:"label"`
	Op       string   `json:"op"`
	Required float64  `json:"required"`
	Value    *float64 `json:"value" jsonschema:"nullable"`
	Unit     string   `json:"unit"`
	Pass     bool     `json:"pass"`
	Margin   *float64 `json:"margin" jsonschema:"nullable"`
}

// Record returns the check as a TargetRecord.
func (c TargetCheck) Record() TargetRecord {
	r := TargetRecord{Key: c.Key, Label: c.Label, Op: c.Op, Required: c.Limit, Unit: c.Unit, Pass: c.Pass}
	if !math.IsNaN(c.Got) && !math.IsInf(c.Got, 0) {
		v, m := c.Got, c.Got-c.Limit
		if c.Op == OpAtMost {
			m = c.Limit - c.Got
		}
		r.Value, r.Margin = &v, &m
	}
	return r
}

// Records returns the checks as records (an empty list, never nil).
func Records(checks []TargetCheck) []TargetRecord {
	out := make([]TargetRecord, 0, len(checks))
	for _, c := range checks {
		out = append(out, c.Record())
	}
	return out
}

// Comparison operators of the target records.
const (
	OpAtLeast = ">="
	OpAtMost  = "<="
)

// CheckTargets judges the run's headline figures and the layout's sky
// coverage against the scenario's targets. This is the one place targets are
// judged: the summary, the report and the layout search all use it. Error
// targets use the realistic p95 (with albedo when an albedo model is set). A
// figure that is undefined (no valid estimate at all) fails its target.
func CheckTargets(s *scenario.Scenario, h sim.Headline, cov sky.Result) []TargetCheck {
	t := s.Targets
	var out []TargetCheck
	pct := func(f float64) string {
		if math.IsNaN(f) {
			return Missing
		}
		return fmt.Sprintf("%.1f %%", 100*f)
	}
	j := JudgedFigures(s, h)
	if t.MinValidFraction > 0 {
		out = append(out, TargetCheck{Key: TargetValid, Label: "sunlit time with a valid sun vector (" + j.What + ")",
			Required: "≥ " + pct(t.MinValidFraction), Value: pct(j.ValidFraction), Pass: j.ValidFraction >= t.MinValidFraction,
			Margin: j.ValidFraction - t.MinValidFraction,
			Op:     OpAtLeast, Limit: t.MinValidFraction, Got: j.ValidFraction, Unit: UnitFraction})
	}
	if t.MaxErrorP95Rad > 0 {
		out = append(out, checkP95(TargetErrorP95, "p95 sun-vector error ("+j.What+")", t.MaxErrorP95Rad, j.P95Deg))
	}
	if t.MaxErrorP95UnitsRad > 0 {
		c := checkP95(TargetErrorP95Units, fmt.Sprintf("p95 sun-vector error reached by 95 %% of Monte Carlo units (%s)", j.What),
			t.MaxErrorP95UnitsRad, j.UnitsP95Deg)
		out = append(out, c)
	}
	if t.MinCoverage > 0 && t.CoverageSensors > 0 {
		k := min(t.CoverageSensors, sky.MaxLevel)
		out = append(out, TargetCheck{Key: TargetCoverage, Label: fmt.Sprintf("sky seen by ≥ %d sensors", k),
			Required: "≥ " + pct(t.MinCoverage), Value: pct(cov.AtLeast[k]), Pass: cov.AtLeast[k] >= t.MinCoverage,
			Margin: cov.AtLeast[k] - t.MinCoverage,
			Op:     OpAtLeast, Limit: t.MinCoverage, Got: cov.AtLeast[k], Unit: UnitFraction})
		if t.SurviveOneFailure {
			out = append(out, TargetCheck{Key: TargetCoverageOneFailed, Label: fmt.Sprintf("sky seen by ≥ %d sensors, any one failed", k),
				Required: "≥ " + pct(t.MinCoverage), Value: pct(cov.WorstOneFailed[k]), Pass: cov.WorstOneFailed[k] >= t.MinCoverage,
				Margin: cov.WorstOneFailed[k] - t.MinCoverage,
				Op:     OpAtLeast, Limit: t.MinCoverage, Got: cov.WorstOneFailed[k], Unit: UnitFraction})
		}
	}
	if t.MaxGap > 0 {
		lim := t.MaxGap.Seconds()
		label := "longest sunlit gap without a valid sun vector"
		if j.Corrected {
			label += " (" + j.What + ")"
		}
		out = append(out, TargetCheck{Key: TargetGap, Label: label,
			Required: "≤ " + spanS(lim), Value: spanS(j.LongestGapS), Pass: j.LongestGapS <= lim,
			Margin: (lim - j.LongestGapS) / lim,
			Op:     OpAtMost, Limit: lim, Got: j.LongestGapS, Unit: UnitSeconds})
	}
	if lim := t.MinOrbitAvgPowerW; lim > 0 {
		got := h.OrbitAvgPowerW
		c := TargetCheck{Key: TargetPower, Label: "orbit-average solar-array power", Required: fmt.Sprintf("≥ %.2f W", lim),
			Value: Missing, Pass: got >= lim, Margin: math.Inf(-1), Op: OpAtLeast, Limit: lim, Got: got, Unit: UnitWatts}
		if !math.IsNaN(got) {
			c.Value, c.Margin = fmt.Sprintf("%.2f W", got), (got-lim)/lim
		}
		out = append(out, c)
	}
	return out
}

// CheckSingleFailure judges the n_minus_1 targets on the single-failure
// study: each on the worst row for its own figure (the lowest valid share,
// the largest p95 error, the longest gap), naming the sensor whose failure
// gives it. An undefined p95 (no valid estimate) fails its target.
func CheckSingleFailure(s *scenario.Scenario, sf SingleFailure) []TargetCheck {
	t := s.Targets.NMinus1
	if len(sf.Rows) == 0 {
		return nil
	}
	est := JudgedFigures(s, sf.Rows[0].Headline).What
	pick := func(worse func(a, b Judged) bool) (FailedSensor, Judged) {
		w, wj := sf.Rows[0], JudgedFigures(s, sf.Rows[0].Headline)
		for _, r := range sf.Rows[1:] {
			if rj := JudgedFigures(s, r.Headline); worse(rj, wj) {
				w, wj = r, rj
			}
		}
		return w, wj
	}
	var out []TargetCheck
	if t.MinValidFraction > 0 {
		w, wj := pick(func(a, b Judged) bool { return a.ValidFraction < b.ValidFraction })
		v := wj.ValidFraction
		out = append(out, TargetCheck{Key: TargetNMinus1Valid,
			Label:    fmt.Sprintf("sunlit time with a valid sun vector, any one sensor failed (%s; worst: %s)", est, w.Sensor),
			Required: fmt.Sprintf("≥ %.1f %%", 100*t.MinValidFraction), Value: fmt.Sprintf("%.1f %%", 100*v), Pass: v >= t.MinValidFraction,
			Margin: v - t.MinValidFraction, Op: OpAtLeast, Limit: t.MinValidFraction, Got: v, Unit: UnitFraction})
	}
	if t.MaxErrorP95Rad > 0 {
		w, wj := pick(func(a, b Judged) bool { return orInf(a.P95Deg) > orInf(b.P95Deg) })
		lim := t.MaxErrorP95Rad * 180 / math.Pi
		p95 := wj.P95Deg
		c := TargetCheck{Key: TargetNMinus1ErrorP95,
			Label:    fmt.Sprintf("p95 sun-vector error, any one sensor failed (%s; worst: %s)", est, w.Sensor),
			Required: fmt.Sprintf("≤ %.2f°", lim), Value: Missing, Pass: p95 <= lim, Margin: math.Inf(-1),
			Op: OpAtMost, Limit: lim, Got: p95, Unit: UnitDeg}
		if !math.IsNaN(p95) {
			c.Value, c.Margin = fmt.Sprintf("%.2f°", p95), (lim-p95)/lim
		}
		out = append(out, c)
	}
	if t.MaxGap > 0 {
		w, wj := pick(func(a, b Judged) bool { return a.LongestGapS > b.LongestGapS })
		lim, g := t.MaxGap.Seconds(), wj.LongestGapS
		out = append(out, TargetCheck{Key: TargetNMinus1Gap,
			Label:    fmt.Sprintf("longest sunlit gap, any one sensor failed (%s; worst: %s)", est, w.Sensor),
			Required: "≤ " + spanS(lim), Value: spanS(g), Pass: g <= lim, Margin: (lim - g) / lim,
			Op: OpAtMost, Limit: lim, Got: g, Unit: UnitSeconds})
	}
	return out
}

// Judged are the figures of a run's primary estimator that the
// valid-share, p95-error and gap targets judge, as targets.judge says: the
// uncorrected estimate (p95 with albedo when an albedo model is set), or
// the estimate from the readings after the on-board albedo correction.
// What names the estimate in target labels and tables.
type Judged struct {
	ValidFraction, P95Deg, LongestGapS float64
	// UnitsP95Deg is the p95 error reached by 95 % of the Monte Carlo
	// units (+Inf when units without any valid estimate make it, NaN with
	// one unit).
	UnitsP95Deg float64
	What        string
	Corrected   bool
}

// JudgedFigures returns the figures of h the targets of s judge.
func JudgedFigures(s *scenario.Scenario, h sim.Headline) Judged {
	if s.Targets.Judge == scenario.JudgeOnboardCorrected {
		return Judged{ValidFraction: h.ValidFractionCorrected, P95Deg: h.P95CorrectedDeg, LongestGapS: h.LongestGapCorrectedS,
			UnitsP95Deg: h.UnitsP95CorrectedDeg, What: h.Estimator + ", on-board corrected", Corrected: true}
	}
	return Judged{ValidFraction: h.ValidFraction, P95Deg: headlineP95(h), LongestGapS: h.LongestGapS,
		UnitsP95Deg: h.UnitsP95Deg, What: h.Estimator}
}

// checkP95 judges a p95 error (degrees) against a limit (rad) under the
// target key; an undefined p95 (NaN: no valid estimate; +Inf: units
// without any) fails.
func checkP95(key, label string, limRad, p95 float64) TargetCheck {
	lim := limRad * 180 / math.Pi
	c := TargetCheck{Key: key, Label: label, Required: fmt.Sprintf("≤ %.2f°", lim), Value: Missing,
		Pass: p95 <= lim, Margin: math.Inf(-1), Op: OpAtMost, Limit: lim, Got: p95, Unit: UnitDeg}
	if !math.IsNaN(p95) && !math.IsInf(p95, 0) {
		c.Value = fmt.Sprintf("%.2f°", p95)
		c.Margin = (lim - p95) / lim
	}
	return c
}

// FindTarget returns the check of the given key.
func FindTarget(checks []TargetCheck, key string) (TargetCheck, bool) {
	for _, c := range checks {
		if c.Key == key {
			return c, true
		}
	}
	return TargetCheck{}, false
}

// Verdict is the overall judgement of a run against its targets, computed
// once from the checks so the summary, the JSON record, the report banner
// and the exit code all say the same thing.
type Verdict struct {
	// Total is the number of targets judged; Failed how many were missed.
	Total, Failed int
	// FailedKeys and FailedLabels name the missed targets in check order.
	FailedKeys   []string
	FailedLabels []string
}

// Judge returns the overall verdict of the checks.
func Judge(checks []TargetCheck) Verdict {
	v := Verdict{Total: len(checks)}
	for _, c := range checks {
		if !c.Pass {
			v.Failed++
			v.FailedKeys = append(v.FailedKeys, c.Key)
			v.FailedLabels = append(v.FailedLabels, c.Label)
		}
	}
	return v
}

// Met reports whether every target was met (true when there are none).
func (v Verdict) Met() bool { return v.Failed == 0 }

// Status is a one-word status for machines: "met", "failed" or
// "no-targets".
func (v Verdict) Status() string {
	switch {
	case v.Total == 0:
		return "no-targets"
	case v.Failed == 0:
		return "met"
	}
	return "failed"
}

// Text is the verdict in one line: "all 4 targets met", "1 of 4 targets
// failed: p95 sun-vector error (combined)" or "no targets set".
func (v Verdict) Text() string {
	switch {
	case v.Total == 0:
		return "no targets set"
	case v.Failed == 0:
		if v.Total == 1 {
			return "the 1 target met"
		}
		return fmt.Sprintf("all %d targets met", v.Total)
	}
	return fmt.Sprintf("%d of %d targets failed: %s", v.Failed, v.Total, strings.Join(v.FailedLabels, "; "))
}

// spanS prints a span in seconds ("600 s"), the unit every gap figure uses.
func spanS(s float64) string { return fmt.Sprintf("%.0f s", s) }
