package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"
)

// jsonNames collects every object key of a JSON document.
func jsonNames(v any, into map[string]bool) {
	switch x := v.(type) {
	case map[string]any:
		for k, e := range x {
			into[k] = true
			jsonNames(e, into)
		}
	case []any:
		for _, e := range x {
			jsonNames(e, into)
		}
	}
}

func csvHeader(t *testing.T, path string) []string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	h, err := csv.NewReader(f).Read()
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return h
}

// Every name in real outputs — the JSON records of every example, the CSV
// tables of a run with modes and several units, a sweep table and case file
// — is listed (in backquotes) in docs/data-dictionary.md.
func TestDataDictionaryListsEveryName(t *testing.T) {
	doc, err := os.ReadFile("../../docs/data-dictionary.md")
	if err != nil {
		t.Fatal(err)
	}
	names := map[string]bool{}
	for _, b := range realRecords(t) {
		var v any
		if err := json.Unmarshal(b, &v); err != nil {
			t.Fatal(err)
		}
		jsonNames(v, names)
	}
	dir := filepath.Join(t.TempDir(), "csv")
	var so, se bytes.Buffer
	if code := runMain([]string{"run", "../../examples/dawn-dusk-12u.yaml", "--duration", "2h", "--units", "2", "--csv", dir, "--all-units", "--quiet"}, &so, &se); code != exitOK && code != exitTargetFailed {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	files, _ := filepath.Glob(filepath.Join(dir, "*.csv"))
	if len(files) < 6 {
		t.Fatalf("only %d CSV files", len(files))
	}
	for _, f := range files {
		if !strings.Contains(string(doc), "`"+filepath.Base(f)+"`") {
			t.Errorf("file %s is not in the data dictionary", filepath.Base(f))
		}
		for _, c := range csvHeader(t, f) {
			if !strings.HasPrefix(c, "signal_") {
				names[c] = true
			}
		}
	}
	var m map[string]any
	b, _ := os.ReadFile(filepath.Join(dir, "manifest.json"))
	if err := json.Unmarshal(b, &m); err != nil {
		t.Fatal(err)
	}
	for k := range m {
		names[k] = true
	}
	file := writeSweepScenario(t)
	out := filepath.Join(t.TempDir(), "sweep")
	// The coverage targets add the columns of the coverage they judge.
	if code := runMain([]string{"sweep", file, "--vary", "orbit.altitude_km=400,500", "--vary", "targets.coverage_sensors=1",
		"--vary", "targets.min_coverage=0.1", "--vary", "targets.survive_one_failure=true", "--out", out, "--no-plots"}, &so, &se); code != exitOK {
		t.Fatalf("sweep exit %d: %s", code, se.String())
	}
	for _, c := range csvHeader(t, filepath.Join(out, "sweep.csv")) {
		if !strings.HasPrefix(c, "orbit.") && !strings.HasPrefix(c, "targets.") {
			names[c] = true
		}
	}
	for _, p := range []string{filepath.Join(out, "cases", "00000.json"), filepath.Join(out, "plan.json")} {
		var v any
		b, _ := os.ReadFile(p)
		if err := json.Unmarshal(b, &v); err != nil {
			t.Fatal(err)
		}
		jsonNames(v, names)
	}
	var missing []string
	for n := range names {
		if !strings.Contains(string(doc), "`"+n+"`") {
			missing = append(missing, n)
		}
	}
	sort.Strings(missing)
	if len(missing) > 0 {
		t.Errorf("%d names are not in docs/data-dictionary.md: %s", len(missing), strings.Join(missing, ", "))
	}
	if len(names) < 100 {
		t.Errorf("only %d names collected", len(names))
	}
}
