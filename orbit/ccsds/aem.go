package ccsds

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"time"

	"gonum.org/v1/gonum/num/quat"
)

// AEM is an Attitude Ephemeris Message (or an attitude CSV) read into
// quaternions of the rotation EME2000 → body (the tool's attitude
// convention: A.Rotate(v_EME2000) is v in body axes), in time order, UTC.
type AEM struct {
	ObjectName string
	Times      []time.Time
	Q          []quat.Number // unit, real part Real
}

// Supported subset of CCSDS 504.0-B-1 (KVN): CCSDS_AEM_VERS 1.0, one or more
// segments with REF_FRAME_A EME2000 and REF_FRAME_B a body frame
// (SC_BODY_1), ATTITUDE_DIR A2B or B2A, TIME_SYSTEM UTC, ATTITUDE_TYPE
// QUATERNION with QUATERNION_TYPE FIRST or LAST. Other attitude types
// (Euler angles, spin, rates) are refused.
var aemMetaKeys = map[string]bool{"OBJECT_NAME": true, "OBJECT_ID": true, "CENTER_NAME": true, "REF_FRAME_A": true,
	"REF_FRAME_B": true, "ATTITUDE_DIR": true, "TIME_SYSTEM": true, "START_TIME": true, "USEABLE_START_TIME": true,
	"USEABLE_STOP_TIME": true, "STOP_TIME": true, "ATTITUDE_TYPE": true, "QUATERNION_TYPE": true,
	"INTERPOLATION_METHOD": true, "INTERPOLATION_DEGREE": true}

// ReadAEM parses an AEM in KVN form.
func ReadAEM(r io.Reader) (*AEM, error) {
	lines, err := kvnLines(r)
	if err != nil {
		return nil, fmt.Errorf("ccsds: AEM: %w", err)
	}
	if len(lines) == 0 {
		return nil, fmt.Errorf("ccsds: AEM: empty file; allowed a KVN AEM starting with CCSDS_AEM_VERS")
	}
	k, v, ok := keyValue(lines[0].text)
	if !ok || k != "CCSDS_AEM_VERS" || v != "1.0" {
		return nil, errAt("AEM", lines[0], "first line %q; allowed CCSDS_AEM_VERS = 1.0 (KVN form)", lines[0].text)
	}
	a := &AEM{}
	i := 1
	for ; i < len(lines) && lines[i].text != "META_START"; i++ {
		k, _, ok := keyValue(lines[i].text)
		if !ok || (k != "CREATION_DATE" && k != "ORIGINATOR" && k != "MESSAGE_ID") {
			return nil, errAt("AEM", lines[i], "%q in the header; allowed CREATION_DATE, ORIGINATOR, MESSAGE_ID", lines[i].text)
		}
	}
	segments := 0
	for i < len(lines) {
		if lines[i].text != "META_START" {
			return nil, errAt("AEM", lines[i], "%q; allowed META_START opening a segment", lines[i].text)
		}
		segments++
		meta := map[string]string{}
		for i++; i < len(lines) && lines[i].text != "META_STOP"; i++ {
			k, v, ok := keyValue(lines[i].text)
			if !ok || !aemMetaKeys[k] {
				return nil, errAt("AEM", lines[i], "%q in the metadata; allowed %s", lines[i].text, strings.Join(sortedKeys(aemMetaKeys), ", "))
			}
			meta[k] = strings.ToUpper(v)
		}
		if i == len(lines) {
			return nil, fmt.Errorf("ccsds: AEM: segment %d has no META_STOP", segments)
		}
		at := lines[i]
		i++
		if meta["REF_FRAME_A"] != "EME2000" || !strings.HasPrefix(meta["REF_FRAME_B"], "SC_BODY") {
			return nil, errAt("AEM", at, "frames %q → %q; allowed REF_FRAME_A = EME2000 and REF_FRAME_B = SC_BODY_n", meta["REF_FRAME_A"], meta["REF_FRAME_B"])
		}
		if meta["TIME_SYSTEM"] != "UTC" {
			return nil, errAt("AEM", at, "TIME_SYSTEM %q; allowed UTC", meta["TIME_SYSTEM"])
		}
		if meta["ATTITUDE_TYPE"] != "QUATERNION" {
			return nil, errAt("AEM", at, "ATTITUDE_TYPE %q is not supported; allowed QUATERNION", meta["ATTITUDE_TYPE"])
		}
		first := meta["QUATERNION_TYPE"] == "FIRST"
		if !first && meta["QUATERNION_TYPE"] != "LAST" {
			return nil, errAt("AEM", at, "QUATERNION_TYPE %q; allowed FIRST or LAST", meta["QUATERNION_TYPE"])
		}
		b2a := meta["ATTITUDE_DIR"] == "B2A"
		if !b2a && meta["ATTITUDE_DIR"] != "A2B" {
			return nil, errAt("AEM", at, "ATTITUDE_DIR %q; allowed A2B or B2A", meta["ATTITUDE_DIR"])
		}
		if strings.HasPrefix(lines[min(i, len(lines)-1)].text, "DATA_START") {
			i++
		}
		a.ObjectName = meta["OBJECT_NAME"]
		for ; i < len(lines) && lines[i].text != "META_START"; i++ {
			if lines[i].text == "DATA_STOP" || lines[i].text == "DATA_START" {
				continue
			}
			f := strings.Fields(lines[i].text)
			if len(f) != 5 {
				return nil, errAt("AEM", lines[i], "%d fields; allowed an epoch and four quaternion components", len(f))
			}
			t, err := parseEpoch(f[0])
			if err != nil {
				return nil, errAt("AEM", lines[i], "%v", err)
			}
			q, err := quaternion(f[1:], first, b2a)
			if err != nil {
				return nil, errAt("AEM", lines[i], "%v", err)
			}
			if err := a.add(t, q); err != nil {
				return nil, errAt("AEM", lines[i], "%v", err)
			}
		}
	}
	if segments == 0 {
		return nil, fmt.Errorf("ccsds: AEM: no META_START; allowed at least one segment")
	}
	if len(a.Times) < 2 {
		return nil, fmt.Errorf("ccsds: AEM: %d attitudes; allowed at least two", len(a.Times))
	}
	return a, nil
}

// quaternion reads four components (scalar first or last) into a unit
// quaternion of EME2000 → body.
func quaternion(f []string, scalarFirst, b2a bool) (quat.Number, error) {
	var c [4]float64
	for k := range 4 {
		v, err := strconv.ParseFloat(f[k], 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			return quat.Number{}, fmt.Errorf("quaternion component %q is not a finite number", f[k])
		}
		c[k] = v
	}
	q := quat.Number{Imag: c[0], Jmag: c[1], Kmag: c[2], Real: c[3]}
	if scalarFirst {
		q = quat.Number{Real: c[0], Imag: c[1], Jmag: c[2], Kmag: c[3]}
	}
	n := quat.Abs(q)
	if math.Abs(n-1) > 1e-6 {
		return quat.Number{}, fmt.Errorf("quaternion norm %.9g; allowed a unit quaternion (within 1e-6)", n)
	}
	if b2a {
		q = quat.Conj(q)
	}
	return q, nil
}

func (a *AEM) add(t time.Time, q quat.Number) error {
	if n := len(a.Times); n > 0 && !t.After(a.Times[n-1]) {
		return fmt.Errorf("epoch %s is not after the previous one; allowed increasing epochs", formatEpoch(t))
	}
	a.Times = append(a.Times, t)
	a.Q = append(a.Q, q)
	return nil
}

// ReadAttitudeCSV reads a plain attitude table: a header
// time_utc,qx,qy,qz,qw and rows of an RFC 3339 UTC time and the unit
// quaternion of EME2000 → body, scalar last.
func ReadAttitudeCSV(r io.Reader) (*AEM, error) {
	cr := csv.NewReader(io.LimitReader(r, MaxFileBytes))
	cr.Comment = '#'
	head, err := cr.Read()
	if err != nil {
		return nil, fmt.Errorf("ccsds: attitude CSV: %w", err)
	}
	if strings.Join(head, ",") != "time_utc,qx,qy,qz,qw" {
		return nil, fmt.Errorf("ccsds: attitude CSV: header %q; allowed time_utc,qx,qy,qz,qw", strings.Join(head, ","))
	}
	a := &AEM{}
	for n := 2; ; n++ {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, fmt.Errorf("ccsds: attitude CSV line %d: %w", n, err)
		}
		t, err := time.Parse(time.RFC3339Nano, rec[0])
		if err != nil {
			return nil, fmt.Errorf("ccsds: attitude CSV line %d: time %q is not RFC 3339", n, rec[0])
		}
		q, err := quaternion(rec[1:], false, false)
		if err != nil {
			return nil, fmt.Errorf("ccsds: attitude CSV line %d: %v", n, err)
		}
		if err := a.add(t.UTC(), q); err != nil {
			return nil, fmt.Errorf("ccsds: attitude CSV line %d: %v", n, err)
		}
	}
	if len(a.Times) < 2 {
		return nil, fmt.Errorf("ccsds: attitude CSV: %d attitudes; allowed at least two", len(a.Times))
	}
	return a, nil
}

// WriteAEM writes attitudes (EME2000 → body, A2B) at the given times as a
// KVN AEM 1.0 with scalar-last quaternions.
func WriteAEM(w io.Writer, object string, times []time.Time, q []quat.Number, created time.Time) error {
	if len(times) < 2 || len(times) != len(q) {
		return fmt.Errorf("ccsds: AEM needs at least two attitudes, one per time")
	}
	var b strings.Builder
	fmt.Fprintf(&b, "CCSDS_AEM_VERS = 1.0\nCREATION_DATE = %s\nORIGINATOR = sunsight\n\nMETA_START\n", formatEpoch(created))
	fmt.Fprintf(&b, "OBJECT_NAME = %s\nOBJECT_ID = %s\nCENTER_NAME = EARTH\nREF_FRAME_A = EME2000\nREF_FRAME_B = SC_BODY_1\nATTITUDE_DIR = A2B\n", object, object)
	fmt.Fprintf(&b, "TIME_SYSTEM = UTC\nSTART_TIME = %s\nSTOP_TIME = %s\nATTITUDE_TYPE = QUATERNION\nQUATERNION_TYPE = LAST\nINTERPOLATION_METHOD = LINEAR\nMETA_STOP\n\nDATA_START\n",
		formatEpoch(times[0]), formatEpoch(times[len(times)-1]))
	for k, t := range times {
		fmt.Fprintf(&b, "%s %.17g %.17g %.17g %.17g\n", formatEpoch(t), q[k].Imag, q[k].Jmag, q[k].Kmag, q[k].Real)
	}
	b.WriteString("DATA_STOP\n")
	_, err := io.WriteString(w, b.String())
	return err
}
