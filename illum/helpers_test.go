package illum

import (
	"bufio"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

const (
	muEarth = 398600.4418   // km³/s², WGS 84 (NIMA TR8350.2; from memory)
	auKm    = 149597870.700 // km, IAU 2012 Resolution B2 (from memory)
)

// circular is a closed-form circular two-body orbit (test helper).
type circular struct {
	a, inc, raan, u0 float64
	raanRate         float64 // rad/s, secular J2 node drift when set
}

func (c circular) n() float64      { return math.Sqrt(muEarth / (c.a * c.a * c.a)) }
func (c circular) period() float64 { return 2 * math.Pi / c.n() }

func (c circular) pos(t float64) r3.Vec {
	u := c.u0 + c.n()*t
	Ω := c.raan + c.raanRate*t
	su, cu := math.Sincos(u)
	sΩ, cΩ := math.Sincos(Ω)
	si, ci := math.Sincos(c.inc)
	return r3.Scale(c.a, r3.Vec{
		X: cu*cΩ - su*ci*sΩ,
		Y: cu*sΩ + su*ci*cΩ,
		Z: su * si,
	})
}

func (c circular) normal(t float64) r3.Vec {
	Ω := c.raan + c.raanRate*t
	sΩ, cΩ := math.Sincos(Ω)
	si, ci := math.Sincos(c.inc)
	return r3.Vec{X: si * sΩ, Y: -si * cΩ, Z: ci}
}

// betaOrbit is a circular orbit at beta angle β to a sun fixed on +X; u = 0
// is orbit noon (closed form).
func betaOrbit(altKm, β float64) (Geometry, float64) {
	a := EarthRadiusKm + altKm
	n := math.Sqrt(muEarth / (a * a * a))
	sβ, cβ := math.Sincos(β)
	p := r3.Vec{X: cβ, Z: -sβ}
	q := r3.Vec{Y: 1}
	sun := r3.Vec{X: auKm}
	g := func(t float64) (r3.Vec, r3.Vec) {
		su, cu := math.Sincos(n * t)
		return r3.Add(r3.Scale(a*cu, p), r3.Scale(a*su, q)), sun
	}
	return g, 2 * math.Pi / n
}

// sunTable is the ERFA sun sampled every 600 s, linearly interpolated
// (direction error < 2e-9 rad over 600 s: a·ω²·Δt²/8, closed form).
type sunTable struct {
	t0, dt float64
	p      []r3.Vec
}

func (s *sunTable) at(t float64) r3.Vec {
	x := (t - s.t0) / s.dt
	i := int(math.Floor(x))
	i = max(0, min(i, len(s.p)-2))
	f := x - float64(i)
	return r3.Add(r3.Scale(1-f, s.p[i]), r3.Scale(f, s.p[i+1]))
}

// readCSV returns the comment lines and the data rows (header dropped).
func readCSV(t *testing.T, path string) (comments []string, rows [][]string) {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	header := true
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") {
			comments = append(comments, line)
			continue
		}
		if header {
			header = false
			continue
		}
		rows = append(rows, strings.Split(line, ","))
	}
	return comments, rows
}

func atof(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil {
		t.Fatal(err)
	}
	return v
}

func loadSun(t *testing.T) *sunTable {
	_, rows := readCSV(t, "testdata/sun_erfa.csv")
	s := &sunTable{t0: atof(t, rows[0][0]), dt: atof(t, rows[1][0]) - atof(t, rows[0][0])}
	for _, r := range rows {
		s.p = append(s.p, r3.Vec{X: atof(t, r[1]), Y: atof(t, r[2]), Z: atof(t, r[3])})
	}
	return s
}
