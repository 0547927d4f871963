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

// A run with panels writes the array power into series.csv and one row per
// whole orbit into power_orbits.csv (every name in the data dictionary);
// the orbit means agree with the JSON record's energy per orbit, and the
// power figure is drawn. Without panels neither the column nor the file
// nor the figure appears.
func TestPowerCSVAndFigure(t *testing.T) {
	doc, err := os.ReadFile("../../docs/data-dictionary.md")
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	csvDir, plotDir := filepath.Join(dir, "csv"), filepath.Join(dir, "plots")
	var so, se bytes.Buffer
	if code := runMain([]string{"run", "../../examples/power-6u.yaml", "--duration", "4h", "--csv", csvDir, "--plots", plotDir, "--quiet"}, &so, &se); code != exitOK && code != exitTargetFailed {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	read := func(name string) [][]string {
		f, err := os.Open(filepath.Join(csvDir, name))
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
	series := read("series.csv")
	col := -1
	for i, c := range series[0] {
		if c == "array_power_w" {
			col = i
		}
	}
	if col < 0 {
		t.Fatalf("series.csv header %v has no array_power_w", series[0])
	}
	var lit, dark int
	for _, r := range series[1:] {
		w, err := strconv.ParseFloat(r[col], 64)
		if err != nil || w < 0 {
			t.Fatalf("array_power_w %q", r[col])
		}
		switch {
		case r[2] == "umbra" && w != 0:
			t.Errorf("umbra at %s s: %g W", r[0], w)
		case r[2] == "umbra":
			dark++
		case r[2] == "sunlit" && w > 0:
			lit++
		}
	}
	if lit == 0 || dark == 0 {
		t.Errorf("%d sunlit samples with power, %d umbra samples", lit, dark)
	}
	orbits := read("power_orbits.csv")
	for _, c := range orbits[0] {
		if !strings.Contains(string(doc), "`"+c+"`") {
			t.Errorf("power_orbits.csv column %s is not in the data dictionary", c)
		}
	}
	for _, n := range []string{"`power_orbits.csv`", "`array_power_w`"} {
		if !strings.Contains(string(doc), n) {
			t.Errorf("%s is not in the data dictionary", n)
		}
	}
	if len(orbits) != 3 { // 4 h at 95.6 min: two whole orbits
		t.Fatalf("power_orbits.csv has %d rows, want a header and 2 orbits", len(orbits))
	}
	var rec struct {
		Power struct {
			MeanWh float64 `json:"energy_per_orbit_mean_wh"`
		} `json:"power"`
	}
	b, err := os.ReadFile(filepath.Join(csvDir, "run.json"))
	if err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(b, &rec); err != nil {
		t.Fatal(err)
	}
	mean := 0.0
	for _, r := range orbits[1:] {
		wh, _ := strconv.ParseFloat(r[4], 64)
		mean += wh / 2
	}
	if want := rec.Power.MeanWh; math.Abs(mean-want) > 1e-3 {
		t.Errorf("power_orbits.csv mean energy %.4f Wh, record %.4f Wh", mean, want)
	}
	if _, err := os.Stat(filepath.Join(plotDir, "power.png")); err != nil {
		t.Errorf("power figure: %v", err)
	}

	bare := filepath.Join(dir, "bare")
	if code := runMain([]string{"run", "../../examples/nadir-6u-sso.yaml", "--duration", "2h", "--csv", bare, "--plots", filepath.Join(dir, "bareplots"), "--quiet"}, &so, &se); code != exitOK && code != exitTargetFailed {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	if b, _ := os.ReadFile(filepath.Join(bare, "series.csv")); bytes.Contains(b, []byte("array_power_w")) {
		t.Error("series.csv of a run without panels has a power column")
	}
	for _, f := range []string{filepath.Join(bare, "power_orbits.csv"), filepath.Join(dir, "bareplots", "power.png")} {
		if _, err := os.Stat(f); err == nil {
			t.Errorf("%s written for a run without panels", f)
		}
	}
}
