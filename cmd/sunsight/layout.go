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
branch and bound; the sky coverage is judged on the lattice run uses, so the chosen set
passes run's coverage target with the coverage printed here). The exit status is 3 when
no subset meets the targets, and 1 when --max-runs stopped the search before any subset
met them (an incomplete search, not a proof).`,
		examples: []string{"sunsight layout examples/layout-6u.yaml", "sunsight layout examples/layout-6u.yaml --top 10 --out layout-out"},
		run:      runLayout})
}

func runLayout(args []string, stdout, stderr io.Writer) error {
	fs := newFlagSet("layout")
	maxSensors := fs.Int("max-sensors", 0, "largest subset tried (`N`; 0 = all candidates)")
	top := fs.Int("top", 5, "ranked alternatives to report (`K`)")
	out := fs.String("out", "", "folder for layout.json (`DIR`, optional)")
	maxRuns := fs.Int("max-runs", 0, "stop after `N` time simulations (0 = no limit; stopped before any subset meets the targets: exit 1, not a proof)")
	force := fs.Bool("force", false, "replace an earlier --out folder or --cpuprofile file")
	cpuProf := fs.String("cpuprofile", "", cpuProfileUsage)
	fs.pathFlags(false, "out", "cpuprofile")
	pos, err := fs.parse(args, stdout)
	if err != nil {
		return err
	}
	if len(pos) != 1 {
		return usagef("want one scenario file; usage: sunsight layout FILE [--max-sensors N] [--top K] [--out DIR]")
	}
	if *maxSensors < 0 || *top < 1 || *maxRuns < 0 {
		return usagef("--max-sensors ≥ 0, --top ≥ 1 and --max-runs ≥ 0 are required")
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
	stopProf, err := startCPUProfile(*cpuProf, force)
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
		SurviveOneFailure: t.SurviveOneFailure, MaxSensors: *maxSensors, Top: *top, Points: layout.DefaultPoints,
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
	fmt.Fprintf(stdout, "sky coverage judged on the %d-point sky lattice run uses (a share resolved to about %.1e)\n", layout.DefaultPoints, layout.Resolution(layout.DefaultPoints))
	untried := strconv.Itoa(res.Untried)
	if res.UntriedAtLeast {
		untried = "at least " + untried
	}
	switch {
	case !res.Exhausted && res.Best == nil:
		total := strconv.Itoa(res.Evaluated + res.Untried)
		if res.UntriedAtLeast {
			total = "at least " + total
		}
		fmt.Fprintf(stdout, "search incomplete: stopped at --max-runs %d in size %d after %d of the %s subsets (up to %d sensors) that pass the coverage bound;\n",
			*maxRuns, res.StoppedSize, res.Evaluated, total, maxSize(*maxSensors, len(cands)))
		fmt.Fprintln(stdout, "none of those tried meets every target, which is not a proof that no subset does: raise --max-runs or give 0")
	case !res.Exhausted:
		fmt.Fprintf(stdout, "run limit: stopped at --max-runs %d with %s subsets of %d sensors untried; every smaller size was simulated in full,\n", *maxRuns, untried, res.StoppedSize)
		fmt.Fprintln(stdout, "so the fewest sensors below is proven, but the ranking covers only the subsets of its size tried")
	}
	if res.Best == nil && res.Exhausted {
		fmt.Fprintln(stdout, "no subset meets every target; relax targets or add candidates")
	} else if res.Best != nil {
		fmt.Fprintf(stdout, "fewest sensors: %d (%s)\n", len(res.Best.Subset), name(*res.Best))
	}
	fmt.Fprintln(stdout, "\nrank  sensors  coverage  p95_deg  margin  set")
	for i, c := range res.Alternatives {
		fmt.Fprintf(stdout, "%4d  %7d  %8.4f  %7s  %6.3f  %s\n", i+1, len(c.Subset), c.Coverage, fixed(c.Score.P95Deg, 3), c.Score.Margin, name(c))
	}
	fmt.Fprintln(stdout, "coverage: share of the sphere seen by enough sensors; p95_deg: the worst mode's p95 error;")
	fmt.Fprintln(stdout, "margin: the smallest target margin over the modes (a valid fraction: above its minimum;")
	fmt.Fprintln(stdout, "the p95 error and the gap: the share of the limit left)")
	fmt.Fprintf(stdout, "ranked by margin, then coverage (closer than %.1e, the lattice's resolution, is a tie), then p95_deg\n", res.Resolution)
	if ties := coverageTies(res.Alternatives); ties != "" {
		fmt.Fprintf(stdout, "tied on coverage: ranks %s (ordered by p95_deg, then coverage)\n", ties)
	}
	fmt.Fprintln(stdout, "\ntrade-off front (count vs coverage vs p95 error)")
	fmt.Fprintln(stdout, "sensors  coverage  p95_deg  meets  set")
	for _, c := range res.Front {
		fmt.Fprintf(stdout, "%7d  %8.4f  %7s  %-5v  %s\n", len(c.Subset), c.Coverage, fixed(c.Score.P95Deg, 3), c.Score.Meets, name(c))
	}
	if b := res.Best; b != nil && t.CoverageSensors > 0 && b.Coverage-t.MinCoverage < layout.Resolution(layout.DefaultPoints) {
		fmt.Fprintf(stdout, "note: the chosen set's coverage %.4f is within the lattice's resolution of min_coverage %.4f: run judges it the same way, but the sky itself could fall either side\n", b.Coverage, t.MinCoverage)
	}
	fmt.Fprintln(stdout, "\nanalysis aid: verify the chosen layout with qualified flight analysis")
	// No subset meeting the targets is a completed search whose answer is
	// "none": exit status 3, after the table and layout.json are written.
	// A search stopped by --max-runs before any subset met the targets has
	// no answer: exit status 1, after the table and layout.json.
	var verdict error
	switch {
	case res.Best == nil && res.Exhausted:
		verdict = targetsFailed{what: "no subset of body.candidates meets every target"}
	case res.Best == nil:
		verdict = fmt.Errorf("search incomplete: --max-runs %d stopped it before any subset met every target (%d simulated, %s passing the coverage bound untried); not a proof that none does", *maxRuns, res.Evaluated, untried)
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
		Class    *int     `json:"coverage_class,omitempty"` // alternatives only
	}
	conv := func(list []layout.Choice, ranked bool) []row {
		rows := []row{}
		for _, c := range list {
			r := row{Coverage: c.Coverage, Margin: c.Score.Margin, Meets: c.Score.Meets, Detail: c.Score.Detail}
			if ranked {
				cl := c.CoverageClass
				r.Class = &cl
			}
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
	doc := map[string]any{"proven": res.Exhausted, "simulated": res.Evaluated, "untried": res.Untried, "untried_at_least": res.UntriedAtLeast, "sky_points": layout.DefaultPoints, "coverage_resolution_fraction": res.Resolution, "alternatives": conv(res.Alternatives, true), "front": conv(res.Front, false)}
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

// maxSize is the largest subset size searched.
func maxSize(maxSensors, n int) int {
	if maxSensors <= 0 || maxSensors > n {
		return n
	}
	return maxSensors
}

// coverageTies lists the runs of ranks (1-based, "1-2, 4-5") that the
// coverage did not order: the same size and margin, one coverage class.
func coverageTies(alt []layout.Choice) string {
	var runs []string
	for i := 0; i < len(alt); {
		j := i + 1
		for j < len(alt) && len(alt[j].Subset) == len(alt[i].Subset) && alt[j].Score.Margin == alt[i].Score.Margin &&
			alt[j].CoverageClass == alt[i].CoverageClass {
			j++
		}
		if j-i > 1 {
			runs = append(runs, fmt.Sprintf("%d-%d", i+1, j))
		}
		i = j
	}
	return strings.Join(runs, ", ")
}

// fixed prints v with prec decimals, or the missing-value mark.
func fixed(v float64, prec int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return study.Missing
	}
	return strconv.FormatFloat(v, 'f', prec, 64)
}
