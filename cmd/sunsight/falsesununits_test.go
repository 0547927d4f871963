package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"strings"
	"testing"
)

// A false sun in umbra drawn in some units only: unit 0 (the summary's
// unit) shows none in this scenario, yet the Monte Carlo section and the
// JSON's across_units name the units that have one and the worst share.
func TestFalseSunsOverUnits(t *testing.T) {
	var out, errb bytes.Buffer
	if code := runMain([]string{"run", "--quiet", "--json", "testdata/umbra-false-sun.yaml"}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var rec struct {
		Headline struct {
			FalseSun float64 `json:"false_sun_fraction_of_umbra"`
		} `json:"headline"`
		Across []struct {
			Units int     `json:"units_with_false_sun_in_umbra"`
			Worst float64 `json:"worst_unit_false_sun_fraction_of_umbra"`
		} `json:"across_units"`
	}
	if err := json.Unmarshal(out.Bytes(), &rec); err != nil {
		t.Fatal(err)
	}
	if rec.Headline.FalseSun != 0 || len(rec.Across) == 0 || rec.Across[0].Units == 0 || !(rec.Across[0].Worst > 0) {
		t.Fatalf("unit 0 false sun %v; across units %+v: want 0 for unit 0 and some units with one", rec.Headline.FalseSun, rec.Across)
	}
	out.Reset()
	if code := runMain([]string{"run", "--quiet", "testdata/umbra-false-sun.yaml"}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if want := fmt.Sprintf("(%d of 16 units have one)", 4); !strings.Contains(out.String(), "worst unit: false sun in umbra") || !strings.Contains(out.String(), want) {
		t.Errorf("the Monte Carlo section does not name the false suns:\n%s", out.String())
	}
}
