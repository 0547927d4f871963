package sensor

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// The dark signal doubles per DoublingC above the calibration temperature
// (application-note rule of thumb, common practice, no source) and the gain
// changes linearly: at +20 °C with a 10 °C doubling the dark signal is 4×
// its calibrated value, so the reading carries 3× that value on top of the
// calibration; at the calibration temperature nothing changes.
func TestThermalFactorsClosedForm(t *testing.T) {
	th := Thermal{SunlitC: 60, EclipseC: -20, CalibrationC: 20, DarkAtCal: 0.002, DoublingC: 10, GainPerC: 0.001}
	for _, c := range []struct{ tempC, gain, dark float64 }{
		{20, 1, 0}, {40, 1.02, 0.002 * 3}, {30, 1.01, 0.002}, {0, 0.98, 0.002 * (0.25 - 1)}, {60, 1.04, 0.002 * 15},
	} {
		g, d := th.Factors(c.tempC)
		if math.Abs(g-c.gain) > 1e-15 || math.Abs(d-c.dark) > 1e-15 {
			t.Errorf("%g °C: gain %.15g, dark %.15g; want %g, %g", c.tempC, g, d, c.gain, c.dark)
		}
	}
	// Per phase: sunlit and eclipse values, linear in the lit share of the
	// solar disc through the penumbra.
	for lit, want := range map[float64]float64{1: 60, 0: -20, 0.25: 0} {
		if got := th.Temperature(lit); math.Abs(got-want) > 1e-12 {
			t.Errorf("lit %g: %g °C, want %g °C", lit, got, want)
		}
	}
	if !th.On() || (Thermal{SunlitC: 20, EclipseC: 20, CalibrationC: 20, DarkAtCal: 0.01, DoublingC: 10}).On() ||
		(Thermal{SunlitC: 50, EclipseC: 20, CalibrationC: 20, DoublingC: 10}).On() {
		t.Error("On: a model changes readings only with a temperature off calibration and a dark signal or a gain coefficient")
	}
}

// A cosine sensor read at a temperature gives gain(T)·cos θ + dark(T) on
// top of its calibrated reading (closed form, no noise, no ADC), and the
// quadrant's four cells carry the same shifts, so its sum does.
func TestReadAtTemperature(t *testing.T) {
	th := Thermal{SunlitC: 50, EclipseC: -10, CalibrationC: 20, DarkAtCal: 0.003, DoublingC: 10, GainPerC: 0.0015}
	m, err := FaceMount(FacePlusZ, 0, FaceNone, 0)
	if err != nil {
		t.Fatal(err)
	}
	c, err := NewCosine(CosineSpec{Name: "c", Mount: m, HalfAngle: math.Pi / 2, Errors: Errors{Thermal: th}})
	if err != nil {
		t.Fatal(err)
	}
	sun := r3.Unit(r3.Vec{X: 0.6, Z: 0.8})
	base := c.Read(sun, SolarConstant, Albedo{}, nil)
	for _, T := range []float64{-10, 20, 50} {
		g, d := th.Factors(T)
		got := c.ReadAt(sun, SolarConstant, Albedo{}, nil, T)
		if want := g*0.8 + d; math.Abs(got.Signal-want) > 1e-12 {
			t.Errorf("cosine at %g °C: %.12f, want %.12f", T, got.Signal, want)
		}
		if T == 20 && got != base {
			t.Errorf("at the calibration temperature %+v, Read gives %+v", got, base)
		}
	}
	q, err := NewQuadrant(QuadrantSpec{Name: "q", Mount: m, Height: 1, CellSide: 2, Gap: 0.1, ApertureSide: 2, Errors: Errors{Thermal: th}})
	if err != nil {
		t.Fatal(err)
	}
	s := r3.Unit(r3.Vec{X: 0.1, Y: 0.05, Z: 1})
	q0 := q.Read(s, SolarConstant, Albedo{}, nil)
	for _, T := range []float64{-10, 50} {
		g, d := th.Factors(T)
		got := q.ReadAt(s, SolarConstant, Albedo{}, nil, T)
		for i := range got.Cells {
			if want := g*q0.Cells[i] + d; math.Abs(got.Cells[i]-want) > 1e-12 {
				t.Errorf("quadrant cell %d at %g °C: %.12f, want %.12f", i, T, got.Cells[i], want)
			}
		}
	}
	// A drawn unit keeps the model, and the noise stream advances as Read's.
	u := c.Draw(rand.New(rand.NewPCG(1, 2))).(*Cosine)
	if u.ThermalModel() != th {
		t.Errorf("drawn unit's model %+v", u.ThermalModel())
	}
}

// The file keys: every thermal key is registered for the cosine and both
// quadrant kinds (not the digital one), with the stated defaults, and a
// temperature without a dark signal or gain coefficient is refused (it
// would have no effect), as is a dark signal with every temperature at the
// calibration one.
func TestThermalKeysAndRefusals(t *testing.T) {
	for _, kind := range []Kind{KindCosine, KindQuadrant, KindQuadrantWall} {
		k, _ := LookupKind(string(kind))
		got := map[string]float64{}
		for _, p := range k.Params {
			got[p.Key] = p.Default
		}
		for key, def := range map[string]float64{"temperature_sunlit_c": 20, "temperature_eclipse_c": 20, "calibration_temperature_c": 20,
			"dark_signal_at_calibration": 0, "dark_doubling_c": 10, "gain_tempco_pct_per_c": 0} {
			if v, ok := got[key]; !ok || v != def {
				t.Errorf("%s: key %s default %v (present %v), want %g", kind, key, v, ok, def)
			}
		}
	}
	d, _ := LookupKind(string(KindDigital))
	for _, p := range d.Params {
		if p.Key == "temperature_sunlit_c" {
			t.Error("the digital kind has thermal keys")
		}
	}
	for name, th := range map[string]Thermal{
		"temperature without an effect":            {SunlitC: 60, EclipseC: 20, CalibrationC: 20, DoublingC: 10},
		"dark signal without a temperature change": {SunlitC: 20, EclipseC: 20, CalibrationC: 20, DarkAtCal: 0.01, DoublingC: 10},
	} {
		if err := th.validate("s"); err == nil {
			t.Errorf("%s accepted", name)
		}
	}
}
