package main

import (
	"errors"

	"sunsight/scenario"
	"sunsight/scenario/sim"
)

// writeReview writes the design-review figures and report.
func writeReview(s *scenario.Scenario, cfg sim.Config, res *sim.Result, report, plotsDir string) error {
	return errors.New("the report and figures are not wired yet")
}
