package albedo

import (
	"math"
	"math/rand/v2"
	"testing"
	"time"

	"gonum.org/v1/gonum/spatial/r3"
)

// compareBoresight draws n random cases (radius in [r0, r1], spacecraft
// position, sun and boresight directions uniform on the sphere) and returns
// the worst differences between the table and the cell integral with the
// same cells, the peak being the largest integral of the sample.
func compareBoresight(t *testing.T, tab *BoresightTable, m *Model, r0, r1 float64, n int, seed uint64) errStats {
	t.Helper()
	rng := rand.New(rand.NewPCG(seed, 11))
	type sample struct{ got, want Result }
	samples := make([]sample, 0, n)
	var peak float64
	want := make([]Result, 1)
	var f SunFrame
	for range n {
		rSat := r3.Scale(r0+(r1-r0)*rng.Float64(), randUnit(rng))
		sun, bore := randUnit(rng), randUnit(rng)
		if !tab.Frame(&f, rSat, sun, AUKm) {
			t.Fatalf("radius %g km not covered by %v", math.Sqrt(r3.Norm2(rSat)), tab.RadiiKm())
		}
		m.Irradiance(want, rSat, sun, AUKm, 0, 2451545, []Sensor{{Normal: bore, HalfAngle: tab.HalfAngle()}})
		samples = append(samples, sample{tab.At(&f, bore), want[0]})
		peak = max(peak, want[0].Irradiance)
	}
	var st errStats
	for _, s := range samples {
		g, w := s.got, s.want
		g.Fill, w.Fill = 0, 0 // the boresight table keeps no fill fraction
		st.add(g, w, peak)
	}
	return st
}

// The boresight table agrees with the cell integral it samples, for any
// attitude, at radii between its nodes 25 km apart (and within the slack
// beyond them), for cones of 90° and 30°, at the default steps. Measured
// worst cases over 4000 random cases each: 90° at 400 km |ΔE| ≤ 3.5e-4 of
// the peak, direction ≤ 0.43° where E ≥ 1 % of the peak; 30° at 700 km
// |ΔE| ≤ 3.6e-3 of the peak, direction ≤ 0.6°; the bounds are those
// rounded up.
func TestBoresightTableMatchesIntegral(t *testing.T) {
	if testing.Short() {
		t.Skip("builds four tables")
	}
	for _, tc := range []struct {
		halfDeg float64
		r0, r1  float64
	}{
		{90, EarthRadiusKm + 400, EarthRadiusKm + 425},
		{30, EarthRadiusKm + 700, EarthRadiusKm + 725},
	} {
		m, err := New(Config{})
		if err != nil {
			t.Fatal(err)
		}
		start := time.Now()
		tab, err := NewBoresightTable(m, []float64{tc.r0, tc.r1}, tc.halfDeg*math.Pi/180, Response{}, DefaultBoresightSunResDeg, DefaultBoresightStepDeg)
		if err != nil {
			t.Fatal(err)
		}
		build := time.Since(start)
		st := compareBoresight(t, tab, m, tc.r0-BoresightSlackKm, tc.r1+BoresightSlackKm, 4000, uint64(tc.halfDeg))
		t.Logf("%g° cone, r %g…%g km (built in %v): %v", tc.halfDeg, tc.r0, tc.r1, build.Round(time.Millisecond), st)
		if st.absFrac > 5e-3 {
			t.Errorf("%g°: |ΔE| up to %.2e of the peak, want ≤ 5e-3", tc.halfDeg, st.absFrac)
		}
		if st.dir > 1*math.Pi/180 {
			t.Errorf("%g°: direction off by up to %.2f° where E ≥ 1 %% of peak, want ≤ 1°", tc.halfDeg, st.dir*180/math.Pi)
		}
	}
}

// Bad arguments are refused with the field named.
func TestBoresightTableRefusesBadInput(t *testing.T) {
	m, _ := New(Config{})
	z, _ := New(Config{Reflectance: Zonal{A0: 0.9, A2: 0.5}}) // clamped at 1 toward the poles: no table
	r := EarthRadiusKm + 500
	for _, tc := range []struct {
		m     *Model
		radii []float64
		half  float64
	}{
		{nil, []float64{r}, 1},
		{z, []float64{r}, 1},
		{m, nil, 1},
		{m, []float64{r, r}, 1},
		{m, []float64{EarthRadiusKm}, 1},
		{m, []float64{r}, 2},
	} {
		if _, err := NewBoresightTable(tc.m, tc.radii, tc.half, Response{}, 1, 3); err == nil {
			t.Errorf("%v %v %v: no error", tc.m != nil, tc.radii, tc.half)
		}
	}
}

// Every node of a boresight table holds the cell integral of its own
// geometry (closed form of the construction: spacecraft on −Z, sun in the
// x–z plane at the node's polar angle, boresight at the node's angles), to
// float32 rounding: the build may reorder the work but not change the sum.
func TestBoresightTableNodesAreTheIntegral(t *testing.T) {
	for _, tc := range []struct {
		halfDeg float64
		resp    Response
	}{{60, Response{}}, {80, rolloff(t)}} {
		m, err := New(Config{Cells: 500})
		if err != nil {
			t.Fatal(err)
		}
		radii := []float64{EarthRadiusKm + 500, EarthRadiusKm + 520}
		tab, err := NewBoresightTable(m, radii, tc.halfDeg*math.Pi/180, tc.resp, 6, 6)
		if err != nil {
			t.Fatal(err)
		}
		rng := rand.New(rand.NewPCG(3, uint64(tc.halfDeg)))
		want := make([]Result, 1)
		checked := 0
		for range 300 {
			r, i := rng.IntN(len(radii)), rng.IntN(tab.polar.n+1)
			jθ, jφ := rng.IntN(tab.nθn), rng.IntN(tab.nφ)
			sθ, cθ := math.Sincos(tab.polar.angle(i))
			bθ, bc := math.Sincos(float64(jθ) * tab.hb)
			pφ, cφ := math.Sincos(float64(jφ) * tab.hb)
			sn := Sensor{Normal: r3.Vec{X: bθ * cφ, Y: bθ * pφ, Z: bc}, HalfAngle: tc.halfDeg * math.Pi / 180, Response: tc.resp}
			mr, err := New(Config{Cells: 500, AltitudeKm: radii[r] - EarthRadiusKm})
			if err != nil {
				t.Fatal(err)
			}
			mr.Irradiance(want, r3.Vec{Z: -radii[r]}, r3.Vec{X: sθ, Z: cθ}, AUKm, 0, 0, []Sensor{sn})
			if cθ >= tab.darkZ[r] {
				want[0] = Result{}
			}
			w := want[0]
			v := tab.vals[r*tab.per+((i*tab.nθn+jθ)*tab.nφ+jφ)*boresightVals:][:boresightVals]
			exp := [boresightVals]float32{float32(w.Irradiance), float32(w.Irradiance * w.Dir.X), float32(w.Irradiance * w.Dir.Y), float32(w.Irradiance * w.Dir.Z)}
			for c := range exp {
				if d := math.Abs(float64(v[c] - exp[c])); d > 1e-6*math.Abs(float64(exp[c]))+1e-9 {
					t.Fatalf("%g° cone, radius %d, sun row %d, node (%d, %d), value %d: table %g, integral %g", tc.halfDeg, r, i, jθ, jφ, c, v[c], exp[c])
				}
			}
			if w.Irradiance > 0 {
				checked++
			}
		}
		if checked < 50 {
			t.Fatalf("%g° cone: only %d lit nodes checked", tc.halfDeg, checked)
		}
	}
}

// rolloff is a response that falls faster than the cosine toward grazing
// incidence (invented, for tests of the non-cosine path).
func rolloff(t *testing.T) Response {
	t.Helper()
	r, err := NewTableResponse([]float64{0, 0.7, 1.2, math.Pi / 2}, []float64{1, 0.7, 0.2, 0})
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// BoresightTableBytes is what NewBoresightTable allocates for its values,
// uniform and zonal, one radius and three (closed form: the same grid).
func TestBoresightTableBytes(t *testing.T) {
	const deg = math.Pi / 180
	u, _ := New(Config{Cells: 200})
	z, _ := New(Config{Cells: 200, Reflectance: Zonal{A0: 0.3, A2: 0.1}})
	r := EarthRadiusKm + 550
	for _, c := range []struct {
		m     *Model
		zonal bool
		radii []float64
		half  float64
	}{{u, false, []float64{r}, 60 * deg}, {u, false, []float64{r, r + 5, r + 10}, 30 * deg}, {z, true, []float64{r}, 60 * deg}} {
		tab, err := NewBoresightTable(c.m, c.radii, c.half, Response{}, 9, 9)
		if err != nil {
			t.Fatal(err)
		}
		if got, want := BoresightTableBytes(len(c.radii), c.radii[0], c.half, c.zonal, 9, 9), tab.Bytes(); got != want || want == 0 {
			t.Errorf("zonal %v, %d radii: estimate %d bytes, table %d", c.zonal, len(c.radii), got, want)
		}
	}
	t.Logf("default grid, 550 km, 60° cone: uniform %.1f MB, zonal %.1f MB per radius",
		float64(BoresightTableBytes(1, r, 60*deg, false, DefaultBoresightSunResDeg, DefaultBoresightStepDeg))/1e6,
		float64(BoresightTableBytes(1, r, 60*deg, true, DefaultBoresightSunResDeg, DefaultBoresightStepDeg))/1e6)
}
