package illum

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

const deg = math.Pi / 180

// Lens-area checks of the shadow function ν (closed form).
func TestVisibleFractionLens(t *testing.T) {
	cases := []struct {
		name    string
		a, b, c float64 // degrees
		want    float64
		region  Region
	}{
		// a = b = c: two equal discs through each other's centres; lens area
		// a²(2π/3 − √3/2) (closed form).
		{"equal discs", 0.5, 0.5, 0.5, 1 - (2*math.Pi/3-math.Sqrt(3)/2)/math.Pi, Penumbra},
		// Sun half covered when c = b and a ≪ b tends to 1/2; the exact values
		// for a = 0.25, b = 1 come from the same lens formula evaluated by hand
		// in REFERENCE-VALUES (calc), re-derived below by numeric integration.
		{"small sun c=b", 0.25, 1, 1, 0.526567, Penumbra},
		{"small sun c=1.1", 0.25, 1, 1.1, 0.766714, Penumbra},
		{"small sun c=0.9", 0.25, 1, 0.9, 0.274442, Penumbra},
		{"sunlit", 0.25, 1, 1.25, 1, Sunlit},
		{"umbra", 0.25, 1, 0.75, 0, Umbra},
		// Annular: ν = 1 − b²/a² (closed form).
		{"annular", 1, 0.5, 0.2, 0.75, Annular},
	}
	for _, c := range cases {
		got, reg := visibleFraction(c.a*deg, c.b*deg, c.c*deg)
		if math.Abs(got-c.want) > 1e-6 || reg != c.region {
			t.Errorf("%s: ν = %.7f %v, want %.7f %v", c.name, got, reg, c.want, c.region)
		}
		if c.region == Penumbra {
			if num := numericFraction(c.a, c.b, c.c); math.Abs(num-got) > 2e-4 {
				t.Errorf("%s: ν = %.6f, grid integration %.6f", c.name, got, num)
			}
		}
	}
}

// numericFraction integrates the visible part of the solar disc on a grid
// (independent brute-force check of the lens formula).
func numericFraction(a, b, c float64) float64 {
	const n = 1500
	in, vis := 0, 0
	for i := range n {
		x := -a + (float64(i)+0.5)*2*a/n
		for j := range n {
			y := -a + (float64(j)+0.5)*2*a/n
			if x*x+y*y > a*a {
				continue
			}
			in++
			if (x-c)*(x-c)+y*y > b*b {
				vis++
			}
		}
	}
	return float64(vis) / float64(in)
}

// Continuity and monotonicity of ν through the penumbra (closed form).
func TestVisibleFractionContinuousMonotonic(t *testing.T) {
	a, b := 0.2667*deg, 70*deg
	prev := -1.0
	for c := b - a - 1e-6; c <= b+a+1e-6; c += (2 * a) / 2000 {
		ν, _ := visibleFraction(a, b, c)
		if ν < prev-1e-12 {
			t.Fatalf("ν decreases at c = %g: %g < %g", c, ν, prev)
		}
		prev = ν
	}
	for _, edge := range []struct{ c, want float64 }{{b - a, 0}, {b + a, 1}} {
		for _, dc := range []float64{-1e-9, 1e-9} {
			ν, _ := visibleFraction(a, b, edge.c+dc)
			if math.Abs(ν-edge.want) > 1e-4 {
				t.Errorf("ν(c=%g%+g) = %g, want ≈ %g", edge.c, dc, ν, edge.want)
			}
		}
	}
}

func TestShadowConicalGeometries(t *testing.T) {
	au := 149597870.7
	sun := r3.Vec{X: au}
	r := EarthRadiusKm + 500
	for _, c := range []struct {
		name string
		sat  r3.Vec
		want Region
	}{
		{"day side", r3.Vec{X: r}, Sunlit},
		{"midnight", r3.Vec{X: -r}, Umbra},
		{"terminator", r3.Vec{X: -1, Y: r}, Sunlit},
		{"30 km inside the cylinder", r3.Vec{X: -r * 0.5, Y: EarthRadiusKm - 30}, Umbra},
		// The umbra cone narrows by 3439·tan 0.264° ≈ 16 km at x = −3439 km
		// (closed form), so 1 km inside the cylinder is penumbra.
		{"1 km inside the cylinder", r3.Vec{X: -r * 0.5, Y: EarthRadiusKm - 1}, Penumbra},
		{"far beyond the umbra tip", r3.Vec{X: -3e6}, Annular},
	} {
		lit, reg := ShadowConical(c.sat, sun)
		if reg != c.want {
			t.Errorf("%s: region %v, want %v (lit %g)", c.name, reg, c.want, lit)
		}
		cyl := ShadowCylindrical(c.sat, sun)
		if c.want != Annular && c.want != Penumbra && (cyl == 1) != (c.want == Sunlit) {
			t.Errorf("%s: cylindrical %g disagrees with conical %v", c.name, cyl, reg)
		}
	}
	// On the shadow axis at 3e6 km: a = asin(R☉/d), b = asin(Rₑ/r),
	// ν = 1 − b²/a² (closed form).
	sat := r3.Vec{X: -3e6}
	a := math.Asin(SunRadiusKm / (au + 3e6))
	b := math.Asin(EarthRadiusKm / 3e6)
	lit, _ := ShadowConical(sat, sun)
	if want := 1 - b*b/(a*a); math.Abs(lit-want) > 1e-12 {
		t.Errorf("annular ν = %g, want %g", lit, want)
	}
}

// Conical penumbra cone half-angle asin((R☉+Rₑ)/AU) = 0.269011° vs the umbra
// 0.264125° (closed form): a point at the penumbra edge on the tangent ray.
func TestShadowConicalPenumbraOnRay(t *testing.T) {
	au := 149597870.7
	sun := r3.Vec{X: au}
	// A circle of radius 7000 km crossing behind the Earth: ν goes 1 → 0
	// monotonically as the point moves from the terminator to midnight.
	prev := 2.0
	for k := 0; k <= 20000; k++ {
		θ := math.Pi/2 + float64(k)/20000*math.Pi/2
		sat := r3.Vec{X: 7000 * math.Cos(θ), Y: 7000 * math.Sin(θ)}
		lit, _ := ShadowConical(sat, sun)
		if lit > prev+1e-12 {
			t.Fatalf("ν rises at θ = %g°", θ/deg)
		}
		prev = lit
	}
	if prev != 0 {
		t.Errorf("ν at midnight = %g, want 0", prev)
	}
}

func TestShadowConicalAllocs(t *testing.T) {
	sun := r3.Vec{X: 1.496e8}
	sat := r3.Vec{X: -3000, Y: 6300}
	if n := testing.AllocsPerRun(100, func() { ShadowConical(sat, sun) }); n != 0 {
		t.Errorf("ShadowConical allocates %v times", n)
	}
}
