package ccsds

import (
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"
	"time"

	"codeberg.org/sunsight/sunsight/orbit"
	"gonum.org/v1/gonum/spatial/r3"
)

// OEM is an Orbit Ephemeris Message read from its KVN form: the states of
// every data segment, in time order, EME2000 (km, km/s), UTC.
type OEM struct {
	ObjectName    string
	Interpolation string // LAGRANGE or HERMITE
	Degree        int
	Times         []time.Time
	States        []orbit.State
}

// Supported subset of CCSDS 502.0-B-2 (KVN): version 1.0 or 2.0 headers,
// CENTER_NAME EARTH, REF_FRAME EME2000, TIME_SYSTEM UTC, data lines of six
// numbers (or nine with accelerations, which are ignored), any number of
// segments that follow each other in time. Covariance sections, other
// frames, centres and time systems are refused.
var oemMetaKeys = map[string]bool{"OBJECT_NAME": true, "OBJECT_ID": true, "CENTER_NAME": true, "REF_FRAME": true,
	"REF_FRAME_EPOCH": true, "TIME_SYSTEM": true, "START_TIME": true, "USEABLE_START_TIME": true, "USEABLE_STOP_TIME": true,
	"STOP_TIME": true, "INTERPOLATION": true, "INTERPOLATION_DEGREE": true}

// ReadOEM parses an OEM in KVN form.
func ReadOEM(r io.Reader) (*OEM, error) {
	lines, err := kvnLines(r)
	if err != nil {
		return nil, fmt.Errorf("ccsds: OEM: %w", err)
	}
	if len(lines) == 0 {
		return nil, fmt.Errorf("ccsds: OEM: empty file; allowed a KVN OEM starting with CCSDS_OEM_VERS")
	}
	k, v, ok := keyValue(lines[0].text)
	if !ok || k != "CCSDS_OEM_VERS" || (v != "1.0" && v != "2.0") {
		return nil, errAt("OEM", lines[0], "first line %q; allowed CCSDS_OEM_VERS = 1.0 or 2.0 (KVN form)", lines[0].text)
	}
	o := &OEM{Interpolation: "LAGRANGE", Degree: 7}
	i := 1
	for ; i < len(lines) && lines[i].text != "META_START"; i++ {
		k, _, ok := keyValue(lines[i].text)
		if !ok || (k != "CREATION_DATE" && k != "ORIGINATOR" && k != "MESSAGE_ID") {
			return nil, errAt("OEM", lines[i], "%q in the header; allowed CREATION_DATE, ORIGINATOR, MESSAGE_ID", lines[i].text)
		}
	}
	segments := 0
	for i < len(lines) {
		if lines[i].text != "META_START" {
			return nil, errAt("OEM", lines[i], "%q; allowed META_START opening a segment", lines[i].text)
		}
		segments++
		meta := map[string]string{}
		for i++; i < len(lines) && lines[i].text != "META_STOP"; i++ {
			k, v, ok := keyValue(lines[i].text)
			if !ok || !oemMetaKeys[k] {
				return nil, errAt("OEM", lines[i], "%q in the metadata; allowed %s", lines[i].text, strings.Join(sortedKeys(oemMetaKeys), ", "))
			}
			meta[k] = v
		}
		if i == len(lines) {
			return nil, fmt.Errorf("ccsds: OEM: segment %d has no META_STOP", segments)
		}
		at := lines[i]
		i++
		for key, want := range map[string]string{"CENTER_NAME": "EARTH", "REF_FRAME": "EME2000", "TIME_SYSTEM": "UTC"} {
			if got := strings.ToUpper(meta[key]); got != want {
				return nil, errAt("OEM", at, "%s %q; allowed %s (the frame, centre and time scale sunsight works in)", key, meta[key], want)
			}
		}
		if v, ok := meta["INTERPOLATION"]; ok {
			v = strings.ToUpper(v)
			if v != "LAGRANGE" && v != "HERMITE" {
				return nil, errAt("OEM", at, "INTERPOLATION %q; allowed LAGRANGE or HERMITE", v)
			}
			o.Interpolation = v
		}
		if v, ok := meta["INTERPOLATION_DEGREE"]; ok {
			d, err := strconv.Atoi(v)
			if err != nil || d < 1 || d > 15 {
				return nil, errAt("OEM", at, "INTERPOLATION_DEGREE %q; allowed a whole number in [1, 15]", v)
			}
			o.Degree = d
		}
		o.ObjectName = meta["OBJECT_NAME"]
		for ; i < len(lines) && lines[i].text != "META_START"; i++ {
			if strings.HasPrefix(lines[i].text, "COVARIANCE_START") {
				return nil, errAt("OEM", lines[i], "covariance data are not supported; allowed state lines only (remove the covariance section)")
			}
			f := strings.Fields(lines[i].text)
			if len(f) != 7 && len(f) != 10 {
				return nil, errAt("OEM", lines[i], "%d fields; allowed an epoch and 6 numbers (x y z km, vx vy vz km/s), optionally 3 accelerations", len(f))
			}
			t, err := parseEpoch(f[0])
			if err != nil {
				return nil, errAt("OEM", lines[i], "%v", err)
			}
			var x [6]float64
			for k := range 6 {
				x[k], err = strconv.ParseFloat(f[1+k], 64)
				if err != nil || math.IsNaN(x[k]) || math.IsInf(x[k], 0) {
					return nil, errAt("OEM", lines[i], "field %d %q is not a finite number", k+2, f[1+k])
				}
			}
			if n := len(o.Times); n > 0 && !t.After(o.Times[n-1]) {
				return nil, errAt("OEM", lines[i], "epoch %s is not after the previous one; allowed increasing epochs", f[0])
			}
			o.Times = append(o.Times, t)
			o.States = append(o.States, orbit.State{R: r3.Vec{X: x[0], Y: x[1], Z: x[2]}, V: r3.Vec{X: x[3], Y: x[4], Z: x[5]}})
		}
	}
	if segments == 0 {
		return nil, fmt.Errorf("ccsds: OEM: no META_START; allowed at least one segment")
	}
	if len(o.Times) <= o.Degree {
		return nil, fmt.Errorf("ccsds: OEM: %d states; interpolation of degree %d needs at least %d", len(o.Times), o.Degree, o.Degree+1)
	}
	return o, nil
}

func sortedKeys(m map[string]bool) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

// WriteOEM writes states at epoch + k·step as a KVN OEM (version 2.0), one
// segment, EME2000, UTC, Lagrange interpolation of degree 7.
func WriteOEM(w io.Writer, object string, epoch time.Time, step float64, states []orbit.State, created time.Time) error {
	if len(states) < 2 {
		return fmt.Errorf("ccsds: OEM needs at least two states")
	}
	end := epoch.Add(time.Duration(step * float64(len(states)-1) * 1e9))
	var b strings.Builder
	fmt.Fprintf(&b, "CCSDS_OEM_VERS = 2.0\nCREATION_DATE = %s\nORIGINATOR = sunsight\n\nMETA_START\n", formatEpoch(created))
	fmt.Fprintf(&b, "OBJECT_NAME = %s\nOBJECT_ID = %s\nCENTER_NAME = EARTH\nREF_FRAME = EME2000\nTIME_SYSTEM = UTC\n", object, object)
	fmt.Fprintf(&b, "START_TIME = %s\nSTOP_TIME = %s\nINTERPOLATION = LAGRANGE\nINTERPOLATION_DEGREE = 7\nMETA_STOP\n\n", formatEpoch(epoch), formatEpoch(end))
	for k, s := range states {
		t := epoch.Add(time.Duration(step * float64(k) * 1e9))
		fmt.Fprintf(&b, "%s %.17g %.17g %.17g %.17g %.17g %.17g\n", formatEpoch(t), s.R.X, s.R.Y, s.R.Z, s.V.X, s.V.Y, s.V.Z)
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// Ephemeris interpolates an OEM: Lagrange polynomials of the file's degree
// through the degree+1 nearest states (position and velocity separately), or
// Hermite polynomials through the positions and velocities of the
// (degree+1)/2 nearest states, the velocity being the derivative of the
// position polynomial (the interpolation methods CCSDS 502.0-B-2 names;
// their formulas as in Burden & Faires, Numerical Analysis, §3.1 and §3.4,
// from memory). It is an orbit.Propagator whose t = 0 is the run epoch.
type Ephemeris struct {
	o     *OEM
	t     []float64 // seconds from the run epoch
	start time.Time
}

// Propagator returns the interpolating propagator for a run starting at
// runEpoch and lasting duration seconds; it refuses a run outside the file.
func (o *OEM) Propagator(runEpoch time.Time, duration float64) (*Ephemeris, error) {
	e := &Ephemeris{o: o, start: runEpoch, t: make([]float64, len(o.Times))}
	for k, t := range o.Times {
		e.t[k] = t.Sub(runEpoch).Seconds()
	}
	if e.t[0] > 1e-6 || e.t[len(e.t)-1] < duration-1e-6 {
		return nil, fmt.Errorf("ccsds: OEM covers %s to %s; allowed a run inside it (the run is %s for %.0f s)",
			formatEpoch(o.Times[0]), formatEpoch(o.Times[len(o.Times)-1]), formatEpoch(runEpoch), duration)
	}
	return e, nil
}

// window returns the first index of the n samples around t.
func (e *Ephemeris) window(t float64, n int) int {
	k := sort.SearchFloat64s(e.t, t) // first sample ≥ t
	i := k - n/2
	return max(0, min(i, len(e.t)-n))
}

// StateAt interpolates the state at t seconds after the run epoch.
func (e *Ephemeris) StateAt(t float64) orbit.State {
	if e.o.Interpolation == "HERMITE" {
		return e.hermite(t)
	}
	n := e.o.Degree + 1
	i := e.window(t, n)
	var out orbit.State
	for j := i; j < i+n; j++ {
		l := 1.0
		for m := i; m < i+n; m++ {
			if m != j {
				l *= (t - e.t[m]) / (e.t[j] - e.t[m])
			}
		}
		s := e.o.States[j]
		out.R = r3.Add(out.R, r3.Scale(l, s.R))
		out.V = r3.Add(out.V, r3.Scale(l, s.V))
	}
	return out
}

// hermite interpolates positions and velocities together: with nodes
// counted twice, the Hermite basis h_j(t) = (1 − 2 l_j'(t_j)(t − t_j)) l_j²,
// g_j(t) = (t − t_j) l_j², and the velocity is the derivative of the same
// polynomial.
func (e *Ephemeris) hermite(t float64) orbit.State {
	n := max(2, (e.o.Degree+1)/2)
	i := e.window(t, n)
	var out orbit.State
	for j := i; j < i+n; j++ {
		l, dl, d := 1.0, 0.0, 0.0 // l_j(t), l_j'(t), l_j'(t_j)
		for m := i; m < i+n; m++ {
			if m == j {
				continue
			}
			w := e.t[j] - e.t[m]
			d += 1 / w
			// product rule for l and its derivative
			f := (t - e.t[m]) / w
			dl = dl*f + l/w
			l *= f
		}
		u := t - e.t[j]
		h := (1 - 2*d*u) * l * l
		dh := -2*d*l*l + (1-2*d*u)*2*l*dl
		g := u * l * l
		dg := l*l + u*2*l*dl
		s := e.o.States[j]
		out.R = r3.Add(out.R, r3.Add(r3.Scale(h, s.R), r3.Scale(g, s.V)))
		out.V = r3.Add(out.V, r3.Add(r3.Scale(dh, s.R), r3.Scale(dg, s.V)))
	}
	return out
}

// Fill writes the states at t0 + k·dt into dst.
func (e *Ephemeris) Fill(dst []orbit.State, t0, dt float64) {
	for k := range dst {
		dst[k] = e.StateAt(t0 + float64(k)*dt)
	}
}
