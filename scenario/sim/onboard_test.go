package sim

import (
	"context"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// onboardCase is six cosine sensors on the faces, nadir pointing at 550 km
// over duration s, a uniform truth albedo of 0.3 and, with onboard set, a
// zonal on-board model (demo values).
func onboardCase(t testing.TB, duration float64, onboard bool) Config {
	t.Helper()
	var ss []sensor.Sensor
	for i, b := range []r3.Vec{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}, {Z: 1}, {Z: -1}} {
		ss = append(ss, cosineAt(t, string(rune('a'+i)), b, 90))
	}
	cfg := bodiesCase(t, 550, attitude.Nadir{}, duration, ss...)
	cfg.NewAlbedo = func() (*albedo.Model, error) {
		return albedo.New(albedo.Config{Reflectance: albedo.Uniform{Albedo: 0.3}, Cells: 300})
	}
	if onboard {
		cfg.NewCorrection = func() (*albedo.Model, error) {
			return albedo.New(albedo.Config{Reflectance: albedo.Zonal{A0: 0.3, A2: 0.1}, Cells: 300})
		}
	}
	return cfg
}

// The step loop allocates nothing with an on-board albedo model: its
// prediction, the view past the body and the corrected readings all go into
// buffers made once.
func TestOnboardStepAllocatesNothing(t *testing.T) {
	cfg := onboardCase(t, 3600, true)
	g, err := newGeometry(&cfg, cfg.Array, 0, albedoTables{})
	if err != nil {
		t.Fatal(err)
	}
	r := newReader(&cfg, cfg.Array, 0, 0)
	vw := newViewer(&cfg, cfg.Array)
	alb := make([]sensor.Albedo, cfg.Array.Len())
	pred := make([]sensor.Albedo, cfg.Array.Len())
	k := 0
	step := func() {
		sg := g.step(k%cfg.Steps(), alb, pred)
		r.step(k%cfg.Steps(), &sg, vw.at(&sg, alb, pred))
		k++
	}
	for range 200 {
		step() // the quantile bins are taken on the first values
	}
	if n := testing.AllocsPerRun(500, step); n != 0 {
		t.Errorf("%v allocations per step", n)
	}
	if r.readCorr == nil || r.acc.est[0].validCorr == 0 {
		t.Error("no corrected estimate was made: the test does not exercise the correction")
	}
}

// BenchmarkOnboardCorrection measures one hour of a six-sensor nadir run at
// a 30 s step without and with an on-board albedo model, side by side (the
// prediction is a second albedo integral per step).
func BenchmarkOnboardCorrection(b *testing.B) {
	for _, c := range []struct {
		name    string
		onboard bool
	}{{"truth-only", false}, {"with-onboard", true}} {
		cfg := onboardCase(b, 6*3600, c.onboard)
		b.Run(c.name, func(b *testing.B) {
			for b.Loop() {
				if _, err := Run(context.Background(), cfg); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// An on-board model equal to the truth's goes the truth's route: with the
// albedo tables in use (the LVLH table of a nadir run, the boresight tables
// of a spinning one), the prediction is read from a table built the same
// way, so the correction of linear, error-free readings still removes the
// albedo part to rounding.
func TestOnboardSameModelThroughTheTables(t *testing.T) {
	defer func(n, w int) { albedoTableMinSteps, boresightMinWork = n, w }(albedoTableMinSteps, boresightMinWork)
	albedoTableMinSteps, boresightMinWork = 0, 0
	for _, c := range []struct {
		name     string
		law      attitude.Law
		boresite bool
	}{{"nadir, LVLH table", attitude.Nadir{}, false}, {"spin, boresight tables", attitude.Spin{Axis: r3.Unit(r3.Vec{X: 1, Y: 1, Z: 1}), BodyAxis: r3.Unit(r3.Vec{X: 1, Y: 2, Z: 3}), Rate: 0.01}, true}} {
		cfg := onboardCase(t, 3*3600, false)
		cfg.Law = c.law
		cfg.NewCorrection = cfg.NewAlbedo
		res, err := Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		if !res.AlbedoTable || res.albedoBoresight != c.boresite {
			t.Fatalf("%s: table %v, boresight %v", c.name, res.AlbedoTable, res.albedoBoresight)
		}
		e := res.Nominal.Estimators[0]
		k := e.Corrected
		t.Logf("%s: albedo part p95 %.3f°, residual max %.2g° over %d samples", c.name, e.AlbedoPart.P95Deg, k.ResidualPart.MaxDeg, k.ResidualPart.N)
		if !(e.AlbedoPart.P95Deg > 1) || k.ResidualPart.N == 0 || k.ResidualPart.MaxDeg > 1e-6 {
			t.Errorf("%s: albedo part p95 %.3f°, residual max %.3g° over %d samples: want ≤ 1e-6°", c.name, e.AlbedoPart.P95Deg, k.ResidualPart.MaxDeg, k.ResidualPart.N)
		}
		if k.ValidFraction != e.ValidFractionNoAlbedo {
			t.Errorf("%s: valid %.6f corrected, %.6f without albedo", c.name, k.ValidFraction, e.ValidFractionNoAlbedo)
		}
	}
}
