package main

import (
	"encoding/json"
	"errors"
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

func runBudget(args []string, stdout, stderr io.Writer) error {
	fs := newFlagSet("budget")
	units := fs.Int("units", 0, "Monte Carlo units per run (`N`; 0 = the scenario's, at least 2)")
	out := fs.String("out", "", "folder for the figures (`DIR`; PNG and SVG); none when empty")
	target := fs.Float64("tolerance-target", 0, "p95 target (`DEG`) for the tolerances; 0 = budget.tolerance_deg, else targets.max_error_p95_deg")
	asJSON := fs.Bool("json", false, "print the budget as JSON")
	force := fs.Bool("force", false, "replace an earlier --out folder or --cpuprofile file")
	full := fs.Bool("full", false, "simulate the scenario's whole duration instead of at most 6 h")
	cpuProf := fs.String("cpuprofile", "", cpuProfileUsage)
	fs.pathFlags(false, "out", "cpuprofile")
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
	if err := distinctOutputs(output{"--out", *out}, output{"--cpuprofile", *cpuProf}); err != nil {
		return err
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
	stopProf, err := startCPUProfile(*cpuProf, force)
	if err != nil {
		return err
	}
	defer stopProf()
	ctx, stop := interruptContext()
	defer stop()
	start := time.Now()
	rep, err := budget.Study(ctx, s, budget.StudyOptions{Units: *units, Full: *full, TargetDeg: *target, Curves: *out != ""})
	var optErr *budget.OptionError
	if errors.As(err, &optErr) {
		return usageError{err}
	}
	if err != nil {
		return interrupted(err)
	}
	tgt := rep.TargetDeg
	if *out != "" {
		err := writeOutputDir(*out, *force, func(dir string) error { return budgetFigures(s, rep, tgt, dir) })
		if err != nil {
			return err
		}
	}
	elapsed := time.Since(start)
	// A tolerance target the all-together error misses: exit status 3.
	var verdict error
	if rep.Missed() {
		verdict = targetsFailed{what: fmt.Sprintf("p95 error with every source as stated %.3f° exceeds the tolerance target %.3g°", rep.AllP95Deg, tgt)}
	}
	if *asJSON {
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(rep); err != nil {
			return err
		}
		return verdict
	}
	printBudget(stdout, rep, elapsed)
	if verdict != nil {
		fmt.Fprintf(stdout, "\nverdict: FAIL, %v\n", verdict)
	} else if tgt > 0 {
		fmt.Fprintf(stdout, "\nverdict: PASS, p95 %.3f° within the tolerance target %.3g°\n", rep.AllP95Deg, tgt)
	}
	return verdict
}

func printBudget(w io.Writer, rep budget.Report, elapsed time.Duration) {
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
	if p, r := rep.GapP95CIDeg, rep.GapRMSCIDeg; p != nil && r != nil {
		fmt.Fprintf(w, "\nall − RSS: p95 %+.3f° (95 %% bootstrap interval over units [%+.3f, %+.3f]), RMS %+.3f° [%+.3f, %+.3f]\n",
			rep.AllP95Deg-rep.RSSP95Deg, p[0], p[1], rep.AllRMSDeg-rep.RSSRMSDeg, r[0], r[1])
		fmt.Fprintln(w, "  an interval that excludes 0 means that figure does not add in RSS: size it from the all-together run.")
	} else {
		fmt.Fprintf(w, "\nall − RSS: p95 %+.3f°, RMS %+.3f°; no interval and no conclusion from %d units: a 95 %% bootstrap\n",
			rep.AllP95Deg-rep.RSSP95Deg, rep.AllRMSDeg-rep.RSSRMSDeg, rep.Units)
		fmt.Fprintf(w, "  interval over units needs at least %d units (below that it holds the true value well under 90 %%\n", rep.IntervalMinUnits)
		fmt.Fprintf(w, "  of the time); give --units %d or more to judge whether the budget adds in RSS.\n", rep.IntervalMinUnits)
	}
	if rep.CalibratedP95 != nil || rep.NoAlbedoP95 != nil {
		fmt.Fprintln(w, "\nWhat calibration buys (p95, all sources):")
		fmt.Fprintf(w, "  as stated                         %.3f°\n", rep.AllP95Deg)
		if rep.CalibratedP95 != nil {
			fmt.Fprintf(w, "  calibrated residuals (budget)     %.3f°\n", *rep.CalibratedP95)
		}
		switch {
		case rep.CorrectedP95 != nil:
			fmt.Fprintf(w, "  albedo corrected on board         %.3f°   (%s)\n", *rep.CorrectedP95, rep.CorrectionModel)
		case rep.NoAlbedoP95 != nil:
			fmt.Fprintf(w, "  albedo corrected on board         —        (no sensor of the layout can subtract a predicted albedo)\n")
		}
		if rep.NoAlbedoP95 != nil {
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
	if c := rep.CalibrationRange; c != nil {
		printCalibrationRange(w, c, rep.TargetDeg)
	}
	fmt.Fprintf(w, "\nComputed in %.1f s. An analysis aid: flight hardware needs qualified verification.\n", elapsed.Seconds())
}

// printCalibrationRange prints over what sensor temperatures the ground
// calibration keeps the target.
func printCalibrationRange(w io.Writer, c *budget.TemperatureRow, target float64) {
	fmt.Fprintf(w, "\nCalibration temperature range for p95 ≤ %.3g° (every sensor with a dark signal or gain coefficient moved alike, sunlit and eclipse):\n", target)
	if c.Infeasible {
		fmt.Fprintf(w, "  none: the target is missed at the calibration temperature itself (p95 %.3f°)\n", c.AtLowDeg)
		return
	}
	end := func(d float64, bounded bool) string {
		s := fmt.Sprintf("%+.1f °C", d)
		if c.CalibrationC != nil {
			s = fmt.Sprintf("%.1f °C (%+.1f)", *c.CalibrationC+d, d)
		}
		if !bounded {
			s = "beyond " + s
		}
		return s
	}
	from := "their calibration temperatures"
	if c.CalibrationC != nil {
		from = fmt.Sprintf("the calibration at %.1f °C", *c.CalibrationC)
	}
	fmt.Fprintf(w, "  from %s to %s around %s (p95 %.3f° and %.3f° at the ends; searched to 0.5 °C, ±%.0f °C at most)\n",
		end(c.LowOffsetC, c.LowBounded), end(c.HighOffsetC, c.HighBounded), from, c.AtLowDeg, c.AtHighDeg, budget.MaxTemperatureOffsetC)
}

func budgetFigures(s *scenario.Scenario, rep budget.Report, tgt float64, dir string) error {
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
	if len(rep.Curves) > 0 {
		nom := 1.0
		sens := plots.Sensitivity{Title: "Sensitivity of the p95 error to each source", Parameter: "1σ / stated 1σ",
			X: budget.SensitivityScales, YLabel: "p95 sun-vector error (deg)", Nominal: &nom}
		for _, cv := range rep.Curves {
			sens.Lines = append(sens.Lines, plots.Line{Label: cv.Source.String(), Y: cv.P95Deg})
		}
		caption.Assumptions = "one source scaled, the others as stated"
		if tgt > 0 {
			caption.Assumptions += fmt.Sprintf("; target p95 ≤ %.3g° (the dash-dot line)", tgt)
			sens.Target, sens.TargetLabel = &tgt, fmt.Sprintf("target p95 ≤ %.3g°", tgt)
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
