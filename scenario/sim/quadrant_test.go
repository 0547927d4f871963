package sim

import (
	"context"
	"math"
	"testing"

	"codeberg.org/sunsight/sunsight/illum/sensor"
)

// Quadrant sensors get their albedo cell by cell through their own
// responses, also when a table serves the cosine sensors: with and without
// the nadir table their two-axis figures are identical, and albedo moves
// them (the cells are lit).
func TestQuadrantAlbedoCellByCell(t *testing.T) {
	defer func(n int) { albedoTableMinSteps = n }(albedoTableMinSteps)
	var runs []*Result
	for _, min := range []int{1 << 40, 0} {
		albedoTableMinSteps = min
		cfg := referenceCase(t, 0.25, true)
		ss := faceArray(t, 80).Sensors()
		for _, f := range []struct {
			name string
			face sensor.Face
			tilt float64
		}{{"q-nadir", sensor.FacePlusZ, 0}, {"q-tilt", sensor.FacePlusX, 50}} {
			toward := sensor.FaceNone
			if f.tilt != 0 {
				toward = sensor.FacePlusZ
			}
			m, err := sensor.FaceMount(f.face, f.tilt*math.Pi/180, toward, 0)
			if err != nil {
				t.Fatal(err)
			}
			q, err := sensor.NewQuadrant(sensor.QuadrantSpec{Name: f.name, Mount: m, Geometry: sensor.GeometryWall, Height: 2, CellSide: 3,
				WallDistance: 1, SignalMargin: 0.2, ImbalanceMargin: 0.05, DeadZoneImbalance: 0.01, Threshold: 0.01})
			if err != nil {
				t.Fatal(err)
			}
			ss = append(ss, q)
		}
		arr, err := sensor.NewArray(ss...)
		if err != nil {
			t.Fatal(err)
		}
		cfg.Array = arr
		cfg.Estimators = []sensor.Estimator{sensor.TwoAxis{}, sensor.LeastSquares{}}
		res, err := Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		if res.AlbedoTable != (min == 0) {
			t.Fatalf("table used %v, want %v", res.AlbedoTable, min == 0)
		}
		runs = append(runs, res)
	}
	a, b := runs[0].Nominal.Estimators[0], runs[1].Nominal.Estimators[0]
	t.Logf("two-axis: valid %.4f, p95 no albedo %.3f°, with albedo %.3f°, albedo part p95 %.3f°",
		a.ValidFraction, a.ErrNoAlbedo.P95Deg, a.ErrAlbedo.P95Deg, a.AlbedoPart.P95Deg)
	if a.ErrAlbedo != b.ErrAlbedo || a.AlbedoPart != b.AlbedoPart || a.ValidFraction != b.ValidFraction {
		t.Errorf("two-axis with the table differs: %+v / %+v", a.ErrAlbedo, b.ErrAlbedo)
	}
	if !(a.AlbedoPart.P95Deg > 0) {
		t.Errorf("albedo did not move the quadrant directions: %+v", a.AlbedoPart)
	}
}

// A quadrant's full scale applies to each cell, its signal is the sum of
// four: the output the converter's margin is taken on (PeakOutput) is the
// largest cell, between a quarter of the peak signal and the full scale;
// for a cosine sensor it is the peak signal. With cells clipped at full
// scale the peak signal reaches up to four times it (here above it).
func TestQuadrantPeakOutputIsACell(t *testing.T) {
	cfg := referenceCase(t, 0.25, false)
	ss := faceArray(t, 80).Sensors()
	m, err := sensor.FaceMount(sensor.FacePlusX, 0, sensor.FaceNone, 0)
	if err != nil {
		t.Fatal(err)
	}
	const full = 0.1 // below a cell's share of normal sun: the cells clip
	q, err := sensor.NewQuadrant(sensor.QuadrantSpec{Name: "q", Mount: m, Geometry: sensor.GeometryWall, Height: 2, CellSide: 3,
		WallDistance: 1, SignalMargin: 0.2, ImbalanceMargin: 0.05, DeadZoneImbalance: 0.01, Threshold: 0.01,
		Errors: sensor.Errors{FullScale: full}})
	if err != nil {
		t.Fatal(err)
	}
	arr, err := sensor.NewArray(append(ss, q)...)
	if err != nil {
		t.Fatal(err)
	}
	cfg.Array = arr
	cfg.Estimators = []sensor.Estimator{sensor.TwoAxis{}}
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range res.Nominal.Sensors {
		if s.Name != "q" {
			if s.PeakOutput != s.PeakSignal {
				t.Errorf("%s: peak output %g, peak signal %g: want equal for a cosine sensor", s.Name, s.PeakOutput, s.PeakSignal)
			}
			continue
		}
		t.Logf("quadrant: peak signal %.4f, peak output %.4f, full scale %g", s.PeakSignal, s.PeakOutput, full)
		if s.PeakOutput != full || !(s.PeakSignal > full) || s.PeakOutput < s.PeakSignal/4 {
			t.Errorf("quadrant: peak output %g, peak signal %g: want the clipped cell %g, a sum above it", s.PeakOutput, s.PeakSignal, full)
		}
	}
}
