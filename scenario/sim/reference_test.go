package sim

import (
	"context"
	"encoding/json"
	"math"
	"os"
	"testing"

	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// benchRef is the part of bench/reference.py's output the test compares.
type benchRef struct {
	Sunlit   float64            `json:"sunlit_fraction"`
	Penumbra float64            `json:"penumbra_fraction"`
	Umbra    float64            `json:"umbra_fraction"`
	Seen1    float64            `json:"seen_by_at_least_1"`
	Seen2    float64            `json:"seen_by_at_least_2"`
	Seen3    float64            `json:"seen_by_at_least_3"`
	InView   map[string]float64 `json:"sensor_in_view_fraction"`
	ErrNo    benchErr           `json:"sun_error_deg_no_albedo"`
	ErrAlb   benchErr           `json:"sun_error_deg_albedo"`
}

type benchErr struct {
	Mean, RMS, P50, P95, P99, Max float64
}

// The reference case run through sunsight agrees with the independent,
// vectorised numpy computation of bench/reference.py (same published
// physics, written separately: AA low-precision sun with IAU 1976
// precession, secular-J2 orbit, conical shadow, LVLH attitude, Lambertian
// albedo on a 7200-cell cap). Coverage and sunlit fractions must agree to
// 0.1 percentage point (one 10 s sample of a day is 0.012 pp).
func TestAgainstNumpyReference(t *testing.T) {
	defer func(n, w int) { albedoTableMinSteps, boresightMinWork = n, w }(albedoTableMinSteps, boresightMinWork)
	for _, c := range []struct {
		file   string
		albedo bool
		table  bool // albedo from a precomputed table
		bore   bool // the boresight table (any attitude) instead of the LVLH one
	}{{"../../bench/ref-1d.json", false, false, false}, {"../../bench/ref-1d-albedo.json", true, false, false},
		{"../../bench/ref-1d-albedo.json", true, true, false}, {"../../bench/ref-1d-albedo.json", true, true, true}} {
		albedoTableMinSteps, boresightMinWork = 1<<30, 1<<30
		if c.table && !c.bore {
			albedoTableMinSteps = 0
		}
		if c.bore {
			boresightMinWork = 0
		}
		b, err := os.ReadFile(c.file)
		if err != nil {
			t.Fatal(err)
		}
		var ref benchRef
		if err := json.Unmarshal(b, &ref); err != nil {
			t.Fatal(err)
		}
		res, err := Run(context.Background(), referenceCase(t, 1, c.albedo))
		if err != nil {
			t.Fatal(err)
		}
		if res.AlbedoTable != c.table {
			t.Fatalf("albedo table used: %v, want %v", res.AlbedoTable, c.table)
		}
		if c.bore && res.AlbedoTable && !res.albedoBoresight {
			t.Fatal("the LVLH table was used, want the boresight table")
		}
		u := res.Nominal
		const pp = 0.001
		near := func(name string, got, want, tol float64) {
			t.Helper()
			if math.Abs(got-want) > tol {
				t.Errorf("%s (albedo %v, table %v): sunsight %.6f, numpy %.6f (tolerance %g)", name, c.albedo, c.table, got, want, tol)
			}
		}
		near("sunlit fraction", u.SunlitFraction, ref.Sunlit, pp)
		near("penumbra fraction", u.PenumbraFraction, ref.Penumbra, pp)
		near("umbra fraction", u.UmbraFraction, ref.Umbra, pp)
		near("seen by >=1", u.SeenAtLeast[1], ref.Seen1, pp)
		near("seen by >=2", u.SeenAtLeast[2], ref.Seen2, pp)
		near("seen by >=3", u.SeenAtLeast[3], ref.Seen3, pp)
		for _, s := range u.Sensors {
			near("in view "+s.Name, s.InViewFraction, ref.InView[s.Name[len("css"):]], pp)
		}
		// Opposite-pair estimator errors: the quantiles are log-binned to
		// ±0.07 % and one sample may differ at the shadow boundary.
		e := u.Estimators[0]
		check := func(label string, got ErrorStats, want benchErr) {
			near(label+" mean", got.MeanDeg, want.Mean, 0.05)
			near(label+" rms", got.RMSDeg, want.RMS, 0.05)
			near(label+" p50", got.P50Deg, want.P50, 0.05)
			near(label+" p95", got.P95Deg, want.P95, 0.05)
			near(label+" p99", got.P99Deg, want.P99, 0.05)
			near(label+" max", got.MaxDeg, want.Max, 0.05)
		}
		check("error without albedo", e.ErrNoAlbedo, ref.ErrNo)
		if c.albedo {
			check("error with albedo", e.ErrAlbedo, ref.ErrAlb)
		}
	}
}

// Away from nadir pointing (a tumble: every attitude) the boresight albedo
// table gives the figures of the cell integral: error statistics within
// 0.05°, peak signals within 0.5 % of full sun, the same valid and false-sun
// fractions to 0.2 percentage point.
func TestBoresightTableRunMatchesIntegral(t *testing.T) {
	defer func(w int) { boresightMinWork = w }(boresightMinWork)
	var runs []*Result
	for _, w := range []int{1 << 30, 0} {
		boresightMinWork = w
		cfg := referenceCase(t, 0.5, true)
		cfg.Array = noisyFaceArray(t, 70)
		cfg.Law = attitude.NewTumble(3, 2*math.Pi/180)
		res, err := Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		if res.albedoBoresight != (w == 0) {
			t.Fatalf("boresight table used: %v, want %v", res.albedoBoresight, w == 0)
		}
		runs = append(runs, res)
	}
	a, b := runs[0].Nominal, runs[1].Nominal
	for i := range a.Sensors {
		if d := math.Abs(a.Sensors[i].PeakSignal - b.Sensors[i].PeakSignal); d > 0.005 {
			t.Errorf("%s peak: integral %.4f, table %.4f", a.Sensors[i].Name, a.Sensors[i].PeakSignal, b.Sensors[i].PeakSignal)
		}
	}
	for j := range a.Estimators {
		x, y := a.Estimators[j], b.Estimators[j]
		t.Logf("%s: albedo part p95 %.3f° (integral) / %.3f° (table), error p95 %.3f° / %.3f°", x.Name, x.AlbedoPart.P95Deg, y.AlbedoPart.P95Deg, x.ErrAlbedo.P95Deg, y.ErrAlbedo.P95Deg)
		for _, p := range [][2]float64{{x.ErrAlbedo.MeanDeg, y.ErrAlbedo.MeanDeg}, {x.ErrAlbedo.P95Deg, y.ErrAlbedo.P95Deg},
			{x.ErrAlbedo.P99Deg, y.ErrAlbedo.P99Deg}, {x.AlbedoPart.P95Deg, y.AlbedoPart.P95Deg}} {
			if math.Abs(p[0]-p[1]) > 0.05 {
				t.Errorf("%s: integral %.3f°, table %.3f°", x.Name, p[0], p[1])
			}
		}
		if math.Abs(x.ValidFraction-y.ValidFraction) > 0.002 || math.Abs(x.FalseSunFraction-y.FalseSunFraction) > 0.002 {
			t.Errorf("%s: valid %.4f / %.4f, false sun %.4f / %.4f", x.Name, x.ValidFraction, y.ValidFraction, x.FalseSunFraction, y.FalseSunFraction)
		}
	}
}
