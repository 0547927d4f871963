package main

import (
	"codeberg.org/sunsight/sunsight/scenario/study"
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"strings"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/review"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

func init() {
	register(command{name: "run", summary: "simulate a scenario: eclipses, sun visibility, sun-vector error with and without albedo",
		args: "[flags] FILE",
		about: `Simulates the scenario FILE (YAML; - reads it from standard input) and prints its summary,
ending with a verdict line on the scenario's targets. The exit status is 3 when the run
completes but a target is not met.`,
		examples: []string{
			"sunsight run examples/nadir-6u-sso.yaml",
			"sunsight run examples/nadir-6u-sso.yaml --json > run.json",
			"sunsight run examples/tumbling-3u.yaml --units 200 --csv out/ --report report.html",
			"sunsight init -o - | sunsight run - --duration 6h",
		},
		run: runRun})
}

// runFlags are the options of sunsight run.
type runFlags struct {
	json      bool
	csvDir    string
	report    string
	plotsDir  string
	units     int
	workers   int
	quiet     bool
	force     bool
	allUnits  bool
	maxMemMiB int
	duration  string
	step      string
	cpuProf   string
}

func runFlagSet(f *runFlags) *flagSet {
	fs := newFlagSet("run")
	fs.BoolVar(&f.json, "json", false, "print the results as JSON on stdout instead of the summary table")
	fs.StringVar(&f.csvDir, "csv", "", "write the time series and tables as CSV files into `DIR`")
	fs.StringVar(&f.report, "report", "", "write a self-contained HTML design-review report to `FILE`")
	fs.StringVar(&f.plotsDir, "plots", "", "write every figure as PNG and SVG into `DIR`")
	fs.IntVar(&f.units, "units", 0, "simulated sensor units for the Monte Carlo (`N`; 0 = the scenario's monte_carlo.units)")
	fs.IntVar(&f.workers, "workers", 0, "parallel units (`N`; 0 = all cores)")
	fs.BoolVar(&f.quiet, "quiet", false, "no progress display")
	fs.BoolVar(&f.force, "force", false, "replace an earlier --csv or --plots folder, --report or --cpuprofile file")
	fs.BoolVar(&f.allUnits, "all-units", false, "write every Monte Carlo unit into the --csv tables (default: the nominal unit 0)")
	fs.IntVar(&f.maxMemMiB, "max-memory-mib", defaultMaxMemoryMiB, "refuse a run whose estimated memory exceeds `MIB`")
	fs.StringVar(&f.duration, "duration", "", "override the scenario duration (`SPAN`, e.g. 6h, 30d)")
	fs.StringVar(&f.step, "step", "", "override the scenario step (`SPAN`, e.g. 10s)")
	fs.StringVar(&f.cpuProf, "cpuprofile", "", cpuProfileUsage)
	fs.pathFlags(false, "csv", "report", "plots", "cpuprofile")
	return fs
}

func parseRunFlags(args []string, stdout io.Writer) (runFlags, string, error) {
	var f runFlags
	pos, err := runFlagSet(&f).parse(args, stdout)
	if err != nil {
		return f, "", err
	}
	if len(pos) == 0 {
		return f, "", usagef("no scenario file; usage: sunsight run [flags] FILE (sunsight init writes one)")
	}
	if len(pos) > 1 {
		return f, "", usagef("want one scenario file, got %q and %q", pos[0], pos[1])
	}
	if f.units < 0 {
		return f, "", usagef("--units %d: want a whole number ≥ 1 (or 0 for the scenario's value)", f.units)
	}
	if f.workers < 0 {
		return f, "", usagef("--workers %d: want a whole number ≥ 1 (or 0 for all cores)", f.workers)
	}
	if f.allUnits && f.csvDir == "" {
		return f, "", usagef("--all-units selects the units of the --csv tables; give --csv DIR too")
	}
	if err := distinctOutputs(output{"--csv", f.csvDir}, output{"--plots", f.plotsDir}, output{"--report", f.report}, output{"--cpuprofile", f.cpuProf}); err != nil {
		return f, "", err
	}
	return f, pos[0], nil
}

func runRun(args []string, stdout, stderr io.Writer) error {
	f, file, err := parseRunFlags(args, stdout)
	if err != nil {
		return err
	}
	s, err := loadScenario(file)
	if err != nil {
		return err
	}
	if f.duration != "" {
		d, err := spanFlag("--duration", f.duration, "90m, 12h or 30d")
		if err != nil {
			return err
		}
		s.Duration = d
	}
	if f.step != "" {
		d, err := spanFlag("--step", f.step, "10s or 1m")
		if err != nil {
			return err
		}
		s.Step = d
	}
	if s.Step.Seconds() > s.Duration.Seconds() {
		return usagef("step %s is longer than the duration %s: shorten the step or lengthen the run", s.Step, s.Duration)
	}
	if f.plotsDir != "" {
		if err := checkPlotFigures(file, s); err != nil {
			return err
		}
	}
	// Check every output place before the run, so a long run does not end
	// on an unwritable folder or an output it may not replace.
	for _, d := range []string{f.csvDir, f.plotsDir} {
		if d != "" {
			if err := checkOutputDir(d, f.force); err != nil {
				return err
			}
		}
	}
	if f.report != "" {
		if err := checkOutputFile(f.report, f.force); err != nil {
			return err
		}
	}
	plan, err := study.Prepare(s)
	if err != nil {
		return usageError{fmt.Errorf("%s: %w", file, err)}
	}
	cfg := plan.Primary
	if f.units > 0 {
		if f.units < 2 && s.Targets.MaxErrorP95UnitsRad > 0 {
			return usagef("--units %d: %s: targets.max_error_p95_units_deg needs at least 2 Monte Carlo units; give --units 2 or more, or leave --units out", f.units, file)
		}
		cfg.Units = f.units
	}
	cfg.Workers = f.workers
	// A time series is kept only for the CSV files: series.csv has every
	// step unless output.decimate thins it (said on stderr). The figures ask
	// the run for what they need (review.Request).
	var series *seriesFile
	if f.csvDir != "" {
		// gaps.csv lists the gaps of the units it writes.
		cfg.GapListUnits = 1
		if f.allUnits {
			cfg.GapListUnits = max(1, cfg.Units)
		}
		cfg.SeriesStride = max(1, s.Output.Decimate)
		if cfg.SeriesStride > 1 {
			fmt.Fprintf(stderr, "sunsight run: series.csv keeps every %d-th step (output.decimate: %d); remove the key for every step\n",
				cfg.SeriesStride, cfg.SeriesStride)
		}
		// series.csv is written as the run goes, into a temporary file
		// that any failure before the output set is in place removes.
		var err error
		if series, err = newSeriesFile(f.csvDir, s.Epoch, cfg.Panels != nil); err != nil {
			return fmt.Errorf("--csv %s: %w", f.csvDir, err)
		}
		defer series.discard()
		cfg.SeriesSink = series.write
	}
	if f.report != "" || f.plotsDir != "" {
		if err := review.Request(s, &cfg, s.Output.Figures); err != nil {
			return usageError{fmt.Errorf("%s: %w", file, err)}
		}
	}
	if f.maxMemMiB < 1 {
		return usagef("--max-memory-mib %d: want a positive number of MiB", f.maxMemMiB)
	}
	est := float64(study.MemoryEstimate(&cfg, study.SeriesRows(&cfg))) / (1 << 20)
	if s.Targets.NMinus1.Set {
		est += float64(study.SingleFailureTraceBytes(&cfg)) / (1 << 20)
	}
	if est > float64(f.maxMemMiB) {
		tables := ""
		if tb := sim.AlbedoTableBytes(&cfg); tb > 0 {
			tables = fmt.Sprintf("; %.0f MiB of it albedo tables, one per kind of sensor cone", float64(tb)/(1<<20))
		}
		return usagef("the run would need about %.0f MiB (%d units × %d steps, series of %d rows%s), more than --max-memory-mib %d; lower --units, --duration or the step, thin the series with output.decimate, or raise --max-memory-mib",
			est, cfg.Units, cfg.Steps(), study.SeriesRows(&cfg), tables, f.maxMemMiB)
	}

	ctx, stop := interruptContext()
	defer stop()
	prog := newProgress(stderr, f.quiet, cfg.Steps(), s.Name)
	cfg.Progress = prog.update
	stopProf, err := startCPUProfile(f.cpuProf, &f.force)
	if err != nil {
		return err
	}
	res, err := sim.Run(ctx, cfg)
	prog.done()
	if perr := stopProf(); perr != nil && err == nil {
		err = perr
	}
	if err != nil {
		return interrupted(err)
	}
	out := newRunOutput(s, &cfg, res, toolVersion())
	out.series = series
	printWarnings(stderr, out.warnings)
	out.allUnits = f.allUnits
	if study.TimelineOf(cfg) != nil {
		pc := cfg.Lean()
		ph, err := study.RunPhases(ctx, pc, res)
		if err != nil {
			return interrupted(err)
		}
		out.phases = &ph
	}
	if s.Targets.NMinus1.Set {
		sc := cfg.Lean()
		sf, err := study.RunSingleFailure(ctx, s, sc)
		if err != nil {
			return interrupted(err)
		}
		out.addSingleFailure(sf)
	}
	// Each mode runs on the same orbit, sensors and estimators, reported
	// beside the primary attitude.
	for _, m := range plan.Modes {
		mc := m.Config
		mc.Units, mc.Workers = cfg.Units, cfg.Workers
		prog := newProgress(stderr, f.quiet, mc.Steps(), s.Name+" / "+m.Name)
		mc.Progress = prog.update
		mr, err := sim.Run(ctx, mc)
		prog.done()
		if err != nil {
			if errors.Is(err, context.Canceled) {
				return errInterrupted
			}
			return fmt.Errorf("mode %s: %w", m.Name, err)
		}
		out.addMode(m.Name, &mc, mr)
	}
	if f.csvDir != "" {
		if err := writeOutputDir(f.csvDir, f.force, out.writeCSV); err != nil {
			return err
		}
	}
	if f.report != "" || f.plotsDir != "" {
		prov, err := provenance(file)
		if err != nil {
			return err
		}
		if err := writeReview(s, cfg, res, out.assessed.SingleFailure, out.phases, f.report, f.plotsDir, prov, f.force, stderr); err != nil {
			return err
		}
	}
	verdict := study.Judge(out.allTargets())
	if f.json {
		if err := out.writeJSON(stdout); err != nil {
			return err
		}
		return verdictError(verdict)
	}
	out.writeSummary(stdout)
	var written []string
	for _, p := range []string{f.csvDir, f.plotsDir, f.report} {
		if p != "" {
			written = append(written, p)
		}
	}
	if len(written) > 0 {
		fmt.Fprintf(stdout, "\nwritten: %s\n", strings.Join(written, ", "))
	}
	fmt.Fprintf(stdout, "\nverdict: %s\n", verdict.Text())
	if !verdict.Met() {
		return targetsFailed{verdict.Text(), true}
	}
	return nil
}

// verdictError is the error of a run whose targets are not all met (exit 3).
func verdictError(v study.Verdict) error {
	if v.Met() {
		return nil
	}
	return targetsFailed{what: v.Text()}
}

// ensureWritableDir creates dir if needed and checks a file can be made in it.
func ensureWritableDir(dir string) error {
	if dir == "" {
		dir = "."
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("output folder %s: %w", dir, err)
	}
	f, err := os.CreateTemp(dir, ".sunsight-probe-*")
	if err != nil {
		return fmt.Errorf("output folder %s is not writable: %w", dir, err)
	}
	name := f.Name()
	f.Close()
	return os.Remove(name)
}

// defaultMaxMemoryMiB is the memory a run may be estimated to need before it
// is refused (--max-memory-mib raises it).
const defaultMaxMemoryMiB = 4096

// spanFlag reads the value of a flag that takes a length of time: the
// parser's own reason when it cannot read it (an unknown or calendar unit,
// a span too long), and a positive span asked for otherwise (examples: what
// to write instead).
func spanFlag(flag, text, examples string) (scenario.Span, error) {
	d, err := scenario.ParseSpan(text)
	if err != nil {
		return 0, usagef("%s: %v", flag, err)
	}
	if !(d.Seconds() > 0) {
		return 0, usagef("%s %q: want a positive span such as %s", flag, text, examples)
	}
	return d, nil
}
