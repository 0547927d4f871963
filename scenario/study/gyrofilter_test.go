package study

import (
	"fmt"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// gyroBase is a short nadir case with one eclipse and six noisy cosine
// sensors under uniform albedo.
const gyroBase = `name: filter keys
epoch: "2026-03-20T00:00:00Z"
duration: 100m
step: 10s
orbit: {altitude_km: 500, inclination_deg: 51.6, raan_deg: 0}
attitude: {law: tumble, min_rate_deg_s: 1, max_rate_deg_s: 2}
albedo: {model: uniform, value: 0.3}
body:
  sensors:
    - {name: px, kind: cosine, face: "+X", half_angle_deg: 80, errors: {noise_1sigma: 0.01, dark_offset_1sigma: 0.01}}
    - {name: mx, kind: cosine, face: "-X", half_angle_deg: 80, errors: {noise_1sigma: 0.01, dark_offset_1sigma: 0.01}}
    - {name: py, kind: cosine, face: "+Y", half_angle_deg: 80, errors: {noise_1sigma: 0.01, dark_offset_1sigma: 0.01}}
    - {name: my, kind: cosine, face: "-Y", half_angle_deg: 80, errors: {noise_1sigma: 0.01, dark_offset_1sigma: 0.01}}
    - {name: pz, kind: cosine, face: "+Z", half_angle_deg: 80, errors: {noise_1sigma: 0.01, dark_offset_1sigma: 0.01}}
    - {name: mz, kind: cosine, face: "-Z", half_angle_deg: 80, errors: {noise_1sigma: 0.01, dark_offset_1sigma: 0.01}}
estimators: [least-squares]
`

func filterRun(t *testing.T, block string) *sim.FilterStats {
	t.Helper()
	return runText(t, gyroBase+block).Nominal.Filter
}

// Every key of the gyro_filter block changes the filter's figures; without
// the block there are none.
func TestEveryGyroFilterKeyHasAnEffect(t *testing.T) {
	if f := filterRun(t, ""); f != nil {
		t.Fatal("filter figures without a gyro_filter block")
	}
	show := func(f *sim.FilterStats) string { return fmt.Sprintf("%+v", *f) }
	def := filterRun(t, "gyro_filter: {}\n")
	if def == nil {
		t.Fatal("no filter figures with a gyro_filter block")
	}
	for _, kv := range []string{
		"angle_random_walk_deg_rt_h: 3", "bias_instability_deg_h: 100", "bias_time_s: 20", "cosine_sigma: 0.2",
		"start_sigma_deg: 1", "valid_sigma_deg: 6", "gate_sigma: 1", "hold_bound_deg: 1",
	} {
		got := filterRun(t, "gyro_filter: {"+kv+"}\n")
		if show(got) == show(def) {
			t.Errorf("gyro_filter.%s changes nothing: %s", kv, show(got))
		}
	}
}

func TestGyroFilterRefusesBadValues(t *testing.T) {
	for _, c := range []struct{ block, want string }{
		{"gyro_filter: {bias_time_s: 0}\n", "gyro_filter.bias_time_s"},
		{"gyro_filter: {angle_random_walk_deg_rt_h: -1}\n", "gyro_filter.angle_random_walk_deg_rt_h"},
		{"gyro_filter: {start_sigma_deg: 20, valid_sigma_deg: 10}\n", "gyro_filter.start_sigma_deg"},
		{"gyro_filter: {hold_bound_deg: 180}\n", "gyro_filter.hold_bound_deg"},
		{"gyro_filter: {cosine_sigma: 2}\n", "gyro_filter.cosine_sigma"},
		{"gyro_filter: {gate: 3}\n", "gyro_filter.gate"},
	} {
		_, err := scenario.Parse([]byte(gyroBase+c.block), ".")
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: got %v, want an error naming %s", c.block, err, c.want)
		}
	}
}

// A tumble of 8°/s at 10 s steps (80° a step) is beyond what the filter's
// covariance was checked at: the run warns; 1–2°/s does not.
func TestFilterWarnsOfLargeTurnsPerStep(t *testing.T) {
	s, err := scenario.Parse([]byte(gyroBase+"gyro_filter: {}\n"), ".")
	if err != nil {
		t.Fatal(err)
	}
	if w := filterWarnings(runText(t, gyroBase+"gyro_filter: {}\n")); len(w) != 0 {
		t.Errorf("warned at 20° a step: %v", w)
	}
	fast := strings.Replace(gyroBase, "min_rate_deg_s: 1, max_rate_deg_s: 2", "min_rate_deg_s: 8, max_rate_deg_s: 8", 1)
	w := Warnings(s, runText(t, fast+"gyro_filter: {}\n"))
	if len(w) == 0 || !strings.Contains(w[len(w)-1], "80° in one step") {
		t.Errorf("no warning of 80° a step: %v", w)
	}
}
