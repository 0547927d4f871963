package main

import (
	"bufio"
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// check and run give the same verdict on every bundled example and on every
// file that loads but cannot be built (scenario/testdata/buildbad: check
// used to call only Load and passed them, run then refused them). A bad
// file is refused by both with exit 2 and the field named in its "# want:"
// line; run leaves no output behind.
func TestCheckAndRunAgree(t *testing.T) {
	examples, _ := filepath.Glob("../../examples/*.yaml")
	bad, _ := filepath.Glob("../../scenario/testdata/buildbad/*.yaml")
	if len(examples) < 4 || len(bad) < 4 {
		t.Fatalf("%d examples, %d bad files", len(examples), len(bad))
	}
	for _, f := range append(examples, bad...) {
		want := wantLine(t, f)
		var out, errb bytes.Buffer
		check := runMain([]string{"check", f}, &out, &errb)
		checkErr := errb.String()
		csvDir := filepath.Join(t.TempDir(), "csv")
		out.Reset()
		errb.Reset()
		run := runMain([]string{"run", "-quiet", "-duration", "20m", "-units", "2", "-csv", csvDir, f}, &out, &errb)
		runErr := errb.String()
		name := filepath.Base(f)
		if want == "" {
			// Exit 3 is a run that worked and judged a target missed.
			if check != 0 || (run != 0 && run != 3) {
				t.Errorf("%s: check exit %d (%s), run exit %d (%s); want 0 and 0 or 3", name, check, checkErr, run, runErr)
			}
			continue
		}
		if check != 2 || run != 2 {
			t.Errorf("%s: check exit %d, run exit %d; want 2 from both", name, check, run)
		}
		for _, msg := range []string{checkErr, runErr} {
			if !strings.Contains(msg, want) || !strings.Contains(msg, name) {
				t.Errorf("%s: message %q lacks the file or %q", name, msg, want)
			}
		}
		if entries, _ := os.ReadDir(csvDir); len(entries) > 0 {
			t.Errorf("%s: run refused the file but left %d files", name, len(entries))
		}
	}
}

// wantLine returns the text after "# want: " on the first line of f, or "".
func wantLine(t *testing.T, f string) string {
	t.Helper()
	fh, err := os.Open(f)
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	sc := bufio.NewScanner(fh)
	if sc.Scan() {
		if w, ok := strings.CutPrefix(sc.Text(), "# want: "); ok {
			return w
		}
	}
	return ""
}

// check prints what a user wants to know before a long run.
func TestCheckPrintsDerivedValues(t *testing.T) {
	var out, errb bytes.Buffer
	if code := runMain([]string{"check", "../../examples/nadir-6u-sso.yaml"}, &out, &errb); code != 0 {
		t.Fatalf("check exit %d: %s", code, errb.String())
	}
	// 550 km: T = 2π√(a³/μ) = 95.65 min (closed form, a = 6928.137 km);
	// SSO inclination 97.59° (Vallado 4th ed. Ex. 11-1 gives 97.6° near
	// this height; from memory); 2 days at 10 s = 17281 steps.
	for _, want := range []string{"orbit period 95.65 min", "inclination 97.59", "RAAN from LTAN 10:30 in mean solar time",
		"beta angle over the run -24.1° to -24.1°", "17281 steps × 1 unit(s)", "memory about", "propagator: j2-mean"} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("check output lacks %q:\n%s", want, out.String())
		}
	}
}
