package sim

import (
	"context"
	"fmt"
	"math"
	"testing"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// referenceCase builds the bench reference case (bench/README.md): a 550 km
// 10:30 sun-synchronous orbit, nadir pointing, six face cosine sensors of 60°.
func referenceCase(t testing.TB, days float64, withAlbedo bool) Config {
	t.Helper()
	epoch := time.Date(2027, 1, 1, 0, 0, 0, 0, time.UTC)
	a := orbit.RadiusEarthKm + 550
	inc, err := orbit.SunSyncInclination(a, 0)
	if err != nil {
		t.Fatal(err)
	}
	el := orbit.Elements{SemiMajorAxisKm: a, Inclination: inc, RAAN: orbit.RAANFromLTAN(10.5, epoch)}
	arr := faceArray(t, 60)
	cfg := Config{
		Epoch: epoch, Duration: days * 86400, Step: 10,
		NewPropagator: func() orbit.Propagator { return orbit.NewJ2Mean(el) },
		Sun:           ephem.LowPrecision{},
		Law:           attitude.Nadir{},
		Array:         arr,
		Estimators:    []sensor.Estimator{sensor.OppositePairs{}, sensor.LeastSquares{}},
		Seed:          1, Units: 1,
	}
	if withAlbedo {
		cfg.NewAlbedo = func() (*albedo.Model, error) { return albedo.New(albedo.Config{AltitudeKm: 550}) }
	}
	return cfg
}

func TestReferenceCaseRuns(t *testing.T) {
	cfg := referenceCase(t, 1, true)
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	u := res.Nominal
	t.Logf("sunlit %.4f pen %.5f umb %.4f seen %.4f %.4f %.4f eclipses %d", u.SunlitFraction, u.PenumbraFraction, u.UmbraFraction, u.SeenAtLeast[1], u.SeenAtLeast[2], u.SeenAtLeast[3], len(res.Eclipses))
	for _, e := range u.Estimators {
		t.Logf("%s valid %.4f gap %.0f no %+v alb %+v part %+v false %.3f", e.Name, e.ValidFraction, e.LongestGapS, e.ErrNoAlbedo, e.ErrAlbedo, e.AlbedoPart, e.FalseSunFraction)
	}
	for _, s := range u.Sensors {
		t.Logf("%+v", s)
	}
}

// BenchmarkReferenceDay runs one day at 10 s of the bench reference case,
// without and with albedo.
func BenchmarkReferenceDay(b *testing.B) {
	for _, alb := range []bool{false, true} {
		name := "no-albedo"
		if alb {
			name = "albedo"
		}
		b.Run(name, func(b *testing.B) {
			cfg := referenceCase(b, 1, alb)
			for b.Loop() {
				if _, err := Run(context.Background(), cfg); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// Six face sensors of 90° cover the whole sphere, so in any attitude the sun
// is seen by at least one sensor all the sunlit time (closed form).
func TestFullSphereLayoutSeesSunAlways(t *testing.T) {
	for _, law := range []attitude.Law{attitude.NewTumble(7, 10*math.Pi/180), attitude.Isotropic{Seed: 3}, attitude.Nadir{}} {
		cfg := referenceCase(t, 0.3, false)
		cfg.Law = law
		cfg.Array = faceArray(t, 90)
		res, err := Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		if got := res.Nominal.SeenAtLeast[1]; got != 1 {
			t.Errorf("%T: seen by >=1 = %v, want 1", law, got)
		}
	}
}

// In sun-pointing mode the sun stays on the pointing axis (+Z by default).
func TestSunPointingKeepsSunOnAxis(t *testing.T) {
	cfg := referenceCase(t, 0.3, false)
	cfg.Law = attitude.Sun{}
	cfg.SeriesStride = 1
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	s := res.Nominal.Series
	worst := 0.0
	for i, el := range s.SunBodyEl {
		if s.Region[i] == illum.Sunlit {
			worst = math.Max(worst, 90-el)
		}
	}
	// Elevation comes from asin(z), which near the pole resolves only
	// √(2ε) ≈ 2e-8 rad (1.2e-6°).
	if worst > 1e-5 {
		t.Fatalf("sun up to %g° off the +Z axis", worst)
	}
}

func faceArray(t testing.TB, halfDeg float64) *sensor.Array {
	return faceArrayWith(t, halfDeg, sensor.Errors{})
}

// faceArrayWith is faceArray with the given error model on every sensor.
func faceArrayWith(t testing.TB, halfDeg float64, errs sensor.Errors) *sensor.Array {
	t.Helper()
	var ss []sensor.Sensor
	for _, f := range []string{"+X", "-X", "+Y", "-Y", "+Z", "-Z"} {
		face, _ := sensor.ParseFace(f)
		m, err := sensor.FaceMount(face, 0, sensor.FaceNone, 0)
		if err != nil {
			t.Fatal(err)
		}
		c, err := sensor.NewCosine(sensor.CosineSpec{Name: "css" + f, Mount: m, HalfAngle: halfDeg * math.Pi / 180, Threshold: 0.05, Errors: errs})
		if err != nil {
			t.Fatal(err)
		}
		ss = append(ss, c)
	}
	arr, err := sensor.NewArray(ss...)
	if err != nil {
		t.Fatal(err)
	}
	return arr
}

// A run long enough to be cut into several chunks gives identical results on
// one and two workers, with noise and Monte Carlo units.
func TestChunkedRunIndependentOfWorkers(t *testing.T) {
	var results []*Result
	for _, w := range []int{1, 2} {
		cfg := referenceCase(t, 5, false)
		cfg.Law = attitude.NewTumble(5, 5*math.Pi/180)
		cfg.Units = 2
		cfg.Workers = w
		res, err := Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		if res.Steps <= chunkSteps {
			t.Fatalf("%d steps: not chunked", res.Steps)
		}
		results = append(results, res)
	}
	// Printed with %v (NaN equals NaN there; reflect.DeepEqual would not).
	show := showUnits
	if a, b := show(results[0]), show(results[1]); a != b {
		t.Fatalf("results differ between 1 and 2 workers:\n%s\n%s", a, b)
	}
	if a, b := fmt.Sprint(results[0].Headline()), fmt.Sprint(results[1].Headline()); a != b {
		t.Fatalf("headlines differ: %s / %s", a, b)
	}
}

// A sensor whose view is blocked by the body reads no direct sunlight and
// no albedo from the blocked directions.
func TestObstructionCutsReadings(t *testing.T) {
	cfg := referenceCase(t, 0.2, true)
	cfg.Blocked = make([]*sky.Obstructed, cfg.Array.Len())
	cfg.Blocked[0] = &sky.Obstructed{Obstacles: []sky.Obstacle{blockEverything{}}} // css+X
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	if p := res.Nominal.Sensors[0].PeakSignal; p != 0 {
		t.Errorf("blocked sensor peak signal %g, want 0", p)
	}
	if p := res.Nominal.Sensors[1].PeakSignal; !(p > 0.5) {
		t.Errorf("unblocked sensor peak signal %g, want a lit reading", p)
	}
}

// noisyFaceArray is faceArray with realistic errors: misalignment, dark
// offset, gain mismatch, noise and a 12-bit ADC (values of a hobby-grade
// photodiode chain, common practice, no source).
func noisyFaceArray(t testing.TB, halfDeg float64) *sensor.Array {
	return faceArrayWith(t, halfDeg, sensor.Errors{MisalignSigma: 0.5 * math.Pi / 180, DarkSigma: 0.005, GainSigma: 0.02,
		NoiseSigma: 0.003, ADCBits: 12, FullScale: 1.5})
}

// Monte Carlo units of one attitude share the geometry of each step (one
// computation read by every unit); the figures equal those of units that
// each compute their own (a per-unit law returning the same attitude).
func TestSharedGeometryEqualsPerUnit(t *testing.T) {
	var shows []string
	for _, perUnit := range []bool{false, true} {
		for _, w := range []int{1, 2} {
			cfg := referenceCase(t, 0.5, true)
			cfg.Array = noisyFaceArray(t, 70)
			cfg.Units, cfg.Workers = 5, w
			if perUnit {
				cfg.LawForUnit = func(int) attitude.Law { return attitude.Nadir{} }
			}
			res, err := Run(context.Background(), cfg)
			if err != nil {
				t.Fatal(err)
			}
			if a, b := res.Units[0].Estimators[0].ErrAlbedo, res.Units[1].Estimators[0].ErrAlbedo; a == b {
				t.Fatalf("units 0 and 1 have the same errors %+v: the drawn errors do not act", a)
			}
			shows = append(shows, showUnits(res))
		}
	}
	for i := 1; i < len(shows); i++ {
		if shows[i] != shows[0] {
			t.Fatalf("case %d differs from shared geometry on one worker:\n%s\n%s", i, shows[0], shows[i])
		}
	}
}

// blockEverything is an obstacle that meets every ray.
type blockEverything struct{}

func (blockEverything) Blocks(_, _ r3.Vec) bool { return true }

// Listing the gaps of the first unit (Config.GapListUnits) leaves every
// figure of every unit as it is; the listed unit's gaps agree with its
// count, longest and histogram of lengths, and the other units keep no
// list. The run is tumbling (gaps every few steps) and cut into pieces on
// two workers, so gaps join across pieces.
func TestGapListChangesNoFigure(t *testing.T) {
	run := func(list int) *Result {
		cfg := referenceCase(t, 5, false)
		cfg.Law = attitude.NewTumble(5, 5*math.Pi/180)
		cfg.Array = faceArray(t, 40) // 40° cones leave gaps between them
		cfg.Units, cfg.Workers, cfg.GapListUnits = 3, 2, list
		res, err := Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		return res
	}
	plain, listed := run(0), run(1)
	strip := func(r *Result) string {
		for _, u := range r.Units {
			for j := range u.Estimators {
				u.Estimators[j].Gaps, u.Estimators[j].GapStartS = nil, nil
			}
		}
		return showUnits(r)
	}
	e := listed.Units[0].Estimators[0]
	t.Logf("%d gaps, %d lengths", e.NumGaps, len(e.GapLengths))
	if e.NumGaps < 100 {
		t.Fatalf("%d gaps: the case should have many", e.NumGaps)
	}
	if len(e.Gaps) != e.NumGaps || len(e.GapStartS) != e.NumGaps {
		t.Fatalf("%d gaps listed, %d starts, %d counted", len(e.Gaps), len(e.GapStartS), e.NumGaps)
	}
	hist := map[int]int{}
	longest, at := 0.0, 0.0
	for k, d := range e.Gaps {
		hist[int(math.Round(d/10))]++
		if d > longest {
			longest, at = d, e.GapStartS[k]
		}
	}
	for _, l := range e.GapLengths {
		if hist[l.Steps] != l.Count {
			t.Errorf("%d gaps of %d steps listed, %d counted", hist[l.Steps], l.Steps, l.Count)
		}
		delete(hist, l.Steps)
	}
	if len(hist) != 0 || longest != e.LongestGapS || at != e.LongestAtS {
		t.Errorf("lengths listed but not counted %v; longest listed %v at %v, recorded %v at %v", hist, longest, at, e.LongestGapS, e.LongestAtS)
	}
	for _, u := range listed.Units[1:] {
		if u.Estimators[0].Gaps != nil {
			t.Errorf("unit %d keeps a list of gaps without being asked", u.Unit)
		}
	}
	if a, b := strip(plain), strip(listed); a != b {
		t.Fatalf("listing gaps moved a figure:\n%s\n%s", a, b)
	}
}

// Units are alike when nothing is drawn per unit: sensors without errors;
// any drawn error, any noise, an attitude drawn per unit or a gyro filter
// makes them differ.
func TestUnitsAlike(t *testing.T) {
	cfg := referenceCase(t, 1, false)
	if !cfg.UnitsAlike() {
		t.Error("sensors without errors: units not alike")
	}
	for name, errs := range map[string]sensor.Errors{
		"noise":                 {NoiseSigma: 0.001},
		"noise, 1 AU saturates": {NoiseSigma: 0.001, FullScale: 1, ADCBits: 12},
		"dark offset":           {DarkSigma: 0.001},
		"gain":                  {GainSigma: 0.001},
		"misalignment":          {MisalignSigma: 1e-4},
	} {
		c := cfg
		c.Array = faceArrayWith(t, 60, errs)
		if c.UnitsAlike() {
			t.Errorf("%s: units alike", name)
		}
	}
	c := cfg
	c.LawForUnit = func(int) attitude.Law { return attitude.Nadir{} }
	if c.UnitsAlike() {
		t.Error("attitude drawn per unit: units alike")
	}
	// And alike units do give the same numbers.
	c = cfg
	c.Units, c.Duration = 3, 6*3600
	res, err := Run(context.Background(), c)
	if err != nil {
		t.Fatal(err)
	}
	for u := 1; u < 3; u++ {
		if !sameBits(res.Units[u].Estimators, res.Units[0].Estimators) || !sameBits(res.Units[u].Sensors, res.Units[0].Sensors) {
			t.Errorf("unit %d differs from unit 0 though the units are alike", u)
		}
	}
}
