package budget

import (
	"codeberg.org/sunsight/sunsight/scenario/study"
	"context"
	"fmt"
	"math"

	"codeberg.org/sunsight/sunsight/scenario"
)

// StudyOptions set a budget study.
type StudyOptions struct {
	Units int  // Monte Carlo units per run; 0 = the scenario's (at least 2)
	Full  bool // simulate the scenario's whole duration instead of at most DefaultMaxDurationS
	// TargetDeg is the p95 target of the tolerance search; 0 takes
	// budget.tolerance_deg, else targets.max_error_p95_deg, else none.
	TargetDeg float64
	// Curves asks for the sensitivity curves (the figures' input).
	Curves bool
	// Workers runs the Monte Carlo on that many goroutines; 0 = GOMAXPROCS.
	Workers int
}

// Report is a budget study: the terms of each source alone and all
// together, what calibration and albedo correction buy, and the tolerances.
type Report struct {
	SchemaVersion int       `json:"schema_version"`
	Scenario      string    `json:"scenario"`
	DurationS     float64   `json:"duration_s"`
	Shortened     bool      `json:"shortened"`
	Units         int       `json:"units"`
	Terms         []TermRow `json:"terms"`
	AllP95Deg     float64   `json:"all_p95_deg"`
	AllRMSDeg     float64   `json:"all_rms_deg"`
	RSSP95Deg     float64   `json:"rss_p95_deg"`
	RSSRMSDeg     float64   `json:"rss_rms_deg"`
	// GapP95CIDeg and GapRMSCIDeg are the 95 % bootstrap intervals of
	// all − RSS, null below IntervalMinUnits units.
	GapP95CIDeg      *[2]float64 `json:"all_minus_rss_p95_ci95_deg"`
	GapRMSCIDeg      *[2]float64 `json:"all_minus_rss_rms_ci95_deg"`
	IntervalMinUnits int         `json:"interval_min_units"`
	CalibratedP95    *float64    `json:"calibrated_p95_deg,omitempty"`
	CorrectedP95     *float64    `json:"albedo_corrected_p95_deg,omitempty"`
	// CorrectionModel names the on-board albedo model of CorrectedP95 and
	// says when it is the truth's own (CorrectionModelText).
	CorrectionModel string         `json:"albedo_correction_model,omitempty"`
	NoAlbedoP95     *float64       `json:"no_albedo_p95_deg,omitempty"`
	TargetDeg       float64        `json:"tolerance_target_deg,omitempty"`
	Tolerances      []ToleranceRow `json:"tolerances,omitempty"`
	// CalibrationRange is how far the temperature-dependent sensors may
	// move from their calibration temperature with the target kept (with a
	// target and a sensor with a dark signal or gain coefficient).
	CalibrationRange *TemperatureRow `json:"calibration_temperature_range,omitempty"`
	// Curves are the sensitivity curves (StudyOptions.Curves), at
	// SensitivityScales.
	Curves []Curve `json:"-"`
}

// TermRow is one source alone.
type TermRow struct {
	Source   string  `json:"source"`
	Stated   float64 `json:"stated_1sigma"`
	Unit     string  `json:"unit"`
	P95Deg   float64 `json:"p95_deg"`
	RMSDeg   float64 `json:"rms_deg"`
	ShareRSS float64 `json:"share_of_rss_squared"`
}

// ToleranceRow is the largest 1σ of one source that keeps the target.
type ToleranceRow struct {
	Source     string  `json:"source"`
	Scale      float64 `json:"scale_of_stated"`
	Sigma      float64 `json:"max_1sigma"`
	Unit       string  `json:"unit"`
	AtDeg      float64 `json:"p95_at_max_deg"`
	At110Deg   float64 `json:"p95_at_1_1x_deg"`
	Meets      bool    `json:"meets_target"`
	FailsAbove bool    `json:"fails_at_1_1x"`
	Infeasible bool    `json:"infeasible"`
	Unbounded  bool    `json:"unbounded"`
}

// TemperatureRow is the calibration range of the report (offsets from each
// sensor's calibration temperature, °C).
type TemperatureRow struct {
	LowOffsetC  float64 `json:"low_offset_c"`
	HighOffsetC float64 `json:"high_offset_c"`
	LowBounded  bool    `json:"low_bounded"`
	HighBounded bool    `json:"high_bounded"`
	Infeasible  bool    `json:"infeasible"`
	AtLowDeg    float64 `json:"p95_at_low_deg"`
	AtHighDeg   float64 `json:"p95_at_high_deg"`
	// CalibrationC is the calibration temperature when every such sensor
	// states the same one, else null.
	CalibrationC *float64 `json:"calibration_temperature_c"`
}

// Missed reports that a tolerance target is set and the all-together p95
// error exceeds it.
func (r Report) Missed() bool { return r.TargetDeg > 0 && !(r.AllP95Deg <= r.TargetDeg) }

// SensitivityScales are the multiples of the stated σ of the sensitivity
// curves.
var SensitivityScales = []float64{0, 0.5, 1, 1.5, 2, 3}

// OptionError is a study refused for its options or its scenario before any
// run.
type OptionError struct{ Err error }

func (e *OptionError) Error() string { return e.Err.Error() }
func (e *OptionError) Unwrap() error { return e.Err }

// Study runs the error budget of a scenario: each source alone and all
// together (Decompose), the calibrated and albedo-corrected runs, the
// no-albedo floor, the tolerance of each scalable source against the target
// and, when asked, the sensitivity curves.
func Study(ctx context.Context, s *scenario.Scenario, o StudyOptions) (Report, error) {
	opt := Options{Units: o.Units, Workers: o.Workers}
	if o.Full {
		opt.MaxDurationS = -1
	}
	r, err := NewRunner(s, opt)
	if err != nil {
		return Report{}, &OptionError{err}
	}
	tgt := o.TargetDeg
	switch {
	case tgt > 0:
	case s.Budget.Set && s.Budget.ToleranceRad > 0:
		tgt = s.Budget.ToleranceRad * 180 / math.Pi
	case s.Targets.MaxErrorP95Rad > 0:
		tgt = s.Targets.MaxErrorP95Rad * 180 / math.Pi
	}
	sources := r.Sources()
	b, err := Decompose(ctx, r.Run, sources)
	if err != nil {
		return Report{}, err
	}
	rep := Report{SchemaVersion: 1, Scenario: s.Name, DurationS: r.DurationS(), Shortened: r.Shortened(), Units: b.Units,
		AllP95Deg: b.All.P95Deg, AllRMSDeg: b.All.RMSDeg, RSSP95Deg: b.RSSP95Deg, RSSRMSDeg: b.RSSRMSDeg,
		IntervalMinUnits: MinIntervalUnits, TargetDeg: tgt}
	if b.IntervalShown() {
		rep.GapP95CIDeg = &[2]float64{b.NonAdditiveCI.Lo, b.NonAdditiveCI.Hi}
		rep.GapRMSCIDeg = &[2]float64{b.NonAdditiveRMSCI.Lo, b.NonAdditiveRMSCI.Hi}
	}
	for _, t := range b.Terms {
		v, unit := r.Sigma(t.Source, 1)
		if !t.Source.Scalable() {
			v, unit = 0, ""
		}
		rep.Terms = append(rep.Terms, TermRow{Source: t.Source.String(), Stated: v, Unit: unit, P95Deg: t.P95Deg, RMSDeg: t.RMSDeg,
			ShareRSS: t.P95Deg * t.P95Deg / (b.RSSP95Deg * b.RSSP95Deg)})
	}
	all := AllOf(sources)
	p95 := func(c Case) (*float64, error) {
		m, err := r.Run(ctx, c)
		if err != nil {
			return nil, err
		}
		v := m.P95Deg()
		return &v, nil
	}
	if s.Budget.Set {
		c := all
		c.Calibrated = true
		if rep.CalibratedP95, err = p95(c); err != nil {
			return Report{}, err
		}
	}
	if all.Scale[Albedo] > 0 {
		// An on-board correction only where a sensor can subtract a
		// prediction; otherwise the row would repeat "as stated".
		canCorrect, err := study.CanCorrectAlbedo(s)
		if err != nil {
			return Report{}, err
		}
		c := all
		if canCorrect {
			c.Correction = true
			if rep.CorrectedP95, err = p95(c); err != nil {
				return Report{}, err
			}
			rep.CorrectionModel = CorrectionModelText(s)
		}
		c = all
		c.Scale[Albedo] = 0
		if rep.NoAlbedoP95, err = p95(c); err != nil {
			return Report{}, err
		}
	}
	for _, src := range sources {
		if !src.Scalable() {
			continue
		}
		if tgt > 0 {
			t, err := FindTolerance(ctx, r.Run, all, src, tgt, Metric.P95Deg)
			if err != nil {
				return Report{}, err
			}
			sig, unit := r.Sigma(src, t.Scale)
			rep.Tolerances = append(rep.Tolerances, ToleranceRow{Source: src.String(), Scale: t.Scale, Sigma: sig, Unit: unit,
				AtDeg: t.AtScaleDeg, At110Deg: t.At110Deg, Meets: t.Meets, FailsAbove: t.FailsAbove, Infeasible: t.Infeasible, Unbounded: t.Unbounded})
		}
	}
	if tgt > 0 && r.Thermal() {
		t, err := FindTemperatureRange(ctx, r.Run, all, tgt, Metric.P95Deg)
		if err != nil {
			return Report{}, err
		}
		rep.CalibrationRange = &TemperatureRow{LowOffsetC: t.LowC, HighOffsetC: t.HighC, LowBounded: t.LowBounded, HighBounded: t.HighBounded,
			Infeasible: t.Infeasible, AtLowDeg: t.AtLowDeg, AtHighDeg: t.AtHighDeg, CalibrationC: r.CalibrationC()}
	}
	if o.Curves {
		for _, src := range sources {
			if !src.Scalable() {
				continue
			}
			c, err := Sensitivity(ctx, r.Run, all, src, SensitivityScales, Metric.P95Deg)
			if err != nil {
				return Report{}, err
			}
			rep.Curves = append(rep.Curves, c)
		}
	}
	return rep, nil
}

// CorrectionModelText names the on-board model of the budget's albedo
// correction: the scenario's albedo.onboard, else a uniform model of the
// truth's value. It says when that is the truth's own model, whose
// correction is perfect by construction but for the sensors' gain
// mismatch and ADC rounding.
func CorrectionModelText(s *scenario.Scenario) string {
	ob := scenario.Albedo{Model: scenario.AlbedoUniform, Value: s.Albedo.Value, Cells: s.Albedo.Cells}
	text := "uniform %.2f (no albedo.onboard given)"
	if s.Albedo.Onboard != nil {
		ob, text = *s.Albedo.Onboard, "on-board %s"
		text = fmt.Sprintf(text, ob.Label())
	} else {
		text = fmt.Sprintf(text, ob.Value)
	}
	if s.Albedo.SameModel(ob) {
		text += ", the truth's own model: perfect by construction but for gain mismatch and ADC rounding"
	}
	return text
}
