package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// run runs the scenario's modes beside the primary attitude: the JSON
// record lists the primary first and then each mode with its own headline,
// the summary prints them side by side and -csv writes modes.csv. The
// dawn-dusk example's tumbling mode sees the sun differently from its
// sun-pointing primary, so the figures must differ.
func TestRunReportsModesSideBySide(t *testing.T) {
	var out, errb bytes.Buffer
	if code := runMain([]string{"run", "-quiet", "-json", "-duration", "3h", "../../examples/dawn-dusk-12u.yaml"}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var rec struct {
		Modes []struct {
			Mode     string         `json:"mode"`
			Primary  bool           `json:"primary"`
			Headline map[string]any `json:"headline"`
		} `json:"modes"`
	}
	if err := json.Unmarshal(out.Bytes(), &rec); err != nil {
		t.Fatal(err)
	}
	if len(rec.Modes) != 2 || !rec.Modes[0].Primary || rec.Modes[0].Mode != "primary" || rec.Modes[1].Mode != "tumbling" || rec.Modes[1].Primary {
		t.Fatalf("modes %+v", rec.Modes)
	}
	a, b := rec.Modes[0].Headline, rec.Modes[1].Headline
	if a["valid_fraction"] == b["valid_fraction"] && a["seen_by_2_fraction"] == b["seen_by_2_fraction"] {
		t.Errorf("tumbling mode gives the primary's figures: %v", b)
	}
	out.Reset()
	dir := filepath.Join(t.TempDir(), "csv")
	if code := runMain([]string{"run", "-quiet", "-duration", "3h", "-csv", dir, "../../examples/dawn-dusk-12u.yaml"}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(out.String(), "Modes side by side") || !strings.Contains(out.String(), "tumbling") {
		t.Errorf("summary lacks the modes table:\n%s", out.String())
	}
	csv, err := os.ReadFile(filepath.Join(dir, "modes.csv"))
	if err != nil || strings.Count(string(csv), "\n") != 3 || !strings.HasPrefix(strings.SplitN(string(csv), "\n", 3)[1], "primary,true") {
		t.Errorf("modes.csv: %v\n%s", err, csv)
	}
}
