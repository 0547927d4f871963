package albedo

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// compareZonal draws n random cases at radius rKm (spacecraft position,
// sun, boresight uniform on the sphere, a date within a year) and returns
// the worst differences between the zonal table and the cell integral of
// the same model, the peak being the largest integral of the sample.
func compareZonal(t *testing.T, tab *BoresightTable, m *Model, rKm float64, n int, seed uint64) errStats {
	t.Helper()
	rng := rand.New(rand.NewPCG(seed, 23))
	type sample struct{ got, want Result }
	samples := make([]sample, 0, n)
	var peak float64
	want := make([]Result, 1)
	var f SunFrame
	for range n {
		rSat := r3.Scale(rKm, randUnit(rng))
		sun, bore := randUnit(rng), randUnit(rng)
		jd := 2461000.5 + 365.25*rng.Float64()
		if !tab.Frame(&f, rSat, sun, AUKm) {
			t.Fatalf("radius %g km not covered by %v", rKm, tab.RadiiKm())
		}
		tab.Season(&f, jd)
		m.Irradiance(want, rSat, sun, AUKm, 0, jd, []Sensor{{Normal: bore, HalfAngle: tab.HalfAngle()}})
		samples = append(samples, sample{tab.At(&f, bore), want[0]})
		peak = max(peak, want[0].Irradiance)
	}
	var st errStats
	for _, s := range samples {
		g, w := s.got, s.want
		g.Fill, w.Fill = 0, 0
		st.add(g, w, peak)
	}
	return st
}

// A zonal boresight table (Knocke's profile) against the cell integral of
// Model.Irradiance with the same profile, at random positions, suns,
// boresights and dates: the worst error where E ≥ 1 % of the peak and the
// worst direction error there.
func TestZonalBoresightTableMatchesIntegral(t *testing.T) {
	if testing.Short() {
		t.Skip("builds three zonal tables")
	}
	for _, tc := range []struct {
		halfDeg, altKm float64
		rel, dirDeg    float64 // bounds: measured worst, rounded up
	}{
		{90, 400, 0.015, 0.5},
		{60, 550, 0.045, 0.5},
		{30, 700, 0.12, 0.7},
	} {
		m, err := New(Config{Reflectance: KnockeZonal(), AltitudeKm: tc.altKm})
		if err != nil {
			t.Fatal(err)
		}
		r := EarthRadiusKm + tc.altKm
		tab, err := NewBoresightTable(m, []float64{r}, tc.halfDeg*math.Pi/180, Response{}, DefaultBoresightSunResDeg, DefaultBoresightStepDeg)
		if err != nil {
			t.Fatal(err)
		}
		st := compareZonal(t, tab, m, r, 4000, uint64(tc.halfDeg))
		t.Logf("%g° cone, %g km: %v; %.0f MB", tc.halfDeg, tc.altKm, st, float64(len(tab.vals))*4/1e6)
		if st.rel > tc.rel || st.dir*180/math.Pi > tc.dirDeg {
			t.Errorf("%g° cone, %g km: rel %.3g (bound %g), dir %.3f° (bound %g°)", tc.halfDeg, tc.altKm, st.rel, tc.rel, st.dir*180/math.Pi, tc.dirDeg)
		}
	}
}

// Models of NewTableFactory read whole cones from the shared zonal table
// (the same numbers as the table itself) and integrate the rest (a sensor
// with a mounting plane, a step off the table's radius) as a plain model
// does; two models of one factory share one table per cone.
func TestTableFactory(t *testing.T) {
	cfg := Config{Reflectance: KnockeZonal(), AltitudeKm: 550}
	f, err := NewTableFactory(cfg)
	if err != nil {
		t.Fatal(err)
	}
	a, _ := f()
	b, _ := f()
	plain, _ := New(cfg)
	r := EarthRadiusKm + 550
	rng := rand.New(rand.NewPCG(8, 8))
	var tab *BoresightTable
	lit := 0
	for k := range 300 {
		rSat := r3.Scale(r, randUnit(rng))
		if k%10 == 0 {
			rSat = r3.Scale(r+5, randUnit(rng)) // off the table: integrated
		}
		sun, jd := randUnit(rng), 2461000.5+365*rng.Float64()
		n1, n2 := randUnit(rng), randUnit(rng)
		sensors := []Sensor{{Normal: n1, HalfAngle: math.Pi / 3}, {Normal: n2, HalfAngle: math.Pi / 3, Plane: n2}}
		got, again, want := make([]Result, 2), make([]Result, 2), make([]Result, 2)
		a.Irradiance(got, rSat, sun, AUKm, 0, jd, sensors)
		b.Irradiance(again, rSat, sun, AUKm, 0, jd, sensors)
		plain.Irradiance(want, rSat, sun, AUKm, 0, jd, sensors)
		if tab == nil && len(a.kinds) > 0 {
			tab = a.kinds[0].tab
		}
		if got[0] != again[0] || got[1] != again[1] {
			t.Fatalf("two models of one factory differ: %+v, %+v", got, again)
		}
		if got[1] != want[1] {
			t.Fatalf("sensor with a plane: %+v, integral %+v", got[1], want[1])
		}
		if k%10 == 0 {
			if got[0] != want[0] {
				t.Fatalf("off the table's radius: %+v, integral %+v", got[0], want[0])
			}
			continue
		}
		var fr SunFrame
		tab.Frame(&fr, rSat, sun, AUKm)
		tab.Season(&fr, jd)
		if w := tab.At(&fr, n1); got[0] != w {
			t.Fatalf("whole cone: %+v, table %+v", got[0], w)
		}
		if got[0].Irradiance > 0 {
			lit++
		}
	}
	if a.kinds[0].tab != b.kinds[0].tab || len(a.tabs.kinds) != 1 {
		t.Error("the models do not share one table")
	}
	if lit < 50 {
		t.Errorf("only %d lit cases", lit)
	}
	for _, bad := range []Config{{AltitudeKm: 550}, {Reflectance: KnockeZonal()}, {Reflectance: KnockeZonal().Scaled(2.5), AltitudeKm: 550}} {
		if _, err := NewTableFactory(bad); err == nil {
			t.Errorf("NewTableFactory(%+v): no error", bad)
		}
	}
}
