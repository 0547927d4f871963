package scenario

import (
	"fmt"
	"maps"
	"math"
	"path/filepath"
	"slices"
	"strings"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/internal/suggest"
	"codeberg.org/sunsight/sunsight/plots/figures"
)

func (r *resolver) vec(path string, v []float64, def r3.Vec) r3.Vec {
	if v == nil {
		return def
	}
	if len(v) != 3 {
		r.fail(path, "value has %d numbers; allowed three [x, y, z]", len(v))
		return def
	}
	return r3.Vec{X: v[0], Y: v[1], Z: v[2]}
}

func (r *resolver) body(b *fileBody) Body {
	var out Body
	out.FormFactor, out.SizeM = r.outline(b)
	r.half = r3.Scale(0.5, out.SizeM)
	r.obstructed = len(b.Obstructions) > 0
	r.hasPanels = len(b.Panels) > 0
	if len(b.Sensors) == 0 {
		r.fail("body.sensors", "value is an empty list; allowed at least one sensor")
	}
	out.Sensors = r.sensors("body.sensors", b.Sensors)
	for i := range b.Obstructions {
		out.Obstructions = append(out.Obstructions, r.obstruction(fmt.Sprintf("body.obstructions[%d]", i), &b.Obstructions[i]))
	}
	names := map[string]bool{}
	for i := range b.Layouts {
		l := &b.Layouts[i]
		p := fmt.Sprintf("body.layouts[%d]", i)
		if l.Name == "" || names[l.Name] {
			r.fail(p+".name", "value %q is empty or used twice; allowed a distinct layout name", l.Name)
		}
		names[l.Name] = true
		if len(l.Sensors) == 0 {
			r.fail(p+".sensors", "value is an empty list; allowed at least one sensor")
		}
		out.Layouts = append(out.Layouts, Layout{Name: l.Name, Sensors: r.sensors(p+".sensors", l.Sensors)})
	}
	out.Candidates = r.sensors("body.candidates", b.Candidates)
	out.Panels = r.panels(b.Panels)
	return out
}

func (r *resolver) sensors(path string, list []fileSensor) []Sensor {
	var out []Sensor
	names := map[string]bool{}
	for i := range list {
		p := fmt.Sprintf("%s[%d]", path, i)
		s := r.sensor(p, &list[i])
		if s.Name == "" {
			r.fail(p+".name", "value is empty; allowed a name for the sensor")
		} else if names[s.Name] {
			r.fail(p+".name", "value %q is used twice; allowed a distinct name per sensor", s.Name)
		}
		names[s.Name] = true
		out = append(out, s)
	}
	return out
}

// defaultToward picks the axis a face's sensor tilts toward: +Z for the side
// faces, +X for the ±Z faces.
func defaultToward(face string) string {
	if strings.HasSuffix(face, "Z") {
		return "+X"
	}
	return "+Z"
}

func (r *resolver) sensor(p string, f *fileSensor) Sensor {
	s := Sensor{Name: f.Name, Kind: f.Kind}
	if kinds := sensor.KindNames(); !oneOf(f.Kind, kinds) {
		r.fail(p+".kind", "value %q is unknown%s; allowed %s", f.Kind, suggest.Hint(f.Kind, kinds), strings.Join(kinds, ", "))
	}
	switch {
	case f.Face != "" && f.Boresight != nil:
		r.fail(p+".boresight", "value is given together with face; allowed one of face or boresight")
	case f.Face != "":
		n, ok := parseAxis(f.Face)
		if !ok {
			r.fail(p+".face", "value %q is unknown%s; allowed %s", f.Face, suggest.Hint(f.Face, faces), strings.Join(faces, ", "))
			break
		}
		f.Face = strings.ToUpper(f.Face)
		s.Face = f.Face
		tilt := setDefault(&f.TiltDeg, 0)
		r.rangeCheck(p+".tilt_deg", tilt, tiltRange, " degrees")
		if f.TiltToward == "" {
			f.TiltToward = defaultToward(f.Face)
		}
		t, ok := parseAxis(f.TiltToward)
		if !ok || math.Abs(r3.Dot(t, n)) > 0.5 {
			r.fail(p+".tilt_toward", "value %q is not a body axis perpendicular to face %s; allowed an axis at 90° to the face", f.TiltToward, f.Face)
			break
		}
		s.TiltRad = tilt * deg
		// Tilt the face normal by tilt toward t: b = n cos τ + t sin τ (closed form).
		s.Boresight = r3.Add(r3.Scale(math.Cos(s.TiltRad), n), r3.Scale(math.Sin(s.TiltRad), t))
		s.RefAxis = r3.Sub(r3.Scale(math.Cos(s.TiltRad), t), r3.Scale(math.Sin(s.TiltRad), n))
	case f.Boresight != nil:
		b := r.vec(p+".boresight", f.Boresight, r3.Vec{})
		if r3.Norm(b) < 1e-9 {
			r.fail(p+".boresight", "value is the zero vector; allowed a non-zero direction [x, y, z]")
			break
		}
		s.Boresight = r3.Unit(b)
		// Reference axis: the body axis least aligned with the boresight, made perpendicular (Gram–Schmidt).
		ref := r3.Vec{X: 1}
		if math.Abs(s.Boresight.X) > 0.6 {
			ref = r3.Vec{Z: 1}
		}
		s.RefAxis = r3.Unit(r3.Sub(ref, r3.Scale(r3.Dot(ref, s.Boresight), s.Boresight)))
		if f.TiltDeg != nil || f.TiltToward != "" {
			r.fail(p+".tilt_deg", "value applies to a face mount only; allowed tilt_deg and tilt_toward with face")
		}
	default:
		r.fail(p+".face", "value is missing; allowed a face (%s) or a boresight [x, y, z]", strings.Join(faces, ", "))
	}
	clock := setDefault(&f.ClockDeg, 0)
	r.rangeCheck(p+".clock_deg", clock, clockRange, " degrees")
	s.ClockRad = clock * deg
	if s.ClockRad != 0 && r3.Norm(s.Boresight) > 0 {
		s.RefAxis = r3.Rotate(s.RefAxis, s.ClockRad, s.Boresight)
	}
	r.place(p, f, &s)

	info, known := sensor.LookupKind(f.Kind)
	if known && info.GeometricFOV {
		// The view follows from the kind's geometry (check and run print
		// its ranges); a half angle would be ignored.
		if f.HalfAngleDeg != nil {
			r.fail(p+".half_angle_deg", "value does not apply to kind %s: its field of view follows from its geometry keys; remove half_angle_deg", f.Kind)
		}
	} else {
		halfDef := 60.0
		if known {
			halfDef = info.HalfAngleDeg
		}
		half := setDefault(&f.HalfAngleDeg, halfDef)
		if !halfAngleRange.Holds(half) {
			r.fail(p+".half_angle_deg", "value %g is out of range; allowed a field of view half angle in %s degrees", half, halfAngleRange)
		}
		s.HalfAngleRad = half * deg
	}
	s.Threshold = setDefault(&f.Threshold, defaultThreshold)
	r.rangeCheck(p+".threshold", s.Threshold, fractionRange, " (fraction of the full-sun reading)")
	if known && !hasSource(info, sensor.SourceQuantisation) {
		// The kind has no converter model: its keys would be ignored.
		for key, given := range map[string]bool{"full_scale": f.FullScale != nil, "adc_bits": f.ADCBits != nil} {
			if given {
				r.fail(p+"."+key, "value does not apply to kind %s (its model has no analogue-to-digital converter); remove %s", f.Kind, key)
			}
		}
		// No converter: no full scale to fill (the sensors table prints
		// none), no ADC.
		s.FullScale, s.ADCBits = 0, 0
	} else {
		s.FullScale = setDefault(&f.FullScale, defaultFullScale)
		r.rangeCheck(p+".full_scale", s.FullScale, positiveRange, "")
		if f.ADCBits == nil {
			v := defaultADCBits
			f.ADCBits = &v
		}
		s.ADCBits = *f.ADCBits
		if !adcBitsRange.Holds(float64(s.ADCBits)) {
			r.fail(p+".adc_bits", "value %d is out of range; allowed %s (0 = no quantisation)", s.ADCBits, adcBitsRange)
		}
		// The full scale clips each output (a quadrant's four cells, whose
		// sum the threshold applies to): at or below the threshold no
		// reading could ever be valid.
		outputs := 1.0
		if f.Kind == string(sensor.KindQuadrant) || f.Kind == string(sensor.KindQuadrantWall) {
			outputs = 4
		}
		if s.FullScale > 0 && fractionRange.Holds(s.Threshold) && outputs*s.FullScale <= s.Threshold {
			r.fail(p+".full_scale", "value %g leaves no valid reading: the clipped signal (at most %g) never exceeds the threshold %g; allowed a full scale above %g",
				s.FullScale, outputs*s.FullScale, s.Threshold, s.Threshold/outputs)
		}
	}
	if known {
		s.Params = r.kindParams(p, info, f)
	}
	if f.Errors == nil {
		f.Errors = &fileErrors{}
	}
	s.Errors = r.errorsOf(p+".errors", f.Errors)
	if known {
		// An error the kind's model does not draw would be ignored: refuse it.
		for _, c := range errorKeySources {
			if c.value(f.Errors) != 0 && !hasSource(info, c.source) {
				r.fail(p+".errors."+c.key, "value does not apply to kind %s (its error model has no %s); remove it", f.Kind, c.source)
			}
		}
	}
	return s
}

// errorKeySources pairs each key of a sensor's errors block with the error
// source it sets and its value in the file.
var errorKeySources = [...]struct {
	key, source string
	value       func(*fileErrors) float64
}{
	{"dark_offset_1sigma", sensor.SourceDarkOffset, func(e *fileErrors) float64 { return e.DarkOffset1Sigma }},
	{"gain_1sigma", sensor.SourceGain, func(e *fileErrors) float64 { return e.Gain1Sigma }},
	{"noise_1sigma", sensor.SourceNoise, func(e *fileErrors) float64 { return e.Noise1Sigma }},
	{"misalignment_deg_1sigma", sensor.SourceMisalignment, func(e *fileErrors) float64 { return e.MisalignmentDeg1Sigma }},
	{"aperture_offset_mm_1sigma", sensor.SourceApertureOffset, func(e *fileErrors) float64 { return e.ApertureOffsetMM1Sigma }},
}

// errorKeyApplies reports whether the errors key applies to a sensor kind
// (true for a key or a kind it does not know).
func errorKeyApplies(k sensor.KindInfo, key string) bool {
	for _, c := range errorKeySources {
		if c.key == key {
			return hasSource(k, c.source)
		}
	}
	return true
}

// hasSource reports whether a sensor kind's error model draws the source.
func hasSource(k sensor.KindInfo, source string) bool {
	for _, s := range k.Sources {
		if s.Name == source {
			return true
		}
	}
	return false
}

// formFactors are the outer dimensions (m, along body X, Y, Z) of the
// CubeSat sizes a file may name instead of size_m: 1U 100 × 100 × 113.5 mm
// and 3U 100 × 100 × 340.5 mm (CubeSat Design Specification rev. 14,
// Cal Poly, from memory), 6U 226.3 × 100 × 366 mm and 12U 226.3 × 226.3 ×
// 366 mm (6U/12U CubeSat Design Specification rev. 1.0, Cal Poly, from
// memory). The long (deployer rail) axis is body Z and a 6U's wide side
// body X: our convention. Rails and deployables are not part of the outline.
var formFactors = map[string]r3.Vec{
	"1U":  {X: 0.1, Y: 0.1, Z: 0.1135},
	"3U":  {X: 0.1, Y: 0.1, Z: 0.3405},
	"6U":  {X: 0.2263, Y: 0.1, Z: 0.366},
	"12U": {X: 0.2263, Y: 0.2263, Z: 0.366},
}

var formFactorNames = []string{"1U", "3U", "6U", "12U"}

// outline resolves the bus outline: form_factor or size_m, not both.
func (r *resolver) outline(b *fileBody) (string, r3.Vec) {
	switch {
	case b.FormFactor != "" && b.SizeM != nil:
		r.fail("body.size_m", "value is given together with form_factor; allowed one of form_factor or size_m")
	case b.FormFactor != "":
		f := strings.ToUpper(b.FormFactor)
		size, ok := formFactors[f]
		if !ok {
			r.fail("body.form_factor", "value %q is unknown%s; allowed %s (or size_m: [x, y, z] in metres)", b.FormFactor, suggest.Hint(b.FormFactor, formFactorNames), strings.Join(formFactorNames, ", "))
			return "", r3.Vec{}
		}
		b.FormFactor = f
		return f, size
	case b.SizeM != nil:
		size := r.vec("body.size_m", b.SizeM, r3.Vec{})
		if !(size.X > 0 && size.Y > 0 && size.Z > 0 && size.X <= 100 && size.Y <= 100 && size.Z <= 100) {
			r.fail("body.size_m", "value %v is out of range; allowed three full extents in (0, 100] metres along body X, Y, Z", b.SizeM)
			return "", r3.Vec{}
		}
		return "", size
	}
	return "", r3.Vec{}
}

// surfaceTolM is how far from the outline a position may lie and still count
// as on its surface (1 mm).
const surfaceTolM = 1e-3

// place sets a sensor's position and mounting plane. On a bus outline a
// sensor left without position_m sits at the centre of its face (a face
// mount) or where its boresight leaves the outline (a vector mount); a given
// position inside the outline is refused. Without an outline the position
// defaults to the body origin, which is refused when obstructions are traced
// from it. The mounting plane is the face's for a face mount; for a vector
// mount, the outline face it sits on, else the plane normal to its boresight.
func (r *resolver) place(p string, f *fileSensor, s *Sensor) {
	h := r.half
	onBus := h != (r3.Vec{})
	var face r3.Vec
	if s.Face != "" {
		face, _ = parseAxis(s.Face)
	}
	if r3.Norm(s.Boresight) == 0 {
		return // the mount was refused already
	}
	if f.PositionM != nil {
		s.PositionM = r.vec(p+".position_m", f.PositionM, r3.Vec{})
		q := s.PositionM
		if onBus && math.Abs(q.X) < h.X-surfaceTolM && math.Abs(q.Y) < h.Y-surfaceTolM && math.Abs(q.Z) < h.Z-surfaceTolM {
			r.fail(p+".position_m", "value %v lies inside the bus outline (half extents %.4g, %.4g, %.4g m); allowed a point on a face or outside it, or leave position_m out to place the sensor at its face centre",
				f.PositionM, h.X, h.Y, h.Z)
		}
	} else {
		switch {
		case onBus && face != (r3.Vec{}):
			s.PositionM = r3.Vec{X: face.X * h.X, Y: face.Y * h.Y, Z: face.Z * h.Z}
		case onBus:
			s.PositionM = exitPoint(s.Boresight, h)
		case r.obstructed:
			r.fail(p+".position_m", "value is missing while body.obstructions are traced from each sensor's position; allowed position_m [x, y, z] in metres, or body.form_factor / body.size_m to place sensors at their face centres")
		}
		f.PositionM = []float64{s.PositionM.X, s.PositionM.Y, s.PositionM.Z}
	}
	switch {
	case face != (r3.Vec{}):
		s.MountNormal = face
	case onBus:
		s.MountNormal = surfaceNormal(s.PositionM, s.Boresight, h)
		// A boresight into the surface the sensor sits on sees only the
		// bus: nothing of its cone's centre can reach it.
		if r3.Dot(s.MountNormal, s.Boresight) < -1e-9 {
			r.fail(p+".boresight", "value %v points into the bus face the sensor sits on (outward normal [%g %g %g] at position_m %v); allowed a boresight that leaves the face (a positive component along its normal), or a position_m on another face",
				f.Boresight, s.MountNormal.X, s.MountNormal.Y, s.MountNormal.Z, f.PositionM)
		}
	default:
		s.MountNormal = s.Boresight
	}
}

// exitPoint is where the ray from the body origin along unit b leaves the
// box of half extents h.
func exitPoint(b, h r3.Vec) r3.Vec {
	t := math.Inf(1)
	for _, c := range [3][2]float64{{b.X, h.X}, {b.Y, h.Y}, {b.Z, h.Z}} {
		if c[0] != 0 {
			t = min(t, c[1]/math.Abs(c[0]))
		}
	}
	return r3.Scale(t, b)
}

// surfaceNormal is the outward normal of the outline face the point q lies
// on (within surfaceTolM), the one facing the boresight b best on an edge;
// the boresight itself when q is off the outline.
func surfaceNormal(q, b, h r3.Vec) r3.Vec {
	best, bestDot := b, math.Inf(-1)
	for _, c := range []struct {
		q, h float64
		n    r3.Vec
	}{{q.X, h.X, r3.Vec{X: 1}}, {q.Y, h.Y, r3.Vec{Y: 1}}, {q.Z, h.Z, r3.Vec{Z: 1}}} {
		if math.Abs(math.Abs(c.q)-c.h) > surfaceTolM {
			continue
		}
		n := c.n
		if c.q < 0 {
			n = r3.Scale(-1, n)
		}
		if d := r3.Dot(n, b); d > bestDot {
			best, bestDot = n, d
		}
	}
	if math.Abs(q.X) > h.X+surfaceTolM || math.Abs(q.Y) > h.Y+surfaceTolM || math.Abs(q.Z) > h.Z+surfaceTolM {
		return b
	}
	return best
}

// kindParams checks the kind keys of a sensor entry against the kind's
// registry entry, fills their defaults in place (for the record) and returns
// them in model units.
func (r *resolver) kindParams(p string, info sensor.KindInfo, f *fileSensor) sensor.Params {
	for _, key := range slices.Sorted(maps.Keys(f.Params)) {
		if _, ok := info.Param(key); !ok {
			r.fail(p+"."+key, "value does not apply to kind %q; allowed for kind %s only", f.Kind, strings.Join(sensor.KindsWithKey(key), ", "))
		}
	}
	if f.Params == nil {
		f.Params = map[string]any{}
	}
	inFile := maps.Clone(f.Params) // the keys the file gives (defaults are filled in below)
	out := sensor.Params{Num: map[string]float64{}, Text: map[string]string{}, Table: map[string][][2]float64{}}
	for _, k := range info.Params {
		kp := p + "." + k.Key
		v, given := f.Params[k.Key]
		switch k.Type {
		case sensor.Number:
			if !given {
				v = k.Default
				f.Params[k.Key] = v
			}
			x := v.(float64)
			hi := k.Max
			if k.MaxKey != "" {
				hi = f.Params[k.MaxKey].(float64)
			}
			if !(Interval{Lo: k.Min, Hi: hi, LoOpen: k.MinOpen}).Holds(x) {
				r.fail(kp, "value %g is out of range; allowed %s", x, k.Allowed)
			}
			out.Num[k.Key] = x * sensor.ScaleOr1(k.Scale)
		case sensor.Choice:
			if !given {
				v = k.Choices[0]
				f.Params[k.Key] = v
			}
			if !oneOf(v.(string), k.Choices) {
				r.fail(kp, "value %q is unknown%s; allowed %s", v, suggest.Hint(v.(string), k.Choices), strings.Join(k.Choices, ", "))
			}
			out.Text[k.Key] = v.(string)
		case sensor.Table:
			if given {
				out.Table[k.Key] = r.table(kp, k.Columns, v.([][]float64))
			}
		}
	}
	// A key that acts only through another one is refused without it
	// when set away from its default (a scenario's record writes every
	// default back).
	for _, k := range info.Params {
		if v, given := inFile[k.Key]; given && k.ActsWith != "" && v != any(k.Default) && out.Num[k.ActsWith] == 0 {
			r.fail(p+"."+k.Key, "value has no effect while %s is 0; allowed only with %s > 0: set it, or leave %s out", k.ActsWith, k.ActsWith, k.Key)
		}
	}
	return out
}

// table checks the rows of a two-column table parameter and returns them in
// model units.
func (r *resolver) table(p string, cols [2]sensor.Column, rows [][]float64) [][2]float64 {
	var out [][2]float64
	prev := [2]float64{math.Inf(-1), math.Inf(-1)}
	for i, row := range rows {
		rp := fmt.Sprintf("%s[%d]", p, i)
		if len(row) != 2 {
			r.fail(rp, "value has %d numbers; allowed [%s, %s]", len(row), cols[0].Name, cols[1].Name)
			continue
		}
		var v [2]float64
		for j, c := range cols {
			x := row[j]
			if x < c.Min || x > c.Max || (c.Increasing && !(x > prev[j])) {
				order := ""
				if c.Increasing {
					order = " increasing"
				}
				r.fail(rp, "value %s %g is out of order or range; allowed%s values in [%g, %g]", c.Name, x, order, c.Min, c.Max)
			}
			v[j] = x * sensor.ScaleOr1(c.Scale)
		}
		prev = [2]float64(row)
		out = append(out, v)
	}
	return out
}

// errorKeyRanges are the ranges of the errors block's keys, in file order.
var errorKeyRanges = []struct {
	key, what, unit string
	iv              Interval
}{
	{"dark_offset_1sigma", "fraction of full scale", "", errorRange},
	{"gain_1sigma", "fraction of the gain", "", errorRange},
	{"noise_1sigma", "fraction of full scale", "", errorRange},
	{"misalignment_deg_1sigma", "angle", " degrees", misalignRange},
	{"aperture_offset_mm_1sigma", "offset", " mm", errorRange},
}

func (r *resolver) errorsOf(p string, e *fileErrors) SensorErrors {
	vals := map[string]float64{"dark_offset_1sigma": e.DarkOffset1Sigma, "gain_1sigma": e.Gain1Sigma, "noise_1sigma": e.Noise1Sigma,
		"misalignment_deg_1sigma": e.MisalignmentDeg1Sigma, "aperture_offset_mm_1sigma": e.ApertureOffsetMM1Sigma}
	for _, c := range errorKeyRanges {
		if v := vals[c.key]; !c.iv.Holds(v) {
			r.fail(p+"."+c.key, "value %g is out of range; allowed a one-sigma %s in %s%s", v, c.what, c.iv, c.unit)
		}
	}
	return SensorErrors{DarkOffset1Sigma: e.DarkOffset1Sigma, Gain1Sigma: e.Gain1Sigma, Noise1Sigma: e.Noise1Sigma,
		MisalignmentRad1Sigma: e.MisalignmentDeg1Sigma * deg, ApertureOffsetMM1Sigma: e.ApertureOffsetMM1Sigma}
}

// residuals resolves budget.calibrated: the top-level keys for every kind
// and each kind's block. A residual must not exceed the error a sensor of
// that kind states (a calibration that worsens a sensor is a typing slip),
// and a kind block must name a kind of the layout.
func (r *resolver) residuals(c *fileCalibrated, sensors []Sensor) map[string]Residuals {
	out := map[string]Residuals{}
	blocks := []struct {
		kind string
		e    *fileErrors
	}{{"", &c.fileErrors}, {"cosine", c.Cosine}, {"quadrant", c.Quadrant}, {"digital", c.Digital}} // the kind names of illum/sensor's registry
	for _, b := range blocks {
		if b.e == nil {
			continue
		}
		p := "budget.calibrated"
		if b.kind != "" {
			p += "." + b.kind
		}
		res := Residuals{Errors: r.errorsOf(p, b.e)}
		vals := (&res.Errors).ptrs()
		n := 0
		for i, key := range ErrorSources {
			if _, given := r.nodes[p+"."+key]; !given {
				continue
			}
			res.Given[i] = true
			n++
			applies := false
			for _, sc := range sensors {
				applies = applies || ((b.kind == "" || b.kind == sc.Kind) && *(&sc.Errors).ptrs()[i] > 0)
			}
			if !applies {
				r.fail(p+"."+key, "value applies to no sensor: none of the sensors it covers states %s, so there is nothing to calibrate; allowed residuals of errors the sensors state (calibration never adds an error)", key)
				continue
			}
			for _, sc := range sensors {
				st := *(&sc.Errors).ptrs()[i]
				if (b.kind == "" || b.kind == sc.Kind) && st > 0 && *vals[i] > st*(1+1e-12) {
					shown, stShown := *vals[i], st
					if key == "misalignment_deg_1sigma" {
						shown, stShown = shown/deg, st/deg
					}
					r.fail(p+"."+key, "value %g exceeds the %g sensor %s states; allowed a residual after calibration at most the stated error", shown, stShown, sc.Name)
					break
				}
			}
		}
		if b.kind != "" {
			has := false
			for _, sc := range sensors {
				has = has || sc.Kind == b.kind
			}
			if !has {
				r.fail(p, "value names kind %s, which no sensor of body.sensors has; allowed a block for a kind the layout flies", b.kind)
			}
		}
		if n > 0 {
			out[b.kind] = res
		}
	}
	return out
}

func (r *resolver) obstruction(p string, o *fileObstruction) Obstruction {
	out := Obstruction{Name: o.Name, Shape: o.Shape}
	switch o.Shape {
	case ShapeRectangle:
		out.CentreM = r.vec(p+".centre_m", o.CentreM, r3.Vec{})
		out.HalfExtentsM = r.vec(p+".half_extents_m", o.HalfExtentsM, r3.Vec{})
		h := out.HalfExtentsM
		if o.HalfExtentsM == nil || h.X < 0 || h.Y < 0 || h.Z < 0 || (h.X == 0 && h.Y == 0) || (h.Y == 0 && h.Z == 0) || (h.X == 0 && h.Z == 0) {
			r.fail(p+".half_extents_m", "value %v is missing or degenerate; allowed three half extents ≥ 0 in metres, at most one zero", o.HalfExtentsM)
		}
	case ShapeCylinder:
		out.FromM = r.vec(p+".from_m", o.FromM, r3.Vec{})
		out.ToM = r.vec(p+".to_m", o.ToM, r3.Vec{})
		if o.FromM == nil || o.ToM == nil || r3.Norm(r3.Sub(out.ToM, out.FromM)) == 0 {
			r.fail(p+".to_m", "value is missing or equal to from_m; allowed two distinct end points [x, y, z] in metres")
		}
		if o.RadiusM == nil || !positiveRange.Holds(*o.RadiusM) {
			r.fail(p+".radius_m", "value is missing or not positive; allowed a radius > 0 in metres")
		} else {
			out.RadiusM = *o.RadiusM
		}
	default:
		r.fail(p+".shape", "value %q is unknown; allowed %s", o.Shape, strings.Join(obstructionShapes, ", "))
	}
	return out
}

func (r *resolver) estimators(f *fileScenario, sensors []Sensor) []string {
	if len(f.Estimators) == 0 {
		cos, twoAxis := 0, 0
		var bores []r3.Vec
		for _, s := range sensors {
			if k, _ := sensor.LookupKind(s.Kind); !k.TwoAxis {
				cos++
				if r3.Norm(s.Boresight) > 0 {
					bores = append(bores, r3.Unit(s.Boresight))
				}
			} else {
				twoAxis++
			}
		}
		// The pair difference only where it can give an estimate: three
		// opposed pairs on axes that are not coplanar.
		pairs := sensor.OppositePairsPossible(bores)
		// The first listed is the primary estimator of the headline figures
		// and targets: the combination when there are both kinds, else the
		// two-axis directions, else the pair difference (less biased by
		// albedo than lit-only least squares), else least squares.
		if cos >= 3 && twoAxis > 0 {
			f.Estimators = append(f.Estimators, "combined")
		}
		if twoAxis > 0 {
			f.Estimators = append(f.Estimators, "two-axis")
		}
		if pairs {
			f.Estimators = append(f.Estimators, "opposite-pairs")
		}
		if cos >= 3 {
			f.Estimators = append(f.Estimators, "least-squares")
		}
		// Too few sensors for any estimate: least squares still runs and
		// reports that it never has a valid sun vector (coverage figures
		// are unaffected).
		if len(f.Estimators) == 0 {
			f.Estimators = append(f.Estimators, "least-squares")
		}
	}
	seen := map[string]bool{}
	for i, e := range f.Estimators {
		p := fmt.Sprintf("estimators[%d]", i)
		if names := sensor.EstimatorNames(); !oneOf(e, names) {
			r.fail(p, "value %q is unknown%s; allowed %s", e, suggest.Hint(e, names), strings.Join(names, ", "))
		} else if seen[e] {
			r.fail(p, "value %q is listed twice; allowed each estimator once", e)
		}
		seen[e] = true
	}
	return append([]string(nil), f.Estimators...)
}

func (r *resolver) albedo(a *fileAlbedo) Albedo {
	out := r.albedoModel("albedo", &a.fileAlbedoModel)
	if a.Onboard != nil {
		if out.Model == AlbedoNone {
			r.fail("albedo.onboard", "an on-board correction needs albedo in the truth; allowed with albedo.model %s", strings.Join(albedoModelsWith(func(m albedo.ModelInfo) bool { return m.Reflectance != nil }), ", "))
		}
		ob := r.albedoModel("albedo.onboard", a.Onboard)
		out.Onboard = &ob
	}
	if a.OnPanels {
		switch {
		case out.Model == AlbedoNone:
			r.fail("albedo.on_panels", "albedo on the panels needs an albedo model; allowed with albedo.model other than %s", AlbedoNone)
		case !r.hasPanels:
			r.fail("albedo.on_panels", "value is set but body.panels is empty; allowed only with solar panels listed under body.panels")
		}
		out.OnPanels = true
	}
	return out
}

// albedoModel resolves one albedo model block at path (albedo, or the
// on-board model albedo.onboard).
func (r *resolver) albedoModel(path string, a *fileAlbedoModel) Albedo {
	r.choice(path+".model", &a.Model, AlbedoUniform, albedo.ModelNames())
	out := Albedo{Model: a.Model}
	m, err := albedo.LookupModel(a.Model)
	if err != nil {
		return out
	}
	if m.TakesValue {
		out.Value = setDefault(&a.Value, m.DefaultValue)
		r.rangeCheck(path+".value", out.Value, fractionRange, "")
	} else if a.Value != nil {
		r.fail(path+".value", "value does not apply to model %q; allowed with %s", a.Model, strings.Join(albedoModelsWith(func(m albedo.ModelInfo) bool { return m.TakesValue }), " or "))
	}
	if m.TakesGrid {
		if a.GridFile == "" {
			r.fail(path+".grid_file", "value is missing; allowed the path of a reflectance grid (relative to the scenario file)")
		} else {
			out.GridFile = a.GridFile
			if !filepath.IsAbs(out.GridFile) {
				out.GridFile = filepath.Join(r.dir, out.GridFile)
			}
		}
	} else if a.GridFile != "" {
		r.fail(path+".grid_file", "value applies to model %s only; allowed model: %s with grid_file", strings.Join(albedoModelsWith(func(m albedo.ModelInfo) bool { return m.TakesGrid }), ", "), strings.Join(albedoModelsWith(func(m albedo.ModelInfo) bool { return m.TakesGrid }), ", "))
	}
	if a.Cells == 0 {
		if _, given := r.nodes[path+".cells"]; !given {
			a.Cells = defaultCells
		}
	}
	if a.Cells < 10 || a.Cells > 1_000_000 {
		r.fail(path+".cells", "value %d is out of range; allowed [10, 1000000]", a.Cells)
	}
	out.Cells = a.Cells
	return out
}

// DefaultGate returns the validity gate of an estimator when the file sets
// none: the estimator registry's own (sensor.DefaultGate).
func DefaultGate(estimator string) Gate {
	g := sensor.DefaultGate(estimator)
	return Gate{MinSensors: g.MinSensors, MinTotalSignal: g.MinSignal, MaxResidual: g.MaxResidual}
}

func (r *resolver) validity(v *fileValidity, ests []string) Validity {
	out := Validity{FalseSunBoundDeg: setDefault(&v.FalseSunBoundDeg, defaultFalseSunBoundDeg), Gates: map[string]Gate{}}
	r.rangeCheck("validity.false_sun_bound_deg", out.FalseSunBoundDeg, boundRange, " degrees")
	run := map[string]bool{}
	for _, e := range ests {
		run[e] = true
	}
	for name := range v.Gates {
		if !run[name] {
			r.fail("validity.gates."+name, "value names an estimator this scenario does not run; allowed %s", strings.Join(ests, ", "))
		}
	}
	if v.Gates == nil {
		v.Gates = map[string]fileGate{}
	}
	for _, name := range ests {
		p := "validity.gates." + name
		fg := v.Gates[name]
		d := DefaultGate(name)
		if fg.MinSensors == nil {
			n := d.MinSensors
			fg.MinSensors = &n
		}
		g := Gate{MinSensors: *fg.MinSensors, MinTotalSignal: setDefault(&fg.MinTotalSignal, d.MinTotalSignal),
			MaxResidual: setDefault(&fg.MaxResidual, d.MaxResidual)}
		if g.MinSensors < 0 || g.MinSensors > 1000 {
			r.fail(p+".min_sensors", "value %d is out of range; allowed a whole number in [0, 1000] (0: the estimator's own minimum)", g.MinSensors)
		}
		r.rangeCheck(p+".min_total_signal", g.MinTotalSignal, totalSignalRange, " (sum of normalised signals; 1 = one sensor facing a 1 AU sun)")
		r.rangeCheck(p+".max_residual", g.MaxResidual, residualRange, " (RMS fit residual in normalised signal, or chord between directions; 0: no limit)")
		v.Gates[name] = fg
		out.Gates[name] = g
	}
	return out
}

// albedoModelsWith lists the albedo models for which has is true.
func albedoModelsWith(has func(albedo.ModelInfo) bool) []string {
	var out []string
	for _, m := range albedo.Models() {
		if has(m) {
			out = append(out, m.Name)
		}
	}
	return out
}

func (r *resolver) targets(t *fileTargets, nSensors int) Targets {
	out := Targets{Judge: JudgeUncorrected}
	if t == nil {
		return out
	}
	switch t.Judge { // the words of judges
	case "":
	case JudgeUncorrected, JudgeOnboardCorrected:
		out.Judge = t.Judge
	default:
		r.fail("targets.judge", "value %q is unknown; allowed %s, %s", t.Judge, JudgeUncorrected, JudgeOnboardCorrected)
	}
	if t.MinValidFraction != nil {
		out.MinValidFraction = *t.MinValidFraction
		r.rangeCheck("targets.min_valid_fraction", out.MinValidFraction, openFraction, "")
	}
	if t.MaxErrorP95Deg != nil {
		r.rangeCheck("targets.max_error_p95_deg", *t.MaxErrorP95Deg, p95Range, " degrees")
		out.MaxErrorP95Rad = *t.MaxErrorP95Deg * deg
	}
	if t.MaxErrorP95UnitsDeg != nil {
		r.rangeCheck("targets.max_error_p95_units_deg", *t.MaxErrorP95UnitsDeg, p95Range, " degrees")
		out.MaxErrorP95UnitsRad = *t.MaxErrorP95UnitsDeg * deg
	}
	if t.MinCoverage != nil {
		if t.CoverageSensors == nil {
			k := 1
			t.CoverageSensors = &k
		}
		out.MinCoverage = *t.MinCoverage
		r.rangeCheck("targets.min_coverage", out.MinCoverage, openFraction, "")
	}
	if t.CoverageSensors != nil {
		out.CoverageSensors = *t.CoverageSensors
		if out.CoverageSensors < 1 || (nSensors > 0 && out.CoverageSensors > nSensors) {
			r.fail("targets.coverage_sensors", "value %d is out of range; allowed [1, %d] (the number of sensors)", out.CoverageSensors, nSensors)
		}
	}
	if t.MaxGap != nil {
		out.MaxGap = *t.MaxGap
		if out.MaxGap <= 0 {
			r.fail("targets.max_gap", "value %s is not positive; allowed a length of time > 0", out.MaxGap)
		}
	}
	out.SurviveOneFailure = t.SurviveOneFailure
	if n := t.NMinus1; n != nil {
		out.NMinus1.Set = true
		if nSensors < 2 {
			r.fail("targets.n_minus_1", "the single-failure study needs at least 2 sensors, the body has %d; add a sensor or remove the block", nSensors)
		}
		if n.MinValidFraction != nil {
			out.NMinus1.MinValidFraction = *n.MinValidFraction
			r.rangeCheck("targets.n_minus_1.min_valid_fraction", *n.MinValidFraction, openFraction, "")
		}
		out.NMinus1.Pairs = n.AlsoPairs
		if n.AlsoPairs && nSensors < 3 {
			r.fail("targets.n_minus_1.also_pairs", "failing pairs needs at least 3 sensors, the body has %d; remove also_pairs", nSensors)
		}
		if n.MaxErrorP95Deg != nil {
			r.rangeCheck("targets.n_minus_1.max_error_p95_deg", *n.MaxErrorP95Deg, p95Range, " degrees")
			out.NMinus1.MaxErrorP95Rad = *n.MaxErrorP95Deg * deg
		}
		if n.MaxGap != nil {
			out.NMinus1.MaxGap = *n.MaxGap
			if *n.MaxGap <= 0 {
				r.fail("targets.n_minus_1.max_gap", "value %s is not positive; allowed a length of time > 0", *n.MaxGap)
			}
		}
	}
	if t.MinOrbitAvgPowerW != nil {
		out.MinOrbitAvgPowerW = *t.MinOrbitAvgPowerW
		if !(out.MinOrbitAvgPowerW > 0) || math.IsInf(out.MinOrbitAvgPowerW, 0) {
			r.fail("targets.min_orbit_average_power_w", "value %g is not positive; allowed a power > 0 W", out.MinOrbitAvgPowerW)
		}
		if !r.hasPanels {
			r.fail("targets.min_orbit_average_power_w", "value is set but body.panels is empty; allowed only with solar panels listed under body.panels")
		}
	}
	return out
}

func (r *resolver) output(o *fileOutput) Output {
	if o.Decimate == 0 {
		if _, given := r.nodes["output.decimate"]; !given {
			o.Decimate = defaultDecimate
		}
	}
	if o.Decimate < 1 {
		r.fail("output.decimate", "value %d is below 1; allowed a whole number ≥ 1 (keep every n-th step)", o.Decimate)
	}
	given := o.Figures != nil
	if !given {
		for _, f := range figures.Names() {
			if f != figures.Power || r.hasPanels {
				o.Figures = append(o.Figures, f)
			}
		}
	}
	for i, f := range o.Figures {
		if names := figures.Names(); !oneOf(f, names) {
			r.fail(fmt.Sprintf("output.figures[%d]", i), "value %q is unknown%s; allowed %s", f, suggest.Hint(f, names), strings.Join(names, ", "))
		}
		if given && f == figures.Power && !r.hasPanels {
			r.fail(fmt.Sprintf("output.figures[%d]", i), "value %q needs solar panels but body.panels is empty; allowed with body.panels listed, or leave %q out", f, f)
		}
	}
	return Output{Decimate: o.Decimate, Figures: append([]string(nil), o.Figures...)}
}
