package illum

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// coneRadii are the penumbra and umbra cone radii at x km behind the Earth
// for a sun D km away (Montenbruck & Gill 2000, §3.4.2, dual-cone geometry;
// closed form), written out again here from apex and half-angle so that the
// test does not lean on clearRegion's own arithmetic.
func coneRadii(x, D float64) (pen, umb float64) {
	f1 := math.Asin((SunRadiusKm + EarthRadiusKm) / D)
	f2 := math.Asin((SunRadiusKm - EarthRadiusKm) / D)
	apex1 := EarthRadiusKm / math.Sin(f1) // in front of the Earth
	apex2 := EarthRadiusKm / math.Sin(f2) // behind the Earth
	return (apex1 + x) * math.Tan(f1), (apex2 - x) * math.Tan(f2)
}

func randomUnit(rng *rand.Rand) r3.Vec {
	z := 2*rng.Float64() - 1 // Archimedes' hat-box theorem (closed form)
	φ := 2 * math.Pi * rng.Float64()
	ρ := math.Sqrt(1 - z*z)
	return r3.Vec{X: ρ * math.Cos(φ), Y: ρ * math.Sin(φ), Z: z}
}

// unitPerp returns a random unit vector perpendicular to the unit vector u.
func unitPerp(rng *rand.Rand, u r3.Vec) r3.Vec {
	for {
		w := randomUnit(rng)
		p := r3.Sub(w, r3.Scale(r3.Dot(w, u), u))
		if n := vecmath.Norm(p); n > 0.1 {
			return r3.Scale(1/n, p)
		}
	}
}

// The fast path of ShadowConical must return exactly what the disc-angle
// computation returns, over 10⁶ random geometries from LEO to GEO: a third
// in random directions, the rest on either side of the penumbra and umbra
// cone surfaces at offsets from 1e-9·|r| to 1e-1·|r| (log-uniform), which
// spans the band that clearRegion leaves to the exact path.
func TestShadowConicalFastEqualsExact(t *testing.T) {
	const n = 1_000_000
	rng := rand.New(rand.NewPCG(2000, 342))
	const rMin, rMax = EarthRadiusKm + 150, 42164.0 + 2000 // LEO to beyond GEO
	var fastLit, fastUmbra, nearFast, inBand int
	for i := range n {
		ŝ := randomUnit(rng)
		D := (0.983 + 0.034*rng.Float64()) * auKm // perihelion to aphelion
		rSun := r3.Scale(D, ŝ)
		var sat r3.Vec
		kind := i % 3   // 0 random, 1 near the penumbra cone, 2 near the umbra cone
		var off float64 // signed offset outward from the chosen cone, km
		if kind == 0 {
			sat = r3.Scale(rMin+(rMax-rMin)*rng.Float64(), randomUnit(rng))
		} else {
			x := rMax * rng.Float64()
			pen, umb := coneRadii(x, D)
			ρ := pen
			if kind == 2 {
				ρ = umb
			}
			off = math.Hypot(x, ρ) * math.Pow(10, -9+8*rng.Float64())
			if rng.IntN(2) == 0 {
				off = -off
			}
			sat = r3.Add(r3.Scale(-x, ŝ), r3.Scale(ρ+off, unitPerp(rng, ŝ)))
			if r := vecmath.Norm(sat); r < rMin || r > rMax {
				sat = r3.Scale(rMin+(rMax-rMin)*rng.Float64(), randomUnit(rng))
				kind, off = 0, 0
			}
		}
		wantLit, wantReg := shadowConicalExact(sat, rSun)
		gotLit, gotReg := ShadowConical(sat, rSun)
		if gotLit != wantLit || gotReg != wantReg {
			t.Fatalf("sat %v sun %v: fast (%v, %v), exact (%v, %v)", sat, rSun, gotLit, gotReg, wantLit, wantReg)
		}
		reg, ok := clearRegion(sat, rSun)
		if ok {
			switch {
			case reg != wantReg:
				t.Fatalf("sat %v sun %v: clearRegion %v, exact %v", sat, rSun, reg, wantReg)
			case reg == Sunlit:
				fastLit++
			case reg == Umbra:
				fastUmbra++
			default:
				t.Fatalf("clearRegion decided %v", reg)
			}
		}
		if kind == 0 {
			continue
		}
		rel := math.Abs(off) / vecmath.Norm(sat)
		// Inside the band (offset below the margin, with 1% slack) the fast
		// path must not decide.
		if rel < 0.99*clearMargin {
			inBand++
			if ok {
				t.Fatalf("sat %v sun %v: %.3g·|r| from a cone, decided %v", sat, rSun, rel, reg)
			}
		}
		if ok && rel < 3*clearMargin {
			nearFast++
		}
		// The cones are where the disc angles say they are: beyond 1e-7·|r|
		// the exact computation is on the expected side.
		if rel > 1e-7 {
			switch {
			case kind == 1 && off > 0 && wantReg != Sunlit,
				kind == 1 && off < 0 && wantReg == Sunlit,
				kind == 2 && off < 0 && wantReg != Umbra,
				kind == 2 && off > 0 && wantReg == Umbra:
				t.Fatalf("cone %d offset %+.3g km: exact region %v", kind, off, wantReg)
			}
		}
	}
	t.Logf("fast sunlit %d, fast umbra %d, decided within 3 margins of a cone %d, in the band %d (of %d)",
		fastLit, fastUmbra, nearFast, inBand, n)
	// The test only means something if the fast path is taken often,
	// including just outside the band.
	if fastLit < n/4 || fastUmbra < n/20 || nearFast < 1000 || inBand < 10000 {
		t.Errorf("fast path too rarely exercised")
	}
}

// Inside the Earth, close to its surface, beyond the umbra tip and with an
// unphysically close sun the fast path stands aside (the bounds of
// clearRegion).
func TestClearRegionStandsAside(t *testing.T) {
	sun := r3.Vec{X: auKm}
	for _, c := range []struct {
		name     string
		sat, sun r3.Vec
	}{
		{"inside the Earth", r3.Vec{X: -3000}, sun},
		{"1 km above the surface", r3.Vec{Y: EarthRadiusKm + 1}, sun},
		{"beyond the umbra tip", r3.Vec{X: -3e6}, sun},
		{"sun at 0.1 au", r3.Vec{X: -7000}, r3.Scale(0.1, sun)},
	} {
		if reg, ok := clearRegion(c.sat, c.sun); ok {
			t.Errorf("%s: decided %v", c.name, reg)
		}
	}
}
