package main

import (
	"codeberg.org/sunsight/sunsight/scenario/study"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"strconv"
	"strings"

	"codeberg.org/sunsight/sunsight/internal/atomicfile"
	"codeberg.org/sunsight/sunsight/scenario/layout"
)

func init() {
	register(command{name: "layout", summary: "find the fewest candidate sun sensors that meet the targets", args: "[flags] FILE",
		about: `Searches the candidate mounts of body.candidates in the scenario FILE (- reads standard
input) for the fewest sensors that meet its targets in its attitude and every mode (exact
branch and bound). The exit status is 3 when no subset meets the targets.`,
		examples: []string{"sunsight layout examples/layout-6u.yaml", "sunsight layout examples/layout-6u.yaml --top 10 --out layout-out"},
		run:      runLayout})
}

func runLayout(args []string, stdout, stderr io.Writer) error {
	fs := newFlagSet("layout")
	maxSensors := fs.Int("max-sensors", 0, "largest subset tried (`N`; 0 = all candidates)")
	top := fs.Int("top", 5, "ranked alternatives to report (`K`)")
	out := fs.String("out", "", "folder for layout.json (`DIR`, optional)")
	points := fs.Int("sky-points", layout.DefaultPoints, "sky lattice points for the coverage bound (`N`)")
	maxRuns := fs.Int("max-runs", 0, "stop after `N` time simulations (0 = no limit; the answer is then not proven)")
	force := fs.Bool("force", false, "replace an earlier --out folder")
	cpuProf := fs.String("cpuprofile", "", cpuProfileUsage)
	fs.pathFlags(false, "out", "cpuprofile")
	pos, err := fs.parse(args, stdout)
	if err != nil {
		return err
	}
	if len(pos) != 1 {
		return usagef("want one scenario file; usage: sunsight layout FILE [--max-sensors N] [--top K] [--out DIR]")
	}
	if *maxSensors < 0 || *top < 1 || *points < 1 || *maxRuns < 0 {
		return usagef("--max-sensors ≥ 0, --top ≥ 1, --sky-points ≥ 1 and --max-runs ≥ 0 are required")
	}
	if err := distinctOutputs(output{"--out", *out}, output{"--cpuprofile", *cpuProf}); err != nil {
		return err
	}
	if *out != "" {
		if err := checkOutputDir(*out, *force); err != nil {
			return err
		}
	}
	s, err := loadScenario(pos[0])
	if err != nil {
		return err
	}
	cands := s.Body.Candidates
	if len(cands) == 0 {
		return usagef("body.candidates is empty; list the candidate sensor mounts there")
	}
	if len(cands) > layout.MaxCandidates {
		return usagef("body.candidates has %d entries; the exact search takes at most %d", len(cands), layout.MaxCandidates)
	}
	_, viewers, _, err := study.BuildSensors(s, cands, "body.candidates")
	if err != nil {
		return usageError{err}
	}
	stopProf, err := startCPUProfile(*cpuProf)
	if err != nil {
		return err
	}
	defer stopProf()
	ctx, stop := interruptContext()
	defer stop()
	eval, err := layout.Evaluator(ctx, s)
	if err != nil {
		return interrupted(err)
	}
	t := s.Targets
	res, err := layout.Search(ctx, layout.Problem{
		Viewers: viewers, CoverageSensors: t.CoverageSensors, MinCoverage: t.MinCoverage,
		SurviveOneFailure: t.SurviveOneFailure, MaxSensors: *maxSensors, Top: *top, Points: *points,
		MaxEvaluations: *maxRuns, Evaluate: eval,
	})
	if err != nil {
		return interrupted(err)
	}
	name := func(c layout.Choice) string {
		var n []string
		for _, i := range c.Subset {
			n = append(n, cands[i].Name)
		}
		return strings.Join(n, " ")
	}
	fmt.Fprintf(stdout, "layout search: %d candidates, %d subsets simulated, %d branches pruned by sky coverage\n", len(cands), res.Evaluated, res.Pruned)
	if !res.Exhausted {
		fmt.Fprintln(stdout, "warning: --max-runs reached; the answer below is not proven to be the fewest sensors")
	}
	if res.Best == nil {
		fmt.Fprintln(stdout, "no subset meets every target; relax targets or add candidates")
	} else {
		fmt.Fprintf(stdout, "fewest sensors: %d (%s)\n", len(res.Best.Subset), name(*res.Best))
	}
	fmt.Fprintln(stdout, "\nrank  sensors  coverage  p95_deg  margin  set")
	for i, c := range res.Alternatives {
		fmt.Fprintf(stdout, "%4d  %7d  %8.4f  %7s  %6.3f  %s\n", i+1, len(c.Subset), c.Coverage, fixed(c.Score.P95Deg, 3), c.Score.Margin, name(c))
	}
	fmt.Fprintln(stdout, "coverage: share of the sphere seen by enough sensors; p95_deg: the worst mode's p95 error;")
	fmt.Fprintln(stdout, "margin: the smallest target margin over the modes (a valid fraction: above its minimum;")
	fmt.Fprintln(stdout, "the p95 error and the gap: the share of the limit left)")
	fmt.Fprintln(stdout, "\ntrade-off front (count vs coverage vs p95 error)")
	fmt.Fprintln(stdout, "sensors  coverage  p95_deg  meets  set")
	for _, c := range res.Front {
		fmt.Fprintf(stdout, "%7d  %8.4f  %7s  %-5v  %s\n", len(c.Subset), c.Coverage, fixed(c.Score.P95Deg, 3), c.Score.Meets, name(c))
	}
	fmt.Fprintln(stdout, "\nanalysis aid: verify the chosen layout with a finer sky map and qualified flight analysis")
	// No subset meeting the targets is a completed search whose answer is
	// "none": exit status 3, after the table and layout.json are written.
	var verdict error
	if res.Best == nil {
		verdict = targetsFailed{what: "no subset of body.candidates meets every target"}
	}
	if *out == "" {
		return verdict
	}
	type row struct {
		Sensors  []string `json:"sensors"`
		Coverage float64  `json:"coverage_fraction"`
		P95Deg   *float64 `json:"p95_error_deg"`
		Margin   float64  `json:"margin"`
		Meets    bool     `json:"meets_targets"`
		Detail   string   `json:"detail"`
	}
	conv := func(list []layout.Choice) []row {
		rows := []row{}
		for _, c := range list {
			r := row{Coverage: c.Coverage, Margin: c.Score.Margin, Meets: c.Score.Meets, Detail: c.Score.Detail}
			for _, i := range c.Subset {
				r.Sensors = append(r.Sensors, cands[i].Name)
			}
			if !math.IsNaN(c.Score.P95Deg) {
				p := c.Score.P95Deg
				r.P95Deg = &p
			}
			if math.IsInf(r.Margin, 0) || math.IsNaN(r.Margin) {
				r.Margin = 0
			}
			rows = append(rows, r)
		}
		return rows
	}
	doc := map[string]any{"proven": res.Exhausted, "simulated": res.Evaluated, "alternatives": conv(res.Alternatives), "front": conv(res.Front)}
	data, err := json.MarshalIndent(doc, "", "  ")
	if err != nil {
		return err
	}
	path := filepath.Join(*out, "layout.json")
	err = writeOutputDir(*out, *force, func(dir string) error {
		return atomicfile.Write(filepath.Join(dir, "layout.json"), append(data, '\n'))
	})
	if err != nil {
		return err
	}
	fmt.Fprintf(stdout, "wrote %s\n", path)
	return verdict
}

// fixed prints v with prec decimals, or the missing-value mark.
func fixed(v float64, prec int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return study.Missing
	}
	return strconv.FormatFloat(v, 'f', prec, 64)
}
