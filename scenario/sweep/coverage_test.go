package sweep

import (
	"bytes"
	"context"
	"encoding/csv"
	"slices"
	"strconv"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

const coverageCase = "duration: 30m\nstep: 60s\norbit: {altitude_km: 500, inclination_deg: 30, propagator: two-body}\n" +
	"attitude: {law: nadir}\nalbedo: {model: none}\nbody:\n  sensors:\n" +
	"    - {name: a, kind: cosine, face: \"+X\"}\n    - {name: b, kind: cosine, face: \"-Z\"}\n" +
	"    - {name: c, kind: cosine, face: \"+Y\"}\n" +
	"targets: {coverage_sensors: 1, min_coverage: 0.5, survive_one_failure: true}\n"

// sweep.csv holds the sky coverage that target_coverage_pass (and
// target_coverage_one_failed_pass) judge, beside the verdict: the value of
// the case's own target record (study.CheckTargets, the judge run uses),
// and an empty cell in a case that states no coverage target.
func TestSweepTableHoldsTheJudgedCoverage(t *testing.T) {
	s, err := scenario.Parse([]byte(coverageCase), "")
	if err != nil {
		t.Fatal(err)
	}
	oc, err := RunCase(context.Background(), s, 1)
	if err != nil {
		t.Fatal(err)
	}
	var recs []study.TargetRecord
	for _, c := range oc.Targets {
		recs = append(recs, c.Record())
	}
	cov, ok1 := study.FindTarget(oc.Targets, study.TargetCoverage)
	one, ok2 := study.FindTarget(oc.Targets, study.TargetCoverageOneFailed)
	if !ok1 || !ok2 {
		t.Fatalf("targets %+v lack the coverage checks", oc.Targets)
	}
	m := Manifest{Keys: []string{"orbit.altitude_km"}, Cases: [][]string{{"500"}, {"600"}}}
	cases := []*CaseFile{
		{Index: 0, Inputs: []Input{{Value: "500"}}, Headline: map[string]any{}, Targets: recs},
		{Index: 1, Inputs: []Input{{Value: "600"}}, Headline: map[string]any{}},
	}
	var b bytes.Buffer
	if err := Table(&b, m, cases); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&b).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		col  string
		want float64
	}{{CoverageColumn, cov.Got}, {CoverageOneFailedColumn, one.Got}} {
		i := slices.Index(rows[0], c.col)
		if i < 0 {
			t.Errorf("header %v lacks %s", rows[0], c.col)
			continue
		}
		if want := strconv.FormatFloat(c.want, 'f', 6, 64); rows[1][i] != want || c.want <= 0 {
			t.Errorf("%s = %q, want the judged %.6f", c.col, rows[1][i], c.want)
		}
		if rows[2][i] != "" {
			t.Errorf("%s = %q in a case without the target, want empty", c.col, rows[2][i])
		}
	}
}
