package study

import (
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
		b.WriteString(`    - {name: "css` + f + `", kind: cosine, face: "` + f + `"` + errors + "}\n")
	}
	b.WriteString(albedoBlock)
	s, err := scenario.Parse([]byte(b.String()), "")
	if err != nil {
		t.Fatal(err)
	}
	return runScenario(t, s)
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
