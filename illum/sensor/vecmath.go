package sensor

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// vecNorm is |v|. It replaces r3.Norm, which goes through math.Hypot and
// costs several times more in the step loop; the vectors here are far from
// overflow.
func vecNorm(v r3.Vec) float64 { return math.Sqrt(r3.Norm2(v)) }

// vecUnit is v/|v| (NaNs for the zero vector, as r3.Unit).
func vecUnit(v r3.Vec) r3.Vec { return r3.Scale(1/math.Sqrt(r3.Norm2(v)), v) }
