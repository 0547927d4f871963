package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// output.figures: [] asks for no figure, so --plots has nothing to write:
// it is refused before the run (exit 2, naming the key, the flag and the
// fix, nothing written) instead of writing an empty folder. A report is
// still written, without figures.
func TestPlotsWithNoFiguresRefused(t *testing.T) {
	b, err := os.ReadFile("../../examples/nadir-6u-sso.yaml")
	if err != nil {
		t.Fatal(err)
	}
	d := t.TempDir()
	scen := filepath.Join(d, "nofig.yaml")
	if err := os.WriteFile(scen, append(b, []byte("\noutput:\n  figures: []\n")...), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(d, "plots")
	var so, se bytes.Buffer
	code := runMain([]string{"run", scen, "--duration", "1h", "--quiet", "--plots", out}, &so, &se)
	msg := se.String()
	if code != exitUsage {
		t.Errorf("exit %d, want 2; stderr %q", code, msg)
	}
	for _, w := range []string{"nofig.yaml", "output.figures", "--plots", "remove the key"} {
		if !strings.Contains(msg, w) {
			t.Errorf("message %q lacks %q", msg, w)
		}
	}
	if _, err := os.Stat(out); !os.IsNotExist(err) {
		t.Errorf("plots folder written: %v", err)
	}
	rep := filepath.Join(d, "r.html")
	so.Reset()
	se.Reset()
	if code := runMain([]string{"run", scen, "--duration", "1h", "--quiet", "--report", rep}, &so, &se); code != 0 && code != exitTargetFailed {
		t.Fatalf("report with no figures: exit %d, %s", code, se.String())
	}
	if h, err := os.ReadFile(rep); err != nil || strings.Contains(string(h), "<figure") {
		t.Errorf("report: %v; it holds a figure: %v", err, strings.Contains(string(h), "<figure"))
	}
}

// A named figure the run has nothing for (gaps, when the estimate is valid
// throughout) is left out of --plots with a note on stderr saying why,
// not silently.
func TestPlotsSaySkippedFigures(t *testing.T) {
	b, err := os.ReadFile("../../examples/mission-6u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	d := t.TempDir()
	scen := filepath.Join(d, "gaps.yaml")
	if err := os.WriteFile(scen, append(b, []byte("\noutput:\n  figures: [gaps]\n")...), 0o644); err != nil {
		t.Fatal(err)
	}
	var so, se bytes.Buffer
	code := runMain([]string{"run", scen, "--duration", "2h", "--units", "1", "--quiet", "--plots", filepath.Join(d, "p")}, &so, &se)
	if code != 0 && code != exitTargetFailed {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	if w := "--plots: No gap figure"; !strings.Contains(se.String(), w) {
		t.Errorf("stderr %q lacks %q", se.String(), w)
	}
}
