package sweep

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/orbit"
)

// eclipseBase is an equatorial orbit started at the March 2026 equinox
// (2026-03-20 14:46 UTC, from memory), so β ≈ 0, with the cylindrical shadow.
const eclipseBase = `name: equinox equatorial
epoch: "2026-03-20T14:46:00Z"
duration: 1h
step: 5s
orbit:
  altitude_km: 500
  inclination_deg: 0
  propagator: two-body
shadow: cylindrical
attitude:
  law: nadir
body:
  sensors:
    - {name: a, kind: cosine, face: "-Z"}
    - {name: b, kind: cosine, face: "+X"}
    - {name: c, kind: cosine, face: "+Y"}
albedo:
  model: none
`

// closedFormEclipse is the cylindrical-shadow eclipse fraction of a circular
// orbit, f = (1/π)·acos(√(h²+2Rₑh)/((Rₑ+h)·cos β)) (Rickman, NASA TFAWS 2014;
// Gilmore, Spacecraft Thermal Control Handbook, 2nd ed. 2002, ch. 2; from
// memory).
func closedFormEclipse(hKm, β float64) float64 {
	R := orbit.RadiusEarthKm
	return math.Acos(math.Sqrt(hKm*hKm+2*R*hKm)/((R+hKm)*math.Cos(β))) / math.Pi
}

// TestAltitudeSweepMatchesClosedFormEclipse zips the altitude with a
// duration of ten whole orbits, so the eclipse fraction of each case has no
// partial-orbit bias; what remains is the 5 s sampling of two shadow
// boundaries per orbit and the sun's 0.4°/day motion (cos β ≈ 1 − 3e-5).
func TestAltitudeSweepMatchesClosedFormEclipse(t *testing.T) {
	var alts, durs []string
	for h := 300.0; h <= 900; h += 100 {
		a := orbit.RadiusEarthKm + h
		period := 2 * math.Pi * math.Sqrt(a*a*a/orbit.MuEarth)
		alts = append(alts, fmt.Sprint(h))
		durs = append(durs, fmt.Sprintf("%.0fs", 10*period))
	}
	axes := []Axis{{"orbit.altitude_km", alts}, {"duration", durs}}
	p, err := NewPlan([]byte(eclipseBase), t.TempDir(), axes, true)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	if _, err := Execute(context.Background(), p, dir, Options{}); err != nil {
		t.Fatal(err)
	}
	m, cases, err := Gather([]string{dir})
	if err != nil {
		t.Fatal(err)
	}
	prev := 1.0
	for i, cf := range cases {
		h := p.Scenario(i).Orbit.AltitudeKm
		got := cf.Value("umbra_fraction") + cf.Value("penumbra_fraction")
		want := closedFormEclipse(h, 0)
		// Sampling: each boundary is found to one step; two per orbit.
		tol := 2 * 5.0 / (p.Scenario(i).Duration.Seconds() / 10)
		if math.Abs(got-want) > tol {
			t.Errorf("h = %g km: eclipse fraction %.5f, closed form %.5f (tolerance %.5f)", h, got, want, tol)
		}
		t.Logf("h = %g km: eclipse fraction %.5f, closed form %.5f, difference %+.5f", h, got, want, got-want)
		if !(got < prev) {
			t.Errorf("h = %g km: eclipse fraction %.5f does not fall with altitude (previous %.5f)", h, got, prev)
		}
		prev = got
	}
	if strings.Join(m.Keys, ",") != "orbit.altitude_km,duration" {
		t.Errorf("keys %v", m.Keys)
	}
}
