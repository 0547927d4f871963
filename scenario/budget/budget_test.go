package budget

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"codeberg.org/sunsight/sunsight/illum/sensor"
)

// fakeRun is a closed-form budget: source s alone gives a unit error
// a[s]·k·w[u] and the sources add in root-sum-square, so the RSS of the
// terms equals the all-together figure exactly (closed form).
func fakeRun(a [NumSources]float64, w []float64) RunFunc {
	return func(_ context.Context, c Case) (Metric, error) {
		ss := 0.0
		for s, v := range a {
			x := v * c.Scale[s]
			ss += x * x
		}
		var m Metric
		for _, wu := range w {
			m.UnitP95Deg = append(m.UnitP95Deg, math.Sqrt(ss)*wu)
			m.UnitRMSDeg = append(m.UnitRMSDeg, 0.5*math.Sqrt(ss)*wu)
		}
		return m, nil
	}
}

// Ten units: the bootstrap interval is given from MinIntervalUnits on.
var fakeWeights = []float64{0.9, 1.1, 1.0, 0.95, 1.05, 1.2, 0.8, 1.0, 0.85, 1.15}

func TestDecomposeClosedForm(t *testing.T) {
	a := [NumSources]float64{Noise: 0.3, Misalignment: 0.4, Albedo: 1.2}
	r, err := Decompose(context.Background(), fakeRun(a, fakeWeights), []Source{Noise, Misalignment, Albedo})
	if err != nil {
		t.Fatal(err)
	}
	// Ranked: albedo, misalignment, noise.
	if r.Terms[0].Source != Albedo || r.Terms[1].Source != Misalignment || r.Terms[2].Source != Noise {
		t.Errorf("ranking %v", r.Terms)
	}
	want := math.Sqrt(0.09+0.16+1.44) * mean(fakeWeights) // closed form
	if math.Abs(r.All.P95Deg-want) > 1e-12 || math.Abs(r.RSSP95Deg-want) > 1e-12 {
		t.Errorf("all %g, rss %g, want %g", r.All.P95Deg, r.RSSP95Deg, want)
	}
	if math.Abs(r.NonAdditiveP95Deg) > 1e-12 || r.NonAdditiveCI.Lo > 1e-12 || r.NonAdditiveCI.Hi < -1e-12 {
		t.Errorf("non-additive %g CI %+v, want 0", r.NonAdditiveP95Deg, r.NonAdditiveCI)
	}
}

func TestFindToleranceClosedForm(t *testing.T) {
	// f(k) = sqrt(0.3² + (0.4k)² + 1.2²)·w̄ ≤ T gives k* = sqrt((T/w̄)² − 1.53)/0.4 (closed form).
	a := [NumSources]float64{Noise: 0.3, Misalignment: 0.4, Albedo: 1.2}
	run := fakeRun(a, fakeWeights)
	const target = 2.0
	tol, err := FindTolerance(context.Background(), run, All(), Misalignment, target, Metric.P95Deg)
	if err != nil {
		t.Fatal(err)
	}
	w := mean(fakeWeights)
	want := math.Sqrt(target*target/(w*w)-1.53) / 0.4
	if !tol.Meets || !tol.FailsAbove {
		t.Errorf("meets %v, fails at 1.1× %v", tol.Meets, tol.FailsAbove)
	}
	if tol.Scale > want || tol.Scale < want*(1-relTol) {
		t.Errorf("scale %g, want within 1 %% below %g", tol.Scale, want)
	}
	// Albedo alone already misses a 1° target: infeasible.
	tol, err = FindTolerance(context.Background(), run, All(), Misalignment, 1.0, Metric.P95Deg)
	if err != nil || !tol.Infeasible {
		t.Errorf("want infeasible, got %+v, %v", tol, err)
	}
	if _, err := FindTolerance(context.Background(), run, All(), Albedo, 1.0, Metric.P95Deg); err == nil {
		t.Error("albedo has no σ: want an error")
	}
}

// Every error source a registered sensor kind offers is a row the budget
// knows.
func TestBudgetKnowsEverySourceOfEveryKind(t *testing.T) {
	for _, name := range sensor.KindNames() {
		k, _ := sensor.LookupKind(name)
		for _, es := range k.Sources {
			if _, ok := sourceNamed(es.Name); !ok {
				t.Errorf("kind %s offers source %q, unknown to the budget", name, es.Name)
			}
			if p, ok := k.Param(es.Param); es.Param != "" && (!ok || p.Type != sensor.Number) {
				t.Errorf("kind %s: source %q lives in %q, not a number key of the kind", name, es.Name, es.Param)
			}
		}
	}
}

// A source scaled so far that a unit never gives a valid sun vector (a
// quadrant sensor twisted out of its linear range) counts as a missed
// target in the tolerance search, not as a failed budget: closed form
// p95 = 0.4·k with no valid vector beyond k = 3, target 1 → k = 2.5.
func TestToleranceTreatsNoValidAsMissed(t *testing.T) {
	run := func(_ context.Context, c Case) (Metric, error) {
		k := c.Scale[Twist]
		if k > 3 {
			return Metric{}, fmt.Errorf("unit 1: %w", ErrNoValid)
		}
		return Metric{UnitP95Deg: []float64{0.4 * k}, UnitRMSDeg: []float64{0.2 * k}}, nil
	}
	tol, err := FindTolerance(context.Background(), run, Case{}, Twist, 1, Metric.P95Deg)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(tol.Scale-2.5) > 0.03 || !tol.Meets {
		t.Errorf("tolerance %+v, want scale 2.5", tol)
	}
	if Twist.String() != "twist" || !Twist.Scalable() {
		t.Errorf("twist source %q scalable %v", Twist, Twist.Scalable())
	}
}

// Below MinIntervalUnits the budget gives no bootstrap interval (NaN), from
// it on it does.
func TestIntervalNeedsEnoughUnits(t *testing.T) {
	a := [NumSources]float64{Noise: 0.3, Albedo: 1.2}
	for _, n := range []int{2, MinIntervalUnits - 1, MinIntervalUnits} {
		r, err := Decompose(context.Background(), fakeRun(a, fakeWeights[:n]), []Source{Noise, Albedo})
		if err != nil {
			t.Fatal(err)
		}
		shown := !math.IsNaN(r.NonAdditiveCI.Lo) && !math.IsNaN(r.NonAdditiveRMSCI.Hi)
		if shown != (n >= MinIntervalUnits) || shown != r.IntervalShown() {
			t.Errorf("%d units: interval %+v, RMS %+v", n, r.NonAdditiveCI, r.NonAdditiveRMSCI)
		}
	}
}

// Why MinIntervalUnits: the percentile interval of a mean over n normal
// units covers about P(|t(n−1)| < 1.96·√((n−1)/n)) of the true mean (closed
// form of the plug-in variance and the normal quantile: 0.602 at n = 2,
// 0.904 at n = 10, scipy.stats t.cdf), and at n = 2 the three distinct
// resamples make it [min, max] of the two units, which holds the mean half
// the time (closed form). Checked on the budget's own bootstrap with every
// source alone at zero, so that all − RSS is the mean of the all-together
// units.
func TestBootstrapCoverageByUnits(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	const trials = 400
	for _, c := range []struct {
		n        int
		lo, hi   float64
		expected string
	}{{2, 0.40, 0.60, "0.5"}, {MinIntervalUnits, 0.85, 0.95, "0.904"}} {
		hit := 0
		for range trials {
			all := Metric{}
			for range c.n {
				x := 1 + rng.NormFloat64()
				all.UnitP95Deg = append(all.UnitP95Deg, x)
				all.UnitRMSDeg = append(all.UnitRMSDeg, x)
			}
			zero := Metric{UnitP95Deg: make([]float64, c.n), UnitRMSDeg: make([]float64, c.n)}
			iv := bootstrapNonAdditive([]Metric{zero}, all, false, rng.Uint64())
			if iv.Lo <= 1 && 1 <= iv.Hi {
				hit++
			}
		}
		got := float64(hit) / trials
		if got < c.lo || got > c.hi {
			t.Errorf("%d units: the 95 %% interval covers %.3f of trials, closed form about %s", c.n, got, c.expected)
		}
		t.Logf("%d units: covers %.3f (closed form about %s)", c.n, got, c.expected)
	}
}
