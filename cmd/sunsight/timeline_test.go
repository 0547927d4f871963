package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// timelineFile is a demo timeline (invented 6U): tumbling deployment,
// detumble, a slew to sun pointing until the sun has been held 5 min, then
// nadir science holding attitude in eclipse.
const timelineFile = `name: demo timeline
duration: 6h
step: 20s
orbit: {altitude_km: 525, ltan: "13:30"}
timeline:
  slew_rate_deg_s: 1.5
  slew_accel_deg_s2: 0.05
  phases:
    - {name: deployment, attitude: {law: tumble, min_rate_deg_s: 6, max_rate_deg_s: 8}, until: {elapsed: 20m}}
    - {name: detumble, attitude: {law: detumble, time_constant: 30m}, until: {rate_below_deg_s: 0.3}}
    - {name: acquisition, attitude: {law: sun, point_axis: "-Z"}, slew: true, until: {sun_seen_for: 5m}}
    - {name: science, attitude: {law: nadir}, slew: true, during_eclipse: hold}
albedo: {model: uniform, value: 0.3}
body:
  sensors:
    - {name: css-px, kind: cosine, face: "+X", errors: {dark_offset_1sigma: 0.005, noise_1sigma: 0.003}}
    - {name: css-mx, kind: cosine, face: "-X", errors: {dark_offset_1sigma: 0.005, noise_1sigma: 0.003}}
    - {name: css-py, kind: cosine, face: "+Y", errors: {dark_offset_1sigma: 0.005, noise_1sigma: 0.003}}
    - {name: css-my, kind: cosine, face: "-Y", errors: {dark_offset_1sigma: 0.005, noise_1sigma: 0.003}}
    - {name: css-pz, kind: cosine, face: "+Z", errors: {dark_offset_1sigma: 0.005, noise_1sigma: 0.003}}
    - {name: css-mz, kind: cosine, face: "-Z", errors: {dark_offset_1sigma: 0.005, noise_1sigma: 0.003}}
`

// A timeline run prints its phases, writes timeline.csv and the record's
// timeline array, whose samples add up to the run's and whose spans tile
// the run; every CSV column is in the data dictionary.
func TestTimelineInSummaryCSVAndJSON(t *testing.T) {
	p := filepath.Join(t.TempDir(), "timeline.yaml")
	if err := os.WriteFile(p, []byte(timelineFile), 0o644); err != nil {
		t.Fatal(err)
	}
	var so, se bytes.Buffer
	dir := filepath.Join(t.TempDir(), "csv")
	if code := runMain([]string{"run", p, "--quiet", "--csv", dir}, &so, &se); code != exitOK {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	for _, want := range []string{"Mission timeline (4 of 4 phases reached", "slew to acquisition", "detumble", "science", "attitude timeline",
		"science: 3 slew(s) back onto the law after held shadow passes"} {
		if !strings.Contains(so.String(), want) {
			t.Errorf("summary lacks %q:\n%s", want, so.String())
		}
	}
	h := csvHeader(t, filepath.Join(dir, "timeline.csv"))
	dict, _ := os.ReadFile("../../docs/data-dictionary.md")
	for _, c := range append(h, "timeline.csv") {
		if !strings.Contains(string(dict), "`"+c+"`") {
			t.Errorf("%s is not in docs/data-dictionary.md", c)
		}
	}
	so.Reset()
	if code := runMain([]string{"run", p, "--quiet", "--json"}, &so, &se); code != exitOK {
		t.Fatalf("--json exit %d: %s", code, se.String())
	}
	var rec struct {
		Timeline []struct {
			Phase     string   `json:"phase"`
			Slew      bool     `json:"slew"`
			StartS    float64  `json:"start_s"`
			DurationS float64  `json:"duration_s"`
			Samples   int      `json:"samples"`
			Valid     *float64 `json:"valid_fraction"`
			Returns   int      `json:"return_slews"`
			ReturnS   float64  `json:"return_slew_longest_s"`
		} `json:"timeline"`
	}
	if err := json.Unmarshal(so.Bytes(), &rec); err != nil {
		t.Fatal(err)
	}
	if len(rec.Timeline) != 6 {
		t.Fatalf("timeline has %d spans, want 4 phases and 2 slews: %+v", len(rec.Timeline), rec.Timeline)
	}
	n, end := 0, 0.0
	for _, s := range rec.Timeline {
		// The record keeps 10 significant digits (num).
		if math.Abs(s.StartS-end) > 1e-3 {
			t.Errorf("%s starts at %g s, the previous span ends at %g s", s.Phase, s.StartS, end)
		}
		end = s.StartS + s.DurationS
		n += s.Samples
		// Science holds nadir through each shadow pass and slews back:
		// a few minutes at 1.5°/s, 0.05°/s² for about 130°.
		if want := s.Phase == "science"; want != (s.Returns > 0) || (want && !(s.ReturnS > 60 && s.ReturnS < 200)) {
			t.Errorf("%s: %d return slews, longest %g s", s.Phase, s.Returns, s.ReturnS)
		}
	}
	if math.Abs(end-6*3600) > 1e-3 || n != 6*3600/20+1 {
		t.Errorf("spans end at %g s with %d samples; want 21600 s and %d", end, n, 6*3600/20+1)
	}
}

// The report of a timeline run has the phase table and the timeline
// figure over the whole run with its phase band.
func TestTimelineReport(t *testing.T) {
	p := filepath.Join(t.TempDir(), "timeline.yaml")
	if err := os.WriteFile(p, []byte(timelineFile), 0o644); err != nil {
		t.Fatal(err)
	}
	rep := filepath.Join(t.TempDir(), "r.html")
	var so, se bytes.Buffer
	if code := runMain([]string{"run", p, "--quiet", "--report", rep}, &so, &se); code != exitOK {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	b, err := os.ReadFile(rep)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"Mission timeline: each phase on its own", "slew to acquisition (", "slews back after held shadows, up to", ">Mission phases (slews grey)<", "Mission timeline over the whole run"} {
		if !strings.Contains(string(b), want) {
			t.Errorf("report lacks %q", want)
		}
	}
}

// With a gyro_filter block the phase table, timeline.csv, the record's
// timeline array and the report's phase table carry the filter over each
// span: the run's filter, carried across the phases, so the spans' valid
// samples add up to the run's (gyro_filter record; a definition). Without
// the block the columns are empty and the summary has none.
func TestTimelineCarriesTheFilter(t *testing.T) {
	for _, filt := range []bool{true, false} {
		text := timelineFile
		if filt {
			text += filterBlock
		}
		p := filepath.Join(t.TempDir(), "timeline.yaml")
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		var so, se bytes.Buffer
		dir, rep := filepath.Join(t.TempDir(), "csv"), filepath.Join(t.TempDir(), "r.html")
		if code := runMain([]string{"run", p, "--quiet", "--csv", dir, "--report", rep}, &so, &se); code != exitOK {
			t.Fatalf("filter %v: exit %d: %s", filt, code, se.String())
		}
		if got := strings.Contains(so.String(), "filter eclipse"); got != filt {
			t.Errorf("filter %v: phase table with filter columns %v:\n%s", filt, got, so.String())
		}
		if b, _ := os.ReadFile(rep); bytes.Contains(b, []byte("Filter p95 in eclipse")) != filt {
			t.Errorf("filter %v: the report's phase table disagrees", filt)
		}
		rows := readCSV(t, filepath.Join(dir, "timeline.csv"))
		col := map[string]int{}
		for i, h := range rows[0] {
			col[h] = i
		}
		b, err := os.ReadFile(filepath.Join(dir, "run.json"))
		if err != nil {
			t.Fatal(err)
		}
		var rec struct {
			Units []struct {
				Filter *struct {
					Valid float64 `json:"valid_fraction_of_run"`
				} `json:"gyro_filter"`
			} `json:"units"`
			Timeline []map[string]any `json:"timeline"`
		}
		if err := json.Unmarshal(b, &rec); err != nil {
			t.Fatal(err)
		}
		valid, n := 0.0, 0
		for i, r := range rows[1:] {
			s := rec.Timeline[i]
			for _, name := range []string{"filter_valid_fraction_of_run", "filter_p95_error_deg", "filter_p95_error_in_shadow_deg"} {
				k, ok := col[name]
				if !ok {
					t.Fatalf("timeline.csv lacks %s", name)
				}
				v, jv := r[k], s[name]
				if !filt || name == "filter_p95_error_in_shadow_deg" && v == "" {
					if v != "" || jv != nil {
						t.Errorf("filter %v: %s %s: csv %q, JSON %v", filt, s["phase"], name, v, jv)
					}
					continue
				}
				x, err := strconv.ParseFloat(v, 64)
				if f, ok := jv.(float64); err != nil || !ok || math.Abs(x-f) > 1e-4 {
					t.Errorf("%s %s: csv %q, JSON %v", s["phase"], name, v, jv)
				}
			}
			m := int(s["samples"].(float64))
			n += m
			if f, ok := s["filter_valid_fraction_of_run"].(float64); ok {
				valid += f * float64(m)
			}
		}
		if filt {
			if want := rec.Units[0].Filter.Valid * float64(n); math.Abs(valid-want) > 1e-6*float64(n) {
				t.Errorf("the spans hold %.3f valid filter samples, the run %.3f", valid, want)
			}
		}
	}
}
