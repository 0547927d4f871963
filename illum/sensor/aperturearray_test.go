package sensor

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// apertureSpec is the registry's default design on +Z: a 2 mm mask above a
// 5 mm detector of 10 µm pixels, one aperture, a 0.1 pixel centroid.
func apertureSpec(t testing.TB) ApertureArraySpec {
	t.Helper()
	m, err := FaceMount(FacePlusZ, 0, FaceNone, 0)
	if err != nil {
		t.Fatal(err)
	}
	return ApertureArraySpec{Name: "aa", Mount: m, MaskHeight: 2, DetectorSide: 5, PixelPitch: 0.01, CentroidSigma: 0.1,
		Apertures: 1, Threshold: 0.05}
}

func newAperture(t testing.TB, s ApertureArraySpec) *ApertureArray {
	t.Helper()
	a, err := NewApertureArray(s)
	if err != nil {
		t.Fatal(err)
	}
	return a
}

// The field of view per axis is where the spot pattern stays on the
// detector: tan α = (D − A)/(2h) (pinhole geometry, closed form): 51.34°
// for one aperture 2 mm above 5 mm; 45° for a 1 mm array.
func TestApertureArrayFieldOfView(t *testing.T) {
	for _, c := range []struct {
		n    int
		side float64
		want float64 // deg
	}{{1, 0, math.Atan(1.25) / deg}, {9, 1, 45}} {
		s := apertureSpec(t)
		s.Apertures, s.ArraySide = c.n, c.side
		a := newAperture(t, s)
		if got := a.AxisHalfAngle() / deg; math.Abs(got-c.want) > 1e-12 {
			t.Errorf("N=%d A=%g: half field %g°, want %g°", c.n, c.side, got, c.want)
		}
		for _, d := range []struct {
			ax, ay float64
			valid  bool
		}{{c.want - 0.01, 0, true}, {c.want + 0.01, 0, false}, {0, -(c.want - 0.01), true}, {0, -(c.want + 0.01), false},
			// The square's corner: both axes just inside, 60° off the boresight or more.
			{c.want - 0.01, c.want - 0.01, true}} {
			sun := sunAt(d.ax*deg, d.ay*deg)
			r := a.Read(sun, SolarConstant, Albedo{}, nil)
			if r.Valid != d.valid || a.SeesSun(sun) != d.valid || a.InFOV(sun) != d.valid {
				t.Errorf("N=%d: sun at (%g°, %g°): read valid %v, sees %v, in view %v; want %v", c.n, d.ax, d.ay, r.Valid, a.SeesSun(sun), a.InFOV(sun), d.valid)
			}
			if r.Valid {
				if e := angle(r.Dir, sun); e > 1e-12 {
					t.Errorf("N=%d: sun at (%g°, %g°): noise-free unit off by %g rad", c.n, d.ax, d.ay, e)
				}
			}
		}
		// The cone containing the square passes through its corners.
		if got, want := a.HalfAngle(), math.Atan(math.Sqrt2*math.Tan(c.want*deg)); math.Abs(got-want) > 1e-12 {
			t.Errorf("N=%d: cone %g, want %g", c.n, got, want)
		}
	}
}

// Centroid noise: σ(tan α) = p·σc/(h·√N) per axis, and σ(α) = cos² α times
// that (dα = cos² α·d tan α; closed form). 0.01 mm × 0.1 / 2 mm = 5·10⁻⁴
// at the boresight; four apertures halve it; 40° off it shrinks by
// cos² 40° = 0.587.
func TestApertureArrayCentroidNoise(t *testing.T) {
	for _, c := range []struct {
		n     int
		side  float64
		alpha float64 // deg, along x
		want  float64 // rad, 1σ of αx
	}{{1, 0, 0, 5e-4}, {4, 0.5, 0, 2.5e-4}, {1, 0, 40, 5e-4 * math.Pow(math.Cos(40*deg), 2)}} {
		s := apertureSpec(t)
		s.Apertures, s.ArraySide = c.n, c.side
		a := newAperture(t, s)
		rng := rand.New(rand.NewPCG(1, 2))
		sun := sunAt(c.alpha*deg, 0)
		const n = 40000
		var sum, sum2 float64
		for range n {
			r := a.Read(sun, SolarConstant, Albedo{}, rng)
			if !r.Valid {
				t.Fatal("invalid reading inside the field of view")
			}
			e := math.Atan2(r.Dir.X, r.Dir.Z) - c.alpha*deg
			sum += e
			sum2 += e * e
		}
		mean := sum / n
		sd := math.Sqrt(sum2/n - mean*mean)
		// The sample σ of 40 000 normal draws is within 2 % at 3σ (σ/√(2n) = 0.35 %).
		if math.Abs(sd/c.want-1) > 0.02 || math.Abs(mean) > 4*c.want/math.Sqrt(n) {
			t.Errorf("N=%d at %g°: σ %g (mean %g), want %g", c.n, c.alpha, sd, mean, c.want)
		}
		if c.alpha == 0 && math.Abs(a.Sigma()-math.Atan(c.want)) > 1e-15 {
			t.Errorf("N=%d: stated σ %g, want atan(%g)", c.n, a.Sigma(), c.want)
		}
	}
}

// Unit errors, each alone, against the pinhole geometry (closed forms):
//   - mask height h' = 2.02 mm read with h = 2 mm: tan α̂ = tan α·h'/h, so
//     a sun 30° off along x reads atan(1.01·tan 30°) = 30.2657°;
//   - mask offset 0.02 mm: a sun on the boresight reads atan(0.02/2) = 0.5729°;
//   - twist τ = 1° about the boresight: a sun θ = 30° off reads
//     2·asin(sin θ·sin(τ/2)) = 0.5000° away.
func TestApertureArrayUnitErrors(t *testing.T) {
	a := newAperture(t, apertureSpec(t))

	u := *a
	u.height = 2.02
	sun := sunAt(30*deg, 0)
	r := u.Read(sun, SolarConstant, Albedo{}, nil)
	if got, want := math.Atan2(r.Dir.X, r.Dir.Z)/deg, math.Atan(1.01*math.Tan(30*deg))/deg; math.Abs(got-want) > 1e-9 {
		t.Errorf("mask height: reads %.6f°, want %.6f°", got, want)
	}

	u = *a
	u.offX = 0.02
	r = u.Read(r3.Vec{Z: 1}, SolarConstant, Albedo{}, nil)
	if got, want := angle(r.Dir, r3.Vec{Z: 1})/deg, math.Atan(0.01)/deg; math.Abs(got-want) > 1e-9 {
		t.Errorf("mask offset: %.6f° off, want %.6f°", got, want)
	}
	// The offset moves the edge of the field of view: the spot leaves the
	// detector 0.02 mm earlier on one side, tan α = (2.5 − 0.02)/2.
	edge := math.Atan((2.5-0.02)/2) / deg
	if !u.Read(sunAt(-(edge-0.01)*deg, 0), SolarConstant, Albedo{}, nil).Valid || u.Read(sunAt(-(edge+0.01)*deg, 0), SolarConstant, Albedo{}, nil).Valid {
		t.Errorf("mask offset: the edge on the far side is not at %.3f°", edge)
	}

	u = *a
	u.actual = a.actual.Misaligned(r3.Vec{Z: 1 * deg})
	sun = sunAt(30*deg, 0)
	r = u.Read(sun, SolarConstant, Albedo{}, nil)
	if got, want := angle(r.Dir, sun)/deg, 2*math.Asin(math.Sin(30*deg)*math.Sin(0.5*deg))/deg; math.Abs(got-want) > 1e-9 {
		t.Errorf("twist: %.6f° off, want %.6f°", got, want)
	}
}

// Draw draws every error it is given, and none it is not: a unit drawn
// with only a mask-height tolerance reads the boresight sun exactly and a
// 30° sun off; each tolerance moves a reading.
func TestApertureArrayDrawUsesEveryTolerance(t *testing.T) {
	sun := sunAt(30*deg, 20*deg)
	for _, c := range []struct {
		name string
		set  func(*ApertureArraySpec)
	}{
		{"misalignment", func(s *ApertureArraySpec) { s.MisalignSigma = 0.5 * deg }},
		{"twist", func(s *ApertureArraySpec) { s.TwistSigma = 1 * deg }},
		{"offset", func(s *ApertureArraySpec) { s.OffsetSigma = 0.02 }},
		{"height", func(s *ApertureArraySpec) { s.HeightSigma = 0.02 }},
	} {
		s := apertureSpec(t)
		c.set(&s)
		u := newAperture(t, s).Draw(rand.New(rand.NewPCG(3, 4)))
		r := u.Read(sun, SolarConstant, Albedo{}, nil)
		if !r.Valid || !(angle(r.Dir, sun) > 1e-6) {
			t.Errorf("%s: a drawn unit reads %v, %g rad off; want an error", c.name, r.Valid, angle(r.Dir, sun))
		}
		if c.name == "height" {
			if e := angle(u.Read(r3.Vec{Z: 1}, SolarConstant, Albedo{}, nil).Dir, r3.Vec{Z: 1}); e > 1e-15 {
				t.Errorf("height alone moves the boresight reading by %g rad", e)
			}
		}
	}
}

// The threshold is on the direct irradiance S·cos θ; the albedo never
// makes or moves a reading (the sun's radiance is 4.6·10⁴ times a white
// Earth's, closed form); a sun behind the mask gives nothing.
func TestApertureArrayThresholdAndAlbedo(t *testing.T) {
	a := newAperture(t, apertureSpec(t))
	sun := sunAt(20*deg, 0)
	c := math.Cos(20 * deg)
	if !a.Read(sun, 0.051/c*SolarConstant, Albedo{}, nil).Valid || a.Read(sun, 0.049/c*SolarConstant, Albedo{}, nil).Valid {
		t.Error("threshold 0.05 of full sun not at S·cos θ")
	}
	alb := Albedo{Irradiance: 400, Dir: sunAt(-10*deg, 5*deg)}
	if r0, r1 := a.Read(sun, SolarConstant, Albedo{}, nil), a.Read(sun, SolarConstant, alb, nil); r0 != r1 {
		t.Errorf("albedo moved the reading: %+v against %+v", r1, r0)
	}
	if a.Read(r3.Vec{}, 0, alb, nil).Valid {
		t.Error("albedo alone gave a sun")
	}
	if a.Read(r3.Vec{Z: -1}, SolarConstant, Albedo{}, nil).Valid {
		t.Error("a sun behind the mask gave a reading")
	}
}

// A geometry that cannot work is refused with the key and the fix.
func TestApertureArrayRefusals(t *testing.T) {
	for _, c := range []struct {
		set  func(*ApertureArraySpec)
		want string
	}{
		{func(s *ApertureArraySpec) { s.ArraySide = 1 }, "give apertures > 1 or leave array_size_mm out"},
		{func(s *ApertureArraySpec) { s.Apertures = 4 }, "need array_size_mm"},
		{func(s *ApertureArraySpec) { s.Apertures, s.ArraySide = 4, 5 }, "never fits on the detector"},
		{func(s *ApertureArraySpec) { s.HeightSigma = 0.7 }, "could touch the detector"},
		{func(s *ApertureArraySpec) { s.MaskHeight = 0 }, "mask_height_mm = 0"},
		{func(s *ApertureArraySpec) { s.Apertures = 0 }, "apertures = 0"},
	} {
		s := apertureSpec(t)
		c.set(&s)
		if _, err := NewApertureArray(s); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("want an error with %q, got %v", c.want, err)
		}
	}
	p := Params{Num: map[string]float64{"mask_height_mm": 2, "detector_size_mm": 5, "pixel_pitch_um": 0.01, "centroid_px_1sigma": 0.1, "apertures": 2.5}}
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	if _, err := buildApertureArray(Common{Name: "aa", Mount: m}, p); err == nil || !strings.Contains(err.Error(), "whole number") {
		t.Errorf("apertures 2.5: %v", err)
	}
}
