package main

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/internal/atomicfile"
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

// writeSweepScenario writes the sweep test scenario with a gap target (the
// nadir three-face layout of 30 min has one 1800 s gap: 1h is met, 1m not).
func writeSweepScenario(t *testing.T) string {
	t.Helper()
	file := filepath.Join(t.TempDir(), "s.yaml")
	if err := os.WriteFile(file, []byte(sweepCLIScenario+"targets: {max_gap: 1h}\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	return file
}

// sweep exits 3 when any case misses a target, 0 when all meet them; the
// table has the scenario hash and one pass column per target.
func TestSweepExitStatusAndPassColumns(t *testing.T) {
	file := writeSweepScenario(t)
	for _, c := range []struct {
		vary string
		code int
		col  string
	}{
		{"targets.max_gap=1h,2h", exitOK, "true,true"},
		{"targets.max_gap=1h,1m", exitTargetFailed, "false,false"},
	} {
		out := filepath.Join(t.TempDir(), "o")
		var so, se bytes.Buffer
		code := runMain([]string{"sweep", file, "--vary", c.vary, "--out", out, "--no-plots"}, &so, &se)
		if code != c.code {
			t.Errorf("%s: exit %d, want %d (%s)", c.vary, code, c.code, se.String())
		}
		b, _ := os.ReadFile(filepath.Join(out, "sweep.csv"))
		lines := strings.Split(strings.TrimSpace(string(b)), "\n")
		if !strings.HasPrefix(lines[0], "case,seed,scenario_sha256,") || !strings.HasSuffix(lines[0], ",targets_met,target_gap_pass") {
			t.Errorf("header %s", lines[0])
		}
		if last := lines[len(lines)-1]; !strings.HasSuffix(last, ","+c.col) {
			t.Errorf("%s: last row %s, want it to end with %s", c.vary, last, c.col)
		}
	}
}

// A second sweep on a folder in use is refused at once (exit 1) and leaves
// the folder to the first.
func TestSweepLockRefusesSecond(t *testing.T) {
	file := writeSweepScenario(t)
	out := filepath.Join(t.TempDir(), "o")
	release, err := atomicfile.Lock(out)
	if err != nil {
		t.Fatal(err)
	}
	var so, se bytes.Buffer
	code := runMain([]string{"sweep", file, "--vary", "orbit.altitude_km=400,500", "--out", out, "--no-plots"}, &so, &se)
	if code != exitFailure || !strings.Contains(se.String(), "in use by another sunsight process") {
		t.Errorf("locked folder: exit %d, %s", code, se.String())
	}
	if _, err := os.Stat(filepath.Join(out, "plan.json")); err == nil {
		t.Error("the refused sweep wrote plan.json")
	}
	release()
	if code := runMain([]string{"sweep", file, "--vary", "orbit.altitude_km=400,500", "--out", out, "--no-plots"}, &so, &se); code != 0 {
		t.Errorf("after release: exit %d, %s", code, se.String())
	}
}

// Two sweeps started together on one folder: each either runs (the later one
// then resumes) or is refused as "in use"; the folder ends as one sweep's,
// its table byte-identical to a sweep run alone.
func TestConcurrentSweepsOneFolder(t *testing.T) {
	file := writeSweepScenario(t)
	args := func(out string) []string {
		return []string{"sweep", file, "--vary", "orbit.altitude_km=400:700:100", "--out", out, "--no-plots", "--workers", "1"}
	}
	alone := filepath.Join(t.TempDir(), "alone")
	var so, se bytes.Buffer
	if code := runMain(args(alone), &so, &se); code != 0 {
		t.Fatalf("alone: %d %s", code, se.String())
	}
	want, _ := os.ReadFile(filepath.Join(alone, "sweep.csv"))
	for trial := range 5 {
		out := filepath.Join(t.TempDir(), "o")
		codes := make([]int, 2)
		errs := make([]string, 2)
		done := make(chan int)
		for k := range 2 {
			go func() {
				var so, se bytes.Buffer
				codes[k] = runMain(args(out), &so, &se)
				errs[k] = se.String()
				done <- k
			}()
		}
		<-done
		<-done
		ran := 0
		for k := range 2 {
			switch {
			case codes[k] == 0:
				ran++
			case codes[k] == exitFailure && strings.Contains(errs[k], "in use"):
			default:
				t.Errorf("trial %d sweep %d: exit %d, %s", trial, k, codes[k], errs[k])
			}
		}
		got, _ := os.ReadFile(filepath.Join(out, "sweep.csv"))
		if ran == 0 || !bytes.Equal(got, want) {
			t.Errorf("trial %d: %d ran; table equal to the lone run: %v", trial, ran, bytes.Equal(got, want))
		}
	}
}

// merge verifies every case file's checksum: a hand-edited one is refused.
func TestMergeRefusesEditedCase(t *testing.T) {
	file := writeSweepScenario(t)
	out := filepath.Join(t.TempDir(), "o")
	var so, se bytes.Buffer
	if code := runMain([]string{"sweep", file, "--vary", "orbit.altitude_km=400,500", "--out", out, "--no-plots"}, &so, &se); code != 0 {
		t.Fatalf("%d %s", code, se.String())
	}
	p := filepath.Join(out, "cases", "00001.json")
	b, _ := os.ReadFile(p)
	edited := strings.Replace(string(b), `"pass": true`, `"pass": false`, 1)
	if edited == string(b) {
		t.Fatal("no pass field to edit")
	}
	os.WriteFile(p, []byte(edited), 0o644)
	se.Reset()
	if code := runMain([]string{"merge", "--no-plots", out}, &so, &se); code == 0 || !strings.Contains(se.String(), "checksum") {
		t.Errorf("edited case: exit %d, %s", code, se.String())
	}
}

// tree lists every file under dir with its contents, for before/after
// comparisons.
func tree(t *testing.T, dir string) map[string]string {
	t.Helper()
	m := map[string]string{}
	filepath.WalkDir(dir, func(p string, d os.DirEntry, err error) error {
		if err != nil {
			return err
		}
		rel, _ := filepath.Rel(dir, p)
		if d.IsDir() {
			m[rel+"/"] = ""
			return nil
		}
		b, _ := os.ReadFile(p)
		m[rel] = string(b)
		return nil
	})
	return m
}

// sweep --out refuses, before any case runs, a folder that holds files and
// is not a sunsight sweep (no plan.json): exit 2 naming the folder, and the
// folder exactly as it was (no lock, no case, the user's files untouched).
// In a sweep folder, a plots folder holding a file that is not one of its
// figures is refused too, so re-running never deletes it.
func TestSweepRefusesForeignFolder(t *testing.T) {
	file := writeSweepScenario(t)
	for _, files := range []map[string]string{
		{"plots/mine.png": "mine", "sweep.csv": "my,table\n"},
		{"notes.txt": "notes"},
		{"cases/00000.json": "{}"},
	} {
		out := filepath.Join(t.TempDir(), "user")
		for name, text := range files {
			os.MkdirAll(filepath.Dir(filepath.Join(out, name)), 0o755)
			os.WriteFile(filepath.Join(out, name), []byte(text), 0o644)
		}
		before := tree(t, out)
		var so, se bytes.Buffer
		code := runMain([]string{"sweep", file, "--vary", "orbit.altitude_km=400,500", "--out", out}, &so, &se)
		if code != exitUsage || !strings.Contains(se.String(), out) || !strings.Contains(se.String(), "not a sunsight sweep") {
			t.Errorf("%v: exit %d, stderr %q; want 2 naming the folder", files, code, se.String())
		}
		if after := tree(t, out); fmt.Sprint(after) != fmt.Sprint(before) {
			t.Errorf("%v: the folder changed:\n%v\nwas\n%v", files, after, before)
		}
	}
	// A sweep folder whose plots hold a file of the user's.
	out := filepath.Join(t.TempDir(), "o")
	args := []string{"sweep", file, "--vary", "orbit.altitude_km=400,500", "--out", out}
	var so, se bytes.Buffer
	if code := runMain(args, &so, &se); code != exitOK {
		t.Fatalf("sweep: exit %d %s", code, se.String())
	}
	mine := filepath.Join(out, "plots", "mine.png")
	os.WriteFile(mine, []byte("mine"), 0o644)
	se.Reset()
	if code := runMain(args, &so, &se); code != exitUsage || !strings.Contains(se.String(), "mine.png") {
		t.Errorf("user file in plots: exit %d, stderr %q; want 2 naming it", code, se.String())
	}
	if b, err := os.ReadFile(mine); err != nil || string(b) != "mine" {
		t.Errorf("the user's file in plots: %q %v", b, err)
	}
	// Re-running a finished sweep with its own figures is fine.
	os.Remove(mine)
	if code := runMain(args, &so, &se); code != exitOK {
		t.Errorf("re-run: exit %d %s", code, se.String())
	}
}

// An output folder with its manifest but also a file the manifest does not
// list (the user's) is not replaced, even with --force: exit 2 naming the
// file, which is kept.
func TestForceKeepsAFileOutsideTheSet(t *testing.T) {
	out := filepath.Join(t.TempDir(), "csv")
	args := []string{"run", "../../examples/nadir-6u-sso.yaml", "--duration", "1h", "--quiet", "--csv", out}
	var so, se bytes.Buffer
	if code := runMain(args, &so, &se); code != exitTargetFailed {
		t.Fatalf("first run: exit %d %s", code, se.String())
	}
	mine := filepath.Join(out, "notes.txt")
	os.WriteFile(mine, []byte("mine"), 0o644)
	se.Reset()
	if code := runMain(append(args, "--force"), &so, &se); code != exitUsage || !strings.Contains(se.String(), "notes.txt") {
		t.Errorf("exit %d, stderr %q; want 2 naming notes.txt", code, se.String())
	}
	if b, err := os.ReadFile(mine); err != nil || string(b) != "mine" {
		t.Errorf("the user's file: %q %v", b, err)
	}
}

// A case that loads but cannot be built (7000 km with an LTAN: no
// sun-synchronous inclination exists) is bad input found before any case
// runs: exit 2 naming the case, as check gives for the same file, and no
// output folder. A folder holding another sweep, and merge given folders of
// different sweeps, a shard missing or a folder that is no sweep's, are bad
// input too (exit 2), and merge copies nothing before it refuses.
func TestSweepBadInputExit2(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "x2")
	var so, se bytes.Buffer
	code := runMain([]string{"sweep", "../../examples/nadir-6u-sso.yaml", "--vary", "orbit.altitude_km=400,7000", "--vary", "duration=30m", "--out", out}, &so, &se)
	if code != exitUsage || !strings.Contains(se.String(), "case 1") || !strings.Contains(se.String(), "sun-synchronous") {
		t.Errorf("7000 km case: exit %d, stderr %q; want 2 naming case 1", code, se.String())
	}
	if _, err := os.Stat(out); err == nil {
		t.Error("the refused sweep left its output folder")
	}

	file := writeSweepScenario(t)
	a := filepath.Join(dir, "a")
	if code := runMain([]string{"sweep", file, "--vary", "orbit.altitude_km=400,500", "--out", a, "--no-plots"}, &so, &se); code != exitOK {
		t.Fatalf("sweep a: %d %s", code, se.String())
	}
	se.Reset()
	if code := runMain([]string{"sweep", file, "--vary", "orbit.altitude_km=400,600", "--out", a, "--no-plots"}, &so, &se); code != exitUsage || !strings.Contains(se.String(), "another sweep") {
		t.Errorf("another sweep in the folder: exit %d, %s", code, se.String())
	}
	var shards []string
	for _, k := range []string{"1/3", "2/3"} {
		d := filepath.Join(dir, "shard"+k[:1])
		if code := runMain([]string{"sweep", file, "--vary", "orbit.altitude_km=400:600:100", "--shard", k, "--out", d}, &so, &se); code != exitOK {
			t.Fatalf("shard %s: %d %s", k, code, se.String())
		}
		shards = append(shards, d)
	}
	before := tree(t, shards[0])
	for _, c := range []struct {
		dirs []string
		want string
	}{
		{shards, "missing"},
		{[]string{shards[0], a}, "different sweeps"},
		{[]string{filepath.Join(dir, "none"), shards[0]}, "plan.json"},
	} {
		se.Reset()
		code := runMain(append([]string{"merge", "--no-plots"}, c.dirs...), &so, &se)
		if code != exitUsage || !strings.Contains(se.String(), c.want) {
			t.Errorf("merge %v: exit %d, stderr %q; want 2 and %q", c.dirs, code, se.String(), c.want)
		}
	}
	if after := tree(t, shards[0]); fmt.Sprint(after) != fmt.Sprint(before) {
		t.Errorf("a refused merge changed the first folder:\n%v\nwas\n%v", after, before)
	}
	if _, err := os.Stat(filepath.Join(dir, "none")); err == nil {
		t.Error("a refused merge created its first folder")
	}
}

// Sweep progress goes to a terminal only (as run's and season's): into a
// pipe or log stderr gets no "cases done" lines (it had one per case for
// sweeps under 20 cases), and --quiet turns it off on a terminal too. On a
// terminal the count rewrites one line.
func TestSweepProgressOnlyOnATerminal(t *testing.T) {
	file := writeSweepScenario(t)
	for _, extra := range [][]string{nil, {"--quiet"}} {
		out := filepath.Join(t.TempDir(), "o")
		var so, se bytes.Buffer
		args := append([]string{"sweep", file, "--vary", "orbit.altitude_km=400,500,600", "--out", out, "--no-plots"}, extra...)
		if code := runMain(args, &so, &se); code != 0 {
			t.Fatalf("%v: exit %d, %s", args, code, se.String())
		}
		if se.Len() != 0 {
			t.Errorf("%v: stderr into a buffer: %q", args, se.String())
		}
	}
	var b bytes.Buffer
	p := sweepProgress(&b, true, 3)
	p.update()
	p.update()
	p.finish()
	if got, want := b.String(), "\rsunsight sweep: 1 new case done (at most 3 to run)\rsunsight sweep: 2 new cases done (at most 3 to run)\n"; got != want {
		t.Errorf("terminal progress %q, want %q", got, want)
	}
	b.Reset()
	p = sweepProgress(&b, false, 3)
	p.update()
	p.finish()
	if b.Len() != 0 {
		t.Errorf("progress off wrote %q", b.String())
	}
}
