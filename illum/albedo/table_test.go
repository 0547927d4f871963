package albedo

import (
	"fmt"
	"math"
	"math/rand/v2"

	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// localFaceSensors returns six hemispherical cosine sensors on the faces of a
// cube whose axes are those of the local frame (+Z to nadir).
func localFaceSensors() []Sensor { return faceSensors() }

// localFrame is a local frame at the spacecraft position rSat: ez to nadir,
// ex the unit projection of hint on the horizontal plane, ey = ez × ex.
type localFrame struct{ ex, ey, ez r3.Vec }

func newLocalFrame(rSat, hint r3.Vec) localFrame {
	ez := r3.Scale(-1, vecmath.Unit(rSat))
	ex := vecmath.Unit(r3.Sub(hint, r3.Scale(r3.Dot(hint, ez), ez)))
	return localFrame{ex, r3.Cross(ez, ex), ez}
}

func (f localFrame) toECI(l r3.Vec) r3.Vec {
	return r3.Add(r3.Add(r3.Scale(l.X, f.ex), r3.Scale(l.Y, f.ey)), r3.Scale(l.Z, f.ez))
}

func (f localFrame) toLocal(v r3.Vec) r3.Vec {
	return r3.Vec{X: r3.Dot(v, f.ex), Y: r3.Dot(v, f.ey), Z: r3.Dot(v, f.ez)}
}

// randUnit returns a direction uniform on the sphere.
func randUnit(rng *rand.Rand) r3.Vec {
	z := 2*rng.Float64() - 1
	φ := 2 * math.Pi * rng.Float64()
	s := math.Sqrt(1 - z*z)
	return r3.Vec{X: s * math.Cos(φ), Y: s * math.Sin(φ), Z: z}
}

// errStats are the worst differences between a LocalTable and the cell
// integral over a set of sun directions.
type errStats struct {
	absFrac float64 // worst |ΔE| / (largest E of that sensor)
	abs     float64 // worst |ΔE|, W/m²
	rel     float64 // worst |ΔE|/E where E ≥ 1 % of the sensor's largest value
	dir     float64 // worst angle between the mean directions where E ≥ 1 % of the largest, rad
	dirAny  float64 // the same wherever both E > 0, rad
	dirAnyE float64 // the integral's E at that worst case, W/m²
	fill    float64 // worst |ΔFill|
}

func (s *errStats) add(g, w Result, peak float64) {
	e := math.Abs(g.Irradiance - w.Irradiance)
	s.abs = max(s.abs, e)
	s.absFrac = max(s.absFrac, e/peak)
	s.fill = max(s.fill, math.Abs(g.Fill-w.Fill))
	if g.Irradiance > 0 && w.Irradiance > 0 {
		a := math.Acos(min(1, r3.Dot(g.Dir, w.Dir)))
		if a > s.dirAny {
			s.dirAny, s.dirAnyE = a, w.Irradiance
		}
		if w.Irradiance >= 0.01*peak {
			s.rel = max(s.rel, e/w.Irradiance)
			s.dir = max(s.dir, a)
		}
	}
}

func (s errStats) String() string {
	return fmt.Sprintf("|ΔE| ≤ %.2e of peak (%.3f W/m²), rel ≤ %.2e and dir ≤ %.3f° where E ≥ 1 %% of peak, dir ≤ %.2f° wherever E > 0 (there E = %.2g W/m²), |ΔFill| ≤ %.1e",
		s.absFrac, s.abs, s.rel, s.dir*180/math.Pi, s.dirAny*180/math.Pi, s.dirAnyE, s.fill)
}

// tableStats splits the errors by where the sun is.
type tableStats struct {
	all   errStats
	limb  errStats // sun within 15° of the dark limit, lit side: the terminator crosses the limb
	under errStats // sun 80°…100° from nadir: the terminator passes under the spacecraft
	// darkNonZero counts non-zero table results with the sun beyond the dark
	// limit or on a face whose field of view never meets the Earth.
	darkNonZero int
}

// compareTable draws n random sun directions and compares the table with
// Model.Irradiance run in EME2000 at a random spacecraft position, with the
// local frame's x axis at a random azimuth: the table must not depend on the
// orientation of the cells or of the local x/y axes. The peak of each sensor
// is its largest integral over the sample.
func compareTable(tab *LocalTable, m *Model, sensors []Sensor, n int, seed uint64) tableStats {
	rng := rand.New(rand.NewPCG(seed, 7))
	ns := len(sensors)
	type sample struct {
		got, want []Result
		θ         float64 // sun polar angle from nadir, rad
	}
	samples := make([]sample, n)
	eci := make([]Sensor, ns)
	peak := make([]float64, ns)
	for k := range samples {
		rSat := r3.Scale(tab.RadiusKm(), randUnit(rng))
		f := newLocalFrame(rSat, randUnit(rng))
		for i, s := range sensors {
			eci[i] = s
			eci[i].Normal = f.toECI(s.Normal)
		}
		sunL := randUnit(rng)
		got, want := make([]Result, ns), make([]Result, ns)
		tab.Irradiance(got, sunL, AUKm)
		m.Irradiance(want, rSat, f.toECI(sunL), AUKm, 0, 2451545, eci)
		for i := range want {
			if want[i].Irradiance > 0 {
				want[i].Dir = f.toLocal(want[i].Dir)
			}
			peak[i] = max(peak[i], want[i].Irradiance)
		}
		samples[k] = sample{got, want, math.Acos(sunL.Z)}
	}
	d := math.Pi / 180
	θDark := math.Acos(tab.darkZ) // 90° − λ
	var st tableStats
	for _, s := range samples {
		for i := range s.want {
			g, w := s.got[i], s.want[i]
			if peak[i] == 0 || s.θ <= θDark {
				if g != (Result{}) {
					st.darkNonZero++
				}
				continue
			}
			st.all.add(g, w, peak[i])
			if s.θ < θDark+15*d {
				st.limb.add(g, w, peak[i])
			}
			if s.θ > 80*d && s.θ < 100*d {
				st.under.add(g, w, peak[i])
			}
		}
	}
	return st
}

// The table against the cell integral it was built from: 10⁴ random sun
// directions, six face sensors, 400/550/800 km, default 1° grid.
// Requirement of the project (common practice, no source): within 0.5 % of
// the sensor's largest value, mean direction within 0.5°.
func TestLocalTableAgainstModel(t *testing.T) {
	sensors := localFaceSensors()
	for _, alt := range []float64{400, 550, 800} {
		m, err := New(Config{AltitudeKm: alt})
		if err != nil {
			t.Fatal(err)
		}
		tab, err := NewLocalTable(m, EarthRadiusKm+alt, sensors, DefaultTableResDeg)
		if err != nil {
			t.Fatal(err)
		}
		st := compareTable(tab, m, sensors, 10000, uint64(alt))
		t.Logf("%g km, all:   %v", alt, st.all)
		t.Logf("%g km, limb:  %v", alt, st.limb)
		t.Logf("%g km, under: %v", alt, st.under)
		if st.all.absFrac > 0.005 {
			t.Errorf("%g km: table off by %.2e of the peak", alt, st.all.absFrac)
		}
		if st.all.dir > 0.5*math.Pi/180 {
			t.Errorf("%g km: mean direction off by %.3f°", alt, st.all.dir*180/math.Pi)
		}
		if st.all.fill > 0.01 {
			t.Errorf("%g km: fill off by %.2e", alt, st.all.fill)
		}
		if st.darkNonZero > 0 {
			t.Errorf("%g km: %d non-zero results with the sun beyond the dark limit or on the zenith face", alt, st.darkNonZero)
		}
	}
}

// Sun below the horizon of every visible point (angle from zenith ≥ 90° + λ,
// cos λ = Rₑ/r, closed form): the table gives exact zeros, as the integral.
func TestLocalTableDark(t *testing.T) {
	sensors := localFaceSensors()
	m, _ := New(Config{})
	r := EarthRadiusKm + 550
	tab, err := NewLocalTable(m, r, sensors, 2)
	if err != nil {
		t.Fatal(err)
	}
	λ := math.Acos(EarthRadiusKm / r)
	dst := make([]Result, len(sensors))
	want := make([]Result, len(sensors))
	for k := range 200 {
		// Polar angle from nadir in [0, 90° − λ], any azimuth.
		θ := (90*math.Pi/180 - λ) * float64(k) / 199
		φ := 0.77 * float64(k)
		sun := r3.Vec{X: math.Sin(θ) * math.Cos(φ), Y: math.Sin(θ) * math.Sin(φ), Z: math.Cos(θ)}
		tab.Irradiance(dst, sun, AUKm)
		m.Irradiance(want, r3.Vec{Z: -r}, sun, AUKm, 0, 0, sensors)
		for i := range dst {
			if dst[i] != (Result{}) || want[i] != (Result{}) {
				t.Fatalf("θ = %.3f°, sensor %d: table %+v, integral %+v, want zero", θ*180/math.Pi, i, dst[i], want[i])
			}
		}
	}
	// 10° inside the lit side the nadir face sees light, as the integral
	// does (its outermost cells' mean normals lie ≈ 7° inside the limb at the
	// default resolution, so the integral itself stays dark for the first ≈ 7°).
	θ := 90*math.Pi/180 - λ + 10*math.Pi/180
	sun := r3.Vec{X: math.Sin(θ), Z: math.Cos(θ)}
	tab.Irradiance(dst, sun, AUKm)
	m.Irradiance(want, r3.Vec{Z: -r}, sun, AUKm, 0, 0, sensors)
	if !(dst[4].Irradiance > 0) || math.Abs(dst[4].Irradiance-want[4].Irradiance) > 0.05 {
		t.Errorf("10° inside the lit side: nadir face %+v, integral %+v", dst[4], want[4])
	}
}

// Inverse-square law: E ∝ (AU/d)², Dir and Fill unchanged (closed form), for
// the table and against the integral at the same distance.
func TestLocalTableDistanceScaling(t *testing.T) {
	sensors := localFaceSensors()
	m, _ := New(Config{})
	r := EarthRadiusKm + 550
	tab, err := NewLocalTable(m, r, sensors, 2)
	if err != nil {
		t.Fatal(err)
	}
	sun := r3.Unit(r3.Vec{X: 0.3, Y: -0.5, Z: -0.8})
	at1 := make([]Result, 6)
	tab.Irradiance(at1, sun, AUKm)
	for _, d := range []float64{0.9833 * AUKm, 1.0167 * AUKm} { // perihelion, aphelion (from memory)
		got := make([]Result, 6)
		tab.Irradiance(got, sun, d)
		want := make([]Result, 6)
		m.Irradiance(want, r3.Vec{Z: -r}, sun, d, 0, 0, sensors)
		q := AUKm / d
		for i := range got {
			if math.Abs(got[i].Irradiance-at1[i].Irradiance*q*q) > 1e-12*at1[i].Irradiance {
				t.Errorf("d = %.4f AU, sensor %d: E %g, want %g", d/AUKm, i, got[i].Irradiance, at1[i].Irradiance*q*q)
			}
			if got[i].Dir != at1[i].Dir || got[i].Fill != at1[i].Fill {
				t.Errorf("d = %.4f AU, sensor %d: dir or fill changed with distance", d/AUKm, i)
			}
			if e := math.Abs(got[i].Irradiance - want[i].Irradiance); e > 0.005*want[4].Irradiance {
				t.Errorf("d = %.4f AU, sensor %d: table %g, integral %g", d/AUKm, i, got[i].Irradiance, want[i].Irradiance)
			}
		}
	}
}

// The table against the independent numpy brute force of
// testdata/albedo_ref.csv (gen_albedo_ref.py): the reference sensors, with
// the local x axis turned by 17.3° so that the sun falls between grid nodes.
// Tolerances are those of TestIrradianceAgainstReference plus the table's own
// 0.5 %-of-peak allowance.
func TestLocalTableAgainstReference(t *testing.T) {
	cases := readReference(t)
	d := math.Pi / 180
	turn := 17.3 * d
	rot := func(v r3.Vec) r3.Vec { // local frame of the reference (z up) → table frame (z down), turned
		s, c := math.Sincos(turn)
		x, y := c*v.X+s*v.Y, -s*v.X+c*v.Y
		return r3.Vec{X: x, Y: -y, Z: -v.Z}
	}
	for _, alt := range []float64{400, 550, 800} {
		var sensors []Sensor
		var idx []int
		for _, c := range cases {
			if c.altKm != alt {
				continue
			}
			_, _, s := c.geometry()
			s.Normal = rot(s.Normal)
			found := -1
			for i, o := range sensors {
				if o == s {
					found = i
				}
			}
			if found < 0 {
				found = len(sensors)
				sensors = append(sensors, s)
			}
			idx = append(idx, found)
		}
		m, _ := New(Config{})
		tab, err := NewLocalTable(m, EarthRadiusKm+alt, sensors, 2.5)
		if err != nil {
			t.Fatal(err)
		}
		dst := make([]Result, len(sensors))
		k := 0
		var worstRel, worstAbs, worstDir float64
		for _, c := range cases {
			if c.altKm != alt {
				continue
			}
			_, sun, _ := c.geometry()
			tab.Irradiance(dst, rot(sun), AUKm)
			got := dst[idx[k]]
			k++
			e := math.Abs(got.Irradiance - c.irradiance)
			// The model's tolerances against this reference (relative, W/m²
			// below the floor, direction) plus the table's: 0.5 % relative,
			// 0.05 W/m², 0.25° (TestLocalTableAgainstModel, measured).
			relTol, absTol, dirTol := 0.005+0.005, 0.1+0.05, (0.15+0.25)*d
			if c.half == 60 {
				relTol, absTol, dirTol = 0.01+0.005, 0.3+0.05, (0.35+0.25)*d
			}
			if c.irradiance >= refFloor {
				worstRel = max(worstRel, e/c.irradiance)
				dir := math.Acos(min(1, r3.Dot(got.Dir, rot(c.dir))))
				worstDir = max(worstDir, dir)
				if e > relTol*c.irradiance || dir > dirTol {
					t.Errorf("%g km, zenith %g°, tilt %g°, az %g°, half %g°: E %g, ref %g; dir off %.3f°", alt, c.zenith, c.tilt, c.azimuth, c.half, got.Irradiance, c.irradiance, dir/d)
				}
			} else {
				worstAbs = max(worstAbs, e)
				if e > absTol {
					t.Errorf("%g km, zenith %g°, tilt %g°, az %g°, half %g°: E %g, ref %g", alt, c.zenith, c.tilt, c.azimuth, c.half, got.Irradiance, c.irradiance)
				}
			}
		}
		t.Logf("%g km, %d sensors, 2.5° grid: worst rel %.2e (E ≥ %.1f W/m²), worst abs %.3f W/m² below, worst dir %.3f°", alt, len(sensors), worstRel, refFloor, worstAbs, worstDir/d)
	}
}

func TestLocalTableErrors(t *testing.T) {
	good := localFaceSensors()
	m, _ := New(Config{})
	zonal, _ := New(Config{Reflectance: KnockeZonal()})
	r := EarthRadiusKm + 550
	bad := append([]Sensor(nil), good...)
	bad[2].HalfAngle = 2
	for _, tc := range []struct {
		name    string
		m       *Model
		r       float64
		s       []Sensor
		res     float64
		wantErr string
	}{
		{"nil model", nil, r, good, 1, "nil model"},
		{"zonal", zonal, r, good, 1, "uniform"},
		{"res 0", m, r, good, 0, "res_deg"},
		{"res negative", m, r, good, -1, "res_deg"},
		{"res 10.5", m, r, good, 10.5, "res_deg"},
		{"res NaN", m, r, good, math.NaN(), "res_deg"},
		{"radius inside", m, EarthRadiusKm, good, 1, "radius_km"},
		{"radius NaN", m, math.NaN(), good, 1, "radius_km"},
		{"no sensors", m, r, nil, 1, "no sensors"},
		{"bad sensor", m, r, bad, 1, "sensors[2].half_angle"},
	} {
		_, err := NewLocalTable(tc.m, tc.r, tc.s, tc.res)
		if err == nil || !strings.Contains(err.Error(), tc.wantErr) {
			t.Errorf("%s: error %v, want one mentioning %q", tc.name, err, tc.wantErr)
		}
	}
	if _, err := NewLocalTable(m, r, good, 10); err != nil {
		t.Errorf("res 10: %v", err)
	}
}

// Radius drift: the table is built for one radius. Against the integral at
// r + Δr (sun directions and sensors as in TestLocalTableAgainstModel), the
// error grows with |Δr| about as the view factor, ∝ 2Δr/r for a nadir plate
// (closed form, (Rₑ/r)²). Logged for doc.go; the check holds the 1 km case to
// the table's 0.5 %-of-peak budget.
func TestLocalTableRadiusDrift(t *testing.T) {
	sensors := localFaceSensors()
	r := EarthRadiusKm + 550
	m, _ := New(Config{AltitudeKm: 550})
	tab, err := NewLocalTable(m, r, sensors, DefaultTableResDeg)
	if err != nil {
		t.Fatal(err)
	}
	for _, dr := range []float64{1, -1, 5, -5, 10, -10} {
		mr, _ := New(Config{AltitudeKm: 550 + dr})
		drifted := *tab
		drifted.radiusKm = r + dr // the integral runs at r + Δr, the table is unchanged
		st := compareTable(&drifted, mr, sensors, 2000, 11)
		t.Logf("Δr = %+g km: %v", dr, st.all)
		if math.Abs(dr) <= 1 && st.all.absFrac > 0.005 {
			t.Errorf("Δr = %+g km: %.2e of peak", dr, st.all.absFrac)
		}
	}
}

// Every node of a local table holds the cell integral of its own geometry
// (closed form of the construction: spacecraft on −Z, the sun at the node's
// polar and azimuth angles in the local frame), to rounding: the build may
// reorder the work but not change the sum. Tilted sensors, a non-cosine
// response and a mounting plane are among the sensors.
func TestLocalTableNodesAreTheIntegral(t *testing.T) {
	rKm := EarthRadiusKm + 480
	m, err := New(Config{Cells: 600, AltitudeKm: 480})
	if err != nil {
		t.Fatal(err)
	}
	tilt := r3.Unit(r3.Vec{X: 1, Z: 1})
	sensors := []Sensor{
		{Normal: r3.Vec{Z: 1}, HalfAngle: 60 * math.Pi / 180},
		{Normal: r3.Vec{X: 1}, HalfAngle: 80 * math.Pi / 180, Response: rolloff(t)},
		{Normal: tilt, HalfAngle: 70 * math.Pi / 180, Plane: r3.Vec{X: 1}},
		{Normal: r3.Vec{Z: -1}, HalfAngle: 30 * math.Pi / 180}, // sees only sky
	}
	tab, err := NewLocalTable(m, rKm, sensors, 4)
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(8, 9))
	want := make([]Result, len(sensors))
	lit := 0
	for range 200 {
		i, j := rng.IntN(tab.polar.n+1), rng.IntN(tab.nφ)
		sθ, cθ := math.Sincos(tab.polar.angle(i))
		if i == 0 || i == tab.polar.n {
			j = 0 // the poles hold node 0's values at every azimuth
		}
		sφ, cφ := math.Sincos(float64(j) * tab.dφ)
		m.Irradiance(want, r3.Vec{Z: -rKm}, r3.Vec{X: sθ * cφ, Y: sθ * sφ, Z: cθ}, AUKm, 0, 0, sensors)
		for k, w := range want {
			if cθ >= tab.darkZ {
				w = Result{}
			}
			v := tab.vals[((i*tab.nφ+j)*len(sensors)+k)*tableVals:][:tableVals]
			exp := [tableVals]float64{w.Irradiance, w.Irradiance * w.Dir.X, w.Irradiance * w.Dir.Y, w.Irradiance * w.Dir.Z, w.Fill}
			for c := range exp {
				if d := math.Abs(v[c] - exp[c]); d > 1e-9*math.Abs(exp[c])+1e-12 {
					t.Fatalf("node (%d, %d), sensor %d, value %d: table %.17g, integral %.17g", i, j, k, c, v[c], exp[c])
				}
			}
			if w.Irradiance > 0 {
				lit++
			}
		}
	}
	t.Logf("%d lit sensor nodes checked", lit)
	if lit < 100 {
		t.Fatalf("only %d lit sensor nodes checked", lit)
	}
}
