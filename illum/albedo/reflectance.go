package albedo

import (
	"fmt"
	"math"
)

// Reflectance gives the Lambertian reflectivity of the Earth's surface.
type Reflectance interface {
	// Reflectance returns the reflectivity in [0, 1] at geocentric latitude
	// lat and Earth-fixed east longitude lon (rad) at Julian date jdTT.
	Reflectance(lat, lon, jdTT float64) float64
}

// Uniform is the same reflectivity everywhere.
type Uniform struct {
	Albedo float64 // in [0, 1]; DefaultAlbedo is the design mean 0.30
}

// Reflectance implements Reflectance.
func (u Uniform) Reflectance(lat, lon, jdTT float64) float64 { return u.Albedo }

// Zonal is a second-degree Legendre fit of reflectivity against latitude with
// a seasonal first-degree term:
//
//	ρ(φ, t) = A0 + A1(t) P₁(sin φ) + A2 P₂(sin φ),
//	A1(t) = C0 + C1 cos ω(t − T0) + C2 sin ω(t − T0),  ω = 2π/365.25 d
//
// Knocke, Ries & Tapley 1988 (AIAA 88-4292), as reproduced in
// ECSS-E-ST-10-04C (2008) Annex F.5 (from memory).
type Zonal struct {
	A0, A2     float64
	C0, C1, C2 float64
	T0         float64 // Julian date of the seasonal phase origin
}

// KnockeZonal returns the published coefficients a0 = 0.34, c0 = 0,
// c1 = 0.10, c2 = 0, a2 = 0.29, t0 = JD 2444960.5 (1981-12-22)
// (Knocke, Ries & Tapley 1988 via ECSS-E-ST-10-04C Annex F.5; from memory).
func KnockeZonal() Zonal {
	return Zonal{A0: 0.34, C0: 0, C1: 0.10, C2: 0, A2: 0.29, T0: 2444960.5}
}

// Scaled returns the profile with every coefficient multiplied by f, so its
// global (area) mean A0 becomes f·A0 and its shape is kept: P₁ and P₂
// integrate to zero over the sphere (closed form). Where the scaled ρ leaves
// [0, 1] it is clamped, and the mean then differs from f·A0.
func (z Zonal) Scaled(f float64) Zonal {
	z.A0, z.A2, z.C0, z.C1, z.C2 = f*z.A0, f*z.A2, f*z.C0, f*z.C1, f*z.C2
	return z
}

// a1 returns the seasonal first-degree coefficient at jd.
func (z Zonal) a1(jd float64) float64 {
	const ω = 2 * math.Pi / 365.25
	s, c := math.Sincos(ω * (jd - z.T0))
	return z.C0 + z.C1*c + z.C2*s // ECSS-E-ST-10-04C F.5 (from memory)
}

// at returns ρ for sin φ = sφ with first-degree coefficient a1, clamped to [0, 1].
func (z Zonal) at(sφ, a1 float64) float64 {
	return min(1, max(0, z.unclamped(sφ, a1)))
}

// unclamped returns ρ for sin φ = sφ with first-degree coefficient a1.
func (z Zonal) unclamped(sφ, a1 float64) float64 {
	p2 := 0.5 * (3*sφ*sφ - 1) // P₂(x) = (3x² − 1)/2
	return z.A0 + a1*sφ + z.A2*p2
}

// inRange reports whether ρ stays strictly inside [0, 1] for every
// |sin φ| ≤ 1 and every season, so that at never clamps. For a fixed sin φ,
// ρ is linear in A1, whose range is C0 ± √(C1² + C2²); for a fixed A1 it is
// a parabola in sin φ, extreme at ±1 or at its vertex.
func (z Zonal) inRange() bool {
	const margin = 1e-9
	amp := math.Hypot(z.C1, z.C2)
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, a1 := range []float64{z.C0 - amp, z.C0 + amp} {
		xs := []float64{-1, 1}
		if z.A2 != 0 {
			if v := -a1 / (3 * z.A2); v > -1 && v < 1 {
				xs = append(xs, v)
			}
		}
		for _, x := range xs {
			ρ := z.unclamped(x, a1)
			lo, hi = min(lo, ρ), max(hi, ρ)
		}
	}
	return lo > margin && hi < 1-margin
}

// Reflectance implements Reflectance.
func (z Zonal) Reflectance(lat, lon, jdTT float64) float64 {
	return z.at(math.Sin(lat), z.a1(jdTT))
}

func checkReflectance(r Reflectance) error {
	switch v := r.(type) {
	case Uniform:
		if math.IsNaN(v.Albedo) || v.Albedo < 0 || v.Albedo > 1 {
			return fmt.Errorf("albedo: config.reflectance.albedo = %g: must lie in [0, 1] (design mean 0.30)", v.Albedo)
		}
	case Zonal:
		for _, c := range []float64{v.A0, v.A2, v.C0, v.C1, v.C2, v.T0} {
			if math.IsNaN(c) || math.IsInf(c, 0) {
				return fmt.Errorf("albedo: config.reflectance: zonal coefficients must be finite")
			}
		}
	case *Grid:
		if v == nil || len(v.values) == 0 {
			return fmt.Errorf("albedo: config.reflectance: empty grid; load one with ParseGrid")
		}
	}
	return nil
}
