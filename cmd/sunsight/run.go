package main

import (
	"codeberg.org/sunsight/sunsight/scenario/study"
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"strings"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

func init() {
	register(command{name: "run", summary: "simulate a scenario: eclipses, sun visibility, sun-vector error with and without albedo", run: runRun})
}

// runFlags are the options of sunsight run.
type runFlags struct {
	json     bool
	csvDir   string
	report   string
	plotsDir string
	units    int
	workers  int
	quiet    bool
	duration string
	step     string
	cpuProf  string
}

func parseRunFlags(args []string, stderr io.Writer) (runFlags, string, error) {
	var f runFlags
	fs := flag.NewFlagSet("run", flag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.BoolVar(&f.json, "json", false, "print the results as JSON on stdout instead of the summary table")
	fs.StringVar(&f.csvDir, "csv", "", "write the time series and tables as CSV files into `DIR`")
	fs.StringVar(&f.report, "report", "", "write a self-contained HTML design-review report to `FILE`")
	fs.StringVar(&f.plotsDir, "plots", "", "write every figure as PNG and SVG into `DIR`")
	fs.IntVar(&f.units, "units", 0, "simulated sensor units for the Monte Carlo (`N`; 0 = the scenario's monte_carlo.units)")
	fs.IntVar(&f.workers, "workers", 0, "parallel units (0 = all cores)")
	fs.BoolVar(&f.quiet, "quiet", false, "no progress display")
	fs.StringVar(&f.duration, "duration", "", "override the scenario duration (e.g. 6h, 30d)")
	fs.StringVar(&f.step, "step", "", "override the scenario step (e.g. 10s)")
	fs.StringVar(&f.cpuProf, "cpuprofile", "", cpuProfileUsage)
	fs.Usage = func() {
		fmt.Fprintln(stderr, "Usage: sunsight run [flags] FILE\n\nSimulates the scenario FILE and prints its summary.\n\nFlags:")
		fs.PrintDefaults()
	}
	// Flags may come before or after the file.
	var file string
	rest := args
	for {
		if err := fs.Parse(rest); err != nil {
			if errors.Is(err, flag.ErrHelp) {
				return f, "", errHelpShown
			}
			return f, "", usagef("%v", err)
		}
		if fs.NArg() == 0 {
			break
		}
		if file != "" {
			return f, "", usagef("want one scenario file, got %q and %q", file, fs.Arg(0))
		}
		file = fs.Arg(0)
		rest = fs.Args()[1:]
	}
	if file == "" {
		return f, "", usagef("no scenario file; usage: sunsight run [flags] FILE (sunsight init writes one)")
	}
	if f.units < 0 {
		return f, "", usagef("-units %d: want a whole number ≥ 1 (or 0 for the scenario's value)", f.units)
	}
	if f.workers < 0 {
		return f, "", usagef("-workers %d: want a whole number ≥ 1 (or 0 for all cores)", f.workers)
	}
	return f, file, nil
}

func runRun(args []string, stdout, stderr io.Writer) error {
	f, file, err := parseRunFlags(args, stderr)
	if err != nil {
		return err
	}
	s, err := scenario.Load(file)
	if err != nil {
		return usageError{err}
	}
	if f.duration != "" {
		d, err := scenario.ParseSpan(f.duration)
		if err != nil || d.Seconds() <= 0 {
			return usagef("-duration %q: want a positive span such as 90m, 12h, 30d", f.duration)
		}
		s.Duration = d
	}
	if f.step != "" {
		d, err := scenario.ParseSpan(f.step)
		if err != nil || d.Seconds() <= 0 {
			return usagef("-step %q: want a positive span such as 10s", f.step)
		}
		s.Step = d
	}
	if s.Step.Seconds() > s.Duration.Seconds() {
		return usagef("step %s is longer than the duration %s: shorten the step or lengthen the run", s.Step, s.Duration)
	}
	// Check every output place before the run, so a long run does not end
	// on an unwritable folder.
	for _, d := range []string{f.csvDir, f.plotsDir} {
		if d != "" {
			if err := ensureWritableDir(d); err != nil {
				return usageError{err}
			}
		}
	}
	if f.report != "" {
		if err := ensureWritableDir(filepath.Dir(f.report)); err != nil {
			return usageError{err}
		}
	}
	cfg, err := study.Config(s)
	if err != nil {
		return usageError{fmt.Errorf("%s: %w", file, err)}
	}
	if f.units > 0 {
		cfg.Units = f.units
	}
	cfg.Workers = f.workers
	// A time series is kept only for the CSV files and figures: every
	// output.decimate-th step, or by default at most maxSeriesRows rows.
	if f.csvDir != "" || f.report != "" || f.plotsDir != "" {
		cfg.SeriesStride = s.Output.Decimate
		if cfg.SeriesStride <= 1 {
			cfg.SeriesStride = max(1, cfg.Steps()/maxSeriesRows)
		}
	}
	if f.report != "" || f.plotsDir != "" {
		cfg.SunTrackPoints = 4000
	}

	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	defer stop()
	prog := newProgress(stderr, f.quiet, cfg.Steps(), s.Name)
	cfg.Progress = prog.update
	stopProf, err := startCPUProfile(f.cpuProf)
	if err != nil {
		return err
	}
	res, err := sim.Run(ctx, cfg)
	prog.done()
	if perr := stopProf(); perr != nil && err == nil {
		err = perr
	}
	if err != nil {
		if errors.Is(err, context.Canceled) {
			return errors.New("interrupted: no output written")
		}
		return err
	}
	out := newRunOutput(s, &cfg, res, toolVersion())
	if f.csvDir != "" {
		if err := out.writeCSV(f.csvDir); err != nil {
			return err
		}
	}
	if f.report != "" || f.plotsDir != "" {
		prov, err := provenance(file)
		if err != nil {
			return err
		}
		if err := writeReview(s, cfg, res, f.report, f.plotsDir, prov); err != nil {
			return err
		}
	}
	if f.json {
		return out.writeJSON(stdout)
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
	return nil
}

// maxSeriesRows bounds the default time series kept for CSV files and
// figures (about 10 MB of CSV).
const maxSeriesRows = 100000

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
