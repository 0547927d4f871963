package study

import (
	"fmt"

	"codeberg.org/sunsight/sunsight/illum/power"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/scenario"
)

// Panels builds the scenario's solar panels, each shaded by its mounting
// plane, the bus outline and the obstructions as traced from its centre;
// nil without panels.
func Panels(s *scenario.Scenario) (*power.Array, error) {
	if len(s.Body.Panels) == 0 {
		return nil, nil
	}
	obs := Obstacles(s)
	var ps []power.Panel
	for _, p := range s.Body.Panels {
		o := sky.Obstructed{Position: p.PositionM, Face: p.Normal, Obstacles: obs}
		ps = append(ps, power.Panel{Name: p.Name, Normal: p.Normal, AreaM2: p.AreaM2, Efficiency: p.Efficiency,
			PackingFactor: p.PackingFactor, Hidden: o.Hidden})
	}
	arr, err := power.NewArray(ps...)
	if err != nil {
		return nil, fmt.Errorf("body.panels: %w", err)
	}
	return arr, nil
}
