package albedo

import (
	"math"
	"os"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// faceSensors returns six cosine sensors on the faces of a cube in EME2000
// axes, hemispherical field of view.
func faceSensors() []Sensor {
	ax := []r3.Vec{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}, {Z: 1}, {Z: -1}}
	out := make([]Sensor, len(ax))
	for i, n := range ax {
		out[i] = Sensor{Normal: n, HalfAngle: math.Pi / 2}
	}
	return out
}

func benchIrradiance(b *testing.B, cfg Config) {
	m, err := New(cfg)
	if err != nil {
		b.Fatal(err)
	}
	sensors := faceSensors()
	dst := make([]Result, len(sensors))
	rSat := r3.Scale(EarthRadiusKm+550, r3.Unit(r3.Vec{X: 0.6, Y: 0.5, Z: 0.62}))
	sun := r3.Unit(r3.Vec{X: 0.9, Y: 0.4, Z: 0.17}) // about 35° from zenith
	m.Irradiance(dst, rSat, sun, AUKm, 1.2, 2461000.5, sensors)
	b.ReportAllocs()
	for b.Loop() {
		m.Irradiance(dst, rSat, sun, AUKm, 1.2, 2461000.5, sensors)
	}
}

func BenchmarkIrradianceSixSensors(b *testing.B) {
	b.Run("uniform/default", func(b *testing.B) { benchIrradiance(b, Config{}) })
	b.Run("zonal/default", func(b *testing.B) { benchIrradiance(b, Config{Reflectance: KnockeZonal()}) })
	b.Run("uniform/6000", func(b *testing.B) { benchIrradiance(b, Config{Cells: 6000}) })
}

// BenchmarkRebuild measures one rebuild of the cap geometry (an altitude
// change larger than RebuildKm).
func BenchmarkRebuild(b *testing.B) {
	m, _ := New(Config{AltitudeKm: 550})
	for b.Loop() {
		m.geo.build(EarthRadiusKm+551, DefaultCells, m.gx, m.gw)
	}
}

var calibrationSink float64

// BenchmarkCalibrationSum is a machine yardstick, not a model: a dependent sum
// of 4600 floats, about the number of cell × sensor visits in one six-sensor
// call at the default resolution. Quote Irradiance as a ratio to it.
func BenchmarkCalibrationSum(b *testing.B) {
	x := make([]float64, 4600)
	for i := range x {
		x[i] = float64(i)
	}
	for b.Loop() {
		s := 0.0
		for _, v := range x {
			s += v * 1.0001
		}
		calibrationSink = s
	}
}

func BenchmarkIrradianceGrid(b *testing.B) {
	f, err := os.Open("testdata/demo_grid.csv")
	if err != nil {
		b.Fatal(err)
	}
	defer f.Close()
	g, err := ParseGrid(f)
	if err != nil {
		b.Fatal(err)
	}
	benchIrradiance(b, Config{Reflectance: g})
}
