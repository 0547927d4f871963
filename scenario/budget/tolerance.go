package budget

import (
	"context"
	"errors"
	"fmt"
	"math"
)

// Figure picks the number a target is compared with, e.g. Metric.P95Deg.
type Figure func(Metric) float64

// Tolerance is the largest scale of one source's stated 1σ that still meets
// the target with every other source at its stated value.
type Tolerance struct {
	Source Source
	// Scale multiplies the source's stated σ (or its reference σ when none
	// is stated); Unbounded is set when even MaxScale meets the target,
	// Infeasible when the target is missed with the source switched off.
	Scale                 float64
	Unbounded, Infeasible bool
	// AtScaleDeg and At110Deg are the figures re-run at Scale and 1.1×Scale;
	// Meets and FailsAbove report the two checks.
	AtScaleDeg, At110Deg float64
	Meets, FailsAbove    bool
	Runs                 int
}

// MaxScale bounds the search (1024 × the stated σ).
const MaxScale = 1024

// relTol ends the bisection when the bracket is narrower than 1 % of its
// upper end, well inside the 10 % of the 1.1 × σ check.
const relTol = 0.01

// FindTolerance bisects on the scale of src in base (other sources as base
// has them). The runs use common random numbers, so the figure is a smooth,
// almost monotone function of the scale and bisection converges.
func FindTolerance(ctx context.Context, run RunFunc, base Case, src Source, target float64, fig Figure) (Tolerance, error) {
	t := Tolerance{Source: src}
	if !src.Scalable() {
		return t, fmt.Errorf("budget: %s has no 1σ to search", src)
	}
	if !(target > 0) {
		return t, fmt.Errorf("budget: tolerance target %g deg: want a value > 0", target)
	}
	at := func(k float64) (float64, error) {
		c := base
		c.Scale[src] = k
		t.Runs++
		m, err := run(ctx, c)
		if k > 0 && errors.Is(err, ErrNoValid) {
			// A source so large that a unit never gives a valid sun
			// vector (a quadrant twisted or offset out of its linear
			// range) misses any target.
			return math.Inf(1), nil
		}
		if err != nil {
			return 0, fmt.Errorf("budget: %s at %g × σ: %w", src, k, err)
		}
		return fig(m), nil
	}
	f0, err := at(0)
	if err != nil {
		return t, err
	}
	if f0 > target {
		t.Infeasible = true
		t.AtScaleDeg = f0
		return t, nil
	}
	lo, hi := 0.0, 1.0
	for {
		f, err := at(hi)
		if err != nil {
			return t, err
		}
		if f > target {
			break
		}
		lo = hi
		if hi >= MaxScale {
			t.Unbounded, t.Scale, t.AtScaleDeg, t.Meets = true, hi, f, true
			return t, nil
		}
		hi *= 2
	}
	for hi-lo > relTol*hi {
		mid := (lo + hi) / 2
		f, err := at(mid)
		if err != nil {
			return t, err
		}
		if f <= target {
			lo = mid
		} else {
			hi = mid
		}
	}
	t.Scale = lo
	if t.AtScaleDeg, err = at(lo); err != nil {
		return t, err
	}
	if t.At110Deg, err = at(1.1 * lo); err != nil {
		return t, err
	}
	t.Meets, t.FailsAbove = t.AtScaleDeg <= target, t.At110Deg > target
	return t, nil
}

// Curve is a sensitivity curve: the figure against the scale of one source.
type Curve struct {
	Source Source
	Scale  []float64
	P95Deg []float64
}

// Sensitivity runs base with src at each scale.
func Sensitivity(ctx context.Context, run RunFunc, base Case, src Source, scales []float64, fig Figure) (Curve, error) {
	c := Curve{Source: src, Scale: append([]float64(nil), scales...)}
	for _, k := range scales {
		cs := base
		cs.Scale[src] = k
		m, err := run(ctx, cs)
		if err != nil {
			return c, fmt.Errorf("budget: sensitivity of %s at %g × σ: %w", src, k, err)
		}
		c.P95Deg = append(c.P95Deg, fig(m))
	}
	return c, nil
}
