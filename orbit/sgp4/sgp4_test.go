package sgp4

import (
	"encoding/csv"
	"errors"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

func readCSV(t *testing.T, path string) [][]string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return rows[1:]
}

func num(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatal(err)
	}
	return v
}

// codeOf maps an error to the error code of Vallado et al. 2006.
func codeOf(err error) int {
	switch {
	case err == nil:
		return 0
	case errors.Is(err, ErrEccentricity):
		return 1
	case errors.Is(err, ErrMeanMotion):
		return 2
	case errors.Is(err, ErrPerturbedEcc):
		return 3
	case errors.Is(err, ErrSemiLatus):
		return 4
	case errors.Is(err, ErrDecayed):
		return 6
	}
	return -1
}

// The verification element sets of Vallado, Crawford, Hujsak & Kelso
// (2006), "Revisiting Spacetrack Report #3", AIAA 2006-6753 (near-Earth,
// deep-space, 12 h and 24 h resonant, decaying and failing cases) against
// Debian's python3-sgp4 (testdata/gen_sgp4_ref.py): every state within 1 m
// and 1 mm/s, and the same error codes at the same times.
func TestVerificationSetsAgainstPythonSGP4(t *testing.T) {
	elements := map[string]Elements{}
	for _, r := range readCSV(t, "testdata/sgp4_elements.csv") {
		elements[r[0]] = Elements{EpochDays1950: num(t, r[3]), MeanMotion: num(t, r[4]), Eccentricity: num(t, r[5]),
			Inclination: num(t, r[6]), RAAN: num(t, r[7]), ArgPerigee: num(t, r[8]), MeanAnomaly: num(t, r[9]), BStar: num(t, r[10])}
	}
	models := map[string]*Model{}
	var worstR, worstV float64
	var worstCat string
	deep, near := 0, 0
	for _, r := range readCSV(t, "testdata/sgp4_states.csv") {
		cat := r[0]
		tsince := num(t, r[1])
		code, _ := strconv.Atoi(r[2])
		m, ok := models[cat]
		if !ok {
			var err error
			m, err = New(elements[cat], WGS72)
			if err != nil {
				if tsince != 0 || codeOf(err) != code {
					t.Errorf("%s: New: %v, reference code %d at %v min", cat, err, code, tsince)
				}
				models[cat] = nil
				continue
			}
			models[cat] = m
			if m.Deep() {
				deep++
			} else {
				near++
			}
		}
		if m == nil {
			continue
		}
		pos, vel, err := m.Propagate(tsince)
		if codeOf(err) != code {
			t.Errorf("%s at %v min: error %v, reference code %d", cat, tsince, err, code)
			continue
		}
		if code != 0 && code != 6 {
			continue
		}
		var dr, dv float64
		for k := 0; k < 3; k++ {
			dr = math.Max(dr, math.Abs(pos[k]-num(t, r[3+k])))
			dv = math.Max(dv, math.Abs(vel[k]-num(t, r[6+k])))
		}
		if dr > worstR {
			worstR, worstCat = dr, cat
		}
		worstV = math.Max(worstV, dv)
		if dr > 1e-3 || dv > 1e-6 {
			t.Errorf("%s at %v min: |Δr| %.3g km, |Δv| %.3g km/s", cat, tsince, dr, dv)
		}
	}
	if deep < 20 || near < 8 {
		t.Errorf("only %d deep-space and %d near-Earth sets ran", deep, near)
	}
	t.Logf("%d near-Earth, %d deep-space sets; worst position %.3g m (%s), velocity %.3g mm/s", near, deep, worstR*1e3, worstCat, worstV*1e6)
}

// The published output of the verification run (tcppver.out of Vallado et
// al. 2006, AIAA 2006-6753, as shipped with python3-sgp4): every state of
// every set within 1 m and 1 mm/s (the file prints 1e-8 km and 1e-9 km/s).
func TestVerificationSetsAgainstPublishedOutput(t *testing.T) {
	elements := map[string]Elements{}
	for _, r := range readCSV(t, "testdata/sgp4_elements.csv") {
		elements[strings.TrimLeft(r[0], "0")] = Elements{EpochDays1950: num(t, r[3]), MeanMotion: num(t, r[4]), Eccentricity: num(t, r[5]),
			Inclination: num(t, r[6]), RAAN: num(t, r[7]), ArgPerigee: num(t, r[8]), MeanAnomaly: num(t, r[9]), BStar: num(t, r[10])}
	}
	data, err := os.ReadFile("testdata/tcppver.out")
	if err != nil {
		t.Fatal(err)
	}
	var m *Model
	var cat string
	n, worst := 0, 0.0
	for _, line := range strings.Split(string(data), "\n") {
		f := strings.Fields(line)
		switch {
		case len(f) == 2 && f[1] == "xx":
			cat = f[0]
			el, ok := elements[cat]
			if !ok {
				t.Fatalf("set %s of the published output has no elements", cat)
			}
			if m, err = New(el, WGS72); err != nil {
				m = nil // 33334 fails at its epoch, as published (no states follow)
			}
		case len(f) >= 7 && m != nil:
			ts := num(t, f[0])
			r, v, _ := m.Propagate(ts)
			for k := range 3 {
				dr, dv := math.Abs(r[k]-num(t, f[1+k])), math.Abs(v[k]-num(t, f[4+k]))
				worst = math.Max(worst, dr)
				if dr > 1e-3 || dv > 1e-6 {
					t.Errorf("%s at %v min: component %d off by %.3g m, %.3g mm/s", cat, ts, k, dr*1e3, dv*1e6)
				}
			}
			n++
		}
	}
	if n < 500 {
		t.Errorf("only %d published states compared", n)
	}
	t.Logf("%d published states, worst position component %.3g m", n, worst*1e3)
}
