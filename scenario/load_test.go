package scenario

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"go.yaml.in/yaml/v3"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/sensor"
)

func TestExamplesLoadAndMatchTemplates(t *testing.T) {
	for _, name := range ExampleNames() {
		tmpl, err := ExampleText(name)
		if err != nil {
			t.Fatal(err)
		}
		ex, err := os.ReadFile(filepath.Join("..", "examples", name+".yaml"))
		if err != nil || !bytes.Equal(ex, tmpl) {
			t.Errorf("examples/%s.yaml differs from scenario/templates (copy it over): %v", name, err)
		}
		s, err := Load(filepath.Join("templates", name+".yaml"))
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		// The record is itself a valid scenario that resolves to the same record.
		again, err := Parse(s.Record(), s.Dir)
		if err != nil {
			t.Fatalf("%s record does not load: %v\n%s", name, err, s.Record())
		}
		if !bytes.Equal(again.Record(), s.Record()) {
			t.Errorf("%s: record is not a fixed point", name)
		}
	}
	if len(ExampleNames()) != 7 {
		t.Errorf("examples: %v", ExampleNames())
	}
}

const minimal = `
orbit: {altitude_km: 500, inclination_deg: 97.4}
body:
  sensors:
    - {name: a, kind: cosine, face: "+X"}
`

func TestDefaults(t *testing.T) {
	s, err := Parse([]byte(minimal), "/tmp")
	if err != nil {
		t.Fatal(err)
	}
	if s.Step.String() != "10s" || s.Duration.String() != "1d" || s.Seed != 1 || s.Orbit.Propagator != "j2-mean" ||
		s.Albedo.Model != "uniform" || s.Albedo.Value != 0.30 || s.Attitude.Name != LawTumble || s.MonteCarlo.Units != 1 {
		t.Errorf("defaults: %+v", s)
	}
	rec := string(s.Record())
	for _, want := range []string{"step: 10s", "propagator: j2-mean", "half_angle_deg: 90", "threshold: 0.05", "max_rate_deg_s: 10", "seed: 1"} {
		if !strings.Contains(rec, want) {
			t.Errorf("record lacks %q:\n%s", want, rec)
		}
	}
	if got := s.Orbit.SemiMajorAxisKm; got != 6878.137 {
		t.Errorf("a = %v; want 6878.137 (WGS 84 Rₑ + 500 km)", got)
	}
}

// The default estimators are those that can give an estimate: opposite
// pairs only with three opposed pairs on non-coplanar axes (two pairs and
// a fifth sensor leave it never valid, and it would have been the primary).
func TestDefaultEstimatorsCanEstimate(t *testing.T) {
	orbit := "orbit: {altitude_km: 500, inclination_deg: 51.6}\n"
	for _, c := range []struct {
		faces []string
		want  []string
	}{
		{[]string{"+X", "-X", "+Y", "-Z", "+Z"}, []string{"least-squares"}},
		{[]string{"+X", "-X", "+Y", "-Y", "+Z", "-Z"}, []string{"opposite-pairs", "least-squares"}},
		{[]string{"+X", "-X"}, []string{"least-squares"}},
	} {
		text := orbit + "body:\n  sensors:\n"
		for i, f := range c.faces {
			text += fmt.Sprintf("    - {name: s%d, kind: cosine, face: \"%s\"}\n", i, f)
		}
		s, err := Parse([]byte(text), "")
		if err != nil {
			t.Fatal(err)
		}
		if !slices.Equal(s.Estimators, c.want) {
			t.Errorf("faces %v: estimators %v, want %v", c.faces, s.Estimators, c.want)
		}
	}
}

func TestSensorMount(t *testing.T) {
	// Closed form: +X tilted 30° toward +Y gives (cos 30°, sin 30°, 0).
	s, err := Parse([]byte(`
orbit: {altitude_km: 500, inclination_deg: 45}
body:
  sensors:
    - {name: a, kind: quadrant, face: "+X", tilt_deg: 30, tilt_toward: "+Y"}
`), "")
	if err != nil {
		t.Fatal(err)
	}
	b := s.Body.Sensors[0].Boresight
	if abs(b.X-0.8660254037844386) > 1e-15 || abs(b.Y-0.5) > 1e-15 || b.Z != 0 {
		t.Errorf("boresight %v", b)
	}
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

func TestTLEOrbit(t *testing.T) {
	c := tleSamples[0]
	s, err := Parse([]byte("orbit:\n  tle:\n    - \""+c.l1+"\"\n    - \""+c.l2+"\"\nbody:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n"), "")
	if err != nil {
		t.Fatal(err)
	}
	if s.Orbit.Kind != OrbitTLE || !s.Epoch.Equal(s.Orbit.TLE.Epoch) {
		t.Errorf("orbit %+v epoch %v", s.Orbit, s.Epoch)
	}
}

// badInput is a scenario text Parse must refuse, with a piece of the
// message it must give.
type badInput struct{ name, text, want string }

// badInputs lists the bad inputs; checkrun_test.go also runs each through
// check and run.
func badInputs() []badInput {
	sensor := "body:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n"
	orbit := "orbit: {altitude_km: 500, inclination_deg: 45}\n"
	tle := tleSamples[0]
	return []badInput{
		{"negative altitude", "orbit: {altitude_km: -20, inclination_deg: 45}\n" + sensor, "orbit.altitude_km (line 1, col 22): value -20"},
		{"sub-surface perigee", "orbit: {semi_major_axis_km: 6000, eccentricity: 0, inclination_deg: 10}\n" + sensor, "orbit.semi_major_axis_km"},
		{"eccentricity 1", "orbit: {semi_major_axis_km: 8000, eccentricity: 1, inclination_deg: 10}\n" + sensor, "orbit.eccentricity"},
		{"unknown face", orbit + "body:\n  sensors: [{name: a, kind: cosine, face: \"+W\"}]\n", "body.sensors[0].face (line 3, col"},
		{"fov zero", orbit + "body:\n  sensors: [{name: a, kind: cosine, face: \"+X\", half_angle_deg: 0}]\n", "half_angle_deg"},
		{"fov 95", orbit + "body:\n  sensors: [{name: a, kind: cosine, face: \"+X\", half_angle_deg: 95}]\n", "value 95 is out of range; allowed a field of view"},
		{"step zero", "step: 0s\n" + orbit + sensor, "step (line 1, col 7): value 0s is not positive"},
		{"step > duration", "step: 2h\nduration: 1h\n" + orbit + sensor, "longer than the duration"},
		{"ltan 25", "orbit: {altitude_km: 500, ltan: \"25:00\"}\n" + sensor, "orbit.ltan"},
		{"type error", "orbit: {altitude_km: high, inclination_deg: 45}\n" + sensor, "value \"high\" is not a number"},
		{"unknown key", orbit + sensor + "colour: red\n", "colour (line 4, col 1): key \"colour\" is unknown"},
		{"duplicate key", orbit + orbit + sensor, "key \"orbit\" is given twice"},
		{"both altitude and a", "orbit: {altitude_km: 500, semi_major_axis_km: 7000, inclination_deg: 45}\n" + sensor, "together with altitude_km"},
		{"unknown propagator", "orbit: {altitude_km: 500, inclination_deg: 45, propagator: sgp}\n" + sensor, "orbit.propagator"},
		{"bad epoch", "epoch: 2026-03-20\n" + orbit + sensor, "epoch (line 1, col 8)"},
		{"bad tle checksum", "orbit:\n  tle: [\"" + tle.l1 + "\", \"" + tle.l2[:68] + "0\"]\n" + sensor, "checksum"},
		{"duplicate sensor", orbit + "body:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}, {name: a, kind: cosine, face: \"-X\"}]\n", "used twice"},
		{"empty sensors", orbit + "body:\n  sensors: []\n", "body.sensors (line 3"},
		{"unknown estimator", orbit + sensor + "estimators: [kalman]\n", "estimators[0] (line 4"},
		{"albedo 1.5", orbit + sensor + "albedo: {value: 1.5}\n", "albedo.value"},
		{"units 0", orbit + sensor + "monte_carlo: {units: 0}\n", "monte_carlo.units"},
		{"seed negative", "seed: -3\n" + orbit + sensor, "seed (line 1, col 7): value -3 is negative"},
		{"timeline with attitude", orbit + sensor + "attitude: {law: nadir}\ntimeline: {phases: [{name: a, attitude: {law: nadir}}]}\n", "attitude (line 4, col 11): value is given with timeline"},
		{"timeline empty", orbit + sensor + "timeline: {phases: []}\n", "timeline.phases"},
		{"timeline phase without until", orbit + sensor + "timeline: {phases: [{name: a, attitude: {law: nadir}}, {name: b, attitude: {law: sun}}]}\n", "timeline.phases[0].until"},
		{"timeline two conditions", orbit + sensor + "timeline: {phases: [{name: a, attitude: {law: nadir}, until: {elapsed: 10m, eclipse: entry}}, {name: b, attitude: {law: sun}}]}\n", "has 2 end conditions"},
		{"timeline rate on nadir", orbit + sensor + "timeline: {phases: [{name: a, attitude: {law: nadir}, until: {rate_below_deg_s: 1}}, {name: b, attitude: {law: sun}}]}\n", "applies to a detumble phase only"},
		{"timeline slew first", orbit + sensor + "timeline: {slew_rate_deg_s: 1, slew_accel_deg_s2: 0.1, phases: [{name: a, slew: true, attitude: {law: nadir}}]}\n", "timeline.phases[0].slew"},
		{"timeline slew onto tumble", orbit + sensor + "timeline: {slew_rate_deg_s: 1, slew_accel_deg_s2: 0.1, phases: [{name: a, attitude: {law: nadir}, until: {elapsed: 1h}}, {name: b, slew: true, attitude: {law: tumble}}]}\n", "turns faster than a slew"},
		{"timeline slew without limits", orbit + sensor + "timeline: {phases: [{name: a, attitude: {law: nadir}, until: {elapsed: 1h}}, {name: b, slew: true, attitude: {law: sun}}]}\n", "no slew_rate_deg_s"},
		{"timeline limits unused", orbit + sensor + "timeline: {slew_rate_deg_s: 1, slew_accel_deg_s2: 0.1, phases: [{name: a, attitude: {law: nadir}}]}\n", "slew limits but no phase with slew"},
		{"timeline seen sensors", orbit + sensor + "timeline: {phases: [{name: a, attitude: {law: sun}, until: {sun_seen_for: 1m, sun_seen_sensors: 2}}, {name: b, attitude: {law: nadir}}]}\n", "sun_seen_sensors"},
		{"timeline eclipse word", orbit + sensor + "timeline: {phases: [{name: a, attitude: {law: sun}, until: {eclipse: start}}, {name: b, attitude: {law: nadir}}]}\n", "allowed entry, exit"},
		{"timeline replay phase", orbit + sensor + "timeline: {phases: [{name: a, attitude: {law: replay, file: x.aem}}]}\n", "replays a whole run"},
		{"timeline duplicate phase", orbit + sensor + "timeline: {phases: [{name: a, attitude: {law: sun}, until: {elapsed: 1h}}, {name: a, attitude: {law: nadir}}]}\n", "used twice"},
		{"timeline hold without limits", orbit + sensor + "timeline: {phases: [{name: a, attitude: {law: nadir}, during_eclipse: hold}]}\n", "no slew_rate_deg_s"},
		{"timeline hold on a tumble", orbit + sensor + "timeline: {slew_rate_deg_s: 1, slew_accel_deg_s2: 0.1, phases: [{name: a, attitude: {law: tumble}, during_eclipse: hold}]}\n", "timeline.phases[0].during_eclipse"},
		{"timeline hold word", orbit + sensor + "timeline: {phases: [{name: a, attitude: {law: sun}, during_eclipse: freeze}]}\n", "during_eclipse"},
		{"nadir align_to orbit-normal", orbit + sensor + "attitude: {law: nadir, align_to: orbit-normal}\n", "allowed velocity, sun"},
		{"detumble without time constant", orbit + sensor + "attitude: {law: detumble}\n", "attitude.time_constant"},
		{"detumble key on tumble", orbit + sensor + "attitude: {law: tumble, time_constant: 10m}\n", "attitude.time_constant"},
		{"unknown kind", orbit + "body:\n  sensors: [{name: a, kind: pinhole, face: \"+X\"}]\n", "kind"},
		{"unknown law", orbit + sensor + "attitude: {law: wobble}\n", "attitude.law"},
		{"quaternion norm", orbit + sensor + "attitude: {law: inertial, quaternion: [1, 1, 0, 0]}\n", "attitude.quaternion"},
		{"law key misuse", orbit + sensor + "attitude: {law: nadir, max_rate_deg_s: 3}\n", "does not apply to law"},
		{"tilt toward parallel", orbit + "body:\n  sensors: [{name: a, kind: cosine, face: \"+X\", tilt_deg: 10, tilt_toward: \"-X\"}]\n", "tilt_toward"},
		{"inclination 200", "orbit: {altitude_km: 500, inclination_deg: 200}\n" + sensor, "orbit.inclination_deg"},
		{"missing inclination", "orbit: {altitude_km: 500}\n" + sensor, "orbit.inclination_deg"},
		{"no orbit", sensor, "orbit: value has no orbit"},
		{"span year", "duration: 1y\n" + orbit + sensor, "calendar-ambiguous"},
		{"quadrant key on cosine", orbit + "body:\n  sensors: [{name: a, kind: cosine, face: \"+X\", gap_mm: 0.1}]\n", "does not apply to kind"},
		{"grid without file", orbit + sensor + "albedo: {model: grid}\n", "albedo.grid_file"},
		{"onboard without truth albedo", orbit + sensor + "albedo: {model: none, onboard: {model: uniform}}\n", "albedo.onboard"},
		{"onboard value on none", orbit + sensor + "albedo: {model: zonal, onboard: {model: none, value: 0.3}}\n", "albedo.onboard.value"},
		{"onboard value 2", orbit + sensor + "albedo: {onboard: {value: 2}}\n", "albedo.onboard.value"},
		{"onboard grid without file", orbit + sensor + "albedo: {onboard: {model: grid}}\n", "albedo.onboard.grid_file"},
		{"onboard cells 5", orbit + sensor + "albedo: {onboard: {cells: 5}}\n", "albedo.onboard.cells"},
		{"judge corrected without onboard", orbit + sensor + "albedo: {model: zonal}\ntargets: {max_error_p95_deg: 3, judge: onboard-corrected}\n", "targets.judge (line 5, col 40): value \"onboard-corrected\" needs an on-board albedo model; allowed only with albedo.onboard set"},
		{"units target with one unit", orbit + sensor + "monte_carlo: {units: 1}\ntargets: {max_error_p95_units_deg: 5}\n", "targets.max_error_p95_units_deg (line 5, col 36): needs at least 2 Monte Carlo units, monte_carlo.units is 1"},
		{"units target 0", orbit + sensor + "monte_carlo: {units: 4}\ntargets: {max_error_p95_units_deg: 0}\n", "targets.max_error_p95_units_deg"},
		{"judge unknown", orbit + sensor + "albedo: {model: zonal, onboard: {model: zonal}}\ntargets: {judge: corrected}\n", "targets.judge (line 5, col 18): value \"corrected\" is unknown; allowed uncorrected, onboard-corrected"},
		{"onboard unknown model", orbit + sensor + "albedo: {onboard: {model: cloudy}}\n", "albedo.onboard.model"},
		{"onboard unknown key", orbit + sensor + "albedo: {onboard: {model: uniform, gain: 1}}\n", "key \"gain\" is unknown"},
		{"unknown figure", orbit + sensor + "output: {figures: [pie]}\n", "output.figures[0]"},
		{"power figure without panels", orbit + sensor + "output: {figures: [sky, power]}\n", "output.figures[1]"},
		{"decimate 0", orbit + sensor + "output: {decimate: 0}\n", "output.decimate"},
		{"yaml syntax", "orbit: [\n", "not valid YAML"},
		{"list for mapping", "orbit: [1, 2]\n" + sensor, "orbit (line 1, col 8): value a list is not a mapping"},
		{"empty file", "", "value is empty"},
		{"cylinder radius", orbit + sensor + "  obstructions: [{name: m, shape: cylinder, from_m: [0,0,0], to_m: [0,0,1]}]\n", "radius_m"},
		{"unknown form factor", orbit + "body:\n  form_factor: 5U\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n", "body.form_factor (line 3"},
		{"form factor and size", orbit + "body:\n  form_factor: 3U\n  size_m: [0.1, 0.1, 0.3]\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n", "body.size_m"},
		{"size negative", orbit + "body:\n  size_m: [0.1, -0.1, 0.3]\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n", "body.size_m"},
		{"sensor inside the bus", orbit + "body:\n  form_factor: 3U\n  sensors: [{name: a, kind: cosine, face: \"+X\", position_m: [0.01, 0, 0]}]\n", "inside the bus outline"},
		{"obstruction without positions", orbit + sensor + "  obstructions: [{name: m, shape: cylinder, from_m: [0,0,0], to_m: [0,0,1], radius_m: 0.01}]\n", "body.sensors[0].position_m"},
		{"false-sun bound 0", orbit + sensor + "validity: {false_sun_bound_deg: 0}\n", "validity.false_sun_bound_deg (line 4"},
		{"gate for an estimator not run", orbit + sensor + "estimators: [least-squares]\nvalidity: {gates: {two-axis: {min_sensors: 2}}}\n", "validity.gates.two-axis"},
		{"gate negative signal", orbit + sensor + "estimators: [least-squares]\nvalidity: {gates: {least-squares: {min_total_signal: -1}}}\n", "validity.gates.least-squares.min_total_signal"},
		{"coverage k too big", orbit + sensor + "targets: {coverage_sensors: 3, min_coverage: 0.9}\n", "targets.coverage_sensors"},
		{"bool type", orbit + sensor + "targets: {survive_one_failure: maybe}\n", "not true or false"},
		{"nadir axes parallel", orbit + sensor + "attitude: {law: nadir, point_axis: \"+Z\", align_axis: \"+Z\"}\n", "attitude.align_axis (line 4"},
		{"nadir axes opposite", orbit + sensor + "attitude: {law: nadir, point_axis: \"+Z\", align_axis: \"-Z\"}\n", "parallel to point_axis"},
		{"sun axes parallel", orbit + sensor + "attitude: {law: sun, point_axis: \"+X\"}\nmodes: [{name: safe, law: sun, point_axis: \"-X\", align_axis: \"+X\"}]\n", "parallel to point_axis"},
		{"tle far out", "orbit:\n  tle: [\"" + tle.l1 + "\", \"" + withTLEField(tle.l2, 52, "00.01000000") + "\"]\n" + sensor, "orbit.tle (line 2, col 8): value: mean motion 0.01000000 rev/day"},
		{"tle perigee inside", "orbit:\n  tle: [\"" + tle.l1 + "\", \"" + withTLEField(tle.l2, 26, "5000000") + "\"]\n" + sensor, "perigee altitude"},
		{"altitude above range", "orbit: {altitude_km: 150000, inclination_deg: 45}\n" + sensor, "allowed [100, 100000]"},
		{"apogee above range", "orbit: {semi_major_axis_km: 80000, eccentricity: 0.5, inclination_deg: 10}\n" + sensor, "apogee altitude"},
		{"residual above stated", orbit + "body:\n  sensors: [{name: a, kind: cosine, face: \"+X\", errors: {dark_offset_1sigma: 0.001}}]\nbudget: {calibrated: {dark_offset_1sigma: 0.01}, tolerance_deg: 1}\n", "budget.calibrated.dark_offset_1sigma (line 4, col 43): value 0.01 exceeds the 0.001 sensor a states"},
		{"residual for nothing", orbit + sensor + "budget: {calibrated: {gain_1sigma: 0.001}, tolerance_deg: 1}\n", "applies to no sensor"},
		{"residual kind absent", orbit + "body:\n  sensors: [{name: a, kind: cosine, face: \"+X\", errors: {noise_1sigma: 0.01}}]\nbudget: {calibrated: {digital: {noise_1sigma: 0.001}}, tolerance_deg: 1}\n", "names kind digital"},
		{"dark doubling without a dark signal", orbit + "body:\n  sensors: [{name: a, kind: cosine, face: \"+X\", dark_doubling_c: 5}]\n", "body.sensors[0].dark_doubling_c (line 3, col 66): value has no effect while dark_signal_at_calibration is 0"},
		{"full scale below threshold", orbit + "body:\n  sensors: [{name: a, kind: cosine, face: \"+X\", full_scale: 0.04}]\n", "body.sensors[0].full_scale (line 3, col 61): value 0.04 leaves no valid reading"},
		{"quadrant cells below threshold", orbit + "body:\n  sensors: [{name: a, kind: quadrant, face: \"+X\", full_scale: 0.01}]\n", "clipped signal (at most 0.04) never exceeds the threshold 0.05"},
		{"boresight into its face", orbit + "body:\n  form_factor: 3U\n  sensors: [{name: a, kind: cosine, boresight: [-1, 0, 0], position_m: [0.05, 0, 0]}]\n", "body.sensors[0].boresight (line 4, col 48): value [-1 0 0] points into the bus face"},
		{"second document", orbit + sensor + "---\nname: other\n", "(file) (line 5, col 1): value holds more than one YAML document"},
	}
}

func TestBadInputs(t *testing.T) {
	for _, c := range badInputs() {
		_, err := Parse([]byte(c.text), "")
		if err == nil {
			t.Errorf("%s: accepted", c.name)
			continue
		}
		msg := err.Error()
		if !strings.Contains(msg, c.want) {
			t.Errorf("%s: error %q lacks %q", c.name, msg, c.want)
		}
		for _, line := range strings.Split(msg, "\n") {
			if strings.Contains(line, "float64") || strings.Contains(line, "scenario.file") || !strings.Contains(line, "allowed") {
				t.Errorf("%s: line %q leaks a Go type or says nothing allowed", c.name, line)
			}
		}
	}
	if _, err := Load("no/such/file.yaml"); err == nil || !strings.Contains(err.Error(), "does not exist") {
		t.Errorf("missing file: %v", err)
	}
}

func FuzzParse(f *testing.F) {
	for _, n := range ExampleNames() {
		b, _ := ExampleText(n)
		f.Add(b)
	}
	f.Add([]byte(minimal))
	f.Add([]byte("orbit: {semi_major_axis_km: 7000, eccentricity: 0.01, inclination_deg: 98}\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		s, err := Parse(data, "")
		if err == nil {
			if _, err := Parse(s.Record(), ""); err != nil {
				t.Fatalf("record of a valid scenario does not load: %v", err)
			}
		}
	})
}

// Sensors on a bus outline: a face mount left without position_m sits at
// its face centre, a vector mount where its boresight leaves the outline,
// and each sees nothing behind the surface it sits on. The 3U outline is
// 100 × 100 × 340.5 mm (CubeSat Design Specification rev. 14, from memory).
func TestSensorPlacementOnTheOutline(t *testing.T) {
	text := "orbit: {altitude_km: 500, inclination_deg: 97}\nbody:\n  form_factor: 3u\n  sensors:\n" +
		"    - {name: a, kind: cosine, face: \"-Z\", tilt_deg: 30}\n" +
		"    - {name: b, kind: cosine, boresight: [1, 1, 0]}\n" +
		"    - {name: c, kind: cosine, boresight: [0, 0, 1], position_m: [0.3, 0, 0]}\n" +
		"    - {name: d, kind: cosine, boresight: [0.2, 0, 1], position_m: [0.02, 0.01, 0.17025]}\n"
	s, err := Parse([]byte(text), "")
	if err != nil {
		t.Fatal(err)
	}
	if s.Body.FormFactor != "3U" || s.Body.SizeM != (r3.Vec{X: 0.1, Y: 0.1, Z: 0.3405}) {
		t.Fatalf("outline %q %v", s.Body.FormFactor, s.Body.SizeM)
	}
	want := []struct{ pos, normal r3.Vec }{
		{r3.Vec{Z: -0.17025}, r3.Vec{Z: -1}},
		{r3.Vec{X: 0.05, Y: 0.05}, r3.Vec{X: 1}}, // an edge: the first face met along the boresight
		{r3.Vec{X: 0.3}, r3.Vec{Z: 1}},           // off the outline: its own boresight plane
		{r3.Vec{X: 0.02, Y: 0.01, Z: 0.17025}, r3.Vec{Z: 1}},
	}
	for i, w := range want {
		got := s.Body.Sensors[i]
		if r3.Norm(r3.Sub(got.PositionM, w.pos)) > 1e-12 || r3.Norm(r3.Sub(got.MountNormal, w.normal)) > 1e-12 {
			t.Errorf("sensor %s: position %v normal %v, want %v %v", got.Name, got.PositionM, got.MountNormal, w.pos, w.normal)
		}
	}
	// The record states the placed positions and loads to the same scenario.
	again, err := Parse(s.Record(), "")
	if err != nil {
		t.Fatal(err)
	}
	for i := range want {
		if again.Body.Sensors[i].PositionM != s.Body.Sensors[i].PositionM || again.Body.Sensors[i].MountNormal != s.Body.Sensors[i].MountNormal {
			t.Errorf("sensor %d placed differently from the record", i)
		}
	}
}

// withTLEField returns a TLE line with the field at 0-based column col
// replaced by v and the checksum (column 69) recomputed.
func withTLEField(line string, col int, v string) string {
	l := line[:col] + v + line[col+len(v):]
	return l[:68] + string(rune('0'+tleChecksum(l[:68]+"0")))
}

// The record's errors block of each sensor kind offers exactly the errors
// that kind's model draws (the others are refused when set), and a record
// that names them all loads again.
func TestRecordErrorsAreTheKindsOwn(t *testing.T) {
	for _, kind := range sensor.KindNames() {
		info, _ := sensor.LookupKind(kind)
		text := "orbit: {altitude_km: 500, inclination_deg: 97.4}\nbody:\n  form_factor: 3U\n  sensors:\n    - {name: a, kind: " + kind + ", face: \"+X\"}\n"
		s, err := Parse([]byte(text), t.TempDir())
		if err != nil {
			t.Fatalf("%s: %v", kind, err)
		}
		var rec struct {
			Body struct {
				Sensors []struct {
					Errors map[string]float64 `yaml:"errors"`
				} `yaml:"sensors"`
			} `yaml:"body"`
		}
		if err := yaml.Unmarshal(s.Record(), &rec); err != nil || len(rec.Body.Sensors) != 1 {
			t.Fatalf("%s: record: %v\n%s", kind, err, s.Record())
		}
		got := rec.Body.Sensors[0].Errors
		for _, c := range errorKeySources {
			if _, listed := got[c.key]; listed != hasSource(info, c.source) {
				t.Errorf("%s: errors.%s listed %v, but the kind draws %s: %v", kind, c.key, listed, c.source, hasSource(info, c.source))
			}
		}
		if len(got) == 0 || len(got) > len(errorKeySources) {
			t.Errorf("%s: errors block %v", kind, got)
		}
		if _, err := Parse(s.Record(), s.Dir); err != nil {
			t.Errorf("%s: the record does not load: %v", kind, err)
		}
	}
}

// A key given twice is the one problem reported: the sections after it are
// not said to be missing (the decoder stops at the duplicate, and the
// file's orbit and sensors looked absent).
func TestDuplicateKeyAlone(t *testing.T) {
	for _, text := range []string{
		"name: x\nname: y\norbit: {altitude_km: 500, inclination_deg: 97}\nbody:\n  sensors:\n    - {name: a, kind: cosine, face: \"+X\"}\n",
		"orbit: {altitude_km: 500, inclination_deg: 97}\nbody:\n  sensors:\n    - {name: a, kind: cosine, face: \"+X\", face: \"-X\"}\n",
	} {
		_, err := Parse([]byte(text), t.TempDir())
		var errs Errors
		if !errors.As(err, &errs) || len(errs) != 1 || !strings.Contains(errs[0].Error(), "is given twice") {
			t.Errorf("%q: %v; want the duplicate key alone", text, err)
		}
	}
}

// A refused value is the one problem reported about it: what the resolver
// would say of the file with that value missing (a list one entry short, a
// section without its key, a cross-check naming it) is its consequence, not
// a second problem. An independent problem is still reported in the same
// round.
func TestRefusedValueHasNoConsequences(t *testing.T) {
	sensor7 := func(gain string) string {
		var b strings.Builder
		for i, f := range []string{"+X", "-X", "+Y", "-Y", "+Z", "-Z", "+X"} {
			g := "0.01"
			if i < 6 {
				g = gain
			}
			b.WriteString("    - {name: s" + string(rune('a'+i)) + ", kind: cosine, face: \"" + f + "\", errors: {gain_1sigma: " + g + "}}\n")
		}
		return b.String()
	}
	const orbit = "orbit: {altitude_km: 500, inclination_deg: 97.4}\n"
	cases := []struct {
		name, text string
		want       []string // the paths reported, in order
	}{
		{"wrong type in the only sensor",
			orbit + "body:\n  sensors:\n    - name: q\n      kind: quadrant\n      face: \"-Z\"\n      tilt_deg: TILT\n      tilt_toward: \"+X\"\n",
			[]string{"body.sensors[0].tilt_deg"}},
		{"wrong type in six of seven sensors",
			orbit + "body:\n  sensors:\n" + sensor7(`"two"`) + "targets:\n  coverage_sensors: 2\n",
			[]string{"body.sensors[0].errors.gain_1sigma", "body.sensors[1].errors.gain_1sigma", "body.sensors[2].errors.gain_1sigma",
				"body.sensors[3].errors.gain_1sigma", "body.sensors[4].errors.gain_1sigma", "body.sensors[5].errors.gain_1sigma"}},
		{"wrong type in a vector",
			orbit + "body:\n  sensors:\n    - {name: a, kind: cosine, boresight: [1, x, 0]}\n",
			[]string{"body.sensors[0].boresight[1]"}},
		{"a sensor that is not a mapping",
			orbit + "body:\n  sensors:\n    - cosine\n    - {name: a, kind: cosine, face: \"+X\"}\ntargets:\n  coverage_sensors: 2\n",
			[]string{"body.sensors[0]"}},
		{"misspelt required key",
			"orbit: {altitude_kms: 500, inclination_deg: 97.4}\nbody:\n  sensors:\n    - {name: a, kind: cosine, face: \"+X\"}\n",
			[]string{"orbit.altitude_kms"}},
		{"cross-check naming the refused key",
			orbit + "body:\n  sensors:\n    - {name: a, kind: cosine, face: \"+X\"}\nmonte_carlo:\n  units: many\ntargets:\n  max_error_p95_units_deg: 5\n",
			[]string{"monte_carlo.units"}},
		{"an independent problem in the same round",
			orbit + "body:\n  sensors:\n    - {name: a, kind: cosine, face: \"+X\", tilt_deg: TILT}\nalbedo:\n  value: 1.5\n",
			[]string{"body.sensors[0].tilt_deg", "albedo.value"}},
	}
	for _, c := range cases {
		_, err := Parse([]byte(c.text), t.TempDir())
		var errs Errors
		if !errors.As(err, &errs) {
			t.Errorf("%s: %v; want %v", c.name, err, c.want)
			continue
		}
		var got []string
		for _, e := range errs {
			got = append(got, e.Path)
		}
		if strings.Join(got, " ") != strings.Join(c.want, " ") {
			t.Errorf("%s: reported\n%v\nwant the paths %v", c.name, err, c.want)
		}
	}
}

// One mistake in a bundled example is one problem reported: each value in
// turn given as the wrong type (a mapping for a scalar, a word for a
// mapping or list), and each key in turn misspelt.
func TestOneMistakeOneProblem(t *testing.T) {
	for _, name := range ExampleNames() {
		data, err := os.ReadFile(filepath.Join("templates", name+".yaml"))
		if err != nil {
			t.Fatal(err)
		}
		var doc yaml.Node
		if err := yaml.Unmarshal(data, &doc); err != nil {
			t.Fatal(err)
		}
		var values, keys []*yaml.Node
		var walk func(n *yaml.Node)
		walk = func(n *yaml.Node) {
			for i, c := range n.Content {
				if n.Kind == yaml.MappingNode && i%2 == 0 {
					keys = append(keys, c)
					continue
				}
				values = append(values, c)
				walk(c)
			}
		}
		walk(doc.Content[0])
		try := func(what string, line int) {
			text, err := yaml.Marshal(&doc)
			if err != nil {
				t.Fatal(err)
			}
			_, err = Parse(text, "templates")
			var errs Errors
			if !errors.As(err, &errs) || len(errs) != 1 {
				t.Errorf("%s, %s at line %d: want one problem, got\n%v", name, what, line, err)
			}
		}
		for _, n := range values {
			saved := *n
			if n.Kind == yaml.ScalarNode {
				*n = yaml.Node{Kind: yaml.MappingNode, Tag: "!!map", Content: []*yaml.Node{
					{Kind: yaml.ScalarNode, Tag: "!!str", Value: "x"}, {Kind: yaml.ScalarNode, Tag: "!!int", Value: "1"}}}
			} else {
				*n = yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: "x"}
			}
			try("a value of the wrong type", saved.Line)
			*n = saved
		}
		for _, k := range keys {
			saved := k.Value
			k.Value += "q"
			try("key "+saved+" misspelt", k.Line)
			k.Value = saved
		}
	}
}
