package main

import (
	"bytes"
	"crypto/sha256"
	"fmt"
	"io"
	"os"
	"runtime/debug"
	"strings"
	"time"

	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/plots/figures"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/review"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// writeReview draws the design-review figures of a run and writes them as
// files (plotsDir) and/or binds them into the HTML report. A named figure
// the run has nothing for is left out of plotsDir with a note on stderr
// (the report carries the same note).
func writeReview(s *scenario.Scenario, cfg sim.Config, res *sim.Result, sf *study.SingleFailure, ph *study.Phases, report, plotsDir string, prov review.Provenance, force bool, stderr io.Writer) error {
	// output.figures chooses the figures (all of them by default); only
	// those are built.
	figs, err := review.Figures(s, cfg, res, s.Output.Figures)
	if err != nil {
		return fmt.Errorf("figures: %w", err)
	}
	if plotsDir != "" {
		for _, n := range review.Skipped(res, s.Output.Figures) {
			fmt.Fprintf(stderr, "sunsight run: --plots: %s\n", n)
		}
		err := writeOutputDir(plotsDir, force, func(dir string) error {
			return review.WritePlots(dir, figs, []string{"png", "svg"})
		})
		if err != nil {
			return err
		}
	}
	if report != "" {
		r, err := review.Report(s, cfg, res, figs, prov)
		if err != nil {
			return fmt.Errorf("report: %w", err)
		}
		if ph != nil {
			review.AddPhases(&r, s, *ph)
		}
		if sf != nil {
			review.AddSingleFailure(&r, s, cfg, res, *sf)
		}
		var buf bytes.Buffer
		if err := plots.WriteReport(&buf, r); err != nil {
			return fmt.Errorf("report: %w", err)
		}
		if err := writeOutput(report, buf.Bytes(), force); err != nil {
			return err
		}
	}
	return nil
}

// checkPlotFigures refuses --plots when output.figures names no figure: an
// empty list asks for none, and a plots folder with no figure in it is no
// output. (A report is still written then, with its tables alone.)
func checkPlotFigures(file string, s *scenario.Scenario) error {
	if len(s.Output.Figures) > 0 {
		return nil
	}
	return usagef("--plots: %s: output.figures is an empty list, so there is no figure to write; name the figures there (%s), remove the key for the default set, or leave --plots out",
		file, strings.Join(figures.Names(), ", "))
}

// provenance records where a report comes from: the scenario file as given,
// the SHA-256 of its bytes, the build's version and VCS revision, and now.
func provenance(file string) (review.Provenance, error) {
	b, err := os.ReadFile(file)
	if err != nil {
		return review.Provenance{}, err
	}
	p := review.Provenance{Input: file, InputSHA256: fmt.Sprintf("%x", sha256.Sum256(b)), Generated: time.Now().UTC()}
	if bi, ok := debug.ReadBuildInfo(); ok {
		p.Version = bi.Main.Version
		dirty := false
		for _, s := range bi.Settings {
			switch s.Key {
			case "vcs.revision":
				p.Revision = s.Value
			case "vcs.modified":
				dirty = s.Value == "true"
			}
		}
		if dirty && p.Revision != "" {
			p.Revision += " (with local changes)"
		}
	}
	return p, nil
}
