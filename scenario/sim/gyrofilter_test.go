package sim

import (
	"context"
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sensor/filter"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

const degRad = math.Pi / 180

// filterConfig is a MEMS-class gyro (0.3°/√h angle random walk, 10°/h bias
// instability over 600 s: common practice, no source), valid while the
// filter's 1σ is within 10°, holding to 10°.
func filterConfig() *FilterConfig {
	return &FilterConfig{Settings: filter.Settings{ARW: 0.3 * degRad / 60, BiasSigma: 10 * degRad / 3600, BiasTau: 600,
		LengthRate: 0.01, StartSigma: 5 * degRad, StartLengthSigma: 0.1, MaxSigma: 10 * degRad, Gate: 5},
		CosineSigma: 0.02, HoldBoundDeg: 10}
}

// Realistic errors on (noise, dark offsets, gain mismatch, 0.5°
// misalignment, 12-bit ADC, uniform albedo) and a tumble at 1°/s about a
// skew body axis: through eclipse the least-squares point estimator has
// no valid reading, and its last answer held drifts with the tumble, while
// the gyro-aided filter keeps the sun: its p95 in eclipse is a few degrees
// against the held estimate's tens (measured: see the log).
func TestFilterHoldsThroughEclipse(t *testing.T) {
	cfg := referenceCase(t, 0.15, true)
	cfg.Step = 2
	cfg.NewAlbedo = func() (*albedo.Model, error) { return albedo.New(albedo.Config{AltitudeKm: 550}) }
	cfg.Array = faceArrayWith(t, 80, sensor.Errors{NoiseSigma: 0.005, DarkSigma: 0.005, GainSigma: 0.02,
		MisalignSigma: 0.5 * degRad, ADCBits: 12, FullScale: 1.5})
	cfg.Law = attitude.Tumble{Q0: r3.NewRotation(0.4, r3.Vec{X: 1, Y: 1}), Rate: r3.Scale(degRad/math.Sqrt(3), r3.Vec{X: 1, Y: -1, Z: 1})}
	cfg.Estimators = []sensor.Estimator{sensor.LeastSquares{}}
	cfg.Gates = []sensor.Gate{sensor.DefaultGate("least-squares")}
	cfg.Filter = filterConfig()
	res, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	f := res.Nominal.Filter
	if f == nil {
		t.Fatal("no filter figures")
	}
	t.Logf("filter valid %.3f (eclipse %.3f), p95 %.2f°, eclipse p95 %.2f° (%d samples); held point estimate eclipse p95 %.1f°; outages %d held %d, shortest break %.0f s, longest held %.0f s, starts %d",
		f.ValidFraction, f.ValidShadowFraction, f.Err.P95Deg, f.ErrShadow.P95Deg, f.ErrShadow.N, f.HoldLastShadow.P95Deg,
		f.Outages, f.OutagesHeld, f.ShortestBreakS, f.LongestHeldS, f.Starts)
	if len(res.Eclipses) == 0 || f.ErrShadow.N == 0 {
		t.Fatalf("no eclipse sample with a valid filter (%d eclipses)", len(res.Eclipses))
	}
	if !(f.ErrShadow.P95Deg < f.HoldLastShadow.P95Deg/3) || !(f.ErrShadow.P95Deg < cfg.Filter.HoldBoundDeg) {
		t.Errorf("filter p95 in eclipse %.2f°: want below the bound %g° and a third of the held point estimate's %.1f°",
			f.ErrShadow.P95Deg, cfg.Filter.HoldBoundDeg, f.HoldLastShadow.P95Deg)
	}
	if !(f.ValidShadowFraction > 0.95) {
		t.Errorf("filter valid in %.3f of eclipse time, want > 0.95", f.ValidShadowFraction)
	}
}

// The filter adds figures and changes none of the point estimators'.
func TestFilterLeavesEstimatorsUnchanged(t *testing.T) {
	cfg := referenceCase(t, 0.05, false)
	cfg.Array = noisyFaceArray(t, 70)
	without, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	cfg.Filter = filterConfig()
	with, err := Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	if without.Nominal.Filter != nil || with.Nominal.Filter == nil {
		t.Fatal("filter figures present without a filter or missing with one")
	}
	for j := range with.Nominal.Estimators {
		a, b := without.Nominal.Estimators[j], with.Nominal.Estimators[j]
		if fmt.Sprint(a.ValidFraction, a.ErrNoAlbedo, a.NumGaps, a.GapLengths) != fmt.Sprint(b.ValidFraction, b.ErrNoAlbedo, b.NumGaps, b.GapLengths) {
			t.Errorf("%s changed with the filter on: %+v vs %+v", a.Name, a.ErrNoAlbedo, b.ErrNoAlbedo)
		}
	}
}
