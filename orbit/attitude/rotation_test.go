package attitude

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

const tight = 1e-12

func matClose(t *testing.T, name string, got *r3.Mat, want [3][3]float64, tol float64) {
	t.Helper()
	for i := range 3 {
		for j := range 3 {
			if d := math.Abs(got.At(i, j) - want[i][j]); d > tol {
				t.Errorf("%s: C[%d][%d] = %.15g, want %.15g (|Δ| %.2g > %.1g)", name, i, j, got.At(i, j), want[i][j], d, tol)
			}
		}
	}
}

func sameRotation(a, b r3.Rotation) float64 { return AngleBetween(a, b) }

// Closed form: active rotation by θ about z has matrix [[c, −s, 0], [s, c, 0], [0, 0, 1]].
func TestToDCMClosedForm(t *testing.T) {
	θ := 0.7
	c, s := math.Cos(θ), math.Sin(θ)
	matClose(t, "active Rz", ToDCM(r3.NewRotation(θ, unitZ)), [3][3]float64{{c, -s, 0}, {s, c, 0}, {0, 0, 1}}, tight)
	matClose(t, "active Rx", ToDCM(r3.NewRotation(θ, unitX)), [3][3]float64{{1, 0, 0}, {0, c, -s}, {0, s, c}}, tight)
	// Frame rotation R₂(θ) (Wertz 1978 App. E, from memory): [[c, 0, −s], [0, 1, 0], [s, 0, c]].
	matClose(t, "frame R2", ToDCM(frameTurn(θ, unitY)), [3][3]float64{{c, 0, -s}, {0, 1, 0}, {s, 0, c}}, tight)
}

// Round trip quaternion → DCM → quaternion, including each of Shepperd's
// four branches (near-identity and 180° turns about x, y, z).
func TestDCMRoundTrip(t *testing.T) {
	cases := []r3.Rotation{
		Identity,
		r3.NewRotation(math.Pi, unitX),
		r3.NewRotation(math.Pi, unitY),
		r3.NewRotation(math.Pi, unitZ),
		r3.NewRotation(math.Pi-1e-9, r3.Vec{X: 1, Y: 1, Z: 1}),
		r3.NewRotation(1e-9, r3.Vec{X: 1, Y: -2, Z: 3}),
	}
	r := rand.New(rand.NewPCG(1, 2))
	for range 2000 {
		cases = append(cases, UniformRotation(r))
	}
	worst := 0.0
	for _, q := range cases {
		back := FromDCM(ToDCM(q))
		worst = math.Max(worst, sameRotation(q, back))
		// DCM action equals Rotate.
		v := r3.Vec{X: 0.3, Y: -0.5, Z: 0.8}
		if d := r3.Norm(r3.Sub(ToDCM(q).MulVec(v), q.Rotate(v))); d > tight {
			t.Fatalf("C·v differs from Rotate(v) by %g for %v", d, q)
		}
		if back.Real < 0 {
			t.Fatalf("FromDCM gave negative scalar part %v", back)
		}
	}
	if worst > 1e-12 {
		t.Errorf("worst DCM round-trip angle %g rad > 1e-12", worst)
	}
	t.Logf("worst DCM round-trip angle %.3g rad", worst)
}

// 3-2-1 closed form (Schaub & Junkins 2018, 4th ed., eq. 3.33, from memory).
func TestEuler321ClosedForm(t *testing.T) {
	ψ, θ, φ := 0.4, -0.3, 1.1
	cψ, sψ := math.Cos(ψ), math.Sin(ψ)
	cθ, sθ := math.Cos(θ), math.Sin(θ)
	cφ, sφ := math.Cos(φ), math.Sin(φ)
	want := [3][3]float64{
		{cθ * cψ, cθ * sψ, -sθ},
		{sφ*sθ*cψ - cφ*sψ, sφ*sθ*sψ + cφ*cψ, sφ * cθ},
		{cφ*sθ*cψ + sφ*sψ, cφ*sθ*sψ - sφ*cψ, cφ * cθ},
	}
	matClose(t, "3-2-1", ToDCM(FromEuler(Seq321, ψ, θ, φ)), want, tight)
}

// 3-1-3 closed form (Schaub & Junkins 2018, 4th ed., eq. 3.37, from
// memory): the ECI → perifocal matrix with (Ω, i, ω).
func TestEuler313ClosedForm(t *testing.T) {
	Ω, i, ω := 0.9, 1.7, -0.6
	cΩ, sΩ := math.Cos(Ω), math.Sin(Ω)
	ci, si := math.Cos(i), math.Sin(i)
	cω, sω := math.Cos(ω), math.Sin(ω)
	want := [3][3]float64{
		{cω*cΩ - sω*ci*sΩ, cω*sΩ + sω*ci*cΩ, sω * si},
		{-sω*cΩ - cω*ci*sΩ, -sω*sΩ + cω*ci*cΩ, cω * si},
		{si * sΩ, -si * cΩ, ci},
	}
	matClose(t, "3-1-3", ToDCM(FromEuler(Seq313, Ω, i, ω)), want, tight)
}

func TestEulerRoundTrip(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	for _, seq := range []EulerSequence{Seq321, Seq313} {
		worstAng, worstRot := 0.0, 0.0
		for range 2000 {
			a1 := (2*r.Float64() - 1) * math.Pi * 0.999
			a3 := (2*r.Float64() - 1) * math.Pi * 0.999
			var a2 float64
			if seq == Seq321 {
				a2 = (2*r.Float64() - 1) * math.Pi / 2 * 0.999
			} else {
				a2 = (0.001 + 0.998*r.Float64()) * math.Pi
			}
			q := FromEuler(seq, a1, a2, a3)
			b1, b2, b3 := ToEuler(seq, q)
			worstAng = math.Max(worstAng, math.Max(math.Abs(b1-a1), math.Max(math.Abs(b2-a2), math.Abs(b3-a3))))
			worstRot = math.Max(worstRot, sameRotation(q, FromEuler(seq, b1, b2, b3)))
		}
		if worstAng > 1e-9 || worstRot > 1e-12 {
			t.Errorf("%v: worst angle error %g rad, rotation error %g rad", seq, worstAng, worstRot)
		}
		t.Logf("%v: worst angle error %.3g rad, rotation error %.3g rad", seq, worstAng, worstRot)
	}
	// Gimbal lock keeps the rotation even though the angles are not unique.
	for _, c := range []struct {
		seq        EulerSequence
		a1, a2, a3 float64
	}{{Seq321, 0.3, math.Pi / 2, 0.2}, {Seq321, 0.3, -math.Pi / 2, 0.2}, {Seq313, 0.3, 0, 0.2}, {Seq313, 0.3, math.Pi, 0.2}} {
		q := FromEuler(c.seq, c.a1, c.a2, c.a3)
		b1, b2, b3 := ToEuler(c.seq, q)
		if d := sameRotation(q, FromEuler(c.seq, b1, b2, b3)); d > 1e-6 {
			t.Errorf("%v gimbal lock %v: rotation error %g", c.seq, c, d)
		}
	}
}

// Every one of the twelve sequences against the product of the elementary
// frame-rotation matrices R₁, R₂, R₃ (Wertz 1978, App. E, from memory):
// C = R_k(φ₃)·R_j(φ₂)·R_i(φ₁) for the sequence i-j-k.
func TestEulerAllSequences(t *testing.T) {
	elem := func(axis int, θ float64) [3][3]float64 {
		c, s := math.Cos(θ), math.Sin(θ)
		switch axis {
		case 1:
			return [3][3]float64{{1, 0, 0}, {0, c, s}, {0, -s, c}}
		case 2:
			return [3][3]float64{{c, 0, -s}, {0, 1, 0}, {s, 0, c}}
		}
		return [3][3]float64{{c, s, 0}, {-s, c, 0}, {0, 0, 1}}
	}
	mul := func(a, b [3][3]float64) (m [3][3]float64) {
		for i := range 3 {
			for j := range 3 {
				for k := range 3 {
					m[i][j] += a[i][k] * b[k][j]
				}
			}
		}
		return m
	}
	names := []string{"121", "123", "131", "132", "212", "213", "231", "232", "312", "313", "321", "323"}
	for _, name := range names {
		seq, err := ParseEulerSequence(name)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if dashed, err := ParseEulerSequence(seq.String()); err != nil || dashed != seq {
			t.Errorf("%s: %q does not parse back (%v)", name, seq.String(), err)
		}
		φ1, φ2, φ3 := 0.4, -0.7, 1.3
		want := mul(elem(int(name[2]-'0'), φ3), mul(elem(int(name[1]-'0'), φ2), elem(int(name[0]-'0'), φ1)))
		matClose(t, name, ToDCM(FromEuler(seq, φ1, φ2, φ3)), want, tight)
	}
	for _, bad := range []string{"112", "3-3-1", "124", "32", ""} {
		if _, err := ParseEulerSequence(bad); err == nil {
			t.Errorf("%q parsed as a sequence", bad)
		}
	}
}

func TestParseEulerSequence(t *testing.T) {
	for _, s := range []string{"321", "3-2-1", "313", "3-1-3"} {
		if _, err := ParseEulerSequence(s); err != nil {
			t.Errorf("%q: %v", s, err)
		}
	}
	if _, err := ParseEulerSequence("3-3-1"); err == nil {
		t.Error("3-3-1 accepted")
	}
}

// TRIAD recovers a known rotation exactly when the vector pair is
// consistent (closed form).
func TestFromTriad(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	worst := 0.0
	for range 1000 {
		q := UniformRotation(r)
		p := r3.Vec{X: r.NormFloat64(), Y: r.NormFloat64(), Z: r.NormFloat64()}
		s := r3.Vec{X: r.NormFloat64(), Y: r.NormFloat64(), Z: r.NormFloat64()}
		got, err := FromTriad(q.Rotate(p), p, q.Rotate(s), s)
		if err != nil {
			t.Fatal(err)
		}
		worst = math.Max(worst, sameRotation(q, got))
	}
	if worst > 1e-12 {
		t.Errorf("TRIAD worst error %g rad", worst)
	}
	if _, err := FromTriad(unitX, unitX, r3.Scale(2, unitX), unitY); err == nil {
		t.Error("parallel body vectors accepted")
	}
}
