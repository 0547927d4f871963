package main

import (
	"bufio"
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"os"
	"os/exec"
	"os/signal"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"
)

// The child side: when the test binary is started with SUNSIGHT_CHILD_ARGS
// it runs those arguments as the command line; with SUNSIGHT_CHILD_STALL it
// stops, once an output folder is filled, until it is killed.
func init() {
	args := os.Getenv("SUNSIGHT_CHILD_ARGS")
	if args == "" {
		return
	}
	if lim := os.Getenv("SUNSIGHT_CHILD_FSIZE"); lim != "" {
		// A file-size limit makes every write past it fail (EFBIG), as a
		// full disk would, without root.
		n, _ := strconv.ParseUint(lim, 10, 64)
		signal.Ignore(syscall.SIGXFSZ)
		if err := syscall.Setrlimit(syscall.RLIMIT_FSIZE, &syscall.Rlimit{Cur: n, Max: n}); err != nil {
			fmt.Fprintln(os.Stderr, "setrlimit:", err)
			os.Exit(99)
		}
	}
	if os.Getenv("SUNSIGHT_CHILD_STALL") != "" {
		outputFilled = func(string) {
			fmt.Fprintln(os.Stderr, "FILLED")
			time.Sleep(time.Minute)
		}
	}
	os.Exit(runMain(strings.Split(args, "\x1f"), os.Stdout, os.Stderr))
}

func child(stall bool, args ...string) *exec.Cmd {
	c := exec.Command(os.Args[0], "-test.run=^$")
	c.Env = append(os.Environ(), "SUNSIGHT_CHILD_ARGS="+strings.Join(args, "\x1f"))
	if stall {
		c.Env = append(c.Env, "SUNSIGHT_CHILD_STALL=1")
	}
	return c
}

// outputSet reads an output folder and checks it against its manifest: every
// file listed with its SHA-256, nothing else. It returns the manifest's map.
func outputSet(t *testing.T, dir string) map[string]string {
	t.Helper()
	var m manifest
	b, err := os.ReadFile(filepath.Join(dir, manifestName))
	if err != nil {
		t.Fatalf("%s: %v", dir, err)
	}
	if err := json.Unmarshal(b, &m); err != nil {
		t.Fatal(err)
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != len(m.Files)+1 {
		t.Errorf("%s: %d entries, manifest lists %d files", dir, len(ents), len(m.Files))
	}
	for name, sum := range m.Files {
		b, err := os.ReadFile(filepath.Join(dir, name))
		got := sha256.Sum256(b)
		if err != nil || hex.EncodeToString(got[:]) != sum {
			t.Errorf("%s/%s: not the file of the manifest (%v)", dir, name, err)
		}
	}
	return m.Files
}

func sameSet(a, b map[string]string) bool {
	if len(a) != len(b) {
		return false
	}
	for k, v := range a {
		if b[k] != v {
			return false
		}
	}
	return true
}

// A run killed (SIGKILL) after its new CSV set is written but before it is
// swapped in leaves the old set, whole; killed at other moments, the folder
// holds the old set or the new set, never a mix.
func TestKilledRunLeavesOldOrNewSet(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "csv")
	scen := "../../examples/nadir-6u-sso.yaml"
	var so, se bytes.Buffer
	if code := runMain([]string{"run", scen, "--duration", "2h", "--csv", out, "--quiet"}, &so, &se); code != exitTargetFailed {
		t.Fatalf("old set: exit %d %s", code, se.String())
	}
	old := outputSet(t, out)
	newArgs := []string{"run", scen, "--duration", "3h", "--csv", out, "--force", "--quiet"}

	c := child(true, newArgs...)
	stderr, _ := c.StderrPipe()
	if err := c.Start(); err != nil {
		t.Fatal(err)
	}
	sc := bufio.NewScanner(stderr)
	filled := false
	for sc.Scan() {
		if sc.Text() == "FILLED" {
			filled = true
			break
		}
	}
	c.Process.Kill()
	c.Wait()
	if !filled {
		t.Fatal("the child never reached the filled output")
	}
	if got := outputSet(t, out); !sameSet(got, old) {
		t.Error("after a kill mid-write the folder is not the old set")
	}

	// The new set, from a run left to finish, for comparison.
	ref := filepath.Join(dir, "ref")
	refArgs := append([]string{}, newArgs...)
	refArgs[5] = ref
	runMain(refArgs, &so, &se)
	newSet := outputSet(t, ref)
	if sameSet(newSet, old) {
		t.Fatal("old and new sets are equal: the test cannot tell them apart")
	}
	// Kills at spread-out moments of a whole run.
	start := time.Now()
	runMain(append(append([]string{}, refArgs[:5]...), filepath.Join(dir, "timing"), "--quiet"), &so, &se)
	whole := time.Since(start)
	for i := range 6 {
		c := child(false, newArgs...)
		if err := c.Start(); err != nil {
			t.Fatal(err)
		}
		time.Sleep(whole * time.Duration(i+1) / 5)
		c.Process.Kill()
		c.Wait()
		got := outputSet(t, out)
		if !sameSet(got, old) && !sameSet(got, newSet) {
			t.Errorf("kill %d: the folder is neither the old nor the new set", i)
		}
		if sameSet(got, newSet) {
			// Put the old set back for the next kill.
			if code := runMain([]string{"run", scen, "--duration", "2h", "--csv", out, "--force", "--quiet"}, &so, &se); code != exitTargetFailed {
				t.Fatal(se.String())
			}
		}
	}
}

// SIGTERM, and SIGHUP (the terminal closed), stop a run like Ctrl-C: exit 1,
// "interrupted", the old output set untouched and no temporary file or
// folder left (SIGHUP left the series' temporary file, exit 129).
func TestSIGTERMStopsCleanly(t *testing.T) {
	for _, sig := range []syscall.Signal{syscall.SIGTERM, syscall.SIGHUP} {
		t.Run(sig.String(), func(t *testing.T) { signalStopsCleanly(t, sig) })
	}
}

func signalStopsCleanly(t *testing.T, sig syscall.Signal) {
	dir := t.TempDir()
	out := filepath.Join(dir, "csv")
	scen := "../../examples/nadir-6u-sso.yaml"
	var so, se bytes.Buffer
	if code := runMain([]string{"run", scen, "--duration", "2h", "--csv", out, "--quiet"}, &so, &se); code != exitTargetFailed {
		t.Fatalf("old set: exit %d %s", code, se.String())
	}
	old := outputSet(t, out)
	c := child(false, "run", scen, "--duration", "365d", "--csv", out, "--force", "--quiet")
	var cerr bytes.Buffer
	c.Stderr = &cerr
	if err := c.Start(); err != nil {
		t.Fatal(err)
	}
	time.Sleep(500 * time.Millisecond)
	c.Process.Signal(sig)
	err := c.Wait()
	code := -1
	if ee, ok := err.(*exec.ExitError); ok {
		code = ee.ExitCode()
	} else if err == nil {
		code = 0
	}
	if code != exitFailure || !strings.Contains(cerr.String(), "interrupted") {
		t.Errorf("%v: exit %d, stderr %q; want 1 and interrupted", sig, code, cerr.String())
	}
	if got := outputSet(t, out); !sameSet(got, old) {
		t.Errorf("%v changed the old set", sig)
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 1 {
		t.Errorf("entries left beside the output: %v", ents)
	}
}

// exitCode is a finished child's exit status.
func exitCode(err error) int {
	if ee, ok := err.(*exec.ExitError); ok {
		return ee.ExitCode()
	}
	if err == nil {
		return 0
	}
	return -1
}

// A write that fails half way (a file-size limit stands in for a full disk)
// is a run failure, exit 1, naming the file; the earlier output set stays
// whole and no temporary file or folder is left beside it. The same for the
// report file, a layout's and a budget's --out folder.
func TestWriteFailureMidOutput(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "csv")
	scen := "../../examples/nadir-6u-sso.yaml"
	var so, se bytes.Buffer
	if code := runMain([]string{"run", scen, "--duration", "1h", "--csv", out, "--quiet"}, &so, &se); code != exitTargetFailed {
		t.Fatalf("old set: exit %d %s", code, se.String())
	}
	old := outputSet(t, out)
	report := filepath.Join(dir, "report.html")
	os.WriteFile(report, []byte("old report"), 0o644)
	layoutOut := filepath.Join(dir, "layout")
	layoutScen := filepath.Join(dir, "layout.yaml")
	os.WriteFile(layoutScen, []byte(layoutCLIScenario), 0o644)
	for _, c := range []struct {
		name  string
		limit string
		args  []string
	}{
		{"csv folder", "2000", []string{"run", scen, "--duration", "6h", "--csv", out, "--force", "--quiet"}},
		{"report file", "2000", []string{"run", scen, "--duration", "6h", "--report", report, "--force", "--quiet"}},
		{"layout folder", "100", []string{"layout", layoutScen, "--out", layoutOut}},
	} {
		cmd := child(false, c.args...)
		cmd.Env = append(cmd.Env, "SUNSIGHT_CHILD_FSIZE="+c.limit)
		var cerr bytes.Buffer
		cmd.Stderr = &cerr
		code := exitCode(cmd.Run())
		if code != exitFailure || !(strings.Contains(cerr.String(), "file too large") || strings.Contains(cerr.String(), "no space")) {
			t.Errorf("%s: exit %d, stderr %q; want 1 naming the write error", c.name, code, cerr.String())
		}
	}
	if got := outputSet(t, out); !sameSet(got, old) {
		t.Error("a failed write changed the old CSV set")
	}
	if b, _ := os.ReadFile(report); string(b) != "old report" {
		t.Error("a failed write changed the old report")
	}
	if _, err := os.Stat(layoutOut); err == nil {
		t.Error("a failed layout write left its --out folder")
	}
	ents, _ := os.ReadDir(dir)
	var names []string
	for _, e := range ents {
		names = append(names, e.Name())
	}
	if strings.Join(names, " ") != "csv layout.yaml report.html" {
		t.Errorf("left beside the outputs: %v", names)
	}
}

// A closed pipe on standard output (sunsight run x.yaml | head -1) is a write
// error: exit 1 with one message, not the death by SIGPIPE (141 in a shell).
func TestClosedPipeIsAWriteError(t *testing.T) {
	pass := nadirWith(t, "40")
	for _, args := range [][]string{
		{"run", pass, "--duration", "2h", "--quiet"},
		{"run", pass, "--duration", "2h", "--quiet", "--json"},
		{"orbit", "--altitude-km", "550", "--ltan", "10:30", "--epoch", "2027-03-20T12:00:00Z"},
	} {
		r, w, err := os.Pipe()
		if err != nil {
			t.Fatal(err)
		}
		r.Close() // the reader is gone before the first write
		c := child(false, args...)
		c.Stdout = w
		var cerr bytes.Buffer
		c.Stderr = &cerr
		err = c.Run()
		w.Close()
		code := exitCode(err)
		msg := cerr.String()
		if code != exitFailure || !strings.Contains(msg, "broken pipe") || strings.Count(msg, "\n") != 1 {
			t.Errorf("%v | (closed): exit %d (%v), stderr %q; want 1 and one message naming the broken pipe", args, code, err, msg)
		}
	}
}
