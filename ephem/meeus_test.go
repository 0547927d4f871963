package ephem

import (
	"math"
	"testing"

	"github.com/soniakeys/meeus/v3/solar"
)

const (
	// Meeus 1998 ch. 25: 0.01° for the low-accuracy longitude; 0.012°
	// allows for the J2000 reduction of p. 166.
	tolMeeusDeg = 0.012
	// Between the two models (both apparent, EME2000).
	tolModelsDeg = 0.02
)

func TestMeeusExample25a(t *testing.T) {
	// Meeus 1998 Example 25.a p. 165: 1992 Oct 13.0 TD, JDE 2448908.5.
	const jde = 2448908.5
	// Reference check of the library: apparent α = 13h13m31.4s,
	// δ = −7°47′06″ (of date, with nutation and aberration).
	α, δ := solar.ApparentEquatorial(jde)
	wantα := (13 + 13/60.0 + 31.4/3600) * 15 * deg
	wantδ := -(7 + 47/60.0 + 6/3600.0) * deg
	if d := math.Abs(α.Rad() - wantα); d > 0.05*15*arcsec { // printed to 0.1 s
		t.Errorf("α = %.6f°, want %.6f° (%.2f″)", α.Rad()/deg, wantα/deg, d/arcsec)
	}
	if d := math.Abs(δ.Rad() - wantδ); d > 0.5*arcsec { // printed to 1″
		t.Errorf("δ = %.6f°, want %.6f° (%.2f″)", δ.Rad()/deg, wantδ/deg, d/arcsec)
	}
	// R = 0.99766 AU, printed to 1e-5 AU.
	T := CenturiesTT(jde)
	_, dKm := Meeus{}.Position(jde)
	if d := math.Abs(dKm/AUKm - 0.99766); d > 5e-6 {
		t.Errorf("R = %.6f AU, want 0.99766 AU", dKm/AUKm)
	}
	// Our model's geometric longitude is on the J2000 equinox; adding back
	// the p. 166 reduction (0.01397° per year) must give the printed true
	// longitude of date ☉ = 199.90988°.
	λ := meeusLongitude2000(T)/deg + 0.01397*100*T
	if d := math.Abs(λ - 199.90988); d > 1e-5 {
		t.Errorf("☉ = %.6f°, want 199.90988°", λ)
	}
}

func TestMeeusAgainstERFA(t *testing.T) {
	// ERFA eraEpv00 + eraAb (testdata/gen_sun_erfa.py), 400 epochs 2000–2050.
	ref := readERFASun(t)
	dir, dist, at := worstAgainstERFA(Meeus{}, ref)
	t.Logf("meeus vs ERFA apparent: worst direction %.5f° (JD %.1f), worst distance %.2e AU", dir, at, dist)
	if dir > tolMeeusDeg {
		t.Errorf("direction error %.5f° > %g°", dir, tolMeeusDeg)
	}
	if dist > tolDistAU {
		t.Errorf("distance error %.2e AU > %g AU", dist, tolDistAU)
	}
	var worst float64
	for _, r := range ref {
		u1, _ := LowPrecision{}.Position(r.jdTT)
		u2, _ := Meeus{}.Position(r.jdTT)
		worst = math.Max(worst, sepDeg(u1, u2))
	}
	t.Logf("low-precision vs meeus: worst %.5f°", worst)
	if worst > tolModelsDeg {
		t.Errorf("models differ by %.5f° > %g°", worst, tolModelsDeg)
	}
}

func TestSunByNameMeeus(t *testing.T) {
	s, err := SunByName("meeus")
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := s.(Meeus); !ok {
		t.Errorf("meeus gave %T", s)
	}
}

func TestMeeusIsApparent(t *testing.T) {
	// Meeus gets −20.4898″/R added (Meeus 1998 (25.10) p. 167), so like
	// LowPrecision it must sit on ERFA's apparent direction, not the
	// geometric one.
	app, geo := alongTrackBias(Meeus{}, readERFASun(t))
	t.Logf("meeus mean along-track offset: %.2f″ from apparent, %.2f″ from geometric", app, geo)
	if math.Abs(app) >= math.Abs(geo) || math.Abs(app) > 10 {
		t.Errorf("meeus looks geometric: %.2f″ from apparent, %.2f″ from geometric", app, geo)
	}
}
