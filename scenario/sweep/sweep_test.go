package sweep

import (
	"bytes"
	"context"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"sync/atomic"
	"testing"

	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// base is a small, fast scenario: tumbling (so the seed matters), no albedo.
const base = `name: sweep test
epoch: "2026-03-20T12:00:00Z"
duration: 1h
step: 30s
seed: 11
orbit:
  altitude_km: 500
  inclination_deg: 40
  propagator: two-body
shadow: cylindrical
attitude:
  law: tumble
  max_rate_deg_s: 5
modes:
  - {name: sunward, law: sun, point_axis: "+Z"}
body:
  sensors:
    - {name: a, kind: cosine, face: "+X", half_angle_deg: 80}
    - {name: b, kind: cosine, face: "-X", half_angle_deg: 80}
    - {name: c, kind: cosine, face: "+Z", half_angle_deg: 80}
  layouts:
    - name: two
      sensors:
        - {name: a, kind: cosine, face: "+X", half_angle_deg: 80}
        - {name: c, kind: cosine, face: "+Z", half_angle_deg: 80}
albedo:
  model: none
`

func TestParseAxis(t *testing.T) {
	for _, tc := range []struct {
		spec string
		want string
	}{
		{"orbit.altitude_km=300:900:100", "300 400 500 600 700 800 900"},
		{"orbit.altitude_km=300:950:100", "300 400 500 600 700 800 900"},
		{"albedo.value=0.1:0.3:0.1", "0.1 0.2 0.3"},
		{"orbit.ltan=06:00,10:30,13:30", "06:00 10:30 13:30"},
		{"orbit.ltan=10:30", "10:30"},
		{"epoch=2026-03-20T00:00:00Z,2026-06-21T00:00:00Z", "2026-03-20T00:00:00Z 2026-06-21T00:00:00Z"},
	} {
		a, err := ParseAxis(tc.spec)
		if err != nil {
			t.Errorf("%s: %v", tc.spec, err)
			continue
		}
		if got := strings.Join(a.Values, " "); got != tc.want {
			t.Errorf("%s: values %q, want %q", tc.spec, got, tc.want)
		}
	}
	for _, bad := range []string{"orbit.altitude_km", "=1,2", "x=300:200:10", "x=1:2:0", "x=1,,2", "body.sensors[a].x=1"} {
		if _, err := ParseAxis(bad); err == nil {
			t.Errorf("%s: no error", bad)
		}
	}
}

func TestCasesCrossAndZip(t *testing.T) {
	ax := []Axis{{"a", []string{"1", "2"}}, {"b", []string{"x", "y", "z"}}}
	c, err := Cases(ax, false)
	if err != nil || len(c) != 6 || c[0][0] != "1" || c[0][1] != "x" || c[1][1] != "y" || c[3][0] != "2" {
		t.Fatalf("cross product %v, %v", c, err)
	}
	if _, err := Cases(ax, true); err == nil || !strings.Contains(err.Error(), "equal length") {
		t.Errorf("zip of unequal lists: %v", err)
	}
	ax[1].Values = ax[1].Values[:2]
	if c, err := Cases(ax, true); err != nil || len(c) != 2 || c[1][1] != "y" {
		t.Errorf("zip %v, %v", c, err)
	}
}

func plan(t *testing.T, zip bool, specs ...string) *Plan {
	t.Helper()
	var axes []Axis
	for _, s := range specs {
		a, err := ParseAxis(s)
		if err != nil {
			t.Fatal(err)
		}
		axes = append(axes, a)
	}
	p, err := NewPlan([]byte(base), t.TempDir(), axes, zip)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

func TestEditsReachTheScenario(t *testing.T) {
	// The layout replaces body.sensors before the finer edit refines it.
	p := plan(t, false, "body.sensors[1].half_angle_deg=45", "epoch=2026-06-21T00:00:00Z", "layout=two", "mode=sunward")
	s := p.Scenario(0)
	if len(s.Body.Sensors) != 2 || s.Body.Sensors[1].Name != "c" || math.Abs(s.Body.Sensors[1].HalfAngleRad-math.Pi/4) > 1e-12 {
		t.Errorf("sensors %+v", s.Body.Sensors)
	}
	if s.Attitude.Name != scenario.LawSun || s.Epoch.Month() != 6 {
		t.Errorf("attitude %q epoch %v", s.Attitude.Name, s.Epoch)
	}
}

func TestBadKeysAreNamed(t *testing.T) {
	for _, tc := range []struct{ spec, want string }{
		{"body.sensors[9].half_angle_deg=45", "body.sensors[9] is out of range"},
		{"orbit.altitude=500", "orbit.altitude"},
		{"orbit.altitude_km=-5", "orbit.altitude_km"},
		{"layout=nine", `no entry named "nine"`},
		{"mode=spinning", "modes has no entry"},
		{"name.first=x", "name is not a mapping"},
	} {
		a, err := ParseAxis(tc.spec)
		if err != nil {
			t.Fatal(err)
		}
		_, err = NewPlan([]byte(base), t.TempDir(), []Axis{a}, false)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want it to contain %q", tc.spec, err, tc.want)
		}
	}
}

// fake is a cheap deterministic case run: the headline echoes the inputs and
// the seed.
func fake(_ context.Context, s *scenario.Scenario, seed uint64) (Outcome, error) {
	h := sim.Headline{SunlitFraction: s.Orbit.AltitudeKm / 1000, Seen3: float64(seed%1000) / 1000,
		Estimator: "fake", P95AlbedoDeg: math.NaN(), Eclipses: int(s.Body.Sensors[0].HalfAngleRad * 100)}
	return Outcome{Headline: h, Targets: study.CheckTargets(s, h, sky.Result{})}, nil
}

func csvOf(t *testing.T, dirs ...string) []byte {
	t.Helper()
	if _, err := WriteOutputs(dirs, true, scenarioCaption(), nil); err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(filepath.Join(dirs[0], "sweep.csv"))
	if err != nil {
		t.Fatal(err)
	}
	return b
}

func TestResumeAfterCancelIsByteIdentical(t *testing.T) {
	p := plan(t, false, "orbit.altitude_km=400:700:100", "body.sensors[0].half_angle_deg=50,60,70")
	full := t.TempDir()
	if _, err := Execute(context.Background(), p, full, Options{Workers: 2, Run: fake}); err != nil {
		t.Fatal(err)
	}
	want := csvOf(t, full)

	dir := t.TempDir()
	ctx, cancel := context.WithCancel(context.Background())
	var n atomic.Int32
	_, err := Execute(ctx, p, dir, Options{Workers: 2, Run: fake, Done: func(int) {
		if n.Add(1) == 5 {
			cancel()
		}
	}})
	if err == nil {
		t.Fatal("cancelled sweep returned no error")
	}
	if _, err := WriteOutputs([]string{dir}, true, scenarioCaption(), nil); err == nil || !strings.Contains(err.Error(), "missing") {
		t.Errorf("table of a partial sweep: %v", err)
	}
	if _, err := os.Stat(filepath.Join(dir, "sweep.csv")); err == nil {
		t.Error("a partial sweep wrote sweep.csv")
	}
	sum, err := Execute(context.Background(), p, dir, Options{Workers: 1, Run: fake})
	if err != nil {
		t.Fatal(err)
	}
	if sum.Skipped < 5 || sum.Skipped+sum.Ran != 12 {
		t.Errorf("resume summary %+v", sum)
	}
	if got := csvOf(t, dir); !bytes.Equal(got, want) {
		t.Errorf("resumed table differs:\n%s\nwant\n%s", got, want)
	}
	// A different sweep into the same folder is refused.
	q := plan(t, false, "orbit.altitude_km=400:700:50")
	if _, err := Execute(context.Background(), q, dir, Options{Run: fake}); err == nil || !strings.Contains(err.Error(), "another sweep") {
		t.Errorf("foreign sweep into a used folder: %v", err)
	}
}

func TestShardsMergeToTheUnshardedTable(t *testing.T) {
	p := plan(t, false, "orbit.altitude_km=400:800:100", "orbit.inclination_deg=10,50")
	full := t.TempDir()
	if _, err := Execute(context.Background(), p, full, Options{Run: fake}); err != nil {
		t.Fatal(err)
	}
	want := csvOf(t, full)
	var dirs []string
	for k := 1; k <= 3; k++ {
		d := t.TempDir()
		sum, err := Execute(context.Background(), p, d, Options{ShardK: k, ShardN: 3, Run: fake})
		if err != nil {
			t.Fatal(err)
		}
		if sum.Ran != sum.InShard || sum.InShard < 3 {
			t.Errorf("shard %d: %+v", k, sum)
		}
		dirs = append(dirs, d)
	}
	if got := csvOf(t, dirs...); !bytes.Equal(got, want) {
		t.Errorf("merged table differs:\n%s\nwant\n%s", got, want)
	}
	if _, err := Execute(context.Background(), p, t.TempDir(), Options{ShardK: 4, ShardN: 3, Run: fake}); err == nil {
		t.Error("shard 4/3 accepted")
	}
}

// TestWorkersDoNotChangeResults runs the real simulation (tumbling, so the
// seed drives the attitude) with 1 and 2 workers.
func TestWorkersDoNotChangeResults(t *testing.T) {
	p := plan(t, false, "orbit.altitude_km=400,600", "orbit.inclination_deg=0,60")
	var tables [][]byte
	for _, w := range []int{1, 2} {
		d := t.TempDir()
		if _, err := Execute(context.Background(), p, d, Options{Workers: w}); err != nil {
			t.Fatal(err)
		}
		tables = append(tables, csvOf(t, d))
	}
	if !bytes.Equal(tables[0], tables[1]) {
		t.Errorf("1 worker:\n%s\n2 workers:\n%s", tables[0], tables[1])
	}
}

func scenarioCaption() plots.Caption { return plots.Caption{Scenario: "sweep test"} }

// A case's problem points at the user's file: a key of the file by its own
// line and column there, a value the sweep set by the --vary that set it
// (the case file is an edited copy whose lines are not the user's).
func TestCaseErrorsPointAtTheUsersFile(t *testing.T) {
	// Blank lines and spacing the edited copy would not keep.
	text := strings.Replace(strings.Replace(base, "duration: 1h\n", "\n\nduration: 1h\n\n", 1), "step: 30s", "step:   30s", 1)
	lineOf := func(prefix string) int {
		for i, l := range strings.Split(text, "\n") {
			if strings.HasPrefix(l, prefix) {
				return i + 1
			}
		}
		t.Fatalf("no line %q", prefix)
		return 0
	}
	for _, tc := range []struct{ spec, want string }{
		{"orbit.altitud_km=400", "orbit.altitud_km (set by --vary orbit.altitud_km): key"},
		{"orbit.altitude_km=50", "orbit.altitude_km (set by --vary orbit.altitude_km): value 50"},
		{"duration=10s", fmt.Sprintf("step (line %d, col 9): value 30s is longer than the duration 10s", lineOf("step:"))},
	} {
		a, err := ParseAxis(tc.spec)
		if err != nil {
			t.Fatal(err)
		}
		_, err = NewPlan([]byte(text), t.TempDir(), []Axis{a}, false)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("--vary %s: error\n%v\nwant it to contain %q", tc.spec, err, tc.want)
		}
	}
}
