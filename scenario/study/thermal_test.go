package study

import (
	"math"
	"os"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// thermalRun runs the power-6u demo for 6 h, without albedo, with extra
// keys on every cosine sensor.
func thermalRun(t *testing.T, keys string) *sim.Result {
	t.Helper()
	data, err := os.ReadFile("../../examples/power-6u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	txt := strings.ReplaceAll(string(data), "kind: cosine,", "kind: cosine,"+keys)
	s, err := scenario.Parse([]byte(txt), "../../examples")
	if err != nil {
		t.Fatal(err)
	}
	s.Duration = scenario.Span(6 * 3600e9)
	s.Albedo.Model = scenario.AlbedoNone
	return runScenario(t, s)
}

// The temperature keys reach the readings: a dark signal calibrated at
// 20 °C that doubles per 10 °C (rule of thumb, common practice, no source)
// grows 16-fold on a 60 °C sunlit sensor, and the sun-vector error changes
// (on a six-face cube the common offset cancels in opposite pairs and
// lifts the dark faces over the threshold, so the least-squares error may
// even shrink: the number to look at is the run's, not a guess); a gain coefficient common to every sensor scales all the
// signals alike and leaves the direction unchanged (the estimators use
// signal ratios), while sensors at different temperatures see different
// gains and the error changes.
func TestTemperatureReachesTheReadings(t *testing.T) {
	p95 := func(r *sim.Result) float64 { return r.Nominal.Estimators[1].ErrNoAlbedo.P95Deg } // least squares
	base := thermalRun(t, "")
	warm := thermalRun(t, " temperature_sunlit_c: 60, temperature_eclipse_c: -20, dark_signal_at_calibration: 0.01,")
	b, w := p95(base), p95(warm)
	if !(math.Abs(w-b) > 0.05) {
		t.Errorf("p95 error (least squares): calibrated %.3f°, at 60 °C with a 0.01 dark signal %.3f°; want a change", b, w)
	}
	gain := thermalRun(t, " temperature_sunlit_c: 60, temperature_eclipse_c: -20, gain_tempco_pct_per_c: 0.2,")
	if g := p95(gain); math.Abs(g-b) > 0.02 {
		t.Errorf("a gain change common to every sensor: p95 %.4f°, calibrated %.4f°; want the same direction", g, b)
	}
	data, _ := os.ReadFile("../../examples/power-6u.yaml")
	hot := strings.Replace(string(data), "{name: css-px, kind: cosine,", "{name: css-px, kind: cosine, temperature_sunlit_c: 80, gain_tempco_pct_per_c: 0.2,", 1)
	s, err := scenario.Parse([]byte(hot), "../../examples")
	if err != nil {
		t.Fatal(err)
	}
	s.Duration = scenario.Span(6 * 3600e9)
	s.Albedo.Model = scenario.AlbedoNone
	res := runScenario(t, s)
	if h := p95(res); !(math.Abs(h-b) > 0.05) {
		t.Errorf("+X sensor alone at 80 °C with +0.2 %%/°C: p95 %.4f°, calibrated %.4f°; want a change", h, b)
	}
	t.Logf("p95 error, least squares: calibrated %.3f°, dark signal 0.01 at 60 °C sunlit %.3f°, common gain coefficient %.3f°, +X sensor hot %.3f°",
		b, w, p95(gain), p95(res))
}

// A temperature that cannot act is refused with the sensor named.
func TestTemperatureWithoutEffectRefused(t *testing.T) {
	data, _ := os.ReadFile("../../examples/power-6u.yaml")
	for keys, want := range map[string]string{
		" temperature_sunlit_c: 60,":         "dark_signal_at_calibration",
		" dark_signal_at_calibration: 0.01,": "temperature_sunlit_c",
	} {
		txt := strings.Replace(string(data), "{name: css-px, kind: cosine,", "{name: css-px, kind: cosine,"+keys, 1)
		s, err := scenario.Parse([]byte(txt), "../../examples")
		if err == nil {
			_, err = Config(s)
		}
		if err == nil || !strings.Contains(err.Error(), want) || !strings.Contains(err.Error(), "css-px") {
			t.Errorf("%s: error %v, want one naming css-px and %s", keys, err, want)
		}
	}
}
