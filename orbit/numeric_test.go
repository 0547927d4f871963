package orbit

import (
	"encoding/csv"
	"flag"
	"fmt"
	"math"
	"os"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

var regenInitial = flag.Bool("regen-initial", false, "rewrite testdata/j2_initial.csv (then run testdata/gen_j2_scipy.py)")

// scipyCase is one orbit of the independent reference integration. The
// mean elements are ours (invented); the tolerance is the brief's target.
type scipyCase struct {
	name  string
	mean  Elements
	tolKm float64
}

func scipyCases() []scipyCase {
	sso, _ := SunSyncInclination(RadiusEarthKm+550, 0.001)
	return []scipyCase{
		{"leo420", Elements{RadiusEarthKm + 420, 0.0005, 51.6 * deg, 30 * deg, 40 * deg, 50 * deg}, 0.010},
		{"sso550", Elements{RadiusEarthKm + 550, 0.001, sso, 100 * deg, 90 * deg, 0}, 0.010},
		{"heo", Elements{26600, 0.74, 63.4 * deg, 10 * deg, 270 * deg, 0}, 0.100},
	}
}

func readCSV(t *testing.T, path string) [][]string {
	t.Helper()
	f, err := os.Open(path)
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
	return rows[1:] // header
}

func parseRow(t *testing.T, row []string) []float64 {
	t.Helper()
	out := make([]float64, len(row)-1)
	for i, s := range row[1:] {
		v, err := strconv.ParseFloat(s, 64)
		if err != nil {
			t.Fatal(err)
		}
		out[i] = v
	}
	return out
}

// J2Numeric against scipy.integrate.solve_ivp DOP853 (rtol 1e-12, atol
// 1e-12) of the same point-mass + J2 equations written independently in
// testdata/gen_j2_scipy.py, from the initial osculating states in
// testdata/j2_initial.csv; 3 days, every 10 minutes.
func TestJ2NumericAgainstScipy(t *testing.T) {
	cases := scipyCases()
	if *regenInitial {
		f, err := os.Create("testdata/j2_initial.csv")
		if err != nil {
			t.Fatal(err)
		}
		fmt.Fprintln(f, "# initial osculating EME2000 states (km, km/s) that NewJ2Numeric derives from the mean elements of numeric_test.go")
		fmt.Fprintln(f, "case,x,y,z,vx,vy,vz")
		for _, c := range cases {
			p, err := NewJ2Numeric(c.mean, NumericOptions{})
			if err != nil {
				t.Fatal(err)
			}
			s := p.InitialState()
			fmt.Fprintf(f, "%s,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g\n", c.name, s.R.X, s.R.Y, s.R.Z, s.V.X, s.V.Y, s.V.Z)
		}
		if err := f.Close(); err != nil {
			t.Fatal(err)
		}
	}
	initial := map[string][]float64{}
	for _, row := range readCSV(t, "testdata/j2_initial.csv") {
		initial[row[0]] = parseRow(t, row)
	}
	ref := map[string][][]float64{}
	for _, row := range readCSV(t, "testdata/j2_scipy.csv") {
		ref[row[0]] = append(ref[row[0]], parseRow(t, row))
	}
	for _, c := range cases {
		p, err := NewJ2Numeric(c.mean, NumericOptions{})
		if err != nil {
			t.Fatal(err)
		}
		s0, in := p.InitialState(), initial[c.name]
		// The committed start must still be what the Go code derives, to
		// 1 mm (well below the 10 m target; rounding in the mean-element
		// conversion moves it by nanometres).
		if d := r3.Norm(r3.Sub(s0.R, r3.Vec{X: in[0], Y: in[1], Z: in[2]})); d > 1e-6 {
			t.Fatalf("%s: initial state moved by %.3g km; rerun with -regen-initial and the generator", c.name, d)
		}
		rows := ref[c.name]
		if len(rows) != 433 {
			t.Fatalf("%s: %d reference rows, want 433", c.name, len(rows))
		}
		worst := 0.0
		for _, r := range rows {
			s := p.StateAt(r[0])
			worst = math.Max(worst, r3.Norm(r3.Sub(s.R, r3.Vec{X: r[1], Y: r[2], Z: r[3]})))
		}
		t.Logf("%s: worst |Δr| = %.3g m over 3 days", c.name, worst*1e3)
		if worst > c.tolKm {
			t.Errorf("%s: worst |Δr| = %.3g m, want ≤ %.0f m", c.name, worst*1e3, c.tolKm*1e3)
		}
	}
}
