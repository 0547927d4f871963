package layout

import (
	"context"
	"fmt"
	"math"
	"runtime"
	"sort"
	"sync"

	"codeberg.org/sunsight/sunsight/illum/sky"
)

// MaxCandidates is the most candidates Search accepts.
const MaxCandidates = 30

// DefaultPoints is the default coverage lattice size.
const DefaultPoints = 4096

// Score is what Evaluate says about one subset.
type Score struct {
	Meets bool // every time target met
	// Margin is the smallest target margin (positive = met with room),
	// used to rank subsets of equal size.
	Margin float64
	P95Deg float64 // worst 95th-percentile error over the modes (NaN if none)
	Detail string  // one line for the report
}

// EvaluateFunc scores a subset (candidate indices, increasing).
type EvaluateFunc func(ctx context.Context, subset []int) (Score, error)

// Problem is one layout search.
type Problem struct {
	Viewers           []sky.Viewer // one per candidate
	CoverageSensors   int          // k of "seen by at least k" (1..sky.MaxLevel); 0 = no coverage target
	MinCoverage       float64
	SurviveOneFailure bool
	MaxSensors        int // 0 = all candidates
	Top               int // ranked alternatives wanted (0 = 5)
	Points            int // lattice points (0 = DefaultPoints)
	Evaluate          EvaluateFunc
	// Workers bounds the subsets scored at once (0 = GOMAXPROCS); Evaluate
	// must then be safe for concurrent use.
	Workers int
	// MaxEvaluations bounds the Evaluate calls (0 = no bound); when hit,
	// Result.Exhausted is false.
	MaxEvaluations int
}

// Choice is one evaluated subset.
type Choice struct {
	Subset   []int
	Coverage float64 // ≥ k fraction (worst single failure when SurviveOneFailure)
	Score    Score
}

// Result is the search outcome.
type Result struct {
	Best         *Choice  // fewest sensors meeting every target; nil if none
	Alternatives []Choice // feasible, by size then margin (Best first)
	Front        []Choice // evaluated subsets not dominated in (count, coverage, p95)
	Evaluated    int      // Evaluate calls
	Visited      int      // branch-and-bound nodes
	Pruned       int      // branches cut by the coverage bound
	Exhausted    bool     // every coverage-feasible size up to the stop was evaluated
}

// Search runs the branch and bound.
func Search(ctx context.Context, p Problem) (Result, error) {
	n := len(p.Viewers)
	switch {
	case n == 0:
		return Result{}, fmt.Errorf("layout: no candidates; list candidate sensors under body.candidates")
	case n > MaxCandidates:
		return Result{}, fmt.Errorf("layout: %d candidates; the exact search takes at most %d (drop candidates or split the search by face)", n, MaxCandidates)
	case p.CoverageSensors < 0 || p.CoverageSensors > sky.MaxLevel:
		return Result{}, fmt.Errorf("layout: targets.coverage_sensors = %d; allowed 1 to %d", p.CoverageSensors, sky.MaxLevel)
	case p.Evaluate == nil:
		return Result{}, fmt.Errorf("layout: no evaluation function")
	}
	maxS := p.MaxSensors
	if maxS <= 0 || maxS > n {
		maxS = n
	}
	top := p.Top
	if top <= 0 {
		top = 5
	}
	pts := p.Points
	if pts <= 0 {
		pts = DefaultPoints
	}
	lat, err := sky.Fibonacci(pts)
	if err != nil {
		return Result{}, err
	}
	b := newBounder(p.Viewers, lat, p.CoverageSensors, p.SurviveOneFailure)
	var res Result
	chosen := make([]int, 0, maxS)
	// collect walks the subsets of exactly size sensors, pruning a branch
	// when it cannot reach the size or, with every undecided candidate
	// added, the coverage target; it returns those meeting the target.
	collect := func(size int) []Choice {
		var out []Choice
		var walk func(i int)
		walk = func(i int) {
			res.Visited++
			if len(chosen)+(n-i) < size {
				return
			}
			if p.CoverageSensors > 0 && !b.canReach(chosen, i, p.MinCoverage) {
				res.Pruned++
				return
			}
			if len(chosen) == size {
				c := b.coverage(chosen)
				if p.CoverageSensors == 0 || c >= p.MinCoverage {
					out = append(out, Choice{Subset: append([]int(nil), chosen...), Coverage: c})
				}
				return
			}
			chosen = append(chosen, i)
			b.add(i)
			walk(i + 1)
			b.remove(i)
			chosen = chosen[:len(chosen)-1]
			walk(i + 1)
		}
		walk(0)
		return out
	}

	var evaluated []Choice
	res.Exhausted = true
	workers := p.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	batch := 4 * workers
sizes:
	for size := 1; size <= maxS; size++ {
		// Sizes are walked one at a time and only up to the answer: the
		// subsets of larger sizes are never enumerated.
		list := collect(size)
		// Most coverage first, then candidate order: a stable order of work.
		sort.SliceStable(list, func(a, b int) bool { return list[a].Coverage > list[b].Coverage })
		// Subsets are scored in batches on all workers, then taken in list
		// order, so the outcome does not depend on the number of workers.
		for start := 0; start < len(list); start += batch {
			end := min(start+batch, len(list))
			scores := make([]Score, end-start)
			errs := make([]error, end-start)
			var wg sync.WaitGroup
			next := make(chan int)
			for range min(workers, end-start) {
				wg.Go(func() {
					for k := range next {
						scores[k-start], errs[k-start] = p.Evaluate(ctx, list[k].Subset)
					}
				})
			}
			for k := start; k < end; k++ {
				next <- k
			}
			close(next)
			wg.Wait()
			for k := start; k < end; k++ {
				if p.MaxEvaluations > 0 && res.Evaluated >= p.MaxEvaluations {
					res.Exhausted = false
					break sizes
				}
				if err := ctx.Err(); err != nil {
					return res, err
				}
				if err := errs[k-start]; err != nil {
					return res, fmt.Errorf("layout: subset %v: %w", list[k].Subset, err)
				}
				res.Evaluated++
				list[k].Score = scores[k-start]
				evaluated = append(evaluated, list[k])
				if list[k].Score.Meets {
					res.Alternatives = append(res.Alternatives, list[k])
					// Every smaller size was exhausted, so this size is
					// the fewest; the alternatives are the first Top
					// feasible subsets of it in coverage order.
					if len(res.Alternatives) >= top {
						break sizes
					}
				}
			}
		}
		if len(res.Alternatives) > 0 {
			break
		}
	}
	sort.SliceStable(res.Alternatives, func(a, b int) bool {
		x, y := res.Alternatives[a], res.Alternatives[b]
		if len(x.Subset) != len(y.Subset) {
			return len(x.Subset) < len(y.Subset)
		}
		return x.Score.Margin > y.Score.Margin
	})
	if len(res.Alternatives) > top {
		res.Alternatives = res.Alternatives[:top]
	}
	if len(res.Alternatives) > 0 {
		res.Best = &res.Alternatives[0]
	}
	res.Front = front(evaluated)
	return res, nil
}

// front keeps the evaluated subsets no other beats on every axis: fewer or
// equal sensors, more or equal coverage, less or equal p95 error (NaN p95
// counts as worst), and strictly better on one.
func front(list []Choice) []Choice {
	p95 := func(c Choice) float64 {
		if math.IsNaN(c.Score.P95Deg) {
			return math.Inf(1)
		}
		return c.Score.P95Deg
	}
	var out []Choice
	for i, a := range list {
		dominated := false
		for j, o := range list {
			if i == j {
				continue
			}
			le := len(o.Subset) <= len(a.Subset) && o.Coverage >= a.Coverage && p95(o) <= p95(a)
			lt := len(o.Subset) < len(a.Subset) || o.Coverage > a.Coverage || p95(o) < p95(a)
			if le && lt {
				dominated = true
				break
			}
		}
		if !dominated {
			out = append(out, a)
		}
	}
	sort.SliceStable(out, func(a, b int) bool { return len(out[a].Subset) < len(out[b].Subset) })
	return out
}

// bounder keeps per-point counts of the chosen sensors, and per candidate
// index i the counts of candidates i..n−1, for the coverage bound.
type bounder struct {
	k, n    int
	survive bool
	sees    [][]bool // [candidate][point]
	count   []int    // chosen sensors seeing each point
	suffix  [][]int  // suffix[i][p]: candidates ≥ i seeing p
	scratch []int
}

func newBounder(v []sky.Viewer, lat sky.Lattice, k int, survive bool) *bounder {
	n, np := len(v), len(lat.Dirs)
	b := &bounder{k: k, n: n, survive: survive, count: make([]int, np), scratch: make([]int, np)}
	b.sees = make([][]bool, n)
	for i, vi := range v {
		b.sees[i] = make([]bool, np)
		for p, d := range lat.Dirs {
			b.sees[i][p] = vi.Sees(d)
		}
	}
	b.suffix = make([][]int, n+1)
	b.suffix[n] = make([]int, np)
	for i := n - 1; i >= 0; i-- {
		b.suffix[i] = make([]int, np)
		for p := range np {
			b.suffix[i][p] = b.suffix[i+1][p]
			if b.sees[i][p] {
				b.suffix[i][p]++
			}
		}
	}
	return b
}

func (b *bounder) add(i int) {
	for p, s := range b.sees[i] {
		if s {
			b.count[p]++
		}
	}
}

func (b *bounder) remove(i int) {
	for p, s := range b.sees[i] {
		if s {
			b.count[p]--
		}
	}
}

// upper is the coverage of chosen plus every candidate from i on.
func (b *bounder) upper(chosen []int, i int) float64 {
	c := b.scratch
	for p := range c {
		c[p] = b.count[p] + b.suffix[i][p]
	}
	members := chosen
	if b.survive {
		members = append(append([]int(nil), chosen...), rangeFrom(i, b.n)...)
	}
	return b.level(c, members)
}

// canReach reports whether upper(chosen, i) ≥ target. Without the
// single-failure case it stops counting as soon as more points are missed
// than the target allows, which settles most pruned branches early.
func (b *bounder) canReach(chosen []int, i int, target float64) bool {
	if b.survive {
		return b.upper(chosen, i) >= target
	}
	np := len(b.count)
	allowed := np - int(math.Ceil(target*float64(np)-1e-9))
	miss := 0
	suf := b.suffix[i]
	for p, c := range b.count {
		if c+suf[p] < b.k {
			miss++
			if miss > allowed {
				return false
			}
		}
	}
	return true
}

// coverage is the coverage of chosen alone.
func (b *bounder) coverage(chosen []int) float64 {
	copy(b.scratch, b.count)
	return b.level(b.scratch, chosen)
}

// level returns the ≥ k fraction for counts c, or with survive the worst of
// it over the loss of any one member.
func (b *bounder) level(c []int, members []int) float64 {
	np := len(c)
	at := 0
	for _, x := range c {
		if x >= b.k {
			at++
		}
	}
	if !b.survive {
		return float64(at) / float64(np)
	}
	worst := at
	for _, m := range members {
		lost := 0
		for p, s := range b.sees[m] {
			if s && c[p] == b.k {
				lost++
			}
		}
		worst = min(worst, at-lost)
	}
	if len(members) == 0 {
		worst = 0
	}
	return float64(worst) / float64(np)
}

func rangeFrom(i, n int) []int {
	out := make([]int, 0, n-i)
	for j := i; j < n; j++ {
		out = append(out, j)
	}
	return out
}
