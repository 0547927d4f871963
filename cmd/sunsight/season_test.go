package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// seasonFile is a demo scenario of our own: a dawn-dusk orbit whose
// eclipses come only around the December solstice.
const seasonFile = `name: demo season
epoch: "2026-09-01T00:00:00Z"
duration: 2h
step: 60s
orbit: {altitude_km: 650, ltan: "06:00"}
attitude: {law: nadir}
estimators: [opposite-pairs]
body:
  sensors:
    - {name: px, kind: cosine, face: "+X", errors: {noise_1sigma: 0.003}}
    - {name: mx, kind: cosine, face: "-X", errors: {noise_1sigma: 0.003}}
    - {name: py, kind: cosine, face: "+Y", errors: {noise_1sigma: 0.003}}
    - {name: my, kind: cosine, face: "-Y", errors: {noise_1sigma: 0.003}}
    - {name: pz, kind: cosine, face: "+Z", errors: {noise_1sigma: 0.003}}
    - {name: mz, kind: cosine, face: "-Z", errors: {noise_1sigma: 0.003}}
targets: {min_valid_fraction: 0.5}
`

// season finds the longest eclipse near the December solstice, prints the
// worst epochs and the month table, and its JSON and CSV names are in the
// data dictionary.
func TestSeasonCommand(t *testing.T) {
	p := filepath.Join(t.TempDir(), "season.yaml")
	if err := os.WriteFile(p, []byte(seasonFile), 0o644); err != nil {
		t.Fatal(err)
	}
	args := []string{"season", p, "--quiet", "--span", "180d", "--cases", "6", "--refine", "1", "--case-duration", "2h"}
	var so, se bytes.Buffer
	dir := filepath.Join(t.TempDir(), "csv")
	if code := runMain(append(args, "--csv", dir), &so, &se); code != exitOK {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	for _, want := range []string{"Worst epochs", "lowest valid share", "longest eclipse", "orbits without eclipse", "2026-12"} {
		if !strings.Contains(so.String(), want) {
			t.Errorf("summary lacks %q:\n%s", want, so.String())
		}
	}
	dict, _ := os.ReadFile("../../docs/data-dictionary.md")
	for _, f := range []string{"season_cases.csv", "eclipse_months.csv"} {
		for _, c := range append(csvHeader(t, filepath.Join(dir, f)), f) {
			if !strings.Contains(string(dict), "`"+c+"`") {
				t.Errorf("%s is not in docs/data-dictionary.md", c)
			}
		}
	}
	so.Reset()
	if code := runMain(append(args, "--json"), &so, &se); code != exitOK {
		t.Fatalf("--json exit %d: %s", code, se.String())
	}
	var rec map[string]any
	if err := json.Unmarshal(so.Bytes(), &rec); err != nil {
		t.Fatal(err)
	}
	var walk func(v any)
	walk = func(v any) {
		switch x := v.(type) {
		case map[string]any:
			for k, e := range x {
				if !strings.Contains(string(dict), "`"+k+"`") {
					t.Errorf("JSON name %s is not in docs/data-dictionary.md", k)
				}
				walk(e)
			}
		case []any:
			for _, e := range x {
				walk(e)
			}
		}
	}
	walk(rec)
	var typed struct {
		Worst []struct {
			Criterion string `json:"criterion"`
			StartUTC  string `json:"start_utc"`
		} `json:"worst"`
		Eclipses struct {
			Without float64 `json:"share_without_eclipse"`
		} `json:"eclipse_distribution"`
	}
	if err := json.Unmarshal(so.Bytes(), &typed); err != nil {
		t.Fatal(err)
	}
	// Dawn-dusk at 650 km: eclipses only from about November to
	// February (closed form: |β| < asin(R/(R + h)) = 64.7° around the
	// solstice), so from September most orbits have none and the longest
	// eclipse case is in the last months of the span.
	if len(typed.Worst) != 3 || !strings.HasPrefix(typed.Worst[2].StartUTC, "2027-0") && !strings.HasPrefix(typed.Worst[2].StartUTC, "2026-1") {
		t.Errorf("worst %+v: want the longest eclipse near the December solstice", typed.Worst)
	}
	if typed.Eclipses.Without < 0.3 || typed.Eclipses.Without > 0.95 {
		t.Errorf("share without eclipse %g", typed.Eclipses.Without)
	}
	// A target missed at a worst epoch: exit status 3.
	strict := strings.Replace(seasonFile, "min_valid_fraction: 0.5", "max_error_p95_deg: 0.01", 1)
	if err := os.WriteFile(p, []byte(strict), 0o644); err != nil {
		t.Fatal(err)
	}
	so.Reset()
	se.Reset()
	if code := runMain(args, &so, &se); code != exitTargetFailed {
		t.Errorf("exit %d with a missed target, want %d: %s", code, exitTargetFailed, se.String())
	}
	// Bad options: exit status 2 with the option named.
	se.Reset()
	if code := runMain([]string{"season", p, "--cases", "1"}, &so, &se); code != exitUsage || !strings.Contains(se.String(), "cases") {
		t.Errorf("--cases 1: exit %d, %s", code, se.String())
	}
}

// Without --quiet, a season whose stderr is not a terminal (a log, a pipe)
// gets no progress counter: no carriage returns, nothing but what it says.
func TestSeasonProgressOnlyOnATerminal(t *testing.T) {
	p := filepath.Join(t.TempDir(), "season.yaml")
	if err := os.WriteFile(p, []byte(seasonFile), 0o644); err != nil {
		t.Fatal(err)
	}
	var so, se bytes.Buffer
	if code := runMain([]string{"season", p, "--span", "60d", "--cases", "3", "--refine", "1", "--case-duration", "2h"}, &so, &se); code != exitOK {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	if strings.Contains(se.String(), "\r") || strings.Contains(se.String(), "of about") {
		t.Errorf("stderr has a progress counter: %q", se.String())
	}
}
