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
		lo, hi = max(lo, t1), min(hi, t2)
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
		lo, hi = max(lo, s1), min(hi, s2)
	}
	return lo <= hi
}

// Box is a solid axis-aligned box Centre ± Half (half extents ≥ 0): the
// bus outline, or a box-shaped body part.
type Box struct {
	Centre, Half r3.Vec
}

// Blocks implements Obstacle by the slab method: the ray is inside the box
// for t in the intersection of its three slab intervals, and it meets the
// box when that intersection holds some t > rayEps (Kay & Kajiya 1986,
// SIGGRAPH 20(4) 269–278, from memory). A sensor on a face looking out of
// the box is not blocked: its interval ends at t = 0.
func (b Box) Blocks(o, d r3.Vec) bool {
	lo, hi := rayEps, math.Inf(1)
	for _, ax := range [3][3]float64{
		{o.X - b.Centre.X, d.X, b.Half.X},
		{o.Y - b.Centre.Y, d.Y, b.Half.Y},
		{o.Z - b.Centre.Z, d.Z, b.Half.Z},
	} {
		p, v, h := ax[0], ax[1], ax[2]
		if v == 0 {
			if p < -h || p > h {
				return false
			}
			continue
		}
		t1, t2 := (-h-p)/v, (h-p)/v
		if t1 > t2 {
			t1, t2 = t2, t1
		}
		lo, hi = max(lo, t1), min(hi, t2)
		if lo > hi {
			return false
		}
	}
	return true
}

// ClearAbove reports whether Blocks(o, d) is false, as computed, for every
// direction d with d·n > 0: n is exactly an outward axis normal of the box
// (one component ±1, the others 0) and o lies exactly on that face's plane
// (o − Centre equals ±Half along that axis, bit for bit). Then the face's
// slab interval, computed in Blocks, ends at t = ±0 < rayEps, so the
// intersection is empty whatever the other axes give (closed form). The
// step loop drops such a box from a sensor's obstruction test: a sensor on
// the bus looking out of its face, whose mounting plane already hides
// every direction with d·n ≤ FacePlaneMargin.
func (b Box) ClearAbove(o, n r3.Vec) bool {
	on := func(p, c, h, ni float64) bool {
		return ni == 1 && p-c == h || ni == -1 && p-c == -h
	}
	switch {
	case n.Y == 0 && n.Z == 0:
		return on(o.X, b.Centre.X, b.Half.X, n.X)
	case n.X == 0 && n.Z == 0:
		return on(o.Y, b.Centre.Y, b.Half.Y, n.Y)
	case n.X == 0 && n.Y == 0:
		return on(o.Z, b.Centre.Z, b.Half.Z, n.Z)
	}
	return false
}

// Obstructed is a Viewer mounted at Position (body frame) on a surface of
// outward normal Face, whose view is blocked by Obstacles. A direction at
// or behind the mounting plane (d·Face ≤ FacePlaneMargin) is never seen, whatever the
// field of view: the sensor cannot look through the surface it sits on. A
// zero Face means no mounting plane; Face and the directions are unit
// vectors. Sun and albedo rays are treated as
// parallel, so a direction is blocked when the ray from the mount position
// meets a shape.
type Obstructed struct {
	View      Viewer
	Position  r3.Vec
	Face      r3.Vec
	Obstacles []Obstacle
}

// FacePlaneMargin is how far above its mounting plane (the sine of the
// elevation, about 0.2″) a direction must be for a sensor to see it. Light
// at grazing incidence on the surface a sensor sits on is not collected,
// and the margin keeps a sun that an attitude law places exactly in that
// plane (a sun-pointing law with the sun axis along a face) from being seen
// or not by floating-point rounding: a 1e-9 rad turn of the attitude never
// crosses it.
const FacePlaneMargin = 1e-6

// Hidden reports whether the mounting plane or an obstacle hides the body
// direction d from the mount position (the field of view aside). A
// pointer receiver: the step loop asks it for every sensor at every step,
// without copying the value.
func (o *Obstructed) Hidden(d r3.Vec) bool {
	if o.Face != (r3.Vec{}) && !(r3.Dot(d, o.Face) > FacePlaneMargin) {
		return true
	}
	for _, ob := range o.Obstacles {
		if ob.Blocks(o.Position, d) {
			return true
		}
	}
	return false
}

// Sees implements Viewer.
func (o *Obstructed) Sees(d r3.Vec) bool {
	return o.View.Sees(d) && !o.Hidden(d)
}

// Plate is a flat surface (a solar panel) sampled at points: the share of
// its points from which a body direction is neither behind the plate's
// plane nor blocked by an obstacle is the share of the plate the sun
// reaches from there (parallel rays; the points stand for equal areas).
type Plate struct {
	Points    []r3.Vec
	Face      r3.Vec // outward unit normal of the lit side
	Obstacles []Obstacle
}

// PlateSamplesPerSide is the sample grid of NewPlate: 8 × 8 cell centres,
// so a lit share is a multiple of 1/64.
const PlateSamplesPerSide = 8

// PlateAxes returns the in-plane axes of a plate of unit normal n: u is
// the body axis (X, Y or Z, the first on a tie) least aligned with n,
// projected into the plane and normalised, and v = n × u.
func PlateAxes(n r3.Vec) (u, v r3.Vec) {
	axes := [3]r3.Vec{{X: 1}, {Y: 1}, {Z: 1}}
	best := 0
	for i, a := range axes {
		if math.Abs(r3.Dot(a, n)) < math.Abs(r3.Dot(axes[best], n))-1e-12 {
			best = i
		}
	}
	a := axes[best]
	u = r3.Unit(r3.Sub(a, r3.Scale(r3.Dot(a, n), n)))
	return u, r3.Cross(n, u)
}

// NewPlate samples the rectangle of side lengths sizeU × sizeV (m) centred
// on centre with unit normal n (axes from PlateAxes) at the centres of a
// PlateSamplesPerSide² grid of equal cells.
func NewPlate(centre, n r3.Vec, sizeU, sizeV float64, obstacles []Obstacle) Plate {
	u, v := PlateAxes(n)
	const k = PlateSamplesPerSide
	pts := make([]r3.Vec, 0, k*k)
	for i := range k {
		a := ((float64(i)+0.5)/k - 0.5) * sizeU
		for j := range k {
			b := ((float64(j)+0.5)/k - 0.5) * sizeV
			pts = append(pts, r3.Add(centre, r3.Add(r3.Scale(a, u), r3.Scale(b, v))))
		}
	}
	// An obstacle wholly at or behind the plate's plane cannot block a ray
	// that leaves the plate's front (d·n > 0): leave it out.
	var front []Obstacle
	for _, ob := range obstacles {
		if !behindPlane(ob, centre, n) {
			front = append(front, ob)
		}
	}
	return Plate{Points: pts, Face: n, Obstacles: front}
}

// behindPlane reports whether an obstacle lies wholly at or behind the
// plane through p of normal n (its corners, or its axis ends less its
// radius, have (x − p)·n ≤ 1e-12); false for a shape it does not know.
func behindPlane(ob Obstacle, p, n r3.Vec) bool {
	below := func(x r3.Vec, r float64) bool { return r3.Dot(r3.Sub(x, p), n)+r <= 1e-12 }
	switch o := ob.(type) {
	case Box:
		for _, sx := range []float64{-1, 1} {
			for _, sy := range []float64{-1, 1} {
				for _, sz := range []float64{-1, 1} {
					if !below(r3.Add(o.Centre, r3.Vec{X: sx * o.Half.X, Y: sy * o.Half.Y, Z: sz * o.Half.Z}), 0) {
						return false
					}
				}
			}
		}
		return true
	case Rectangle:
		for _, a := range []float64{-1, 1} {
			for _, b := range []float64{-1, 1} {
				if !below(r3.Add(o.Centre, r3.Add(r3.Scale(a, o.HalfU), r3.Scale(b, o.HalfV))), 0) {
					return false
				}
			}
		}
		return true
	case Cylinder:
		return below(o.A, o.Radius) && below(o.B, o.Radius)
	}
	return false
}

// PlateRectangle returns the outline of the plate NewPlate samples, as an
// obstacle for other shapes.
func PlateRectangle(centre, n r3.Vec, sizeU, sizeV float64) Rectangle {
	u, v := PlateAxes(n)
	return Rectangle{Centre: centre, HalfU: r3.Scale(sizeU/2, u), HalfV: r3.Scale(sizeV/2, v)}
}

// LitShare returns the share of the plate's points that see the body
// direction d (unit vector); 0 at or behind the plate's plane. It
// allocates nothing.
func (p Plate) LitShare(d r3.Vec) float64 {
	if len(p.Points) == 0 || !(r3.Dot(d, p.Face) > FacePlaneMargin) {
		return 0
	}
	lit := 0
	for _, q := range p.Points {
		blocked := false
		for _, ob := range p.Obstacles {
			if ob.Blocks(q, d) {
				blocked = true
				break
			}
		}
		if !blocked {
			lit++
		}
	}
	return float64(lit) / float64(len(p.Points))
}
