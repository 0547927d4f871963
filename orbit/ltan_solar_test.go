package orbit

import (
	"math"
	"testing"
	"time"

	"codeberg.org/sunsight/sunsight/ephem"
)

// The RAANs of one LTAN read in mean and in apparent solar time differ by
// the equation of time: Meeus 1998 Example 28.b (Smart's formula), 1992
// October 13.0 TD, E = 0.059825 rad = +13m 42.7s, within 0.1 s; the full
// method of Example 28.a gives 13m 42.6s, within 1 s.
func TestApparentLTANDiffersByEquationOfTime(t *testing.T) {
	// 1992 Oct 13.0 TD; TT − UTC was 32.184 s + 27 s (TAI − UTC from 1992 July 1).
	epoch := time.Date(1992, 10, 13, 0, 0, 0, 0, time.UTC).Add(-59184 * time.Millisecond)
	if jd := ephem.JulianDateTT(epoch); math.Abs(jd-2448908.5) > 1e-7 {
		t.Fatalf("epoch is JD(TT) %.8f, want 2448908.5", jd)
	}
	mean, _ := RAANFromLTANSolar(10.5, epoch, MeanSolarTime)
	app, err := RAANFromLTANSolar(10.5, epoch, ApparentSolarTime)
	if err != nil {
		t.Fatal(err)
	}
	d := math.Remainder(mean-app, 2*math.Pi) * 180 / math.Pi * 240 // seconds of time
	if want := 0.059825 * 43200 / math.Pi; math.Abs(d-want) > 0.1 {
		t.Errorf("mean − apparent RAAN = %.2f s of time; Meeus Example 28.b E = %.2f s", d, want)
	}
	if want := 13*60 + 42.6; math.Abs(d-want) > 1 {
		t.Errorf("mean − apparent RAAN = %.2f s of time; Meeus Example 28.a E = %.1f s", d, want)
	}
	t.Logf("mean − apparent = %.2f s of time (Meeus 28.b: %.2f s)", d, 0.059825*43200/math.Pi)
	if _, err := RAANFromLTANSolar(10.5, epoch, "sidereal"); err == nil {
		t.Error("an unknown solar time was accepted")
	}
}
