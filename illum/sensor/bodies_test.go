package sensor

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// dirAt is the unit vector θ (deg) from +Z toward +X.
func dirAt(θDeg float64) r3.Vec {
	s, c := math.Sincos(θDeg * math.Pi / 180)
	return r3.Vec{X: s, Z: c}
}

// bodiesAt puts the Moon θMoon from +Z (angular radius 0.26°) and nadir
// θNadir from +Z (Earth angular radius ρE), Earth lit, at the given angles
// (deg, in the X–Z plane).
func bodiesAt(θMoon, θNadir, ρEDeg float64) Bodies {
	sM, cM := math.Sincos(0.26 * math.Pi / 180)
	sE, cE := math.Sincos(ρEDeg * math.Pi / 180)
	b := Bodies{MoonDir: dirAt(θMoon), MoonSin: sM, MoonCos: cM, MoonLit: 0.5,
		NadirDir: dirAt(θNadir), EarthSin: sE, EarthCos: cE, EarthLit: true}
	return b
}

// The cone tests against their definitions (closed form): the Moon is in a
// 30° cone up to 30.26° from the boresight, the Earth of radius 67° up to
// 97°; a mounting plane hides what lies more than 90° + radius from its
// normal; an unlit Earth and a hidden Moon are never in view.
func TestBodiesConeRules(t *testing.T) {
	c := NewCone(r3.Vec{Z: 1}, 30*math.Pi/180)
	face := r3.Vec{Z: 1}
	for _, k := range []struct {
		name string
		b    Bodies
		face r3.Vec
		moon bool
	}{
		{"Moon on the boresight", bodiesAt(0, 180, 67), r3.Vec{}, true},
		{"Moon just inside 30° + 0.26°", bodiesAt(30.25, 180, 67), r3.Vec{}, true},
		{"Moon just outside", bodiesAt(30.27, 180, 67), r3.Vec{}, false},
	} {
		if got := k.b.MoonInCone(c, k.face); got != k.moon {
			t.Errorf("%s: Moon in cone %v, want %v", k.name, got, k.moon)
		}
	}
	hidden := bodiesAt(0, 180, 67)
	hidden.MoonHidden = true
	if hidden.MoonInCone(c, r3.Vec{}) {
		t.Error("a Moon wholly behind the Earth is in view")
	}
	// A 90° cone: the mounting plane z = 0 cuts what lies beyond 90° + ρ.
	wide := NewCone(r3.Vec{Z: 1}, math.Pi/2)
	if b := bodiesAt(90.25, 180, 67); !b.MoonInCone(wide, face) {
		t.Error("Moon 90.25° from the normal (radius 0.26°): part of its disc is in front of the face")
	}
	if b := bodiesAt(90.27, 180, 67); b.MoonInCone(wide, face) {
		t.Error("Moon 90.27° from the normal: wholly behind the face, yet in view")
	}
	for _, k := range []struct {
		θNadir float64
		want   bool
	}{{96.9, true}, {97.1, false}, {0, true}} {
		if b := bodiesAt(0, k.θNadir, 67); b.LitEarthInCone(c, r3.Vec{}) != k.want {
			t.Errorf("nadir %.1f° from the boresight, Earth radius 67°: lit Earth in a 30° cone %v, want %v", k.θNadir, !k.want, k.want)
		}
	}
	dark := bodiesAt(0, 0, 67)
	dark.EarthLit = false
	if dark.LitEarthInCone(c, r3.Vec{}) {
		t.Error("an Earth whose sub-satellite point is dark counts as lit")
	}
	deep := bodiesAt(0, 80, 67)
	if d := deep.EarthDepth(r3.Vec{Z: 1}, 30*math.Pi/180) * 180 / math.Pi; math.Abs(d-17) > 1e-9 {
		t.Errorf("Earth depth %.12f°, want 30 + 67 − 80 = 17°", d)
	}
}

// The digital kind's rule: each threshold acts only beyond its value, and
// the defaults of the registry can never act.
func TestDigitalBlindingThresholds(t *testing.T) {
	m, err := FaceMount(FacePlusZ, 0, FaceNone, 0)
	if err != nil {
		t.Fatal(err)
	}
	mk := func(r BlindRule) *Digital {
		d, err := NewDigital(DigitalSpec{Name: "d", Mount: m, HalfAngle: 30 * math.Pi / 180, Sigma: 1e-3, Blind: r})
		if err != nil {
			t.Fatal(err)
		}
		return d
	}
	b := bodiesAt(10, 80, 67) // Moon in view, Earth 17° deep
	if d := mk(BlindRule{Earth: true, EarthDepthAbove: 16 * math.Pi / 180}); !d.Blinded(b) {
		t.Error("Earth 17° deep, threshold 16°: not blinded")
	}
	if d := mk(BlindRule{Earth: true, EarthDepthAbove: 18 * math.Pi / 180}); d.Blinded(b) {
		t.Error("Earth 17° deep, threshold 18°: blinded")
	}
	if d := mk(BlindRule{Moon: true, MoonLitAbove: 0.4}); !d.Blinded(b) {
		t.Error("Moon lit 0.5 in view, threshold 0.4: not blinded")
	}
	if d := mk(BlindRule{Moon: true, MoonLitAbove: 0.6}); d.Blinded(b) {
		t.Error("Moon lit 0.5 in view, threshold 0.6: blinded")
	}
	info, ok := LookupKind(string(KindDigital))
	if !ok {
		t.Fatal("no digital kind")
	}
	p := Params{Num: map[string]float64{}, Text: map[string]string{"fov_shape": "cone"}}
	for _, q := range info.Params {
		if q.Type == Number {
			sc := q.Scale
			if sc == 0 {
				sc = 1
			}
			p.Num[q.Key] = q.Default * sc
		}
	}
	s, err := info.Build(Common{Name: "d", Mount: m, HalfAngle: 30 * math.Pi / 180, Threshold: 0.05}, p)
	if err != nil {
		t.Fatal(err)
	}
	if s.(Blindable).Blinding() {
		t.Error("the registry defaults turn a blinding rule on")
	}
	if _, err := NewDigital(DigitalSpec{Name: "d", Mount: m, HalfAngle: 0.5, Sigma: 1e-3, Blind: BlindRule{Moon: true, MoonLitAbove: 1}}); err == nil {
		t.Error("a Moon threshold of 1 (can never act) is accepted as a rule")
	}
}

// A lit-Earth depth threshold the Earth can never reach is refused: the
// disc reaches at most half angle + its angular radius inside the cone,
// and its angular radius is below 90° from any orbit (closed form), so a
// threshold of half angle + 90° or more would never act.
func TestDigitalUnreachableEarthDepthRefused(t *testing.T) {
	m, err := FaceMount(FacePlusZ, 0, FaceNone, 0)
	if err != nil {
		t.Fatal(err)
	}
	half := 30 * math.Pi / 180
	for _, c := range []struct {
		depthDeg float64
		ok       bool
	}{{119, true}, {120, false}, {150, false}} {
		_, err := NewDigital(DigitalSpec{Name: "d", Mount: m, HalfAngle: half, Sigma: 1e-3,
			Blind: BlindRule{Earth: true, EarthDepthAbove: c.depthDeg * math.Pi / 180}})
		if (err == nil) != c.ok {
			t.Errorf("depth %g° on a 30° cone: error %v, want accepted %v", c.depthDeg, err, c.ok)
		}
		if err != nil && !strings.Contains(err.Error(), "lit_earth_blind_depth_deg") {
			t.Errorf("the refusal does not name the key: %v", err)
		}
	}
	// Reachable from this orbit: 119° < 30° + 90°, though at 550 km the
	// Earth's disc is 67° in radius and reaches only 97° deep.
	b := bodiesAt(0, 0, 67)
	if d := b.EarthDepth(r3.Vec{Z: 1}, half) * 180 / math.Pi; math.Abs(d-97) > 1e-9 {
		t.Errorf("deepest Earth %.9f°, want 97°", d)
	}
}
