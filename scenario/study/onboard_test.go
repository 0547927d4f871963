package study

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// onboardCase is a 6U in a 550 km sun-synchronous orbit at 10:30, nadir
// pointing, six cosine sensors (invented demo values) and the given albedo
// block and sensor errors, over six hours.
func onboardCase(t *testing.T, albedoBlock, errors string) *sim.Result {
	t.Helper()
	return runScenario(t, onboardScenario(t, albedoBlock, errors))
}

// onboardScenario is onboardCase's scenario, the albedo block followed by
// any further top-level keys (targets).
func onboardScenario(t *testing.T, albedoBlock, errors string) *scenario.Scenario {
	return onboardScenarioOf(t, albedoBlock, errors, []string{""})
}

// onboardScenarioOf is onboardScenario with one sensor per face and name
// suffix (two suffixes give two sensors on each face).
func onboardScenarioOf(t *testing.T, albedoBlock, errors string, suffixes []string) *scenario.Scenario {
	t.Helper()
	var b strings.Builder
	b.WriteString(`epoch: "2026-03-20T00:00:00Z"
duration: 6h
step: 30s
orbit: {altitude_km: 550, ltan: "10:30"}
attitude: {law: nadir, point_axis: "+Z", align_axis: "+X"}
estimators: [least-squares]
monte_carlo: {units: 2}
body:
  sensors:
`)
	for _, f := range []string{"+X", "-X", "+Y", "-Y", "+Z", "-Z"} {
		for _, x := range suffixes {
			b.WriteString(`    - {name: "css` + f + x + `", kind: cosine, face: "` + f + `"` + errors + "}\n")
		}
	}
	b.WriteString(albedoBlock)
	s, err := scenario.Parse([]byte(b.String()), "")
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// The on-board model equal to the truth's removes the albedo part of the
// estimate: with linear error-free readings (adc_bits 0; the default full
// scale of 1.5 is not reached by this layout) the corrected readings are
// the readings without albedo (closed form), so the residual albedo part is
// zero to rounding (≤ 1e-6°) and validity is that without albedo.
func TestOnboardSameModelRemovesAlbedoPart(t *testing.T) {
	for _, truth := range []string{"{model: uniform, value: 0.3, cells: 400}", "{model: zonal, value: 0.3, cells: 400}"} {
		res := onboardCase(t, "albedo: "+strings.TrimSuffix(truth, "}")+", onboard: "+truth+"}\n", ", adc_bits: 0")
		for _, u := range res.Units {
			e := u.Estimators[0]
			k := e.Corrected
			if k == nil {
				t.Fatalf("%s: no corrected figures", truth)
			}
			t.Logf("%s unit %d: albedo part p95 %.3f°, residual max %.2g° over %d samples; valid %.4f corrected, %.4f without albedo",
				truth, u.Unit, e.AlbedoPart.P95Deg, k.ResidualPart.MaxDeg, k.ResidualPart.N, k.ValidFraction, e.ValidFractionNoAlbedo)
			if !(e.AlbedoPart.P95Deg > 1) {
				t.Errorf("%s: albedo part p95 %.3f°: the case has too little albedo to test a correction", truth, e.AlbedoPart.P95Deg)
			}
			if k.ResidualPart.N == 0 || k.ResidualPart.MaxDeg > 1e-6 {
				t.Errorf("%s unit %d: residual albedo part max %.3g° over %d samples, want ≤ 1e-6°", truth, u.Unit, k.ResidualPart.MaxDeg, k.ResidualPart.N)
			}
			if k.ValidFraction != e.ValidFractionNoAlbedo {
				t.Errorf("%s: valid %.6f corrected, %.6f without albedo", truth, k.ValidFraction, e.ValidFractionNoAlbedo)
			}
			if math.Abs(k.Err.P95Deg-e.ErrNoAlbedo.P95Deg) > 1e-6 {
				t.Errorf("%s: corrected p95 %.6f°, without albedo %.6f°", truth, k.Err.P95Deg, e.ErrNoAlbedo.P95Deg)
			}
		}
	}
}

// The same check with realistic sensor errors on (dark offset, gain, noise,
// misalignment, a 10-bit ADC; common practice, no source): the correction
// still takes most of the albedo part away but no longer all of it (the
// gain mismatch scales the albedo the nominal-gain correction removes, the
// ADC rounds the reading with albedo), the validity gate still passes
// about the share it passes without albedo, and no false sun appears.
func TestOnboardSameModelWithRealisticErrors(t *testing.T) {
	errs := `, adc_bits: 10, errors: {dark_offset_1sigma: 0.005, gain_1sigma: 0.02, noise_1sigma: 0.003, misalignment_deg_1sigma: 1}`
	res := onboardCase(t, "albedo: {model: zonal, value: 0.3, cells: 400, onboard: {model: zonal, value: 0.3, cells: 400}}\n", errs)
	for _, u := range res.Units {
		e := u.Estimators[0]
		k := e.Corrected
		t.Logf("unit %d: p95 no albedo %.3f°, albedo %.3f°, corrected %.3f°; albedo part p95 %.3f°, residual p95 %.3f°; valid %.4f / %.4f / %.4f",
			u.Unit, e.ErrNoAlbedo.P95Deg, e.ErrAlbedo.P95Deg, k.Err.P95Deg, e.AlbedoPart.P95Deg, k.ResidualPart.P95Deg,
			e.ValidFractionNoAlbedo, e.ValidFraction, k.ValidFraction)
		if !(k.ResidualPart.P95Deg > 1e-3) {
			t.Errorf("unit %d: residual p95 %.3g° with gain errors and an ADC: a correction cannot be perfect here", u.Unit, k.ResidualPart.P95Deg)
		}
		if !(k.ResidualPart.P95Deg < 0.25*e.AlbedoPart.P95Deg) {
			t.Errorf("unit %d: residual p95 %.3f° not below a quarter of the uncorrected albedo part %.3f°", u.Unit, k.ResidualPart.P95Deg, e.AlbedoPart.P95Deg)
		}
		if math.Abs(k.ValidFraction-e.ValidFractionNoAlbedo) > 0.01 {
			t.Errorf("unit %d: valid %.4f corrected against %.4f without albedo", u.Unit, k.ValidFraction, e.ValidFractionNoAlbedo)
		}
		if !(k.Err.P95Deg < e.ErrAlbedo.P95Deg) {
			t.Errorf("unit %d: corrected p95 %.3f° not below the uncorrected %.3f°", u.Unit, k.Err.P95Deg, e.ErrAlbedo.P95Deg)
		}
	}
}

// A uniform on-board model against a zonal truth (the same global mean)
// leaves a residual: the zonal model's reflectance varies with latitude
// (illum/albedo zonal model), the uniform one does not. The residual is
// stated, larger than rounding and smaller than the uncorrected albedo part.
func TestOnboardUniformAgainstZonalLeavesResidual(t *testing.T) {
	res := onboardCase(t, "albedo: {model: zonal, value: 0.3, cells: 400, onboard: {model: uniform, value: 0.3, cells: 400}}\n", "")
	e := res.Nominal.Estimators[0]
	k := e.Corrected
	t.Logf("albedo part p95 %.3f°, residual after a uniform correction p95 %.3f° (max %.3f°)", e.AlbedoPart.P95Deg, k.ResidualPart.P95Deg, k.ResidualPart.MaxDeg)
	if !(k.ResidualPart.P95Deg > 0.01) {
		t.Errorf("residual p95 %.3g°: a uniform model cannot remove a zonal albedo", k.ResidualPart.P95Deg)
	}
	if !(k.ResidualPart.P95Deg < e.AlbedoPart.P95Deg) {
		t.Errorf("residual p95 %.3f° not below the uncorrected albedo part %.3f°", k.ResidualPart.P95Deg, e.AlbedoPart.P95Deg)
	}
}

// The on-board model "none" predicts no albedo: the corrected figures are
// the uncorrected ones (identity: nothing is subtracted), gaps included,
// still reported.
func TestOnboardNoneChangesNothing(t *testing.T) {
	res := onboardCase(t, "albedo: {model: zonal, cells: 400, onboard: {model: none}}\n", "")
	e := res.Nominal.Estimators[0]
	k := e.Corrected
	if k == nil || k.ValidFraction != e.ValidFraction || k.Err != e.ErrAlbedo || k.LongestGapS != e.LongestGapS {
		t.Errorf("on-board none: corrected %+v, uncorrected valid %.6f, error %+v", k, e.ValidFraction, e.ErrAlbedo)
	}
}

// targets.judge: onboard-corrected moves the single-failure targets
// (n_minus_1) to the corrected estimate, with realistic sensor errors on so
// the correction is not perfect, on two sensors per face (each with its own
// error draws) so every failed layout keeps a defined p95. By definition of the n_minus_1 targets the
// p95 target's value is the largest corrected p95 over the failed layouts,
// the valid-share target's the lowest corrected valid share, the gap
// target's the longest corrected gap, and the worst failure the one with the
// lowest corrected valid share (ties: largest corrected p95). A p95 limit
// between the worst corrected and the worst uncorrected p95 fails judged
// uncorrected and passes judged corrected, and the verdict follows.
func TestSingleFailureJudgedOnboardCorrected(t *testing.T) {
	errs := `, adc_bits: 10, errors: {dark_offset_1sigma: 0.005, gain_1sigma: 0.02, noise_1sigma: 0.003, misalignment_deg_1sigma: 1}`
	albedo := "albedo: {model: zonal, value: 0.3, cells: 400, onboard: {model: zonal, value: 0.3, cells: 400}}\n"
	run := func(targets string) (SingleFailure, Assessment) {
		s := onboardScenarioOf(t, albedo+targets, errs, []string{"a", "b"})
		_, sf, a := runSingleFailure(t, s)
		return sf, a
	}
	// First, the figures with a loose limit, to place the test limit.
	sf, _ := run("targets: {judge: onboard-corrected, n_minus_1: {max_error_p95_deg: 90, min_valid_fraction: 0.01, max_gap: 10h}}\n")
	worstCorr, worstRaw, lowValid, longGap := 0.0, 0.0, 1.0, 0.0
	w := 0
	for i, r := range sf.Rows {
		h := r.Headline
		t.Logf("%s failed: valid %.4f (corrected %.4f), gap %.0f s (corrected %.0f s), p95 %.3f° (corrected %.3f°)", r.Sensor,
			h.ValidFraction, h.ValidFractionCorrected, h.LongestGapS, h.LongestGapCorrectedS, h.P95AlbedoDeg, h.P95CorrectedDeg)
		worstCorr, worstRaw = math.Max(worstCorr, h.P95CorrectedDeg), math.Max(worstRaw, h.P95AlbedoDeg)
		lowValid, longGap = math.Min(lowValid, h.ValidFractionCorrected), math.Max(longGap, h.LongestGapCorrectedS)
		b := sf.Rows[w].Headline
		if h.ValidFractionCorrected < b.ValidFractionCorrected || h.ValidFractionCorrected == b.ValidFractionCorrected && h.P95CorrectedDeg > b.P95CorrectedDeg {
			w = i
		}
	}
	if sf.Worst != w {
		t.Errorf("worst failure %s, want %s (lowest corrected valid share)", sf.Rows[sf.Worst].Sensor, sf.Rows[w].Sensor)
	}
	if !(worstCorr < 0.8*worstRaw) {
		t.Fatalf("worst p95 corrected %.3f°, uncorrected %.3f°: the case needs a correction that matters", worstCorr, worstRaw)
	}
	lim := (worstCorr + worstRaw) / 2
	targets := fmt.Sprintf("n_minus_1: {max_error_p95_deg: %g, min_valid_fraction: 0.01, max_gap: 10h}", lim)
	_, aCorr := run("targets: {judge: onboard-corrected, " + targets + "}\n")
	_, aRaw := run("targets: {" + targets + "}\n")
	for key, want := range map[string]float64{TargetNMinus1ErrorP95: worstCorr, TargetNMinus1Valid: lowValid, TargetNMinus1Gap: longGap} {
		c, ok := FindTarget(aCorr.Targets, key)
		if !ok || c.Got != want || !strings.Contains(c.Label, "on-board corrected") {
			t.Errorf("%s judged corrected: %+v (found %v), want the worst corrected figure %g", key, c, ok, want)
		}
	}
	c, _ := FindTarget(aCorr.Targets, TargetNMinus1ErrorP95)
	r, _ := FindTarget(aRaw.Targets, TargetNMinus1ErrorP95)
	t.Logf("limit %.3f°: corrected %.3f° pass %v, uncorrected %.3f° pass %v", lim, c.Got, c.Pass, r.Got, r.Pass)
	if !c.Pass || r.Pass || r.Got != worstRaw {
		t.Errorf("p95 limit %.3f°: corrected %+v, uncorrected %+v: want pass on %.3f°, fail on %.3f°", lim, c, r, worstCorr, worstRaw)
	}
	if !aCorr.Verdict.Met() || aRaw.Verdict.Met() {
		t.Errorf("verdicts: corrected %q, uncorrected %q", aCorr.Verdict.Text(), aRaw.Verdict.Text())
	}
}
