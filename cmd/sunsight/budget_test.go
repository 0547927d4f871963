package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario/budget"
)

const budgetScenario = "../../scenario/budget/testdata/inertial-4css.yaml"

func TestBudgetBadInput(t *testing.T) {
	dir := t.TempDir()
	// A regular file where the output folder should be: it cannot be created.
	blocker := filepath.Join(t.TempDir(), "file")
	if err := os.WriteFile(blocker, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, args := range [][]string{
		{"budget"},
		{"budget", budgetScenario, "--units", "-3", "--out", dir},
		{"budget", budgetScenario, "--tolerance-target", "-1", "--out", dir},
		{"budget", budgetScenario, "--out", filepath.Join(blocker, "out")},
		{"budget", "no-such-file.yaml", "--out", dir},
	} {
		var out, errb bytes.Buffer
		if code := runMain(args, &out, &errb); code != 2 {
			t.Errorf("%v: exit %d, want 2 (%s)", args, code, errb.String())
		}
		if !strings.Contains(errb.String(), "sunsight budget:") {
			t.Errorf("%v: message %q", args, errb.String())
		}
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 0 {
		t.Errorf("bad input left files: %v", ents)
	}
}

func TestBudgetJSONAndFigures(t *testing.T) {
	dir := t.TempDir()
	var out, errb bytes.Buffer
	args := []string{"budget", budgetScenario, "--units", "4", "--tolerance-target", "3.5", "--json", "--out", dir}
	if code := runMain(args, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var rep budget.Report
	if err := json.Unmarshal(out.Bytes(), &rep); err != nil {
		t.Fatal(err)
	}
	if rep.Units != 4 || len(rep.Terms) == 0 || rep.Terms[0].Source != "albedo" || rep.CorrectedP95 == nil {
		t.Errorf("report %+v", rep)
	}
	for _, tol := range rep.Tolerances {
		if !tol.Infeasible && !tol.Unbounded && (!tol.Meets || !tol.FailsAbove) {
			t.Errorf("tolerance %+v: want meets at σ and fails at 1.1σ", tol)
		}
	}
	for _, f := range []string{"budget.png", "budget.svg", "budget-sensitivity.png", "budget-sensitivity.svg"} {
		if st, err := os.Stat(filepath.Join(dir, f)); err != nil || st.Size() == 0 {
			t.Errorf("%s: %v", f, err)
		}
	}
}
