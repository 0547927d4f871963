package sim

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/internal/vecmath"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// albedoTableMinSteps is the run length (steps × units) from which a
// precomputed albedo table pays for its build (about 1 s, against ~20 µs per
// step for the cell integral of six sensors). A variable so tests can use
// the table on short runs.
var albedoTableMinSteps = 100_000

// albedoTableRadiusTolKm is how far the orbit radius may stray from the
// table's before the step falls back to the cell integral: 1 km moves the
// result by 0.075 % of a sensor's largest value (illum/albedo LocalTable
// doc), well inside the 0.5 % accuracy of the integral itself.
const albedoTableRadiusTolKm = 1.0

// localAlbedo is the albedo table of a nadir-pointing run: with the body
// fixed in the LVLH frame, a uniform Earth at a fixed radius and the sun at
// infinity, each sensor's albedo depends only on the sun's direction in
// LVLH, so a table over that direction replaces the cell integral.
type localAlbedo struct {
	table *albedo.LocalTable
	rKm   float64
}

// buildLocalAlbedo returns the table when it applies to the run: a nadir
// law for every unit, a uniform albedo model, and an orbit whose radius stays
// within albedoTableRadiusTolKm over its first period. Otherwise nil (the
// loop integrates every step).
func buildLocalAlbedo(cfg *Config) *localAlbedo {
	law, ok := cfg.Law.(attitude.Nadir)
	if !ok || cfg.LawForUnit != nil || cfg.NewAlbedo == nil {
		return nil
	}
	p := cfg.NewPropagator()
	s0 := p.StateAt(0)
	r0 := vecmath.Norm(s0.R)
	period := orbitPeriod(s0)
	if math.IsNaN(period) {
		return nil
	}
	for k := 1; k <= 64; k++ {
		if math.Abs(vecmath.Norm(p.StateAt(period*float64(k)/64).R)-r0) > albedoTableRadiusTolKm/2 {
			return nil
		}
	}
	m, err := cfg.NewAlbedo()
	if err != nil {
		return nil
	}
	sunU, _ := cfg.Sun.Position(ephem.JulianDateTT(cfg.Epoch))
	A := attitudeRot(law.Attitude(0, s0, sunU))
	x, y, z := orbit.LVLH(s0)
	var sensors []albedo.Sensor
	for i, s := range cfg.Array.Sensors() {
		n := A.toECI(s.Mount().Boresight())
		as := albedo.Sensor{Normal: r3.Vec{X: r3.Dot(x, n), Y: r3.Dot(y, n), Z: r3.Dot(z, n)}, HalfAngle: s.HalfAngle()}
		if cfg.AlbedoResponse != nil {
			as.Response = cfg.AlbedoResponse[i]
		}
		sensors = append(sensors, as)
	}
	t, err := albedo.NewLocalTable(m, r0, sensors, albedo.DefaultTableResDeg)
	if err != nil {
		return nil // not a uniform model: integrate
	}
	return &localAlbedo{table: t, rKm: r0}
}

// irradiance fills dst (Dir in ECI) from the table and reports true, or
// reports false when the spacecraft is too far from the table's radius.
func (l *localAlbedo) irradiance(dst []albedo.Result, st orbit.State, sunU r3.Vec, sunD float64) bool {
	if math.Abs(vecmath.Norm(st.R)-l.rKm) > albedoTableRadiusTolKm {
		return false
	}
	x, y, z := orbit.LVLH(st)
	l.table.Irradiance(dst, r3.Vec{X: r3.Dot(x, sunU), Y: r3.Dot(y, sunU), Z: r3.Dot(z, sunU)}, sunD)
	for i := range dst {
		d := dst[i].Dir
		dst[i].Dir = r3.Add(r3.Add(r3.Scale(d.X, x), r3.Scale(d.Y, y)), r3.Scale(d.Z, z))
	}
	return true
}
