package study

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/power"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/scenario"
)

// Panels builds the scenario's solar panels, each shaded by its mounting
// plane, the bus outline, the obstructions and the other panels given with
// their sides (size_m); a panel with its sides is sampled over its area
// (sky.Plate), one without at its centre. Nil without panels.
func Panels(s *scenario.Scenario) (*power.Array, error) {
	if len(s.Body.Panels) == 0 {
		return nil, nil
	}
	obs := Obstacles(s)
	half := r3.Scale(0.5, s.Body.SizeM)
	plates := make([]sky.Obstacle, len(s.Body.Panels))
	for i, p := range s.Body.Panels {
		if p.SizeM != ([2]float64{}) && !onOutline(sky.PlateRectangle(p.PositionM, p.Normal, p.SizeM[0], p.SizeM[1]), half) {
			plates[i] = sky.PlateRectangle(p.PositionM, p.Normal, p.SizeM[0], p.SizeM[1])
		}
	}
	var ps []power.Panel
	for i, p := range s.Body.Panels {
		mine := append([]sky.Obstacle(nil), obs...)
		for j, pl := range plates {
			if j != i && pl != nil {
				mine = append(mine, pl)
			}
		}
		pn := power.Panel{Name: p.Name, Normal: p.Normal, AreaM2: p.AreaM2, Efficiency: p.Efficiency, PackingFactor: p.PackingFactor}
		if p.SizeM != ([2]float64{}) {
			pn.LitShare = sky.NewPlate(p.PositionM, p.Normal, p.SizeM[0], p.SizeM[1], mine).LitShare
		} else {
			o := sky.Obstructed{Position: p.PositionM, Face: p.Normal, Obstacles: mine}
			pn.LitShare = func(d r3.Vec) float64 {
				if o.Hidden(d) {
					return 0
				}
				return 1
			}
		}
		ps = append(ps, pn)
	}
	arr, err := power.NewArray(ps...)
	if err != nil {
		return nil, fmt.Errorf("body.panels: %w", err)
	}
	return arr, nil
}

// onOutline says whether a rectangle lies on the bus outline (every corner
// within the half extents, 1 mm tolerance): the outline box already stands
// for it as an obstacle.
func onOutline(r sky.Rectangle, half r3.Vec) bool {
	if half == (r3.Vec{}) {
		return false
	}
	for _, a := range []float64{-1, 1} {
		for _, b := range []float64{-1, 1} {
			c := r3.Add(r.Centre, r3.Add(r3.Scale(a, r.HalfU), r3.Scale(b, r.HalfV)))
			if math.Abs(c.X) > half.X+1e-3 || math.Abs(c.Y) > half.Y+1e-3 || math.Abs(c.Z) > half.Z+1e-3 {
				return false
			}
		}
	}
	return true
}
