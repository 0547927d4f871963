package study

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/scenario"
)

const quadHead = "orbit: {altitude_km: 500, ltan: \"10:30\"}\nbody:\n  sensors:\n"

// Every quadrant key of the file reaches the model: the wall kind's dead
// zone is atan(wall_distance_mm/shade_height_mm) (geometry: d/H = tan 30°
// gives 30°), the gate margins and the dead-zone choice are those given, a
// stated accuracy weights the sensor, and without one the weight is derived
// from the error model.
func TestQuadrantKeysReachTheModel(t *testing.T) {
	d := 2 * math.Tan(30*math.Pi/180)
	s, err := scenario.Parse([]byte(quadHead+
		"    - {name: w, kind: quadrant-wall, face: \"+Z\", shade_height_mm: 2, cell_size_mm: 3, wall_distance_mm: "+
		strconv.FormatFloat(d, 'g', 17, 64)+", dead_zone: no-sun, signal_margin: 0.3, imbalance_margin: 0.1, twist_deg_1sigma: 0.5}\n"+
		"    - {name: a, kind: quadrant, face: \"-Z\", aperture_mm: 1.5, accuracy_deg_1sigma: 0.7, errors: {dark_offset_1sigma: 0.001}}\n"+
		"    - {name: b, kind: quadrant, face: \"+X\", errors: {dark_offset_1sigma: 0.001}}\n"), ".")
	if err != nil {
		t.Fatal(err)
	}
	arr, _, _, err := BuildSensors(s, s.Body.Sensors, "body.sensors")
	if err != nil {
		t.Fatal(err)
	}
	w := arr.Sensors()[0].(*sensor.Quadrant)
	spec := w.Spec()
	if w.Kind() != sensor.KindQuadrantWall || spec.Geometry != sensor.GeometryWall || spec.DeadZone != sensor.DeadZoneNoSun ||
		spec.SignalMargin != 0.3 || spec.ImbalanceMargin != 0.1 || math.Abs(spec.TwistSigma-0.5*math.Pi/180) > 1e-15 {
		t.Errorf("wall spec %+v", spec)
	}
	if got := w.DeadZoneHalfAngle() * 180 / math.Pi; math.Abs(got-30) > 1e-9 {
		t.Errorf("dead zone %.10f°, want 30°", got)
	}
	a := arr.Sensors()[1].(*sensor.Quadrant)
	if a.Spec().ApertureSide != 1.5 || math.Abs(a.Sigma()-0.7*math.Pi/180) > 1e-15 {
		t.Errorf("aperture %g, σ %g°", a.Spec().ApertureSide, a.Sigma()*180/math.Pi)
	}
	b := arr.Sensors()[2].(*sensor.Quadrant)
	if b.Spec().ApertureSide != 2 || !(b.Sigma() > 0) || b.Sigma() == a.Sigma() {
		t.Errorf("default aperture %g (want the cell size 2), derived σ %g°", b.Spec().ApertureSide, b.Sigma()*180/math.Pi)
	}
	// The dead zone with no-sun: no reading at 20° off the boresight.
	sun := r3.Vec{X: math.Sin(20 * math.Pi / 180), Z: math.Cos(20 * math.Pi / 180)}
	if w.Read(sun, sensor.SolarConstant, sensor.Albedo{}, nil).Valid || w.SeesSun(sun) {
		t.Error("wall, no-sun dead zone: valid at 20°")
	}
	rec := string(s.Record())
	for _, k := range []string{"wall_distance_mm:", "dead_zone: no-sun", "dead_zone: straight-above", "signal_margin: 0.2", "aperture_mm: 1.5"} {
		if !strings.Contains(rec, k) {
			t.Errorf("record lacks %q:\n%s", k, rec)
		}
	}
}

// A half angle on a quadrant sensor is refused with the fix; the wall keys
// are refused on the aperture kind and the reverse.
func TestQuadrantRefusedKeys(t *testing.T) {
	for _, c := range []struct{ entry, want string }{
		{"{name: q, kind: quadrant, face: \"+Z\", half_angle_deg: 60}", "value does not apply to kind quadrant: its field of view follows from its geometry keys; remove half_angle_deg"},
		{"{name: q, kind: quadrant-wall, face: \"+Z\", half_angle_deg: 60}", "half_angle_deg"},
		{"{name: q, kind: quadrant, face: \"+Z\", wall_distance_mm: 1}", "allowed for kind quadrant-wall only"},
		{"{name: q, kind: quadrant-wall, face: \"+Z\", gap_mm: 0.1}", "allowed for kind quadrant only"},
		{"{name: q, kind: quadrant, face: \"+Z\", dead_zone: maybe}", "dead_zone"},
		{"{name: q, kind: quadrant, face: \"+Z\", imbalance_margin: 0.6}", "imbalance_margin"},
		{"{name: q, kind: cosine, face: \"+Z\", twist_deg_1sigma: 1}", "twist_deg_1sigma"},
	} {
		_, err := scenario.Parse([]byte(quadHead+"    - "+c.entry+"\n"), ".")
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want it to say %q", c.entry, err, c.want)
		}
	}
}
