package albedo

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// orbitSuns returns n sun directions in the nadir frame of a nadir-pointing
// spacecraft on a circular orbit with beta angle β, dt seconds apart: the
// sun turns about the orbit normal (local y) once per orbit.
func orbitSuns(n int, β, periodS, dt float64) []r3.Vec {
	out := make([]r3.Vec, n)
	sβ, cβ := math.Sincos(β)
	for k := range out {
		s, c := math.Sincos(2 * math.Pi * float64(k) * dt / periodS)
		out[k] = r3.Vec{X: cβ * s, Y: sβ, Z: cβ * c}
	}
	return out
}

// BenchmarkLocalTable: one lookup for six face sensors along a 550 km orbit
// (10 s steps), and the build of the default 1° table. Compare with
// BenchmarkIrradianceSixSensors/uniform/default in the same run.
func BenchmarkLocalTable(b *testing.B) {
	m, err := New(Config{AltitudeKm: 550})
	if err != nil {
		b.Fatal(err)
	}
	sensors := faceSensors()
	r := EarthRadiusKm + 550
	tab, err := NewLocalTable(m, r, sensors, DefaultTableResDeg)
	if err != nil {
		b.Fatal(err)
	}
	orbit := orbitSuns(4096, 0.5, 5740, 10)
	var lit []r3.Vec // the steps where some visible ground is sunlit
	for _, s := range orbit {
		if s.Z < tab.darkZ {
			lit = append(lit, s)
		}
	}
	lookup := func(suns []r3.Vec) func(b *testing.B) {
		return func(b *testing.B) {
			dst := make([]Result, len(sensors))
			b.ReportAllocs()
			k := 0
			for b.Loop() {
				tab.Irradiance(dst, suns[k%len(suns)], AUKm)
				k++
			}
		}
	}
	b.Run("irradiance/orbit", lookup(orbit))
	b.Run("irradiance/lit", lookup(lit))
	b.Run("build", func(b *testing.B) {
		for b.Loop() {
			if _, err := NewLocalTable(m, r, sensors, DefaultTableResDeg); err != nil {
				b.Fatal(err)
			}
		}
	})
}

// BenchmarkBoresightTableBuild: the build of one default boresight table
// (60° cosine cone, one radius at 550 km), the fixed cost a run with albedo
// and a non-nadir attitude pays before its first step.
func BenchmarkBoresightTableBuild(b *testing.B) {
	m, err := New(Config{})
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := NewBoresightTable(m, []float64{EarthRadiusKm + 550}, math.Pi/3, Response{}, DefaultBoresightSunResDeg, DefaultBoresightStepDeg); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkBoresightTableAt: one lookup of a default boresight table (60°
// cone, two radii) for a random boresight and sun, the per-sensor cost of
// a step with albedo in any attitude.
func BenchmarkBoresightTableAt(b *testing.B) {
	m, err := New(Config{})
	if err != nil {
		b.Fatal(err)
	}
	t, err := NewBoresightTable(m, []float64{EarthRadiusKm + 540, EarthRadiusKm + 560}, math.Pi/3, Response{}, DefaultBoresightSunResDeg, DefaultBoresightStepDeg)
	if err != nil {
		b.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(1, 2))
	unit := func() r3.Vec {
		return r3.Unit(r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()})
	}
	const n = 1024
	frames := make([]SunFrame, n)
	bores := make([]r3.Vec, n)
	for i := range frames {
		for !t.Frame(&frames[i], r3.Scale(EarthRadiusKm+550, unit()), unit(), 1.496e8) || frames[i].dark {
		}
		bores[i] = unit()
	}
	var sink float64
	k := 0
	for b.Loop() {
		sink += t.At(&frames[k%n], bores[k%n]).Irradiance
		k++
	}
	if sink < 0 {
		b.Fatal("negative albedo")
	}
}

// BenchmarkZonalBoresightTableBuild is BenchmarkBoresightTableBuild for
// Knocke's zonal profile (ten channels).
func BenchmarkZonalBoresightTableBuild(b *testing.B) {
	m, err := New(Config{Reflectance: KnockeZonal()})
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := NewBoresightTable(m, []float64{EarthRadiusKm + 550}, math.Pi/3, Response{}, DefaultBoresightSunResDeg, DefaultBoresightStepDeg); err != nil {
			b.Fatal(err)
		}
	}
}
