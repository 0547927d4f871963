package sensor

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

func TestParseFace(t *testing.T) {
	for in, want := range map[string]Face{"+X": FacePlusX, "-y": FaceMinusY, "z": FacePlusZ, "−Z": FaceMinusZ, " +Y ": FacePlusY} {
		if got, err := ParseFace(in); err != nil || got != want {
			t.Errorf("ParseFace(%q) = %v, %v; want %v", in, got, err, want)
		}
	}
	_, err := ParseFace("top")
	if err == nil || !strings.Contains(err.Error(), `"top"`) || !strings.Contains(err.Error(), "+X") {
		t.Errorf("ParseFace(top) error %v: want the value and the allowed faces", err)
	}
}

// Closed form: +X tilted 30° toward +Z has boresight (cos 30°, 0, sin 30°).
func TestFaceMountTiltAndClock(t *testing.T) {
	m, err := FaceMount(FacePlusX, 30*deg, FacePlusZ, 0)
	if err != nil {
		t.Fatal(err)
	}
	if d := angle(m.Boresight(), r3.Vec{X: math.Cos(30 * deg), Z: math.Sin(30 * deg)}); d > 1e-15 {
		t.Errorf("boresight %v", m.Boresight())
	}
	x, y, z := m.Axes()
	if math.Abs(r3.Dot(x, y)) > 1e-14 || math.Abs(r3.Dot(r3.Cross(x, y), z)-1) > 1e-14 {
		t.Error("frame not right-handed orthonormal")
	}
	c, _ := FaceMount(FacePlusX, 30*deg, FacePlusZ, 90*deg)
	cx, _, _ := c.Axes()
	if angle(cx, y) > 1e-15 {
		t.Errorf("clock 90°: sensor X %v, want old Y %v", cx, y)
	}
	v := r3.Vec{X: 0.3, Y: -0.2, Z: 0.9}
	if d := r3.Norm(r3.Sub(m.ToBody(m.ToSensor(v)), v)); d > 1e-15 {
		t.Errorf("round trip off by %g", d)
	}
	if _, err := FaceMount(FacePlusX, 30*deg, FaceMinusX, 0); err == nil {
		t.Error("tilt toward the face's own axis accepted")
	}
	if _, err := VectorMount(r3.Vec{}, r3.Vec{}); err == nil {
		t.Error("zero boresight accepted")
	}
	if _, err := VectorMount(r3.Vec{X: 1}, r3.Vec{X: 2}); err == nil {
		t.Error("reference parallel to the boresight accepted")
	}
}

func TestBadSpecsNameTheField(t *testing.T) {
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	for _, c := range []struct {
		err   error
		field string
	}{
		{second(NewCosine(CosineSpec{Name: "a", Mount: m, HalfAngle: 2})), "half_angle"},
		{second(NewCosine(CosineSpec{Name: "a", HalfAngle: 1})), "mount"},
		{second(NewCosine(CosineSpec{Name: "a", Mount: m, HalfAngle: 1, Errors: Errors{ADCBits: 12}})), "full_scale"},
		{second(NewCosine(CosineSpec{Name: "a", Mount: m, HalfAngle: 1, RollOffAngle: []float64{0, 0}, RollOffRel: []float64{1, 1}})), "roll_off"},
		{second(NewQuadrant(QuadrantSpec{Name: "a", Mount: m, ApertureSide: 1, CellSide: 1, Sigma: 1})), "height"},
		{second(NewDigital(DigitalSpec{Name: "a", Mount: m, HalfAngle: 1})), "sigma"},
	} {
		if c.err == nil || !strings.Contains(c.err.Error(), c.field) {
			t.Errorf("error %v: want it to name %s", c.err, c.field)
		}
	}
	a := cube(t, Errors{})
	if _, err := NewArray(append(a.Sensors(), a.Sensors()[0])...); err == nil {
		t.Error("duplicate name accepted")
	}
}

func second[T any](_ T, err error) error { return err }

// Misalignment draws recovered from the drawn frames have the stated σ per
// axis: 5000 units, sample σ within 4 standard errors (σ/√(2n)).
func TestMisalignmentSigmaAndSeed(t *testing.T) {
	const sigma = 0.5 * deg
	m, _ := FaceMount(FacePlusY, 20*deg, FacePlusZ, 10*deg)
	c, _ := NewCosine(CosineSpec{Name: "c", Mount: m, HalfAngle: 80 * deg, Errors: Errors{MisalignSigma: sigma}})
	rng := rand.New(rand.NewPCG(5, 6))
	nx, ny, nz := m.Axes()
	const n = 5000
	var s2 [3]float64
	for range n {
		u := c.Draw(rng).(*Cosine)
		ax, ay, az := u.actual.Axes()
		phi := [3]float64{r3.Dot(ay, nz), r3.Dot(az, nx), r3.Dot(ax, ny)} // small-angle rotation vector
		for i := range phi {
			s2[i] += phi[i] * phi[i]
		}
	}
	se := sigma / math.Sqrt(2*n)
	for i := range s2 {
		sd := math.Sqrt(s2[i] / n)
		t.Logf("axis %d: σ %.4f° (stated %.4f°)", i, sd/deg, sigma/deg)
		if math.Abs(sd-sigma) > 4*se+1e-3*sigma {
			t.Errorf("axis %d: σ = %.5f°, want %.5f°", i, sd/deg, sigma/deg)
		}
	}
	u1 := c.Draw(rand.New(rand.NewPCG(9, 9))).(*Cosine)
	u2 := c.Draw(rand.New(rand.NewPCG(9, 9))).(*Cosine)
	if u1.actual != u2.actual || u1.unit != u2.unit {
		t.Error("same seed gave different units")
	}
}

// Zero σ everywhere: a drawn unit reads exactly as the ideal one.
func TestZeroSigmaGivesIdealReadings(t *testing.T) {
	a := cube(t, Errors{})
	u := a.Draw(rand.New(rand.NewPCG(1, 1)))
	s := r3.Unit(r3.Vec{X: 0.3, Y: -0.5, Z: 0.8})
	r1, r2 := make([]Reading, 6), make([]Reading, 6)
	a.Read(r1, s, SolarConstant, nil, nil)
	u.Read(r2, s, SolarConstant, nil, rand.New(rand.NewPCG(2, 2)))
	for i := range r1 {
		if r1[i] != r2[i] {
			t.Errorf("sensor %d: %+v vs %+v", i, r1[i], r2[i])
		}
	}
	if math.Abs(r1[0].Signal-s.X) > 1e-15 {
		t.Errorf("+X signal %g, want cos θ = %g", r1[0].Signal, s.X)
	}
}

// ADC: 8 bits over full scale 1.2 gives steps of 1.2/256; saturation clips.
// Roll-off: the table multiplies the cosine (linear interpolation).
func TestCosineADCSaturationRollOff(t *testing.T) {
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	c, err := NewCosine(CosineSpec{Name: "c", Mount: m, HalfAngle: 85 * deg, Errors: Errors{ADCBits: 8, FullScale: 1.2},
		RollOffAngle: []float64{0, 60 * deg, 85 * deg}, RollOffRel: []float64{1, 1, 0.5}})
	if err != nil {
		t.Fatal(err)
	}
	q := 1.2 / 256
	r := c.Read(sunAt(40*deg, 0), SolarConstant, Albedo{}, nil)
	if want := math.Round(math.Cos(40*deg)/q) * q; r.Signal != want {
		t.Errorf("quantised %g, want %g", r.Signal, want)
	}
	if r := c.Read(r3.Vec{Z: 1}, 2*SolarConstant, Albedo{}, nil); !r.Saturated || r.Signal != 1.2 {
		t.Errorf("saturation: %+v", r)
	}
	want := math.Cos(72.5*deg) * 0.75
	if got := c.Response(sunAt(72.5*deg, 0)); math.Abs(got-want) > 1e-12 {
		t.Errorf("roll-off response %g, want %g", got, want)
	}
	if c.Response(sunAt(86*deg, 0)) != 0 || c.InFOV(sunAt(86*deg, 0)) {
		t.Error("outside the cone")
	}
}

func TestMountRow(t *testing.T) {
	m, _ := FaceMount(FaceMinusY, 15*deg, FacePlusX, 0)
	c, _ := NewCosine(CosineSpec{Name: "c1", Mount: m, HalfAngle: 70 * deg})
	row := Row(c)
	if row.Face != "-Y" || row.Toward != "+X" || math.Abs(row.TiltDeg-15) > 1e-12 || math.Abs(row.FOVDeg-70) > 1e-12 || row.Kind != KindCosine {
		t.Errorf("row %+v", row)
	}
}
