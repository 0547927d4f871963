package scenario

import (
	"fmt"
	"maps"
	"math"
	"path/filepath"
	"slices"
	"strings"
	"time"

	"go.yaml.in/yaml/v3"
	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/internal/numtext"
	"codeberg.org/sunsight/sunsight/internal/suggest"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// Defaults of the file's own keys (each is common practice, no source, unless
// noted). The defaults of a model's keys live in its registry entry (sensor
// kinds in illum/sensor, albedo models in illum/albedo).
const (
	defaultName       = "unnamed scenario"
	defaultEpoch      = "2026-03-20T00:00:00Z" // near an equinox, so eclipses are near their longest for low inclinations
	defaultDuration   = Span(24 * time.Hour)
	defaultStep       = Span(10 * time.Second)
	defaultSeed       = 1
	defaultPropagator = "j2-mean"
	tlePropagator     = "sgp4" // default for a TLE orbit
	// defaultLTANSolarTime: an LTAN is local mean solar time unless the
	// file says apparent (the mean sun is the usual launch-provider
	// convention; common practice, no source).
	defaultLTANSolarTime = "mean"
	defaultSunModel      = "low-precision"
	defaultShadow        = "conical"
	defaultCells         = albedo.DefaultCells
	defaultUnits         = 1
	defaultDecimate      = 1
	defaultThreshold     = 0.05
	defaultFullScale     = 1.5 // × normal sun at 1 AU: room for perihelion (+3.4 %), albedo (≈ +0.3) and gain spread (common practice, no source)
	defaultADCBits       = 12
	// defaultFalseSunBoundDeg: a valid estimate this far from the sun points
	// the spacecraft at the wrong thing, well beyond the few degrees of
	// albedo bias of a coarse sensor (the engine's default; common practice,
	// no source).
	defaultFalseSunBoundDeg = 20.0
)

var (
	faces     = []string{"+X", "-X", "+Y", "-Y", "+Z", "-Z"}
	eulerSeqs = []string{"121", "123", "131", "132", "212", "213", "231", "232", "312", "313", "321", "323"}
)

const deg = math.Pi / 180

type resolver struct {
	nodes map[string]*yaml.Node
	dir   string
	errs  Errors
	// half is the bus outline's half extents (m), zero without an outline;
	// obstructed says the body lists obstructions. Both are set before the
	// sensors are resolved, which are placed on the outline.
	half       r3.Vec
	obstructed bool
	hasPanels  bool // body.panels lists at least one panel
}

// fail records a problem at path, taking the line from the nearest key of the
// path that the file has.
func (r *resolver) fail(path, format string, a ...any) {
	e := &FieldError{Path: path, Msg: fmt.Sprintf(format, numtext.Clean(a)...)}
	for p := path; p != ""; {
		if n, ok := r.nodes[p]; ok {
			e.Line, e.Col = n.Line, n.Column
			break
		}
		if i := strings.LastIndexAny(p, ".["); i >= 0 {
			p = p[:i]
		} else {
			p = ""
		}
	}
	r.errs = append(r.errs, e)
}

func oneOf(v string, list []string) bool {
	for _, s := range list {
		if s == v {
			return true
		}
	}
	return false
}

func (r *resolver) choice(path string, v *string, def string, list []string) {
	if *v == "" {
		*v = def
	}
	if !oneOf(*v, list) {
		r.fail(path, "value %q is unknown%s; allowed %s", *v, suggest.Hint(*v, list), strings.Join(list, ", "))
	}
}

// rangeCheck refuses v outside iv; note follows the interval in the
// message (a unit, what the number is).
func (r *resolver) rangeCheck(path string, v float64, iv Interval, note string) {
	if !iv.Holds(v) {
		r.fail(path, "value %g is out of range; allowed %s%s", v, iv, note)
	}
}

func setDefault(p **float64, v float64) float64 {
	if *p == nil {
		*p = &v
	}
	return **p
}

func (r *resolver) resolve(f *fileScenario) *Scenario {
	s := &Scenario{Dir: r.dir}
	if f.Name == "" {
		f.Name = defaultName
	}
	s.Name = f.Name
	if f.Epoch == "" && len(f.Orbit.TLE) == 0 {
		f.Epoch = defaultEpoch
	}
	if f.Epoch != "" {
		t, err := ParseEpoch(f.Epoch)
		if err != nil {
			r.fail("epoch", "value %s", err)
		}
		s.Epoch = t
	}
	if _, given := r.nodes["duration"]; !given {
		f.Duration = defaultDuration
	}
	if _, given := r.nodes["step"]; !given {
		f.Step = defaultStep
	}
	s.Duration, s.Step = f.Duration, f.Step
	if f.Duration <= 0 {
		r.fail("duration", "value %s is not positive; allowed a length of time > 0 such as 1d", f.Duration)
	}
	if f.Step <= 0 {
		r.fail("step", "value %s is not positive; allowed a length of time > 0 such as 10s", f.Step)
	} else if f.Duration > 0 && f.Step > f.Duration {
		r.fail("step", "value %s is longer than the duration %s; allowed a step ≤ duration", f.Step, f.Duration)
	} else if f.Step > 0 && f.Duration/f.Step > 100_000_000 {
		r.fail("step", "value %s gives more than 1e8 steps over %s; allowed a longer step or a shorter duration", f.Step, f.Duration)
	}
	if f.Seed == nil {
		v := int64(defaultSeed)
		f.Seed = &v
	}
	if !seedRange.Holds(float64(*f.Seed)) {
		r.fail("seed", "value %d is negative; allowed a whole number ≥ 0", *f.Seed)
	}
	s.Seed = *f.Seed
	s.Orbit = r.orbit(&f.Orbit, &f.Epoch, &s.Epoch)
	r.choice("sun_model", &f.SunModel, defaultSunModel, ephem.SunModelNames())
	r.choice("shadow", &f.Shadow, defaultShadow, illum.ShadowNames())
	s.SunModel, s.Shadow = f.SunModel, f.Shadow
	if f.Timeline != nil {
		if _, given := r.nodes["attitude"]; given {
			r.fail("attitude", "value is given with timeline; allowed one of them (the timeline's phases carry the attitude)")
		}
		s.Attitude = Attitude{Law: Law{Name: LawTimeline}}
	} else {
		s.Attitude = r.attitude("attitude", &f.Attitude)
	}
	names := map[string]bool{}
	for i := range f.Modes {
		m := &f.Modes[i]
		p := fmt.Sprintf("modes[%d]", i)
		if m.Name == "" {
			r.fail(p+".name", "value is empty; allowed a name for the mode")
		} else if names[m.Name] {
			r.fail(p+".name", "value %q is used twice; allowed a distinct name per mode", m.Name)
		}
		names[m.Name] = true
		s.Modes = append(s.Modes, Mode{Name: m.Name, Attitude: r.attitude(p, &m.fileAttitude)})
	}
	s.Body = r.body(&f.Body)
	if f.Timeline != nil {
		s.Timeline = r.timeline(f.Timeline, len(s.Body.Sensors))
	}
	s.Estimators = r.estimators(f, s.Body.Sensors)
	s.Albedo = r.albedo(&f.Albedo)
	s.Validity = r.validity(&f.Validity, s.Estimators)
	s.GyroFilter = r.gyroFilter(f.GyroFilter)
	s.Targets = r.targets(f.Targets, len(s.Body.Sensors))
	if s.Targets.Judge == JudgeOnboardCorrected && s.Albedo.Onboard == nil {
		r.fail("targets.judge", "value %q needs an on-board albedo model; allowed only with albedo.onboard set: add it or set judge: %s", JudgeOnboardCorrected, JudgeUncorrected)
	}
	if f.MonteCarlo.Units == 0 {
		if _, given := r.nodes["monte_carlo.units"]; !given {
			f.MonteCarlo.Units = defaultUnits
		}
	}
	if f.MonteCarlo.Units < 1 || f.MonteCarlo.Units > 1_000_000 {
		r.fail("monte_carlo.units", "value %d is out of range; allowed a whole number in [1, 1000000]", f.MonteCarlo.Units)
	}
	s.MonteCarlo.Units = f.MonteCarlo.Units
	if s.Targets.MaxErrorP95UnitsRad > 0 && s.MonteCarlo.Units < 2 {
		r.fail("targets.max_error_p95_units_deg", "needs at least 2 Monte Carlo units, monte_carlo.units is %d; allowed only with monte_carlo.units ≥ 2: set it (e.g. 100) or remove the target", s.MonteCarlo.Units)
	}
	if f.Budget != nil {
		s.Budget = Budget{Set: true, Residuals: r.residuals(&f.Budget.Calibrated, s.Body.Sensors), ToleranceRad: f.Budget.ToleranceDeg * deg}
		r.rangeCheck("budget.tolerance_deg", f.Budget.ToleranceDeg, toleranceRange, " degrees")
	}
	s.Output = r.output(&f.Output)
	return s
}

func (r *resolver) orbit(o *fileOrbit, epoch *string, ep *time.Time) Orbit {
	var out Orbit
	def := defaultPropagator
	if len(o.TLE) > 0 {
		def = tlePropagator // the model TLEs are fitted with
	}
	if o.EphemerisFile != "" {
		def = orbit.EphemerisPropagator
	}
	r.choice("orbit.propagator", &o.Propagator, def, orbit.PropagatorNames())
	if o.LTANSolarTime != "" && o.LTAN == "" {
		r.fail("orbit.ltan_solar_time", "value is given without ltan; allowed with altitude_km + ltan only")
	}
	out.Propagator = o.Propagator
	if o.Propagator == tlePropagator && len(o.TLE) == 0 {
		r.fail("orbit.propagator", "value sgp4 propagates the mean elements of a TLE; allowed with orbit.tle only (two-body, j2-mean or j2-numeric for other orbits)")
	}
	has := func(p *float64) bool { return p != nil }
	elems := has(o.SemiMajorAxisKm) || has(o.Eccentricity) || has(o.ArgPerigeeDeg)
	if o.ElementSet != "" && !oneOf(o.ElementSet, elementSets) {
		r.fail("orbit.element_set", "value %q is unknown; allowed %s", o.ElementSet, strings.Join(elementSets, ", "))
	}
	if o.ElementSet == "osculating" && !has(o.SemiMajorAxisKm) {
		r.fail("orbit.element_set", "value osculating is given without semi_major_axis_km; allowed with full elements (a state is osculating by itself)")
	}
	switch {
	case o.EphemerisFile != "":
		if has(o.AltitudeKm) || elems || has(o.InclinationDeg) || has(o.RAANDeg) || has(o.MeanAnomalyDeg) || o.LTAN != "" || len(o.TLE) > 0 || o.State != nil || o.ElementSet != "" {
			r.fail("orbit.ephemeris_file", "value is given with other orbit keys; allowed ephemeris_file alone (the file holds the orbit)")
			return out
		}
		if o.Propagator != orbit.EphemerisPropagator {
			r.fail("orbit.propagator", "value %q with ephemeris_file; allowed %s (the file's states, interpolated)", o.Propagator, orbit.EphemerisPropagator)
		}
		out.Kind, out.Osculating, out.EphemerisFile = OrbitFile, true, r.path(o.EphemerisFile)
	case o.State != nil:
		if has(o.AltitudeKm) || elems || has(o.InclinationDeg) || has(o.RAANDeg) || has(o.MeanAnomalyDeg) || o.LTAN != "" || len(o.TLE) > 0 || o.ElementSet != "" {
			r.fail("orbit.state", "value is given with other orbit keys; allowed state alone (position_km and velocity_km_s hold the whole orbit)")
			return out
		}
		pos := r.vec("orbit.state.position_km", o.State.PositionKm, r3.Vec{})
		vel := r.vec("orbit.state.velocity_km_s", o.State.VelocityKmS, r3.Vec{})
		if o.State.PositionKm == nil || o.State.VelocityKmS == nil {
			r.fail("orbit.state", "value needs position_km and velocity_km_s, three numbers each (EME2000, km and km/s, at the epoch)")
			return out
		}
		out.Kind, out.Osculating, out.StatePositionKm, out.StateVelocityKmS = OrbitState, true, pos, vel
		el, err := orbit.ElementsFromState(orbit.State{R: pos, V: vel})
		if err != nil {
			r.fail("orbit.state", "value is not a closed orbit: %s; allowed an elliptic state above the atmosphere", err)
			return out
		}
		if rp := el.SemiMajorAxisKm * (1 - el.Eccentricity); rp < orbit.RadiusEarthKm+MinPerigeeAltitudeKm {
			r.fail("orbit.state", "value gives a perigee altitude of %.1f km; allowed a perigee ≥ %d km above the surface", rp-orbit.RadiusEarthKm, MinPerigeeAltitudeKm)
		}
		out.SemiMajorAxisKm, out.Eccentricity, out.AltitudeKm = el.SemiMajorAxisKm, el.Eccentricity, el.SemiMajorAxisKm-orbit.RadiusEarthKm
		out.InclinationRad, out.RAANRad, out.ArgPerigeeRad, out.MeanAnomalyRad = el.Inclination, el.RAAN, el.ArgPerigee, el.MeanAnomaly
	case len(o.TLE) > 0:
		if has(o.AltitudeKm) || elems || has(o.InclinationDeg) || has(o.RAANDeg) || has(o.MeanAnomalyDeg) || o.LTAN != "" {
			r.fail("orbit.tle", "value is given with other orbit keys; allowed tle alone (its lines hold every element)")
			return out
		}
		if len(o.TLE) != 2 {
			r.fail("orbit.tle", "value has %d lines; allowed exactly two lines (line 1 and line 2)", len(o.TLE))
			return out
		}
		t, err := ParseTLE(o.TLE[0], o.TLE[1])
		if err != nil {
			r.fail("orbit.tle", "value is not a valid element set: %s", err)
			return out
		}
		if msg := OrbitSizeError(t.SemiMajorAxisKm, t.Eccentricity); msg != "" {
			r.fail("orbit.tle", "value: mean motion %.8f rev/day and eccentricity %.7f give a %s", t.MeanMotionRevDay, t.Eccentricity, msg)
			return out
		}
		out.Kind, out.TLE = OrbitTLE, &t
		out.SemiMajorAxisKm, out.Eccentricity = t.SemiMajorAxisKm, t.Eccentricity
		out.InclinationRad, out.RAANRad, out.ArgPerigeeRad, out.MeanAnomalyRad = t.InclinationRad, t.RAANRad, t.ArgPerigeeRad, t.MeanAnomalyRad
		if *epoch == "" {
			*epoch = t.Epoch.Format(time.RFC3339Nano)
			*ep = t.Epoch
		}
	case has(o.AltitudeKm) && has(o.SemiMajorAxisKm):
		r.fail("orbit.semi_major_axis_km", "value is given together with altitude_km; allowed one of altitude_km (circular) or semi_major_axis_km (elements)")
		return out
	case has(o.AltitudeKm):
		h := *o.AltitudeKm
		if !altitudeRange.Holds(h) {
			r.fail("orbit.altitude_km", "value %g is below %d km or above %d km (the surface is at 0); allowed [%d, %d]", h, MinPerigeeAltitudeKm, MaxApogeeAltitudeKm, MinPerigeeAltitudeKm, MaxApogeeAltitudeKm)
		}
		if has(o.Eccentricity) || has(o.ArgPerigeeDeg) {
			r.fail("orbit.altitude_km", "value is given with eccentricity or arg_perigee_deg; allowed semi_major_axis_km with full elements, or altitude_km for a circular orbit")
		}
		out.AltitudeKm, out.SemiMajorAxisKm = h, orbit.RadiusEarthKm+h
		if o.LTAN != "" {
			if has(o.InclinationDeg) || has(o.RAANDeg) {
				r.fail("orbit.ltan", "value is given with inclination_deg or raan_deg; allowed ltan alone (a sun-synchronous orbit sets both)")
			}
			lt, err := ParseLocalTime(o.LTAN)
			if err != nil {
				r.fail("orbit.ltan", "value %s", err)
			}
			out.Kind, out.LTANHours = OrbitSunSync, lt
			r.choice("orbit.ltan_solar_time", &o.LTANSolarTime, defaultLTANSolarTime, ltanSolarTimes)
			out.LTANSolarTime = o.LTANSolarTime
		} else {
			if !has(o.InclinationDeg) {
				r.fail("orbit.inclination_deg", "value is missing; allowed %s with altitude_km, or give ltan for a sun-synchronous orbit", inclinationRange)
				return out
			}
			out.Kind = OrbitCircular
			out.InclinationRad = r.angle("orbit.inclination_deg", *o.InclinationDeg, inclinationRange)
			out.RAANRad = r.angle("orbit.raan_deg", setDefault(&o.RAANDeg, 0), nodeAngleRange)
		}
		out.MeanAnomalyRad = r.angle("orbit.mean_anomaly_deg", setDefault(&o.MeanAnomalyDeg, 0), nodeAngleRange)
	case has(o.SemiMajorAxisKm):
		if o.LTAN != "" {
			r.fail("orbit.ltan", "value is given with semi_major_axis_km; allowed ltan with altitude_km only")
		}
		a := *o.SemiMajorAxisKm
		e := setDefault(&o.Eccentricity, 0)
		if !eccentricityRng.Holds(e) {
			r.fail("orbit.eccentricity", "value %g is not an ellipse; allowed %s", e, eccentricityRng)
			return out
		}
		if msg := OrbitSizeError(a, e); msg != "" {
			r.fail("orbit.semi_major_axis_km", "value %g gives a %s", a, msg)
		}
		if !has(o.InclinationDeg) {
			r.fail("orbit.inclination_deg", "value is missing; allowed [0, 180]")
			return out
		}
		out.Kind, out.SemiMajorAxisKm, out.Eccentricity = OrbitKeplerian, a, e
		out.Osculating = o.ElementSet == "osculating"
		out.AltitudeKm = a - orbit.RadiusEarthKm
		out.InclinationRad = r.angle("orbit.inclination_deg", *o.InclinationDeg, inclinationRange)
		out.RAANRad = r.angle("orbit.raan_deg", setDefault(&o.RAANDeg, 0), nodeAngleRange)
		out.ArgPerigeeRad = r.angle("orbit.arg_perigee_deg", setDefault(&o.ArgPerigeeDeg, 0), nodeAngleRange)
		out.MeanAnomalyRad = r.angle("orbit.mean_anomaly_deg", setDefault(&o.MeanAnomalyDeg, 0), nodeAngleRange)
	default:
		r.fail("orbit", "value has no orbit; allowed altitude_km + inclination_deg, altitude_km + ltan, semi_major_axis_km + eccentricity + angles, or tle")
	}
	return out
}

func (r *resolver) angle(path string, v float64, iv Interval) float64 {
	r.rangeCheck(path, v, iv, " degrees")
	return v * deg
}

// parseAxis reads "+X", "-Z" … into a unit vector.
func parseAxis(s string) (r3.Vec, bool) {
	if len(s) != 2 || (s[0] != '+' && s[0] != '-') {
		return r3.Vec{}, false
	}
	sign := 1.0
	if s[0] == '-' {
		sign = -1
	}
	switch s[1] {
	case 'X', 'x':
		return r3.Vec{X: sign}, true
	case 'Y', 'y':
		return r3.Vec{Y: sign}, true
	case 'Z', 'z':
		return r3.Vec{Z: sign}, true
	}
	return r3.Vec{}, false
}

func (r *resolver) axis(path string, v *string, def string) r3.Vec {
	if *v == "" {
		*v = def
	}
	a, ok := parseAxis(*v)
	if !ok {
		r.fail(path, "value %q is not a body axis; allowed %s", *v, strings.Join(faces, ", "))
	}
	return a
}

func (r *resolver) attitude(path string, a *fileAttitude) Attitude {
	if a.InSunlight != nil || a.InEclipse != nil {
		if a.Law != "" && a.Law != LawSchedule {
			r.fail(path+".law", "value %q is given with in_sunlight/in_eclipse; allowed either a law or a schedule", a.Law)
		}
		if a.InSunlight == nil || a.InEclipse == nil {
			r.fail(path, "value has only one of in_sunlight and in_eclipse; allowed both")
			return Attitude{}
		}
		a.Law = LawSchedule
		sun := r.law(path+".in_sunlight", a.InSunlight)
		ecl := r.law(path+".in_eclipse", a.InEclipse)
		return Attitude{Law: Law{Name: LawSchedule}, InSunlight: &sun, InEclipse: &ecl}
	}
	if a.Law == "" {
		a.Law = LawTumble
	}
	return Attitude{Law: r.law(path, &a.fileLaw)}
}

func (r *resolver) law(path string, l *fileLaw) Law {
	if l.Law == "" {
		r.fail(path+".law", "value is missing; allowed %s", strings.Join(attitude.LawNames(), ", "))
		return Law{}
	}
	info, err := attitude.LookupLaw(l.Law)
	if err != nil {
		r.fail(path+".law", "value %q is unknown%s; allowed %s", l.Law, suggest.Hint(l.Law, attitude.LawNames()), strings.Join(attitude.LawNames(), ", "))
		return Law{}
	}
	out := Law{Name: l.Law, Orientation: quat.Number{Real: 1}}
	resolve, ok := lawResolvers[l.Law]
	if !ok {
		r.fail(path+".law", "value %q has no reader of its keys; allowed %s", l.Law, strings.Join(slices.Sorted(maps.Keys(lawResolvers)), ", "))
		return Law{}
	}
	resolve(r, path, l, info, &out)
	if (l.Law == LawNadir || l.Law == LawSun) && r3.Norm(r3.Cross(out.PointAxis, out.AlignAxis)) < 1e-9 && r3.Norm(out.PointAxis) > 0 && r3.Norm(out.AlignAxis) > 0 {
		r.fail(path+".align_axis", "value %q is parallel to point_axis %q, so it fixes no rotation about the pointed axis; allowed a body axis perpendicular to point_axis (for example +X with point_axis +Z)", l.AlignAxis, l.PointAxis)
	}
	given := l.given()
	for _, k := range attitude.LawKeys() {
		if given[k] && !slices.Contains(info.Keys, k) {
			r.fail(path+"."+k, "value does not apply to law %q; allowed only that law's keys", l.Law)
		}
	}
	return out
}

// lawResolvers read each registered law's keys from the file, with the
// defaults and choices of its registry entry (attitude.LawInfo): one entry
// per law (TestEveryLawHasAReader).
var lawResolvers = map[string]func(r *resolver, path string, l *fileLaw, info attitude.LawInfo, out *Law){
	attitude.NameNadir: func(r *resolver, path string, l *fileLaw, info attitude.LawInfo, out *Law) {
		out.PointAxis = r.axis(path+".point_axis", &l.PointAxis, info.Word("point_axis"))
		out.AlignAxis = r.axis(path+".align_axis", &l.AlignAxis, info.Word("align_axis"))
		out.RollRad = r.angle(path+".roll_offset_deg", setDefault(&l.RollOffsetDeg, info.Number("roll_offset_deg")), offsetRange)
		out.PitchRad = r.angle(path+".pitch_offset_deg", setDefault(&l.PitchOffsetDeg, info.Number("pitch_offset_deg")), offsetRange)
		out.YawRad = r.angle(path+".yaw_offset_deg", setDefault(&l.YawOffsetDeg, info.Number("yaw_offset_deg")), offsetRange)
		r.choice(path+".align_to", &l.AlignTo, info.Word("align_to"), info.Choices["align_to"])
		out.AlignTo = l.AlignTo
	},
	attitude.NameSun: func(r *resolver, path string, l *fileLaw, info attitude.LawInfo, out *Law) {
		out.PointAxis = r.axis(path+".point_axis", &l.PointAxis, info.Word("point_axis"))
		out.AlignAxis = r.axis(path+".align_axis", &l.AlignAxis, info.Word("align_axis"))
		out.ClockRad = r.angle(path+".clock_deg", setDefault(&l.ClockDeg, info.Number("clock_deg")), clockRange)
		r.choice(path+".align_to", &l.AlignTo, info.Word("align_to"), info.Choices["align_to"])
		out.AlignTo = l.AlignTo
		if l.AlignTo == AlignInertial {
			v := r.vec(path+".align_inertial", l.AlignInertial, r3.Vec{})
			if n := r3.Norm(v); !(n > 0) || math.IsInf(n, 0) {
				r.fail(path+".align_inertial", "value is missing or zero; allowed a direction [x, y, z] in EME2000 when align_to is inertial")
			} else {
				out.AlignInertial = r3.Scale(1/n, v)
			}
		}
		if l.AlignTo != AlignInertial && l.AlignInertial != nil {
			r.fail(path+".align_inertial", "value applies with align_to: inertial only; allowed align_to: inertial with align_inertial, or no align_inertial")
		}
		rate := setDefault(&l.RateDegS, info.Number("rate_deg_s"))
		r.rangeCheck(path+".rate_deg_s", rate, spinRateRange, " deg/s (spin about the sun line)")
		out.RateRadS = rate * deg
	},
	attitude.NameInertial: func(r *resolver, path string, l *fileLaw, info attitude.LawInfo, out *Law) {
		r.orientation(path, l, info, out)
	},
	attitude.NameSpin: func(r *resolver, path string, l *fileLaw, info attitude.LawInfo, out *Law) {
		r.orientation(path, l, info, out)
		out.SpinAxis = r.axis(path+".spin_axis", &l.SpinAxis, info.Word("spin_axis"))
		rate := setDefault(&l.RateDegS, info.Number("rate_deg_s"))
		r.rangeCheck(path+".rate_deg_s", rate, spinRateRange, " deg/s")
		out.RateRadS = rate * deg
	},
	attitude.NameReplay: func(r *resolver, path string, l *fileLaw, _ attitude.LawInfo, out *Law) {
		if l.File == "" {
			r.fail(path+".file", "value is missing; allowed the path of an attitude history: a CCSDS AEM (KVN, .aem) or a table time_utc,qx,qy,qz,qw (.csv)")
		}
		out.File = r.path(l.File)
	},
	attitude.NameTumble: (*resolver).rates,
	attitude.NameDetumble: func(r *resolver, path string, l *fileLaw, info attitude.LawInfo, out *Law) {
		r.rates(path, l, info, out)
		if l.TimeConstant == nil {
			r.fail(path+".time_constant", "value is missing; allowed the e-folding time of the detumbling controller's rate, such as 40m")
		} else if *l.TimeConstant <= 0 {
			r.fail(path+".time_constant", "value %s is not positive; allowed a length of time > 0 such as 40m", *l.TimeConstant)
		} else {
			out.TimeConstantS = l.TimeConstant.Seconds()
		}
	},
	attitude.NameIsotropic: func(*resolver, string, *fileLaw, attitude.LawInfo, *Law) {},
}

// rates reads the initial-rate bounds of a tumble (and a detumble) and its
// inertia tensor.
func (r *resolver) rates(path string, l *fileLaw, info attitude.LawInfo, out *Law) {
	m := setDefault(&l.MaxRateDegS, info.Number("max_rate_deg_s"))
	r.rangeCheck(path+".max_rate_deg_s", m, maxRateRange, " deg/s")
	lo := setDefault(&l.MinRateDegS, info.Number("min_rate_deg_s"))
	r.rangeCheck(path+".min_rate_deg_s", lo, minRateRange, " deg/s")
	if lo > m {
		r.fail(path+".min_rate_deg_s", "value %g is above max_rate_deg_s %g; allowed min_rate_deg_s ≤ max_rate_deg_s (equal values fix the rate)", lo, m)
	}
	out.MinRateRadS, out.MaxRateRadS = lo*deg, m*deg
	if l.InertiaKgM2 != nil {
		out.Inertia, out.HasInertia = r.inertia(path+".inertia_kg_m2", l.InertiaKgM2)
	}
}

// given says which law keys the file sets, by key (every key of
// attitude.LawKeys, TestFileLawKnowsEveryLawKey).
func (l *fileLaw) given() map[string]bool {
	return map[string]bool{
		"point_axis": l.PointAxis != "", "align_axis": l.AlignAxis != "", "roll_offset_deg": l.RollOffsetDeg != nil,
		"pitch_offset_deg": l.PitchOffsetDeg != nil, "yaw_offset_deg": l.YawOffsetDeg != nil, "clock_deg": l.ClockDeg != nil,
		"quaternion": l.Quaternion != nil, "euler_deg": l.EulerDeg != nil, "euler_sequence": l.EulerSequence != "",
		"spin_axis": l.SpinAxis != "", "rate_deg_s": l.RateDegS != nil, "max_rate_deg_s": l.MaxRateDegS != nil,
		"min_rate_deg_s": l.MinRateDegS != nil, "inertia_kg_m2": l.InertiaKgM2 != nil,
		"align_to": l.AlignTo != "", "align_inertial": l.AlignInertial != nil, "file": l.File != "",
		"time_constant": l.TimeConstant != nil,
	}
}

// inertia reads an inertia tensor given as [Ixx, Iyy, Izz] (principal axes
// along the body axes) or [Ixx, Iyy, Izz, Ixy, Ixz, Iyz] (the tensor's
// elements, kg·m²). Positive definiteness and the triangle inequalities are
// checked when the law is built.
func (r *resolver) inertia(path string, v []float64) ([3][3]float64, bool) {
	var J [3][3]float64
	if len(v) != 3 && len(v) != 6 {
		r.fail(path, "value has %d numbers; allowed [Ixx, Iyy, Izz] or [Ixx, Iyy, Izz, Ixy, Ixz, Iyz] in kg·m² (tensor elements, body axes)", len(v))
		return J, false
	}
	for i, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) || (i < 3 && !(x > 0)) {
			r.fail(path, "value [%d] = %g is not allowed; allowed positive moments Ixx, Iyy, Izz (kg·m²) and finite products", i, x)
			return J, false
		}
	}
	J[0][0], J[1][1], J[2][2] = v[0], v[1], v[2]
	if len(v) == 6 {
		J[0][1], J[1][0] = v[3], v[3]
		J[0][2], J[2][0] = v[4], v[4]
		J[1][2], J[2][1] = v[5], v[5]
	}
	return J, true
}

func (r *resolver) orientation(path string, l *fileLaw, info attitude.LawInfo, out *Law) {
	switch {
	case l.Quaternion != nil && l.EulerDeg != nil:
		r.fail(path+".euler_deg", "value is given together with quaternion; allowed one of them")
	case l.Quaternion != nil:
		q := l.Quaternion
		if len(q) != 4 {
			r.fail(path+".quaternion", "value has %d numbers; allowed four [w, x, y, z], scalar first", len(q))
			return
		}
		n := quat.Number{Real: q[0], Imag: q[1], Jmag: q[2], Kmag: q[3]}
		a := quat.Abs(n)
		if math.Abs(a-1) > 1e-3 {
			r.fail(path+".quaternion", "value has norm %g; allowed a unit quaternion (norm within 0.001 of 1)", a)
			return
		}
		out.Orientation = quat.Scale(1/a, n)
	case l.EulerDeg != nil:
		if len(l.EulerDeg) != 3 {
			r.fail(path+".euler_deg", "value has %d angles; allowed three angles in degrees", len(l.EulerDeg))
			return
		}
		if l.EulerSequence == "" {
			l.EulerSequence = info.Word("euler_sequence")
		}
		if !oneOf(l.EulerSequence, eulerSeqs) {
			r.fail(path+".euler_sequence", "value %q is unknown%s; allowed %s", l.EulerSequence, suggest.Hint(l.EulerSequence, eulerSeqs), strings.Join(eulerSeqs, ", "))
		}
		for i, v := range l.EulerDeg {
			out.EulerRad[i] = r.angle(fmt.Sprintf("%s.euler_deg[%d]", path, i), v, eulerRange)
		}
		out.EulerSequence = l.EulerSequence
	default:
		l.Quaternion = []float64{1, 0, 0, 0}
	}
}

// path resolves a file named in the scenario against the scenario's folder.
func (r *resolver) path(p string) string {
	if p == "" || filepath.IsAbs(p) {
		return p
	}
	return filepath.Join(r.dir, p)
}
