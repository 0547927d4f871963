package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"strconv"
	"strings"
	"sync"

	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario/sweep"
)

func init() {
	register(command{name: "sweep", summary: "run a scenario over ranges of its keys (altitude, LTAN, epoch, layout, mode…)",
		args: "FILE --vary KEY=VALUES [--vary ...] --out DIR [flags]",
		about: `Runs the scenario FILE (- reads standard input) once per combination of the --vary
values and writes one case file per case, sweep.csv and figures into --out. Re-running the
same command into the same folder resumes; a second sweep on a folder in use is refused.
The exit status is 3 when any case misses a target (for a sharded sweep, at the merge).`,
		examples: []string{
			"sunsight sweep examples/nadir-6u-sso.yaml --vary orbit.altitude_km=400:700:100 --vary orbit.ltan=06:00,10:30 --out sweep-out",
			"sunsight sweep scen.yaml --vary orbit.altitude_km=300:900:25 --shard 2/8 --out out-2",
		},
		run: runSweep})
}

func runSweep(args []string, stdout, stderr io.Writer) error {
	fs := newFlagSet("sweep")
	vary := fs.StringArray("vary", nil, "`KEY=VALUES` to vary (repeatable): a dotted key of the scenario file, layout or mode; VALUES lo:hi:step or a comma list")
	zip := fs.Bool("zip", false, "pair the i-th values of every --vary (lists of equal length) instead of the cross product")
	out := fs.String("out", "", "output folder (`DIR`, required); re-running into it resumes")
	workers := fs.Int("workers", 0, "cases run in parallel (`N`; 0 = number of CPUs)")
	shard := fs.String("shard", "", "`K/N`: run only cases with index % N == K-1 (join the shards with sunsight merge)")
	noPlots := fs.Bool("no-plots", false, "write the table but no figures")
	quiet := fs.Bool("quiet", false, "no progress on stderr (it is shown on a terminal only)")
	cpuProf := fs.String("cpuprofile", "", cpuProfileUsage)
	fs.pathFlags(false, "out", "cpuprofile")
	pos, err := fs.parse(args, stdout)
	if err != nil {
		return err
	}
	var axes []sweep.Axis
	for _, v := range *vary {
		a, err := sweep.ParseAxis(v)
		if err != nil {
			return usagef("--vary %q: %v", v, err)
		}
		axes = append(axes, a)
	}
	if len(pos) != 1 {
		return usagef("want one scenario file; usage: sunsight sweep FILE --vary KEY=VALUES --out DIR")
	}
	if *out == "" {
		return usagef("--out is missing; give the folder for the case files and sweep.csv")
	}
	if err := distinctOutputs(output{"--out", *out}, output{"--cpuprofile", *cpuProf}); err != nil {
		return err
	}
	if *workers < 0 {
		return usagef("--workers %d: give 0 (number of CPUs) or a positive count", *workers)
	}
	k, n, err := parseShard(*shard)
	if err != nil {
		return err
	}
	data, err := readInput(pos[0], maxScenarioBytes, "scenario file")
	if err != nil {
		return err
	}
	dir := "."
	if pos[0] != stdinName {
		dir = filepath.Dir(pos[0])
	}
	dir, err = filepath.Abs(dir)
	if err != nil {
		return err
	}
	plan, err := sweep.NewPlan(data, dir, axes, *zip)
	if err != nil {
		return usageError{scenarioError(describeFile(pos[0]), err)}
	}
	stopProf, err := startCPUProfile(*cpuProf, nil)
	if err != nil {
		return err
	}
	defer stopProf()
	ctx, stop := interruptContext()
	defer stop()
	// One sweep at a time writes a folder: a second one on the same --out
	// is refused at once instead of racing on plan.json and the case files.
	// A folder that is not a sweep's is refused untouched (a shard writes
	// no table nor figures; the merge does).
	release, err := holdSweepDir(*out, !*noPlots && n <= 1)
	if err != nil {
		return err
	}
	defer release()
	// The count of new cases done, on a terminal only (as run's and
	// season's displays): logs and pipes stay clean.
	prog := sweepProgress(stderr, !*quiet && isTerminal(stderr), len(plan.Cases))
	sum, err := sweep.Execute(ctx, plan, *out, sweep.Options{Workers: *workers, ShardK: k, ShardN: n, Done: func(int) { prog.update() }})
	prog.finish()
	if errors.Is(err, context.Canceled) {
		// The finished cases stay: a sweep resumes.
		return fmt.Errorf("interrupted after %d new cases (%d of %d in %s); run the same command again to resume", sum.Ran, sum.Ran+sum.Skipped, sum.InShard, *out)
	}
	if err != nil {
		return sweepError(err)
	}
	fmt.Fprintf(stdout, "sweep: %d cases in %s (%d run now, %d already there)\n", sum.InShard, *out, sum.Ran, sum.Skipped)
	if n > 1 {
		fmt.Fprintf(stdout, "sweep: shard %d/%d done; join the shards with: sunsight merge %s OTHER-SHARD-DIRS...\n", k, n, *out)
		return nil
	}
	return writeSweepOutputs([]string{*out}, *noPlots, pos[0], stdout)
}

// caseProgress rewrites one line of stderr with the number of new cases
// done; off, it writes nothing.
type caseProgress struct {
	mu         sync.Mutex
	w          io.Writer
	on         bool
	done, most int
}

// sweepProgress is the case count of a sweep of at most most cases to run
// (a resumed or sharded sweep runs fewer), shown when on.
func sweepProgress(w io.Writer, on bool, most int) *caseProgress {
	return &caseProgress{w: w, on: on, most: most}
}

// update counts one more case done (from any worker).
func (p *caseProgress) update() {
	p.mu.Lock()
	defer p.mu.Unlock()
	p.done++
	if !p.on {
		return
	}
	word := "cases"
	if p.done == 1 {
		word = "case"
	}
	fmt.Fprintf(p.w, "\rsunsight sweep: %d new %s done (at most %d to run)", p.done, word, p.most)
}

// finish ends the line, if one was written.
func (p *caseProgress) finish() {
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.on && p.done > 0 {
		fmt.Fprintln(p.w)
	}
}

func writeSweepOutputs(dirs []string, noPlots bool, source string, stdout io.Writer) error {
	m, err := sweep.ReadManifest(dirs[0])
	if err != nil {
		return usagef("%v", err)
	}
	caption := plots.Caption{Scenario: source + " swept over " + strings.Join(m.Keys, ", "),
		Assumptions: "analysis aid; flight hardware needs qualified verification"}
	// The figures go in as an output set of their own (with its manifest):
	// a plots folder holding a file of the user's is never replaced.
	cases, err := sweep.WriteOutputs(dirs, noPlots, caption, func(dst string, fill func(string) error) error {
		return writeOutputDir(dst, true, fill)
	})
	if err != nil {
		return sweepError(err)
	}
	fmt.Fprintf(stdout, "sweep: wrote %s\n", filepath.Join(dirs[0], sweep.TableFile))
	if !noPlots {
		fmt.Fprintf(stdout, "sweep: figures in %s\n", filepath.Join(dirs[0], sweep.PlotsDir))
	}
	failed, stated := 0, 0
	for _, cf := range cases {
		if !cf.Met() {
			failed++
		}
		if len(cf.Targets) > 0 {
			stated++
		}
	}
	if failed > 0 {
		fmt.Fprintf(stdout, "verdict: %d of %d cases miss a target (see the target_*_pass columns of sweep.csv)\n", failed, len(cases))
		return targetsFailed{what: fmt.Sprintf("%d of %d cases miss a target", failed, len(cases))}
	}
	switch stated {
	case 0:
		fmt.Fprintf(stdout, "verdict: no targets set in any of the %d cases\n", len(cases))
	case len(cases):
		fmt.Fprintf(stdout, "verdict: every target met in all %d cases\n", len(cases))
	default:
		fmt.Fprintf(stdout, "verdict: every target met in the %d cases that set any (%d set none)\n", stated, len(cases)-stated)
	}
	return nil
}

// sweepError is err, marked bad input (exit 2) when it is a folder that does
// not fit the sweep (sweep.FolderError: another sweep's, a case missing or
// damaged), which the user fixes.
func sweepError(err error) error {
	var fe *sweep.FolderError
	if errors.As(err, &fe) {
		return usageError{err}
	}
	return err
}

func parseShard(s string) (k, n int, err error) {
	if s == "" {
		return 0, 0, nil
	}
	a, b, ok := strings.Cut(s, "/")
	k, err1 := strconv.Atoi(a)
	n, err2 := strconv.Atoi(b)
	if !ok || err1 != nil || err2 != nil || n < 1 || k < 1 || k > n {
		return 0, 0, usagef("--shard %q: want K/N with 1 ≤ K ≤ N, e.g. 2/8", s)
	}
	return k, n, nil
}
