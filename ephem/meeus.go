package ephem

import (
	"math"

	"github.com/soniakeys/meeus/v3/base"
	"github.com/soniakeys/meeus/v3/solar"
	"gonum.org/v1/gonum/spatial/r3"
)

// Meeus is the low-accuracy solar theory of Meeus, Astronomical
// Algorithms 2nd ed. 1998, ch. 25 (eqs. 25.2–25.5; geometric longitude
// good to 0.01°), through github.com/soniakeys/meeus/v3: solar.True2000
// gives the geometric longitude on the ecliptic and equinox of J2000
// (Meeus p. 166 reduction −0.01397°/yr), annual aberration −20.4898″/R
// (Meeus (25.10) p. 167) makes it apparent like LowPrecision, and the
// J2000 obliquity (base.SOblJ2000, base.COblJ2000, Meeus p. 228) turns it
// into EME2000. The ecliptic latitude (< 1.2″) is neglected. The zero
// value is ready to use.
type Meeus struct{}

func init() {
	sunModels["meeus"] = SunModelInfo{Name: "meeus",
		Model:  "low-accuracy solar theory on the J2000 equinox, via github.com/soniakeys/meeus/v3",
		Source: "J. Meeus, Astronomical Algorithms, 2nd ed., 1998, ch. 25; checked against IAU SOFA/ERFA to 0.0091°",
		New:    func() Sun { return Meeus{} }}
}

// Position implements Sun.
func (Meeus) Position(jdTT float64) (r3.Vec, float64) {
	T := CenturiesTT(jdTT)
	R := solar.Radius(T)                                        // (25.5) p. 164, AU
	λ := meeusLongitude2000(T) - AberrationMeeusArcsec*arcsec/R // (25.10) p. 167
	sλ, cλ := math.Sincos(λ)
	return r3.Vec{X: cλ, Y: base.COblJ2000 * sλ, Z: base.SOblJ2000 * sλ}, R * AUKm
}

// meeusLongitude2000 returns the geometric longitude of the sun on the
// ecliptic and mean equinox of J2000 in radians (Meeus 1998 (25.2) and
// p. 166).
func meeusLongitude2000(T float64) float64 {
	s, _ := solar.True2000(T)
	return s.Rad()
}
