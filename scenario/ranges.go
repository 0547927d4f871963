package scenario

import (
	"fmt"

	"codeberg.org/sunsight/sunsight/internal/numtext"
	"codeberg.org/sunsight/sunsight/orbit"
)

// The orbit sizes sunsight accepts, in one place: scenario keys
// (altitude_km, semi_major_axis_km + eccentricity), two-line element sets
// and the orbit command all check against OrbitSizeError.
const (
	// MinPerigeeAltitudeKm is the lowest perigee altitude: 100 km, the
	// conventional edge of space (common practice, no source); below
	// ~150 km an orbit decays within days, so results there mean little.
	MinPerigeeAltitudeKm = 100
	// MaxApogeeAltitudeKm is the highest apogee altitude: 100 000 km.
	// Beyond it the Moon's and the sun's pull, which no propagator here
	// models, move the orbit by more than the two-body + J2 models'
	// stated accuracy within a day (own estimate; the lunar third-body
	// acceleration at 100 000 km is ≈ 3 % of the Earth's J2 term at LEO,
	// from memory).
	MaxApogeeAltitudeKm = 100000
)

// OrbitSizeError returns "" when an orbit of semi-major axis aKm and
// eccentricity e has its perigee and apogee inside the accepted range, or a
// message naming what is wrong and what is allowed.
func OrbitSizeError(aKm, e float64) string {
	rp, ra := aKm*(1-e)-orbit.RadiusEarthKm, aKm*(1+e)-orbit.RadiusEarthKm
	switch {
	case !(aKm > 0) || aKm != aKm:
		return fmt.Sprintf("semi-major axis %s km is not a positive number; allowed perigee altitude ≥ %d km and apogee altitude ≤ %d km", numtext.Format(aKm), MinPerigeeAltitudeKm, MaxApogeeAltitudeKm)
	case rp < MinPerigeeAltitudeKm:
		return fmt.Sprintf("perigee altitude %.1f km is below %d km (a = %.1f km, e = %.4f); allowed perigee altitude ≥ %d km above the equatorial radius %.3f km", rp, MinPerigeeAltitudeKm, aKm, e, MinPerigeeAltitudeKm, orbit.RadiusEarthKm)
	case ra > MaxApogeeAltitudeKm:
		return fmt.Sprintf("apogee altitude %.0f km is above %d km (a = %.1f km, e = %.4f); allowed apogee altitude ≤ %d km (the Moon's and sun's pull are not modelled)", ra, MaxApogeeAltitudeKm, aKm, e, MaxApogeeAltitudeKm)
	}
	return ""
}
