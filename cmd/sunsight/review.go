package main

import (
	"fmt"
	"slices"

	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/review"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// writeReview draws the design-review figures of a run and writes them as
// files (plotsDir) and/or binds them into the HTML report.
func writeReview(s *scenario.Scenario, cfg sim.Config, res *sim.Result, report, plotsDir string) error {
	all, err := review.Figures(s, cfg, res)
	if err != nil {
		return fmt.Errorf("figures: %w", err)
	}
	// output.figures chooses the figures (all of them by default).
	var figs []review.Named
	for _, f := range all {
		if slices.Contains(s.Output.Figures, f.Name) {
			figs = append(figs, f)
		}
	}
	if plotsDir != "" {
		if err := review.WritePlots(plotsDir, figs, []string{"png", "svg"}); err != nil {
			return err
		}
	}
	if report != "" {
		r, err := review.Report(s, cfg, res, figs, toolVersion())
		if err != nil {
			return fmt.Errorf("report: %w", err)
		}
		if err := plots.WriteReportFile(report, r); err != nil {
			return err
		}
	}
	return nil
}
