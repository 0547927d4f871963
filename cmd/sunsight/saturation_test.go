package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"testing"
)

// saturated_fraction is a share of sunlit time, as the data dictionary and
// the sensors table (beside "in view", also of sunlit time) say: a cosine
// sensor held at the sun with a full scale of half the sun's signal is
// saturated in all of its sunlit time (closed form: cos 0° = 1 > 0.5),
// while the orbit spends about a third of the time in shadow.
func TestSaturatedFractionIsOfSunlitTime(t *testing.T) {
	file := scenarioText(t, `name: saturation share
epoch: "2026-03-20T00:00:00Z"
duration: 6h
step: 10s
orbit: {altitude_km: 500, inclination_deg: 45, raan_deg: 0}
attitude: {law: sun, point_axis: "+Z"}
body:
  sensors:
    - {name: s, kind: cosine, face: "+Z", full_scale: 0.5}
albedo: {model: none}
`)
	var out, errb bytes.Buffer
	if code := runMain([]string{"run", "--quiet", "--json", file}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var rec struct {
		Units []struct {
			Sunlit  float64 `json:"sunlit_fraction"`
			Sensors []struct {
				Saturated float64 `json:"saturated_fraction"`
			} `json:"sensors"`
		} `json:"units"`
	}
	if err := json.Unmarshal(out.Bytes(), &rec); err != nil {
		t.Fatal(err)
	}
	u := rec.Units[0]
	if !(u.Sunlit < 0.8) || u.Sensors[0].Saturated != 1 {
		t.Errorf("sunlit %v, saturated %v: want a shadowed orbit and saturation in all sunlit time (1)", u.Sunlit, u.Sensors[0].Saturated)
	}
}

// scenarioText writes a scenario file of the given text in a test folder
// and returns its path.
func scenarioText(t *testing.T, text string) string {
	t.Helper()
	file := filepath.Join(t.TempDir(), "scenario.yaml")
	if err := os.WriteFile(file, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return file
}
