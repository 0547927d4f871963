package albedo

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// capGeometry holds the cells of an equal-solid-angle partition of the Earth's
// disc as seen from radius r, in the cap frame (z toward the spacecraft, origin
// at the Earth's centre). It is built once per radius and only read afterwards.
type capGeometry struct {
	rKm            float64
	halfWidth      float64 // half the angular size of a cell, √a/2 rad
	η              float64 // angular radius of the Earth's disc seen from rKm, rad
	cellSolidAngle float64 // a, sr; the same for every cell
	cells          []cell
	rings          []ring // the polar cell, then the rings outward; they tile cells in order
}

// ring is one ring of cells (the polar cell is a ring of one): cells
// [start, start+count) at azimuths offset + (j + ½)·step, j = 0…count−1,
// whose mean arrival directions are u_j = (k cos φ_j, k sin φ_j, −cα).
type ring struct {
	start, count int
	k, cα        float64
	offset, step float64
}

// cell is one cell of the visible Earth disc.
type cell struct {
	px, py, pz float64 // mean over the cell of the unit outward surface normal where its rays meet the Earth
	ux, uy, uz float64 // mean over the cell of the unit direction from the spacecraft toward the Earth
	g          float64 // ω/π with ω the cell's solid angle: Σ g·cos θ_sensor is the view factor
}

// build fills geo with n cells for a spacecraft at radius rKm > EarthRadiusKm.
// It reuses geo.cells when its capacity allows, so a rebuild does not allocate.
// gx, gw are Gauss–Legendre nodes and weights on [−1, 1] for the radial means.
//
// The cells partition the cone of directions that meet the Earth (nadir angle
// α ≤ η, sin η = Rₑ/r) into n cells of equal solid angle. Equal solid angle,
// rather than equal Earth area, keeps the integrand L·cos θ smooth across the
// cells; equal Earth area under-weights the peak of 1/d² below the spacecraft
// (1 % low for a nadir plate at 400 km with 1500 cells, measured).
//
// Partition: one polar cell around nadir, then rings whose cell counts
// follow the recursive zonal equal-area rule of Leopardi 2006 (Electron.
// Trans. Numer. Anal. 25, pp. 309–327, from memory): nominal rings of width
// √a, counts rounded with carried remainder, ring edges then moved so that
// every cell has exactly the solid angle a = 2π(1 − cos η)/n.
//
// Each cell stores the means over its solid angle of the arrival direction u
// and of the surface normal P̂, not their values at the centre: the cosine
// sensor weight n·u and the sunlit factor P̂·ŝ are linear in them, so a cell
// wholly in view and wholly lit is integrated exactly in each factor. The
// azimuthal mean is the factor sin(Δφ/2)/(Δφ/2) (closed form); the radial mean
// over x = cos α is taken with Gauss–Legendre after x = cos η + (x₀ − cos η)v²,
// which removes the √ behaviour of P̂ at the Earth's limb.
func (geo *capGeometry) build(rKm float64, n int, gx, gw []float64) {
	if cap(geo.cells) < n {
		geo.cells = make([]cell, 0, n)
	}
	geo.cells = geo.cells[:0]
	geo.rings = geo.rings[:0]
	geo.rKm = rKm
	re := EarthRadiusKm
	sinη := re / rKm
	η := math.Asin(sinη)
	cosη := math.Cos(η)
	a := 2 * math.Pi * (1 - cosη) / float64(n) // solid angle per cell, sr
	geo.halfWidth = 0.5 * math.Sqrt(a)
	geo.η = η
	geo.cellSolidAngle = a

	// ringMeans returns the means over x = cos α ∈ [xb, xt] (uniform in x,
	// i.e. in solid angle) of sin α, cos α, the cylindrical radius ρ and the
	// height z of the unit surface normal where the ray meets the Earth.
	ringMeans := func(xb, xt float64) (sα, cα, ρ, z float64) {
		span := xt - cosη
		vlo := math.Sqrt(max(0, (xb-cosη)/span))
		var sum float64
		for k := range gx {
			v := vlo + (1-vlo)*0.5*(gx[k]+1)
			x := cosη + span*v*v
			w := gw[k] * 0.5 * (1 - vlo) * 2 * span * v // dx = 2 span v dv
			sa := math.Sqrt(max(0, 1-x*x))
			t := rKm*x - math.Sqrt(max(0, re*re-rKm*rKm*sa*sa)) // range to the surface
			sα += w * sa
			ρ += w * t * sa / re
			z += w * (rKm - t*x) / re
			sum += w
		}
		// sum = xt − xb up to rounding; the cos α mean is exact.
		return sα / sum, 0.5 * (xb + xt), ρ / sum, z / sum
	}
	add := func(xb, xt float64, count int) {
		sα, cα, ρ, z := ringMeans(xb, xt)
		step := 2 * math.Pi / float64(count)
		k := 1.0 // azimuthal mean of cos φ about the centre: sin(Δφ/2)/(Δφ/2)
		offset := 0.0
		if count > 1 {
			k = math.Sin(step/2) / (step / 2)
			offset = 0.5 * step * float64(len(geo.cells)%2)
		} else {
			k = 0
		}
		geo.rings = append(geo.rings, ring{start: len(geo.cells), count: count, k: k * sα, cα: cα, offset: offset, step: step})
		for j := range count {
			sφ, cφ := math.Sincos(offset + (float64(j)+0.5)*step)
			geo.cells = append(geo.cells, cell{
				px: k * ρ * cφ, py: k * ρ * sφ, pz: z,
				ux: k * sα * cφ, uy: k * sα * sφ, uz: -cα,
				g: a / math.Pi,
			})
		}
	}

	xt := 1.0
	x1 := 1 - a/(2*math.Pi)
	add(x1, xt, 1) // polar cell: cone of solid angle a around nadir
	if n == 1 {
		return
	}
	α1 := math.Acos(x1)
	rings := int(math.Round((η - α1) / math.Sqrt(a)))
	if rings < 1 {
		rings = 1
	}
	width := (η - α1) / float64(rings)
	left := n - 1
	carry := 0.0
	xt = x1
	for i := range rings {
		var count int
		if i == rings-1 {
			count = left
		} else {
			lo, hi := α1+float64(i)*width, α1+float64(i+1)*width
			ideal := 2*math.Pi*(math.Cos(lo)-math.Cos(hi))/a + carry
			count = int(math.Round(ideal))
			count = max(1, min(count, left-(rings-1-i)))
			carry = ideal - float64(count)
		}
		left -= count
		xb := xt - float64(count)*a/(2*math.Pi)
		if i == rings-1 {
			xb = cosη
		}
		add(xb, xt, count)
		xt = xb
	}
}

// span is a run of cells [lo, hi) of the cap.
type span struct{ lo, hi int }

// windowSlack lowers a ring's threshold on n·u, so that the rounding of
// the exact test (about 1e-16) never keeps a cell the window dropped.
const windowSlack = 1e-12

// windowMargin widens a ring's window in azimuth (rad) so that rounding in
// its bounds never drops a cell the exact test would keep.
const windowMargin = 1e-6

// window appends to dst, in increasing cell order, the runs of ring rg's
// cells that may have n·u > outer (n a cap-frame unit vector): a superset
// of the cells that pass the exact test, which the caller still applies,
// so the sum over the runs adds the same terms in the same order as a sum
// over every cell. With n·u_j = k·hn·cos(φ_j − ψ) − n_z·cα (hn, ψ the
// length and azimuth of n's horizontal part) the test holds on one arc of
// azimuths |φ_j − ψ| < Δ, cos Δ = (outer + n_z·cα)/(k·hn).
func (rg *ring) window(dst []span, hn, ψ, nz, outer float64) []span {
	end := rg.start + rg.count
	kh := rg.k * hn
	// The slack: the exact test's products round differently from these.
	lim := outer + nz*rg.cα - windowSlack
	if rg.count == 1 || kh <= 0 {
		if lim < 0 || rg.count == 1 {
			return append(dst, span{rg.start, end})
		}
		return dst
	}
	τ := lim / kh
	if τ >= 1 {
		return dst
	}
	if τ <= -1 {
		return append(dst, span{rg.start, end})
	}
	Δ := math.Acos(τ) + windowMargin
	lo := int(math.Ceil((ψ-Δ-rg.offset)/rg.step - 0.5))
	hi := int(math.Floor((ψ+Δ-rg.offset)/rg.step - 0.5))
	n := hi - lo + 1
	if n >= rg.count {
		return append(dst, span{rg.start, end})
	}
	if n <= 0 {
		return dst
	}
	m := lo % rg.count
	if m < 0 {
		m += rg.count
	}
	if m+n <= rg.count {
		return append(dst, span{rg.start + m, rg.start + m + n})
	}
	return append(dst, span{rg.start, rg.start + m + n - rg.count}, span{rg.start + m, end})
}

// windows returns, in increasing cell order, runs of cells holding every
// cell with n·u > outer (n a cap-frame unit vector), reusing dst. full
// returns every cell (the reference for the tests).
func (geo *capGeometry) windows(dst []span, n r3.Vec, outer float64, full bool) []span {
	dst = dst[:0]
	if full {
		return append(dst, span{0, len(geo.cells)})
	}
	hn := math.Hypot(n.X, n.Y)
	ψ := math.Atan2(n.Y, n.X)
	for i := range geo.rings {
		dst = geo.rings[i].window(dst, hn, ψ, n.Z, outer)
	}
	return dst
}
