package scenario

import (
	"encoding/csv"
	"math"
	"os"
	"strconv"
	"testing"
	"time"
)

// ParseTLE against Debian's python3-sgp4 twoline2rv over the verification
// element sets of Vallado et al. 2006 (AIAA 2006-6753), as written by
// orbit/sgp4/testdata/gen_sgp4_ref.py: the same B*, angles, eccentricity,
// mean motion and epoch. Sets that break the column rules (short lines,
// bad checksums in the paper's file) are refused and not compared.
func TestParseTLEAgainstPythonSGP4(t *testing.T) {
	f, err := os.Open("../orbit/sgp4/testdata/sgp4_elements.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, r := range rows[1:] {
		tle, err := ParseTLE(r[1], r[2])
		if err != nil {
			continue
		}
		n++
		v := func(k int) float64 { x, _ := strconv.ParseFloat(r[k], 64); return x }
		epoch := time.Date(1949, 12, 31, 0, 0, 0, 0, time.UTC).Add(time.Duration(v(3) * 86400e9))
		checks := []struct {
			name      string
			got, want float64
			tol       float64
		}{
			{"epoch (s)", tle.Epoch.Sub(epoch).Seconds(), 0, 1e-3},
			{"mean motion (rad/min)", tle.MeanMotionRevDay * 2 * math.Pi / 1440, v(4), 1e-15},
			{"eccentricity", tle.Eccentricity, v(5), 1e-15},
			{"inclination", tle.InclinationRad, v(6), 1e-15},
			{"raan", tle.RAANRad, v(7), 1e-15},
			{"arg perigee", tle.ArgPerigeeRad, v(8), 1e-15},
			{"mean anomaly", tle.MeanAnomalyRad, v(9), 1e-15},
			{"bstar", tle.BStar, v(10), 1e-15},
		}
		for _, c := range checks {
			if math.Abs(c.got-c.want) > c.tol*math.Max(1, math.Abs(c.want)) {
				t.Errorf("%s %s: got %.15g, python3-sgp4 %.15g", r[0], c.name, c.got, c.want)
			}
		}
	}
	if n < 20 {
		t.Errorf("only %d of %d element sets parsed", n, len(rows)-1)
	}
	t.Logf("%d of %d verification element sets parsed and agree", n, len(rows)-1)
}

func TestParseTLEExp(t *testing.T) {
	for _, c := range []struct {
		in   string
		want float64
	}{{" 28098-4", 0.28098e-4}, {"-11606-4", -0.11606e-4}, {" 00000+0", 0}, {" 10000-3", 1e-4}, {"+14311-1", 0.014311}} {
		got, err := parseTLEExp(c.in)
		if err != nil || math.Abs(got-c.want) > 1e-15*math.Abs(c.want) {
			t.Errorf("parseTLEExp(%q) = %v, %v; want %v", c.in, got, err, c.want)
		}
	}
	for _, bad := range []string{"  2a098-4", " 28098 4", "-"} {
		if _, err := parseTLEExp(bad); err == nil {
			t.Errorf("parseTLEExp(%q) accepted", bad)
		}
	}
}

func FuzzParseTLE(f *testing.F) {
	f.Add("1 00005U 58002B   00179.78495062  .00000023  00000-0  28098-4 0  4753", "2 00005  34.2682 348.7242 1859667 331.7664  19.3264 10.82419157413667")
	f.Fuzz(func(t *testing.T, l1, l2 string) {
		tle, err := ParseTLE(l1, l2)
		if err != nil {
			return
		}
		if !(tle.MeanMotionRevDay > 0) || tle.Eccentricity < 0 || tle.Eccentricity >= 1 || math.IsNaN(tle.BStar) || math.IsInf(tle.BStar, 0) {
			t.Fatalf("accepted an element set out of range: %+v", tle)
		}
	})
}
