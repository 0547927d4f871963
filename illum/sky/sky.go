package sky

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// Viewer reports whether a body-frame unit direction is in view.
type Viewer interface {
	Sees(dirBody r3.Vec) bool
}

// ViewerFunc adapts a function to Viewer.
type ViewerFunc func(dirBody r3.Vec) bool

// Sees implements Viewer.
func (f ViewerFunc) Sees(d r3.Vec) bool { return f(d) }

// Cone is a circular field of view: directions within HalfAngle of Axis.
// Build it with NewCone so the cosine is computed once.
type Cone struct {
	axis    r3.Vec
	cosHalf float64
}

// NewCone returns a cone of the given half-angle (radians) about axis.
func NewCone(axis r3.Vec, halfAngle float64) Cone {
	return Cone{axis: r3.Unit(axis), cosHalf: math.Cos(halfAngle)}
}

// Sees implements Viewer: d·â ≥ cos(half-angle).
func (c Cone) Sees(d r3.Vec) bool { return r3.Dot(d, c.axis) >= c.cosHalf }

// Lattice is a set of unit directions of equal area 4π/len(Dirs).
type Lattice struct {
	Dirs []r3.Vec
}

// DefaultPoints is the default lattice size: mean spacing √(4π/N) ≈ 0.81°.
const DefaultPoints = 1 << 16

// Fibonacci returns the golden-spiral lattice of n points (González 2010,
// Math. Geosci. 42, eq. 2–3, from memory): z_i = 1 − (2i+1)/n and
// longitude 2πi/φ with φ the golden ratio. Each point stands for an equal
// area; the z values are equally spaced, so zonal areas are exact to 1/n.
func Fibonacci(n int) (Lattice, error) {
	if n < 1 {
		return Lattice{}, fmt.Errorf("sky: lattice points = %d; use at least 1 (default %d)", n, DefaultPoints)
	}
	φ := (1 + math.Sqrt(5)) / 2
	d := make([]r3.Vec, n)
	for i := range d {
		z := 1 - (2*float64(i)+1)/float64(n)
		ρ := math.Sqrt(1 - z*z)
		// The fractional part of i/φ ≥ 0: x − ⌊x⌋ is exact (Sterbenz), so
		// it is math.Mod(x, 1) bit for bit at a fraction of its cost.
		x := float64(i) / φ
		λ := 2 * math.Pi * (x - math.Floor(x))
		s, c := math.Sincos(λ)
		d[i] = r3.Vec{X: ρ * c, Y: ρ * s, Z: z}
	}
	return Lattice{Dirs: d}, nil
}

// SpacingDeg returns the mean point spacing √(4π/N) in degrees.
func (l Lattice) SpacingDeg() float64 {
	return math.Sqrt(4*math.Pi/float64(len(l.Dirs))) * 180 / math.Pi
}

// MaxLevel is the highest "seen by at least k" level reported.
const MaxLevel = 3

// Result holds sphere fractions seen by at least k viewers, k = 1..MaxLevel
// (index k; index 0 is always 1), and the single-failure worst case.
type Result struct {
	Points  int                   // lattice points used
	AtLeast [MaxLevel + 1]float64 // fraction seen by ≥ k viewers
	// WithoutEach[i][k] is AtLeast[k] with viewer i removed.
	WithoutEach [][MaxLevel + 1]float64
	// WorstOneFailed[k] is the minimum of WithoutEach[·][k]; Critical[k]
	// the viewer whose loss gives it (lowest index on ties, −1 with no viewers).
	WorstOneFailed [MaxLevel + 1]float64
	Critical       [MaxLevel + 1]int
}

// Coverage counts, at each lattice point, the viewers that see it and
// returns the fractions of the sphere seen by ≥ 1, 2, 3 viewers, and the
// same fractions with each viewer removed in turn (N−1). Removing viewer i
// lowers the count by one exactly where i sees, so a point leaves level k
// when its count is k and i sees it.
func Coverage(viewers []Viewer, lat Lattice) (Result, error) {
	n := len(lat.Dirs)
	if n == 0 {
		return Result{}, errors.New("sky: lattice is empty; build one with Fibonacci(n), n ≥ 1")
	}
	nv := len(viewers)
	count := make([]int, n)
	seen := make([]bool, nv*n)
	for i, v := range viewers {
		row := seen[i*n : (i+1)*n]
		for p, d := range lat.Dirs {
			if v.Sees(d) {
				row[p] = true
				count[p]++
			}
		}
	}
	var atLeast [MaxLevel + 1]int
	for _, c := range count {
		for k := 0; k <= MaxLevel && k <= c; k++ {
			atLeast[k]++
		}
	}
	res := Result{Points: n, WithoutEach: make([][MaxLevel + 1]float64, nv)}
	for k := range atLeast {
		res.AtLeast[k] = float64(atLeast[k]) / float64(n)
		res.WorstOneFailed[k] = res.AtLeast[k]
		res.Critical[k] = -1
	}
	for i := range viewers {
		var lost [MaxLevel + 1]int
		row := seen[i*n : (i+1)*n]
		for p, s := range row {
			if s && count[p] <= MaxLevel {
				lost[count[p]]++
			}
		}
		for k := range lost {
			f := float64(atLeast[k]-lost[k]) / float64(n)
			res.WithoutEach[i][k] = f
			if res.Critical[k] < 0 || f < res.WorstOneFailed[k] {
				res.WorstOneFailed[k], res.Critical[k] = f, i
			}
		}
	}
	return res, nil
}

// Grid is an azimuth/elevation map of viewer counts in body axes. Azimuth
// is measured in the body x–y plane from +X toward +Y on [0°, 360°),
// elevation from that plane toward +Z on [−90°, 90°]. Cell (row e, column a)
// spans elevations [−90 + e·Δ, −90 + (e+1)·Δ] and azimuths [a·Δ, (a+1)·Δ];
// its count is taken at the cell centre.
type Grid struct {
	CellDeg  float64
	NAz, NEl int
	Counts   []int     // row-major, NEl rows of NAz
	RowArea  []float64 // solid angle of one cell in each row, as a fraction of 4π
}

// At returns the count of the cell at elevation row e, azimuth column a.
func (g Grid) At(e, a int) int { return g.Counts[e*g.NAz+a] }

// Centre returns the body-frame unit vector at the centre of cell (e, a).
func (g Grid) Centre(e, a int) r3.Vec {
	Δ := g.CellDeg * math.Pi / 180
	el := -math.Pi/2 + (float64(e)+0.5)*Δ
	az := (float64(a) + 0.5) * Δ
	se, ce := math.Sincos(el)
	sa, ca := math.Sincos(az)
	return r3.Vec{X: ce * ca, Y: ce * sa, Z: se}
}

// FractionAtLeast returns the cell-area-weighted fraction of the sphere
// with count ≥ k.
func (g Grid) FractionAtLeast(k int) float64 {
	f := 0.0
	for e := range g.NEl {
		for a := range g.NAz {
			if g.At(e, a) >= k {
				f += g.RowArea[e]
			}
		}
	}
	return f
}

// Map returns the azimuth/elevation count grid with square cells of
// cellDeg degrees, which must divide 180 into a whole number of rows.
func Map(viewers []Viewer, cellDeg float64) (Grid, error) {
	if !(cellDeg > 0) || cellDeg > 90 {
		return Grid{}, fmt.Errorf("sky: map cell = %g°; use a size in (0°, 90°] that divides 180°, e.g. 1 or 2", cellDeg)
	}
	nEl := int(math.Round(180 / cellDeg))
	if math.Abs(float64(nEl)*cellDeg-180) > 1e-9 {
		return Grid{}, fmt.Errorf("sky: map cell = %g° does not divide 180°; use e.g. 0.5, 1, 2 or 5", cellDeg)
	}
	g := Grid{CellDeg: cellDeg, NAz: 2 * nEl, NEl: nEl, Counts: make([]int, 2*nEl*nEl), RowArea: make([]float64, nEl)}
	Δ := cellDeg * math.Pi / 180
	// Column sines and cosines once; cell centres are then products.
	sa, ca := make([]float64, g.NAz), make([]float64, g.NAz)
	for a := range g.NAz {
		sa[a], ca[a] = math.Sincos((float64(a) + 0.5) * Δ)
	}
	for e := range nEl {
		lo, hi := -math.Pi/2+float64(e)*Δ, -math.Pi/2+float64(e+1)*Δ
		// Cell solid angle Δλ·(sin el₂ − sin el₁), closed form; over 4π.
		g.RowArea[e] = Δ * (math.Sin(hi) - math.Sin(lo)) / (4 * math.Pi)
		se, ce := math.Sincos(-math.Pi/2 + (float64(e)+0.5)*Δ)
		for a := range g.NAz {
			d := r3.Vec{X: ce * ca[a], Y: ce * sa[a], Z: se}
			c := 0
			for _, v := range viewers {
				if v.Sees(d) {
					c++
				}
			}
			g.Counts[e*g.NAz+a] = c
		}
	}
	return g, nil
}
