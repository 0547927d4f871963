package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// singleFailureFile is a demo scenario with the single-failure study: a
// nadir-pointing cube of six cosine sensors with realistic errors.
const singleFailureFile = `name: demo single failure
duration: 2h
step: 20s
orbit: {altitude_km: 550, ltan: "10:30"}
attitude: {law: nadir}
estimators: [least-squares]
albedo: {model: uniform, value: 0.3}
body:
  sensors:
    - {name: css-px, kind: cosine, face: "+X", errors: {dark_offset_1sigma: 0.005, gain_1sigma: 0.02, noise_1sigma: 0.003}}
    - {name: css-mx, kind: cosine, face: "-X", errors: {dark_offset_1sigma: 0.005, gain_1sigma: 0.02, noise_1sigma: 0.003}}
    - {name: css-py, kind: cosine, face: "+Y", errors: {dark_offset_1sigma: 0.005, gain_1sigma: 0.02, noise_1sigma: 0.003}}
    - {name: css-my, kind: cosine, face: "-Y", errors: {dark_offset_1sigma: 0.005, gain_1sigma: 0.02, noise_1sigma: 0.003}}
    - {name: css-pz, kind: cosine, face: "+Z", errors: {dark_offset_1sigma: 0.005, gain_1sigma: 0.02, noise_1sigma: 0.003}}
    - {name: css-mz, kind: cosine, face: "-Z", errors: {dark_offset_1sigma: 0.005, gain_1sigma: 0.02, noise_1sigma: 0.003}}
targets:
  n_minus_1: {min_valid_fraction: 0.99, max_error_p95_deg: 60, max_gap: 10h, also_pairs: true}
`

func writeSingleFailureFile(t *testing.T) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), "single-failure.yaml")
	if err := os.WriteFile(p, []byte(singleFailureFile), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// targets.n_minus_1 runs the single-failure study: one row per sensor in
// the summary and the JSON record, the worst named, its targets judged with
// the others so the summary, the JSON verdict and the exit status agree (a
// cube of six faces loses the directions its failed face saw: the valid
// share target of 99 % fails).
func TestSingleFailureInSummaryJSONAndExit(t *testing.T) {
	p := writeSingleFailureFile(t)
	var so, se bytes.Buffer
	if code := runMain([]string{"run", p, "--quiet"}, &so, &se); code != exitTargetFailed {
		t.Fatalf("exit %d, want %d (n_minus_1 valid target missed): %s", code, exitTargetFailed, se.String())
	}
	sum := so.String()
	for _, want := range []string{"Single failure over time", "css-mz", "(worst)", "pairs failed together, worst 5 of 15", "FAIL sunlit time with a valid sun vector, any one sensor failed"} {
		if !strings.Contains(sum, want) {
			t.Errorf("summary lacks %q:\n%s", want, sum)
		}
	}
	dir := filepath.Join(t.TempDir(), "csv")
	so.Reset()
	if code := runMain([]string{"run", p, "--quiet", "--csv", dir}, &so, &se); code != exitTargetFailed {
		t.Fatalf("--csv exit %d, want %d: %s", code, exitTargetFailed, se.String())
	}
	if h := csvHeader(t, filepath.Join(dir, "single_failure.csv")); len(h) != 13 || h[0] != "failed_sensor" {
		t.Errorf("single_failure.csv header %v", h)
	}
	dict, _ := os.ReadFile("../../docs/data-dictionary.md")
	for _, c := range append(csvHeader(t, filepath.Join(dir, "single_failure.csv")), "single_failure.csv") {
		if !strings.Contains(string(dict), "`"+c+"`") {
			t.Errorf("%s is not in docs/data-dictionary.md", c)
		}
	}
	if b, _ := os.ReadFile(filepath.Join(dir, "single_failure.csv")); strings.Count(string(b), "\n") != 1+6+15 {
		t.Errorf("single_failure.csv has %d lines, want a header, 6 sensors and 15 pairs:\n%s", strings.Count(string(b), "\n"), b)
	}
	so.Reset()
	if code := runMain([]string{"run", p, "--quiet", "--json"}, &so, &se); code != exitTargetFailed {
		t.Fatalf("--json exit %d, want %d", code, exitTargetFailed)
	}
	var rec struct {
		SingleFailure struct {
			Estimator   string `json:"estimator"`
			WorstSensor string `json:"worst_sensor"`
			Failed      []struct {
				Sensor string   `json:"failed_sensor"`
				Valid  *float64 `json:"valid_fraction"`
			} `json:"failed"`
			WorstPair   []string `json:"worst_pair"`
			FailedPairs []struct {
				Sensors []string `json:"failed_sensors"`
			} `json:"failed_pairs"`
		} `json:"single_failure"`
		Targets []struct {
			Key  string `json:"key"`
			Pass bool   `json:"pass"`
		} `json:"targets"`
		Verdict struct {
			Status string   `json:"status"`
			Failed []string `json:"failed_targets"`
		} `json:"verdict"`
	}
	if err := json.Unmarshal(so.Bytes(), &rec); err != nil {
		t.Fatal(err)
	}
	sf := rec.SingleFailure
	if sf.Estimator != "least-squares" || len(sf.Failed) != 6 || sf.WorstSensor == "" {
		t.Fatalf("single_failure %+v: want least-squares, 6 rows, a worst sensor", sf)
	}
	if len(sf.FailedPairs) != 15 || len(sf.WorstPair) != 2 || len(sf.FailedPairs[0].Sensors) != 2 {
		t.Errorf("failed_pairs %d (want 15 = 6·5/2), worst_pair %v", len(sf.FailedPairs), sf.WorstPair)
	}
	worst := 2.0
	for _, f := range sf.Failed {
		if f.Valid != nil && *f.Valid < worst {
			worst = *f.Valid
		}
	}
	t.Logf("worst single failure %s: valid %.4f", sf.WorstSensor, worst)
	keys := map[string]bool{}
	for _, tg := range rec.Targets {
		keys[tg.Key] = tg.Pass
	}
	if pass, ok := keys["n-minus-1-valid"]; !ok || pass {
		t.Errorf("targets %+v: want n-minus-1-valid failed", rec.Targets)
	}
	if _, ok := keys["n-minus-1-error-p95"]; !ok {
		t.Errorf("targets %+v: want n-minus-1-error-p95", rec.Targets)
	}
	if _, ok := keys["n-minus-1-gap"]; !ok {
		t.Errorf("targets %+v: want n-minus-1-gap", rec.Targets)
	}
	if rec.Verdict.Status != "failed" || !strings.Contains(strings.Join(rec.Verdict.Failed, " "), "n-minus-1-valid") {
		t.Errorf("verdict %+v: want failed naming n-minus-1-valid", rec.Verdict)
	}
}

// Without targets.n_minus_1 there is no single-failure record.
func TestNoSingleFailureWithoutTheKey(t *testing.T) {
	p := filepath.Join(t.TempDir(), "plain.yaml")
	if err := os.WriteFile(p, []byte(singleFailureFile[:strings.Index(singleFailureFile, "targets:")]), 0o644); err != nil {
		t.Fatal(err)
	}
	var so, se bytes.Buffer
	if code := runMain([]string{"run", p, "--quiet", "--json"}, &so, &se); code != exitOK {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	if strings.Contains(so.String(), "single_failure") {
		t.Errorf("a run without targets.n_minus_1 writes a single_failure record")
	}
}

// check says what the single-failure study will run: 6 sensors and 15
// pairs, replayed from the recorded geometry.
func TestCheckShowsSingleFailureStudy(t *testing.T) {
	var so, se bytes.Buffer
	if code := runMain([]string{"check", writeSingleFailureFile(t)}, &so, &se); code != exitOK {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	if want := "single-failure study (targets.n_minus_1): 21 failed layouts, replaying"; !strings.Contains(so.String(), want) {
		t.Errorf("check output lacks %q:\n%s", want, so.String())
	}
}

// The report shows the single-failure table and its banner counts the
// n_minus_1 targets, as the summary and the JSON verdict do.
func TestReportShowsSingleFailure(t *testing.T) {
	rep := filepath.Join(t.TempDir(), "r.html")
	var so, se bytes.Buffer
	if code := runMain([]string{"run", writeSingleFailureFile(t), "--quiet", "--report", rep}, &so, &se); code != exitTargetFailed {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	b, err := os.ReadFile(rep)
	if err != nil {
		t.Fatal(err)
	}
	html := string(b)
	for _, want := range []string{"Single failure over time", "(worst)", "(worst pair)", "targets failed"} {
		if !strings.Contains(html, want) {
			t.Errorf("report lacks %q", want)
		}
	}
}

// With a gyro_filter block the single-failure table, the record's failed
// entries, single_failure.csv and the report's table carry the filter
// flown on the sensors left. The replayed layout's filter is that of a run
// of the scenario written without the failed sensor (its gyro_filter
// record); without the block the figures are null and the columns empty.
func TestSingleFailureCarriesTheFilter(t *testing.T) {
	for _, filt := range []bool{true, false} {
		text := singleFailureFile
		if filt {
			text += filterBlock
		}
		p := filepath.Join(t.TempDir(), "sf.yaml")
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		dir, rep := filepath.Join(t.TempDir(), "csv"), filepath.Join(t.TempDir(), "r.html")
		var so, se bytes.Buffer
		if code := runMain([]string{"run", p, "--quiet", "--csv", dir, "--report", rep}, &so, &se); code != exitTargetFailed {
			t.Fatalf("filter %v: exit %d: %s", filt, code, se.String())
		}
		if got := strings.Contains(so.String(), "filter eclipse"); got != filt {
			t.Errorf("filter %v: table with filter columns %v:\n%s", filt, got, so.String())
		}
		if b, _ := os.ReadFile(rep); bytes.Contains(b, []byte("Filter p95 in eclipse")) != filt {
			t.Errorf("filter %v: the report's table disagrees", filt)
		}
		b, err := os.ReadFile(filepath.Join(dir, "run.json"))
		if err != nil {
			t.Fatal(err)
		}
		var rec struct {
			SF struct {
				Failed []map[string]any `json:"failed"`
			} `json:"single_failure"`
		}
		if err := json.Unmarshal(b, &rec); err != nil {
			t.Fatal(err)
		}
		rows := readCSV(t, filepath.Join(dir, "single_failure.csv"))
		col := map[string]int{}
		for i, h := range rows[0] {
			col[h] = i
		}
		names := []string{"filter_valid_fraction_of_run", "filter_p95_error_deg", "filter_p95_error_in_shadow_deg"}
		for i, f := range rec.SF.Failed {
			for _, n := range names {
				v, jv := rows[1+i][col[n]], f[n]
				if !filt {
					if v != "" || jv != nil {
						t.Errorf("no filter: %s %s: csv %q, JSON %v", f["failed_sensor"], n, v, jv)
					}
					continue
				}
				x, err := strconv.ParseFloat(v, 64)
				if g, ok := jv.(float64); err != nil || !ok || math.Abs(x-g) > 1e-4 {
					t.Errorf("%s %s: csv %q, JSON %v", f["failed_sensor"], n, v, jv)
				}
			}
		}
		if !filt {
			continue
		}
		// The scenario flown without css-px, run in full.
		without := strings.Join(slices.DeleteFunc(strings.Split(text, "\n"), func(l string) bool { return strings.Contains(l, "css-px") }), "\n")
		without = strings.Replace(without, "targets:\n  n_minus_1: {min_valid_fraction: 0.99, max_error_p95_deg: 60, max_gap: 10h, also_pairs: true}\n", "", 1)
		q := filepath.Join(t.TempDir(), "without.yaml")
		if err := os.WriteFile(q, []byte(without), 0o644); err != nil {
			t.Fatal(err)
		}
		so.Reset()
		if code := runMain([]string{"run", q, "--quiet", "--json"}, &so, &se); code != exitOK {
			t.Fatalf("without css-px: exit %d: %s", code, se.String())
		}
		var full struct {
			Headline map[string]any `json:"headline"`
		}
		if err := json.Unmarshal(so.Bytes(), &full); err != nil {
			t.Fatal(err)
		}
		f := rec.SF.Failed[0]
		if f["failed_sensor"] != "css-px" {
			t.Fatalf("first failed entry %v", f["failed_sensor"])
		}
		for _, n := range names {
			if f[n] != full.Headline[n] || f[n] == nil {
				t.Errorf("css-px failed: %s %v replayed, %v run without it", n, f[n], full.Headline[n])
			}
		}
	}
}
