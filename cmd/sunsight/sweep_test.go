package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

const sweepCLIScenario = `name: cli sweep
epoch: "2026-03-20T12:00:00Z"
duration: 30m
step: 60s
orbit: {altitude_km: 500, inclination_deg: 30, propagator: two-body}
attitude: {law: nadir}
body:
  sensors:
    - {name: a, kind: cosine, face: "+X"}
    - {name: b, kind: cosine, face: "-Z"}
    - {name: c, kind: cosine, face: "+Y"}
albedo: {model: none}
`

func TestSweepCommandAndShardMerge(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "s.yaml")
	os.WriteFile(file, []byte(sweepCLIScenario), 0o644)
	var out, errb bytes.Buffer
	full := filepath.Join(dir, "full")
	if code := runMain([]string{"sweep", file, "--vary", "orbit.altitude_km=400:600:100", "--out", full, "--no-plots"}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	want, _ := os.ReadFile(filepath.Join(full, "sweep.csv"))
	var shards []string
	for _, k := range []string{"1/2", "2/2"} {
		d := filepath.Join(dir, "shard"+k[:1])
		if code := runMain([]string{"sweep", file, "--vary", "orbit.altitude_km=400:600:100", "--shard", k, "--out", d}, &out, &errb); code != 0 {
			t.Fatalf("shard %s: exit %d: %s", k, code, errb.String())
		}
		shards = append(shards, d)
	}
	if code := runMain(append([]string{"merge", "--no-plots"}, shards...), &out, &errb); code != 0 {
		t.Fatalf("merge: exit %d: %s", code, errb.String())
	}
	got, _ := os.ReadFile(filepath.Join(shards[0], "sweep.csv"))
	if !bytes.Equal(got, want) || len(want) == 0 {
		t.Errorf("merged:\n%s\nunsharded:\n%s", got, want)
	}
	errb.Reset()
	if code := runMain([]string{"sweep", file, "--vary", "orbit.altitud_km=400", "--out", filepath.Join(dir, "bad")}, &out, &errb); code != 2 || !strings.Contains(errb.String(), "orbit.altitud_km") {
		t.Errorf("bad key: exit %d, %s", code, errb.String())
	}
	if _, err := os.Stat(filepath.Join(dir, "bad")); err == nil {
		t.Error("a rejected sweep created its output folder")
	}
}
