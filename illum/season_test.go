package illum

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

const (
	j2Earth    = 1.08262668e-3 // EGM96 / WGS 84 J2 (from memory)
	ssoNodeRad = 1.99096871e-7 // rad/s, 360° per sidereal year (closed form)
	jdEpoch    = 2460676.5     // 2025-01-01 00:00 TT
	secPerDay  = 86400.0       // s
)

// almanacSun is the Astronomical Almanac's low-precision sun (The
// Astronomical Almanac, section C, "low precision formulas for the Sun",
// ≈ 0.01° for 1950–2050; from memory), km, mean equator and equinox of
// date (within 0.35° of EME2000 in 2025; enough for a season table).
func almanacSun(t float64) r3.Vec {
	n := jdEpoch + t/secPerDay - 2451545.0
	L := (280.460 + 0.9856474*n) * deg
	g := (357.528 + 0.9856003*n) * deg
	λ := L + (1.915*math.Sin(g)+0.020*math.Sin(2*g))*deg
	ε := (23.439 - 0.0000004*n) * deg
	R := (1.00014 - 0.01671*math.Cos(g) - 0.00014*math.Cos(2*g)) * auKm
	sλ, cλ := math.Sincos(λ)
	sε, cε := math.Sincos(ε)
	return r3.Vec{X: R * cλ, Y: R * sλ * cε, Z: R * sλ * sε}
}

// sso builds a circular sun-synchronous orbit whose node drifts with J2
// (secular rate −(3/2) J2 (Rₑ/a)² n cos i; Vallado 2013 eq. 9-41, from
// memory) at the given local time of the ascending node.
func sso(altKm, ltanHours float64) circular {
	a := EarthRadiusKm + altKm
	n := math.Sqrt(muEarth / (a * a * a))
	cosi := -ssoNodeRad / (1.5 * j2Earth * (EarthRadiusKm / a) * (EarthRadiusKm / a) * n)
	s := almanacSun(0)
	αSun := math.Atan2(s.Y, s.X)
	return circular{a: a, inc: math.Acos(cosi), raan: αSun + (ltanHours-12)*15*deg, raanRate: ssoNodeRad}
}

func seasonTable(orb circular) []DayRow {
	g := func(t float64) (r3.Vec, r3.Vec) { return orb.pos(t), almanacSun(t) }
	return YearTable(Conical, g, orb.normal, 0, 365, orb.period())
}

// A 10:30 LTAN SSO at 550 km eclipses every orbit all year, ≈ 34–35 min
// (common practice, no source; cylindrical closed form at its β, below).
func TestYearTableSSO1030(t *testing.T) {
	orb := sso(550, 10.5)
	rows := seasonTable(orb)
	if n := EclipseFreeDays(rows); n != 0 {
		t.Errorf("%d eclipse-free days, want 0", n)
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, r := range rows {
		lo, hi = math.Min(lo, r.ShadowS), math.Max(hi, r.ShadowS)
		// Conical umbra < cylindrical closed form < conical shadow.
		cyl := EclipseFractionCircular(550, r.Beta) * orb.period()
		if !(r.UmbraS < cyl+1 && cyl-1 < r.ShadowS) {
			t.Errorf("day %d β=%.2f°: umbra %.1f, cylinder %.1f, shadow %.1f s", r.Day, r.Beta/deg, r.UmbraS, cyl, r.ShadowS)
		}
	}
	if lo < 33*60 || hi > 36*60 {
		t.Errorf("eclipse length %.2f–%.2f min, want within 33–36", lo/60, hi/60)
	}
	t.Logf("10:30 SSO 550 km: eclipse %.2f–%.2f min every day", lo/60, hi/60)
}

// A 06:00 LTAN (dawn–dusk) SSO at 600 km: eclipse-free except around the
// December solstice. With Ω = α☉ − 90° the beta angle is
// β = −asin(sin(i − δ☉)) (closed form from BetaAngleElements), so |β| =
// 180° − (i − δ☉) falls to 58.8° < β* = 66.07° at δ☉ = −23.4°, and rises to
// 74.4° at δ☉ = +23.4° (i = 97.8°).
func TestYearTableDawnDusk(t *testing.T) {
	orb := sso(600, 6)
	rows := seasonTable(orb)
	free := EclipseFreeDays(rows)
	bStar := BetaCritical(orb.a)
	maxS := 0.0
	starts := 0 // eclipse-free → eclipse transitions, counted round the year
	for i, r := range rows {
		if !r.EclipseFree {
			maxS = math.Max(maxS, r.ShadowS)
		}
		if prev := rows[(i+364)%365]; prev.EclipseFree && !r.EclipseFree {
			starts++
		}
		// Away from the boundary the table must agree with β vs β*
		// (the conical penumbra reaches ≈ 0.27° beyond the cylinder).
		if math.Abs(math.Abs(r.Beta)-bStar) > 0.5*deg && r.EclipseFree != (math.Abs(r.Beta) > bStar) {
			t.Errorf("day %d β=%.2f°: eclipse-free %v", r.Day, r.Beta/deg, r.EclipseFree)
		}
	}
	if free < 240 || free > 320 {
		t.Errorf("%d eclipse-free days, want a long season (240–320)", free)
	}
	// One contiguous season, containing day 354 (21 December 2025).
	if starts != 1 || rows[354].EclipseFree {
		t.Errorf("%d eclipse seasons; day 354 eclipse-free %v", starts, rows[354].EclipseFree)
	}
	first := 354
	for !rows[(first+364)%365].EclipseFree {
		first = (first + 364) % 365
	}
	if maxS > 25*60 {
		t.Errorf("longest eclipse %.1f min, want short (< 25)", maxS/60)
	}
	t.Logf("06:00 SSO 600 km: %d eclipse-free days; season of %d days from day %d, eclipses up to %.1f min", free, 365-free, first, maxS/60)
}
