package layout

import (
	"context"
	"fmt"
	"math"
	"math/bits"
	"runtime"
	"sort"
	"sync"

	"codeberg.org/sunsight/sunsight/illum/sky"
)

// MaxCandidates is the most candidates Search accepts.
const MaxCandidates = 30

// DefaultPoints is the default coverage lattice size: the lattice run judges
// the coverage target on (sky.DefaultPoints), so that a subset's coverage
// here is the number run prints for it.
const DefaultPoints = sky.DefaultPoints

// Resolution is how finely a coverage share counted on n points of the
// Fibonacci lattice resolves the sky: 2·n^(−3/4) (4.9e-4 at the default
// 65 536 points). The count itself steps by 1/n, but the share of a region
// bounded by cone edges is off by more: over random spherical caps (closed
// form share (1 − cos θ)/2) the largest error is 0.85 to 1.4 × n^(−3/4) at
// n = 1024 to 65 536 (TestResolutionBoundsCapError), the rate at which the
// spherical-cap discrepancy of these points is seen to fall (Aistleitner,
// Brauchart & Dick, Discrete Comput. Geom. 48, 2012, from memory); the
// factor 2 covers the measured spread.
func Resolution(n int) float64 { return 2 * math.Pow(float64(n), -0.75) }

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
	// CoverageClass numbers the coverage ties among the alternatives (0 =
	// the most coverage): alternatives whose coverages are closer than the
	// lattice's Resolution, in a chain, share a class and rank as equal
	// on coverage.
	CoverageClass int
}

// Result is the search outcome.
type Result struct {
	Best         *Choice  // fewest sensors meeting every target; nil if none
	Alternatives []Choice // feasible, in rank order (Best first; see rank)
	Front        []Choice // evaluated subsets not dominated in (count, coverage, p95)
	Evaluated    int      // Evaluate calls
	Visited      int      // branch-and-bound nodes
	Pruned       int      // branches cut by the coverage bound
	Exhausted    bool     // every coverage-feasible size up to the stop was evaluated
	// Untried counts, when MaxEvaluations stopped the search (Exhausted
	// false), the subsets passing the coverage bound that were not
	// simulated: the rest of the size it stopped in and every larger size up
	// to MaxSensors, which a search finding nothing would all simulate.
	// UntriedAtLeast says the count stopped at maxCountNodes nodes.
	Untried        int
	UntriedAtLeast bool
	// StoppedSize is the subset size the run limit stopped in (0 when
	// Exhausted).
	StoppedSize int
	// Resolution is the lattice's coverage resolution (Resolution(Points)):
	// coverage differences below it are ties.
	Resolution float64
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
	res := Result{Resolution: Resolution(pts)}
	chosen := make([]int, 0, maxS)
	var mask uint64 // chosen as a bit mask
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
			if p.CoverageSensors > 0 && !b.canReach(mask, i, p.MinCoverage) {
				res.Pruned++
				return
			}
			if len(chosen) == size {
				c := b.coverage(mask)
				if p.CoverageSensors == 0 || c >= p.MinCoverage {
					out = append(out, Choice{Subset: append([]int(nil), chosen...), Coverage: c})
				}
				return
			}
			chosen = append(chosen, i)
			mask |= 1 << i
			walk(i + 1)
			mask &^= 1 << i
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
	// Once Top feasible subsets are found, the subsets after them whose
	// coverage is within the resolution of the last one found tie with it
	// in the order of work, so they are scored too before the ranking.
	full, cut := false, 0.0
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
				if full && list[k].Coverage <= cut-res.Resolution {
					break sizes
				}
				if p.MaxEvaluations > 0 && res.Evaluated >= p.MaxEvaluations {
					res.Exhausted = false
					res.StoppedSize = size
					res.Untried = len(list) - k
					if len(res.Alternatives) == 0 {
						n, capped := countPassing(b, p, size+1, maxS)
						res.Untried += n
						res.UntriedAtLeast = capped
					}
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
					// feasible subsets of it in coverage order, and those
					// tied with the last of them on coverage.
					if len(res.Alternatives) == top {
						full, cut = true, list[k].Coverage
					}
				}
			}
		}
		if len(res.Alternatives) > 0 {
			break
		}
	}
	rank(res.Alternatives, res.Resolution)
	if len(res.Alternatives) > top {
		res.Alternatives = res.Alternatives[:top]
	}
	if len(res.Alternatives) > 0 {
		res.Best = &res.Alternatives[0]
	}
	res.Front = front(evaluated, res.Resolution)
	return res, nil
}

// maxCountNodes bounds the nodes countPassing visits.
const maxCountNodes = 1 << 20

// countPassing counts the subsets of sizes from..to that pass the coverage
// bound (the subsets a search finding nothing would simulate), visiting at
// most maxCountNodes nodes; capped reports that it stopped there.
func countPassing(b *bounder, p Problem, from, to int) (count int, capped bool) {
	n := len(p.Viewers)
	nodes := 0
	var walk func(i, size, have int, mask uint64)
	walk = func(i, size, have int, mask uint64) {
		if capped {
			return
		}
		if nodes++; nodes > maxCountNodes {
			capped = true
			return
		}
		if have+(n-i) < size || (p.CoverageSensors > 0 && !b.canReach(mask, i, p.MinCoverage)) {
			return
		}
		if have == size {
			if p.CoverageSensors == 0 || b.coverage(mask) >= p.MinCoverage {
				count++
			}
			return
		}
		walk(i+1, size, have+1, mask|1<<i)
		walk(i+1, size, have, mask)
	}
	for size := from; size <= to && !capped; size++ {
		walk(0, size, 0, 0)
	}
	return count, capped
}

// rank orders the alternatives: fewer sensors, then a larger margin, then
// more coverage — where coverages closer than the resolution tie (a chain of
// such steps is one class: CoverageClass) — then a smaller p95 error (NaN
// last), then more coverage, then the order of work.
func rank(alt []Choice, resolution float64) {
	byCov := make([]int, len(alt))
	for i := range byCov {
		byCov[i] = i
	}
	sort.SliceStable(byCov, func(a, b int) bool { return alt[byCov[a]].Coverage > alt[byCov[b]].Coverage })
	for j, i := range byCov {
		if j > 0 {
			prev := alt[byCov[j-1]]
			alt[i].CoverageClass = prev.CoverageClass
			if prev.Coverage-alt[i].Coverage >= resolution {
				alt[i].CoverageClass++
			}
		}
	}
	p95 := func(c Choice) float64 {
		if math.IsNaN(c.Score.P95Deg) {
			return math.Inf(1)
		}
		return c.Score.P95Deg
	}
	sort.SliceStable(alt, func(a, b int) bool {
		x, y := alt[a], alt[b]
		switch {
		case len(x.Subset) != len(y.Subset):
			return len(x.Subset) < len(y.Subset)
		case x.Score.Margin != y.Score.Margin:
			return x.Score.Margin > y.Score.Margin
		case x.CoverageClass != y.CoverageClass:
			return x.CoverageClass < y.CoverageClass
		case p95(x) != p95(y):
			return p95(x) < p95(y)
		}
		return x.Coverage > y.Coverage
	})
}

// front keeps the evaluated subsets no other beats on every axis: fewer or
// equal sensors, more or equal coverage, less or equal p95 error (NaN p95
// counts as worst), and strictly better on one. Coverages closer than the
// lattice's resolution are equal, as in the ranking: a subset a lattice
// point ahead on coverage but worse on error is not on the front. The
// relation stays acyclic (along a cycle the counts and errors would all be
// equal and each coverage a resolution above the last), so the front is
// never empty.
func front(list []Choice, resolution float64) []Choice {
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
			le := len(o.Subset) <= len(a.Subset) && o.Coverage >= a.Coverage-resolution && p95(o) <= p95(a)
			lt := len(o.Subset) < len(a.Subset) || o.Coverage >= a.Coverage+resolution || p95(o) < p95(a)
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

// bounder judges coverage on the lattice through the visibility signature
// of each point: the set of candidates that see it, as a bit mask. Points of
// one signature are seen by the same sensors of every subset, so the bound
// and the coverage are counted over the distinct signatures, each weighted
// by its points: the same counts as point by point, at a cost set by the
// cells the candidates' fields cut the sky into rather than by the lattice
// size.
type bounder struct {
	k, n    int
	survive bool
	points  int      // lattice points
	sig     []uint64 // distinct signatures, in order of first point
	weight  []int    // points of each signature
	suffix  []uint64 // suffix[i]: the mask of candidates i..n−1
}

func newBounder(v []sky.Viewer, lat sky.Lattice, k int, survive bool) *bounder {
	n := len(v)
	b := &bounder{k: k, n: n, survive: survive, points: len(lat.Dirs)}
	at := map[uint64]int{}
	for _, d := range lat.Dirs {
		var s uint64
		for i, vi := range v {
			if vi.Sees(d) {
				s |= 1 << i
			}
		}
		j, ok := at[s]
		if !ok {
			j = len(b.sig)
			at[s] = j
			b.sig = append(b.sig, s)
			b.weight = append(b.weight, 0)
		}
		b.weight[j]++
	}
	b.suffix = make([]uint64, n+1)
	for i := n - 1; i >= 0; i-- {
		b.suffix[i] = b.suffix[i+1] | 1<<i
	}
	return b
}

// upper is the coverage of chosen plus every candidate from i on.
func (b *bounder) upper(chosen uint64, i int) float64 {
	return b.level(chosen | b.suffix[i])
}

// canReach reports whether upper(chosen, i) ≥ target. Without the
// single-failure case it stops counting as soon as more points are missed
// than the target allows, which settles most pruned branches early.
func (b *bounder) canReach(chosen uint64, i int, target float64) bool {
	if b.survive {
		return b.upper(chosen, i) >= target
	}
	allowed := b.points - int(math.Ceil(target*float64(b.points)-1e-9))
	members := chosen | b.suffix[i]
	miss := 0
	for j, s := range b.sig {
		if bits.OnesCount64(s&members) < b.k {
			miss += b.weight[j]
			if miss > allowed {
				return false
			}
		}
	}
	return true
}

// coverage is the coverage of chosen alone.
func (b *bounder) coverage(chosen uint64) float64 { return b.level(chosen) }

// level returns the ≥ k fraction of the members, or with survive the worst
// of it over the loss of any one member.
func (b *bounder) level(members uint64) float64 {
	at := 0
	for j, s := range b.sig {
		if bits.OnesCount64(s&members) >= b.k {
			at += b.weight[j]
		}
	}
	if !b.survive {
		return float64(at) / float64(b.points)
	}
	if members == 0 {
		return 0
	}
	worst := at
	for m := members; m != 0; m &= m - 1 {
		one := m & -m
		lost := 0
		for j, s := range b.sig {
			if s&one != 0 && bits.OnesCount64(s&members) == b.k {
				lost += b.weight[j]
			}
		}
		worst = min(worst, at-lost)
	}
	return float64(worst) / float64(b.points)
}
