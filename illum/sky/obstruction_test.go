package sky

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

var everywhere = ViewerFunc(func(r3.Vec) bool { return true })

func blockedFraction(t *testing.T, ob Obstacle, origin r3.Vec, n int) float64 {
	t.Helper()
	v := Obstructed{View: everywhere, Position: origin, Obstacles: []Obstacle{ob}}
	return 1 - mustCoverage(t, []Viewer{&v}, mustLattice(t, n)).AtLeast[1]
}

// An (effectively) infinite plate through the sensor blocks exactly half of
// the sphere (closed form). The Fibonacci z values are symmetric, so the
// lattice gives exactly 1/2.
func TestInfinitePlateBlocksHalf(t *testing.T) {
	plate := Rectangle{Centre: r3.Vec{}, HalfU: r3.Vec{X: 1e9}, HalfV: r3.Vec{Y: 1e9}}
	if f := blockedFraction(t, plate, r3.Vec{Z: 1e-3}, DefaultPoints); f != 0.5 {
		t.Errorf("blocked fraction %.8f, want 0.5", f)
	}
}

// Solid angle of a rectangle of half-sides a, b seen on its axis from
// distance d: Ω = 4 arcsin(ab / √((a² + d²)(b² + d²))) (closed form).
func TestRectangleSolidAngle(t *testing.T) {
	a, b, d := 0.4, 0.7, 0.5
	r := Rectangle{Centre: r3.Vec{Z: d}, HalfU: r3.Vec{X: a}, HalfV: r3.Vec{Y: b}}
	want := 4 * math.Asin(a*b/math.Sqrt((a*a+d*d)*(b*b+d*d))) / (4 * math.Pi)
	got := blockedFraction(t, r, r3.Vec{}, 1<<18)
	if math.Abs(got-want) > 2e-4 {
		t.Errorf("rectangle blocks %.6f, closed form %.6f", got, want)
	}
	t.Logf("rectangle: %.6f vs %.6f (Δ %.2g)", got, want, got-want)
	// A tilted (non-axis-aligned) copy blocks the same fraction.
	q := r3.NewRotation(0.7, r3.Vec{X: 1, Y: 2, Z: 3})
	rt := Rectangle{Centre: q.Rotate(r.Centre), HalfU: q.Rotate(r.HalfU), HalfV: q.Rotate(r.HalfV)}
	if g2 := blockedFraction(t, rt, r3.Vec{}, 1<<18); math.Abs(g2-want) > 2e-4 {
		t.Errorf("tilted rectangle blocks %.6f, closed form %.6f", g2, want)
	}
	// Behind the sensor it blocks nothing.
	if r.Blocks(r3.Vec{Z: 1}, r3.Vec{Z: 1}) {
		t.Error("plate behind the ray origin blocks")
	}
}

// A long cylinder of radius R at distance D from the sensor: its azimuth
// (about the cylinder axis) subtends 2·arcsin(R/D), and azimuth is uniform
// on the sphere, so it blocks arcsin(R/D)/π (closed form).
func TestCylinderLong(t *testing.T) {
	R, D := 0.3, 1.0
	c := Cylinder{A: r3.Vec{X: D, Z: -1e7}, B: r3.Vec{X: D, Z: 1e7}, Radius: R}
	want := math.Asin(R/D) / math.Pi
	got := blockedFraction(t, c, r3.Vec{}, 1<<18)
	if math.Abs(got-want) > 5e-4 {
		t.Errorf("cylinder blocks %.6f, closed form %.6f", got, want)
	}
	t.Logf("long cylinder: %.6f vs %.6f (Δ %.2g)", got, want, got-want)
}

func TestCylinderCases(t *testing.T) {
	c := Cylinder{A: r3.Vec{Z: 1}, B: r3.Vec{Z: 3}, Radius: 0.1}
	cases := []struct {
		name   string
		o, d   r3.Vec
		blocks bool
	}{
		{"along the axis into the end cap", r3.Vec{}, r3.Vec{Z: 1}, true},
		{"along the axis away", r3.Vec{}, r3.Vec{Z: -1}, false},
		{"parallel, outside radius", r3.Vec{X: 0.2}, r3.Vec{Z: 1}, false},
		{"side hit", r3.Vec{X: -1, Z: 2}, r3.Vec{X: 1}, true},
		{"passes beyond the end", r3.Vec{X: -1, Z: 3.5}, r3.Vec{X: 1}, false},
		{"oblique through the cap", r3.Vec{X: -0.5}, r3.Unit(r3.Vec{X: 0.5, Z: 1.05}), true},
		{"from inside", r3.Vec{Z: 2}, r3.Vec{Y: 1}, true},
	}
	for _, cs := range cases {
		if got := c.Blocks(cs.o, cs.d); got != cs.blocks {
			t.Errorf("%s: blocks = %v, want %v", cs.name, got, cs.blocks)
		}
	}
}

// A hemispherical sensor under a panel that covers its whole view sees nothing;
// a cone field of view is kept when nothing blocks.
func TestObstructedViewer(t *testing.T) {
	lat := mustLattice(t, 4096)
	cone := NewCone(r3.Vec{Z: 1}, 60*deg)
	panel := Rectangle{Centre: r3.Vec{Z: 0.5}, HalfU: r3.Vec{X: 10}, HalfV: r3.Vec{Y: 10}}
	if f := mustCoverage(t, []Viewer{&Obstructed{View: cone, Obstacles: []Obstacle{panel}}}, lat).AtLeast[1]; f != 0 {
		t.Errorf("covered sensor sees %.4f", f)
	}
	free := mustCoverage(t, []Viewer{&Obstructed{View: cone}}, lat).AtLeast[1]
	if want := mustCoverage(t, []Viewer{cone}, lat).AtLeast[1]; free != want {
		t.Errorf("unobstructed %.6f, bare cone %.6f", free, want)
	}
}

// From the centre of a box face every inward direction meets the box and no
// outward one does: the box hides exactly half of the sphere (closed form;
// the lattice's z values are symmetric, so a ±Z face gives exactly 1/2).
func TestBoxFromItsFaceHidesHalf(t *testing.T) {
	b := Box{Half: r3.Vec{X: 0.05, Y: 0.1135, Z: 0.17025}}
	for _, o := range []r3.Vec{{Z: 0.17025}, {X: 0.02, Y: -0.1, Z: -0.17025}} {
		if f := blockedFraction(t, b, o, DefaultPoints); f != 0.5 {
			t.Errorf("box seen from its face at %v hides %.8f, want 0.5", o, f)
		}
	}
}

// Seen from a point on the axis in front of a face, a box hides exactly the
// solid angle of that face: its side faces recede behind the face's outline
// (closed form, the rectangle formula of TestRectangleSolidAngle).
func TestBoxFromOutside(t *testing.T) {
	a, b, c, d := 0.3, 0.5, 0.2, 0.9
	box := Box{Centre: r3.Vec{X: 0.1, Y: -0.2}, Half: r3.Vec{X: a, Y: b, Z: c}}
	o := r3.Vec{X: 0.1, Y: -0.2, Z: d}
	h := d - c
	want := 4 * math.Asin(a*b/math.Sqrt((a*a+h*h)*(b*b+h*h))) / (4 * math.Pi)
	if got := blockedFraction(t, box, o, 1<<18); math.Abs(got-want) > 2e-4 {
		t.Errorf("box hides %.6f, its near face subtends %.6f", got, want)
	}
	cases := []struct {
		name   string
		o, d   r3.Vec
		blocks bool
	}{
		{"toward the box", r3.Vec{Z: 1}, r3.Vec{Z: -1}, true},
		{"away from the box", r3.Vec{Z: 1}, r3.Vec{Z: 1}, false},
		{"parallel, outside a slab", r3.Vec{X: 1}, r3.Vec{Y: 1}, false},
		{"parallel, inside the slabs", r3.Vec{X: 0.1, Y: -2}, r3.Vec{Y: 1}, true},
		{"passes a corner", r3.Vec{X: 1, Y: -0.2, Z: 0.5}, r3.Unit(r3.Vec{X: -1, Z: -0.1}), false},
		{"from inside", r3.Vec{X: 0.1, Y: -0.2}, r3.Vec{X: 1}, true},
	}
	for _, cs := range cases {
		if got := box.Blocks(cs.o, cs.d); got != cs.blocks {
			t.Errorf("%s: blocks = %v, want %v", cs.name, got, cs.blocks)
		}
	}
}

// A sensor never sees behind its mounting plane: a hemispherical sensor
// tilted 45° off a +Z face sees only the lune between the plane z = 0 and
// its own horizon, and a cone on the face normal loses nothing (closed form:
// a lune of dihedral angle θ covers 2θ of the sphere's 4π).
func TestObstructedFacePlane(t *testing.T) {
	lat := mustLattice(t, 1<<18)
	tilted := NewCone(r3.Unit(r3.Vec{X: 1, Z: 1}), math.Pi/2)
	v := Obstructed{View: tilted, Face: r3.Vec{Z: 1}}
	// Hemisphere about (1,0,1)/√2 cut by z > 0: a lune of dihedral angle
	// 135°, area 2·(3π/4) of 4π = 3/8.
	if got := mustCoverage(t, []Viewer{&v}, lat).AtLeast[1]; math.Abs(got-0.375) > 2e-4 {
		t.Errorf("tilted hemisphere behind a face sees %.6f, want 0.375", got)
	}
	n := Obstructed{View: NewCone(r3.Vec{Z: 1}, math.Pi/2-1e-12), Face: r3.Vec{Z: 1}}
	if got, want := mustCoverage(t, []Viewer{&n}, lat).AtLeast[1], mustCoverage(t, []Viewer{n.View}, lat).AtLeast[1]; got != want {
		t.Errorf("face-normal sensor: %.6f with the face plane, %.6f without", got, want)
	}
	if v.Sees(r3.Vec{X: 1}) {
		t.Error("a direction in the mounting plane is seen")
	}
}

// TestBoxClearAboveNeverBlocks: from a point exactly on a box face, no
// direction out of that face is blocked by the box as Blocks computes it,
// for boxes of every size (flat ones too), points across and beyond the
// face, and directions down to grazing ones (closed form: the face's slab
// interval ends at t = ±0); a point just inside the plane, or a tilted
// normal, is not claimed clear.
func TestBoxClearAboveNeverBlocks(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 32))
	axes := []r3.Vec{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}, {Z: 1}, {Z: -1}}
	comp := func(v r3.Vec, k int) *float64 { return [3]*float64{&v.X, &v.Y, &v.Z}[k] }
	for trial := range 2000 {
		size := r3.Vec{X: 0.1 + 0.3*rng.Float64(), Y: 0.1 * float64(rng.IntN(4)), Z: 0.34}
		b := Box{Centre: r3.Vec{X: rng.NormFloat64() * 0.01, Z: 0.05 * float64(trial%3)}, Half: r3.Scale(0.5, size)}
		n := axes[trial%6]
		k := (trial % 6) / 2
		sign := n.X + n.Y + n.Z
		o := r3.Add(b.Centre, r3.Vec{X: (rng.Float64()*3 - 1.5) * b.Half.X, Y: (rng.Float64()*3 - 1.5) * b.Half.Y, Z: (rng.Float64()*3 - 1.5) * b.Half.Z})
		p := &o
		*[3]*float64{&p.X, &p.Y, &p.Z}[k] = *comp(b.Centre, k) + sign**comp(b.Half, k)
		if *comp(o, k)-*comp(b.Centre, k) != sign**comp(b.Half, k) {
			continue // the sum did not round back: not on the plane as computed
		}
		if !b.ClearAbove(o, n) {
			t.Fatalf("box %v, point %v on face %v: not clear", b, o, n)
		}
		for j := range 200 {
			d := r3.Unit(r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()})
			if j%4 == 0 { // grazing: d·n a few ulps to 1e-6 above zero
				*[3]*float64{&d.X, &d.Y, &d.Z}[k] = sign * math.Ldexp(1, -rng.IntN(1000)-20)
			}
			if !(r3.Dot(d, n) > 0) {
				continue
			}
			if b.Blocks(o, d) {
				t.Fatalf("box %v, point %v on face %v: direction %v blocked", b, o, n, d)
			}
		}
		off := o
		q := &off
		c := [3]*float64{&q.X, &q.Y, &q.Z}[k]
		for *c-*comp(b.Centre, k) == sign**comp(b.Half, k) { // ulps inside until off the plane as computed
			*c = math.Nextafter(*c, math.Inf(-1)*sign)
		}
		if b.ClearAbove(off, n) {
			t.Fatalf("box %v, point %v just inside face %v: claimed clear", b, off, n)
		}
		if b.ClearAbove(o, r3.Unit(r3.Add(n, r3.Vec{X: 1e-3, Y: 1e-3, Z: 1e-3}))) {
			t.Fatalf("box %v, point %v: tilted normal claimed clear", b, o)
		}
	}
}
