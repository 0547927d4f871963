package sweep

import (
	"bytes"
	"codeberg.org/sunsight/sunsight/scenario/study"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"runtime"
	"slices"
	"strconv"
	"sync"

	"codeberg.org/sunsight/sunsight/internal/atomicfile"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// RunFunc simulates one case with the given seed. RunCase is the real one;
// tests may inject a cheaper function.
type RunFunc func(ctx context.Context, s *scenario.Scenario, seed uint64) (Outcome, error)

// Outcome is what a case run gives: its headline and its targets judged.
type Outcome struct {
	Headline sim.Headline
	Targets  []study.TargetCheck
}

// RunCase builds the case's simulation with one worker and the derived seed
// and returns its headline and its targets, judged with the layout's sky
// coverage as run does.
func RunCase(ctx context.Context, s *scenario.Scenario, seed uint64) (Outcome, error) {
	cfg, err := study.Config(s)
	if err != nil {
		return Outcome{}, err
	}
	cfg.Workers, cfg.Seed, cfg.SeriesStride, cfg.SunTrackPoints = 1, seed, 0, 0
	res, err := sim.Run(ctx, cfg)
	if err != nil {
		return Outcome{}, err
	}
	a := study.AssessTargets(s, cfg, res)
	if a.CoverageErr != nil {
		return Outcome{}, a.CoverageErr
	}
	if s.Targets.NMinus1.Set {
		sf, err := study.RunSingleFailure(ctx, s, cfg)
		if err != nil {
			return Outcome{}, err
		}
		a = a.WithSingleFailure(s, sf)
	}
	return Outcome{Headline: a.Headline, Targets: a.Targets}, nil
}

// Options controls Execute.
type Options struct {
	Workers int // cases in parallel; 0 = GOMAXPROCS
	// Shard K of N (1 ≤ K ≤ N) runs only the cases with index % N == K−1;
	// N = 0 runs every case.
	ShardK, ShardN int
	Run            RunFunc // nil = RunCase
	// Done, when set, is called after each case finishes (from any worker).
	Done func(index int)
}

// The files of a sweep folder besides cases/: the plan, the table and the
// figures' folder.
const (
	PlanFile  = "plan.json"
	TableFile = "sweep.csv"
	PlotsDir  = "plots"
)

// Manifest is DIR/plan.json: the sweep's definition, so a resume or merge
// can refuse a folder made by another sweep.
type Manifest struct {
	Keys      []string   `json:"keys"`
	Zip       bool       `json:"zip"`
	Cases     [][]string `json:"cases"`
	CaseSHA   []string   `json:"case_scenario_sha256"`
	BaseSeeds []string   `json:"case_scenario_seed"` // decimal: 64-bit seeds stay exact in JSON
}

// CaseFile is DIR/cases/NNNNN.json. Checksum is the SHA-256 of the file's
// JSON with the checksum left empty: a case file edited by hand or damaged
// is refused on resume and merge.
type CaseFile struct {
	Index    int                  `json:"index"`
	Inputs   []Input              `json:"inputs"`
	SHA256   string               `json:"scenario_sha256"`
	Seed     uint64               `json:"seed,string"`
	Headline map[string]any       `json:"headline"` // NaN stored as null
	Targets  []study.TargetRecord `json:"targets"`
	Checksum string               `json:"checksum_sha256"`
}

// Met reports whether every target of the case is met.
func (cf *CaseFile) Met() bool {
	for _, t := range cf.Targets {
		if !t.Pass {
			return false
		}
	}
	return true
}

// sum returns the checksum of the case file's content.
func (cf CaseFile) sum() (string, error) {
	cf.Checksum = ""
	b, err := marshal(cf)
	if err != nil {
		return "", err
	}
	s := sha256.Sum256(b)
	return hex.EncodeToString(s[:]), nil
}

// Input is one varied key and its value.
type Input struct {
	Key   string `json:"key"`
	Value string `json:"value"`
}

func (p *Plan) manifest() Manifest {
	m := Manifest{Keys: p.Keys(), Zip: p.Zip, Cases: p.Cases, CaseSHA: p.sum}
	for _, s := range p.scen {
		m.BaseSeeds = append(m.BaseSeeds, strconv.FormatInt(s.Seed, 10))
	}
	return m
}

// FolderError is a folder that does not hold what the sweep asked for needs:
// another sweep's plan, a case file made from another scenario, edited or
// damaged, shards of different sweeps, cases missing at a merge. The fix is
// the user's (another folder, the missing shards), as for bad input.
type FolderError struct{ Err error }

func (e *FolderError) Error() string { return e.Err.Error() }
func (e *FolderError) Unwrap() error { return e.Err }

// folderErrorf builds a *FolderError.
func folderErrorf(format string, a ...any) error {
	return &FolderError{fmt.Errorf(format, a...)}
}

// Summary tells what Execute did.
type Summary struct {
	Total, InShard, Skipped, Ran int
}

// Execute runs the plan's cases (those of the shard) into dir, skipping
// cases whose file exists and matches. It stops at the first failure or
// when ctx is cancelled, keeping every case already written; only cases in
// flight are lost.
func Execute(ctx context.Context, p *Plan, dir string, opt Options) (Summary, error) {
	sum := Summary{Total: len(p.Cases)}
	if opt.ShardN < 0 || (opt.ShardN > 0 && (opt.ShardK < 1 || opt.ShardK > opt.ShardN)) {
		return sum, fmt.Errorf("sweep: --shard %d/%d: want K/N with 1 ≤ K ≤ N", opt.ShardK, opt.ShardN)
	}
	run := opt.Run
	if run == nil {
		run = RunCase
	}
	// The plan first: a folder holding anything of the sweep's holds its
	// plan.json, which is how a later run knows the folder is a sweep's.
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return sum, fmt.Errorf("sweep: output folder: %w", err)
	}
	if err := p.claim(dir); err != nil {
		return sum, err
	}
	if err := os.MkdirAll(filepath.Join(dir, "cases"), 0o755); err != nil {
		return sum, fmt.Errorf("sweep: output folder: %w", err)
	}
	var todo []int
	for i := range p.Cases {
		if opt.ShardN > 0 && i%opt.ShardN != opt.ShardK-1 {
			continue
		}
		sum.InShard++
		cf, err := ReadCase(dir, i)
		if errors.Is(err, os.ErrNotExist) {
			todo = append(todo, i)
			continue
		}
		if err != nil {
			return sum, err
		}
		if err := p.matches(cf); err != nil {
			return sum, folderErrorf("sweep: %s: %w; use a new --out folder or delete the file", caseFile(dir, i), err)
		}
		sum.Skipped++
	}
	workers := opt.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, max(len(todo), 1))
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	jobs := make(chan int)
	var (
		mu       sync.Mutex
		firstErr error
		wg       sync.WaitGroup
	)
	fail := func(err error) {
		mu.Lock()
		if firstErr == nil {
			firstErr = err
		}
		mu.Unlock()
		cancel()
	}
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range jobs {
				seed := CaseSeed(p.scen[i].Seed, i)
				oc, err := run(ctx, p.scen[i], seed)
				if err != nil {
					if ctx.Err() == nil {
						fail(fmt.Errorf("sweep: case %d (%s): %w", i, describeCase(p.Axes, p.Cases[i]), err))
					}
					continue
				}
				cf, err := p.caseFile(i, seed, oc)
				if err == nil {
					err = writeJSON(caseFile(dir, i), cf)
				}
				if err != nil {
					fail(err)
					continue
				}
				mu.Lock()
				sum.Ran++
				mu.Unlock()
				if opt.Done != nil {
					opt.Done(i)
				}
			}
		}()
	}
feed:
	for _, i := range todo {
		select {
		case jobs <- i:
		case <-ctx.Done():
			break feed
		}
	}
	close(jobs)
	wg.Wait()
	if firstErr != nil {
		return sum, firstErr
	}
	if err := ctx.Err(); err != nil {
		return sum, fmt.Errorf("sweep: stopped after %d new cases (%d of %d in the folder): %w", sum.Ran, sum.Ran+sum.Skipped, sum.InShard, err)
	}
	return sum, nil
}

// claim writes dir/plan.json, or checks that the one there is this plan's.
func (p *Plan) claim(dir string) error {
	path := filepath.Join(dir, PlanFile)
	want := p.manifest()
	old, err := ReadManifest(dir)
	if errors.Is(err, os.ErrNotExist) {
		return writeJSON(path, want)
	}
	if err != nil {
		return err
	}
	if !reflect.DeepEqual(old, want) {
		return folderErrorf("sweep: %s holds another sweep (different keys, values or scenario); use a new --out folder or delete it", dir)
	}
	return nil
}

func (p *Plan) matches(cf *CaseFile) error {
	i := cf.Index
	if i < 0 || i >= len(p.Cases) {
		return fmt.Errorf("case index %d is outside this sweep's %d cases", i, len(p.Cases))
	}
	if cf.SHA256 != p.sum[i] {
		return fmt.Errorf("case %d was made from another scenario (checksum differs)", i)
	}
	if len(cf.Inputs) != len(p.Axes) {
		return fmt.Errorf("case %d has %d inputs, this sweep varies %d keys", i, len(cf.Inputs), len(p.Axes))
	}
	for k, in := range cf.Inputs {
		if in.Key != p.Axes[k].Key || in.Value != p.Cases[i][k] {
			return fmt.Errorf("case %d has %s=%s, this sweep wants %s=%s", i, in.Key, in.Value, p.Axes[k].Key, p.Cases[i][k])
		}
	}
	return nil
}

func (p *Plan) caseFile(i int, seed uint64, oc Outcome) (CaseFile, error) {
	h := oc.Headline
	cf := CaseFile{Index: i, SHA256: p.sum[i], Seed: seed, Headline: map[string]any{}, Targets: study.Records(oc.Targets)}
	for k, a := range p.Axes {
		cf.Inputs = append(cf.Inputs, Input{a.Key, p.Cases[i][k]})
	}
	for _, c := range headlineColumns(h) {
		switch {
		case c.isText:
			cf.Headline[c.name] = c.text
		case math.IsNaN(c.num):
			cf.Headline[c.name] = nil
		default:
			cf.Headline[c.name] = c.num
		}
	}
	sum, err := cf.sum()
	cf.Checksum = sum
	return cf, err
}

func caseFile(dir string, i int) string {
	return filepath.Join(dir, "cases", fmt.Sprintf("%05d.json", i))
}

// ReadCase reads dir/cases/NNNNN.json; a missing file gives os.ErrNotExist.
func ReadCase(dir string, i int) (*CaseFile, error) {
	data, err := os.ReadFile(caseFile(dir, i))
	if err != nil {
		if errors.Is(err, os.ErrNotExist) {
			return nil, err
		}
		return nil, fmt.Errorf("sweep: %w", err)
	}
	var cf CaseFile
	if err := json.Unmarshal(data, &cf); err != nil {
		return nil, folderErrorf("sweep: %s is not a case file (%v); delete it to run the case again", caseFile(dir, i), err)
	}
	if cf.Index != i {
		return nil, folderErrorf("sweep: %s says it is case %d; delete it to run the case again", caseFile(dir, i), cf.Index)
	}
	if sum, err := cf.sum(); err != nil || sum != cf.Checksum {
		return nil, folderErrorf("sweep: %s fails its checksum (edited or damaged); delete it to run the case again", caseFile(dir, i))
	}
	return &cf, nil
}

// ReadManifest reads dir/plan.json.
func ReadManifest(dir string) (Manifest, error) {
	var m Manifest
	data, err := os.ReadFile(filepath.Join(dir, PlanFile))
	if err != nil {
		if errors.Is(err, os.ErrNotExist) {
			return m, err
		}
		return m, fmt.Errorf("sweep: %w", err)
	}
	if err := json.Unmarshal(data, &m); err != nil {
		return m, folderErrorf("sweep: %s is not a sweep plan (%v); use a new --out folder or delete it", filepath.Join(dir, PlanFile), err)
	}
	return m, nil
}

// writeJSON writes v atomically: a temporary file in the same folder, then
// a rename, so a reader never sees a partial file.
func writeJSON(path string, v any) error {
	data, err := marshal(v)
	if err != nil {
		return fmt.Errorf("sweep: %w", err)
	}
	return atomicfile.Write(path, data)
}

// marshal is the one JSON form of the sweep's files: indented, "<" and ">"
// as themselves, a final newline.
func marshal(v any) ([]byte, error) {
	var b bytes.Buffer
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	if err := enc.Encode(v); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

// column is one headline figure.
type column struct {
	name   string
	num    float64
	text   string
	isText bool
	isInt  bool
}

// headlineColumns lists h's fields in declaration order under their json
// names (which carry the units).
func headlineColumns(h sim.Headline) []column {
	v := reflect.ValueOf(h)
	t := v.Type()
	out := make([]column, 0, t.NumField())
	for i := range t.NumField() {
		c := column{name: t.Field(i).Tag.Get("json")}
		f := v.Field(i)
		switch f.Kind() {
		case reflect.String:
			c.text, c.isText = f.String(), true
		case reflect.Int, reflect.Int64:
			c.num, c.isInt = float64(f.Int()), true
		case reflect.Float64:
			c.num = f.Float()
		default:
			continue
		}
		out = append(out, c)
	}
	return out
}

// HeadlineNames returns the headline column names in table order.
func HeadlineNames() []string {
	var out []string
	for _, c := range headlineColumns(sim.Headline{}) {
		out = append(out, c.name)
	}
	return slices.Clip(out)
}
