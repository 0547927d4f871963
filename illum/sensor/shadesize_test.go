package sensor

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// A shade that is not square: the unit's aperture side (or wall distance)
// differs per axis from the nominal the flight software inverts with.
// Elementary geometry (own calculation), sun along the x axis inside the
// linear range, the y axis at normal incidence:
//   - aperture: the imbalance is X' = 2h·t/(w' − g), inverted with the
//     nominal w, so the measured tangent is t·(w − g)/(w' − g);
//     w = c = 2, g = 0.2, h = 1, w'ₓ = 2.1, t = 0.3: 0.3·1.8/1.9.
//   - wall: the shadow reaches s = H·t − d' into the near cell, inverted
//     with the nominal d, so the measured tangent is t − (d' − d)/H;
//     c = 2, d = 0.577, H = 1, d'ₓ = 0.677, t = 1.2: 1.1.
//
// The y axis, built to nominal, reads straight along the boresight.
func TestQuadrantShadeNotSquare(t *testing.T) {
	for _, c := range []struct {
		name        string
		spec        QuadrantSpec
		tan, wantTx float64
	}{
		{"aperture", QuadrantSpec{ApertureSide: 2, Height: 1, CellSide: 2, Gap: 0.2, SizeErrX: 0.1}, 0.3, 0.3 * 1.8 / 1.9},
		{"wall", QuadrantSpec{Geometry: GeometryWall, Height: 1, CellSide: 2, WallDistance: 0.577, SizeErrX: 0.1}, 1.2, 1.1},
	} {
		q := quadSpec(t, c.spec)
		sun := r3.Unit(r3.Vec{X: c.tan, Z: 1})
		r := q.Read(sun, SolarConstant, Albedo{}, nil)
		if !r.Valid {
			t.Errorf("%s: no valid reading at tan %.2f", c.name, c.tan)
			continue
		}
		d := q.spec.Mount.ToSensor(r.Dir)
		if tx, ty := d.X/d.Z, d.Y/d.Z; math.Abs(tx-c.wantTx) > 1e-9 || math.Abs(ty) > 1e-12 {
			t.Errorf("%s: measured tangents (%.12f, %.3g), closed form (%.12f, 0)", c.name, tx, ty, c.wantTx)
		}
		// The nominal unit (no size error) reads the sun exactly.
		c.spec.SizeErrX = 0
		n := quadSpec(t, c.spec).Read(sun, SolarConstant, Albedo{}, nil)
		if !n.Valid || angle(n.Dir, sun) > 1e-9 {
			t.Errorf("%s: nominal unit off by %.3g rad (valid %v)", c.name, angle(n.Dir, sun), n.Valid)
		}
	}
}

// The size error is drawn per unit and per axis with SizeSigma, and only
// then: a sensor without it draws the same units as before (the same
// random stream), and the two axes of a drawn unit differ.
func TestQuadrantShadeSizeDraw(t *testing.T) {
	base := QuadrantSpec{ApertureSide: 2, Height: 1, CellSide: 2, Gap: 0.2, TwistSigma: 0.5 * deg}
	q0 := quadSpec(t, base)
	base.SizeSigma = 0.05
	q1 := quadSpec(t, base)
	r0, r1 := rand.New(rand.NewPCG(3, 4)), rand.New(rand.NewPCG(3, 4))
	u0 := q0.Draw(r0).(*Quadrant)
	u1 := q1.Draw(r1).(*Quadrant)
	if u0.sizeX != 2 || u0.sizeY != 2 {
		t.Errorf("no size error: unit sizes (%g, %g), want the nominal 2", u0.sizeX, u0.sizeY)
	}
	if u0.actual != u1.actual {
		t.Errorf("the size draw moved the twist draw: %+v vs %+v", u0.actual, u1.actual)
	}
	if u1.sizeX == 2 || u1.sizeY == 2 || u1.sizeX == u1.sizeY {
		t.Errorf("drawn sizes (%g, %g): want two different values off the nominal", u1.sizeX, u1.sizeY)
	}
	// Spread: 2000 units, σ within 5 % of 0.05 mm (closed form: a normal
	// draw; 5 % is over 3σ of the sample σ's spread, σ/√(2n) = 1.6 %).
	rng := rand.New(rand.NewPCG(5, 6))
	var s2 float64
	const n = 2000
	for range n {
		u := q1.Draw(rng).(*Quadrant)
		s2 += (u.sizeX-2)*(u.sizeX-2) + (u.sizeY-2)*(u.sizeY-2)
	}
	if sd := math.Sqrt(s2 / (2 * n)); math.Abs(sd/0.05-1) > 0.05 {
		t.Errorf("drawn size σ %.4f mm, want 0.05", sd)
	}
}
