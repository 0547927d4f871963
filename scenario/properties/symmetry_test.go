package properties

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/internal/randscenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// fixedSun is a sun that does not move: ECI +X at 1 AU. With an equatorial
// orbit it keeps β = 0 exactly and makes the geometry periodic.
type fixedSun struct{}

func (fixedSun) Position(float64) (r3.Vec, float64) { return r3.Vec{X: 1}, albedo.AUKm }

// mirroredFile is a nadir-pointing equatorial orbit (nadir on +Z, velocity
// on +X, so the orbit normal is a body ±Y axis) with random sensors in
// mirror pairs about the body x–z plane, which contains the sun, nadir and
// velocity at every instant when the sun lies in the orbit plane.
func mirroredFile(r *rand.Rand, albedoModel string) *randscenario.File {
	alt := 400 + 1200*r.Float64()
	f := simpleFile(math.Round(alt), 0, 0, "2026-03-20T00:00:00Z", []string{"conical", "cylindrical"}[r.IntN(2)], 1.3)
	f.Body.Sensors = nil
	f.Albedo = randscenario.Albedo{Model: albedoModel, Cells: 400}
	for i := range 1 + r.IntN(4) {
		b := r3.Unit(r3.Vec{X: r.NormFloat64(), Y: r.NormFloat64(), Z: r.NormFloat64()})
		half := math.Round(30 + 60*r.Float64())
		for k, y := range []float64{b.Y, -b.Y} {
			h := half
			f.Body.Sensors = append(f.Body.Sensors, randscenario.Sensor{Name: fmt.Sprintf("m%d%c", i, "ab"[k]), Kind: "cosine",
				Boresight: []float64{b.X, y, b.Z}, HalfAngleDeg: &h})
		}
	}
	return f
}

// A mirror-symmetric layout under a mirror-symmetric geometry gives
// mirrored per-sensor numbers: equal in-view shares exactly, equal peak
// signals (to the albedo cell discretisation when albedo is on).
func TestMirrorSymmetry(t *testing.T) {
	r := rand.New(rand.NewPCG(13, 14))
	for k := range 10 {
		f := mirroredFile(r, []string{"none", "uniform"}[k%2])
		t.Run(fmt.Sprint("case", k), func(t *testing.T) {
			showOnFailure(t, f.YAML())
			b, err := build(f)
			if err != nil {
				t.Fatal(err)
			}
			b.cfg.Sun = fixedSun{}
			res, err := run(b.cfg)
			if err != nil {
				t.Fatal(err)
			}
			u := res.Nominal
			rel := 1e-12
			if f.Albedo.Model != "none" {
				rel = 2e-3
			}
			for i := 0; i < len(u.Sensors); i += 2 {
				a, m := u.Sensors[i], u.Sensors[i+1]
				if a.InViewFraction != m.InViewFraction {
					t.Errorf("%s in view %.6f, its mirror %s %.6f", a.Name, a.InViewFraction, m.Name, m.InViewFraction)
				}
				if math.Abs(a.PeakSignal-m.PeakSignal) > rel*math.Max(a.PeakSignal, m.PeakSignal)+1e-3 {
					t.Errorf("%s peak %.6f, its mirror %s %.6f", a.Name, a.PeakSignal, m.Name, m.PeakSignal)
				}
			}
		})
	}
}

// Doubling the duration of a periodic case (fixed sun, circular two-body
// orbit, nadir pointing: the geometry repeats every orbit) leaves the
// fractions unchanged to within one sample per change of state.
func TestDoubledPeriodicRun(t *testing.T) {
	r := rand.New(rand.NewPCG(15, 16))
	for k := range 4 {
		f := mirroredFile(r, "none")
		t.Run(fmt.Sprint("case", k), func(t *testing.T) {
			showOnFailure(t, f.YAML())
			b, err := build(f)
			if err != nil {
				t.Fatal(err)
			}
			a := earthRadiusKm + *f.Orbit.AltitudeKm
			period := 2 * math.Pi * math.Sqrt(a*a*a/muEarth)
			runFor := func(orbits float64) *sim.UnitResult {
				cfg := b.cfg
				cfg.Sun = fixedSun{}
				cfg.Duration = orbits * period
				cfg.SeriesStride = 1
				res, err := run(cfg)
				if err != nil {
					t.Fatal(err)
				}
				return res.Nominal
			}
			one, two := runFor(1), runFor(2)
			changes := 0
			s := two.Series
			for i := 1; i < len(s.T); i++ {
				if s.Region[i] != s.Region[i-1] || s.Seen[i] != s.Seen[i-1] || s.Valid[i] != s.Valid[i-1] {
					changes++
				}
			}
			n := float64(sunlitSamples(one))
			var fl failures
			shareDiffs(&fl, "two orbits against one", one, two, float64(changes+2)/n)
			for _, m := range fl {
				t.Error(m)
			}
		})
	}
}
