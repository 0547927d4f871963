package attitude

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
)

// nadirTriad is Nadir.Attitude as it was built before alignAxes: TRIAD on
// the normalised axes, Shepperd, then the offset.
func nadirTriad(n Nadir, s orbit.State) r3.Rotation {
	q := alignPair(orDefault(n.NadirAxis, unitZ), r3.Scale(-1, s.R), orDefault(n.VelocityAxis, unitX), s.V)
	return then(q, offsetOrIdentity(n.Offset))
}

// sunTriad is Sun.Attitude as it was built before alignAxes.
func sunTriad(l Sun, t float64, s orbit.State, sunDir r3.Vec) r3.Rotation {
	var ref r3.Vec
	switch l.Reference {
	case TowardNadir:
		ref = r3.Scale(-1, s.R)
	case TowardInertial:
		ref = l.InertialDir
	default:
		ref = r3.Cross(s.R, s.V)
	}
	axis := orDefault(l.SunAxis, unitZ)
	q := alignPair(axis, sunDir, orDefault(l.SecondaryAxis, unitX), ref)
	if l.SpinRate == 0 && l.Phase == 0 {
		return q
	}
	return then(q, frameTurn(l.Phase+l.SpinRate*t, axis))
}

// randomAxis is the zero vector (the law's default) a quarter of the time,
// a signed coordinate axis a quarter of the time, and otherwise a random
// direction of random length in [0.5, 2] (the laws accept any length).
func randomAxis(r *rand.Rand) r3.Vec {
	switch r.IntN(4) {
	case 0:
		return r3.Vec{}
	case 1:
		v := axes[1+r.IntN(3)]
		if r.IntN(2) == 0 {
			v = r3.Scale(-1, v)
		}
		return v
	}
	return r3.Scale(0.5+1.5*r.Float64(), randomUnit(r))
}

// randomAxisPair draws two body axes that are not parallel (coordinate
// axes may coincide; such draws are made again).
func randomAxisPair(r *rand.Rand) (p, s r3.Vec) {
	for {
		p, s = randomAxis(r), randomAxis(r)
		if r3.Norm(r3.Cross(orDefault(p, unitZ), orDefault(s, unitX))) > 1e-3 {
			return p, s
		}
	}
}

// randomRotation is zero (no offset) half of the time, else a uniformly
// random unit rotation (Shoemake 1992, as shoemake in random.go).
func randomRotation(r *rand.Rand) r3.Rotation {
	if r.IntN(2) == 0 {
		return r3.Rotation{}
	}
	return shoemake(r.Float64(), r.Float64(), r.Float64())
}

// The direct path of Nadir and Sun agrees with the TRIAD path they used
// before to 1e-12 rad over 10⁴ random states and axis choices, and its
// quaternion has unit norm within 1e-15 (closed form: a rotation has
// |q| = 1; TRIAD itself is Black 1964, from memory).
func TestAlignAxesMatchesTriad(t *testing.T) {
	const n = 10_000
	r := rand.New(rand.NewPCG(11, 12))
	states := randomStates(n, 13)
	worst, worstNorm := 0.0, 0.0
	check := func(name string, got, want r3.Rotation) {
		t.Helper()
		d := AngleBetween(want, got)
		m := math.Abs(math.Sqrt(got.Real*got.Real+got.Imag*got.Imag+got.Jmag*got.Jmag+got.Kmag*got.Kmag) - 1)
		if !(d <= tight) || !(m <= 1e-15) {
			t.Fatalf("%s: %.3g rad from the TRIAD path, |q| − 1 = %.3g", name, d, m)
		}
		worst, worstNorm = math.Max(worst, d), math.Max(worstNorm, m)
	}
	for i, s := range states {
		var nd Nadir
		nd.NadirAxis, nd.VelocityAxis = randomAxisPair(r)
		nd.Offset = randomRotation(r)
		check("nadir", nd.Attitude(0, s, r3.Vec{}), nadirTriad(nd, s))

		var l Sun
		l.SunAxis, l.SecondaryAxis = randomAxisPair(r)
		l.Reference = SunReference(r.IntN(3))
		l.InertialDir = randomUnit(r)
		if r.IntN(2) == 0 {
			l.SpinRate, l.Phase = 0.1*r.NormFloat64(), r.Float64()
		}
		sun := randomUnit(r)
		tt := float64(i)
		check("sun", l.Attitude(tt, s, sun), sunTriad(l, tt, s, sun))
	}
	t.Logf("worst angle %.3g rad, worst | |q| − 1 | %.3g", worst, worstNorm)
}

// Where a triad is degenerate the laws give exactly what the TRIAD path
// gives (its fixed-perpendicular fallback, or identity for parallel body
// axes).
func TestAlignAxesDegenerate(t *testing.T) {
	radial := orbit.State{R: r3.Vec{X: 7000, Y: 1}, V: r3.Vec{X: 7, Y: 1e-3}} // v ∥ r
	// 1.2e-12 rad between r and v: inside the band where unitPair stands
	// aside but triadBasis does not.
	nearly := orbit.State{R: r3.Vec{X: 7000}, V: r3.Vec{X: 7.5, Y: 7.5 * 1.2e-12}}
	s := randomStates(1, 5)[0]
	for _, c := range []struct {
		name string
		n    Nadir
		s    orbit.State
	}{
		{"radial velocity", Nadir{}, radial},
		{"velocity 1.2e-12 rad off r", Nadir{}, nearly},
		{"custom axes, radial velocity", Nadir{NadirAxis: r3.Vec{Y: 1}, VelocityAxis: unitZ}, radial},
		{"parallel body axes", Nadir{NadirAxis: unitX, VelocityAxis: r3.Vec{X: -2}}, s},
	} {
		if got, want := c.n.Attitude(0, c.s, r3.Vec{}), nadirTriad(c.n, c.s); got != want {
			t.Errorf("%s: %v, TRIAD path %v", c.name, got, want)
		}
	}
	// 1.5e-12 rad: past the band the direct path decides, and it agrees
	// because both build the ECI triad with the same operations.
	past := orbit.State{R: r3.Vec{X: 7000}, V: r3.Vec{X: 7.5, Y: 7.5 * 1.5e-12}}
	if d := AngleBetween(nadirTriad(Nadir{}, past), Nadir{}.Attitude(0, past, r3.Vec{})); !(d <= tight) {
		t.Errorf("velocity 1.5e-12 rad off r: %.3g rad from the TRIAD path", d)
	}
	// β = 90°: the orbit normal is along the sun line.
	h := r3.Unit(r3.Cross(s.R, s.V))
	if got, want := (Sun{}).Attitude(0, s, h), sunTriad(Sun{}, 0, s, h); got != want {
		t.Errorf("sun along the orbit normal: %v, TRIAD path %v", got, want)
	}
}
