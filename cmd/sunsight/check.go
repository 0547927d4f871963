package main

import (
	"fmt"
	"io"
	"math"

	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/review"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

func init() {
	register(command{name: "check", summary: "validate a scenario file and print it with every default", args: "[flags] FILE",
		about: `Checks the scenario FILE (YAML; - reads it from standard input) as run would, building
every model, and prints the resolved scenario with every default filled in. All problems
are reported together, each line naming the file, the key and what is allowed.`,
		examples: []string{"sunsight check examples/nadir-6u-sso.yaml", "sunsight check --quiet scenario.yaml && echo valid"},
		run:      runCheck})
}

func runCheck(args []string, stdout, stderr io.Writer) error {
	fs := newFlagSet("check")
	quiet := fs.BoolP("quiet", "q", false, "print nothing on success")
	pos, err := fs.parse(args, stdout)
	if err != nil {
		return err
	}
	if len(pos) != 1 {
		return usagef("want one scenario file; usage: sunsight check [--quiet] FILE")
	}
	s, err := loadScenario(pos[0])
	if err != nil {
		return err
	}
	// Build everything run builds (propagator, albedo model and grid file,
	// sensors, estimators, every mode), so a file check accepts is one run
	// accepts.
	file := describeFile(pos[0])
	plan, err := study.Prepare(s)
	if err != nil {
		return usageError{fmt.Errorf("%s: %w", file, err)}
	}
	d, err := study.Derive(s, plan)
	if err != nil {
		return usageError{fmt.Errorf("%s: %w", file, err)}
	}
	printWarnings(stderr, study.Warnings(s, nil))
	if *quiet {
		return nil
	}
	fmt.Fprintf(stdout, "# %s: valid (every model run uses was built)\n", file)
	writeDerived(stdout, s, d)
	writePlannedTimeline(stdout, plan)
	fmt.Fprintln(stdout, "# where each sensor can see the sun:")
	for _, sn := range plan.Primary.Array.Sensors() {
		fmt.Fprintf(stdout, "#   %s: %s\n", sn.Name(), sensor.ViewText(sn))
	}
	fmt.Fprintln(stdout, "# models and sources:")
	for _, m := range review.ModelsAndSources(s) {
		fmt.Fprintf(stdout, "#   %s — %s\n", m.Model, m.Source)
	}
	fmt.Fprintf(stdout, "# resolved scenario with every default shown:\n")
	stdout.Write(s.Record())
	return nil
}

// writeDerived prints the values a user wants before a long run, as YAML
// comments so the output stays a loadable scenario.
func writeDerived(w io.Writer, s *scenario.Scenario, d study.Derived) {
	fmt.Fprintf(w, "#   orbit period %.2f min (Keplerian, mean a = %.1f km), inclination %.3f°, RAAN %.3f° at the epoch\n",
		d.PeriodS/60, d.SemiMajorAxisKm, d.InclinationDeg, d.RAANDeg)
	if d.SunSync {
		h, m := math.Modf(d.LTANHours)
		fmt.Fprintf(w, "#   sun-synchronous: inclination from the secular J2 condition; RAAN from LTAN %02.0f:%02.0f in %s solar time\n", h, math.Round(m*60), d.SolarTime)
	}
	fmt.Fprintf(w, "#   beta angle over the run %.1f° to %.1f° (sampled every %.0f s)\n", d.BetaMinDeg, d.BetaMaxDeg, d.BetaSampleS)
	runs := ""
	if d.Runs > 1 {
		runs = fmt.Sprintf(", %d attitudes (primary and %d mode(s))", d.Runs, d.Runs-1)
	}
	fmt.Fprintf(w, "#   %s at %s: %d steps × %d unit(s)%s = %d unit-steps; memory about %.0f MB without time series\n",
		s.Duration, s.Step, d.Steps, d.Units, runs, int64(d.Steps)*int64(d.Units)*int64(d.Runs), float64(d.MemoryBytes)/(1<<20))
	if d.FailedLayouts > 0 {
		how := "each a full run (the attitude is drawn per unit, or the geometry is too long to keep)"
		if d.FailedReplayed {
			how = "replaying the primary attitude's recorded geometry"
		}
		fmt.Fprintf(w, "#   single-failure study (targets.n_minus_1): %d failed layouts, %s\n", d.FailedLayouts, how)
	}
}
