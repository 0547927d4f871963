package orbit

import (
	"math"
	"testing"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
	"gonum.org/v1/gonum/spatial/r3"
)

// Mean → osculating → mean returns the same orbit to within 1 m of position
// (the state of the mean elements before and after), for LEO, SSO, an
// equatorial, an inclined eccentric and a critical-inclination HEO orbit
// (closed loop: the fixed point of OsculatingToMean must invert
// MeanToOsculating; no published value needed).
func TestMeanOsculatingMeanWithinOneMetre(t *testing.T) {
	sso, _ := SunSyncInclination(RadiusEarthKm+550, 0.001)
	worst := 0.0
	for _, m := range []Elements{
		{RadiusEarthKm + 550, 0.001, sso, 1, 2, 3},
		{RadiusEarthKm + 420, 0.0005, 51.6 * deg, 0.5, 0.7, 4},
		{RadiusEarthKm + 800, 0.01, 0.1 * deg, 0, 2, 3},
		{RadiusEarthKm + 1200, 0.1, 70 * deg, 2, 1, 5},
		{26600, 0.74, 63.4 * deg, 10 * deg, 270 * deg, 1},
	} {
		back := OsculatingToMean(MeanToOsculating(m))
		d := vecmath.Norm(r3.Sub(m.State().R, back.State().R)) * 1e3
		worst = math.Max(worst, d)
		if d > 1 {
			t.Errorf("a = %.0f km, e = %g: round trip moves the position by %.3f m", m.SemiMajorAxisKm, m.Eccentricity, d)
		}
	}
	t.Logf("worst round-trip position change %.3g m", worst)
}
