package orbit

import (
	"math"
	"testing"
)

// measuredRates fits the mean RAAN, argument of perigee and mean argument of
// latitude of j2-numeric (started from the osculating state of the mean
// elements) over days days: the mean elements are recovered by
// OsculatingToMean every 1 day and fitted by least squares.
func measuredRates(t *testing.T, mean Elements, days int) (dΩ, dω float64) {
	t.Helper()
	p, err := NewJ2Numeric(mean, NumericOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var xs, ys, ws []float64
	var prevΩ, prevω, accΩ, accω float64
	for d := 0; d <= days; d++ {
		osc, err := ElementsFromState(p.StateAt(float64(d) * 86400))
		if err != nil {
			t.Fatal(err)
		}
		m := OsculatingToMean(osc)
		if d > 0 {
			accΩ += wrapπ(m.RAAN - prevΩ)
			accω += wrapπ(m.ArgPerigee - prevω)
		}
		prevΩ, prevω = m.RAAN, m.ArgPerigee
		xs, ys, ws = append(xs, float64(d)*86400), append(ys, accΩ), append(ws, accω)
	}
	return slope(xs, ys), slope(xs, ws)
}

func slope(x, y []float64) float64 {
	var sx, sy, sxx, sxy float64
	for i := range x {
		sx, sy, sxx, sxy = sx+x[i], sy+y[i], sxx+x[i]*x[i], sxy+x[i]*y[i]
	}
	n := float64(len(x))
	return (n*sxy - sx*sy) / (n*sxx - sx*sx)
}

// At e = 0 the second-order terms are SGP4's J2² secular terms (Hoots &
// Roehrich 1980): 0.5·temp2·(4 − 19θ²)θ for the node and
// 0.0625·temp2·(7 − 114θ² + 395θ⁴) for the perigee, temp2 = (3/4) J2² n / p⁴.
func TestJ2SecondOrderReducesToSGP4AtZeroEccentricity(t *testing.T) {
	el := Elements{SemiMajorAxisKm: 7000, Inclination: 63 * deg}
	Ω2, ω2, M2 := J2RatesSecondOrder(el)
	Ω1, ω1, M1 := J2Rates(el)
	n := math.Sqrt(MuEarth / 7000 / 7000 / 7000)
	p := 7000 / RadiusEarthKm
	θ := math.Cos(el.Inclination)
	temp2 := 0.75 * J2 * J2 * n / (p * p * p * p)
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"node J2² term", Ω2 - Ω1, 0.5 * temp2 * (4 - 19*θ*θ) * θ},
		{"perigee J2² term", ω2 - ω1, 0.0625 * temp2 * (7 - 114*θ*θ + 395*θ*θ*θ*θ)},
		{"mean anomaly J2² term", M2 - M1, 0.0625 * temp2 * (13 - 78*θ*θ + 137*θ*θ*θ*θ)},
	} {
		check(t, c.name, c.got, c.want, 1e-6*math.Abs(c.want))
	}
}

// The node rate of j2-numeric, fitted over 30 days from its own mean
// elements, against the first- and second-order secular rates: a 550 km SSO
// and an eccentric orbit at the critical inclination.
func TestJ2SecondOrderNodeRateAgainstNumeric(t *testing.T) {
	if testing.Short() {
		t.Skip("30-day integrations")
	}
	sso, _ := SunSyncInclination(RadiusEarthKm+550, 0.001)
	for _, c := range []struct {
		name string
		el   Elements
		tol2 float64 // relative, second order
		days int
	}{
		{"550 km SSO", Elements{RadiusEarthKm + 550, 0.001, sso, 1, 2, 3}, 1e-4, 30},
		{"critical inclination, e = 0.3", Elements{12000, 0.3, 63.4349 * deg, 1, 1, 0}, 5e-3, 30},
		{"critical inclination, e = 0.74", Elements{26600, 0.74, 63.4349 * deg, 10 * deg, 270 * deg, 0}, 5e-3, 30},
	} {
		dΩ, dω := measuredRates(t, c.el, c.days)
		Ω1, ω1, _ := J2Rates(c.el)
		Ω2, ω2, _ := J2RatesSecondOrder(c.el)
		t.Logf("%s: node numeric %.6e, first order %+.4f %%, second order %+.4f %%; perigee numeric %.4e, first %.4e, second %.4e",
			c.name, dΩ, 100*(Ω1/dΩ-1), 100*(Ω2/dΩ-1), dω, ω1, ω2)
		if math.Abs(Ω2/dΩ-1) > c.tol2 {
			t.Errorf("%s: second-order node rate %.4f %% from j2-numeric; want ≤ %.3g %%", c.name, 100*(Ω2/dΩ-1), 100*c.tol2)
		}
	}
}
