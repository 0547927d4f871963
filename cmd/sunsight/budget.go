package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"text/tabwriter"
	"time"

	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/budget"
)

func init() {
	register(command{name: "budget", summary: "split the sun-vector error into its sources, find tolerances, show what calibration buys",
		args: "[flags] FILE",
		about: `Runs the Monte Carlo of the scenario FILE (- reads standard input) with each error source
alone and all together, and finds each source's largest 1σ that keeps the p95 error within
the tolerance target. The exit status is 3 when a tolerance target is set and the
all-together error misses it.`,
		examples: []string{"sunsight budget scenario/budget/testdata/inertial-4css.yaml --tolerance-target 3.5",
			"sunsight budget scen.yaml --json > budget.json"},
		run: runBudget})
}

// budgetReport is the --json form of the budget.
type budgetReport struct {
	SchemaVersion int              `json:"schema_version"`
	Scenario      string           `json:"scenario"`
	DurationS     float64          `json:"duration_s"`
	Shortened     bool             `json:"shortened"`
	Units         int              `json:"units"`
	Terms         []budgetTermJSON `json:"terms"`
	AllP95Deg     float64          `json:"all_p95_deg"`
	AllRMSDeg     float64          `json:"all_rms_deg"`
	RSSP95Deg     float64          `json:"rss_p95_deg"`
	RSSRMSDeg     float64          `json:"rss_rms_deg"`
	GapP95CIDeg   [2]float64       `json:"all_minus_rss_p95_ci95_deg"`
	GapRMSCIDeg   [2]float64       `json:"all_minus_rss_rms_ci95_deg"`
	CalibratedP95 *float64         `json:"calibrated_p95_deg,omitempty"`
	CorrectedP95  *float64         `json:"albedo_corrected_p95_deg,omitempty"`
	NoAlbedoP95   *float64         `json:"no_albedo_p95_deg,omitempty"`
	TargetDeg     float64          `json:"tolerance_target_deg,omitempty"`
	Tolerances    []toleranceJSON  `json:"tolerances,omitempty"`
}

type budgetTermJSON struct {
	Source   string  `json:"source"`
	Stated   float64 `json:"stated_1sigma"`
	Unit     string  `json:"unit"`
	P95Deg   float64 `json:"p95_deg"`
	RMSDeg   float64 `json:"rms_deg"`
	ShareRSS float64 `json:"share_of_rss_squared"`
}

type toleranceJSON struct {
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

func runBudget(args []string, stdout, stderr io.Writer) error {
	fs := newFlagSet("budget")
	units := fs.Int("units", 0, "Monte Carlo units per run (`N`; 0 = the scenario's, at least 2)")
	out := fs.String("out", "", "folder for the figures (`DIR`; PNG and SVG); none when empty")
	target := fs.Float64("tolerance-target", 0, "p95 target (`DEG`) for the tolerances; 0 = budget.tolerance_deg, else targets.max_error_p95_deg")
	asJSON := fs.Bool("json", false, "print the budget as JSON")
	force := fs.Bool("force", false, "replace an earlier --out folder")
	full := fs.Bool("full", false, "simulate the scenario's whole duration instead of at most 6 h")
	cpuProf := fs.String("cpuprofile", "", cpuProfileUsage)
	pos, err := fs.parse(args, stdout)
	if err != nil {
		return err
	}
	if len(pos) != 1 {
		return usagef("want one scenario file; usage: sunsight budget [flags] FILE")
	}
	file := pos[0]
	if *units < 0 {
		return usagef("--units %d: want a count ≥ 1 (or 0 for the scenario's)", *units)
	}
	if *target < 0 || math.IsNaN(*target) || math.IsInf(*target, 0) {
		return usagef("--tolerance-target %g: want a p95 error in degrees > 0", *target)
	}
	if *out != "" {
		if err := checkOutputDir(*out, *force); err != nil {
			return err
		}
	}
	s, err := loadScenario(file)
	if err != nil {
		return err
	}
	opt := budget.Options{Units: *units}
	if *full {
		opt.MaxDurationS = -1
	}
	r, err := budget.NewRunner(s, opt)
	if err != nil {
		return usageError{err}
	}
	tgt := *target
	switch {
	case tgt > 0:
	case s.Budget.Set && s.Budget.ToleranceRad > 0:
		tgt = s.Budget.ToleranceRad * 180 / math.Pi
	case s.Targets.MaxErrorP95Rad > 0:
		tgt = s.Targets.MaxErrorP95Rad * 180 / math.Pi
	}
	stopProf, err := startCPUProfile(*cpuProf)
	if err != nil {
		return err
	}
	defer stopProf()
	ctx, stop := interruptContext()
	defer stop()
	start := time.Now()
	sources := r.Sources()
	b, err := budget.Decompose(ctx, r.Run, sources)
	if err != nil {
		return err
	}
	rep := budgetReport{SchemaVersion: 1, Scenario: s.Name, DurationS: r.DurationS(), Shortened: r.Shortened(), Units: b.Units,
		AllP95Deg: b.All.P95Deg, AllRMSDeg: b.All.RMSDeg, RSSP95Deg: b.RSSP95Deg, RSSRMSDeg: b.RSSRMSDeg,
		GapP95CIDeg: [2]float64{b.NonAdditiveCI.Lo, b.NonAdditiveCI.Hi}, GapRMSCIDeg: [2]float64{b.NonAdditiveRMSCI.Lo, b.NonAdditiveRMSCI.Hi}, TargetDeg: tgt}
	for _, t := range b.Terms {
		v, unit := r.Sigma(t.Source, 1)
		if t.Source == budget.Quantisation || t.Source == budget.Albedo {
			v, unit = 0, ""
		}
		rep.Terms = append(rep.Terms, budgetTermJSON{Source: t.Source.String(), Stated: v, Unit: unit, P95Deg: t.P95Deg, RMSDeg: t.RMSDeg,
			ShareRSS: t.P95Deg * t.P95Deg / (b.RSSP95Deg * b.RSSP95Deg)})
	}
	all := budget.AllOf(sources)
	hasAlbedo := all.Scale[budget.Albedo] > 0
	if s.Budget.Set {
		c := all
		c.Calibrated = true
		m, err := r.Run(ctx, c)
		if err != nil {
			return err
		}
		rep.CalibratedP95 = ptr(m.P95Deg())
	}
	if hasAlbedo {
		c := all
		c.Correction = true
		m, err := r.Run(ctx, c)
		if err != nil {
			return err
		}
		rep.CorrectedP95 = ptr(m.P95Deg())
		c = all
		c.Scale[budget.Albedo] = 0
		if m, err = r.Run(ctx, c); err != nil {
			return err
		}
		rep.NoAlbedoP95 = ptr(m.P95Deg())
	}
	var curves []budget.Curve
	if tgt > 0 {
		for _, src := range sources {
			if !src.Scalable() {
				continue
			}
			t, err := budget.FindTolerance(ctx, r.Run, all, src, tgt, budget.Metric.P95Deg)
			if err != nil {
				return err
			}
			sig, unit := r.Sigma(src, t.Scale)
			rep.Tolerances = append(rep.Tolerances, toleranceJSON{Source: src.String(), Scale: t.Scale, Sigma: sig, Unit: unit,
				AtDeg: t.AtScaleDeg, At110Deg: t.At110Deg, Meets: t.Meets, FailsAbove: t.FailsAbove, Infeasible: t.Infeasible, Unbounded: t.Unbounded})
		}
	}
	if *out != "" {
		for _, src := range sources {
			if !src.Scalable() {
				continue
			}
			c, err := budget.Sensitivity(ctx, r.Run, all, src, sensitivityScales, budget.Metric.P95Deg)
			if err != nil {
				return err
			}
			curves = append(curves, c)
		}
		err := writeOutputDir(*out, *force, func(dir string) error { return budgetFigures(s, r, rep, curves, tgt, dir) })
		if err != nil {
			return err
		}
	}
	elapsed := time.Since(start)
	// A tolerance target the all-together error misses: exit status 3.
	var verdict error
	if tgt > 0 && !(rep.AllP95Deg <= tgt) {
		verdict = targetsFailed{fmt.Sprintf("p95 error with every source as stated %.3f° exceeds the tolerance target %.3g°", rep.AllP95Deg, tgt)}
	}
	if *asJSON {
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(rep); err != nil {
			return err
		}
		return verdict
	}
	printBudget(stdout, rep, r, elapsed)
	if verdict != nil {
		fmt.Fprintf(stdout, "\nverdict: FAIL, %v\n", verdict)
	} else if tgt > 0 {
		fmt.Fprintf(stdout, "\nverdict: PASS, p95 %.3f° within the tolerance target %.3g°\n", rep.AllP95Deg, tgt)
	}
	return verdict
}

// sensitivityScales are the multiples of the stated σ of the sensitivity curves.
var sensitivityScales = []float64{0, 0.5, 1, 1.5, 2, 3}

func ptr(v float64) *float64 { return &v }

func printBudget(w io.Writer, rep budgetReport, r *budget.Runner, elapsed time.Duration) {
	fmt.Fprintf(w, "Error budget: %s\n", rep.Scenario)
	fmt.Fprintf(w, "%d Monte Carlo units over %.1f h per run", rep.Units, rep.DurationS/3600)
	if rep.Shortened {
		fmt.Fprint(w, " (shortened from the scenario's duration for speed; --full runs all of it)")
	}
	fmt.Fprintf(w, "; p95 of a typical unit, primary estimator, sunlit samples.\n\n")
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintln(tw, "source alone\tstated 1σ\tp95 (deg)\tRMS (deg)\tshare of RSS²\t")
	for _, t := range rep.Terms {
		st := "on"
		if t.Unit != "" {
			st = fmt.Sprintf("%.4g %s", t.Stated, t.Unit)
		}
		fmt.Fprintf(tw, "%s\t%s\t%.3f\t%.3f\t%.0f %%\t\n", t.Source, st, t.P95Deg, t.RMSDeg, 100*t.ShareRSS)
	}
	fmt.Fprintf(tw, "root-sum-square\t\t%.3f\t%.3f\t\t\n", rep.RSSP95Deg, rep.RSSRMSDeg)
	fmt.Fprintf(tw, "all together\t\t%.3f\t%.3f\t\t\n", rep.AllP95Deg, rep.AllRMSDeg)
	tw.Flush()
	fmt.Fprintf(w, "\nall − RSS: p95 %+.3f° (95 %% bootstrap interval over units [%+.3f, %+.3f]), RMS %+.3f° [%+.3f, %+.3f]\n",
		rep.AllP95Deg-rep.RSSP95Deg, rep.GapP95CIDeg[0], rep.GapP95CIDeg[1], rep.AllRMSDeg-rep.RSSRMSDeg, rep.GapRMSCIDeg[0], rep.GapRMSCIDeg[1])
	fmt.Fprintln(w, "  an interval that excludes 0 means that figure does not add in RSS: size it from the all-together run.")
	if rep.CalibratedP95 != nil || rep.CorrectedP95 != nil {
		fmt.Fprintln(w, "\nWhat calibration buys (p95, all sources):")
		fmt.Fprintf(w, "  as stated                         %.3f°\n", rep.AllP95Deg)
		if rep.CalibratedP95 != nil {
			fmt.Fprintf(w, "  calibrated residuals (budget)     %.3f°\n", *rep.CalibratedP95)
		}
		if rep.CorrectedP95 != nil {
			fmt.Fprintf(w, "  uniform albedo correction         %.3f°\n", *rep.CorrectedP95)
			fmt.Fprintf(w, "  no albedo at all (floor)          %.3f°\n", *rep.NoAlbedoP95)
		}
	}
	if rep.TargetDeg > 0 {
		fmt.Fprintf(w, "\nTolerances for p95 ≤ %.3g° (others as stated; checked by re-running at σ and 1.1 σ):\n", rep.TargetDeg)
		tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
		fmt.Fprintln(tw, "source\tlargest 1σ\t× stated\tp95 at σ\tp95 at 1.1σ\tcheck\t")
		for _, t := range rep.Tolerances {
			switch {
			case t.Infeasible:
				fmt.Fprintf(tw, "%s\tnone\t\t%.3f\t\tmissed even with this source off\t\n", t.Source, t.AtDeg)
			case t.Unbounded:
				fmt.Fprintf(tw, "%s\t> %.4g %s\t> %g\t%.3f\t\tnot limiting\t\n", t.Source, t.Sigma, t.Unit, t.Scale, t.AtDeg)
			default:
				chk := "ok"
				if !t.Meets || !t.FailsAbove {
					chk = "not monotone here: read the sensitivity curve"
				}
				fmt.Fprintf(tw, "%s\t%.4g %s\t%.3g\t%.3f\t%.3f\t%s\t\n", t.Source, t.Sigma, t.Unit, t.Scale, t.AtDeg, t.At110Deg, chk)
			}
		}
		tw.Flush()
	} else {
		fmt.Fprintln(w, "\nNo tolerance target (give --tolerance-target, budget.tolerance_deg or targets.max_error_p95_deg).")
	}
	fmt.Fprintf(w, "\nComputed in %.1f s. An analysis aid: flight hardware needs qualified verification.\n", elapsed.Seconds())
}

func budgetFigures(s *scenario.Scenario, r *budget.Runner, rep budgetReport, curves []budget.Curve, tgt float64, dir string) error {
	caption := plots.Caption{Scenario: s.Name,
		Model:       fmt.Sprintf("%d Monte Carlo units over %.1f h, albedo %s", rep.Units, rep.DurationS/3600, s.Albedo.Model),
		Assumptions: "p95 of a typical unit, primary estimator, sunlit samples; each source alone"}
	bars := plots.BudgetBars{Title: "Sun-vector error budget (p95, each source alone)"}
	for _, t := range rep.Terms {
		bars.Labels = append(bars.Labels, t.Source)
		bars.P95Deg = append(bars.P95Deg, t.P95Deg)
	}
	bars.Labels = append(bars.Labels, "root-sum-square", "all together")
	bars.P95Deg = append(bars.P95Deg, rep.RSSP95Deg, rep.AllP95Deg)
	charts := map[string]*plots.Chart{}
	c, err := bars.Plot(caption)
	if err != nil {
		return err
	}
	charts["budget"] = c
	if len(curves) > 0 {
		nom := 1.0
		sens := plots.Sensitivity{Title: "Sensitivity of the p95 error to each source", Parameter: "1σ / stated 1σ",
			X: sensitivityScales, YLabel: "p95 sun-vector error (deg)", Nominal: &nom}
		for _, cv := range curves {
			sens.Lines = append(sens.Lines, plots.Line{Label: cv.Source.String(), Y: cv.P95Deg})
		}
		caption.Assumptions = "one source scaled, the others as stated"
		if tgt > 0 {
			caption.Assumptions += fmt.Sprintf("; target p95 ≤ %.3g°", tgt)
		}
		if c, err = sens.Plot(caption); err != nil {
			return err
		}
		charts["budget-sensitivity"] = c
	}
	for name, c := range charts {
		for _, f := range []string{"png", "svg"} {
			if err := plots.Save(c, filepath.Join(dir, name+"."+f), f); err != nil {
				return err
			}
		}
	}
	return nil
}
