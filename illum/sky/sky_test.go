package sky

import (
	"bufio"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

const deg = math.Pi / 180

func mustLattice(t testing.TB, n int) Lattice {
	t.Helper()
	l, err := Fibonacci(n)
	if err != nil {
		t.Fatal(err)
	}
	return l
}

func mustCoverage(t testing.TB, v []Viewer, l Lattice) Result {
	t.Helper()
	r, err := Coverage(v, l)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

func faceCones(half float64) []Viewer {
	var v []Viewer
	for _, a := range []r3.Vec{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}, {Z: 1}, {Z: -1}} {
		v = append(v, NewCone(a, half))
	}
	return v
}

// A cone of half-angle θ covers (1 − cos θ)/2 of the sphere (closed form,
// area of a spherical capFrac 2π(1 − cos θ)).
func TestSingleCone(t *testing.T) {
	lat := mustLattice(t, DefaultPoints)
	worst := 0.0
	for _, axis := range []r3.Vec{{Z: 1}, {X: 1, Y: 0.3, Z: -0.2}, {X: -0.4, Y: 0.8, Z: 0.45}} {
		for _, θd := range []float64{5, 10, 30, 45, 60, 90, 120, 170} {
			got := mustCoverage(t, []Viewer{NewCone(axis, θd*deg)}, lat).AtLeast[1]
			want := (1 - math.Cos(θd*deg)) / 2
			worst = math.Max(worst, math.Abs(got-want))
		}
	}
	// Tolerance 2e-4 ≈ 13/N for N = 65536 (measured 1.4e-4).
	if worst > 2e-4 {
		t.Errorf("single-cone worst error %.3g > 2e-4", worst)
	}
	t.Logf("single-cone worst error %.3g with N = %d", worst, DefaultPoints)
}

// Six face-normal cones cover the sphere exactly when θ ≥ arccos(1/√3) =
// 54.7356° (closed form: the cube-corner direction is that far from the
// three nearest face normals).
func TestSixFaceConesFullCoverThreshold(t *testing.T) {
	lat := mustLattice(t, DefaultPoints)
	θc := math.Acos(1 / math.Sqrt(3))
	if math.Abs(θc/deg-54.7356) > 5e-5 {
		t.Fatalf("threshold %.6f°", θc/deg)
	}
	if f := mustCoverage(t, faceCones(θc+1e-9), lat).AtLeast[1]; f != 1 {
		t.Errorf("at %.4f° coverage %.6f, want 1", θc/deg, f)
	}
	if f := mustCoverage(t, faceCones(θc-1*deg), lat).AtLeast[1]; f >= 1 {
		t.Errorf("at %.4f° coverage %.6f, want < 1", θc/deg-1, f)
	}
	corner := r3.Unit(r3.Vec{X: 1, Y: 1, Z: 1})
	if n := seenBy(faceCones(θc-1e-9), corner); n != 0 {
		t.Errorf("just below the threshold the cube corner is seen by %d cones", n)
	}
	if n := seenBy(faceCones(θc+1e-9), corner); n != 3 {
		t.Errorf("just above the threshold the cube corner is seen by %d cones, want 3", n)
	}
}

func seenBy(v []Viewer, d r3.Vec) int {
	n := 0
	for _, x := range v {
		if x.Sees(d) {
			n++
		}
	}
	return n
}

// Against testdata/six_cones.csv (gen_coverage.py: semi-analytic quadrature
// with scipy, cross-checked by numpy Monte Carlo).
func TestSixFaceConesAgainstReference(t *testing.T) {
	f, err := os.Open("testdata/six_cones.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	lat := mustLattice(t, DefaultPoints)
	sc := bufio.NewScanner(f)
	rows, worst := 0, 0.0
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") || strings.HasPrefix(line, "half") {
			continue
		}
		var v [4]float64
		for i, s := range strings.Split(line, ",")[:4] {
			if v[i], err = strconv.ParseFloat(s, 64); err != nil {
				t.Fatal(err)
			}
		}
		r := mustCoverage(t, faceCones(v[0]*deg), lat)
		for k := 1; k <= 3; k++ {
			d := math.Abs(r.AtLeast[k] - v[k])
			worst = math.Max(worst, d)
			if d > 3e-4 {
				t.Errorf("θ = %g°, ≥%d: got %.6f, reference %.6f", v[0], k, r.AtLeast[k], v[k])
			}
		}
		rows++
	}
	if rows < 5 {
		t.Fatalf("read %d reference rows", rows)
	}
	t.Logf("six-cone worst error %.3g over %d rows (tolerance 3e-4)", worst, rows)
}

// Five cones on a triangular bipyramid (±Z and three equatorial axes 120°
// apart). The deepest holes lie at azimuth 60°, elevation arctan(1/2),
// arctan 2 = 63.4349° from the three nearest axes (closed form). This
// matches the 63.5° half-angle for five two-axis sensors to cover the whole
// sphere (Wertz 1978, ch. 7, from memory).
func bipyramid(half float64) []Viewer {
	v := []Viewer{NewCone(r3.Vec{Z: 1}, half), NewCone(r3.Vec{Z: -1}, half)}
	for k := range 3 {
		s, c := math.Sincos(float64(k) * 2 * math.Pi / 3)
		v = append(v, NewCone(r3.Vec{X: c, Y: s}, half))
	}
	return v
}

func TestFiveSensorBipyramid(t *testing.T) {
	lat := mustLattice(t, DefaultPoints)
	if f := mustCoverage(t, bipyramid(63.5*deg), lat).AtLeast[1]; f != 1 {
		t.Errorf("63.5°: coverage %.6f, want 1", f)
	}
	if f := mustCoverage(t, bipyramid(60.5*deg), lat).AtLeast[1]; f >= 1 {
		t.Errorf("60.5°: coverage %.6f, want < 1", f)
	}
	el := math.Atan(0.5)
	hole := r3.Vec{X: math.Cos(el) * math.Cos(60*deg), Y: math.Cos(el) * math.Sin(60*deg), Z: math.Sin(el)}
	if n := seenBy(bipyramid(63.4*deg), hole); n != 0 {
		t.Errorf("63.4°: hole seen by %d sensors, want 0", n)
	}
	// Covering radius from the lattice: the largest angle to the nearest axis.
	axes := []r3.Vec{{Z: 1}, {Z: -1}, {X: 1}, {X: -0.5, Y: math.Sqrt(3) / 2}, {X: -0.5, Y: -math.Sqrt(3) / 2}}
	maxMin := 0.0
	for _, d := range lat.Dirs {
		best := math.Pi
		for _, a := range axes {
			best = math.Min(best, math.Acos(math.Min(1, r3.Dot(d, a))))
		}
		maxMin = math.Max(maxMin, best)
	}
	if want := math.Atan(2); maxMin > want || want-maxMin > lat.SpacingDeg()*deg {
		t.Errorf("lattice covering radius %.4f°, closed form %.4f°", maxMin/deg, want/deg)
	}
}

// N−1 on a closed-form case: two identical +Z cones and one −Z cone of 30°.
func TestOneFailed(t *testing.T) {
	lat := mustLattice(t, DefaultPoints)
	capFrac := (1 - math.Cos(30*deg)) / 2
	v := []Viewer{NewCone(r3.Vec{Z: 1}, 30*deg), NewCone(r3.Vec{Z: 1}, 30*deg), NewCone(r3.Vec{Z: -1}, 30*deg)}
	r := mustCoverage(t, v, lat)
	tol := 1e-4
	check := func(name string, got, want float64) {
		t.Helper()
		if math.Abs(got-want) > tol {
			t.Errorf("%s = %.6f, want %.6f", name, got, want)
		}
	}
	check("≥1", r.AtLeast[1], 2*capFrac)
	check("≥2", r.AtLeast[2], capFrac)
	check("≥3", r.AtLeast[3], 0)
	check("≥1 without 0", r.WithoutEach[0][1], 2*capFrac)
	check("≥1 without 2", r.WithoutEach[2][1], capFrac)
	check("≥2 without 1", r.WithoutEach[1][2], 0)
	check("≥2 without 2", r.WithoutEach[2][2], capFrac)
	check("worst ≥1", r.WorstOneFailed[1], capFrac)
	check("worst ≥2", r.WorstOneFailed[2], 0)
	if r.Critical[1] != 2 || r.Critical[2] != 0 {
		t.Errorf("critical sensors %v, want ≥1: 2, ≥2: 0", r.Critical)
	}
}

func TestMap(t *testing.T) {
	g, err := Map([]Viewer{NewCone(r3.Vec{X: 0.3, Y: -1, Z: 0.5}, 40*deg)}, 1)
	if err != nil {
		t.Fatal(err)
	}
	if g.NAz != 360 || g.NEl != 180 {
		t.Fatalf("grid %d×%d", g.NAz, g.NEl)
	}
	if a := g.FractionAtLeast(0); math.Abs(a-1) > 1e-12 {
		t.Errorf("cell areas sum to %.15f, want 1", a)
	}
	want := (1 - math.Cos(40*deg)) / 2
	// Cell-centre sampling of a 1° grid: error about one cell row along the rim.
	if got := g.FractionAtLeast(1); math.Abs(got-want) > 1e-3 {
		t.Errorf("map cone fraction %.5f, want %.5f", got, want)
	}
	if c := g.Centre(90, 0); math.Abs(c.X-math.Cos(0.5*deg)*math.Cos(0.5*deg)) > 1e-15 || c.Z <= 0 {
		t.Errorf("centre of cell (90, 0) = %v", c)
	}
	for _, bad := range []float64{0, -1, 7, 100, math.NaN()} {
		if _, err := Map(nil, bad); err == nil || !strings.Contains(err.Error(), "map cell") {
			t.Errorf("cell %g: error %v", bad, err)
		}
	}
}

func TestBadLattice(t *testing.T) {
	if _, err := Fibonacci(0); err == nil || !strings.Contains(err.Error(), "lattice points") {
		t.Errorf("Fibonacci(0) error %v", err)
	}
	if _, err := Coverage(nil, Lattice{}); err == nil {
		t.Error("empty lattice accepted")
	}
}

// The map and the lattice agree on the six-cone layout to the map's
// cell-centre sampling error.
func TestMapAgreesWithCoverage(t *testing.T) {
	v := faceCones(70 * deg)
	g, err := Map(v, 1)
	if err != nil {
		t.Fatal(err)
	}
	r := mustCoverage(t, v, mustLattice(t, DefaultPoints))
	for k := 1; k <= 3; k++ {
		if d := math.Abs(g.FractionAtLeast(k) - r.AtLeast[k]); d > 2e-3 {
			t.Errorf("≥%d: map %.5f, lattice %.5f", k, g.FractionAtLeast(k), r.AtLeast[k])
		}
	}
	for e := range g.NEl {
		for a := range g.NAz {
			if g.At(e, a) != seenBy(v, g.Centre(e, a)) {
				t.Fatalf("cell (%d, %d): count %d, centre seen by %d", e, a, g.At(e, a), seenBy(v, g.Centre(e, a)))
			}
		}
	}
}

// The lattice's longitudes use x − ⌊x⌋ for math.Mod(x, 1): the same bits
// for every point of the default lattice and beyond.
func TestFibonacciFractionIsMod(t *testing.T) {
	φ := (1 + math.Sqrt(5)) / 2
	for i := range 1 << 20 {
		x := float64(i) / φ
		if a, b := x-math.Floor(x), math.Mod(x, 1); math.Float64bits(a) != math.Float64bits(b) {
			t.Fatalf("i = %d: %v against math.Mod %v", i, a, b)
		}
	}
}
