package sim

import (
	"context"
	"encoding/json"
	"math"
	"os"
	"testing"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum/power"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// powerReference is testdata/power_nadir.json (gen_power_nadir.py).
type powerReference struct {
	AreaM2        float64 `json:"area_m2"`
	Efficiency    float64 `json:"efficiency"`
	PackingFactor float64 `json:"packing_factor"`
	Cases         []struct {
		Name    string
		Epoch   []float64
		AKm     float64 `json:"a_km"`
		E       float64
		IDeg    float64 `json:"i_deg"`
		RAANDeg float64 `json:"raan_deg"`
		ArgpDeg float64 `json:"argp_deg"`
		MDeg    float64 `json:"m_deg"`
		PeriodS float64 `json:"period_s"`
		Panels  []struct {
			Name   string
			Normal []float64
			MeanW  float64 `json:"mean_w"`
		}
	}
}

// Body-fixed panels in nadir pointing over one orbit against an independent
// integration (testdata/gen_power_nadir.py: numpy two-body orbit, ERFA sun
// and time scales, its own disc-overlap shadow and nadir frame, Simpson's
// rule on a 0.05 s grid). The engine samples every 1 s with the Meeus sun;
// every panel's orbit average agrees within 0.1 %.
func TestPowerNadirPanelsAgainstNumpy(t *testing.T) {
	data, err := os.ReadFile("testdata/power_nadir.json")
	if err != nil {
		t.Fatal(err)
	}
	var ref powerReference
	if err := json.Unmarshal(data, &ref); err != nil {
		t.Fatal(err)
	}
	if len(ref.Cases) == 0 {
		t.Fatal("no reference cases")
	}
	deg := math.Pi / 180
	worst := 0.0
	for _, c := range ref.Cases {
		e := c.Epoch
		sec := math.Floor(e[5])
		epoch := time.Date(int(e[0]), time.Month(int(e[1])), int(e[2]), int(e[3]), int(e[4]), int(sec), int((e[5]-sec)*1e9), time.UTC)
		el := orbit.Elements{SemiMajorAxisKm: c.AKm, Eccentricity: c.E, Inclination: c.IDeg * deg, RAAN: c.RAANDeg * deg,
			ArgPerigee: c.ArgpDeg * deg, MeanAnomaly: c.MDeg * deg}
		if p := 2 * math.Pi * math.Sqrt(c.AKm*c.AKm*c.AKm/orbit.MuEarth); math.Abs(p-c.PeriodS) > 1e-6 {
			t.Fatalf("%s: period %.6f s, reference %.6f s", c.Name, p, c.PeriodS)
		}
		for _, pn := range c.Panels {
			n := r3.Unit(r3.Vec{X: pn.Normal[0], Y: pn.Normal[1], Z: pn.Normal[2]})
			arr, err := power.NewArray(power.Panel{Name: pn.Name, Normal: n, AreaM2: ref.AreaM2, Efficiency: ref.Efficiency, PackingFactor: ref.PackingFactor})
			if err != nil {
				t.Fatal(err)
			}
			cfg := Config{Epoch: epoch, Duration: c.PeriodS, Step: 1,
				NewPropagator: func() orbit.Propagator { return orbit.NewTwoBody(el) },
				Sun:           ephem.Meeus{}, Law: attitude.Nadir{}, Array: faceArray(t, 60), Units: 1, Panels: arr,
				Estimators: []sensor.Estimator{sensor.LeastSquares{}}}
			res, err := Run(context.Background(), cfg)
			if err != nil {
				t.Fatal(err)
			}
			got := res.Power.MeanW
			switch {
			case pn.MeanW == 0:
				if got != 0 {
					t.Errorf("%s, %s panel: %.6g W, reference 0 W (never lit)", c.Name, pn.Name, got)
				}
				continue
			case pn.MeanW < 0.5:
				t.Fatalf("%s, %s panel: reference %.4g W too small for a relative check", c.Name, pn.Name, pn.MeanW)
			}
			rel := (got - pn.MeanW) / pn.MeanW
			worst = math.Max(worst, math.Abs(rel))
			if math.Abs(rel) > 1e-3 {
				t.Errorf("%s, %s panel: orbit average %.5f W, numpy %.5f W (relative %.2e; want ≤ 1e-3)", c.Name, pn.Name, got, pn.MeanW, rel)
			} else {
				t.Logf("%s, %s panel: orbit average %.5f W, numpy %.5f W (relative %+.2e)", c.Name, pn.Name, got, pn.MeanW, rel)
			}
		}
	}
	t.Logf("largest relative difference %.2e", worst)
}
