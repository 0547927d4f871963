package albedo

import (
	"math"
	"os"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// orbitGeometry is one step of benchOrbit: the spacecraft position and GMST.
type orbitGeometry struct {
	rSat r3.Vec
	gmst float64
}

// benchOrbit returns the steps of one 550 km orbit inclined 97.6°, 10 s
// apart, with the sun 30° out of the orbit plane (EME2000).
func benchOrbit() (steps []orbitGeometry, sun r3.Vec) {
	const inc, r, period = 97.6 * math.Pi / 180, EarthRadiusKm + 550, 5740.0
	si, ci := math.Sincos(inc)
	for t := 0.0; t < period; t += 10 {
		s, c := math.Sincos(2 * math.Pi * t / period)
		steps = append(steps, orbitGeometry{
			rSat: r3.Vec{X: r * c, Y: r * s * ci, Z: r * s * si},
			gmst: 7.292115e-5 * t,
		})
	}
	return steps, r3.Unit(r3.Vec{X: 0.85, Y: 0.3, Z: 0.43})
}

// inertialSensors returns six 60° cosine cones on the faces of a cube
// turned off the EME2000 axes (the bench scenario's inertial attitude).
func inertialSensors() []Sensor {
	// Rows of the rotation of quaternion (0.9, 0.1, 0.3, 0.3), normalised.
	q := [4]float64{0.9, 0.1, 0.3, 0.3}
	n := math.Sqrt(q[0]*q[0] + q[1]*q[1] + q[2]*q[2] + q[3]*q[3])
	w, x, y, z := q[0]/n, q[1]/n, q[2]/n, q[3]/n
	cols := []r3.Vec{
		{X: 1 - 2*(y*y+z*z), Y: 2 * (x*y + w*z), Z: 2 * (x*z - w*y)},
		{X: 2 * (x*y - w*z), Y: 1 - 2*(x*x+z*z), Z: 2 * (y*z + w*x)},
		{X: 2 * (x*z + w*y), Y: 2 * (y*z - w*x), Z: 1 - 2*(x*x+y*y)},
	}
	var out []Sensor
	for _, c := range cols {
		out = append(out, Sensor{Normal: c, HalfAngle: math.Pi / 3}, Sensor{Normal: r3.Scale(-1, c), HalfAngle: math.Pi / 3})
	}
	return out
}

// BenchmarkOrbitSteps is the albedo cost of one run step for six 60° cones
// of an inertial body along a sunlit-and-eclipsed orbit, per reflectance
// model (ns/step averages over the orbit, shadowed steps included);
// zonal-tables reads the shared zonal table of NewTableFactory (its build,
// before the timing, not included).
func BenchmarkOrbitSteps(b *testing.B) {
	f, err := os.Open("testdata/demo_grid.csv")
	if err != nil {
		b.Fatal(err)
	}
	g, err := ParseGrid(f)
	f.Close()
	if err != nil {
		b.Fatal(err)
	}
	for _, c := range []struct {
		name   string
		refl   Reflectance
		tables bool
	}{{"uniform", Uniform{Albedo: DefaultAlbedo}, false}, {"zonal", KnockeZonal(), false}, {"zonal-tables", KnockeZonal(), true}, {"grid", g, false}} {
		b.Run(c.name, func(b *testing.B) {
			cfg := Config{Reflectance: c.refl, AltitudeKm: 550}
			m, err := New(cfg)
			if c.tables {
				var f func() (*Model, error)
				if f, err = NewTableFactory(cfg); err == nil {
					m, err = f()
				}
			}
			if err != nil {
				b.Fatal(err)
			}
			steps, sun := benchOrbit()
			sensors := inertialSensors()
			dst := make([]Result, len(sensors))
			m.Irradiance(dst, steps[0].rSat, sun, AUKm, 0, 2461406.5, sensors) // builds the shared table
			b.ReportAllocs()
			for b.Loop() {
				for _, s := range steps {
					m.Irradiance(dst, s.rSat, sun, AUKm, s.gmst, 2461406.5, sensors)
				}
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(steps)), "ns/step")
		})
	}
}
