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

// run runs the scenario's modes beside the primary attitude: the JSON
// record lists the primary first and then each mode with its own headline,
// the summary prints them side by side and -csv writes modes.csv. The
// dawn-dusk example's tumbling mode sees the sun differently from its
// sun-pointing primary, so the figures must differ.
func TestRunReportsModesSideBySide(t *testing.T) {
	var out, errb bytes.Buffer
	if code := runMain([]string{"run", "-quiet", "-json", "-duration", "3h", "../../examples/dawn-dusk-12u.yaml"}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var rec struct {
		Modes []struct {
			Mode     string         `json:"mode"`
			Primary  bool           `json:"primary"`
			Headline map[string]any `json:"headline"`
		} `json:"modes"`
	}
	if err := json.Unmarshal(out.Bytes(), &rec); err != nil {
		t.Fatal(err)
	}
	if len(rec.Modes) != 2 || !rec.Modes[0].Primary || rec.Modes[0].Mode != "primary" || rec.Modes[1].Mode != "tumbling" || rec.Modes[1].Primary {
		t.Fatalf("modes %+v", rec.Modes)
	}
	a, b := rec.Modes[0].Headline, rec.Modes[1].Headline
	if a["valid_fraction"] == b["valid_fraction"] && a["seen_by_2_fraction"] == b["seen_by_2_fraction"] {
		t.Errorf("tumbling mode gives the primary's figures: %v", b)
	}
	out.Reset()
	dir := filepath.Join(t.TempDir(), "csv")
	if code := runMain([]string{"run", "-quiet", "-duration", "3h", "-csv", dir, "../../examples/dawn-dusk-12u.yaml"}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(out.String(), "Modes side by side") || !strings.Contains(out.String(), "tumbling") {
		t.Errorf("summary lacks the modes table:\n%s", out.String())
	}
	csv, err := os.ReadFile(filepath.Join(dir, "modes.csv"))
	if err != nil || strings.Count(string(csv), "\n") != 3 || !strings.HasPrefix(strings.SplitN(string(csv), "\n", 3)[1], "primary,true") {
		t.Errorf("modes.csv: %v\n%s", err, csv)
	}
}

// filterBlock is a gyro_filter block (invented demo values for a MEMS rate
// gyro, as in examples/mission-6u.yaml).
const filterBlock = `gyro_filter:
  angle_random_walk_deg_rt_h: 0.3
  bias_instability_deg_h: 10
  bias_time_s: 600
  hold_bound_deg: 10
`

// withFilter writes the bundled example name with a gyro_filter block
// added, into a temporary folder.
func withFilter(t *testing.T, name string) string {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("..", "..", "examples", name))
	if err != nil {
		t.Fatal(err)
	}
	p := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(p, append(b, filterBlock...), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// With a gyro_filter block the modes table, modes.csv and the modes of the
// JSON record carry the filter's valid share and p95 errors (whole run, in
// eclipse) in each attitude. The primary row is the primary run's own
// filter (its gyro_filter record, to the CSV rounding); the tumbling mode
// of the dawn-dusk example turns the body, so its filter figures differ.
// Without the block the columns are empty and the summary has none.
func TestModesCarryTheFilter(t *testing.T) {
	for _, c := range []struct {
		name, file string
		filter     bool
	}{{"gyro_filter", withFilter(t, "dawn-dusk-12u.yaml"), true}, {"none", "../../examples/dawn-dusk-12u.yaml", false}} {
		dir := filepath.Join(t.TempDir(), "csv")
		var out, errb bytes.Buffer
		if code := runMain([]string{"run", "--quiet", "--duration", "3h", "--csv", dir, c.file}, &out, &errb); code != 0 {
			t.Fatalf("%s: exit %d: %s", c.name, code, errb.String())
		}
		if got := strings.Contains(out.String(), "filter valid"); got != c.filter {
			t.Errorf("%s: modes table has filter columns %v:\n%s", c.name, got, out.String())
		}
		rows := readCSV(t, filepath.Join(dir, "modes.csv"))
		col := map[string]int{}
		for i, h := range rows[0] {
			col[h] = i
		}
		names := []string{"filter_valid_fraction_of_run", "filter_p95_error_deg", "filter_p95_error_in_shadow_deg"}
		var b []byte
		var err error
		if b, err = os.ReadFile(filepath.Join(dir, "run.json")); err != nil {
			t.Fatal(err)
		}
		var rec struct {
			Units []struct {
				Filter *struct {
					Valid float64 `json:"valid_fraction_of_run"`
					Err   struct {
						P95 float64 `json:"p95_deg"`
					} `json:"error"`
					ErrShadow struct {
						P95 float64 `json:"p95_deg"`
					} `json:"error_in_shadow"`
				} `json:"gyro_filter"`
			} `json:"units"`
			Modes []struct {
				Headline map[string]any `json:"headline"`
			} `json:"modes"`
		}
		if err := json.Unmarshal(b, &rec); err != nil {
			t.Fatal(err)
		}
		for i, r := range rows[1:] {
			for _, n := range names {
				k, ok := col[n]
				if !ok {
					t.Fatalf("%s: modes.csv lacks %s: %v", c.name, n, rows[0])
				}
				v, jv := r[k], rec.Modes[i].Headline[n]
				if !c.filter {
					if v != "" || jv != nil {
						t.Errorf("%s: %s row %d: csv %q, JSON %v without a filter", c.name, n, i, v, jv)
					}
					continue
				}
				x, err := strconv.ParseFloat(v, 64)
				if f, ok := jv.(float64); err != nil || !ok || math.Abs(x-f) > 1e-4 {
					t.Errorf("%s: %s row %d: csv %q, JSON %v", c.name, n, i, v, jv)
				}
			}
		}
		if !c.filter {
			continue
		}
		f := rec.Units[0].Filter
		if f == nil {
			t.Fatalf("%s: no gyro_filter record", c.name)
		}
		p := rows[1]
		for n, want := range map[string]float64{names[0]: f.Valid, names[1]: f.Err.P95, names[2]: f.ErrShadow.P95} {
			if x, _ := strconv.ParseFloat(p[col[n]], 64); math.Abs(x-want) > 1e-4 {
				t.Errorf("primary %s %g, gyro_filter record %g", n, x, want)
			}
		}
		if m := rows[2]; m[col[names[1]]] == p[col[names[1]]] && m[col[names[2]]] == p[col[names[2]]] {
			t.Errorf("the tumbling mode's filter figures are the primary's: %v", m)
		}
	}
}
