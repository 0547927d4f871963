package albedo

import "math"

// capGeometry holds the cells of an equal-solid-angle partition of the Earth's
// disc as seen from radius r, in the cap frame (z toward the spacecraft, origin
// at the Earth's centre). It is built once per radius and only read afterwards.
type capGeometry struct {
	rKm       float64
	halfWidth float64 // half the angular size of a cell, √a/2 rad
	cells     []cell
}

// cell is one cell of the visible Earth disc.
type cell struct {
	px, py, pz float64 // unit outward surface normal where the cell's central ray meets the Earth
	ux, uy, uz float64 // unit direction from the spacecraft toward that point
	g          float64 // ω/π with ω the cell's solid angle: Σ g·cos θ_sensor is the view factor
}

// build fills geo with n cells for a spacecraft at radius rKm > EarthRadiusKm.
// It reuses geo.cells when its capacity allows, so a rebuild does not allocate.
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
func (geo *capGeometry) build(rKm float64, n int) {
	if cap(geo.cells) < n {
		geo.cells = make([]cell, 0, n)
	}
	geo.cells = geo.cells[:0]
	geo.rKm = rKm
	re := EarthRadiusKm
	sinη := re / rKm
	η := math.Asin(sinη)
	cosη := math.Cos(η)
	a := 2 * math.Pi * (1 - cosη) / float64(n) // solid angle per cell, sr
	geo.halfWidth = 0.5 * math.Sqrt(a)

	add := func(α, φ float64) {
		sα, cα := math.Sincos(α)
		sφ, cφ := math.Sincos(φ)
		ux, uy, uz := sα*cφ, sα*sφ, -cα
		// First intersection of the ray with the sphere: t = r cos α − √(Rₑ² − r² sin² α).
		t := rKm*cα - math.Sqrt(max(0, re*re-rKm*rKm*sα*sα))
		geo.cells = append(geo.cells, cell{
			px: t * ux / re, py: t * uy / re, pz: (rKm + t*uz) / re,
			ux: ux, uy: uy, uz: uz,
			g: a / math.Pi,
		})
	}

	add(0, 0) // polar cell: cone of solid angle a around nadir
	if n == 1 {
		return
	}
	cosα1 := 1 - a/(2*math.Pi)
	α1 := math.Acos(cosα1)
	rings := int(math.Round((η - α1) / math.Sqrt(a)))
	if rings < 1 {
		rings = 1
	}
	width := (η - α1) / float64(rings)
	left := n - 1
	carry := 0.0
	cosTop := cosα1
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
		cosBot := cosTop - float64(count)*a/(2*math.Pi)
		if i == rings-1 {
			cosBot = cosη
		}
		αc := math.Acos(0.5 * (cosTop + cosBot)) // solid-angle midpoint of the ring
		step := 2 * math.Pi / float64(count)
		offset := 0.5 * step * float64(i%2)
		for j := range count {
			add(αc, offset+(float64(j)+0.5)*step)
		}
		cosTop = cosBot
	}
}
