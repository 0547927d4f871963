package sweep

import (
	"os"
	"path/filepath"
	"testing"
)

// A sweep whose cases model no albedo draws the p95 error without albedo
// in place of the empty one with albedo, and no figure without a value.
func TestPlottedFiguresSkipEmptyOnes(t *testing.T) {
	m := Manifest{Keys: []string{"orbit.altitude_km"}}
	cases := func(albedo bool) []*CaseFile {
		var out []*CaseFile
		for i, alt := range []string{"400", "500", "600"} {
			h := map[string]any{"seen_by_3_fraction": 0.2, "seen_by_1_fraction": 1.0, "sunlit_fraction": 0.6,
				"valid_fraction": 1.0, "p95_error_no_albedo_deg": 3.0 + float64(i)}
			if albedo {
				h["p95_error_albedo_deg"] = 5.0 + float64(i)
			}
			out = append(out, &CaseFile{Index: i, Inputs: []Input{{"orbit.altitude_km", alt}}, Headline: h})
		}
		return out
	}
	names := func(figs [][3]string) map[string]bool {
		got := map[string]bool{}
		for _, f := range figs {
			got[f[0]] = true
		}
		return got
	}
	with := names(plottedFigures(cases(true)))
	if !with["p95_error_albedo_deg"] || with["p95_error_no_albedo_deg"] || len(with) != len(curveFigures) {
		t.Errorf("with albedo: figures %v", with)
	}
	without := names(plottedFigures(cases(false)))
	if without["p95_error_albedo_deg"] || !without["p95_error_no_albedo_deg"] || len(without) != len(curveFigures) {
		t.Errorf("without albedo: figures %v", without)
	}
	// A figure no case has a value of is left out.
	cs := cases(false)
	for _, c := range cs {
		delete(c.Headline, "seen_by_3_fraction")
	}
	if got := names(plottedFigures(cs)); got["seen_by_3_fraction"] || len(got) != len(curveFigures)-1 {
		t.Errorf("figure without values: %v", got)
	}
	// And the files written are those.
	dir := t.TempDir()
	if err := writePlots(dir, m, cases(false), scenarioCaption()); err != nil {
		t.Fatal(err)
	}
	for name, want := range map[string]bool{"p95_error_no_albedo_deg.png": true, "p95_error_albedo_deg.png": false, "valid_fraction.svg": true} {
		if _, err := os.Stat(filepath.Join(dir, name)); (err == nil) != want {
			t.Errorf("%s: written %v, want %v", name, err == nil, want)
		}
	}
}
