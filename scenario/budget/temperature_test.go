package budget

import (
	"context"
	"math"
	"slices"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
)

// On a closed-form figure p95(ΔT) = 1° + (ΔT/20 °C)² (hot side) and
// 1° + (ΔT/40 °C)² (cold side), a 2° target holds from −40 °C to +20 °C
// around the calibration (closed form); the search finds both ends within
// its 0.5 °C resolution, reports a side that never fails as unbounded, and
// a figure already over the target at the calibration as infeasible.
func TestTemperatureRangeClosedForm(t *testing.T) {
	fig := func(scaleHot, scaleCold float64) RunFunc {
		return func(_ context.Context, c Case) (Metric, error) {
			if !c.AtTemperature {
				t.Fatal("case without a temperature")
			}
			d := c.TempOffsetC
			s := scaleHot
			if d < 0 {
				s = scaleCold
			}
			v := 1 + (d/s)*(d/s)
			return Metric{UnitP95Deg: []float64{v, v}, UnitRMSDeg: []float64{v, v}}, nil
		}
	}
	r, err := FindTemperatureRange(context.Background(), fig(20, 40), All(), 2, Metric.P95Deg)
	if err != nil {
		t.Fatal(err)
	}
	if r.Infeasible || !r.LowBounded || !r.HighBounded || math.Abs(r.LowC+40) > 0.5 || math.Abs(r.HighC-20) > 0.5 || r.LowC < -40 || r.HighC > 20 {
		t.Errorf("range %+v, want [−40, +20] °C within 0.5 °C, inside", r)
	}
	if !(r.AtLowDeg <= 2 && r.AtHighDeg <= 2) {
		t.Errorf("figures at the ends %g°, %g°: want within the target", r.AtLowDeg, r.AtHighDeg)
	}
	t.Logf("range [%+.2f, %+.2f] °C in %d runs", r.LowC, r.HighC, r.Runs)
	r, err = FindTemperatureRange(context.Background(), fig(20, 1e9), All(), 2, Metric.P95Deg)
	if err != nil || r.LowBounded || r.LowC != -MaxTemperatureOffsetC || !r.HighBounded {
		t.Errorf("cold side never fails: %+v, %v", r, err)
	}
	r, err = FindTemperatureRange(context.Background(), fig(20, 40), All(), 0.5, Metric.P95Deg)
	if err != nil || !r.Infeasible {
		t.Errorf("target below the figure at calibration: %+v, %v", r, err)
	}
}

// thermalRunner is the four-sensor test scenario with dark signals of d and
// d/2 on two sensors, calibrated at 20 °C (temperatures in orbit at 40 °C,
// moved by the search), 4 units over 3 h.
func thermalRunner(t *testing.T, d float64) *Runner {
	t.Helper()
	s, err := scenario.Load("testdata/inertial-4css.yaml")
	if err != nil {
		t.Fatal(err)
	}
	for i, dark := range []float64{d, d / 2} {
		sc := &s.Body.Sensors[i]
		sc.Params = sc.Params.WithNumber("dark_signal_at_calibration", dark).WithNumber("temperature_sunlit_c", 40).WithNumber("temperature_eclipse_c", 40)
	}
	r, err := NewRunner(s, Options{Units: 4, MaxDurationS: 3 * 3600})
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// The sensors' excess dark signal over the calibration is D·(2^(ΔT/10) − 1)
// on each sensor, so the readings, hence the error, depend on D and ΔT only
// through that product (common random numbers: the same draws in every
// run): halving every dark signal moves the hot end of the calibration range
// to the ΔT' with 2^(ΔT'/10) − 1 = 2·(2^(ΔT/10) − 1) (closed form, within
// the search's 0.5 °C on each end).
func TestCalibrationRangeFollowsTheDoublingRule(t *testing.T) {
	ctx := context.Background()
	r1 := thermalRunner(t, 0.02)
	all := AllOf(r1.Sources())
	c0 := all
	c0.AtTemperature = true
	m0, err := r1.Run(ctx, c0)
	if err != nil {
		t.Fatal(err)
	}
	target := m0.P95Deg() + 0.3
	a, err := FindTemperatureRange(ctx, r1.Run, all, target, Metric.P95Deg)
	if err != nil {
		t.Fatal(err)
	}
	b, err := FindTemperatureRange(ctx, thermalRunner(t, 0.01).Run, all, target, Metric.P95Deg)
	if err != nil {
		t.Fatal(err)
	}
	if !a.HighBounded || !b.HighBounded || a.Infeasible {
		t.Fatalf("ranges %+v and %+v: want both bounded on the hot side", a, b)
	}
	want := 10 * math.Log2(2*math.Exp2(a.HighC/10)-1)
	// Each end is within 0.5 °C below its true crossing; the predicted end
	// carries the first one's through the rule's slope (at most 2×).
	if math.Abs(b.HighC-want) > 0.5+2*0.5 {
		t.Errorf("hot end with dark signal 0.02: %+.2f °C; halved: %+.2f °C, the doubling rule says %+.2f °C", a.HighC, b.HighC, want)
	}
	t.Logf("target %.3f° (calibrated %.3f°): hot end %+.2f °C with dark signal 0.02, %+.2f °C with 0.01 (rule: %+.2f °C); cold ends %+.1f, %+.1f °C",
		target, m0.P95Deg(), a.HighC, b.HighC, want, a.LowC, b.LowC)
}

// Temperature is a budget term of its own: alone it gives an error (the
// sensors' dark signals at 40 °C against a 20 °C calibration), and with it
// off the run is the run of the same sensors without temperature keys.
func TestTemperatureIsABudgetTerm(t *testing.T) {
	ctx := context.Background()
	r := thermalRunner(t, 0.02)
	if !slices.Contains(r.Sources(), Temperature) {
		t.Fatalf("sources %v lack temperature", r.Sources())
	}
	alone, err := r.Run(ctx, Only(Temperature))
	if err != nil {
		t.Fatal(err)
	}
	if !(alone.P95Deg() > 0.1) {
		t.Errorf("temperature alone: p95 %.4f°, want an error", alone.P95Deg())
	}
	off := AllOf(r.Sources())
	off.Scale[Temperature] = 0
	m, err := r.Run(ctx, off)
	if err != nil {
		t.Fatal(err)
	}
	s, err := scenario.Load("testdata/inertial-4css.yaml")
	if err != nil {
		t.Fatal(err)
	}
	plain, err := NewRunner(s, Options{Units: 4, MaxDurationS: 3 * 3600})
	if err != nil {
		t.Fatal(err)
	}
	want, err := plain.Run(ctx, AllOf(plain.Sources()))
	if err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(m.UnitP95Deg, want.UnitP95Deg) {
		t.Errorf("temperature off: unit p95 %v, without temperature keys %v", m.UnitP95Deg, want.UnitP95Deg)
	}
	t.Logf("temperature alone p95 %.3f°, all with temperature off %.3f° (= without keys %.3f°)", alone.P95Deg(), m.P95Deg(), want.P95Deg())
}
