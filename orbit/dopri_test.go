package orbit

import (
	"math"
	"testing"
)

// Closed form: three uncoupled harmonic oscillators y” = −ω²y have
// y = cos(ωt)-type solutions; the step results and the dense output between
// steps must follow them to about the tolerance.
func TestDopri5HarmonicOscillator(t *testing.T) {
	ω := [3]float64{1, 2, 0.5}
	f := func(_ float64, y *vec6, dy *vec6) {
		for i := range 3 {
			dy[i] = y[i+3]
			dy[i+3] = -ω[i] * ω[i] * y[i]
		}
	}
	rk := newDopri5(f, 0, vec6{1, 1, 1, 0, 0, 0}, 0.01, 1e-10, 1e-12, 1)
	worst := 0.0
	for k := 1; k <= 2000; k++ {
		tt := float64(k) * 0.0137 // off the step grid: exercises the dense output
		var y vec6
		rk.advanceTo(tt, &y)
		for i := range 3 {
			worst = math.Max(worst, math.Abs(y[i]-math.Cos(ω[i]*tt)))
		}
	}
	t.Logf("worst error %.3g over t ≤ 27.4 with %d steps (%d rejected)", worst, rk.steps, rk.reject)
	if worst > 1e-8 {
		t.Errorf("worst error %.3g, want ≤ 1e-8", worst)
	}
}

// The fixed point must invert: OsculatingToMean(MeanToOsculating(m)) = m,
// for eccentric, circular and equatorial orbits. And the averaging must
// reproduce the closed-form first-order short-period term in a: for e = 0,
// δa = (3/2)(J2 R²/a) sin² i cos 2u (Kozai 1959, AJ 64, 367, δa term, from
// memory; the (1 − 3/2 sin² i)((a/r)³ − (1−e²)^−3/2) part vanishes at e = 0),
// so at the ascending node (u = 0) δa = (3/2)(J2 R²/a) sin² i.
func TestMeanOsculatingRoundTrip(t *testing.T) {
	for _, m := range []Elements{
		{RadiusEarthKm + 550, 0.001, 97.6 * deg, 1, 2, 3},
		{RadiusEarthKm + 420, 0, 51.6 * deg, 1, 0, 0},
		{RadiusEarthKm + 800, 0.01, 0, 0, 2, 3},
	} {
		osc := MeanToOsculating(m)
		back := OsculatingToMean(osc)
		if math.Abs(back.SemiMajorAxisKm-m.SemiMajorAxisKm) > 1e-5 ||
			math.Abs(back.Eccentricity-m.Eccentricity) > 1e-9 ||
			math.Abs(back.Inclination-m.Inclination) > 1e-9 {
			t.Errorf("round trip\n got %+v\nwant %+v", back, m)
		}
	}
	m := Elements{SemiMajorAxisKm: RadiusEarthKm + 420, Inclination: 51.6 * deg, RAAN: 1}
	osc := MeanToOsculating(m)
	s := math.Sin(m.Inclination)
	want := 1.5 * J2 * RadiusEarthKm * RadiusEarthKm / m.SemiMajorAxisKm * s * s
	got := osc.SemiMajorAxisKm - m.SemiMajorAxisKm
	t.Logf("δa at the node: %.4f km (first-order closed form %.4f km)", got, want)
	if math.Abs(got-want) > 0.02*math.Abs(want) {
		t.Errorf("δa = %.4f km, want %.4f km ± 2 %%", got, want)
	}
}
