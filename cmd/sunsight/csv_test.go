package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

func readCSV(t *testing.T, path string) [][]string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return rows
}

// series.csv has every step (3 h at 10 s: 1081 rows) unless output.decimate
// thins it, which is said on stderr; gaps.csv has start and end times whose
// difference is the duration, every estimator, and the longest gap of the
// primary estimator equals the record's; --all-units writes every unit.
func TestRunCSVResolutionGapsUnits(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "csv")
	var so, se bytes.Buffer
	code := runMain([]string{"run", "../../examples/nadir-6u-sso.yaml", "--duration", "3h", "--units", "3", "--csv", dir, "--all-units", "--quiet"}, &so, &se)
	if code != exitTargetFailed {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	if strings.Contains(se.String(), "every") {
		t.Errorf("full resolution announced thinning: %s", se.String())
	}
	if n := len(readCSV(t, filepath.Join(dir, "series.csv"))) - 1; n != 1081 {
		t.Errorf("series.csv has %d rows, want 1081 (every 10 s step of 3 h)", n)
	}
	var raw struct {
		Units []struct {
			Estimators []struct {
				Name    string  `json:"name"`
				Longest float64 `json:"longest_gap_s"`
				NumGaps int     `json:"sunlit_gaps"`
			} `json:"estimators"`
		} `json:"units"`
	}
	b, _ := os.ReadFile(filepath.Join(dir, "run.json"))
	if err := json.Unmarshal(b, &raw); err != nil {
		t.Fatal(err)
	}
	gaps := readCSV(t, filepath.Join(dir, "gaps.csv"))
	if strings.Join(gaps[0], ",") != "unit,estimator,gap_start_utc,gap_start_s,gap_end_s,gap_s" {
		t.Fatalf("gaps.csv header %v", gaps[0])
	}
	count := map[string]int{}
	longest := map[string]float64{}
	for _, r := range gaps[1:] {
		start, _ := strconv.ParseFloat(r[3], 64)
		end, _ := strconv.ParseFloat(r[4], 64)
		d, _ := strconv.ParseFloat(r[5], 64)
		if math.Abs(end-start-d) > 0.11 || r[2] == "" {
			t.Errorf("gap row %v: end − start ≠ duration", r)
		}
		k := r[0] + "/" + r[1]
		count[k]++
		longest[k] = math.Max(longest[k], d)
	}
	for u, unit := range raw.Units {
		for _, e := range unit.Estimators {
			k := strconv.Itoa(u) + "/" + e.Name
			if count[k] != e.NumGaps || math.Abs(longest[k]-e.Longest) > 0.11 {
				t.Errorf("%s: gaps.csv %d gaps, longest %.1f s; record %d, %.1f s", k, count[k], longest[k], e.NumGaps, e.Longest)
			}
		}
	}
	if len(raw.Units) != 3 {
		t.Fatalf("%d units in the record", len(raw.Units))
	}
	est := readCSV(t, filepath.Join(dir, "estimators.csv"))
	if n := len(est) - 1; n != 3*len(raw.Units[0].Estimators) {
		t.Errorf("estimators.csv has %d rows, want 3 units × %d estimators", n, len(raw.Units[0].Estimators))
	}
	// Without --all-units: the nominal unit only.
	dir2 := filepath.Join(t.TempDir(), "csv")
	runMain([]string{"run", "../../examples/nadir-6u-sso.yaml", "--duration", "3h", "--units", "3", "--csv", dir2, "--quiet"}, &so, &se)
	for _, r := range readCSV(t, filepath.Join(dir2, "estimators.csv"))[1:] {
		if r[0] != "0" {
			t.Errorf("unit %s written without --all-units", r[0])
		}
	}
	// output.decimate thins the series and says so.
	src, _ := os.ReadFile("../../examples/nadir-6u-sso.yaml")
	scen := filepath.Join(t.TempDir(), "s.yaml")
	os.WriteFile(scen, append(src, []byte("output:\n  decimate: 10\n")...), 0o644)
	dir3 := filepath.Join(t.TempDir(), "csv")
	se.Reset()
	runMain([]string{"run", scen, "--duration", "3h", "--csv", dir3, "--quiet"}, &so, &se)
	if n := len(readCSV(t, filepath.Join(dir3, "series.csv"))) - 1; n != 109 || !strings.Contains(se.String(), "every 10-th step") {
		t.Errorf("decimate 10: %d rows (want 109), stderr %q", n, se.String())
	}
	// --all-units alone would have no effect: refused.
	if code := runMain([]string{"run", scen, "--all-units"}, &so, &se); code != exitUsage {
		t.Errorf("--all-units without --csv: exit %d", code)
	}
}
