package sensor

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// Subtracting the albedo a reading holds gives the reading without it:
// reading = (S·cos θ + E)/S_ref (closed form, the cosine model of doc.go),
// so reading − E/S_ref = S·cos θ/S_ref.
func TestCosineSubtractAlbedoUndoesTheAlbedo(t *testing.T) {
	arr := cube(t, Errors{})
	sun := r3.Unit(r3.Vec{X: 1, Y: 0.4, Z: -0.3})
	for i, s := range arr.Sensors() {
		c := s.(*Cosine)
		for _, e := range []float64{0, 1e-3, 120, 400} {
			no := c.Read(sun, SolarConstant, Albedo{}, nil)
			with := c.Read(sun, SolarConstant, Albedo{Irradiance: e}, nil)
			got := c.SubtractAlbedo(with, Albedo{Irradiance: e})
			if got.Valid != no.Valid || math.Abs(got.Signal-no.Signal) > 1e-15 {
				t.Errorf("sensor %d, E = %g W/m²: corrected %+v, without albedo %+v", i, e, got, no)
			}
		}
	}
}

// A sensor facing away from the sun that reads only albedo reads zero after a
// perfect correction, not a rounding residue that a zero threshold would
// count as a sun (closed form: the rounding of one subtraction).
func TestCosineSubtractAlbedoLeavesNoRoundingSun(t *testing.T) {
	m, _ := FaceMount(FaceMinusZ, 0, FaceNone, 0)
	c, err := NewCosine(CosineSpec{Name: "down", Mount: m, HalfAngle: 90 * deg, Threshold: 0})
	if err != nil {
		t.Fatal(err)
	}
	sun := r3.Vec{Z: 1}
	for _, e := range []float64{0.1, 1.7, 33.3, 123.456, 401} {
		r := c.SubtractAlbedo(c.Read(sun, SolarConstant, Albedo{Irradiance: e}, nil), Albedo{Irradiance: e})
		if r.Valid || r.Signal != 0 {
			t.Errorf("E = %g: %+v, want an invalid zero reading", e, r)
		}
	}
}

// An over-prediction drives the signal below the threshold: the reading is
// then dark, never negative. A saturated reading stays flagged.
func TestCosineSubtractAlbedoClipsAndKeepsSaturation(t *testing.T) {
	m, _ := FaceMount(FacePlusX, 0, FaceNone, 0)
	c, err := NewCosine(CosineSpec{Name: "x", Mount: m, HalfAngle: 90 * deg, Threshold: 0.05, Errors: Errors{FullScale: 1.1}})
	if err != nil {
		t.Fatal(err)
	}
	edge := r3.Unit(r3.Vec{X: 0.06, Y: 1})
	r := c.SubtractAlbedo(c.Read(edge, SolarConstant, Albedo{Irradiance: 50}, nil), Albedo{Irradiance: 200})
	if r.Valid || r.Signal != 0 {
		t.Errorf("over-predicted: %+v, want an invalid zero reading", r)
	}
	s := c.SubtractAlbedo(c.Read(r3.Vec{X: 1}, SolarConstant, Albedo{Irradiance: 300}, nil), Albedo{Irradiance: 300})
	if !s.Saturated || !s.Valid {
		t.Errorf("saturated reading: %+v, want valid and saturated", s)
	}
}

// With noise and an ADC the correction cannot give back the reading without
// albedo: the quantisation of the reading with albedo stays (at most half a
// step either way, closed form), so the two differ by at most one step.
func TestCosineSubtractAlbedoWithQuantisation(t *testing.T) {
	m, _ := FaceMount(FacePlusX, 0, FaceNone, 0)
	errs := Errors{NoiseSigma: 0.003, ADCBits: 8, FullScale: 1.5}
	c, err := NewCosine(CosineSpec{Name: "x", Mount: m, HalfAngle: 90 * deg, Threshold: 0.05, Errors: errs})
	if err != nil {
		t.Fatal(err)
	}
	step := errs.FullScale / 256
	rng := rand.New(rand.NewPCG(1, 2))
	differ := 0
	for k := range 2000 {
		sun := r3.Unit(r3.Vec{X: 1, Y: float64(k%17) / 10})
		e := 50 + 300*rng.Float64()
		src := rand.NewPCG(uint64(k), 9)
		no := c.Read(sun, SolarConstant, Albedo{}, rand.New(src))
		src = rand.NewPCG(uint64(k), 9)
		got := c.SubtractAlbedo(c.Read(sun, SolarConstant, Albedo{Irradiance: e}, rand.New(src)), Albedo{Irradiance: e})
		d := math.Abs(got.Signal - no.Signal)
		if d > step*(1+1e-9) {
			t.Fatalf("case %d: corrected %g, without albedo %g: differ by %g, more than one ADC step %g", k, got.Signal, no.Signal, d, step)
		}
		if d > 0 {
			differ++
		}
	}
	if differ == 0 {
		t.Error("quantisation never showed: the test cannot tell a perfect correction from a real one")
	}
}
