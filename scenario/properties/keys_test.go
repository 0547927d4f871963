package properties

import (
	"fmt"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/internal/randscenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// fingerprint prints the figures of every unit that a key could move.
func fingerprint(res *sim.Result) string {
	var b strings.Builder
	fmt.Fprintf(&b, "eclipses %v\n", res.Eclipses)
	for _, u := range res.Units {
		fmt.Fprintf(&b, "unit %d: %v %v %v %v %v\n", u.Unit, u.SunlitFraction, u.PenumbraFraction, u.SeenAtLeast, u.FalseSunFraction, u.BetaMaxDeg)
		for _, s := range u.Sensors {
			fmt.Fprintf(&b, " %s %v %v %v %v %v %v %v\n", s.Name, s.InViewFraction, s.PeakSignal, s.SaturatedFraction, s.FalseSunFraction, s.AlbedoOnlyFraction,
				s.MoonInViewFraction, s.LitEarthInViewFraction)
		}
		for _, e := range u.Estimators {
			fmt.Fprintf(&b, " %s %v %v %v %v %v %v\n", e.Name, e.ValidFraction, e.ValidFractionNoAlbedo, e.ErrNoAlbedo, e.ErrAlbedo, e.AlbedoPart, e.WrongFraction)
			if k := e.Corrected; k != nil {
				fmt.Fprintf(&b, "  corrected %v %v %v\n", k.ValidFraction, k.Err, k.ResidualPart)
			}
		}
	}
	return b.String()
}

// keyBase is a scenario in which every sensor key can show: an isotropic
// attitude sweeps every direction through every sensor, a LEO orbit has
// eclipses, albedo is on, two units draw errors.
func keyBase() *randscenario.File {
	h, inc, th := 550.0, 45.0, 0.05
	half, halfD, acc := 80.0, 50.0, 0.3
	shade, cell, gap := 1.0, 2.0, 0.1
	v := 0.3
	errs := func(e randscenario.Errors) *randscenario.Errors { return &e }
	return &randscenario.File{
		Name: "key effects", Epoch: "2026-03-20T00:00:00Z", Duration: "2h", Step: "10s", Seed: 3,
		Orbit:    randscenario.Orbit{AltitudeKm: &h, InclinationDeg: &inc, Propagator: "j2-mean"},
		SunModel: "low-precision", Shadow: "conical",
		Attitude: randscenario.Law{Law: "isotropic"},
		// A panel beyond the +Z face: the sensors' positions on the outline
		// decide what it shades.
		Body: randscenario.Body{SizeM: []float64{0.1, 0.1, 0.2},
			Obstructions: []randscenario.Obstruction{{Name: "panel", Shape: "rectangle", CentreM: []float64{0.15, 0, 0.2}, HalfExtentsM: []float64{0.1, 0.1, 0}}},
			Sensors: []randscenario.Sensor{
				{Name: "c1", Kind: "cosine", Face: "+X", HalfAngleDeg: &half, Threshold: &th,
					Errors: errs(randscenario.Errors{DarkOffset1Sigma: 0.005, Gain1Sigma: 0.02, Noise1Sigma: 0.003, MisalignmentDeg1Sigma: 1})},
				{Name: "c2", Kind: "cosine", Face: "-X"}, {Name: "c3", Kind: "cosine", Face: "+Y"}, {Name: "c4", Kind: "cosine", Face: "-Y"},
				{Name: "c5", Kind: "cosine", Face: "+Z"}, {Name: "c6", Kind: "cosine", Face: "-Z"},
				{Name: "q", Kind: "quadrant", Face: "+Z", ShadeHeightMM: &shade, CellSizeMM: &cell, GapMM: &gap,
					Errors: errs(randscenario.Errors{DarkOffset1Sigma: 0.002, Gain1Sigma: 0.01, Noise1Sigma: 0.001, MisalignmentDeg1Sigma: 0.2, ApertureOffsetMM1Sigma: 0.02})},
				{Name: "d", Kind: "digital", Face: "+Y", HalfAngleDeg: &halfD, AccuracyDeg1Sigma: &acc, FOVShape: "cone",
					Errors: errs(randscenario.Errors{MisalignmentDeg1Sigma: 0.1})},
			}},
		Albedo:     randscenario.Albedo{Model: "uniform", Value: &v, Cells: 300},
		MonteCarlo: &randscenario.MonteCarlo{Units: 2},
	}
}

// Any key accepted changes some output: each change of one key, from a
// file that runs, is either refused by the file check or moves a figure
// of the run.
func TestEveryAcceptedKeyHasAnEffect(t *testing.T) {
	f64 := func(v float64) *float64 { return &v }
	sens := func(name string, edit func(s *randscenario.Sensor)) func(f *randscenario.File) {
		return func(f *randscenario.File) {
			for i := range f.Body.Sensors {
				if s := &f.Body.Sensors[i]; s.Name == name {
					if s.Errors == nil {
						s.Errors = &randscenario.Errors{}
					}
					edit(s)
				}
			}
		}
	}
	cases := []struct {
		key  string
		edit func(f *randscenario.File)
	}{
		{"seed", func(f *randscenario.File) { f.Seed = 4 }},
		{"epoch", func(f *randscenario.File) { f.Epoch = "2026-06-20T00:00:00Z" }},
		{"step", func(f *randscenario.File) { f.Step = "11s" }},
		{"sun_model", func(f *randscenario.File) { f.SunModel = "meeus" }},
		{"shadow", func(f *randscenario.File) { f.Shadow = "cylindrical" }},
		{"orbit.propagator", func(f *randscenario.File) { f.Orbit.Propagator = "two-body" }},
		{"orbit.raan_deg", func(f *randscenario.File) { f.Orbit.RAANDeg = f64(40) }},
		{"albedo.value", func(f *randscenario.File) { f.Albedo.Value = f64(0.5) }},
		{"albedo.cells", func(f *randscenario.File) { f.Albedo.Cells = 200 }},
		{"albedo.model zonal", func(f *randscenario.File) { f.Albedo = randscenario.Albedo{Model: "zonal", Cells: 300} }},
		{"body.size_m", func(f *randscenario.File) { f.Body.SizeM = []float64{0.3, 0.1, 0.2} }},
		{"monte_carlo.units", func(f *randscenario.File) { f.MonteCarlo.Units = 3 }},
		{"cosine half_angle_deg", sens("c1", func(s *randscenario.Sensor) { s.HalfAngleDeg = f64(60) })},
		{"cosine threshold", sens("c1", func(s *randscenario.Sensor) { s.Threshold = f64(0.2) })},
		{"cosine full_scale", sens("c1", func(s *randscenario.Sensor) { s.FullScale = f64(0.8) })},
		{"cosine adc_bits", sens("c1", func(s *randscenario.Sensor) { s.ADCBits = new(int); *s.ADCBits = 6 })},
		{"cosine tilt_deg", sens("c1", func(s *randscenario.Sensor) { s.TiltDeg, s.TiltToward = f64(30), "+Z" })},
		{"cosine clock_deg", sens("c1", func(s *randscenario.Sensor) { s.ClockDeg = f64(40) })},
		{"cosine errors.dark_offset_1sigma", sens("c1", func(s *randscenario.Sensor) { s.Errors.DarkOffset1Sigma = 0.02 })},
		{"cosine errors.gain_1sigma", sens("c1", func(s *randscenario.Sensor) { s.Errors.Gain1Sigma = 0.1 })},
		{"cosine errors.noise_1sigma", sens("c1", func(s *randscenario.Sensor) { s.Errors.Noise1Sigma = 0.01 })},
		{"cosine errors.misalignment_deg_1sigma", sens("c1", func(s *randscenario.Sensor) { s.Errors.MisalignmentDeg1Sigma = 3 })},
		{"cosine errors.aperture_offset_mm_1sigma", sens("c1", func(s *randscenario.Sensor) { s.Errors.ApertureOffsetMM1Sigma = 0.1 })},
		{"quadrant shade_height_mm", sens("q", func(s *randscenario.Sensor) { s.ShadeHeightMM = f64(2) })},
		{"quadrant cell_size_mm", sens("q", func(s *randscenario.Sensor) { s.CellSizeMM = f64(3) })},
		{"quadrant gap_mm", sens("q", func(s *randscenario.Sensor) { s.GapMM = f64(0.3) })},
		{"quadrant threshold", sens("q", func(s *randscenario.Sensor) { s.Threshold = f64(0.9) })},
		{"quadrant clock_deg", sens("q", func(s *randscenario.Sensor) { s.ClockDeg = f64(30) })},
		{"quadrant errors.dark_offset_1sigma", sens("q", func(s *randscenario.Sensor) { s.Errors.DarkOffset1Sigma = 0.02 })},
		{"quadrant errors.gain_1sigma", sens("q", func(s *randscenario.Sensor) { s.Errors.Gain1Sigma = 0.1 })},
		{"quadrant errors.noise_1sigma", sens("q", func(s *randscenario.Sensor) { s.Errors.Noise1Sigma = 0.01 })},
		{"quadrant errors.misalignment_deg_1sigma", sens("q", func(s *randscenario.Sensor) { s.Errors.MisalignmentDeg1Sigma = 2 })},
		{"quadrant errors.aperture_offset_mm_1sigma", sens("q", func(s *randscenario.Sensor) { s.Errors.ApertureOffsetMM1Sigma = 0.2 })},
		{"digital half_angle_deg", sens("d", func(s *randscenario.Sensor) { s.HalfAngleDeg = f64(30) })},
		{"digital fov_shape", sens("d", func(s *randscenario.Sensor) { s.FOVShape = "square" })},
		{"digital accuracy_deg_1sigma", sens("d", func(s *randscenario.Sensor) { s.AccuracyDeg1Sigma = f64(1.5) })},
		{"digital threshold", sens("d", func(s *randscenario.Sensor) { s.Threshold = f64(0.5) })},
		{"digital clock_deg", sens("d", func(s *randscenario.Sensor) { s.ClockDeg = f64(30) })},
		{"digital errors.misalignment_deg_1sigma", sens("d", func(s *randscenario.Sensor) { s.Errors.MisalignmentDeg1Sigma = 2 })},
		{"digital errors.dark_offset_1sigma", sens("d", func(s *randscenario.Sensor) { s.Errors.DarkOffset1Sigma = 0.02 })},
		{"digital errors.gain_1sigma", sens("d", func(s *randscenario.Sensor) { s.Errors.Gain1Sigma = 0.1 })},
		{"digital errors.noise_1sigma", sens("d", func(s *randscenario.Sensor) { s.Errors.Noise1Sigma = 0.01 })},
		{"digital adc_bits", sens("d", func(s *randscenario.Sensor) { s.ADCBits = new(int); *s.ADCBits = 4 })},
		{"digital full_scale", sens("d", func(s *randscenario.Sensor) { s.FullScale = f64(0.5) })},
		{"digital moon_blind_lit_fraction", sens("d", func(s *randscenario.Sensor) { s.MoonBlindLitFraction = f64(0) })},
		{"digital lit_earth_blind_depth_deg", sens("d", func(s *randscenario.Sensor) { s.LitEarthBlindDepthDeg = f64(10) })},
	}
	base := keyBase()
	_, res := mustRun(t, base)
	want := fingerprint(res)
	for _, c := range cases {
		t.Run(c.key, func(t *testing.T) {
			f := base.Clone()
			c.edit(f)
			b, err := build(f)
			if err != nil {
				t.Logf("refused: %v", err)
				return
			}
			r, err := run(b.cfg)
			if err != nil {
				t.Fatalf("check accepted, run failed: %v", err)
			}
			if fingerprint(r) == want {
				showOnFailure(t, f.YAML())
				verdict(t, "key-has-effect "+c.key, []string{fmt.Sprintf("%s accepted and changed no figure of the run", c.key)})
			}
		})
	}
}

// Every key of the on-board albedo model (albedo.onboard) changes the
// corrected figures or is refused, from a base whose truth is zonal and
// whose on-board model is uniform; adding the block to a file without one
// adds the corrected figures.
func TestEveryOnboardKeyHasAnEffect(t *testing.T) {
	f64 := func(v float64) *float64 { return &v }
	base := keyBase()
	base.Albedo = randscenario.Albedo{Model: "zonal", Cells: 300, Onboard: &randscenario.OnboardAlbedo{Model: "uniform", Value: f64(0.3), Cells: 300}}
	cases := []struct {
		key  string
		edit func(a *randscenario.Albedo)
	}{
		{"albedo.onboard (removed)", func(a *randscenario.Albedo) { a.Onboard = nil }},
		{"albedo.onboard.value", func(a *randscenario.Albedo) { a.Onboard.Value = f64(0.2) }},
		{"albedo.onboard.cells", func(a *randscenario.Albedo) { a.Onboard.Cells = 150 }},
		{"albedo.onboard.model zonal", func(a *randscenario.Albedo) { a.Onboard.Model, a.Onboard.Value = "zonal", nil }},
		{"albedo.onboard.model none", func(a *randscenario.Albedo) { a.Onboard.Model, a.Onboard.Value = "none", nil }},
		{"albedo.onboard.model grid, grid_file", func(a *randscenario.Albedo) {
			a.Onboard.Model, a.Onboard.Value, a.Onboard.GridFile = "grid", nil, gridFile(t)
		}},
	}
	_, res := mustRun(t, base)
	want := fingerprint(res)
	if !strings.Contains(want, "corrected") {
		t.Fatal("the base with an on-board model has no corrected figures")
	}
	for _, c := range cases {
		t.Run(c.key, func(t *testing.T) {
			f := base.Clone()
			c.edit(&f.Albedo)
			b, err := build(f)
			if err != nil {
				t.Fatalf("refused: %v", err)
			}
			r, err := run(b.cfg)
			if err != nil {
				t.Fatalf("check accepted, run failed: %v", err)
			}
			if fingerprint(r) == want {
				showOnFailure(t, f.YAML())
				t.Errorf("%s accepted and changed no figure of the run", c.key)
			}
		})
	}
}
