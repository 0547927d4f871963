package ephem

import (
	"encoding/csv"
	"fmt"
	"math"
	"os"
	"strconv"
	"testing"
	"time"
)

// readCSV reads a generator's output under testdata/, skipping '#' lines
// and the header row.
func readCSV(t testing.TB, name string) [][]string {
	t.Helper()
	f, err := os.Open("testdata/" + name)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return rows[1:]
}

func parseFloats(t testing.TB, row []string) []float64 {
	t.Helper()
	out := make([]float64, len(row))
	for i, s := range row {
		v, err := strconv.ParseFloat(s, 64)
		if err != nil {
			t.Fatalf("testdata: %v", err)
		}
		out[i] = v
	}
	return out
}

func TestTAIMinusUTCStep2017(t *testing.T) {
	// IERS Bulletin C 52 (2016): a leap second at the end of 2016-12-31,
	// ΔAT 36 s → 37 s.
	for _, c := range []struct {
		utc  string
		want float64
	}{
		{"2016-12-31T23:59:59Z", 36},
		{"2017-01-01T00:00:00Z", 37},
		{"2030-06-01T00:00:00Z", 37}, // after the table: last value held (documented)
		{"1965-01-01T00:00:00Z", 10}, // before 1972: first value held (documented)
	} {
		tm, _ := time.Parse(time.RFC3339, c.utc)
		if got := TAIMinusUTC(tm); got != c.want {
			t.Errorf("TAIMinusUTC(%s) = %v, want %v", c.utc, got, c.want)
		}
	}
}

func TestTAIMinusUTCAgainstERFA(t *testing.T) {
	// ERFA eraDat at each step and one second before (testdata/gen_time_erfa.py).
	for _, row := range readCSV(t, "leap_erfa.csv") {
		tm, err := time.Parse(time.RFC3339, row[0])
		if err != nil {
			t.Fatal(err)
		}
		want, _ := strconv.ParseFloat(row[1], 64)
		if tm.Year() < 1972 {
			// ERFA gives the pre-1972 drift value (9.9 s); we hold 10 s (documented).
			if got := TAIMinusUTC(tm); math.Abs(got-want) > 0.2 {
				t.Errorf("TAIMinusUTC(%s) = %v, ERFA %v", row[0], got, want)
			}
			continue
		}
		if got := TAIMinusUTC(tm); got != want {
			t.Errorf("TAIMinusUTC(%s) = %v, ERFA %v", row[0], got, want)
		}
	}
}

func TestJulianDates(t *testing.T) {
	for _, c := range []struct {
		name string
		got  float64
		want float64
		tol  float64
	}{
		// Meeus 1998 Example 7.a p. 61: 1957 Oct 4.81 → JD 2436116.31.
		{"Meeus 7.a", JulianDateUT1(time.Date(1957, 10, 4, 19, 26, 24, 0, time.UTC)), 2436116.31, 1e-8},
		// Meeus 1998 p. 62 list: 2000 Jan 1.5 → 2451545.0, 1987 Jun 19.5 → 2446966.0.
		{"Meeus p62 2000", JulianDateUT1(time.Date(2000, 1, 1, 12, 0, 0, 0, time.UTC)), 2451545.0, 1e-9},
		{"Meeus p62 1987", JulianDateUT1(time.Date(1987, 6, 19, 12, 0, 0, 0, time.UTC)), 2446966.0, 1e-9},
		// J2000.0 = 2000-01-01 11:58:55.816 UTC (TAI−UTC 32 s + 32.184 s;
		// Vallado 2013 p. 190, from memory; closed form from the definitions).
		{"J2000 TT", JulianDateTT(time.Date(2000, 1, 1, 11, 58, 55, 816e6, time.UTC)), JDJ2000, 1e-9},
		// TT − UTC = 37 + 32.184 s after 2017 (closed form).
		{"TT-UTC 2025", (JulianDateTT(time.Date(2025, 1, 1, 0, 0, 0, 0, time.UTC)) - 2460676.5) * SecondsPerDay, 69.184, 1e-4},
		// Meeus 1998 Example 12.a: 1987 Apr 10 0h → T = −0.127296372348.
		{"Meeus 12.a T", CenturiesTT(2446895.5), -0.127296372348, 1e-12},
	} {
		if math.Abs(c.got-c.want) > c.tol {
			t.Errorf("%s: got %.10f, want %.10f", c.name, c.got, c.want)
		}
	}
}

func TestGMSTPublished(t *testing.T) {
	hms := func(h, m, s float64) float64 { return (h + m/60 + s/3600) * 15 * deg }
	for _, c := range []struct {
		name  string
		jdUT1 float64
		want  float64 // rad
		tol   float64 // rad
	}{
		// Meeus 1998 Example 12.a p. 88: 1987 Apr 10 0h UT → 13h10m46.3668s.
		{"Meeus 12.a", 2446895.5, hms(13, 10, 46.3668), 1e-4 * 15 * arcsec},
		// Meeus 1998 Example 12.b p. 89: 1987 Apr 10 19:21:00 UT → 8h34m57.0896s.
		{"Meeus 12.b", JulianDateUT1(time.Date(1987, 4, 10, 19, 21, 0, 0, time.UTC)), hms(8, 34, 57.0896), 1e-4 * 15 * arcsec},
		// Vallado 2013 (4th ed.) Example 3-5 p. 188: 1992-08-20 12:14:00 UT1 → 152.578787810°.
		{"Vallado 3-5", JulianDateUT1(time.Date(1992, 8, 20, 12, 14, 0, 0, time.UTC)), 152.578787810 * deg, 1e-6 * deg},
		// SOFA/ERFA test suite t_gmst82: UT1 = 2400000.5 + 53736.0 → 1.754174981860675 rad.
		// Tolerance 1e-8 rad (2 mas): Meeus's degree-form coefficients are
		// rounded differently from SOFA's seconds form (they agree to < 1 mas
		// over 2000–2050, see TestGMSTAndMeanSunAgainstERFA).
		{"SOFA t_gmst82", 2400000.5 + 53736.0, 1.754174981860675, 1e-8},
	} {
		got := GMST(c.jdUT1)
		if math.Abs(got-c.want) > c.tol {
			t.Errorf("%s: GMST = %.10f°, want %.10f° (diff %.3g″)", c.name, got/deg, c.want/deg, (got-c.want)/arcsec)
		}
	}
}

func TestGMSTRange(t *testing.T) {
	// closed form: result in [0, 2π) over many days, including before J2000.
	for jd := 2415020.0; jd < 2488070; jd += 97.37 {
		if g := GMST(jd); g < 0 || g >= 2*math.Pi || math.IsNaN(g) {
			t.Fatalf("GMST(%v) = %v out of [0, 2π)", jd, g)
		}
	}
}

func TestGMSTAndMeanSunAgainstERFA(t *testing.T) {
	// ERFA eraGmst82 and eraPmat76 (testdata/gen_time_erfa.py).
	var worstG, worstP, worstRA float64
	for _, row := range readCSV(t, "mean_sun_erfa.csv") {
		v := parseFloats(t, row)
		jd := v[0]
		if d := math.Abs(angleDiff(GMST(jd), v[10]*deg)); d > worstG {
			worstG = d
		}
		P := precessionJ2000ToDate(CenturiesTT(jd))
		for i := range 3 {
			for j := range 3 {
				worstP = math.Max(worstP, math.Abs(P[i][j]-v[1+3*i+j]))
			}
		}
		if d := math.Abs(angleDiff(MeanSunRA2000(jd), v[11]*deg)); d > worstRA {
			worstRA = d
		}
	}
	t.Logf("worst vs ERFA: GMST %.3g″, pmat76 element %.3g, mean-sun RA %.3g″", worstG/arcsec, worstP, worstRA/arcsec)
	if worstG > 1e-3*arcsec { // 1 mas
		t.Errorf("GMST vs eraGmst82: %.3g″ > 0.001″", worstG/arcsec)
	}
	if worstP > 1e-12 {
		t.Errorf("precession vs eraPmat76: %.3g > 1e-12", worstP)
	}
	if worstRA > 1e-3*arcsec {
		t.Errorf("MeanSunRA2000 vs ERFA-precessed mean sun: %.3g″ > 0.001″", worstRA/arcsec)
	}
}

func TestMeanSunRA2000(t *testing.T) {
	// At J2000.0 there is no precession: α = L = 280.460° (AA section C; closed form).
	if got := MeanSunRA2000(JDJ2000) / deg; math.Abs(got-280.460) > 1e-9 {
		t.Errorf("MeanSunRA2000(J2000) = %.9f°, want 280.460°", got)
	}
	// In 2025 the EME2000 RA sits below the of-date L by roughly the
	// general precession in RA, m + n sin α tan δ with δ = 0: m = 3.075 s/yr
	// = 46.1″/yr (Meeus 1998 (21.1) p. 132) → 25 yr ≈ 0.32°.
	jd := JulianDateTT(time.Date(2025, 1, 1, 0, 0, 0, 0, time.UTC))
	L := math.Mod(280.460+0.9856474*(jd-JDJ2000), 360)
	d := L - MeanSunRA2000(jd)/deg
	if d < 0.30 || d > 0.34 {
		t.Errorf("L − α2000 in 2025 = %.4f°, want about 0.32°", d)
	}
}

// angleDiff returns a − b wrapped to (−π, π].
func angleDiff(a, b float64) float64 {
	d := math.Mod(a-b, 2*math.Pi)
	if d > math.Pi {
		d -= 2 * math.Pi
	} else if d <= -math.Pi {
		d += 2 * math.Pi
	}
	return d
}

func ExampleGMST() {
	// Meeus 1998 Example 12.b p. 89: 1987 April 10, 19h21m00s UT.
	jd := JulianDateUT1(time.Date(1987, 4, 10, 19, 21, 0, 0, time.UTC))
	θ := GMST(jd) / deg
	h := θ / 15
	m := (h - math.Floor(h)) * 60
	s := (m - math.Floor(m)) * 60
	fmt.Printf("GMST = %.6f° = %dh%02dm%07.4fs\n", θ, int(h), int(m), s)
	// Output:
	// GMST = 128.737873° = 8h34m57.0896s
}
