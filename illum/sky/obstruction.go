package sky

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// Obstacle is a body-frame shape that may block a ray from a sensor.
type Obstacle interface {
	// Blocks reports whether the ray origin + t·dir, t > 0, meets the shape.
	Blocks(origin, dir r3.Vec) bool
}

// rayEps is the smallest ray parameter counted as a hit (same units as the
// positions, e.g. metres): a sensor mounted on a surface does not block
// itself.
const rayEps = 1e-9

// Rectangle is a flat plate: the parallelogram Centre + a·HalfU + b·HalfV,
// |a| ≤ 1, |b| ≤ 1 (a rectangle when HalfU ⟂ HalfV). Solar panels and
// deployed covers.
type Rectangle struct {
	Centre, HalfU, HalfV r3.Vec
}

// Blocks implements Obstacle by ray–plane intersection and the plate's
// coordinates of the hit point (closed form).
func (r Rectangle) Blocks(o, d r3.Vec) bool {
	n := r3.Cross(r.HalfU, r.HalfV)
	den := r3.Dot(d, n)
	if den == 0 {
		return false // ray parallel to the plate: it meets it in no area
	}
	t := r3.Dot(r3.Sub(r.Centre, o), n) / den
	if !(t > rayEps) {
		return false
	}
	p := r3.Sub(r3.Add(o, r3.Scale(t, d)), r.Centre)
	// p = a·U + b·V: solve the 2×2 Gram system.
	uu, vv, uv := r3.Dot(r.HalfU, r.HalfU), r3.Dot(r.HalfV, r.HalfV), r3.Dot(r.HalfU, r.HalfV)
	pu, pv := r3.Dot(p, r.HalfU), r3.Dot(p, r.HalfV)
	det := uu*vv - uv*uv
	a := (pu*vv - pv*uv) / det
	b := (pv*uu - pu*uv) / det
	return math.Abs(a) <= 1 && math.Abs(b) <= 1
}

// Cylinder is a solid circular cylinder of Radius about the segment A–B
// (with flat end caps). Booms, antennas and rods.
type Cylinder struct {
	A, B   r3.Vec
	Radius float64
}

// Blocks implements Obstacle: the ray meets the solid where its interval
// inside the infinite cylinder |w⊥ + t·d⊥| ≤ R overlaps its interval in
// the slab 0 ≤ s(t) ≤ L along the axis, for some t > 0 (closed form).
func (c Cylinder) Blocks(o, d r3.Vec) bool {
	ax := r3.Sub(c.B, c.A)
	L := r3.Norm(ax)
	if L == 0 || !(c.Radius > 0) {
		return false
	}
	â := r3.Scale(1/L, ax)
	w := r3.Sub(o, c.A)
	ws, ds := r3.Dot(w, â), r3.Dot(d, â)
	wp := r3.Sub(w, r3.Scale(ws, â))
	dp := r3.Sub(d, r3.Scale(ds, â))
	lo, hi := rayEps, math.Inf(1)
	// Radial interval: a t² + b t + c ≤ 0.
	qa, qb, qc := r3.Dot(dp, dp), 2*r3.Dot(wp, dp), r3.Dot(wp, wp)-c.Radius*c.Radius
	if qa < 1e-300 {
		if qc > 0 {
			return false
		}
	} else {
		disc := qb*qb - 4*qa*qc
		if disc < 0 {
			return false
		}
		sq := math.Sqrt(disc)
		// Numerically stable roots (Press et al. 2007, Numerical Recipes
		// 3rd ed., eq. 5.6.4, from memory).
		q := -0.5 * (qb + math.Copysign(sq, qb))
		t1, t2 := q/qa, qc/q
		if q == 0 {
			t1, t2 = 0, 0
		}
		if t1 > t2 {
			t1, t2 = t2, t1
		}
		lo, hi = math.Max(lo, t1), math.Min(hi, t2)
	}
	// Axial slab: 0 ≤ ws + t·ds ≤ L.
	if ds == 0 {
		if ws < 0 || ws > L {
			return false
		}
	} else {
		s1, s2 := -ws/ds, (L-ws)/ds
		if s1 > s2 {
			s1, s2 = s2, s1
		}
		lo, hi = math.Max(lo, s1), math.Min(hi, s2)
	}
	return lo <= hi
}

// Obstructed is a Viewer mounted at Position (body frame) whose view is
// blocked by Obstacles. Sun and albedo rays are treated as parallel, so a
// direction is blocked when the ray from the mount position meets a shape.
type Obstructed struct {
	View      Viewer
	Position  r3.Vec
	Obstacles []Obstacle
}

// Sees implements Viewer.
func (o Obstructed) Sees(d r3.Vec) bool {
	if !o.View.Sees(d) {
		return false
	}
	for _, ob := range o.Obstacles {
		if ob.Blocks(o.Position, d) {
			return false
		}
	}
	return true
}
