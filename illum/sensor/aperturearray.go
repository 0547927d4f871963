package sensor

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// KindApertureArray is a digital sun sensor described by its geometry: a
// mask pierced by one or more small apertures above an image detector.
const KindApertureArray Kind = "aperture-array"

// ApertureArraySpec describes an aperture-array sun sensor by its geometry.
// Lengths are in mm.
type ApertureArraySpec struct {
	Name  string
	Mount Mount
	// MaskHeight h is the distance from the mask to the detector.
	MaskHeight float64
	// DetectorSide D is the side of the square active area.
	DetectorSide float64
	// PixelPitch p is the detector's pixel pitch.
	PixelPitch float64
	// CentroidSigma is the 1σ error of one spot's centroid per axis, in
	// pixels.
	CentroidSigma float64
	// Apertures N is the number of apertures; their spots' displacements
	// are averaged.
	Apertures int
	// ArraySide A is the side of the square the apertures span (0 for one
	// aperture).
	ArraySide float64
	// Threshold is the smallest direct irradiance on the detector, S·cos θ
	// as a fraction of SolarConstant, that gives a spot.
	Threshold float64
	// MisalignSigma is the 1σ mounting error per axis (rad); TwistSigma the
	// 1σ rotation about the boresight (rad); OffsetSigma the 1σ shift of
	// the mask over the detector per axis (mm); HeightSigma the 1σ error
	// of the mask height (mm). All drawn per unit.
	MisalignSigma, TwistSigma, OffsetSigma, HeightSigma float64
}

// ApertureArray is an aperture-array sun sensor. The flight software knows
// the nominal geometry; a drawn unit's mask sits where its errors put it.
type ApertureArray struct {
	spec ApertureArraySpec
	// tanMax: the pattern stays on the detector while |tan α| ≤ tanMax
	// per axis (nominal unit).
	tanMax float64
	// sigmaTan is the 1σ per axis of tan α from the centroid noise,
	// p·σc/(h·√N).
	sigmaTan float64
	actual   Mount
	// The drawn unit's mask height and offset (mm).
	height, offX, offY float64
}

// NewApertureArray checks the spec and returns a unit built as designed.
func NewApertureArray(s ApertureArraySpec) (*ApertureArray, error) {
	if err := checkName(s.Name); err != nil {
		return nil, err
	}
	if err := checkMount(s.Name, s.Mount); err != nil {
		return nil, err
	}
	for _, f := range []struct {
		key string
		v   float64
	}{{"mask_height_mm", s.MaskHeight}, {"detector_size_mm", s.DetectorSide}, {"pixel_pitch_um", s.PixelPitch},
		{"centroid_px_1sigma", s.CentroidSigma}} {
		if !(f.v > 0) || math.IsInf(f.v, 0) {
			return nil, fmt.Errorf("sensor: %q: %s = %g: want a finite value > 0", s.Name, f.key, f.v)
		}
	}
	for _, f := range []struct {
		key string
		v   float64
	}{{"array_size_mm", s.ArraySide}, {"threshold", s.Threshold}, {"misalignment", s.MisalignSigma},
		{"twist_deg_1sigma", s.TwistSigma}, {"aperture_offset_mm_1sigma", s.OffsetSigma}, {"mask_height_mm_1sigma", s.HeightSigma}} {
		if !(f.v >= 0) || math.IsInf(f.v, 0) {
			return nil, fmt.Errorf("sensor: %q: %s = %g: want a finite value ≥ 0", s.Name, f.key, f.v)
		}
	}
	switch {
	case s.Apertures < 1:
		return nil, fmt.Errorf("sensor: %q: apertures = %d: want a whole number ≥ 1", s.Name, s.Apertures)
	case s.Apertures == 1 && s.ArraySide > 0:
		return nil, fmt.Errorf("sensor: %q: array_size_mm = %g with one aperture: a single aperture spans no array; give apertures > 1 or leave array_size_mm out", s.Name, s.ArraySide)
	case s.Apertures > 1 && s.ArraySide == 0:
		return nil, fmt.Errorf("sensor: %q: %d apertures need array_size_mm, the side of the square they span (> 0, below detector_size_mm)", s.Name, s.Apertures)
	case s.ArraySide >= s.DetectorSide:
		return nil, fmt.Errorf("sensor: %q: array_size_mm %g is not below detector_size_mm %g: the spot pattern never fits on the detector; make the array smaller or the detector larger", s.Name, s.ArraySide, s.DetectorSide)
	case 3*s.HeightSigma >= s.MaskHeight:
		return nil, fmt.Errorf("sensor: %q: mask_height_mm_1sigma %g is a third of mask_height_mm %g or more: a drawn mask could touch the detector; give a smaller tolerance", s.Name, s.HeightSigma, s.MaskHeight)
	}
	a := &ApertureArray{spec: s, actual: s.Mount, height: s.MaskHeight,
		tanMax:   (s.DetectorSide - s.ArraySide) / (2 * s.MaskHeight),
		sigmaTan: s.PixelPitch * s.CentroidSigma / (s.MaskHeight * math.Sqrt(float64(s.Apertures)))}
	return a, nil
}

// Name implements Sensor.
func (a *ApertureArray) Name() string { return a.spec.Name }

// Kind implements Sensor.
func (a *ApertureArray) Kind() Kind { return KindApertureArray }

// Mount implements Sensor.
func (a *ApertureArray) Mount() Mount { return a.spec.Mount }

// Spec returns the sensor's specification.
func (a *ApertureArray) Spec() ApertureArraySpec { return a.spec }

// AxisHalfAngle is the half field of view per sensor axis (rad) of the
// unit built as designed: the spot pattern stays on the detector while
// tan α ≤ (D − A)/(2h).
func (a *ApertureArray) AxisHalfAngle() float64 { return math.Atan(a.tanMax) }

// Sigma implements Sensor: the 1σ per axis at the boresight from the
// centroid noise, atan(p·σc/(h·√N)); off the boresight it shrinks as
// cos² α (dα = cos² α·d tan α).
func (a *ApertureArray) Sigma() float64 { return math.Atan(a.sigmaTan) }

// HalfAngle implements Sensor: the cone through the corners of the square
// field of view, tan = √2·tanMax.
func (a *ApertureArray) HalfAngle() float64 { return math.Atan(math.Sqrt2 * a.tanMax) }

// inSquare reports whether the sensor-axes direction s lies in the square
// field of view |tan αx|, |tan αy| ≤ tanMax.
func (a *ApertureArray) inSquare(s r3.Vec) bool {
	return s.Z > 0 && math.Abs(s.X) <= a.tanMax*s.Z && math.Abs(s.Y) <= a.tanMax*s.Z
}

// InFOV implements Sensor.
func (a *ApertureArray) InFOV(dir r3.Vec) bool { return a.inSquare(a.spec.Mount.ToSensor(dir)) }

// Response implements Sensor: cos θ inside the field of view.
func (a *ApertureArray) Response(dir r3.Vec) float64 {
	s := a.spec.Mount.ToSensor(dir)
	if !a.inSquare(s) {
		return 0
	}
	return s.Z / vecmath.Norm(s)
}

// SeesSun implements Sensor: the whole pattern on the detector and S·cos θ
// at or above the threshold (and MinSeenSignal of full sun).
func (a *ApertureArray) SeesSun(dir r3.Vec) bool {
	e := a.Response(dir)
	return e >= a.spec.Threshold && e >= MinSeenSignal
}

// Read implements Sensor. The spots fall at the apertures' feet displaced
// by the mask offset less h'·(tan αx, tan αy) (h' the unit's mask height);
// the reading is valid while every spot is on the detector and the direct
// irradiance S·cos θ reaches the threshold. The software inverts the mean
// displacement with the nominal height h and no offset, after adding the
// centroid noise of the mean of N spots. Albedo does not move the reading:
// the sun's radiance is about 4.6·10⁴ times that of a white Lambertian
// Earth under a zenith sun (2.0·10⁷ against S/π = 433 W/m²/sr; closed
// form), so a thresholded centroid finds the sun's spot alone, and the
// lit Earth's image makes none.
func (a *ApertureArray) Read(sun r3.Vec, direct float64, _ Albedo, noise *rand.Rand) Reading {
	s := a.actual.ToSensor(sun)
	if !(s.Z > 0) {
		return Reading{}
	}
	e := direct * s.Z / vecmath.Norm(s) / SolarConstant
	if !(e >= a.spec.Threshold && e >= MinSeenSignal) {
		return Reading{}
	}
	// Spot displacement of the pattern's centre, mm.
	dx := a.offX - a.height*s.X/s.Z
	dy := a.offY - a.height*s.Y/s.Z
	if half := (a.spec.DetectorSide - a.spec.ArraySide) / 2; math.Abs(dx) > half || math.Abs(dy) > half {
		return Reading{}
	}
	tx, ty := -dx/a.spec.MaskHeight, -dy/a.spec.MaskHeight
	if noise != nil {
		tx += a.sigmaTan * noise.NormFloat64()
		ty += a.sigmaTan * noise.NormFloat64()
	}
	dir := vecmath.Unit(r3.Vec{X: tx, Y: ty, Z: 1})
	return Reading{Signal: e, Dir: a.spec.Mount.ToBody(dir), Valid: true}
}

// Draw implements Sensor: misalignment, twist about the boresight, mask
// offset per axis and mask height, drawn in that order.
func (a *ApertureArray) Draw(rng *rand.Rand) Sensor {
	u := *a
	u.actual, _ = drawUnit(Errors{MisalignSigma: a.spec.MisalignSigma}, a.spec.Mount, 0, rng)
	u.actual = u.actual.Misaligned(r3.Vec{Z: a.spec.TwistSigma * rng.NormFloat64()})
	u.offX = a.spec.OffsetSigma * rng.NormFloat64()
	u.offY = a.spec.OffsetSigma * rng.NormFloat64()
	u.height = a.spec.MaskHeight + a.spec.HeightSigma*rng.NormFloat64()
	return &u
}

// The registry entry of the aperture-array kind. The defaults are an
// invented small design (2 mm above a 5 mm detector of 10 µm pixels, a
// 0.1 pixel centroid), not a product's figures.
func init() {
	Register(KindInfo{
		Kind: KindApertureArray, Doc: "digital sun sensor from its geometry: apertures in a mask above an image detector, spot centroids averaged",
		Source:       "pinhole geometry x = h·tan α, dα = cos² α·dx/h (closed form); mean of N independent centroids, σ/√N (closed form)",
		GeometricFOV: true, TwoAxis: true,
		Params: []Param{
			{Key: "mask_height_mm", Doc: "height h of the mask above the detector", Default: 2, Min: 0, Max: 100, MinOpen: true, Allowed: "(0, 100] mm"},
			{Key: "detector_size_mm", Doc: "side D of the square active area of the detector", Default: 5, Min: 0, Max: 100, MinOpen: true, Allowed: "(0, 100] mm"},
			{Key: "pixel_pitch_um", Doc: "pixel pitch of the detector", Default: 10, Min: 0, Max: 1000, MinOpen: true, Allowed: "(0, 1000] µm", Scale: 1e-3},
			{Key: "centroid_px_1sigma", Doc: "1σ error of one spot's centroid per axis", Default: 0.1, Min: 0, Max: 100, MinOpen: true, Allowed: "(0, 100] pixels"},
			{Key: "apertures", Doc: "number of apertures; their spots are averaged (noise / √N)", Default: 1, Min: 1, Max: 10000, Allowed: "a whole number in [1, 10000]"},
			{Key: "array_size_mm", Doc: "side A of the square the apertures span; the field of view per axis is atan((D − A)/2h)", Default: 0, Min: 0, Max: 100, Allowed: "[0, 100] mm, below detector_size_mm; 0 for one aperture"},
			{Key: "twist_deg_1sigma", Doc: "1σ rotation of the unit about its boresight, drawn per unit (a detector soldered turned)",
				Default: 0, Min: 0, Max: 90, Allowed: "[0, 90] degrees", Scale: math.Pi / 180},
			{Key: "mask_height_mm_1sigma", Doc: "1σ error of the mask height, drawn per unit: a scale error of the angle, tan α' = tan α·h'/h",
				Default: 0, Min: 0, Max: 10, Allowed: "[0, 10] mm, below a third of mask_height_mm"},
		},
		Sources: []ErrorSource{{Name: SourceMisalignment}, {Name: SourceApertureOffset}, {Name: SourceTwist, Param: "twist_deg_1sigma"},
			{Name: SourceCentroid, Param: "centroid_px_1sigma"}, {Name: SourceMaskHeight, Param: "mask_height_mm_1sigma"}},
		Build: buildApertureArray,
	})
}

func buildApertureArray(c Common, p Params) (Sensor, error) {
	n := p.Num["apertures"]
	if n != math.Trunc(n) {
		return nil, fmt.Errorf("sensor: %q: apertures = %g: want a whole number ≥ 1", c.Name, n)
	}
	return NewApertureArray(ApertureArraySpec{Name: c.Name, Mount: c.Mount,
		MaskHeight: p.Num["mask_height_mm"], DetectorSide: p.Num["detector_size_mm"], PixelPitch: p.Num["pixel_pitch_um"],
		CentroidSigma: p.Num["centroid_px_1sigma"], Apertures: int(n), ArraySide: p.Num["array_size_mm"],
		Threshold: c.Threshold, MisalignSigma: c.Errors.MisalignSigma, TwistSigma: p.Num["twist_deg_1sigma"],
		OffsetSigma: c.OffsetSigma, HeightSigma: p.Num["mask_height_mm_1sigma"]})
}
