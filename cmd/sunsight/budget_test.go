package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
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

// With fewer units than a bootstrap interval needs, the budget prints the
// all − RSS figures without an interval and without a conclusion, and says
// how many units are needed (it printed a "95 % interval" from 2 units).
func TestBudgetWithholdsIntervalBelowEnoughUnits(t *testing.T) {
	for _, c := range []struct {
		units string
		shown bool
	}{{"2", false}, {strconv.Itoa(budget.MinIntervalUnits), true}} {
		var out, errb bytes.Buffer
		if code := runMain([]string{"budget", budgetScenario, "--units", c.units}, &out, &errb); code != 0 && code != 3 {
			t.Fatalf("exit %d: %s", code, errb.String())
		}
		o := out.String()
		if strings.Contains(o, "bootstrap interval over units [") != c.shown || strings.Contains(o, "an interval that excludes 0") != c.shown {
			t.Errorf("%s units: interval shown %v wanted:\n%s", c.units, !c.shown, o)
		}
		need := fmt.Sprintf("needs at least %d units", budget.MinIntervalUnits)
		if strings.Contains(o, need) == c.shown {
			t.Errorf("%s units: %q said %v:\n%s", c.units, need, c.shown, o)
		}
		var rep budget.Report
		out.Reset()
		runMain([]string{"budget", budgetScenario, "--units", c.units, "--json"}, &out, &errb)
		if err := json.Unmarshal(out.Bytes(), &rep); err != nil {
			t.Fatal(err)
		}
		if (rep.GapP95CIDeg != nil) != c.shown || (rep.GapRMSCIDeg != nil) != c.shown || rep.IntervalMinUnits != budget.MinIntervalUnits {
			t.Errorf("%s units: JSON intervals %v %v, min units %d", c.units, rep.GapP95CIDeg, rep.GapRMSCIDeg, rep.IntervalMinUnits)
		}
	}
}
