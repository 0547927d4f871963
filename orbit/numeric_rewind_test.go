package orbit

import (
	"math/rand/v2"
	"sort"
	"testing"
)

// An event search refines a boundary inside the last grid step, so it asks
// for times a little before the latest one. The integrator serves them from
// the dense output of the steps it keeps (closed form: the same polynomial
// evaluated again gives the same bits), without integrating again.
func TestJ2NumericServesRecentPastFromDenseOutput(t *testing.T) {
	sso, _ := SunSyncInclination(RadiusEarthKm+550, 0.001)
	mean := Elements{RadiusEarthKm + 550, 0.001, sso, 100 * deg, 90 * deg, 0}
	forward, err := NewJ2Numeric(mean, NumericOptions{})
	if err != nil {
		t.Fatal(err)
	}
	probe, _ := NewJ2Numeric(mean, NumericOptions{})
	rng := rand.New(rand.NewPCG(1, 2))
	type served struct {
		t float64
		s State
	}
	var back []served
	const grid = 60.0
	for k := 1; k <= 1440; k++ {
		tk := float64(k) * grid
		want := forward.StateAt(tk)
		if got := probe.StateAt(tk); got != want {
			t.Fatalf("t = %g s: forward state differs", tk)
		}
		// Back and forth inside the last two grid steps, as Brent's method
		// and the golden-section search of the eclipse finder do.
		for range 12 {
			tb := tk - 2*grid*rng.Float64()
			if tb < 0 {
				continue
			}
			back = append(back, served{tb, probe.StateAt(tb)})
		}
		if e := probe.Earliest(); e > max(0, tk-2*grid) {
			t.Fatalf("after t = %g s the integrator keeps steps from %g s only; the finder needs %g s", tk, e, tk-2*grid)
		}
	}
	// A fresh integration asked the same times in increasing order.
	sort.Slice(back, func(i, j int) bool { return back[i].t < back[j].t })
	ref, _ := NewJ2Numeric(mean, NumericOptions{})
	for _, b := range back {
		if exp := ref.StateAt(b.t); b.s != exp {
			t.Fatalf("t = %g s: state from the kept steps %v, fresh integration %v", b.t, b.s, exp)
		}
	}
	fa, _ := forward.Steps()
	pa, _ := probe.Steps()
	if pa != fa {
		t.Errorf("the probed integrator took %d steps, the forward one %d: going back restarted it", pa, fa)
	}
}
