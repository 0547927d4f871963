package orbit

import (
	"math"
	"testing"
)

// Every j2-numeric propagator of one factory gives the same states, bit for
// bit, whichever is asked first: a run must not depend on what ran before
// it in the process (the first one was started from the elements, the
// others from the osculating state, and differed in the last bits).
func TestJ2NumericFactoryPropagatorsAlike(t *testing.T) {
	f, err := newJ2NumericFactory(Elements{SemiMajorAxisKm: 7000, Eccentricity: 0.01, Inclination: 1.2, RAAN: 0.3, ArgPerigee: 0.5, MeanAnomaly: 0.7})
	if err != nil {
		t.Fatal(err)
	}
	a, b := f(), f()
	for _, tt := range []float64{0, 600, 5400, 86400} {
		sa, sb := a.StateAt(tt), b.StateAt(tt)
		if sa != sb {
			t.Errorf("t = %g s: first %v, second %v (%g km apart)", tt, sa.R, sb.R, math.Hypot(math.Hypot(sa.R.X-sb.R.X, sa.R.Y-sb.R.Y), sa.R.Z-sb.R.Z))
		}
	}
}
