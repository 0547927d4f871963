package sensor

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// Estimate is a sun direction estimated from one instant's readings.
type Estimate struct {
	Dir   r3.Vec // unit, body axes; zero when not Valid
	N     int    // sensors used
	Valid bool   // false means no estimate (never a guess)
}

// Estimator turns one instant's readings of an Array into a sun direction.
// Estimators are small values; Estimate allocates nothing.
type Estimator interface {
	Name() string
	Estimate(a *Array, r []Reading) Estimate
}

// LeastSquares solves ŝ ∝ (NᵀN)⁻¹Nᵀm over the cosine sensors whose reading
// is Valid (above threshold). It needs ≥ 3 such sensors whose normals give
// NᵀN a condition number ≤ MaxCondition (0 means 100).
type LeastSquares struct{ MaxCondition float64 }

// Name implements Estimator.
func (LeastSquares) Name() string { return "least-squares" }

// Estimate implements Estimator.
func (e LeastSquares) Estimate(a *Array, r []Reading) Estimate {
	var m sym3
	var b r3.Vec
	n := 0
	for _, i := range a.cosine {
		if !r[i].Valid {
			continue
		}
		nv := a.sensors[i].Mount().Boresight()
		m.addOuter(nv, 1)
		b = r3.Add(b, r3.Scale(r[i].Signal, nv))
		n++
	}
	if n < 3 {
		return Estimate{N: n}
	}
	mc := e.MaxCondition
	if mc == 0 {
		mc = defaultMaxCondition
	}
	inv, ok := m.inverse(mc)
	if !ok {
		return Estimate{N: n}
	}
	return unitEstimate(inv.mulVec(b), n)
}

func unitEstimate(x r3.Vec, n int) Estimate {
	l := vecmath.Norm(x)
	if !(l > 0) || math.IsInf(l, 0) {
		return Estimate{N: n}
	}
	return Estimate{Dir: r3.Scale(1/l, x), N: n, Valid: true}
}

// OppositePairs uses the differences of opposed cosine sensors, d = m₊ − m₋,
// which equal a·s exactly for ideal hemispherical cosine sensors whatever
// the sign of a·s; ŝ ∝ (Σ a aᵀ)⁻¹ Σ a d over the pair axes a (for a ±X, ±Y,
// ±Z cube ŝ ∝ (I₊x − I₋x, I₊y − I₋y, I₊z − I₋z)). Every pair is used, lit or
// not. Valid when the array has ≥ 3 pairs with non-coplanar axes
// (condition ≤ 100), at least one pair member reads above its threshold, and
// the result is non-zero.
type OppositePairs struct{}

// Name implements Estimator.
func (OppositePairs) Name() string { return "opposite-pairs" }

// Estimate implements Estimator.
func (OppositePairs) Estimate(a *Array, r []Reading) Estimate {
	if !a.pairOK {
		return Estimate{}
	}
	var b r3.Vec
	lit := false
	for _, p := range a.pairs {
		b = r3.Add(b, r3.Scale(r[p.plus].Signal-r[p.minus].Signal, p.axis))
		lit = lit || r[p.plus].Valid || r[p.minus].Valid
	}
	n := 2 * len(a.pairs)
	if !lit {
		return Estimate{N: n}
	}
	return unitEstimate(a.pairInv.mulVec(b), n)
}

// TwoAxis averages the directions of the valid two-axis sensors (quadrant,
// digital), weighted by 1/σ² of each sensor's stated accuracy.
type TwoAxis struct{}

// Name implements Estimator.
func (TwoAxis) Name() string { return "two-axis" }

// Estimate implements Estimator.
func (TwoAxis) Estimate(a *Array, r []Reading) Estimate {
	x, n := twoAxisSum(a, r)
	return unitEstimate(x, n)
}

func twoAxisSum(a *Array, r []Reading) (r3.Vec, int) {
	var x r3.Vec
	n := 0
	for _, i := range a.twoAxis {
		if !r[i].Valid {
			continue
		}
		s := a.sensors[i].Sigma()
		if r[i].Sigma > s {
			s = r[i].Sigma
		}
		x = r3.Add(x, r3.Scale(1/(s*s), r[i].Dir))
		n++
	}
	return x, n
}

// Combined is the 1/σ²-weighted mean of every two-axis direction and of the
// cosine least-squares direction, which counts with the stated accuracy
// CoarseSigma (rad; 0 means 5°, a typical uncorrected coarse-sensor error
// in LEO, common practice, no source).
type Combined struct {
	CoarseSigma  float64
	MaxCondition float64
}

// Name implements Estimator.
func (Combined) Name() string { return "combined" }

// Estimate implements Estimator.
func (e Combined) Estimate(a *Array, r []Reading) Estimate {
	x, n := twoAxisSum(a, r)
	if c := (LeastSquares{MaxCondition: e.MaxCondition}).Estimate(a, r); c.Valid {
		s := e.CoarseSigma
		if s == 0 {
			s = 5 * math.Pi / 180
		}
		x = r3.Add(x, r3.Scale(1/(s*s), c.Dir))
		n += c.N
	}
	return unitEstimate(x, n)
}
