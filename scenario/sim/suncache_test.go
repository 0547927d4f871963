package sim

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/internal/vecmath"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// The interpolated sun stays within 1e-8 rad and 10 m of the ephemeris it
// interpolates (closed-form bound in suncache.go: 2e-9 rad, 5 m).
func TestSunCacheMatchesEphemeris(t *testing.T) {
	jd0 := 2461406.5
	c := newSunCache(ephem.LowPrecision{}, jd0)
	worstAng, worstD := 0.0, 0.0
	for ts := 0.0; ts < 3*86400; ts += 37 {
		u, d := c.at(ts)
		u2, d2 := ephem.LowPrecision{}.Position(jd0 + ts/86400)
		worstAng = math.Max(worstAng, angleBetween(u, u2))
		worstD = math.Max(worstD, math.Abs(d-d2))
	}
	if worstAng > 1e-8 || worstD > 0.01 {
		t.Fatalf("worst %g rad, %g km", worstAng, worstD)
	}
	t.Logf("worst interpolation error %.2g rad, %.2g km", worstAng, worstD)
}

// The attitude matrix rotates like the quaternion it comes from (gonum's
// r3.Rotation is the reference), both ways.
func TestBodyMatrixMatchesQuaternion(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for range 1000 {
		q := attitude.UniformRotation(rng)
		A := attitudeRot(q)
		M := A.matrix()
		v := r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()}
		if d := vecmath.Norm(r3.Sub(M.toBody(v), A.toBody(v))); d > 1e-14*vecmath.Norm(v) {
			t.Fatalf("toBody differs by %g", d)
		}
		if d := vecmath.Norm(r3.Sub(M.toECI(v), A.toECI(v))); d > 1e-14*vecmath.Norm(v) {
			t.Fatalf("toECI differs by %g", d)
		}
	}
}

// The interpolated Moon stays within 1e-5 rad (2″) and 0.2 km of ephem.Moon
// (closed-form bound in suncache.go: 3e-6 rad, 60 m).
func TestMoonCacheMatchesEphemeris(t *testing.T) {
	jd0 := 2461406.5
	c := newMoonCache(jd0)
	worstAng, worstD := 0.0, 0.0
	for ts := 0.0; ts < 3*86400; ts += 37 {
		u, d := c.at(ts)
		u2, d2 := ephem.Moon{}.Position(jd0 + ts/86400)
		worstAng = math.Max(worstAng, angleBetween(u, u2))
		worstD = math.Max(worstD, math.Abs(d-d2))
	}
	if worstAng > 1e-5 || worstD > 0.2 {
		t.Fatalf("worst %g rad, %g km", worstAng, worstD)
	}
	t.Logf("worst Moon interpolation error %.2g rad, %.2g km", worstAng, worstD)
}
