package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"testing"

	"codeberg.org/sunsight/sunsight/internal/randscenario"
)

// Property cases of the command line: random scenarios from the same
// generator as scenario/properties, run as a user runs them. A failure
// prints the scenario file.

const propertySeed = 1

func propertyFile(t *testing.T, i int) *randscenario.File {
	grid, err := filepath.Abs("../../illum/albedo/testdata/demo_grid.csv")
	if err != nil {
		t.Fatal(err)
	}
	return randscenario.New(propertySeed, i, randscenario.Options{GridFile: grid})
}

// writeScenario writes f into a fresh folder and returns its path.
func writeScenario(t *testing.T, f *randscenario.File) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), "case.yaml")
	if err := os.WriteFile(p, f.YAML(), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func runCLI(args ...string) (code int, stdout, stderr string) {
	var out, errb bytes.Buffer
	code = runMain(args, &out, &errb)
	return code, out.String(), errb.String()
}

// Same input ⇒ byte-identical JSON for any worker count; unit 0 does not
// depend on the number of units.
func TestPropertyJSONIdenticalAcrossWorkers(t *testing.T) {
	for i := range 6 {
		f := propertyFile(t, 100+i)
		f.MonteCarlo = &randscenario.MonteCarlo{Units: 3}
		t.Run(fmt.Sprint("case", 100+i), func(t *testing.T) {
			p := writeScenario(t, f)
			var outs []string
			for _, w := range []string{"1", "2", "3", "2"} {
				code, out, errs := runCLI("run", "-json", "-quiet", "-workers", w, p)
				if code != 0 && code != exitTargetFailed {
					t.Fatalf("workers %s: exit %d: %s\n%s", w, code, errs, f.YAML())
				}
				outs = append(outs, out)
			}
			for k := 1; k < len(outs); k++ {
				if outs[k] != outs[0] {
					t.Fatalf("JSON differs between worker counts (run %d of 4)\n%s", k+1, f.YAML())
				}
			}
			code, one, errs := runCLI("run", "-json", "-quiet", "-units", "1", p)
			if code != 0 && code != exitTargetFailed {
				t.Fatalf("one unit: exit %d: %s", code, errs)
			}
			if a, b := unitZero(t, one), unitZero(t, outs[0]); a != b {
				t.Errorf("unit 0 with 1 unit:\n%s\nwith 3 units:\n%s\n%s", a, b, f.YAML())
			}
		})
	}
}

// unitZero returns unit 0 of a run's JSON, re-encoded.
func unitZero(t *testing.T, out string) string {
	t.Helper()
	var rec struct {
		Units []json.RawMessage `json:"units"`
	}
	if err := json.Unmarshal([]byte(out), &rec); err != nil || len(rec.Units) == 0 {
		t.Fatalf("JSON without units (%v): %.300s", err, out)
	}
	return string(rec.Units[0])
}

// mutations turn a valid drawn file into one at the edge of what the file
// accepts: values that load but that a build could refuse.
var mutations = []struct {
	name  string
	apply func(f *randscenario.File)
}{
	{"as drawn", func(*randscenario.File) {}},
	{"sun-synchronous at 6000 km", func(f *randscenario.File) {
		h := 6000.0
		f.Orbit = randscenario.Orbit{AltitudeKm: &h, LTAN: "10:30", Propagator: "j2-mean"}
		if f.Epoch == "" {
			f.Epoch = "2026-03-20T00:00:00Z"
		}
	}},
	{"square digital field of view of 90°", func(f *randscenario.File) {
		h, acc := 90.0, 0.2
		f.Body.Sensors = append(f.Body.Sensors, randscenario.Sensor{Name: "wide", Kind: "digital", Face: "+Z", FOVShape: "square", HalfAngleDeg: &h, AccuracyDeg1Sigma: &acc})
	}},
	{"missing grid file", func(f *randscenario.File) {
		f.Albedo = randscenario.Albedo{Model: "grid", GridFile: "no-such-grid.csv"}
	}},
	{"TLE with its perigee inside the Earth", func(f *randscenario.File) {
		f.Epoch = ""
		l1 := "1 00042U 26001A   26079.50000000  .00000000  00000-0  00000-0 0  999"
		l2 := "2 00042  51.6000  10.0000 3000000  90.0000 270.0000 14.00000000    1"
		f.Orbit = randscenario.Orbit{TLE: []string{l1 + fmt.Sprint(randscenario.Checksum(l1)), l2 + fmt.Sprint(randscenario.Checksum(l2))}}
	}},
	{"every Euler sequence", func(f *randscenario.File) {
		f.Attitude = randscenario.Law{Law: "inertial", EulerDeg: []float64{10, 20, 30}, EulerSequence: "232"}
	}},
	{"spin about a tilted sensor", func(f *randscenario.File) {
		r := 45.0
		f.Attitude = randscenario.Law{Law: "spin", SpinAxis: "-Y", RateDegS: &r, EulerDeg: []float64{0, 90, 0}, EulerSequence: "121"}
	}},
	{"grazing cosine at 90°", func(f *randscenario.File) {
		h, tilt := 90.0, 90.0
		f.Body.Sensors = append(f.Body.Sensors, randscenario.Sensor{Name: "edge", Kind: "cosine", Face: "+X", TiltDeg: &tilt, TiltToward: "+Y", HalfAngleDeg: &h})
	}},
}

// Any file check accepts, run accepts (and check refuses what run refuses),
// over random files and their mutations to the edge of the accepted ranges.
func TestPropertyCheckAcceptsThenRunAccepts(t *testing.T) {
	refused := map[string]int{}
	defer func() { t.Logf("files check refused, per mutation of 8: %v", refused) }()
	for i := range 8 {
		for _, m := range mutations {
			f := propertyFile(t, 200+i)
			m.apply(f)
			t.Run(fmt.Sprintf("case%d/%s", 200+i, m.name), func(t *testing.T) {
				p := writeScenario(t, f)
				check, _, checkErr := runCLI("check", "-q", p)
				run, _, runErr := runCLI("run", "-quiet", "-json", p)
				if check != 0 {
					refused[m.name]++
				}
				switch {
				case check == 0 && run != 0 && run != exitTargetFailed:
					t.Errorf("check accepts, run exits %d: %s\n%s", run, runErr, f.YAML())
				case check != 0 && run != check:
					t.Errorf("check exits %d (%s), run exits %d (%s)\n%s", check, checkErr, run, runErr, f.YAML())
				}
			})
		}
	}
}

// The shadow model drives every output that depends on it: in the JSON
// record the eclipse statistics are those of the eclipse list (count,
// longest complete eclipse, total shadow, the headline's minutes), and the
// sampled shadow time agrees with the listed one to within one step per
// eclipse, under either shadow model.
func TestPropertyEclipseTablesAgree(t *testing.T) {
	for i := range 6 {
		for _, shadow := range []string{"conical", "cylindrical"} {
			f := propertyFile(t, 400+i)
			f.Shadow = shadow
			t.Run(fmt.Sprintf("case%d/%s", 400+i, shadow), func(t *testing.T) {
				code, out, errs := runCLI("run", "-json", "-quiet", writeScenario(t, f))
				if code != 0 && code != exitTargetFailed {
					t.Fatalf("exit %d: %s\n%s", code, errs, f.YAML())
				}
				var rec struct {
					Eclipses []struct {
						Start float64 `json:"penumbra_start_s"`
						End   float64 `json:"penumbra_end_s"`
						Cut   bool    `json:"cut_by_span"`
					} `json:"eclipses"`
					Stats struct {
						Count  int     `json:"eclipses"`
						MaxS   float64 `json:"max_s"`
						TotalS float64 `json:"total_s"`
					} `json:"eclipse_stats"`
					Headline struct {
						Eclipses int     `json:"eclipses"`
						MaxMin   float64 `json:"eclipse_max_min"`
						Sunlit   float64 `json:"sunlit_fraction"`
						Penumbra float64 `json:"penumbra_fraction"`
					} `json:"headline"`
					RunInfo struct {
						DurationS float64 `json:"duration_s"`
						StepS     float64 `json:"step_s"`
						Steps     int     `json:"steps"`
					} `json:"run"`
				}
				if err := json.Unmarshal([]byte(out), &rec); err != nil {
					t.Fatal(err)
				}
				longest, total := 0.0, 0.0
				for _, e := range rec.Eclipses {
					if !e.Cut {
						longest = max(longest, e.End-e.Start)
					}
					total += e.End - e.Start
				}
				h, n := rec.RunInfo.StepS, float64(len(rec.Eclipses))
				sampled := (1 - rec.Headline.Sunlit) * float64(rec.RunInfo.Steps) * h
				switch {
				case rec.Stats.Count != len(rec.Eclipses) || rec.Headline.Eclipses != len(rec.Eclipses):
					t.Errorf("%d eclipses listed, statistics count %d, headline %d", len(rec.Eclipses), rec.Stats.Count, rec.Headline.Eclipses)
				case math.Abs(rec.Stats.MaxS-longest) > 1e-3 || math.Abs(rec.Headline.MaxMin*60-longest) > 1e-3:
					t.Errorf("longest complete eclipse %.3f s listed, statistics %.3f s, headline %.4f min", longest, rec.Stats.MaxS, rec.Headline.MaxMin)
				case math.Abs(rec.Stats.TotalS-total) > 1e-3:
					t.Errorf("listed shadow %.3f s, statistics total %.3f s", total, rec.Stats.TotalS)
				case math.Abs(sampled-total) > h*(n+1):
					t.Errorf("%s: sampled shadow %.1f s, listed %.1f s (%d eclipses, step %.0f s)", shadow, sampled, total, len(rec.Eclipses), h)
				case shadow == "cylindrical" && rec.Headline.Penumbra != 0:
					t.Errorf("cylindrical shadow with penumbra fraction %g", rec.Headline.Penumbra)
				}
				if t.Failed() {
					t.Log(string(f.YAML()))
				}
			})
		}
	}
}
