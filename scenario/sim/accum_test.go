package sim

import (
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"testing"

	"gonum.org/v1/gonum/stat"
)

// The streaming accumulators are checked against gonum's whole-slice
// statistics (a general-purpose reference library).
func TestMomentsMatchGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	xs := make([]float64, 10001)
	var a, b Moments
	for i := range xs {
		xs[i] = rng.NormFloat64()*3 + 7
		if i%2 == 0 {
			a.Add(xs[i])
		} else {
			b.Add(xs[i])
		}
	}
	a.Merge(&b)
	mean, sd := stat.MeanStdDev(xs, nil)
	if math.Abs(a.Mean()-mean) > 1e-12 || math.Abs(a.StdDev()-sd) > 1e-10 {
		t.Fatalf("mean/sd %v %v, gonum %v %v", a.Mean(), a.StdDev(), mean, sd)
	}
	var ss float64
	for _, x := range xs {
		ss += x * x
	}
	if rms := math.Sqrt(ss / float64(len(xs))); math.Abs(a.RMS()-rms) > 1e-12 {
		t.Fatalf("rms %v, want %v", a.RMS(), rms)
	}
	sort.Float64s(xs)
	if a.Min != xs[0] || a.Max != xs[len(xs)-1] {
		t.Fatalf("min/max %v %v", a.Min, a.Max)
	}
}

func TestQuantilesMatchGonumEmpirical(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	xs := make([]float64, 50000)
	q := NewQuantiles()
	for i := range xs {
		xs[i] = math.Exp(rng.NormFloat64()) // log-normal, degrees
		q.Add(xs[i])
	}
	sort.Float64s(xs)
	for _, p := range []float64{0.01, 0.5, 0.95, 0.99, 0.999} {
		want := stat.Quantile(p, stat.Empirical, xs, nil)
		got := q.Quantile(p)
		if rel := math.Abs(got-want) / want; rel > 7e-4 { // bin half-width 0.068 %
			t.Errorf("p%v: %v, gonum %v (rel %v)", p, got, want, rel)
		}
	}
	if q.Quantile(1) != xs[len(xs)-1] {
		t.Errorf("max %v", q.Quantile(1))
	}
}

func TestSpellsDurations(t *testing.T) {
	// on at 10,20,30 (run 10..40 = 30 s), off, on at 60 (run 60..70), on at 90 to end 110.
	on := map[float64]bool{10: true, 20: true, 30: true, 60: true, 90: true, 100: true}
	whole := NewSpells(0, 10, true)
	for t := 0.0; t < 110; t += 10 {
		whole.Observe(t, on[t])
	}
	whole.End(110)
	whole.Finish()
	whole.Finish() // a second call changes nothing
	want := []float64{30, 10, 20}
	if len(whole.Durations) != 3 || whole.N != 3 {
		t.Fatalf("durations %v, N %d", whole.Durations, whole.N)
	}
	for i := range want {
		if whole.Durations[i] != want[i] {
			t.Fatalf("durations %v, want %v", whole.Durations, want)
		}
	}
	if whole.Longest != 30 || whole.LongestAt != 10 {
		t.Fatalf("longest %v at %v", whole.Longest, whole.LongestAt)
	}
	if fmt.Sprint(whole.Lengths) != "[{1 1} {2 1} {3 1}]" {
		t.Fatalf("lengths %v", whole.Lengths)
	}
	// The same grid cut into pieces at every possible place merges to the
	// same runs, with and without a list.
	for _, list := range []bool{true, false} {
		for cut := 10.0; cut < 110; cut += 10 {
			a, b := NewSpells(0, 10, list), NewSpells(cut, 10, list)
			for t := 0.0; t < 110; t += 10 {
				if t < cut {
					a.Observe(t, on[t])
				} else {
					b.Observe(t, on[t])
				}
			}
			a.End(cut)
			b.End(110)
			a.Merge(b)
			a.Finish()
			if list && (len(a.Durations) != 3 || a.Durations[0] != 30 || a.Durations[1] != 10 || a.Durations[2] != 20) {
				t.Errorf("cut at %v: durations %v", cut, a.Durations)
			}
			if !list && a.Durations != nil {
				t.Errorf("cut at %v: durations %v kept without a list", cut, a.Durations)
			}
			if a.N != 3 || a.Longest != 30 || a.LongestAt != 10 || fmt.Sprint(a.Lengths) != "[{1 1} {2 1} {3 1}]" {
				t.Errorf("cut at %v, list %v: N %d, longest %v at %v, lengths %v", cut, list, a.N, a.Longest, a.LongestAt, a.Lengths)
			}
		}
	}
}

// A tracker without a list, fed in random pieces and merged, gives the
// number of runs, the longest (the earliest of equal longest ones) and the
// histogram of lengths a plain pass over the samples counts; it keeps at
// most two runs between merges, however many it has seen.
func TestSpellsWithoutListAreFlat(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for trial := range 200 {
		n := 1 + rng.IntN(3000)
		p := rng.Float64()
		on := make([]bool, n)
		for k := range on {
			on[k] = rng.Float64() < p
		}
		// The plain count.
		want := map[int]int{}
		wantN, longest, at := 0, 0, 0
		for k := 0; k < n; {
			if !on[k] {
				k++
				continue
			}
			k0 := k
			for k < n && on[k] {
				k++
			}
			want[k-k0]++
			wantN++
			if k-k0 > longest {
				longest, at = k-k0, k0
			}
		}
		const step = 10.0
		var whole *Spells
		for k0 := 0; k0 < n; {
			k1 := min(n, k0+1+rng.IntN(400))
			s := NewSpells(float64(k0)*step, step, false)
			for k := k0; k < k1; k++ {
				s.Observe(float64(k)*step, on[k])
			}
			s.End(float64(k1) * step)
			if len(s.runs) > 2 {
				t.Fatalf("trial %d: %d runs kept in a piece", trial, len(s.runs))
			}
			if whole == nil {
				whole = s
			} else {
				whole.Merge(s)
			}
			if len(whole.runs) > 2 {
				t.Fatalf("trial %d: %d runs kept after a merge: %v", trial, len(whole.runs), whole.runs)
			}
			k0 = k1
		}
		whole.Finish()
		got := map[int]int{}
		for _, l := range whole.Lengths {
			got[l.Steps] = l.Count
		}
		if whole.N != wantN || fmt.Sprint(got) != fmt.Sprint(want) {
			t.Fatalf("trial %d: N %d lengths %v, want %d %v", trial, whole.N, got, wantN, want)
		}
		if wantN > 0 && (whole.Longest != float64(longest)*step || whole.LongestAt != float64(at)*step) {
			t.Fatalf("trial %d: longest %v at %v, want %v at %v", trial, whole.Longest, whole.LongestAt, float64(longest)*step, float64(at)*step)
		}
	}
}

// Quantiles built piece by piece and merged (with the merged pieces'
// bins recycled into the next pieces) equal those of the whole stream.
func TestQuantilesMergedPiecesEqualWhole(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	whole, merged := NewQuantiles(), NewQuantiles()
	for piece := range 20 {
		q := NewQuantiles()
		for range 1000 * (piece%3 + 1) {
			x := math.Exp(4 * rng.NormFloat64())
			whole.Add(x)
			q.Add(x)
		}
		merged.Merge(q)
		q.release()
	}
	merged.Merge(NewQuantiles()) // an empty piece changes nothing
	if merged.N() != whole.N() {
		t.Fatalf("n %d, want %d", merged.N(), whole.N())
	}
	for _, p := range []float64{0, 0.001, 0.1, 0.5, 0.9, 0.99, 0.9999, 1} {
		if a, b := merged.Quantile(p), whole.Quantile(p); a != b {
			t.Errorf("p%v: merged %v, whole %v", p, a, b)
		}
	}
}

// A narrow spread far from zero (45° ± 0.01°), a million values in pieces
// merged in order as the engine merges its chunks: mean and standard
// deviation still match gonum (relative 1e-9 on the deviation; the shifted
// sums lose nothing to cancellation here).
func TestMomentsNarrowSpreadPieces(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 9))
	xs := make([]float64, 1_000_000)
	var whole Moments
	piece := Moments{}
	for i := range xs {
		xs[i] = 45 + 0.01*rng.NormFloat64()
		piece.Add(xs[i])
		if i%32768 == 32767 || i == len(xs)-1 {
			whole.Merge(&piece)
			piece = Moments{}
		}
	}
	mean, sd := stat.MeanStdDev(xs, nil)
	if math.Abs(whole.Mean()-mean) > 1e-12*mean || math.Abs(whole.StdDev()-sd) > 1e-9*sd {
		t.Fatalf("mean %.15g sd %.15g, gonum %.15g %.15g", whole.Mean(), whole.StdDev(), mean, sd)
	}
}
