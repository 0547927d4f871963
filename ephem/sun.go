package ephem

import "gonum.org/v1/gonum/spatial/r3"

// Sun is a solar ephemeris.
type Sun interface {
	// Position returns the geocentric unit vector to the sun in the EME2000
	// frame and the Earth–sun distance in km, at a TT Julian date.
	Position(jdTT float64) (u r3.Vec, distKm float64)
}
