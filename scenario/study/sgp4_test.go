package study

import (
	"encoding/csv"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
)

func readRows(t *testing.T, path string) [][]string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	cr := csv.NewReader(f)
	cr.Comment = '#'
	rows, err := cr.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return rows[1:]
}

// A TLE orbit runs SGP4 by default, in EME2000: the states of a near-Earth
// and a 12 h Molniya verification set (Vallado et al. 2006, AIAA 2006-6753)
// over two days against python3-sgp4 rotated by ERFA's IAU 1976/1980
// matrices (orbit/sgp4/testdata/gen_sgp4_ref.py): within 1 m and 1 mm/s.
func TestTLEScenarioRunsSGP4InEME2000(t *testing.T) {
	lines := map[string][2]string{}
	for _, r := range readRows(t, "../../orbit/sgp4/testdata/sgp4_elements.csv") {
		lines[r[0]] = [2]string{r[1], r[2]}
	}
	props := map[string]func(float64) (r, v [3]float64){}
	worst := 0.0
	for _, r := range readRows(t, "../../orbit/sgp4/testdata/sgp4_eme2000.csv") {
		cat := r[0]
		if _, ok := props[cat]; !ok {
			l := lines[cat]
			yaml := "orbit:\n  tle:\n    - \"" + l[0] + "\"\n    - \"" + l[1] + "\"\nduration: 2d\nbody:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n"
			s, err := scenario.Parse([]byte(yaml), "")
			if err != nil {
				t.Fatalf("%s: %v", cat, err)
			}
			if s.Orbit.Propagator != "sgp4" {
				t.Fatalf("%s: propagator %q; a TLE orbit defaults to sgp4", cat, s.Orbit.Propagator)
			}
			newProp, err := NewPropagator(s)
			if err != nil {
				t.Fatalf("%s: %v", cat, err)
			}
			p := newProp()
			props[cat] = func(ts float64) (r, v [3]float64) {
				st := p.StateAt(ts)
				return [3]float64{st.R.X, st.R.Y, st.R.Z}, [3]float64{st.V.X, st.V.Y, st.V.Z}
			}
		}
		ts, _ := strconv.ParseFloat(r[1], 64)
		pos, vel := props[cat](ts * 60)
		var dr, dv float64
		for k := 0; k < 3; k++ {
			x, _ := strconv.ParseFloat(r[2+k], 64)
			y, _ := strconv.ParseFloat(r[5+k], 64)
			dr = math.Max(dr, math.Abs(pos[k]-x))
			dv = math.Max(dv, math.Abs(vel[k]-y))
		}
		worst = math.Max(worst, dr)
		if dr > 1e-3 || dv > 1e-6 {
			t.Errorf("%s at %v min: |Δr| %.3g m, |Δv| %.3g mm/s", cat, ts, dr*1e3, dv*1e6)
		}
	}
	t.Logf("worst position difference %.3g m", worst*1e3)
}

// sgp4 needs a TLE; a decaying element set is refused before the run.
func TestSGP4Refusals(t *testing.T) {
	_, err := scenario.Parse([]byte("orbit: {altitude_km: 500, inclination_deg: 50, propagator: sgp4}\nbody:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n"), "")
	if err == nil || !strings.Contains(err.Error(), "orbit.propagator") {
		t.Errorf("sgp4 without a TLE: %v", err)
	}
}

// Element sets that fail inside the run (decay, eccentricity leaving [0, 1):
// catalogues 28872, 29141 and 22312 of the verification file) are refused
// with the time of the failure.
func TestSGP4FailureInsideRunRefused(t *testing.T) {
	n := 0
	for _, r := range readRows(t, "../../orbit/sgp4/testdata/sgp4_elements.csv") {
		if r[0] != "28872" && r[0] != "29141" && r[0] != "22312" {
			continue
		}
		yaml := "orbit:\n  tle:\n    - \"" + r[1] + "\"\n    - \"" + r[2] + "\"\nduration: 2d\nbody:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\n"
		s, err := scenario.Parse([]byte(yaml), "")
		if err != nil {
			continue // the verification file's lines do not all pass the checksum
		}
		n++
		if _, err := NewPropagator(s); err == nil || !strings.Contains(err.Error(), "orbit") {
			t.Errorf("%s: a run the element set does not survive was accepted (%v)", r[0], err)
		}
	}
	if n == 0 {
		t.Fatal("no failing element set parsed")
	}
}
