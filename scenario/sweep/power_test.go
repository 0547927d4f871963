package sweep

import (
	"context"
	"math"
	"os"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// A panel's area is a sweepable key: the +X body panel's share of the orbit-average
// power grows in proportion to its area (the model is linear in area), and
// the power target is judged in each case.
func TestPanelAreaSweeps(t *testing.T) {
	data, err := os.ReadFile("../../examples/power-6u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	a, err := ParseAxis("body.panels[0].area_m2=0.0001,0.0828,0.1656")
	if err != nil {
		t.Fatal(err)
	}
	p, err := NewPlan(data, "../../examples", []Axis{a}, false)
	if err != nil {
		t.Fatal(err)
	}
	var got []float64
	for i := range p.Cases {
		s := p.Scenario(i)
		s.Duration = scenario.Span(3 * 3600e9)
		s.Albedo.Model = scenario.AlbedoNone
		out, err := RunCase(context.Background(), s, 1)
		if err != nil {
			t.Fatal(err)
		}
		if _, ok := study.FindTarget(out.Targets, study.TargetPower); !ok {
			t.Errorf("case %d: no power target judged", i)
		}
		got = append(got, out.Headline.OrbitAvgPowerW)
	}
	// P(A) = P₀ + k·A: the step from 0.0828 to 0.1656 m² equals the step
	// from 0.0001 to 0.0828 m² scaled by 0.0828/0.0827.
	d1, d2 := got[1]-got[0], got[2]-got[1]
	if !(d1 > 0) || math.Abs(d2-d1*0.0828/0.0827) > 1e-9*got[2] {
		t.Errorf("orbit-average power over the +X body panel area: %v W (steps %g, %g)", got, d1, d2)
	}
	t.Logf("orbit-average power for +X body panel areas 0.0001, 0.0828, 0.1656 m²: %.4f, %.4f, %.4f W", got[0], got[1], got[2])
}
