package albedo

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// plateToSphere is the configuration factor from a plane element at distance
// r from the centre of a sphere of radius R, its normal at angle θ from the
// direction to the centre; H = r/R. J. R. Howell, "A Catalog of Radiation Heat
// Transfer Configuration Factors", plane element to sphere, full-view and
// partial-view cases (entry B-11 from memory; formula as tabulated in
// spacecraft thermal handbooks, from memory).
func plateToSphere(H, θ float64) float64 {
	switch {
	case θ <= math.Acos(1/H): // whole disc in front
		return math.Cos(θ) / (H * H)
	case θ >= math.Pi/2+math.Asin(1/H): // Earth behind the plate
		return 0
	}
	x := math.Sqrt(H*H - 1)
	return 0.5 - math.Asin(x/(H*math.Sin(θ)))/math.Pi +
		(math.Cos(θ)*math.Acos(-x/math.Tan(θ))-x*math.Sqrt(1-H*H*math.Cos(θ)*math.Cos(θ)))/(math.Pi*H*H)
}

func TestViewFactorHowell(t *testing.T) {
	const tol = 1e-3 // relative; the project's requirement for view factors
	worst, worstAbs := 0.0, 0.0
	for _, h := range []float64{400, 550, 800} {
		m, err := New(Config{})
		if err != nil {
			t.Fatal(err)
		}
		r := EarthRadiusKm + h
		rSat := r3.Scale(r, r3.Unit(r3.Vec{X: 1, Y: 0.3, Z: -0.2}))
		H := r / EarthRadiusKm
		for deg := 0.0; deg <= 150; deg += 5 {
			θ := deg * math.Pi / 180
			// Normal tilted by θ from nadir at this rSat.
			nadir := r3.Scale(-1/r, rSat)
			side := r3.Unit(r3.Cross(nadir, r3.Vec{Z: 1}))
			n := r3.Add(r3.Scale(math.Cos(θ), nadir), r3.Scale(math.Sin(θ), side))
			got := m.ViewFactor(rSat, n, math.Pi/2)
			want := plateToSphere(H, θ)
			// 0.1 % relative where the plate sees at least 5 % of F(0); where it
			// sees only a sliver of the limb (θ ≳ 130°) an absolute 1e-4
			// (about 0.01 % of F(0)) instead.
			if want >= 0.05/(H*H) {
				e := math.Abs(got-want) / want
				worst = max(worst, e)
				if e > tol {
					t.Errorf("h=%g km θ=%g°: F = %.6f, Howell %.6f (rel err %.2e)", h, deg, got, want, e)
				}
			} else {
				e := math.Abs(got - want)
				worstAbs = max(worstAbs, e)
				if e > 1e-4 {
					t.Errorf("h=%g km θ=%g°: F = %.6f, Howell %.6f (abs err %.2e)", h, deg, got, want, e)
				}
			}
		}
	}
	t.Logf("default %d cells: worst relative view-factor error %.2e, worst absolute on the limb sliver %.2e", DefaultCells, worst, worstAbs)
}

// Nadir plate: F = (Rₑ/r)² (closed form; Howell catalog, plane element to sphere).
func TestViewFactorNadir(t *testing.T) {
	m, _ := New(Config{})
	for _, h := range []float64{200, 400, 550, 800, 1500, 35786} {
		r := EarthRadiusKm + h
		got := m.ViewFactor(r3.Vec{Z: r}, r3.Vec{Z: -1}, math.Pi/2)
		want := (EarthRadiusKm / r) * (EarthRadiusKm / r)
		if e := math.Abs(got/want - 1); e > 1e-3 {
			t.Errorf("h=%g km: F = %.6f, want %.6f (rel %.1e)", h, got, want, e)
		}
	}
}

// Check values quoted for 500 km (H = 1.078393): F(0°) = 0.85990, F(90°) = 0.26740,
// F(135°) = 0.02736; computed here from the Howell formula (closed form).
func TestPlateToSphereFormula(t *testing.T) {
	H := (EarthRadiusKm + 500) / EarthRadiusKm
	for _, c := range []struct{ deg, want float64 }{{0, 0.85990}, {45, 0.63540}, {90, 0.26740}, {135, 0.02736}} {
		if got := plateToSphere(H, c.deg*math.Pi/180); math.Abs(got-c.want) > 1e-5 {
			t.Errorf("θ=%g°: %.5f, want %.5f", c.deg, got, c.want)
		}
	}
}
