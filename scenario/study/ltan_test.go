package study

import (
	"math"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
)

// orbit.ltan_solar_time: the RAAN of an apparent LTAN differs from the mean
// one by the equation of time (Meeus 1998 eq. 28.3); on 2027-03-20 E is
// −7.5 min (Meeus's Smart formula; the true sun trails the mean sun), so
// the apparent RAAN lies about 1.9° east of the mean one; the key is
// refused without ltan and for an unknown solar time.
func TestLTANSolarTimeKey(t *testing.T) {
	raan := func(extra string) float64 {
		t.Helper()
		s, err := scenario.Parse([]byte("epoch: 2027-03-20T00:00:00Z\norbit: {altitude_km: 550, ltan: \"10:30\""+extra+"}\nbody:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n"), "")
		if err != nil {
			t.Fatal(err)
		}
		el, err := MeanElements(s)
		if err != nil {
			t.Fatal(err)
		}
		return el.RAAN
	}
	mean, deflt, app := raan(", ltan_solar_time: mean"), raan(""), raan(", ltan_solar_time: apparent")
	if mean != deflt {
		t.Errorf("default RAAN %v differs from mean %v", deflt, mean)
	}
	d := math.Remainder(app-mean, 2*math.Pi) * 180 / math.Pi
	// E on 2027 March 20 is about −7.5 min (Meeus Smart formula), so the
	// apparent node is 15°/h · 7.5 min ≈ 1.87° east.
	if d < 1.7 || d > 2.0 {
		t.Errorf("apparent − mean RAAN = %.3f°; want ≈ +1.87° (equation of time −7.5 min)", d)
	}
	t.Logf("apparent − mean RAAN on 2027-03-20: %+.3f° (%.2f min of LTAN)", d, d*4)
	_, err := scenario.Parse([]byte("orbit: {altitude_km: 550, inclination_deg: 50, ltan_solar_time: apparent}\nbody:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n"), "")
	if err == nil || !strings.Contains(err.Error(), "orbit.ltan_solar_time") {
		t.Errorf("ltan_solar_time without ltan: %v", err)
	}
	_, err = scenario.Parse([]byte("orbit: {altitude_km: 550, ltan: \"10:30\", ltan_solar_time: sidereal}\nbody:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n"), "")
	if err == nil || !strings.Contains(err.Error(), "orbit.ltan_solar_time") {
		t.Errorf("ltan_solar_time sidereal: %v", err)
	}
}
