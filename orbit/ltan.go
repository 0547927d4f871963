package orbit

import (
	"fmt"

	"github.com/soniakeys/meeus/v3/eqtime"
	"math"
	"time"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/internal/vecmath"
	"gonum.org/v1/gonum/spatial/r3"
)

// RAANFromLTAN returns the RAAN (rad, [0, 2π), EME2000) of the ascending
// node that crosses the equator at local mean solar time ltanHours at the
// epoch:
//
//	Ω = α☉mean + 15°/h · (LTAN − 12 h)
//
// (common practice, no source here; the ASCENDING node: an LTAN of 10:30
// and one of 22:30 are 180° apart, and 22:30 is the same plane flown the
// other way round the descending node). α☉mean is ephem.MeanSunRA2000.
func RAANFromLTAN(ltanHours float64, epoch time.Time) float64 {
	α := ephem.MeanSunRA2000(ephem.JulianDateTT(epoch))
	return wrap2π(α + (ltanHours-12)*15*math.Pi/180)
}

// LTANFromRAAN is the inverse of RAANFromLTAN: the local mean solar time
// (hours, [0, 24)) of the ascending node of RAAN raan at the epoch.
func LTANFromRAAN(raan float64, epoch time.Time) float64 {
	α := ephem.MeanSunRA2000(ephem.JulianDateTT(epoch))
	h := 12 + wrapπ(raan-α)*12/math.Pi
	if h >= 24 {
		h -= 24
	}
	return h
}

// LVLH returns the local-vertical local-horizontal axes of state s in the
// inertial frame: z toward nadir (−r̂), y opposite the orbit normal
// (−(r × v)/|r × v|), and x = y × z, which completes a right-handed triad
// and is the velocity direction for a circular orbit (in general the
// along-track direction perpendicular to r). (Common practice, no source;
// the convention of most attitude texts for nadir pointing.)
func LVLH(s State) (x, y, z r3.Vec) {
	z = r3.Scale(-1/vecmath.Norm(s.R), s.R)
	h := r3.Cross(s.R, s.V)
	y = r3.Scale(-1/vecmath.Norm(h), h)
	x = r3.Cross(y, z)
	return x, y, z
}

// Solar times an LTAN can be given in.
const (
	MeanSolarTime     = "mean"     // the mean sun (uniform along the equator)
	ApparentSolarTime = "apparent" // the true sun, ahead of or behind the mean sun by the equation of time
)

// RAANFromLTANSolar returns the RAAN (rad, [0, 2π), EME2000) for an LTAN
// read in the named solar time. Mean solar time is RAANFromLTAN. Apparent
// solar time is the hour angle of the true sun: local apparent time =
// local mean time + E, so the node of apparent LTAN h sits where the mean
// LTAN is h − E, Ω = RAANFromLTAN(h) − 15°/h·E, with the equation of time E
// from Smart's formula (Meeus 1998 eq. 28.3, through
// github.com/soniakeys/meeus/v3/eqtime.ESmart; Example 28.b within 0.1 s).
// E reaches ±16 min (±4° of RAAN).
func RAANFromLTANSolar(ltanHours float64, epoch time.Time, solarTime string) (float64, error) {
	switch solarTime {
	case MeanSolarTime, "":
		return RAANFromLTAN(ltanHours, epoch), nil
	case ApparentSolarTime:
		e := eqtime.ESmart(ephem.JulianDateTT(epoch)).Rad() // hour angle, rad
		return wrap2π(RAANFromLTAN(ltanHours, epoch) - e), nil
	}
	return 0, fmt.Errorf("orbit: solar time %q is not one of %s, %s", solarTime, MeanSolarTime, ApparentSolarTime)
}
