package study

import (
	"context"
	"encoding/csv"
	"fmt"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// occlusionCases are the scenario texts of the cases of
// testdata/occlusion_mc.csv (written by testdata/gen_occlusion_mc.py).
var occlusionCases = map[string]string{
	"tilted-px-3u": "  form_factor: 3U\n  sensors:\n" +
		"    - {name: s, kind: cosine, face: \"+X\", tilt_deg: 45, tilt_toward: \"+Z\", half_angle_deg: 80}\n",
	"tilted-pz-6u-offcentre": "  form_factor: 6U\n  sensors:\n" +
		"    - {name: s, kind: cosine, face: \"+Z\", tilt_deg: 60, tilt_toward: \"+X\", half_angle_deg: 70, position_m: [0.08, -0.03, 0.183]}\n",
	"boom-facing-bus-6u": "  form_factor: 6U\n  sensors:\n" +
		"    - {name: s, kind: cosine, boresight: [-1, 0, 0.3], half_angle_deg: 80, position_m: [0.25, 0, 0.1]}\n",
}

func occlusionScenario(t *testing.T, body string) *scenario.Scenario {
	t.Helper()
	s, err := scenario.Parse([]byte("orbit: {altitude_km: 500, inclination_deg: 97}\nalbedo: {model: none}\nbody:\n"+body), "")
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func vecOf(t *testing.T, row []string) r3.Vec {
	t.Helper()
	var v [3]float64
	for i := range v {
		x, err := strconv.ParseFloat(row[i], 64)
		if err != nil {
			t.Fatal(err)
		}
		v[i] = x
	}
	return r3.Vec{X: v[0], Y: v[1], Z: v[2]}
}

// A sensor never sees through the face it sits on nor through the bus: the
// sky share of each case agrees with an independent numpy Monte Carlo of the
// same box geometry (testdata/gen_occlusion_mc.py, 4e6 directions, σ ≈
// 0.02 points) to 0.3 points. The +X sensor tilted 45° with an 80°
// half-angle sees 41.3 % of the sky as a bare cone and 32.9 % on the bus.
func TestOcclusionAgainstMonteCarlo(t *testing.T) {
	f, err := os.Open("testdata/occlusion_mc.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rd := csv.NewReader(f)
	rd.Comment = '#'
	rows, err := rd.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	lat, _ := sky.Fibonacci(1 << 18)
	for _, row := range rows[1:] {
		name := row[0]
		body, ok := occlusionCases[name]
		if !ok {
			t.Fatalf("case %q has no scenario", name)
		}
		s := occlusionScenario(t, body)
		sc := s.Body.Sensors[0]
		// The scenario describes the same geometry as the generator.
		size, pos, bore, plane := vecOf(t, row[1:4]), vecOf(t, row[4:7]), vecOf(t, row[7:10]), vecOf(t, row[10:13])
		for _, c := range []struct {
			what      string
			got, want r3.Vec
		}{{"size", s.Body.SizeM, size}, {"position", sc.PositionM, pos}, {"boresight", sc.Boresight, bore}, {"mounting plane", sc.MountNormal, plane}} {
			if r3.Norm(r3.Sub(c.got, c.want)) > 1e-9 {
				t.Fatalf("%s: %s %v, generator %v", name, c.what, c.got, c.want)
			}
		}
		want, _ := strconv.ParseFloat(row[14], 64)
		_, viewers, _, err := BuildSensors(s, s.Body.Sensors, "body.sensors")
		if err != nil {
			t.Fatal(err)
		}
		cov, err := sky.Coverage(viewers, lat)
		if err != nil {
			t.Fatal(err)
		}
		got := cov.AtLeast[1]
		bare := (1 - math.Cos(sc.HalfAngleRad)) / 2
		t.Logf("%-24s sunsight %.4f, Monte Carlo %.4f (Δ %+.3f points), bare cone %.4f", name, got, want, 100*(got-want), bare)
		if math.Abs(got-want) > 0.003 {
			t.Errorf("%s: sky share %.4f, Monte Carlo %.4f: more than 0.3 points apart", name, got, want)
		}
		if !(got < bare-0.05) {
			t.Errorf("%s: the bus hides too little (%.4f of a bare %.4f)", name, got, bare)
		}
	}
}

// Six face-normal sensors on a cube bus cover the whole sphere exactly when
// their half-angle reaches acos(1/√3) = 54.7356° (closed form): the bus
// hides nothing in front of a face.
func TestCubeFacesCoverage(t *testing.T) {
	lat, _ := sky.Fibonacci(1 << 18)
	for _, c := range []struct {
		half float64
		full bool
	}{{54.7356 + 0.1, true}, {54.7356 - 0.1, false}} {
		var b strings.Builder
		b.WriteString("  size_m: [0.1, 0.1, 0.1]\n  sensors:\n")
		for i, face := range []string{"+X", "-X", "+Y", "-Y", "+Z", "-Z"} {
			fmt.Fprintf(&b, "    - {name: s%d, kind: cosine, face: \"%s\", half_angle_deg: %g}\n", i, face, c.half)
		}
		s := occlusionScenario(t, b.String())
		_, viewers, _, err := BuildSensors(s, s.Body.Sensors, "body.sensors")
		if err != nil {
			t.Fatal(err)
		}
		cov, _ := sky.Coverage(viewers, lat)
		if full := cov.AtLeast[1] == 1; full != c.full {
			t.Errorf("half-angle %.4f°: seen by ≥ 1 = %.6f, full = %v, want %v", c.half, cov.AtLeast[1], full, c.full)
		}
	}
}

// The time domain applies the same mounting plane and bus: under an
// isotropic attitude the tilted +X sensor of the Monte Carlo case has the
// sun in view for its sky share of sunlit time (within 4σ of sampling), and
// its reading is dark whenever the bus hides the sun.
func TestOcclusionInTheTimeDomain(t *testing.T) {
	s := occlusionScenario(t, occlusionCases["tilted-px-3u"])
	s.Attitude = scenario.Attitude{Law: scenario.Law{Name: scenario.LawIsotropic}}
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	cfg.Duration, cfg.Step = 3e5, 10
	res, err := sim.Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	u := res.Nominal
	n := u.SunlitFraction * float64(u.Samples)
	const share = 0.32908 // testdata/occlusion_mc.csv
	got := u.Sensors[0].InViewFraction
	σ := math.Sqrt(share * (1 - share) / n)
	t.Logf("in view %.4f of %.0f sunlit samples; sky share %.4f (σ %.4f)", got, n, share, σ)
	if math.Abs(got-share) > 4*σ {
		t.Errorf("in view %.4f of sunlit time, sky share %.4f ± %.4f", got, share, σ)
	}
	// Dark exactly when not in view: a direction inside the cone but behind
	// the face gives no signal.
	cfg.Duration, cfg.SeriesStride = 2e4, 1
	res, err = sim.Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	se := res.Nominal.Series
	behind := 0
	for k := range se.T {
		if se.Region[k] != illum.Sunlit {
			continue
		}
		if lit := se.SignalsAt(k)[0] > 0; lit != (se.Seen[k] == 1) {
			t.Fatalf("t = %g s: signal %g with %d sensors seeing the sun", se.T[k], se.SignalsAt(k)[0], se.Seen[k])
		}
		el, az := se.SunBodyEl[k]*math.Pi/180, se.SunBodyAz[k]*math.Pi/180
		d := r3.Vec{X: math.Cos(el) * math.Cos(az), Y: math.Cos(el) * math.Sin(az), Z: math.Sin(el)}
		if d.X < -0.01 && r3.Dot(d, mountOf(cfg).Boresight()) > 0.2 {
			behind++
		}
	}
	if behind == 0 {
		t.Error("no sample put the sun in the cone behind the face: the check proves nothing")
	}
}

func mountOf(cfg sim.Config) sensor.Mount { return cfg.Array.Sensors()[0].Mount() }

// The albedo of a tilted sensor is integrated only in front of its face: a
// +X sensor tilted 45° toward +Z, +Z at nadir, sees the Earth's disc (66°
// radius) partly behind the +X face plane. Without the plane in the
// integral, the reading is all of the cone's albedo or, when its mean
// direction falls behind the face, none; with it, the part in front. So the
// clipped reading is never above a kept unclipped one, is below it at some
// samples, and keeps a part where the unclipped one was dropped whole.
func TestTiltedSensorAlbedoClippedByItsFace(t *testing.T) {
	s := occlusionScenario(t, occlusionCases["tilted-px-3u"])
	s.Albedo = scenario.Albedo{Model: scenario.AlbedoUniform, Value: 0.3, Cells: 1000}
	s.Attitude = scenario.Attitude{Law: scenario.Law{Name: scenario.LawNadir, PointAxis: r3.Vec{Z: 1}, AlignAxis: r3.Vec{X: 1}}}
	run := func(clip bool) *sim.Series {
		cfg, err := Config(s)
		if err != nil {
			t.Fatal(err)
		}
		if !clip {
			cfg.MountNormals = nil
		}
		cfg.Duration, cfg.Step, cfg.SeriesStride = 6000, 20, 1
		res, err := sim.Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		return res.Nominal.Series
	}
	with, without := run(true), run(false)
	less, kept := 0, 0
	for k := range with.T {
		a, b := with.SignalsAt(k)[0], without.SignalsAt(k)[0]
		switch {
		case b > 0 && a > b+1e-12:
			t.Fatalf("t = %g s: %g with the face plane, %g without", with.T[k], a, b)
		case b > 0 && a < b-1e-6:
			less++
		case b == 0 && a > 0:
			kept++
		}
	}
	t.Logf("of %d samples: clipped below the whole cone at %d, a part kept where the whole was dropped at %d", len(with.T), less, kept)
	if less == 0 || kept == 0 {
		t.Error("the face plane does not act on the tilted sensor's albedo")
	}
}
