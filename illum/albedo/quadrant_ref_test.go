package albedo_test

import (
	"encoding/csv"
	"math"
	"os"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
)

// quadrantRef builds the sensors of testdata/gen_quadrant_ref.py.
func quadrantRef(t *testing.T, name string) *sensor.Quadrant {
	t.Helper()
	m, _ := sensor.FaceMount(sensor.FacePlusZ, 0, sensor.FaceNone, 0)
	spec := map[string]sensor.QuadrantSpec{
		"aperture": {ApertureSide: 2, Height: 1.2, CellSide: 2, Gap: 0.1},
		"wide":     {ApertureSide: 3, Height: 1, CellSide: 1},
		"wall":     {Geometry: sensor.GeometryWall, WallDistance: 1.1547005383792515, Height: 2, CellSide: 3},
	}[name]
	spec.Name, spec.Mount = name, m
	q, err := sensor.NewQuadrant(spec)
	if err != nil {
		t.Fatal(err)
	}
	return q
}

// The albedo on each cell of a four-quadrant sensor, integrated through the
// cells' own responses (each Earth cell lights the detector cells its own
// spot or shadow leaves lit), against an independent numpy brute force over
// the solid angle (testdata/gen_quadrant_ref.py, 3000 × 3000 directions,
// converged to 3e-7), at the default cell count: 90 cases of an aperture sensor, an aperture wider than
// the detector and a 30° shade wall, at 550 km, solar zenith 20…85°, tilts
// 0…75°, two azimuths and two clock angles. Within 1 % per cell where the
// cell gets at least 1 % of the largest cell value of the reference, else
// within 1e-3 W/m² (× the largest value).
func TestQuadrantAlbedoAgainstNumpy(t *testing.T) {
	f, err := os.Open("testdata/quadrant_albedo_ref.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	m, err := albedo.New(albedo.Config{Reflectance: albedo.Uniform{Albedo: 0.30}, AltitudeKm: 550})
	if err != nil {
		t.Fatal(err)
	}
	num := func(s string) float64 {
		v, err := strconv.ParseFloat(s, 64)
		if err != nil {
			t.Fatal(err)
		}
		return v
	}
	const deg = math.Pi / 180
	rSat := r3.Vec{Z: albedo.EarthRadiusKm + 550}
	worst, peak := 0.0, 0.0
	for _, rec := range recs[1:] {
		for _, v := range rec[5:] {
			peak = math.Max(peak, num(v))
		}
	}
	dst := make([]albedo.Result, 1)
	for _, rec := range recs[1:] {
		q := quadrantRef(t, rec[0])
		zeta, tau, psi, kappa := num(rec[1])*deg, num(rec[2])*deg, num(rec[3])*deg, num(rec[4])*deg
		n := r3.Vec{X: math.Sin(tau) * math.Cos(psi), Y: math.Sin(tau) * math.Sin(psi), Z: -math.Cos(tau)}
		ref := r3.Vec{Z: 1}
		if math.Abs(n.Z) >= 0.9 {
			ref = r3.Vec{X: 1}
		}
		x := r3.Unit(r3.Sub(ref, r3.Scale(r3.Dot(ref, n), n)))
		y := r3.Cross(n, x)
		xk := r3.Add(r3.Scale(math.Cos(kappa), x), r3.Scale(math.Sin(kappa), y))
		yk := r3.Cross(n, xk)
		sn := albedo.Sensor{Normal: n, HalfAngle: q.HalfAngle(), Cells: q, X: xk, Y: yk}
		m.Irradiance(dst, rSat, r3.Vec{X: math.Sin(zeta), Z: math.Cos(zeta)}, albedo.AUKm, 0, 0, []albedo.Sensor{sn})
		var sum, want float64
		for i := range 4 {
			w := num(rec[5+i])
			got := dst[0].Cells[i]
			sum += got
			want += w
			if w >= 0.01*peak {
				rel := math.Abs(got-w) / w
				worst = math.Max(worst, rel)
				if rel > 0.01 {
					t.Errorf("%v cell %c: %.4f W/m², numpy %.4f (%.2f %%)", rec[:5], 'A'+i, got, w, 100*rel)
				}
			} else if math.Abs(got-w) > 1e-3*peak {
				t.Errorf("%v cell %c: %.5f W/m², numpy %.5f", rec[:5], 'A'+i, got, w)
			}
		}
		if math.Abs(dst[0].Irradiance-sum) > 1e-9*math.Max(1, sum) {
			t.Errorf("%v: irradiance %.6f is not the cell sum %.6f", rec[:5], dst[0].Irradiance, sum)
		}
	}
	t.Logf("worst relative cell error %.3f %% over %d cases (%d cells)", 100*worst, len(recs)-1, m.Cells())
}
