package albedo

import (
	"math"
	"math/rand/v2"
	"os"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// toyQuadrants is a four-cell response for the tests: the cosine split by
// the signs of the sensor-frame x and y, smoothed across the gaps.
type toyQuadrants struct{}

func (toyQuadrants) CellResponse(d r3.Vec) [4]float64 {
	sx, sy := 0.5+0.5*math.Tanh(8*d.X), 0.5+0.5*math.Tanh(8*d.Y)
	return [4]float64{d.Z * sx * sy, d.Z * (1 - sx) * sy, d.Z * (1 - sx) * (1 - sy), d.Z * sx * (1 - sy)}
}

// The sum over each sensor's ring windows adds the same terms in the same
// order as the sum over every cell, so Model.Irradiance returns the same
// bits either way: random spacecraft radii (300 km to GEO), positions,
// suns and sensors (half-angles 2°…90°, boresights at exact nadir and
// zenith among them, mounting planes, four-cell sensors), for a uniform,
// a zonal (in range and clamped) and a gridded reflectance.
func TestWindowsMatchEveryCell(t *testing.T) {
	f, err := os.Open("testdata/demo_grid.csv")
	if err != nil {
		t.Fatal(err)
	}
	g, err := ParseGrid(f)
	f.Close()
	if err != nil {
		t.Fatal(err)
	}
	refls := map[string]Reflectance{
		"uniform":       Uniform{Albedo: DefaultAlbedo},
		"zonal":         KnockeZonal(),
		"zonal-clamped": KnockeZonal().Scaled(2.5),
		"grid":          g,
	}
	if !KnockeZonal().inRange() || KnockeZonal().Scaled(2.5).inRange() {
		t.Fatal("inRange: Knocke's profile stays in [0, 1], scaled 2.5× it does not")
	}
	rng := rand.New(rand.NewPCG(5, 17))
	for name, refl := range refls {
		fast, err := New(Config{Reflectance: refl, Cells: 500 + rng.IntN(3000)})
		if err != nil {
			t.Fatal(err)
		}
		ref, _ := New(Config{Reflectance: refl, Cells: fast.Cells()})
		ref.fullScan = true
		seen := 0
		for range 400 {
			alt := 300 + 2000*rng.Float64()
			if rng.IntN(8) == 0 {
				alt = 35786
			}
			rSat := r3.Scale(EarthRadiusKm+alt, randUnit(rng))
			nadir := r3.Scale(-1/math.Sqrt(r3.Norm2(rSat)), rSat)
			sun := randUnit(rng)
			var sensors []Sensor
			for k := range 8 {
				n := randUnit(rng)
				switch k {
				case 0:
					n = nadir
				case 1:
					n = r3.Scale(-1, nadir)
				}
				s := Sensor{Normal: n, HalfAngle: (2 + 88*rng.Float64()) * math.Pi / 180}
				if k == 7 {
					s.HalfAngle = math.Pi / 2
				}
				if rng.IntN(4) == 0 {
					s.Plane = r3.Unit(r3.Add(n, r3.Scale(0.8, randUnit(rng))))
				}
				if rng.IntN(5) == 0 {
					s.X = r3.Unit(r3.Cross(n, randUnit(rng)))
					s.Y = r3.Cross(n, s.X)
					s.Cells = toyQuadrants{}
				}
				sensors = append(sensors, s)
			}
			got, want := make([]Result, len(sensors)), make([]Result, len(sensors))
			gmst, jd := 2*math.Pi*rng.Float64(), 2461000.5+365*rng.Float64()
			fast.Irradiance(got, rSat, sun, AUKm, gmst, jd, sensors)
			ref.Irradiance(want, rSat, sun, AUKm, gmst, jd, sensors)
			for i := range got {
				if got[i] != want[i] {
					t.Fatalf("%s, %.0f km, sensor %d (%+v): windows %+v, every cell %+v", name, alt, i, sensors[i], got[i], want[i])
				}
				if want[i].Irradiance > 0 {
					seen++
				}
			}
		}
		if seen < 500 {
			t.Errorf("%s: only %d lit sensor cases", name, seen)
		}
	}
}
