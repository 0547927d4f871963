package ccsds

import (
	"bytes"
	"math"
	"strings"
	"testing"
	"time"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
	"codeberg.org/sunsight/sunsight/orbit"
	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"
)

var epoch = time.Date(2026, 3, 20, 0, 0, 0, 0, time.UTC)

// j2Orbit is a 550 km sun-synchronous orbit integrated by j2-numeric.
func j2Orbit(t *testing.T) orbit.Propagator {
	t.Helper()
	inc, _ := orbit.SunSyncInclination(orbit.RadiusEarthKm+550, 0.001)
	p, err := orbit.NewJ2Numeric(orbit.Elements{SemiMajorAxisKm: orbit.RadiusEarthKm + 550, Eccentricity: 0.001, Inclination: inc, RAAN: 1, ArgPerigee: 2, MeanAnomaly: 3}, orbit.NumericOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// An OEM written every 60 s from j2-numeric and read back reproduces the
// orbit between its samples to ≤ 1 m, with the Lagrange interpolation of
// degree 7 (the check) and with Hermite interpolation through
// positions and velocities; at the samples it returns them exactly.
func TestOEMInterpolationWithinOneMetre(t *testing.T) {
	p := j2Orbit(t)
	const n = 721 // 12 h
	states := make([]orbit.State, n)
	p.Fill(states, 0, 60)
	var b bytes.Buffer
	if err := WriteOEM(&b, "TEST", epoch, 60, states, epoch); err != nil {
		t.Fatal(err)
	}
	for _, interp := range []string{"LAGRANGE", "HERMITE"} {
		text := strings.Replace(b.String(), "INTERPOLATION = LAGRANGE", "INTERPOLATION = "+interp, 1)
		o, err := ReadOEM(strings.NewReader(text))
		if err != nil {
			t.Fatal(err)
		}
		e, err := o.Propagator(epoch, 12*3600)
		if err != nil {
			t.Fatal(err)
		}
		if got := e.StateAt(600); got != states[10] {
			t.Errorf("%s at a sample: %v, want the sample %v", interp, got, states[10])
		}
		ref := j2Orbit(t)
		worst, worstV := 0.0, 0.0
		for ts := 30.0; ts < 12*3600; ts += 60 {
			want, got := ref.StateAt(ts), e.StateAt(ts)
			worst = math.Max(worst, vecmath.Norm(r3.Sub(want.R, got.R)))
			worstV = math.Max(worstV, vecmath.Norm(r3.Sub(want.V, got.V)))
		}
		if worst > 1e-3 || worstV > 1e-6 {
			t.Errorf("%s: worst %.3g m, %.3g mm/s between samples; want ≤ 1 m, 1 mm/s", interp, worst*1e3, worstV*1e6)
		}
		t.Logf("%s: worst %.3g m, %.3g mm/s between 60 s samples", interp, worst*1e3, worstV*1e6)
	}
}

func TestOEMRefusals(t *testing.T) {
	p := j2Orbit(t)
	states := make([]orbit.State, 20)
	p.Fill(states, 0, 60)
	var b bytes.Buffer
	if err := WriteOEM(&b, "TEST", epoch, 60, states, epoch); err != nil {
		t.Fatal(err)
	}
	good := b.String()
	for _, c := range []struct{ from, to, want string }{
		{"REF_FRAME = EME2000", "REF_FRAME = ITRF", "REF_FRAME"},
		{"TIME_SYSTEM = UTC", "TIME_SYSTEM = TDB", "TIME_SYSTEM"},
		{"CENTER_NAME = EARTH", "CENTER_NAME = MOON", "CENTER_NAME"},
		{"CCSDS_OEM_VERS = 2.0", "CCSDS_OEM_VERS = 3.0", "CCSDS_OEM_VERS"},
		{"INTERPOLATION = LAGRANGE", "INTERPOLATION = SPLINE", "INTERPOLATION"},
		{"META_STOP\n\n", "META_STOP\n\nCOVARIANCE_START\n", "covariance"},
		{"OBJECT_ID", "COLOUR", "metadata"},
		{"2026-03-20T00:01:00.000000", "2026-03-20T00:00:00.000000", "not after"},
		{"2026-03-20T00:02:00.000000 ", "2026-03-20T00:02:00.000000 NaN ", "fields"},
	} {
		text := strings.Replace(good, c.from, c.to, 1)
		if text == good {
			t.Fatalf("case %q: nothing replaced", c.from)
		}
		if _, err := ReadOEM(strings.NewReader(text)); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q → %q: error %v, want one about %s", c.from, c.to, err, c.want)
		}
	}
	o, err := ReadOEM(strings.NewReader(good))
	if err != nil {
		t.Fatal(err)
	}
	if _, err := o.Propagator(epoch.Add(-time.Second), 60); err == nil {
		t.Error("a run starting before the file was accepted")
	}
	if _, err := o.Propagator(epoch, 3600); err == nil {
		t.Error("a run ending after the file was accepted")
	}
}

// Written and read back, an AEM gives the same quaternions bit for bit (A2B,
// scalar last); B2A and scalar-first files are turned to the same
// convention; Euler-angle files are refused.
func TestAEMRoundTrip(t *testing.T) {
	var times []time.Time
	var qs []quat.Number
	for k := range 50 {
		a := float64(k) * 0.37
		q := quat.Number{Real: math.Cos(a), Imag: math.Sin(a) * 0.6, Jmag: math.Sin(a) * 0.8}
		times = append(times, epoch.Add(time.Duration(k)*10*time.Second))
		qs = append(qs, quat.Scale(1/quat.Abs(q), q))
	}
	var b bytes.Buffer
	if err := WriteAEM(&b, "TEST", times, qs, epoch); err != nil {
		t.Fatal(err)
	}
	a, err := ReadAEM(strings.NewReader(b.String()))
	if err != nil {
		t.Fatal(err)
	}
	for k := range qs {
		if a.Q[k] != qs[k] || !a.Times[k].Equal(times[k]) {
			t.Fatalf("sample %d: %v %v, want %v %v", k, a.Times[k], a.Q[k], times[k], qs[k])
		}
	}
	b2a := strings.Replace(b.String(), "ATTITUDE_DIR = A2B", "ATTITUDE_DIR = B2A", 1)
	c, err := ReadAEM(strings.NewReader(b2a))
	if err != nil {
		t.Fatal(err)
	}
	if c.Q[3] != quat.Conj(qs[3]) {
		t.Errorf("B2A not inverted: %v, want %v", c.Q[3], quat.Conj(qs[3]))
	}
	for _, bad := range []struct{ from, to, want string }{
		{"ATTITUDE_TYPE = QUATERNION", "ATTITUDE_TYPE = EULER_ANGLE", "ATTITUDE_TYPE"},
		{"REF_FRAME_A = EME2000", "REF_FRAME_A = ICRF", "frames"},
		{"QUATERNION_TYPE = LAST", "QUATERNION_TYPE = MIDDLE", "QUATERNION_TYPE"},
	} {
		text := strings.Replace(b.String(), bad.from, bad.to, 1)
		if _, err := ReadAEM(strings.NewReader(text)); err == nil || !strings.Contains(err.Error(), bad.want) {
			t.Errorf("%q: error %v, want one about %s", bad.to, err, bad.want)
		}
	}
	csv := "time_utc,qx,qy,qz,qw\n2026-03-20T00:00:00Z,0,0,0,1\n2026-03-20T00:00:10Z,0,0,0.6,0.8\n"
	d, err := ReadAttitudeCSV(strings.NewReader(csv))
	if err != nil || len(d.Q) != 2 || d.Q[1] != (quat.Number{Real: 0.8, Kmag: 0.6}) {
		t.Errorf("CSV: %v %v", d, err)
	}
	if _, err := ReadAttitudeCSV(strings.NewReader("time_utc,qx,qy,qz,qw\n2026-03-20T00:00:00Z,0,0,0,2\n2026-03-20T00:00:10Z,0,0,0,1\n")); err == nil {
		t.Error("a non-unit quaternion was accepted")
	}
}

func FuzzReadOEM(f *testing.F) {
	var b bytes.Buffer
	states := []orbit.State{{R: r3.Vec{X: 7000}, V: r3.Vec{Y: 7.5}}, {R: r3.Vec{X: 6999}, V: r3.Vec{Y: 7.5}}}
	_ = WriteOEM(&b, "T", epoch, 60, states, epoch)
	f.Add(b.String())
	f.Add("CCSDS_OEM_VERS = 2.0\nMETA_START\nMETA_STOP\n")
	f.Fuzz(func(t *testing.T, s string) {
		o, err := ReadOEM(strings.NewReader(s))
		if err != nil {
			return
		}
		if len(o.Times) != len(o.States) || len(o.Times) <= o.Degree {
			t.Fatalf("inconsistent OEM: %d times, %d states, degree %d", len(o.Times), len(o.States), o.Degree)
		}
		e, err := o.Propagator(o.Times[0], o.Times[len(o.Times)-1].Sub(o.Times[0]).Seconds())
		if err == nil {
			e.StateAt(0)
		}
	})
}

func FuzzReadAEM(f *testing.F) {
	var b bytes.Buffer
	_ = WriteAEM(&b, "T", []time.Time{epoch, epoch.Add(time.Second)}, []quat.Number{{Real: 1}, {Real: 1}}, epoch)
	f.Add(b.String())
	f.Fuzz(func(t *testing.T, s string) {
		a, err := ReadAEM(strings.NewReader(s))
		if err != nil {
			return
		}
		for _, q := range a.Q {
			if math.Abs(quat.Abs(q)-1) > 1e-6 {
				t.Fatalf("non-unit quaternion %v accepted", q)
			}
		}
	})
}
