// Package vecmath holds the small vector helpers the step loops share and
// gonum's r3 lacks in the fast form: r3.Norm goes through math.Hypot, which
// guards against overflow the km-scale vectors here never approach and costs
// several times more in a loop run millions of times.
package vecmath

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// Norm is |v|.
func Norm(v r3.Vec) float64 { return math.Sqrt(r3.Norm2(v)) }

// Unit is v/|v| (NaNs for the zero vector, as r3.Unit).
func Unit(v r3.Vec) r3.Vec { return r3.Scale(1/math.Sqrt(r3.Norm2(v)), v) }
