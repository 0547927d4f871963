package sky

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// A 0.2 m square plate facing +Z with a box 0.1 m above its +X half: the
// sun straight above lights exactly half of it; tilted by θ toward +X the
// box's shadow moves by z·tan θ and the lit share follows the interval
// arithmetic of the shadow on the plate (closed form; the 8 × 8 samples
// resolve it to one column, 1/8).
func TestPlateHalfShadowedByBox(t *testing.T) {
	box := Box{Centre: r3.Vec{X: 0.05, Z: 0.1}, Half: r3.Vec{X: 0.05, Y: 0.3, Z: 0.005}}
	p := NewPlate(r3.Vec{}, r3.Vec{Z: 1}, 0.2, 0.2, []Obstacle{box})
	if got := p.LitShare(r3.Vec{Z: 1}); got != 0.5 {
		t.Errorf("sun overhead: lit share %g, want 0.5", got)
	}
	for _, deg := range []float64{-60, -30, -10, 10, 30, 45, 60} {
		th := deg * math.Pi / 180
		d := r3.Vec{X: math.Sin(th), Z: math.Cos(th)}
		tn := math.Tan(th)
		// A point x is shaded when x + z·tan θ ∈ [0, 0.1] for some z in the
		// box's height [0.095, 0.105].
		lo := math.Min(-0.095*tn, -0.105*tn)
		hi := 0.1 + math.Max(-0.095*tn, -0.105*tn)
		shaded := math.Max(0, math.Min(hi, 0.1)-math.Max(lo, -0.1)) / 0.2
		want := 1 - shaded
		got := p.LitShare(d)
		if math.Abs(got-want) > 1.0/16+1e-12 {
			t.Errorf("sun %g° from overhead: lit share %.4f, closed form %.4f", deg, got, want)
		}
	}
	// Edges on column boundaries: a thin plate 0.1 m above, tan θ = 1.5
	// moves the shadow to [−0.15, −0.05]: 0.25 of the plate is shaded.
	r := Rectangle{Centre: r3.Vec{X: 0.05, Z: 0.1}, HalfU: r3.Vec{X: 0.05}, HalfV: r3.Vec{Y: 0.3}}
	p = NewPlate(r3.Vec{}, r3.Vec{Z: 1}, 0.2, 0.2, []Obstacle{r})
	if got := p.LitShare(r3.Unit(r3.Vec{X: 1.5, Z: 1})); got != 0.75 {
		t.Errorf("tan θ = 1.5: lit share %g, want 0.75", got)
	}
}

// Properties: the share lies in [0, 1], is 0 at or behind the plate and 1
// with nothing in the way; the sample points stay on the plate.
func TestPlateProperties(t *testing.T) {
	for _, n := range []r3.Vec{{X: 1}, {Y: -1}, {Z: -1}, r3.Unit(r3.Vec{X: 0.6, Z: -0.8}), r3.Unit(r3.Vec{X: 1, Y: 1, Z: 1})} {
		u, v := PlateAxes(n)
		if math.Abs(r3.Dot(u, n)) > 1e-12 || math.Abs(r3.Dot(v, n)) > 1e-12 || math.Abs(r3.Norm(u)-1) > 1e-12 || math.Abs(r3.Norm(v)-1) > 1e-12 {
			t.Fatalf("normal %v: axes %v %v", n, u, v)
		}
		c := r3.Vec{X: 0.3, Y: -0.1, Z: 0.2}
		p := NewPlate(c, n, 0.3, 0.1, nil)
		for _, q := range p.Points {
			off := r3.Sub(q, c)
			if math.Abs(r3.Dot(off, n)) > 1e-12 || math.Abs(r3.Dot(off, u)) > 0.15 || math.Abs(r3.Dot(off, v)) > 0.05 {
				t.Fatalf("sample %v off the plate", q)
			}
		}
		for _, d := range []r3.Vec{n, r3.Scale(-1, n), u, r3.Unit(r3.Add(n, u))} {
			got := p.LitShare(d)
			want := 0.0
			if r3.Dot(d, n) > FacePlaneMargin {
				want = 1
			}
			if got != want {
				t.Errorf("normal %v, direction %v: share %g, want %g", n, d, got, want)
			}
		}
	}
	box := Box{Half: r3.Vec{X: 0.1, Y: 0.1, Z: 0.1}}
	p := NewPlate(r3.Vec{X: 0.1}, r3.Vec{X: 1}, 0.2, 0.2, []Obstacle{box})
	for i := range 200 {
		a := float64(i) * 0.1
		d := r3.Unit(r3.Vec{X: math.Cos(a), Y: math.Sin(a) * math.Cos(3*a), Z: math.Sin(a) * math.Sin(3*a)})
		if s := p.LitShare(d); s < 0 || s > 1 || (d.X > FacePlaneMargin && s != 1) {
			t.Fatalf("face plate on the box: direction %v, share %g", d, s)
		}
	}
	if n := testing.AllocsPerRun(100, func() { p.LitShare(r3.Vec{X: 1}) }); n != 0 {
		t.Errorf("%g allocations per share", n)
	}
}

// Obstacles wholly behind the plate's plane are left out (they cannot
// block a ray leaving its front) and the shares do not change: the bus box
// under a face panel, a coplanar neighbour, a rod behind; a box in front
// stays.
func TestPlateDropsObstaclesBehind(t *testing.T) {
	bus := Box{Half: r3.Vec{X: 0.1, Y: 0.05, Z: 0.2}}
	behind := []Obstacle{bus, Rectangle{Centre: r3.Vec{X: 0.1, Y: 0.3}, HalfU: r3.Vec{Y: 0.1}, HalfV: r3.Vec{Z: 0.1}},
		Cylinder{A: r3.Vec{X: -0.1}, B: r3.Vec{X: 0.05, Y: 0.3}, Radius: 0.01}}
	front := Box{Centre: r3.Vec{X: 0.3}, Half: r3.Vec{X: 0.05, Y: 0.05, Z: 0.05}}
	p := NewPlate(r3.Vec{X: 0.1}, r3.Vec{X: 1}, 0.1, 0.4, append(behind, front))
	if len(p.Obstacles) != 1 || p.Obstacles[0] != Obstacle(front) {
		t.Fatalf("kept %v, want only the box in front", p.Obstacles)
	}
	full := Plate{Points: p.Points, Face: p.Face, Obstacles: append(behind, front)}
	for i := range 500 {
		a, b := 0.37*float64(i), 0.11*float64(i)
		d := r3.Vec{X: math.Cos(a) * math.Cos(b), Y: math.Sin(a) * math.Cos(b), Z: math.Sin(b)}
		if p.LitShare(d) != full.LitShare(d) {
			t.Fatalf("direction %v: share %g with the obstacles left out, %g with all", d, p.LitShare(d), full.LitShare(d))
		}
	}
}
