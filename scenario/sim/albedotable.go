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
// precomputed albedo table pays for its build (about 0.12 s of CPU for the
// 1° table of six sensors, BenchmarkLocalTable/build, against ~15 µs per
// step for the cell integral of six sensors). A variable so tests can use
// the table on short runs.
var albedoTableMinSteps = 10_000

// albedoTableRadiusTolKm is how far the orbit radius may stray from the
// table's before the step falls back to the cell integral: 1 km moves the
// result by 0.075 % of a sensor's largest value (illum/albedo LocalTable
// doc), well inside the 0.5 % accuracy of the integral itself.
const albedoTableRadiusTolKm = 1.0

// localAlbedo is the albedo table of a run with a uniform albedo, in one of
// two forms. For a nadir-pointing run on a circular orbit (the body fixed
// in the LVLH frame, a fixed radius, the sun at infinity) each sensor's
// albedo depends only on the sun's direction in LVLH: a LocalTable over that
// direction. For any other attitude, or a radius that varies, a
// BoresightTable per kind of cone (half-angle and response) over the sun's
// and the boresight's angles from nadir and their azimuth, at a few radii.
type localAlbedo struct {
	table *albedo.LocalTable
	rKm   float64

	bore   []*albedo.BoresightTable
	kindOf []int // sensor i reads bore[kindOf[i]]
	frame  albedo.SunFrame
}

// Boresight tables: the radius range they may span (at most
// boresightMaxRadii radii boresightRadiusStepKm apart; the test of
// illum/albedo measures the error between radii that far apart).
const (
	boresightRadiusStepKm = 25.0
	boresightMaxRadii     = 4
)

// localTableMaxSensors bounds the sensors of a LocalTable: it keeps 1.6 MB
// per sensor (221 × 360 nodes × 5 float64), so a large array uses the
// boresight tables instead (about 12 MB per kind of cone and radius, shared
// by every sensor of that kind), which keeps the memory of a run flat in
// the number of sensors.
const localTableMaxSensors = 8

// boresightMinWork is the number of sensor integrals (steps × sets of
// geometry × sensors) per table from which the boresight tables are built:
// one radius and kind of cone builds in about 0.05 s of CPU
// (BenchmarkBoresightTableBuild in illum/albedo), the time of some 20 000
// sensor integrals at ~2.5 µs each (BenchmarkIrradianceSixSensors). A
// variable so tests can use them on short runs.
var boresightMinWork = 20_000

// albedoTables are the tables of the truth's albedo model and of the
// on-board model (nil where none serves).
type albedoTables struct{ truth, onboard *localAlbedo }

// newAlbedoTables returns the tables of the truth's model and, with an
// on-board model, of that one: the same rules decide for both, so a
// prediction by the truth's own model goes the truth's route.
func newAlbedoTables(cfg *Config, steps, sets int) albedoTables {
	t := albedoTables{truth: newAlbedoTable(cfg, steps, sets)}
	if cfg.NewAlbedo != nil && cfg.NewCorrection != nil {
		c := *cfg
		c.NewAlbedo = cfg.NewCorrection
		t.onboard = newAlbedoTable(&c, steps, sets)
	}
	return t
}

// newAlbedoTable returns the table that serves the run, or nil (the loop
// integrates every step). sets is the number of geometries the run
// computes per step (1 when the units share one attitude).
func newAlbedoTable(cfg *Config, steps, sets int) *localAlbedo {
	if cfg.NewAlbedo == nil || cfg.NoAlbedoTable {
		return nil
	}
	if steps*sets >= albedoTableMinSteps && cfg.Array.Len() <= localTableMaxSensors {
		if t := buildLocalAlbedo(cfg); t != nil {
			return t
		}
	}
	return buildBoresightAlbedo(cfg, steps*sets)
}

// buildBoresightAlbedo returns boresight tables when they apply: a uniform
// albedo model, an orbit whose radius over its first three periods spans at
// most (boresightMaxRadii − 1) × boresightRadiusStepKm, and a run long
// enough. A step whose radius strays outside the tables is integrated.
func buildBoresightAlbedo(cfg *Config, stepSets int) *localAlbedo {
	m, err := cfg.NewAlbedo()
	if err != nil || !m.IsUniform() {
		return nil
	}
	p := cfg.NewPropagator()
	s0 := p.StateAt(0)
	period := orbitPeriod(s0)
	if math.IsNaN(period) {
		return nil
	}
	rMin, rMax := math.Inf(1), math.Inf(-1)
	span := min(3*period, cfg.Duration)
	for k := 0; k <= 192; k++ {
		r := vecmath.Norm(p.StateAt(span * float64(k) / 192).R)
		rMin, rMax = min(rMin, r), max(rMax, r)
	}
	radii := []float64{0.5 * (rMin + rMax)}
	if rMax-rMin > 2*albedo.BoresightSlackKm {
		n := int(math.Ceil((rMax-rMin)/boresightRadiusStepKm)) + 1
		if n > boresightMaxRadii {
			return nil
		}
		radii = radii[:0]
		for k := range n {
			radii = append(radii, rMin+(rMax-rMin)*float64(k)/float64(n-1))
		}
	}
	kinds, kindOf := coneKinds(cfg)
	t := &localAlbedo{kindOf: kindOf}
	if stepSets*cfg.Array.Len() < boresightMinWork*len(kinds)*len(radii) {
		return nil
	}
	for _, k := range kinds {
		// Shared for the process: the runs of a season or a sweep over one
		// orbit build each table once.
		b, err := albedo.SharedBoresightTable(m, radii, k.half, k.resp, albedo.DefaultBoresightSunResDeg, albedo.DefaultBoresightStepDeg)
		if err != nil {
			return nil
		}
		t.bore = append(t.bore, b)
	}
	return t
}

// coneKind is a kind of cone the boresight tables are built for: a
// half-angle and an angular response.
type coneKind struct {
	half float64
	resp albedo.Response
}

// coneKinds returns the distinct cones of cfg's sensors, in order of first
// appearance, and the kind of each sensor.
func coneKinds(cfg *Config) (kinds []coneKind, kindOf []int) {
	for i, s := range cfg.Array.Sensors() {
		k := coneKind{half: s.HalfAngle()}
		if cfg.AlbedoResponse != nil {
			k.resp = cfg.AlbedoResponse[i]
		}
		j := 0
		for j < len(kinds) && kinds[j] != k {
			j++
		}
		if j == len(kinds) {
			kinds = append(kinds, k)
		}
		kindOf = append(kindOf, j)
	}
	return kinds, kindOf
}

// AlbedoTableBytes estimates the memory of the albedo tables a run of cfg
// builds, for the truth's model and the on-board one: one boresight table
// per kind of cone at the orbit's radius at the epoch, zonal (ten
// channels: about 67 MB for a 60° cone) when the model shares zonal
// tables, uniform (about 7 MB) for a uniform albedo; none for a gridded map
// or no albedo. A uniform run on an orbit whose radius varies may build up
// to four radii per kind, and a short one none: the figure is the common
// case, made before any table is built.
func AlbedoTableBytes(cfg *Config) int64 {
	return tableBytes(cfg, cfg.NewAlbedo) + tableBytes(cfg, cfg.NewCorrection)
}

func tableBytes(cfg *Config, f func() (*albedo.Model, error)) int64 {
	if f == nil || cfg.Array == nil || cfg.NewPropagator == nil {
		return 0
	}
	m, err := f()
	if err != nil {
		return 0
	}
	zonal := m.SharesTables()
	if !zonal && (!m.IsUniform() || cfg.NoAlbedoTable) {
		return 0
	}
	r0 := vecmath.Norm(cfg.NewPropagator().StateAt(0).R)
	kinds, _ := coneKinds(cfg)
	var b int64
	for _, k := range kinds {
		b += albedo.BoresightTableBytes(1, r0, k.half, zonal, albedo.DefaultBoresightSunResDeg, albedo.DefaultBoresightStepDeg)
	}
	return b
}

// clone returns a copy with its own scratch frame, for one goroutine.
func (l *localAlbedo) clone() *localAlbedo {
	if l == nil {
		return nil
	}
	c := *l
	return &c
}

// buildLocalAlbedo returns the table when it applies to the run: a nadir
// law for every unit, a uniform albedo model, and an orbit whose radius stays
// within albedoTableRadiusTolKm over its first period. Otherwise nil (the
// loop integrates every step).
func buildLocalAlbedo(cfg *Config) *localAlbedo {
	law, ok := cfg.Law.(attitude.Nadir)
	// A yaw-steered nadir law turns in the LVLH frame: not fixed in it.
	if !ok || law.YawToSun || cfg.LawForUnit != nil || cfg.NewAlbedo == nil {
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

// irradiance fills dst (Dir in ECI) for the sensors (normals in ECI) from
// the table and reports true, or reports false when the spacecraft is too
// far from the table's radii.
func (l *localAlbedo) irradiance(dst []albedo.Result, st orbit.State, sunU r3.Vec, sunD float64, sensors []albedo.Sensor) bool {
	if l.bore != nil {
		if !l.bore[0].Frame(&l.frame, st.R, sunU, sunD) {
			return false
		}
		for i := range sensors {
			dst[i] = l.bore[l.kindOf[i]].At(&l.frame, sensors[i].Normal)
		}
		return true
	}
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
