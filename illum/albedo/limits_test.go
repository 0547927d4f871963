package albedo

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// Sun behind the Earth (spacecraft at local midnight): no visible point is
// lit, so every sensor gets 0 (closed form).
func TestSunBehindEarth(t *testing.T) {
	m, _ := New(Config{})
	s := faceSensors()
	dst := make([]Result, len(s))
	rSat := r3.Vec{X: EarthRadiusKm + 550}
	m.Irradiance(dst, rSat, r3.Vec{X: -1}, AUKm, 0, 2451545, s)
	for i, r := range dst {
		if r.Irradiance != 0 || r.Fill != 0 || r.Dir != (r3.Vec{}) {
			t.Errorf("sensor %d: %+v, want zero", i, r)
		}
	}
}

// A sensor facing zenith at 550 km with an 80° half-angle cannot see the
// Earth: the Earth's disc reaches only 90° − asin(Rₑ/r) ≈ 23.7° above nadir's
// horizon (closed form).
func TestZenithSensorSeesNothing(t *testing.T) {
	m, _ := New(Config{})
	rSat := r3.Vec{Y: EarthRadiusKm + 550}
	s := []Sensor{{Normal: r3.Vec{Y: 1}, HalfAngle: 80 * math.Pi / 180}}
	dst := make([]Result, 1)
	m.Irradiance(dst, rSat, r3.Vec{Y: 1}, AUKm, 0, 2451545, s)
	if dst[0].Irradiance != 0 || dst[0].Fill != 0 {
		t.Errorf("zenith sensor: %+v, want zero", dst[0])
	}
}

// Fill stays in [0, 1] and Dir is unit or zero over many geometries.
func TestFillAndDirRange(t *testing.T) {
	m, _ := New(Config{Reflectance: KnockeZonal()})
	var dst [1]Result
	for k := range 2000 {
		a := float64(k)
		rSat := r3.Scale(EarthRadiusKm+150+float64(k%7)*300, r3.Unit(r3.Vec{X: math.Sin(a), Y: math.Cos(1.3 * a), Z: math.Sin(0.7 * a)}))
		sun := r3.Unit(r3.Vec{X: math.Cos(0.37 * a), Y: math.Sin(0.37 * a), Z: 0.4 * math.Sin(0.11*a)})
		n := r3.Unit(r3.Vec{X: math.Sin(2.1 * a), Y: math.Cos(0.9 * a), Z: math.Cos(3.3 * a)})
		s := []Sensor{{Normal: n, HalfAngle: (5 + float64(k%86)) * math.Pi / 180}}
		m.Irradiance(dst[:], rSat, sun, AUKm, a, 2451545+a, s)
		r := dst[0]
		if !(r.Fill >= 0 && r.Fill <= 1) {
			t.Fatalf("case %d: fill %g outside [0, 1]", k, r.Fill)
		}
		if r.Irradiance < 0 || math.IsNaN(r.Irradiance) {
			t.Fatalf("case %d: irradiance %g", k, r.Irradiance)
		}
		if r.Irradiance > 0 && math.Abs(r3.Norm(r.Dir)-1) > 1e-12 {
			t.Fatalf("case %d: |dir| = %g", k, r3.Norm(r.Dir))
		}
		// Dir points at the Earth: below the local horizontal.
		if r.Irradiance > 0 && r3.Dot(r.Dir, rSat) >= 0 {
			t.Fatalf("case %d: dir %v points away from the Earth", k, r.Dir)
		}
	}
}

// S scales as (AU/d)² (closed form; Kopp & Lean 2011 value at 1 AU), and a
// nadir sensor under an overhead sun sees light arriving from nadir (symmetry).
func TestSunDistanceScaling(t *testing.T) {
	m, _ := New(Config{})
	var a, b [1]Result
	s := []Sensor{{Normal: r3.Vec{Z: -1}, HalfAngle: math.Pi / 2}}
	rSat := r3.Vec{Z: EarthRadiusKm + 550}
	m.Irradiance(a[:], rSat, r3.Vec{Z: 1}, AUKm, 0, 0, s)
	m.Irradiance(b[:], rSat, r3.Vec{Z: 1}, 0.983*AUKm, 0, 0, s)
	if e := math.Abs(b[0].Irradiance/a[0].Irradiance - 1/(0.983*0.983)); e > 1e-12 {
		t.Errorf("S ∝ 1/d²: ratio off by %g", e)
	}
	// Nadir sensor, sun overhead: Dir is nadir by symmetry.
	if e := r3.Norm(r3.Sub(a[0].Dir, r3.Vec{Z: -1})); e > 1e-9 {
		t.Errorf("dir %v, want nadir", a[0].Dir)
	}
}

// Altitude change: after a drift beyond RebuildKm the geometry follows; the
// view factor must track (Rₑ/r)² (closed form).
func TestRebuildOnAltitudeChange(t *testing.T) {
	m, _ := New(Config{AltitudeKm: 500})
	for _, h := range []float64{500, 500.5, 700, 1200, 400} {
		r := EarthRadiusKm + h
		got := m.ViewFactor(r3.Vec{X: r}, r3.Vec{X: -1}, math.Pi/2)
		want := (EarthRadiusKm / r) * (EarthRadiusKm / r)
		if e := math.Abs(got/want - 1); e > 2e-3 {
			t.Errorf("h=%g: F=%.6f want %.6f", h, got, want)
		}
	}
}

// Between rebuilds the geometry of the build radius is used. Measured here:
// the error after a drift just under DefaultRebuildKm, against a fresh build
// at the true radius (same resolution, so the discretisation cancels); doc.go
// quotes it. Sensors that see only the limb are hit hardest, as the disc's
// edge moves by dη = −tan η dr/r.
func TestDriftWithinRebuildTolerance(t *testing.T) {
	const drift = 0.99 * DefaultRebuildKm
	stale, _ := New(Config{AltitudeKm: 550})
	fresh, _ := New(Config{AltitudeKm: 550 + drift})
	s := faceSensors()
	a, b := make([]Result, 6), make([]Result, 6)
	r := EarthRadiusKm + 550 + drift
	rSat := r3.Scale(r, r3.Unit(r3.Vec{X: 1, Y: 1, Z: 0.3}))
	sun := r3.Unit(r3.Vec{X: 1, Y: 0.4, Z: 0.5})
	stale.Irradiance(a, rSat, sun, AUKm, 0, 0, s)
	fresh.Irradiance(b, rSat, sun, AUKm, 0, 0, s)
	worst := 0.0
	for i := range s {
		if b[i].Irradiance < refFloor {
			continue
		}
		worst = max(worst, math.Abs(a[i].Irradiance/b[i].Irradiance-1))
	}
	t.Logf("drift %.3f km without rebuild: worst relative change %.2e", drift, worst)
	if worst > 1e-3 {
		t.Errorf("stale geometry off by %.2e after %.2f km", worst, drift)
	}
}

func TestConfigErrors(t *testing.T) {
	for _, c := range []struct {
		cfg  Config
		want string
	}{
		{Config{Cells: 3}, "config.cells"},
		{Config{Reflectance: Uniform{Albedo: 1.5}}, "config.reflectance.albedo"},
		{Config{AltitudeKm: -3}, "config.altitude_km"},
		{Config{RebuildKm: -1}, "config.rebuild_km"},
		{Config{Reflectance: &Grid{}}, "config.reflectance"},
	} {
		_, err := New(c.cfg)
		if err == nil || !contains(err.Error(), c.want) {
			t.Errorf("%+v: error %v, want one naming %s", c.cfg, err, c.want)
		}
	}
	if err := (Sensor{Normal: r3.Vec{X: 2}, HalfAngle: 1}).Validate("sensors[0]"); err == nil || !contains(err.Error(), "sensors[0].normal") {
		t.Errorf("bad normal: %v", err)
	}
	if err := (Sensor{Normal: r3.Vec{X: 1}, HalfAngle: 2}).Validate("sensors[1]"); err == nil || !contains(err.Error(), "sensors[1].half_angle") {
		t.Errorf("bad half angle: %v", err)
	}
}

func contains(s, sub string) bool {
	for i := 0; i+len(sub) <= len(s); i++ {
		if s[i:i+len(sub)] == sub {
			return true
		}
	}
	return false
}
