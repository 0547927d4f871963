package sensor

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// Estimate is a sun direction estimated from one instant's readings.
type Estimate struct {
	Dir   r3.Vec // unit, body axes; zero when not Valid
	N     int    // sensors used
	Valid bool   // false means no estimate (never a guess)
	// Signal is the sum of the normalised signals of the sensors used
	// (1 = one sensor facing a 1 AU sun).
	Signal float64
	// Residual is the RMS misfit of the estimate to the readings used: for a
	// cosine fit the RMS of m − n·x in normalised signal (x the fitted sun
	// vector, of length ≈ 1 for a full sun); for two-axis directions the RMS
	// chord |d − ŝ| between each direction and the estimate (≈ rad); a fit
	// with no redundancy (three cosines, one direction) has Residual 0.
	Residual float64
}

// Gate is the validity gate every estimate passes before it counts as
// available: an estimate is valid only when the estimator found one, it
// used at least MinSensors sensors (0: the estimator's own minimum), their
// signals sum to at least MinSignal, and its Residual is at most
// MaxResidual (0: no limit). It turns a fit driven by albedo or by a
// sensor that reads wrong (a 120° "valid" estimate) into "no estimate".
type Gate struct {
	MinSensors  int
	MinSignal   float64
	MaxResidual float64
}

// Apply returns e with Valid cleared when it fails the gate.
func (g Gate) Apply(e Estimate) Estimate {
	if e.Valid && (e.N < g.MinSensors || e.Signal < g.MinSignal || (g.MaxResidual > 0 && e.Residual > g.MaxResidual)) {
		e.Valid = false
	}
	return e
}

// MinCosineSignal is the default least total signal of a cosine fit
// (least squares, opposite pairs): half of full sun. A 1 AU sun on the lit
// faces of a box gives |sx| + |sy| + |sz| ≥ 1 (closed form), while albedo
// alone gives a sensor at most ρ·(R/r)² of full sun (0.26 for ρ = 0.3 at
// 500 km; view factor of a sphere to a facing plate, closed form) and
// reaches two or three sensors at once; across the bundled examples real
// fits sum to ≥ 1.1 (1st percentile) and albedo-only fits to ≤ 0.45. The
// value between is our choice (common practice, no source).
const MinCosineSignal = 0.5

// DefaultGate is the validity gate of an estimator when the scenario sets
// none: its own minimum number of sensors (least squares 3, opposite pairs
// 3 pairs = 6 sensors, two-axis and combined 1), the total-signal floor
// MinCosineSignal for the cosine fits and none for two-axis directions
// (each quadrant or digital sensor applies its own detection gate), and no
// residual limit: flight software for coarse sensors commonly gates on
// signal, not on the fit residual (common practice, no source). The
// false-sun share beyond the bound shows what a residual gate would cut.
func DefaultGate(name string) Gate {
	switch name {
	case LeastSquares{}.Name():
		return Gate{MinSensors: 3, MinSignal: MinCosineSignal}
	case OppositePairs{}.Name():
		return Gate{MinSensors: 6, MinSignal: MinCosineSignal}
	}
	return Gate{MinSensors: 1}
}

// Validate checks the gate's values.
func (g Gate) Validate() error {
	if g.MinSensors < 0 || !(g.MinSignal >= 0) || math.IsInf(g.MinSignal, 0) || !(g.MaxResidual >= 0) || math.IsInf(g.MaxResidual, 0) {
		return fmt.Errorf("sensor: validity gate %+v: want min sensors ≥ 0 and finite signal and residual limits ≥ 0", g)
	}
	return nil
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
	sum, sumSq := 0.0, 0.0
	for _, i := range a.cosine {
		if !r[i].Valid {
			continue
		}
		nv := a.sensors[i].Mount().Boresight()
		m.addOuter(nv, 1)
		v := r[i].Signal
		b = r3.Add(b, r3.Scale(v, nv))
		sum += v
		sumSq += v * v
		n++
	}
	if n < 3 {
		return Estimate{N: n, Signal: sum}
	}
	mc := e.MaxCondition
	if mc == 0 {
		mc = defaultMaxCondition
	}
	inv, ok := m.inverse(mc)
	if !ok {
		return Estimate{N: n, Signal: sum}
	}
	x := inv.mulVec(b)
	out := unitEstimate(x, n)
	out.Signal = sum
	// Σ(m − n·x)² = Σm² − 2x·Nᵀm + xᵀNᵀNx = Σm² − x·b at the least-squares
	// solution, where NᵀNx = b (normal equations).
	out.Residual = math.Sqrt(max(sumSq-r3.Dot(x, b), 0) / float64(n))
	return out
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
	sum, sumSq := 0.0, 0.0
	for _, p := range a.pairs {
		d := r[p.plus].Signal - r[p.minus].Signal
		b = r3.Add(b, r3.Scale(d, p.axis))
		lit = lit || r[p.plus].Valid || r[p.minus].Valid
		sum += r[p.plus].Signal + r[p.minus].Signal
		sumSq += d * d
	}
	n := 2 * len(a.pairs)
	if !lit {
		return Estimate{N: n, Signal: sum}
	}
	x := a.pairInv.mulVec(b)
	out := unitEstimate(x, n)
	out.Signal = sum
	// Residual of the pair differences, as for least squares.
	out.Residual = math.Sqrt(max(sumSq-r3.Dot(x, b), 0) / float64(len(a.pairs)))
	return out
}

// TwoAxis averages the directions of the valid two-axis sensors (quadrant,
// digital), weighted by 1/σ² of each sensor's stated accuracy.
type TwoAxis struct{}

// Name implements Estimator.
func (TwoAxis) Name() string { return "two-axis" }

// Estimate implements Estimator.
func (TwoAxis) Estimate(a *Array, r []Reading) Estimate {
	x, n, sum := twoAxisSum(a, r)
	out := unitEstimate(x, n)
	out.Signal = sum
	if out.Valid {
		out.Residual = twoAxisResidual(a, r, out.Dir, r3.Vec{}, 0)
	}
	return out
}

// twoAxisResidual is the RMS chord between the estimate ŝ and each valid
// two-axis direction, and the extra direction d when k > 0.
func twoAxisResidual(a *Array, r []Reading, ŝ, d r3.Vec, k int) float64 {
	ss, n := 0.0, 0
	for _, i := range a.twoAxis {
		if r[i].Valid {
			ss += r3.Norm2(r3.Sub(r[i].Dir, ŝ))
			n++
		}
	}
	if k > 0 {
		ss += r3.Norm2(r3.Sub(d, ŝ))
		n++
	}
	if n == 0 {
		return 0
	}
	return math.Sqrt(ss / float64(n))
}

func twoAxisSum(a *Array, r []Reading) (r3.Vec, int, float64) {
	var x r3.Vec
	n := 0
	sum := 0.0
	for _, i := range a.twoAxis {
		if !r[i].Valid {
			continue
		}
		s := a.sensors[i].Sigma()
		if r[i].Sigma > s {
			s = r[i].Sigma
		}
		x = r3.Add(x, r3.Scale(1/(s*s), r[i].Dir))
		sum += r[i].Signal
		n++
	}
	return x, n, sum
}

// Combined is the 1/σ²-weighted mean of every two-axis direction and of the
// cosine least-squares direction, which counts with the stated accuracy
// CoarseSigma (rad; 0 means 5°, a typical uncorrected coarse-sensor error
// in LEO, common practice, no source).
// The cosine direction joins only when it passes CosineGate (the least-
// squares gate of the scenario), so an albedo-driven cosine fit does not
// pull a good two-axis answer.
type Combined struct {
	CoarseSigma  float64
	MaxCondition float64
	CosineGate   Gate
}

// Name implements Estimator.
func (Combined) Name() string { return "combined" }

// Estimate implements Estimator.
func (e Combined) Estimate(a *Array, r []Reading) Estimate {
	x, n, sum := twoAxisSum(a, r)
	c := e.CosineGate.Apply((LeastSquares{MaxCondition: e.MaxCondition}).Estimate(a, r))
	k := 0
	if c.Valid {
		s := e.CoarseSigma
		if s == 0 {
			s = 5 * math.Pi / 180
		}
		x = r3.Add(x, r3.Scale(1/(s*s), c.Dir))
		n += c.N
		sum += c.Signal
		k = 1
	}
	out := unitEstimate(x, n)
	out.Signal = sum
	if out.Valid {
		// The directions' spread about the estimate, with the cosine fit's
		// own misfit beside it.
		out.Residual = twoAxisResidual(a, r, out.Dir, c.Dir, k)
		if k > 0 {
			out.Residual = max(out.Residual, c.Residual)
		}
	}
	return out
}
