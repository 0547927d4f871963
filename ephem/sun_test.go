package ephem

import (
	"fmt"
	"math"
	"strings"
	"testing"
	"time"

	"gonum.org/v1/gonum/spatial/r3"
)

// Tolerances against ERFA over 2000–2050 (testdata/gen_sun_erfa.py).
const (
	// AA section C states 0.01° for the low-precision apparent coordinates
	// (1950–2050); 0.02° leaves room for the IAU 1976 precession to J2000.
	tolLowPrecisionDeg = 0.02
	// Distance, both models: the AA R formula is quoted to 1e-5 AU
	// digits; 1e-4 AU is common practice, no source.
	tolDistAU = 1e-4
)

// erfaSun is one row of testdata/sun_erfa.csv.
type erfaSun struct {
	jdTT   float64
	app    r3.Vec // apparent direction, EME2000
	geo    r3.Vec // geometric direction, EME2000
	distAU float64
}

func readERFASun(t testing.TB) []erfaSun {
	t.Helper()
	rows := readCSV(t, "sun_erfa.csv")
	out := make([]erfaSun, len(rows))
	for i, row := range rows {
		v := parseFloats(t, row)
		out[i] = erfaSun{v[0], r3.Vec{X: v[1], Y: v[2], Z: v[3]}, r3.Vec{X: v[4], Y: v[5], Z: v[6]}, v[7]}
	}
	if len(out) < 200 {
		t.Fatalf("sun_erfa.csv has %d epochs, want ≥ 200", len(out))
	}
	return out
}

// sepDeg returns the angle between two directions in degrees.
func sepDeg(a, b r3.Vec) float64 {
	// atan2(|a×b|, a·b) keeps precision at small angles.
	return math.Atan2(r3.Norm(r3.Cross(a, b)), r3.Dot(a, b)) / deg
}

// worstAgainstERFA returns the worst direction error (deg) and distance
// error (AU) of sun against the ERFA apparent direction.
func worstAgainstERFA(sun Sun, ref []erfaSun) (dirDeg, distAU, atJD float64) {
	for _, r := range ref {
		u, d := sun.Position(r.jdTT)
		if e := sepDeg(u, r.app); e > dirDeg {
			dirDeg, atJD = e, r.jdTT
		}
		distAU = math.Max(distAU, math.Abs(d/AUKm-r.distAU))
	}
	return dirDeg, distAU, atJD
}

func TestLowPrecisionAgainstERFA(t *testing.T) {
	// ERFA eraEpv00 + eraAb (testdata/gen_sun_erfa.py), 400 epochs 2000–2050.
	dir, dist, at := worstAgainstERFA(LowPrecision{}, readERFASun(t))
	t.Logf("low-precision vs ERFA apparent: worst direction %.5f° (JD %.1f), worst distance %.2e AU", dir, at, dist)
	if dir > tolLowPrecisionDeg {
		t.Errorf("direction error %.5f° > %g°", dir, tolLowPrecisionDeg)
	}
	if dist > tolDistAU {
		t.Errorf("distance error %.2e AU > %g AU", dist, tolDistAU)
	}
}

// ofDate is the trap the EME2000 test must catch: the AA sun left on the
// mean equator and equinox of date.
type ofDate struct{}

func (ofDate) Position(jdTT float64) (r3.Vec, float64) {
	x, y, z, rAU := lowPrecisionOfDate(jdTT)
	return r3.Vec{X: x, Y: y, Z: z}, rAU * AUKm
}

func TestOfDateSunFailsEME2000Check(t *testing.T) {
	// Precession over 25 years is 25 × 50.3″ ≈ 0.35° in longitude (Meeus
	// 1998 (21.1) p. 132, general precession); the direction check must
	// see it in 2025.
	var ref2025 []erfaSun
	for _, r := range readERFASun(t) {
		if r.jdTT >= 2460676.5 && r.jdTT < 2461041.5 { // 2025
			ref2025 = append(ref2025, r)
		}
	}
	if len(ref2025) == 0 {
		t.Fatal("no 2025 epochs in sun_erfa.csv")
	}
	dir, _, _ := worstAgainstERFA(ofDate{}, ref2025)
	t.Logf("sun of date (no precession) vs ERFA EME2000 in 2025: worst %.3f°", dir)
	if dir <= tolLowPrecisionDeg {
		t.Errorf("of-date sun passes the EME2000 check (%.4f°): the check cannot catch a missing precession", dir)
	}
	if dir < 0.30 || dir > 0.40 {
		t.Errorf("of-date sun error %.3f° in 2025, want about 0.35°", dir)
	}
}

func TestLowPrecisionVallado51(t *testing.T) {
	// Vallado 2013 (4th ed.) Example 5-1 p. 280: 2006-04-02 0h, JD 2453827.5,
	// r☉ = (0.9771945, 0.1924424, 0.0834308) AU, mean equator of date.
	// Tolerance 2e-5 AU per component: the book uses the T-form
	// coefficients of its Algorithm 29 and its own time tags.
	x, y, z, r := lowPrecisionOfDate(2453827.5)
	want := [3]float64{0.9771945, 0.1924424, 0.0834308}
	got := [3]float64{x * r, y * r, z * r}
	for i := range 3 {
		if math.Abs(got[i]-want[i]) > 2e-5 {
			t.Errorf("component %d: %.7f AU, want %.7f AU", i, got[i], want[i])
		}
	}
}

func TestLowPrecisionAtJ2000(t *testing.T) {
	// At J2000.0 precession vanishes, so the EME2000 vector equals the
	// of-date one (closed form), and its length is 1.
	u, d := LowPrecision{}.Position(JDJ2000)
	x, y, z, r := lowPrecisionOfDate(JDJ2000)
	if sepDeg(u, r3.Vec{X: x, Y: y, Z: z}) > 1e-12 || math.Abs(d-r*AUKm) > 1e-6 {
		t.Errorf("J2000: %v %v vs of date %v %v %v %v", u, d, x, y, z, r)
	}
	if math.Abs(r3.Norm(u)-1) > 1e-15 {
		t.Errorf("|u| = %v", r3.Norm(u))
	}
}

func TestSunByName(t *testing.T) {
	s, err := SunByName("low-precision")
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := s.(LowPrecision); !ok {
		t.Errorf("low-precision gave %T", s)
	}
	_, err = SunByName("vsop87")
	if err == nil {
		t.Fatal("unknown name accepted")
	}
	for _, want := range append([]string{"vsop87"}, SunModelNames()...) {
		if !strings.Contains(err.Error(), want) {
			t.Errorf("error %q does not name %q", err, want)
		}
	}
}

func ExampleLowPrecision_Position() {
	// Sun on 2025-01-01 00:00 UTC, EME2000 (values printed by this model;
	// they agree with ERFA to 0.02°, see TestLowPrecisionAgainstERFA).
	jd := JulianDateTT(time.Date(2025, 1, 1, 0, 0, 0, 0, time.UTC))
	u, dKm := LowPrecision{}.Position(jd)
	α := math.Mod(math.Atan2(u.Y, u.X)/deg+360, 360)
	δ := math.Asin(u.Z) / deg
	fmt.Printf("RA %.3f°, Dec %.3f°, distance %.6f AU\n", α, δ, dKm/AUKm)
	// Output:
	// RA 281.384°, Dec -23.023°, distance 0.983306 AU
}

// alongTrackBias returns the mean offset (arcsec) of the model from the
// ERFA apparent and geometric directions, measured along the direction of
// the aberration shift (geometric → apparent, about 20.5″ long).
func alongTrackBias(sun Sun, ref []erfaSun) (vsApparent, vsGeometric float64) {
	for _, r := range ref {
		u, _ := sun.Position(r.jdTT)
		e := r3.Unit(r3.Sub(r.app, r.geo))
		vsApparent += r3.Dot(r3.Sub(u, r.app), e)
		vsGeometric += r3.Dot(r3.Sub(u, r.geo), e)
	}
	n := float64(len(ref)) * arcsec
	return vsApparent / n, vsGeometric / n
}

func TestLowPrecisionIsApparent(t *testing.T) {
	// The AA mean longitude includes annual aberration (AA section C), so
	// the model's mean along-track offset must be closer to ERFA's
	// apparent direction than to the geometric one (they are 20.5″ apart;
	// Meeus 1998 (25.10) p. 167).
	app, geo := alongTrackBias(LowPrecision{}, readERFASun(t))
	t.Logf("low-precision mean along-track offset: %.2f″ from apparent, %.2f″ from geometric", app, geo)
	if math.Abs(app) >= math.Abs(geo) || math.Abs(app) > 10 {
		t.Errorf("low-precision looks geometric: %.2f″ from apparent, %.2f″ from geometric", app, geo)
	}
}
