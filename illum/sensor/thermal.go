package sensor

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"math/rand/v2"
)

// Thermal is a sensor's temperature model: its temperature per phase of the
// orbit and how its dark signal and gain follow the temperature away from
// the ground calibration.
//
// The temperature is SunlitC in sunlight and EclipseC in umbra, linear in
// the lit share of the solar disc through the penumbra (no thermal lag:
// the sensor is taken to settle within the step). The dark signal (the
// photodiode's dark current, normalised like the signal) is DarkAtCal at
// CalibrationC and doubles every DoublingC degrees (10 °C: application-note
// rule of thumb, common practice, no source); the ground calibration
// removes DarkAtCal, so a reading at T carries DarkAtCal·(2^((T−Tcal)/D)−1)
// on top of the calibrated dark offset. The responsivity changes by
// GainPerC per degree (a linear temperature coefficient, 1/°C).
type Thermal struct {
	SunlitC, EclipseC, CalibrationC float64
	DarkAtCal                       float64
	DoublingC                       float64
	GainPerC                        float64
}

// On reports whether the model changes any reading: a temperature away
// from the calibration one and a dark signal or gain coefficient.
func (t Thermal) On() bool {
	off := t.SunlitC != t.CalibrationC || t.EclipseC != t.CalibrationC
	return off && (t.DarkAtCal > 0 || t.GainPerC != 0)
}

// Temperature returns the sensor temperature (°C) at a lit share of the
// solar disc in [0, 1].
func (t Thermal) Temperature(lit float64) float64 {
	return t.EclipseC + lit*(t.SunlitC-t.EclipseC)
}

// Factors returns the gain factor and the added dark signal at tempC.
func (t Thermal) Factors(tempC float64) (gain, dark float64) {
	dt := tempC - t.CalibrationC
	gain = 1 + t.GainPerC*dt
	if t.DarkAtCal > 0 {
		dark = t.DarkAtCal * (math.Exp2(dt/t.DoublingC) - 1)
	}
	return gain, dark
}

// validate refuses a model whose keys cannot act: temperatures set away
// from the calibration without a dark signal or gain coefficient, or a dark
// signal or coefficient with every temperature at the calibration one.
func (t Thermal) validate(name string) error {
	if t == (Thermal{}) {
		return nil
	}
	off := t.SunlitC != t.CalibrationC || t.EclipseC != t.CalibrationC
	acts := t.DarkAtCal > 0 || t.GainPerC != 0
	switch {
	case !(t.DoublingC > 0):
		return fmt.Errorf("sensor %q: dark_doubling_c = %g: want > 0 °C", name, t.DoublingC)
	case off && !acts:
		return fmt.Errorf("sensor %q: temperature_sunlit_c %g °C and temperature_eclipse_c %g °C differ from calibration_temperature_c %g °C but dark_signal_at_calibration and gain_tempco_pct_per_c are 0, so the temperatures change nothing; set one of them, or leave the temperatures out",
			name, t.SunlitC, t.EclipseC, t.CalibrationC)
	case acts && !off:
		return fmt.Errorf("sensor %q: dark_signal_at_calibration or gain_tempco_pct_per_c is set but temperature_sunlit_c and temperature_eclipse_c equal calibration_temperature_c %g °C, so they change nothing; set the orbit temperatures, or leave those keys out",
			name, t.CalibrationC)
	}
	return nil
}

// thermalParams are the temperature keys of the kinds with photodiode
// cells (cosine, quadrant). The defaults change nothing.
var thermalParams = []Param{
	{Key: "temperature_sunlit_c", Doc: "sensor temperature in sunlight (linear in the lit share through the penumbra)",
		Default: 20, Min: -150, Max: 150, Allowed: "[-150, 150] °C"},
	{Key: "temperature_eclipse_c", Doc: "sensor temperature in umbra",
		Default: 20, Min: -150, Max: 150, Allowed: "[-150, 150] °C"},
	{Key: "calibration_temperature_c", Doc: "temperature of the ground calibration of dark offset and gain",
		Default: 20, Min: -150, Max: 150, Allowed: "[-150, 150] °C"},
	{Key: "dark_signal_at_calibration", Doc: "dark signal at the calibration temperature (normal sun at 1 AU = 1); the calibration removes it, its change with temperature stays",
		Default: 0, Min: 0, Max: 0.5, Allowed: "[0, 0.5] (of the normal-sun signal)"},
	{Key: "dark_doubling_c", Doc: "temperature rise that doubles the dark signal (10 °C: application-note rule of thumb, common practice, no source)",
		Default: 10, Min: 1, Max: 100, Allowed: "[1, 100] °C", ActsWith: "dark_signal_at_calibration"},
	{Key: "gain_tempco_pct_per_c", Doc: "change of the responsivity per °C away from the calibration temperature",
		Default: 0, Min: -2, Max: 2, Allowed: "[-2, 2] %/°C", Scale: 0.01},
}

// thermalFrom reads the thermal keys of a kind's resolved parameters.
func thermalFrom(p Params) Thermal {
	if _, ok := p.Num["temperature_sunlit_c"]; !ok {
		return Thermal{}
	}
	return Thermal{SunlitC: p.Num["temperature_sunlit_c"], EclipseC: p.Num["temperature_eclipse_c"],
		CalibrationC: p.Num["calibration_temperature_c"], DarkAtCal: p.Num["dark_signal_at_calibration"],
		DoublingC: p.Num["dark_doubling_c"], GainPerC: p.Num["gain_tempco_pct_per_c"]}
}

// Warm is a sensor with a temperature model: ReadAt is Read at the sensor
// temperature tempC (°C), drawing the same noise.
type Warm interface {
	Sensor
	ThermalModel() Thermal
	ReadAt(sun r3.Vec, direct float64, alb Albedo, noise *rand.Rand, tempC float64) Reading
}

// HasThermalCoefficient reports whether a sensor's resolved kind
// parameters give its readings a temperature dependence (a dark signal or
// a gain coefficient).
func HasThermalCoefficient(p Params) bool {
	return p.Num["dark_signal_at_calibration"] > 0 || p.Num["gain_tempco_pct_per_c"] != 0
}

// AtTemperatureOffset returns a copy of the parameters with the sunlit and
// eclipse temperatures at the calibration temperature plus d (°C); at
// d = 0 the coefficients are dropped as well, since a sensor at its
// calibration temperature reads as calibrated (and the builder refuses
// coefficients that cannot act). p is unchanged.
func AtTemperatureOffset(p Params, d float64) Params {
	t := p.Num["calibration_temperature_c"] + d
	q := p.WithNumber("temperature_sunlit_c", t).WithNumber("temperature_eclipse_c", t)
	if d == 0 {
		q = q.WithNumber("dark_signal_at_calibration", 0).WithNumber("gain_tempco_pct_per_c", 0)
	}
	return q
}
