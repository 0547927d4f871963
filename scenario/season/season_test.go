package season

import (
	"context"
	"fmt"
	"math"
	"runtime"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/scenario"
)

func parse(t *testing.T, text string) *scenario.Scenario {
	t.Helper()
	s, err := scenario.Parse([]byte(text), ".")
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// circularISS-like orbit of our own: 500 km at 51.6°, two-body, cylindrical
// shadow, so each orbit's shadow has the closed form of its beta angle.
const circular = `
epoch: "2026-01-01T00:00:00Z"
duration: 1d
step: 60s
orbit: {altitude_km: 500, inclination_deg: 51.6, raan_deg: 40, propagator: two-body}
shadow: cylindrical
attitude: {law: sun}
body: {sensors: [{name: a, kind: cosine, face: "+Z"}]}
`

// Over a year, each orbit's shadow time is the closed form of a circular
// orbit in the cylindrical shadow at its beta angle,
// T·acos(√(h² + 2Rh)/((R + h) cos β))/π for |β| < asin(R/(R + h)), else 0
// (J. R. Wertz (ed.), Spacecraft Attitude Determination and Control, 1978,
// §3.5, and Vallado 2013 §5.3, both from memory; the same form as
// REFERENCE-VALUES §5: 35.75 min at β = 0, 500 km), and the share of orbits
// without eclipse is the share with |β| beyond that limit.
func TestEclipseDistributionClosedForm(t *testing.T) {
	s := parse(t, circular)
	d := checkClosedForm(t, s, 500)
	// β = 0 is crossed during a year at 51.6°: the longest shadow is the
	// closed form at β = 0 (35.75 min, REFERENCE-VALUES §5 table).
	if got := d.LongestS / 60; math.Abs(got-35.75) > 0.05 {
		t.Errorf("longest shadow %.3f min, want 35.75 min", got)
	}
	// A dawn-dusk orbit of our own at 700 km (j2-mean): eclipse-free for
	// most of the year, with short eclipses around the solstice.
	dd := parse(t, strings.Replace(strings.Replace(circular, "altitude_km: 500, inclination_deg: 51.6, raan_deg: 40, propagator: two-body",
		"altitude_km: 700, ltan: \"06:00\"", 1), "2026-01-01", "2026-03-01", 1))
	d = checkClosedForm(t, dd, 700)
	if d.WithoutEclipse == 0 || d.ShareWithout > 0.95 {
		t.Errorf("dawn-dusk: %d orbits without eclipse (%.1f %%); want some but not all", d.WithoutEclipse, 100*d.ShareWithout)
	}
}

// checkClosedForm compares each orbit's shadow with the closed form and
// the eclipse-free orbits with the beta limit, and checks the month bins.
func checkClosedForm(t *testing.T, s *scenario.Scenario, altKm float64) Distribution {
	t.Helper()
	d, err := Eclipses(s, 365*86400, 1800)
	if err != nil {
		t.Fatal(err)
	}
	T := orbit.Period(orbit.RadiusEarthKm + altKm)
	βstar := illum.BetaCritical(orbit.RadiusEarthKm + altKm)
	worst, without, mismatched := 0.0, 0, 0
	for _, o := range d.PerOrbit {
		want := T * illum.EclipseFractionCircular(altKm, o.Beta)
		// The sun moves 0.04° during an orbit and the beta angle with it:
		// orbits within 0.1° of the limit are left out of the comparison.
		if math.Abs(math.Abs(o.Beta)-βstar) < 0.1*math.Pi/180 {
			continue
		}
		worst = math.Max(worst, math.Abs(o.ShadowS-want))
		if math.Abs(o.Beta) >= βstar {
			without++
		}
		if (o.ShadowS == 0) != (math.Abs(o.Beta) >= βstar) {
			mismatched++
		}
	}
	t.Logf("%.0f km: %d orbits, %d without eclipse (%.1f %%; closed form %d away from the limit), longest %.2f min; worst |shadow − closed form| %.3f s",
		altKm, d.Orbits, d.WithoutEclipse, 100*d.ShareWithout, without, d.LongestS/60, worst)
	if worst > 2 {
		t.Errorf("shadow per orbit off the closed form by up to %.3f s, want ≤ 2 s", worst)
	}
	if mismatched > 0 {
		t.Errorf("%d orbits with an eclipse where the beta limit says none, or the reverse", mismatched)
	}
	n := 0
	for _, m := range d.Months {
		n += m.Orbits
		c := m.WithoutEclipse
		for _, k := range m.Counts {
			c += k
		}
		if c != m.Orbits {
			t.Errorf("%s: bins hold %d orbits of %d", m.Start.Format("2006-01"), c, m.Orbits)
		}
	}
	if n != d.Orbits || len(d.Months) != 12 {
		t.Errorf("%d months with %d orbits, want 12 months with %d", len(d.Months), n, d.Orbits)
	}
	// Property: the orbits tile the span between the first and the last
	// ascending node.
	for i := 1; i < len(d.PerOrbit); i++ {
		if d.PerOrbit[i].StartS != d.PerOrbit[i-1].EndS {
			t.Fatalf("orbit %d starts at %g, the previous ends at %g", i, d.PerOrbit[i].StartS, d.PerOrbit[i-1].EndS)
		}
	}
	return d
}

// The scan finds the season of the longest eclipse where the distribution
// puts it (β near 0), and moving the epoch keeps a sun-synchronous orbit's
// local time (its beta angle at the same date does not depend on the
// scan).
func TestScanFindsWorstSeason(t *testing.T) {
	s := parse(t, circular)
	opt := Options{SpanS: 120 * 86400, Cases: 8, CaseS: 6 * 3600, Refine: 2, EclipseAboveS: 1800}
	r, err := Run(context.Background(), s, opt, nil)
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Cases) < opt.Cases || len(r.Worst) != 3 {
		t.Fatalf("%d cases, worst %+v", len(r.Cases), r.Worst)
	}
	for i := 1; i < len(r.Cases); i++ {
		if r.Cases[i].OffsetS <= r.Cases[i-1].OffsetS {
			t.Fatalf("cases out of order at %d", i)
		}
	}
	w := r.Cases[r.Worst[2].Case]
	// The worst case's longest eclipse is at most the span's longest
	// shadow of one orbit and within 1 % of it (the scan samples the span).
	got, max := w.Headline.EclipseMaxMin*60, r.Eclipse.LongestS
	t.Logf("worst eclipse case %s: %.2f min; span's longest %.2f min", w.Epoch.Format("2006-01-02"), got/60, max/60)
	if got > max+1 || got < 0.97*max {
		t.Errorf("worst eclipse case %.2f min, the span's longest %.2f min", got/60, max/60)
	}
}

// A state orbit cannot be moved in time by the scan: refused with the
// reason.
func TestCaseScenarioRefusesStates(t *testing.T) {
	s := parse(t, `
orbit: {state: {position_km: [7000, 0, 0], velocity_km_s: [0, 7.5, 0]}}
attitude: {law: sun}
body: {sensors: [{name: a, kind: cosine, face: "+Z"}]}
`)
	if _, err := CaseScenario(s, 86400, 3600); err == nil {
		t.Error("a state orbit was moved")
	}
}

// The cases run on every core; the result is the one of a run on one
// core, case for case (each case is a run of its own).
func TestScanSameOnOneCore(t *testing.T) {
	s := parse(t, circular)
	opt := Options{SpanS: 60 * 86400, Cases: 6, CaseS: 3 * 3600, Refine: 1, EclipseAboveS: 1800}
	var got []string
	for _, procs := range []int{1, 2} {
		prev := runtime.GOMAXPROCS(procs)
		r, err := Run(context.Background(), s, opt, nil)
		runtime.GOMAXPROCS(prev)
		if err != nil {
			t.Fatal(err)
		}
		// %v prints every float exactly (NaN as NaN) and follows no
		// pointer but the cases' values.
		got = append(got, fmt.Sprintf("%+v %+v %+v", r.Cases, r.Worst, r.Eclipse))
	}
	if got[0] != got[1] {
		t.Error("the scan on two cores differs from the scan on one")
	}
}
