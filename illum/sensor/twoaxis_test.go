package sensor

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

func quad(t testing.TB, w, h, c, g float64, errs Errors) *Quadrant {
	t.Helper()
	m, err := FaceMount(FacePlusZ, 0, FaceNone, 0)
	if err != nil {
		t.Fatal(err)
	}
	q, err := NewQuadrant(QuadrantSpec{Name: "q", Mount: m, ApertureSide: w, Height: h, CellSide: c, Gap: g,
		Threshold: 1e-3, Sigma: 0.5 * deg, Errors: errs})
	if err != nil {
		t.Fatal(err)
	}
	return q
}

// sunAt gives the sensor-frame (= body, +Z mount) direction with per-axis
// angles ax, ay (tan αx = x/z, tan αy = y/z).
func sunAt(ax, ay float64) r3.Vec {
	return r3.Unit(r3.Vec{X: math.Tan(ax), Y: math.Tan(ay), Z: 1})
}

func TestQuadrantNormalIncidenceIsZero(t *testing.T) {
	q := quad(t, 2, 1, 2, 0.1, Errors{})
	r := q.Read(r3.Vec{Z: 1}, SolarConstant, Albedo{}, nil)
	if !r.Valid || r.Cells[0] != r.Cells[1] || r.Cells[1] != r.Cells[2] || r.Cells[2] != r.Cells[3] {
		t.Fatalf("reading %+v", r)
	}
	if angle(r.Dir, r3.Vec{Z: 1}) != 0 {
		t.Errorf("direction %v, want +Z", r.Dir)
	}
}

// Closed form: X = 2h·tan α/(w − g) while the spot straddles the gap and
// stays on the detector (2h·tan α/w with no gap). Example w = 2, h = 1,
// α = 20° → X = tan 20° = 0.36397 (own calculation).
func TestQuadrantTransferSlopeAndMonotonic(t *testing.T) {
	q := quad(t, 2, 1, 2, 0, Errors{})
	if x := q.Transfer(math.Tan(20 * deg)); math.Abs(x-0.36397023426620234) > 1e-12 {
		t.Errorf("X(20°) = %.8f, want tan 20° = 0.36397023", x)
	}
	for _, g := range []float64{0, 0.2} {
		q := quad(t, 2, 1, 2, g, Errors{})
		for _, ta := range []float64{1e-4, 0.1, 0.3} {
			if x, want := q.Transfer(ta), 2*1*ta/(2-g); math.Abs(x-want) > 1e-12 {
				t.Errorf("g=%g tan α=%g: X = %.12f, closed form %.12f", g, ta, x, want)
			}
		}
		// X never falls as α grows (the spot moves toward −x onto cells A
		// and D) over the FOV, and strictly rises in the linear range.
		prev := math.Inf(-1)
		lim := math.Atan(1 + 2 + g/2) // spot edge leaves the detector
		lin := math.Atan((2 - g) / 2) // spot stops straddling the gap
		for a := -lim + lim/1000; a < lim; a += lim / 500 {
			x := q.Transfer(math.Tan(a))
			if x < prev || (math.Abs(a) < lin && x <= prev) {
				t.Fatalf("g=%g: X went from %g to %g at %.3f°", g, prev, x, a/deg)
			}
			prev = x
		}
	}
}

// Round trip: inside the linear range the inverted angles equal the true ones.
func TestQuadrantInversion(t *testing.T) {
	q := quad(t, 2, 1, 2, 0.1, Errors{})
	worst := 0.0
	for ax := -40.0; ax <= 40; ax += 5 {
		for ay := -40.0; ay <= 40; ay += 5 {
			s := sunAt(ax*deg, ay*deg)
			r := q.Read(s, SolarConstant, Albedo{}, nil)
			if !r.Valid {
				t.Fatalf("(%g°, %g°) invalid: %+v", ax, ay, r)
			}
			worst = math.Max(worst, angle(r.Dir, s))
		}
	}
	if worst > 1e-9 {
		t.Errorf("worst inversion error %.3g rad", worst)
	}
	// Far outside: the spot lies on one column of cells: in the detection
	// range, not valid (no edge-of-range direction), not saturated (no cell
	// at full scale).
	r := q.Read(sunAt(60*deg, 0), SolarConstant, Albedo{}, nil)
	if r.Valid || r.Saturated || !q.InFOV(sunAt(60*deg, 0)) {
		t.Errorf("60°: %+v, want in FOV, not valid, not saturated", r)
	}
	if q.InFOV(sunAt(75*deg, 0)) {
		t.Error("75° (spot off the detector) reported in FOV")
	}
}

// Closed form: a spot (w = 0.2) narrower than the gap (0.5) lights no cell
// near the boresight, then falls wholly on one cell: no angle anywhere. Such
// a sensor can never give a valid reading, so it is refused (a file with
// it was accepted and printed "valid within ±0.0°"); so is a gap as wide as
// the cells under the default one-cell aperture.
func TestQuadrantInsensitiveZone(t *testing.T) {
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	for _, c := range []struct{ w, cell, gap float64 }{{0.2, 2, 0.5}, {2, 2, 2}} {
		_, err := NewQuadrant(QuadrantSpec{Name: "q", Mount: m, ApertureSide: c.w, Height: 1, CellSide: c.cell, Gap: c.gap, Threshold: 1e-3, Sigma: deg})
		if err == nil || !strings.Contains(err.Error(), "no reading can be valid") {
			t.Errorf("aperture %g over %g mm cells, gap %g: %v; want a refusal", c.w, c.cell, c.gap, err)
		}
	}
}

// Aperture offset o biases the angle by atan(o/h) at normal incidence (closed form).
func TestQuadrantApertureOffset(t *testing.T) {
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	q, err := NewQuadrant(QuadrantSpec{Name: "q", Mount: m, ApertureSide: 2, Height: 1, CellSide: 2, OffsetX: 0.05, Sigma: deg})
	if err != nil {
		t.Fatal(err)
	}
	r := q.Read(r3.Vec{Z: 1}, SolarConstant, Albedo{}, nil)
	if got, want := angle(r.Dir, r3.Vec{Z: 1}), math.Atan(0.05); math.Abs(got-want) > 1e-9 {
		t.Errorf("offset bias %.6f°, closed form %.6f°", got/deg, want/deg)
	}
}

func digital(t testing.TB, sigma float64, square bool) *Digital {
	t.Helper()
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	d, err := NewDigital(DigitalSpec{Name: "d", Mount: m, HalfAngle: 60 * deg, Square: square, Sigma: sigma,
		MinIrradiance: 100, AlbedoThreshold: 200})
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// Digital noise per axis must have the stated σ: 20000 readings, sample σ
// within 4 standard errors (σ/√(2n)).
func TestDigitalNoiseMatchesSigma(t *testing.T) {
	const sigma = 0.05 * deg
	d := digital(t, sigma, false)
	rng := rand.New(rand.NewPCG(11, 12))
	s := sunAt(10*deg, -20*deg)
	const n = 20000
	var sx, sy, sxx, syy float64
	for range n {
		r := d.Read(s, SolarConstant, Albedo{}, rng)
		ex := math.Atan(r.Dir.X/r.Dir.Z) - 10*deg
		ey := math.Atan(r.Dir.Y/r.Dir.Z) + 20*deg
		sx, sy, sxx, syy = sx+ex, sy+ey, sxx+ex*ex, syy+ey*ey
	}
	se := sigma / math.Sqrt(2*n)
	for i, v := range [][2]float64{{sx, sxx}, {sy, syy}} {
		m := v[0] / n
		sd := math.Sqrt(v[1]/n - m*m)
		t.Logf("axis %d: mean %.3g°, σ %.5f° (stated %.5f°)", i, m/deg, sd/deg, sigma/deg)
		if math.Abs(sd-sigma) > 4*se || math.Abs(m) > 4*sigma/math.Sqrt(n) {
			t.Errorf("axis %d: mean %.3g, σ %.4g, want 0 and %.4g", i, m, sd, sigma)
		}
	}
}

// Albedo below the threshold is ignored; above it pulls the centroid by the
// irradiance ratio (tangent plane), and alone it fakes a sun.
func TestDigitalAlbedo(t *testing.T) {
	d := digital(t, deg, true)
	sun, albDir := r3.Vec{Z: 1}, sunAt(30*deg, 0)
	if r := d.Read(sun, SolarConstant, Albedo{Irradiance: 150, Dir: albDir}, nil); angle(r.Dir, sun) != 0 {
		t.Errorf("albedo below threshold moved the sun: %v", r.Dir)
	}
	r := d.Read(sun, SolarConstant, Albedo{Irradiance: 300, Dir: albDir}, nil)
	want := math.Atan(300 * math.Tan(30*deg) / (SolarConstant + 300))
	if got := math.Atan(r.Dir.X / r.Dir.Z); math.Abs(got-want) > 1e-12 {
		t.Errorf("pull %.6f°, want %.6f°", got/deg, want/deg)
	}
	if r := d.Read(sun, 0, Albedo{Irradiance: 300, Dir: albDir}, nil); !r.Valid || angle(r.Dir, albDir) > 1e-12 {
		t.Errorf("eclipse with albedo: %+v, want a false sun at the albedo direction", r)
	}
	if !d.InFOV(sunAt(59*deg, 59*deg)) || d.InFOV(sunAt(61*deg, 0)) {
		t.Error("square FOV wrong")
	}
}

// Closed form: a spot (w = 3) wider than the detector (2c = 2) covers every
// cell while |h·tan α| ≤ 0.5, so X = 0 there (a dead zone: the reading says
// boresight); beyond it the bisection inverts the non-linear curve exactly.
func TestQuadrantDeadZoneAndNonLinearInversion(t *testing.T) {
	q := quad(t, 3, 1, 1, 0, Errors{})
	r := q.Read(sunAt(math.Atan(0.2), 0), SolarConstant, Albedo{}, nil)
	if !r.Valid || angle(r.Dir, r3.Vec{Z: 1}) != 0 {
		t.Errorf("dead zone: %+v, want boresight", r)
	}
	for _, ta := range []float64{0.7, 1.0, 1.4} {
		s := sunAt(math.Atan(ta), 0) // y stays in its own dead zone at 0
		r := q.Read(s, SolarConstant, Albedo{}, nil)
		if !r.Valid || angle(r.Dir, s) > 1e-9 {
			t.Errorf("tan α = %g: %+v, error %.3g rad", ta, r, angle(r.Dir, s))
		}
	}
}

// albedo_ignore_below sets the level of diffuse light the digital centroid
// ignores: 0.1 of full sun from 40° off the boresight leaves a sun on the
// boresight read exactly at the default 0.3, and pulls it toward the Earth
// at 0.05, by atan of the weighted mean tangent, 0.1·tan 40°/1.1 = 4.36°
// (closed form of the centroid model); alone, it is a false sun.
func TestDigitalAlbedoIgnoreLevel(t *testing.T) {
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	c := Common{Name: "d", Mount: m, HalfAngle: 60 * deg, Threshold: 0.05}
	p := Params{Num: map[string]float64{"accuracy_deg_1sigma": 0.1 * deg, "moon_blind_lit_fraction": 1, "lit_earth_blind_depth_deg": math.Pi,
		"albedo_ignore_below": 0.3}, Text: map[string]string{"fov_shape": "cone"}}
	alb := Albedo{Irradiance: 0.1 * SolarConstant, Dir: sunAt(40*deg, 0)}
	d, err := buildDigital(c, p)
	if err != nil {
		t.Fatal(err)
	}
	if r := d.Read(r3.Vec{Z: 1}, SolarConstant, alb, nil); angle(r.Dir, r3.Vec{Z: 1}) != 0 {
		t.Errorf("default level: albedo of 0.1 moved the reading by %g rad", angle(r.Dir, r3.Vec{Z: 1}))
	}
	p.Num["albedo_ignore_below"] = 0.05
	if d, err = buildDigital(c, p); err != nil {
		t.Fatal(err)
	}
	want := math.Atan(0.1 * math.Tan(40*deg) / 1.1)
	if r := d.Read(r3.Vec{Z: 1}, SolarConstant, alb, nil); math.Abs(angle(r.Dir, r3.Vec{Z: 1})-want) > 1e-12 {
		t.Errorf("level 0.05: pulled %.4f°, want %.4f°", angle(r.Dir, r3.Vec{Z: 1})/deg, want/deg)
	}
	if r := d.Read(r3.Vec{}, 0, alb, nil); !r.Valid {
		t.Error("level 0.05: albedo alone gave no false sun")
	}
}
