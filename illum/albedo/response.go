package albedo

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/interp"
)

// Response is a sensor's response to collimated light as a function of the
// incidence angle θ, relative to normal incidence. The zero value is the
// ideal cosine response R(θ) = cos θ, which takes the fast path.
type Response struct {
	table      *interp.PiecewiseLinear
	first, end float64 // incidence range of the table, rad
	yFirst     float64
	yEnd       float64
}

// NewTableResponse builds a response from a table of incidence angles (rad,
// strictly increasing, within [0, π/2]) and relative responses (finite, ≥ 0),
// interpolated linearly in θ (gonum interp.PiecewiseLinear). Outside the table
// the end values hold. A measured roll-off at grazing incidence is the use.
func NewTableResponse(incidence, relative []float64) (Response, error) {
	if len(incidence) < 2 || len(incidence) != len(relative) {
		return Response{}, fmt.Errorf("albedo: response table: need at least 2 (angle, response) pairs of equal length, got %d angles and %d responses", len(incidence), len(relative))
	}
	for i, θ := range incidence {
		if math.IsNaN(θ) || θ < 0 || θ > math.Pi/2 {
			return Response{}, fmt.Errorf("albedo: response table row %d: incidence %g rad outside [0, π/2]", i+1, θ)
		}
		if i > 0 && θ <= incidence[i-1] {
			return Response{}, fmt.Errorf("albedo: response table row %d: incidence angles must increase strictly", i+1)
		}
		if v := relative[i]; math.IsNaN(v) || math.IsInf(v, 0) || v < 0 {
			return Response{}, fmt.Errorf("albedo: response table row %d: relative response %g must be finite and ≥ 0", i+1, v)
		}
	}
	var pl interp.PiecewiseLinear
	if err := pl.Fit(incidence, relative); err != nil {
		return Response{}, fmt.Errorf("albedo: response table: %w", err)
	}
	n := len(incidence)
	return Response{table: &pl, first: incidence[0], end: incidence[n-1], yFirst: relative[0], yEnd: relative[n-1]}, nil
}

// IsCosine reports whether r is the ideal cosine response.
func (r Response) IsCosine() bool { return r.table == nil }

// At returns the relative response for light arriving at cosine of incidence c.
func (r Response) At(c float64) float64 {
	if r.table == nil {
		return c
	}
	θ := math.Acos(min(1, max(-1, c)))
	switch {
	case θ <= r.first:
		return r.yFirst
	case θ >= r.end:
		return r.yEnd
	}
	return r.table.Predict(θ)
}
