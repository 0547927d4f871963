package sim

import (
	"math"
	"testing"
)

// Quantiles over units count a unit without any valid estimate as the
// worst: it reached no error bound. With 20 units whose p95 are 1..19° and
// one without an estimate, the empirical p95 (the smallest value with at
// least 0.95·20 = 19 values at or below it) is 19°, the worst +Inf; with
// two such units the p95 is +Inf, where dropping them gives 18° (closed
// form: counting).
func TestAcrossUnitsCountsUnitsWithoutEstimateAsWorst(t *testing.T) {
	units := func(missing int) []*UnitResult {
		var out []*UnitResult
		for i := range 20 {
			p := float64(i + 1)
			if i >= 20-missing {
				p = math.NaN()
			}
			e := EstimatorStats{Name: "e", ValidFraction: 0.9}
			e.ErrAlbedo.P95Deg, e.ErrNoAlbedo.P95Deg = math.NaN(), p
			e.Corrected = &CorrectedStats{Err: ErrorStats{P95Deg: p}}
			out = append(out, &UnitResult{Unit: i, Estimators: []EstimatorStats{e}})
		}
		return out
	}
	a := acrossUnits(units(1))[0]
	if a.P95OfUnitP95Deg != 19 || !math.IsInf(a.WorstUnitP95Deg, 1) || a.UnitsWithoutEstimate != 1 || a.P50OfUnitP95Deg != 10 {
		t.Errorf("one unit without estimate: p50 %v p95 %v worst %v missing %d; want 10, 19, +Inf, 1",
			a.P50OfUnitP95Deg, a.P95OfUnitP95Deg, a.WorstUnitP95Deg, a.UnitsWithoutEstimate)
	}
	if a.P95OfUnitP95CorrectedDeg != 19 {
		t.Errorf("corrected p95 over units %v, want 19", a.P95OfUnitP95CorrectedDeg)
	}
	if !math.IsNaN(a.UnitP95Deg[19]) {
		t.Errorf("the unit's own p95 %v, want NaN (undefined)", a.UnitP95Deg[19])
	}
	a = acrossUnits(units(2))[0]
	if !math.IsInf(a.P95OfUnitP95Deg, 1) || a.UnitsWithoutEstimate != 2 {
		t.Errorf("two units without estimate: p95 %v missing %d; want +Inf, 2", a.P95OfUnitP95Deg, a.UnitsWithoutEstimate)
	}
	a = acrossUnits(units(0))[0]
	if a.P95OfUnitP95Deg != 19 || a.WorstUnitP95Deg != 20 || a.UnitsWithoutEstimate != 0 {
		t.Errorf("all units valid: p95 %v worst %v missing %d; want 19, 20, 0", a.P95OfUnitP95Deg, a.WorstUnitP95Deg, a.UnitsWithoutEstimate)
	}
}

// The false suns over the units: the count of units with one in umbra
// and the largest share of any unit, whichever unit it is (unit 0, whose
// errors are one draw, shows none here; counting).
func TestAcrossUnitsFalseSuns(t *testing.T) {
	umbra := []float64{0, 0, 0.5, 1, 0.05}
	var units []*UnitResult
	for i, f := range umbra {
		e := EstimatorStats{Name: "e", ValidFraction: 0.9, FalseSunFraction: f, AlbedoOnlyFraction: 0.01 * float64(i), WrongFraction: 0.1 * float64(4-i)}
		e.ErrAlbedo.P95Deg, e.ErrNoAlbedo.P95Deg = math.NaN(), 1
		units = append(units, &UnitResult{Unit: i, Estimators: []EstimatorStats{e}})
	}
	a := acrossUnits(units)[0]
	if a.UnitsWithFalseSun != 3 || a.WorstFalseSunFraction != 1 || a.WorstAlbedoOnlyFraction != 0.04 || a.WorstWrongFraction != 0.4 {
		t.Errorf("units with a false sun %d, worst %v, albedo only %v, wrong %v; want 3, 1, 0.04, 0.4",
			a.UnitsWithFalseSun, a.WorstFalseSunFraction, a.WorstAlbedoOnlyFraction, a.WorstWrongFraction)
	}
}
