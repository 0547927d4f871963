package sim

import (
	"math"
	"slices"
	"sync"
)

// Moments accumulates count, mean, variance, RMS, minimum and maximum of a
// stream without storing it. It keeps the sums of x − K and (x − K)² about
// a shift K, the first value (the shifted-data algorithm: Chan, Golub &
// LeVeque 1983, Am. Stat. 37(3):242–247, from memory): no division per
// value, and no cancellation as long as the spread of the values is not far
// below their distance from K (angle errors in degrees: relative error of
// the variance ~1e-12 measured against gonum, TestMomentsMatchGonum).
type Moments struct {
	N        int
	k        float64 // shift: the first value
	s1, s2   float64 // Σ(x − k), Σ(x − k)²
	sumSq    float64
	Min, Max float64
}

// Add folds x into the moments.
func (m *Moments) Add(x float64) {
	if m.N == 0 {
		m.k, m.Min, m.Max = x, x, x
	} else if x < m.Min {
		m.Min = x
	} else if x > m.Max {
		m.Max = x
	}
	m.N++
	d := x - m.k
	m.s1 += d
	m.s2 += d * d
	m.sumSq += x * x
}

// Mean returns the mean, NaN when empty.
func (m *Moments) Mean() float64 {
	if m.N == 0 {
		return math.NaN()
	}
	return m.k + m.s1/float64(m.N)
}

// StdDev returns the sample standard deviation, NaN with fewer than two values.
func (m *Moments) StdDev() float64 {
	if m.N < 2 {
		return math.NaN()
	}
	n := float64(m.N)
	return math.Sqrt(max(0, m.s2-m.s1*m.s1/n) / (n - 1))
}

// RMS returns the root mean square, NaN when empty.
func (m *Moments) RMS() float64 {
	if m.N == 0 {
		return math.NaN()
	}
	return math.Sqrt(m.sumSq / float64(m.N))
}

// Merge folds another accumulator into m: o's sums are moved to m's shift,
// Σ(x − k₁) = Σ(x − k₂) + n₂δ and Σ(x − k₁)² = Σ(x − k₂)² + 2δΣ(x − k₂) + n₂δ²
// with δ = k₂ − k₁ (closed form).
func (m *Moments) Merge(o *Moments) {
	if o.N == 0 {
		return
	}
	if m.N == 0 {
		*m = *o
		return
	}
	δ := o.k - m.k
	n2 := float64(o.N)
	m.s2 += o.s2 + 2*δ*o.s1 + n2*δ*δ
	m.s1 += o.s1 + n2*δ
	m.sumSq += o.sumSq
	m.N += o.N
	m.Min = min(m.Min, o.Min)
	m.Max = max(m.Max, o.Max)
}

// Quantile histogram: bins are read off the bits of the float64 itself
// (exponent and the top quantMantBits bits of the mantissa), so each octave
// holds 2^quantMantBits log-spaced bins and a value is binned without a
// logarithm. With 9 bits the bins grow by 2^(1/512) ≈ 1.00135, so a quantile
// is resolved to ±0.07 % of its value (common practice, no source: a
// streaming quantile by fine binning instead of storing the samples).
// Values from quantMin up to about 2e9 (angles in degrees, durations in
// seconds) are resolved; smaller ones count as 0.
const (
	quantMin      = 1e-7
	quantMant     = 9
	quantShift    = 52 - quantMant
	quantMaxValue = 2e9
)

var (
	quantBase = math.Float64bits(quantMin) >> quantShift
	quantBins = int(math.Float64bits(quantMaxValue)>>quantShift-quantBase) + 2
)

// Quantiles estimates quantiles of a non-negative stream with a fixed
// histogram (see quantMant): memory is constant (about 220 kB once the
// first value arrives, nothing before), and merging costs only the range of
// bins in use.
type Quantiles struct {
	counts []uint64 // nil until the first value
	lo, hi int      // bins in use: [lo, hi]
	n      uint64
	max    float64
}

// NewQuantiles returns an empty accumulator.
func NewQuantiles() *Quantiles {
	return &Quantiles{}
}

func binOf(x float64) int {
	if !(x >= quantMin) {
		return 0
	}
	i := int(math.Float64bits(x)>>quantShift-quantBase) + 1
	return min(i, quantBins-1)
}

// binCentre is the geometric centre of bin i.
func binCentre(i int) float64 {
	if i == 0 {
		return 0
	}
	lo := math.Float64frombits((uint64(i-1) + quantBase) << quantShift)
	hi := math.Float64frombits((uint64(i) + quantBase) << quantShift)
	return math.Sqrt(lo * hi)
}

// Add records x.
func (q *Quantiles) Add(x float64) {
	i := binOf(x)
	if q.counts == nil {
		q.counts = getBins()
		q.lo, q.hi = i, i
	} else if i < q.lo {
		q.lo = i
	} else if i > q.hi {
		q.hi = i
	}
	q.counts[i]++
	q.n++
	if x > q.max {
		q.max = x
	}
}

// N returns the number of values recorded.
func (q *Quantiles) N() uint64 { return q.n }

// Quantile returns the p-quantile (0 ≤ p ≤ 1) by the empirical rule (the
// smallest value with at least p·N values at or below it), NaN when empty.
func (q *Quantiles) Quantile(p float64) float64 {
	if q.n == 0 {
		return math.NaN()
	}
	if p >= 1 {
		return q.max
	}
	rank := uint64(math.Ceil(p * float64(q.n)))
	if rank < 1 {
		rank = 1
	}
	var cum uint64
	for i := q.lo; i <= q.hi; i++ {
		cum += q.counts[i]
		if cum >= rank {
			return min(binCentre(i), q.max)
		}
	}
	return q.max
}

// Merge adds another accumulator's counts.
func (q *Quantiles) Merge(o *Quantiles) {
	if o.n == 0 {
		return
	}
	if q.counts == nil {
		q.counts = getBins()
		q.lo, q.hi = o.lo, o.hi
	}
	for i := o.lo; i <= o.hi; i++ {
		q.counts[i] += o.counts[i]
	}
	q.lo, q.hi = min(q.lo, o.lo), max(q.hi, o.hi)
	q.n += o.n
	q.max = max(q.max, o.max)
}

// binPool recycles the bin arrays of accumulators already merged into
// another, so a long run does not allocate a fresh 220 kB per piece of grid.
var binPool sync.Pool

// getBins returns a zeroed bin array.
func getBins() []uint64 {
	if b, ok := binPool.Get().(*[]uint64); ok {
		return *b
	}
	return make([]uint64, quantBins)
}

// release empties q and recycles its bins; q must not be read afterwards.
func (q *Quantiles) release() {
	if q.counts == nil {
		return
	}
	clear(q.counts[q.lo : q.hi+1])
	b := q.counts
	binPool.Put(&b)
	*q = Quantiles{}
}

// CDF returns up to n points (value, fraction at or below) of the empirical
// distribution, for plotting.
func (q *Quantiles) CDF(n int) (x, f []float64) {
	if q.n == 0 || n < 2 {
		return nil, nil
	}
	for k := 1; k <= n; k++ {
		p := float64(k) / float64(n)
		x = append(x, q.Quantile(p))
		f = append(f, p)
	}
	return x, f
}

// Spells tracks runs of consecutive "on" samples on a uniform grid (for
// example sunlit time without a valid sun vector). It always keeps their
// number, the longest and the histogram of their lengths in whole steps;
// with a list (NewSpells' list) it also keeps every run's start and
// duration. Without a list the memory is bounded by the number of distinct
// run lengths (at most √(2N) on N samples, a few dozen in practice), not by
// the number of runs. Trackers of consecutive pieces of a grid merge into
// the tracker of the whole.
type Spells struct {
	t0, step float64 // start of the piece of grid observed, its spacing
	list     bool
	running  bool
	start    float64
	// runs: every run with a list; without, only the runs that may still
	// join a neighbouring piece (one starting at t0, one open at the end).
	runs []spell
	// The folded runs (all of them with a list, at Finish).
	n         int
	longest   float64
	longestAt float64
	lengths   map[int]int // run length in steps → number of runs
	// Filled by Finish:
	N         int       // the number of runs
	Durations []float64 // each run's duration (s), with a list only
	Starts    []float64 // start of each run (s), beside Durations
	Longest   float64
	LongestAt float64
	// Lengths is the histogram of run lengths, by increasing length.
	Lengths []RunLength
}

// RunLength is a bin of the histogram of run lengths: Count runs of Steps
// steps each.
type RunLength struct {
	Steps, Count int
}

type spell struct {
	start, end float64
	open       bool // still running at the end of the piece
}

// NewSpells starts a tracker for a piece of a grid of spacing step (s)
// beginning at t0 (s); list keeps every run's start and duration.
func NewSpells(t0, step float64, list bool) *Spells {
	return &Spells{t0: t0, step: step, list: list}
}

// Observe records the state at time t (s). A run lasts from its first on
// sample to the first off sample after it, so a single on sample counts one
// step.
func (s *Spells) Observe(t float64, on bool) {
	switch {
	case on && !s.running:
		s.running, s.start = true, t
	case !on && s.running:
		s.running = false
		r := spell{start: s.start, end: t}
		if s.list || r.start == s.t0 {
			s.runs = append(s.runs, r)
		} else {
			s.fold(r)
		}
	}
}

// fold counts a closed run into the summary.
func (s *Spells) fold(r spell) {
	d := r.end - r.start
	s.count(d, r.start, int(math.Round(d/s.step)), 1)
}

// count adds n runs of the given length (steps) to the summary, the longest
// of them d seconds long from at. Ties of the longest go to the earliest
// run, whatever the order of counting.
func (s *Spells) count(d, at float64, steps, n int) {
	if s.n == 0 || d > s.longest || d == s.longest && at < s.longestAt {
		s.longest, s.longestAt = d, at
	}
	s.n += n
	if s.lengths == nil {
		s.lengths = make(map[int]int)
	}
	s.lengths[steps] += n
}

// End closes the piece at tEnd (exclusive): a run still going is kept open,
// to be joined with a run that starts the next piece.
func (s *Spells) End(tEnd float64) {
	if s.running {
		s.runs = append(s.runs, spell{start: s.start, end: tEnd, open: true})
		s.running = false
	}
}

// Merge appends the tracker of the next piece of grid.
func (s *Spells) Merge(next *Spells) {
	rs := next.runs
	if k := len(s.runs) - 1; k >= 0 && s.runs[k].open {
		if len(rs) > 0 && rs[0].start == next.t0 && s.runs[k].end == next.t0 {
			s.runs[k].end, s.runs[k].open = rs[0].end, rs[0].open
			rs = rs[1:]
		} else {
			s.runs[k].open = false // it ended where next begins
		}
	}
	s.runs = append(s.runs, rs...)
	for l, c := range next.lengths {
		s.count(next.longest, next.longestAt, l, c)
	}
	if s.list {
		return
	}
	kept := s.runs[:0]
	for _, r := range s.runs {
		if r.open || r.start == s.t0 {
			kept = append(kept, r)
		} else {
			s.fold(r)
		}
	}
	s.runs = kept
}

// Finish computes the number of runs, the longest, the histogram of lengths
// and, with a list, the durations, after the last Merge. It folds the kept
// runs into the summary, so a second call changes nothing.
func (s *Spells) Finish() {
	for _, r := range s.runs {
		if s.list {
			s.Durations = append(s.Durations, r.end-r.start)
			s.Starts = append(s.Starts, r.start)
		}
		s.fold(r)
	}
	s.runs = s.runs[:0]
	s.N, s.Longest, s.LongestAt = s.n, s.longest, s.longestAt
	if s.n == 0 {
		s.Longest, s.LongestAt = 0, 0
	}
	s.Lengths = nil
	for l, c := range s.lengths {
		s.Lengths = append(s.Lengths, RunLength{Steps: l, Count: c})
	}
	slices.SortFunc(s.Lengths, func(a, b RunLength) int { return a.Steps - b.Steps })
}
