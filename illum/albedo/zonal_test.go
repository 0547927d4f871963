package albedo

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// Knocke zonal model at t = t0 (a1 = c1 = 0.10): ρ(φ) = 0.34 + 0.10 sin φ
// + 0.29 P₂(sin φ). Values at −90/−60/−30/0/30/60/90° are the closed form of
// that formula: 0.530, 0.435, 0.254, 0.195, 0.354, 0.608, 0.730 (coefficients
// from ECSS-E-ST-10-04C F.5 after Knocke, Ries & Tapley 1988, from memory).
func TestKnockeZonalValues(t *testing.T) {
	z := KnockeZonal()
	want := []float64{0.530, 0.435, 0.254, 0.195, 0.354, 0.608, 0.730}
	for i, lat := range []float64{-90, -60, -30, 0, 30, 60, 90} {
		if got := z.Reflectance(lat*math.Pi/180, 0, z.T0); math.Abs(got-want[i]) > 6e-4 {
			t.Errorf("lat %g: %.4f, want %.3f", lat, got, want[i])
		}
	}
	// Half a year later the seasonal term changes sign: the poles swap.
	half := z.T0 + 365.25/2
	if n, s := z.Reflectance(math.Pi/2, 0, half), z.Reflectance(-math.Pi/2, 0, half); math.Abs(n-0.53) > 1e-12 || math.Abs(s-0.73) > 1e-12 {
		t.Errorf("half a year on: north %g south %g, want 0.53, 0.73", n, s)
	}
}

// The area mean of the zonal model is a0 = 0.34 (P₁, P₂ integrate to zero over
// the sphere, closed form). A spacecraft far away (disc nearly a hemisphere)
// with the sun overhead an equatorial point is not area-mean weighted, so the
// check is instead: a zonal model with A1 = A2 = 0 equals Uniform{A0} exactly.
func TestZonalReducesToUniform(t *testing.T) {
	mz, _ := New(Config{Reflectance: Zonal{A0: 0.3}})
	mu, _ := New(Config{})
	s := faceSensors()
	a, b := make([]Result, 6), make([]Result, 6)
	rSat := r3.Vec{X: -2000, Y: 5000, Z: 4200}
	sun := r3.Unit(r3.Vec{X: -0.3, Y: 1, Z: 0.4})
	mz.Irradiance(a, rSat, sun, AUKm, 0, 2461000, s)
	mu.Irradiance(b, rSat, sun, AUKm, 0, 2461000, s)
	for i := range s {
		if math.Abs(a[i].Irradiance-b[i].Irradiance) > 1e-12*b[i].Irradiance+1e-15 {
			t.Errorf("sensor %d: zonal %g uniform %g", i, a[i].Irradiance, b[i].Irradiance)
		}
	}
}

// The zonal fast path (cell mean of sin φ, from the pole in the cap frame)
// agrees with the generic path (latitude of the cell's normalised mean normal
// in EME2000, via the interface). The two differ only by how a cell's
// latitude is represented, well inside the 0.5 % budget.
type viaInterface struct{ z Zonal }

func (v viaInterface) Reflectance(lat, lon, jd float64) float64 { return v.z.Reflectance(lat, lon, jd) }

func TestZonalFastPathMatchesGeneric(t *testing.T) {
	mz, _ := New(Config{Reflectance: KnockeZonal()})
	mg, _ := New(Config{Reflectance: viaInterface{KnockeZonal()}})
	s := faceSensors()
	a, b := make([]Result, 6), make([]Result, 6)
	for k := range 20 {
		x := float64(k)
		rSat := r3.Scale(EarthRadiusKm+600, r3.Unit(r3.Vec{X: math.Cos(x), Y: math.Sin(x), Z: math.Sin(2 * x)}))
		sun := r3.Unit(r3.Vec{X: 1, Y: 0.3 * x, Z: 0.1})
		mz.Irradiance(a, rSat, sun, AUKm, 0.4*x, 2461000+10*x, s)
		mg.Irradiance(b, rSat, sun, AUKm, 0.4*x, 2461000+10*x, s)
		for i := range s {
			if math.Abs(a[i].Irradiance-b[i].Irradiance) > 5e-4*b[i].Irradiance+0.01 { // 0.01 W/m² floor for limb slivers
				t.Errorf("case %d sensor %d: fast %g generic %g", k, i, a[i].Irradiance, b[i].Irradiance)
			}
		}
	}
}

// A table response equal to cos θ gives the cosine result (closed form);
// a response that rolls off at grazing incidence gives less.
func TestTableResponse(t *testing.T) {
	var θs, cosθ, rolled []float64
	for deg := 0.0; deg <= 90; deg += 1 {
		θ := deg * math.Pi / 180
		θs = append(θs, θ)
		cosθ = append(cosθ, math.Cos(θ))
		rolled = append(rolled, math.Cos(θ)*math.Max(0, 1-math.Pow(θ/(math.Pi/2), 4)))
	}
	rc, err := NewTableResponse(θs, cosθ)
	if err != nil {
		t.Fatal(err)
	}
	rr, _ := NewTableResponse(θs, rolled)
	m, _ := New(Config{})
	n := r3.Unit(r3.Vec{X: -1, Y: 0.5})
	s := []Sensor{{Normal: n, HalfAngle: math.Pi / 2}, {Normal: n, HalfAngle: math.Pi / 2, Response: rc}, {Normal: n, HalfAngle: math.Pi / 2, Response: rr}}
	dst := make([]Result, 3)
	m.Irradiance(dst, r3.Vec{X: EarthRadiusKm + 500}, r3.Vec{X: 1}, AUKm, 0, 0, s)
	if e := math.Abs(dst[1].Irradiance/dst[0].Irradiance - 1); e > 2e-3 {
		t.Errorf("cos table vs cosine: rel %g", e)
	}
	if !(dst[2].Irradiance < dst[1].Irradiance) {
		t.Errorf("roll-off %g not below cosine %g", dst[2].Irradiance, dst[1].Irradiance)
	}
	if _, err := NewTableResponse([]float64{0, 0}, []float64{1, 1}); err == nil {
		t.Error("non-increasing table accepted")
	}
}

// Example: a nadir-facing coarse sun sensor at 550 km with the sun 30° from the
// zenith gets about a fifth of the direct solar irradiance from the Earth; the
// sunlit Earth fills 61 % of its hemispherical field of view.
func ExampleModel_Irradiance() {
	m, err := New(Config{}) // uniform albedo 0.30, default resolution
	if err != nil {
		panic(err)
	}
	rSat := r3.Vec{Z: EarthRadiusKm + 550}
	sun := r3.Vec{X: 0.5, Z: math.Sqrt(3) / 2}
	sensors := []Sensor{{Normal: r3.Vec{Z: -1}, HalfAngle: math.Pi / 2}}
	dst := make([]Result, 1)
	m.Irradiance(dst, rSat, sun, AUKm, 0, 2451545, sensors)
	fmt.Printf("albedo %.0f W/m² (%.2f of S), fill %.2f\n", dst[0].Irradiance, dst[0].Irradiance/SolarIrradiance1AU, dst[0].Fill)
	// Output: albedo 298 W/m² (0.22 of S), fill 0.61
}

// Example: the plate-to-sphere view factor of a nadir plate at 550 km is (Rₑ/r)².
func ExampleModel_ViewFactor() {
	m, _ := New(Config{})
	r := EarthRadiusKm + 550
	fmt.Printf("F = %.4f, (Re/r)^2 = %.4f\n", m.ViewFactor(r3.Vec{Z: r}, r3.Vec{Z: -1}, math.Pi/2), (EarthRadiusKm/r)*(EarthRadiusKm/r))
	// Output: F = 0.8475, (Re/r)^2 = 0.8475
}
