package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Same file, same seed: byte-identical JSON on repeated runs and with one or
// two workers for the Monte Carlo units.
func TestRunJSONDeterministic(t *testing.T) {
	args := func(workers string) []string {
		return []string{"run", "-json", "-quiet", "-duration", "3h", "-units", "3", "-workers", workers, "../../examples/tumbling-3u.yaml"}
	}
	var outs []string
	for _, w := range []string{"1", "2", "2"} {
		var out, errb bytes.Buffer
		if code := runMain(args(w), &out, &errb); code != 0 {
			t.Fatalf("exit %d: %s", code, errb.String())
		}
		outs = append(outs, out.String())
	}
	if outs[0] != outs[1] || outs[1] != outs[2] {
		t.Fatal("JSON differs between runs or worker counts")
	}
	var rec map[string]any
	if err := json.Unmarshal([]byte(outs[0]), &rec); err != nil {
		t.Fatalf("JSON does not parse: %v", err)
	}
	for _, k := range []string{"schema_version", "tool", "scenario", "headline", "units", "eclipses"} {
		if _, ok := rec[k]; !ok {
			t.Errorf("JSON lacks %q", k)
		}
	}
}

// Bad run invocations exit 2 with a message naming the problem and leave no
// output file.
func TestRunBadInput(t *testing.T) {
	dir := t.TempDir()
	ro := filepath.Join(dir, "ro")
	if err := os.Mkdir(ro, 0o555); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"run"}, "no scenario file"},
		{[]string{"run", filepath.Join(dir, "missing.yaml")}, "missing.yaml"},
		{[]string{"run", "-units", "-2", "../../examples/nadir-6u-sso.yaml"}, "-units"},
		{[]string{"run", "-duration", "soon", "../../examples/nadir-6u-sso.yaml"}, "-duration"},
		// The span parser's own reason reaches the user.
		{[]string{"run", "-duration", "2y", "../../examples/nadir-6u-sso.yaml"}, `--duration: "2y": unit "y" is calendar-ambiguous`},
		{[]string{"run", "-duration", "100000d", "../../examples/nadir-6u-sso.yaml"}, "too long; allowed up to about 146 years"},
		{[]string{"run", "-duration", "-3d", "../../examples/nadir-6u-sso.yaml"}, "want a positive span such as 90m"},
		{[]string{"run", "-step", "10q", "../../examples/nadir-6u-sso.yaml"}, `--step: "10q": unknown unit "q"`},
		{[]string{"run", "-step", "3d", "-duration", "1d", "../../examples/nadir-6u-sso.yaml"}, "longer than the duration"},
		{[]string{"run", "a.yaml", "b.yaml"}, "want one scenario file"},
		{[]string{"run", "-bogus", "../../examples/nadir-6u-sso.yaml"}, "bogus"},
	}
	if os.Geteuid() != 0 { // root can write anywhere
		cases = append(cases, struct {
			args []string
			want string
		}{[]string{"run", "-csv", filepath.Join(ro, "out"), "../../examples/nadir-6u-sso.yaml"}, "output folder"})
	}
	for _, c := range cases {
		var out, errb bytes.Buffer
		code := runMain(c.args, &out, &errb)
		if code != 2 || !strings.Contains(errb.String(), c.want) {
			t.Errorf("%v: exit %d, stderr %q; want exit 2 naming %q", c.args, code, errb.String(), c.want)
		}
	}
	if ents, _ := os.ReadDir(ro); len(ents) != 0 {
		t.Errorf("files left in the output folder: %v", ents)
	}
}

// The CSV folder holds the tables and the record beside them.
func TestRunCSV(t *testing.T) {
	dir := t.TempDir()
	var out, errb bytes.Buffer
	if code := runMain([]string{"run", "-quiet", "-duration", "3h", "-csv", dir, "../../examples/nadir-6u-sso.yaml"}, &out, &errb); code != exitTargetFailed {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	for _, f := range []string{"series.csv", "eclipses.csv", "estimators.csv", "sensors.csv", "scenario.resolved.yaml", "run.json"} {
		b, err := os.ReadFile(filepath.Join(dir, f))
		if err != nil || len(b) == 0 {
			t.Errorf("%s: %v (%d bytes)", f, err, len(b))
		}
	}
	b, _ := os.ReadFile(filepath.Join(dir, "series.csv"))
	if !strings.HasPrefix(string(b), "t_s,utc,region,") {
		t.Errorf("series.csv header: %.80s", b)
	}
}

// output.figures chooses the figures written by --plots.
func TestRunPlotsHonoursOutputFigures(t *testing.T) {
	dir := t.TempDir()
	src, err := os.ReadFile("../../examples/nadir-6u-sso.yaml")
	if err != nil {
		t.Fatal(err)
	}
	scen := filepath.Join(dir, "s.yaml")
	if err := os.WriteFile(scen, append(src, []byte("output:\n  figures: [sky, gaps]\n")...), 0o644); err != nil {
		t.Fatal(err)
	}
	var out, errb bytes.Buffer
	if code := runMain([]string{"run", "-quiet", "-duration", "3h", "-plots", filepath.Join(dir, "figs"), scen}, &out, &errb); code != exitTargetFailed {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	ents, _ := os.ReadDir(filepath.Join(dir, "figs"))
	var names []string
	for _, e := range ents {
		names = append(names, e.Name())
	}
	if got := strings.Join(names, " "); got != "gaps.png gaps.svg manifest.json sky.png sky.svg" {
		t.Errorf("figures written: %s", got)
	}
}

// The summary and the JSON record carry the same verdict, computed once by
// study.Judge from the target checks.
func TestRunVerdictSummaryMatchesJSON(t *testing.T) {
	args := []string{"run", "-quiet", "-duration", "3h", "../../examples/nadir-6u-sso.yaml"}
	var sum, js, errb, errj bytes.Buffer
	runMain(args, &sum, &errb)
	runMain(append([]string{"run", "-json"}, args[1:]...), &js, &errj)
	var rec struct {
		Verdict struct {
			Status  string   `json:"status"`
			Targets int      `json:"targets"`
			Failed  int      `json:"failed"`
			Keys    []string `json:"failed_targets"`
			Text    string   `json:"text"`
		} `json:"verdict"`
	}
	if err := json.Unmarshal(js.Bytes(), &rec); err != nil {
		t.Fatalf("JSON does not parse: %v (%s)", err, errj.String())
	}
	v := rec.Verdict
	if v.Targets != 4 || v.Status == "" || v.Text == "" || len(v.Keys) != v.Failed {
		t.Fatalf("verdict %+v", v)
	}
	if !strings.HasSuffix(sum.String(), "\nverdict: "+v.Text+"\n") {
		t.Errorf("summary does not end with the JSON verdict %q:\n%s", v.Text, sum.String())
	}
	// Said once: the verdict text appears on one line of the summary only
	// (a failed target's label also appears in its own table row).
	if n := strings.Count(sum.String(), v.Text); n != 1 {
		t.Errorf("the verdict %q appears %d times in the summary, want once:\n%s", v.Text, n, sum.String())
	}
	// Standard error does not repeat it; it explains the exit status.
	if v.Status == "failed" && (strings.Contains(errb.String(), v.Text) || !strings.Contains(errb.String(), "exit status 3")) {
		t.Errorf("stderr %q: want the exit status explained, not the verdict repeated", errb.String())
	}
}
