package ephem

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/soniakeys/meeus/v3/base"
	"github.com/soniakeys/unit"
	"gonum.org/v1/gonum/spatial/r3"
)

// astropyMoon is one row of testdata/moon_astropy.csv.
type astropyMoon struct {
	jdTT float64
	pos  r3.Vec // get_body('moon') in GCRS (apparent), km
	geo  r3.Vec // ERFA moon98 (geometric), km
}

func readAstropyMoon(t testing.TB) []astropyMoon {
	t.Helper()
	rows := readCSV(t, "moon_astropy.csv")
	out := make([]astropyMoon, len(rows))
	for i, row := range rows {
		v := parseFloats(t, row)
		out[i] = astropyMoon{v[0], r3.Vec{X: v[1], Y: v[2], Z: v[3]}, r3.Vec{X: v[4], Y: v[5], Z: v[6]}}
	}
	if len(out) < 200 {
		t.Fatalf("moon_astropy.csv has %d epochs, want ≥ 200", len(out))
	}
	return out
}

// Tolerances against astropy over 2000–2050 (testdata/gen_moon_astropy.py).
const (
	// The direction bound of the Moon model's users (0.05°, a tenth of the
	// Moon's apparent diameter): common practice, no source. Meeus 1998
	// ch. 47 states about 10″ in longitude and 4″ in latitude.
	tolMoonDirDeg = 0.05
	// Distance: the same series on both sides; 1 km is common practice,
	// no source (the Moon's angular radius changes by 1e-6 rad per km).
	tolMoonDistKm = 1.0
)

func TestMoonAgainstAstropy(t *testing.T) {
	// astropy 5.2.1 get_body('moon', builtin ephemeris), GCRS (Debian
	// python3-astropy), 400 epochs 2000–2050; the distance against ERFA
	// moon98, the geometric Moon get_body starts from (get_body's own
	// distance carries the Earth's motion over the light time, ~40 km).
	// The builtin Moon implements the same Meeus theory: this checks the
	// frame chain and time arguments, not the lunar theory against another.
	var worst, worstDist, at float64
	for _, r := range readAstropyMoon(t) {
		u, d := Moon{}.Position(r.jdTT)
		if e := sepDeg(u, r.pos); e > worst {
			worst, at = e, r.jdTT
		}
		worstDist = math.Max(worstDist, math.Abs(d-r3.Norm(r.geo)))
	}
	t.Logf("Moon vs astropy get_body GCRS: worst direction %.5f° (JD %.1f); distance vs ERFA moon98: worst %.3f km",
		worst, at, worstDist)
	if worst > tolMoonDirDeg {
		t.Errorf("direction error %.5f° > %g°", worst, tolMoonDirDeg)
	}
	if worstDist > tolMoonDistKm {
		t.Errorf("distance error %.1f km > %g km", worstDist, tolMoonDistKm)
	}
}

func TestMoonLeftOfDateIsCaught(t *testing.T) {
	// The same comparison with the precession to J2000 left out must fail
	// the bound after 2005 (50.3″/yr of general precession, closed form):
	// the test above can tell a frame error from the model's own error.
	ref := readAstropyMoon(t)
	var worst float64
	for _, r := range ref {
		λ, β, _ := MoonEclipticOfDate(r.jdTT)
		sε, cε := math.Sincos(23.4392911 * deg)
		sλ, cλ := math.Sincos(λ)
		sβ, cβ := math.Sincos(β)
		ofDate := r3.Vec{X: cβ * cλ, Y: cε*cβ*sλ - sε*sβ, Z: sε*cβ*sλ + cε*sβ}
		worst = math.Max(worst, sepDeg(ofDate, r.pos))
	}
	if worst < 5*tolMoonDirDeg {
		t.Errorf("a Moon of date is at most %.4f° off; the check could not see a missing precession", worst)
	}
}

func TestMoonIlluminatedFractionLimits(t *testing.T) {
	// Closed form: a Moon opposite the sun is full (k = 1), in line with it
	// new (k = 0), and at quadrature seen from the Earth half lit to within
	// the sun's parallax (k = (1 + cos(90° − Δ/R))/2).
	sun := r3.Vec{X: AUKm}
	for _, c := range []struct {
		moon r3.Vec
		want float64
	}{
		{r3.Vec{X: -384400}, 1},
		{r3.Vec{X: 384400}, 0},
		{r3.Vec{Y: 384400}, (1 + math.Sin(math.Atan(384400/AUKm))) / 2},
	} {
		if k := MoonIlluminatedFraction(c.moon, sun); math.Abs(k-c.want) > 1e-12 {
			t.Errorf("moon %v: k = %.15f, want %.15f", c.moon, k, c.want)
		}
	}
}

// The triangle form of k equals Meeus's (48.3) then (48.1) through
// soniakeys/meeus base.Illuminated, for random Moon and sun positions.
func TestMoonIlluminatedFractionIsMeeus48(t *testing.T) {
	rng := rand.New(rand.NewPCG(48, 1))
	for range 10000 {
		v := func(d float64) r3.Vec {
			return r3.Scale(d, r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()})
		}
		moon, sun := v(380000), v(AUKm)
		want := base.Illuminated(unit.Angle(MoonPhaseAngle(moon, sun)))
		if k := MoonIlluminatedFraction(moon, sun); math.Abs(k-want) > 1e-12 {
			t.Fatalf("k = %.15f, (48.3)+(48.1) give %.15f", k, want)
		}
	}
}
