package plots

import (
	"math"
	"math/rand/v2"
	"sort"
	"testing"
)

// Property: on random series, every rolling window's mean lies between its
// min and max, and the windows tile the span in order.
func TestRollingProperties(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for trial := range 200 {
		n := 2 + rng.IntN(2000)
		ts, y := make([]float64, n), make([]float64, n)
		use := make([]bool, n)
		for i := range ts {
			ts[i] = float64(i)*(1+rng.Float64()) + 0.5
			if i > 0 && ts[i] <= ts[i-1] {
				ts[i] = ts[i-1] + 1
			}
			y[i] = rng.NormFloat64() * 10
			use[i] = rng.Float64() < 0.8
		}
		w := 1 + rng.IntN(300)
		tc, lo, mean, hi := rolling(ts, y, use, w)
		if len(tc) != w || len(lo) != w || len(mean) != w || len(hi) != w {
			t.Fatalf("trial %d: %d windows, want %d", trial, len(tc), w)
		}
		for i := range tc {
			if i > 0 && !(tc[i] > tc[i-1]) {
				t.Fatalf("trial %d: window centres not increasing at %d", trial, i)
			}
			if math.IsNaN(mean[i]) {
				continue
			}
			if !(lo[i] <= mean[i]+1e-9 && mean[i] <= hi[i]+1e-9) {
				t.Fatalf("trial %d window %d: mean %g outside [%g, %g]", trial, i, mean[i], lo[i], hi[i])
			}
		}
	}
}

// Property: for random steps and gap lists of whole steps, every gap falls
// in a bin, bins are whole multiples of the step wide, and bin edges sit
// half a step off the possible durations (so no bin is empty by
// construction when a bin holds one step).
func TestGapBinsProperties(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 14))
	for trial := range 300 {
		step := []float64{1, 5, 10, 20, 60}[rng.IntN(5)]
		longest := step * float64(1+rng.IntN(500))
		e := gapBins(longest, step)
		w := e[1] - e[0]
		if math.Abs(w/step-math.Round(w/step)) > 1e-9 || w < step {
			t.Fatalf("trial %d: bin width %g not a whole multiple of the step %g", trial, w, step)
		}
		if len(e)-1 > 31 {
			t.Fatalf("trial %d: %d bins", trial, len(e)-1)
		}
		for k := 1; k <= int(longest/step); k++ {
			d := float64(k) * step
			i := sort.SearchFloat64s(e, d) - 1
			if i < 0 || i >= len(e)-1 || !(e[i] < d && d < e[i+1]) {
				t.Fatalf("trial %d: gap %g s not strictly inside a bin (edges %v…)", trial, d, e[:min(4, len(e))])
			}
		}
	}
}
