package main

import (
	"fmt"

	"sunsight/plots"
	"sunsight/scenario"
	"sunsight/scenario/review"
	"sunsight/scenario/sim"
)

// writeReview draws the design-review figures of a run and writes them as
// files (plotsDir) and/or binds them into the HTML report.
func writeReview(s *scenario.Scenario, cfg sim.Config, res *sim.Result, report, plotsDir string) error {
	figs, err := review.Figures(s, cfg, res)
	if err != nil {
		return fmt.Errorf("figures: %w", err)
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
