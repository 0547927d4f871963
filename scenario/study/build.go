package study

import (
	"codeberg.org/sunsight/sunsight/scenario"
	"fmt"
	"math"
	"strings"
	"sync"

	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
	"codeberg.org/sunsight/sunsight/orbit/timeline"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// MeanElements returns the orbit's mean Keplerian elements at the epoch:
// sun-synchronous orbits get their inclination from the J2 condition and their
// RAAN from the local time of the ascending node (mean sun).
func MeanElements(s *scenario.Scenario) (orbit.Elements, error) {
	o := s.Orbit
	el := orbit.Elements{SemiMajorAxisKm: o.SemiMajorAxisKm, Eccentricity: o.Eccentricity,
		Inclination: o.InclinationRad, RAAN: o.RAANRad, ArgPerigee: o.ArgPerigeeRad, MeanAnomaly: o.MeanAnomalyRad}
	if o.Kind == scenario.OrbitSunSync {
		inc, err := orbit.SunSyncInclination(o.SemiMajorAxisKm, o.Eccentricity)
		if err != nil {
			return el, fmt.Errorf("orbit.altitude_km: %g: %w", o.AltitudeKm, err)
		}
		el.Inclination = inc
		raan, err := orbit.RAANFromLTANSolar(o.LTANHours, s.Epoch, o.LTANSolarTime)
		if err != nil {
			return el, fmt.Errorf("orbit.ltan_solar_time: %w", err)
		}
		el.RAAN = raan
	}
	if o.Kind == scenario.OrbitFile {
		f, err := oemFactory(s)
		if err != nil {
			return el, err
		}
		oel, err := orbit.ElementsFromState(f().StateAt(0))
		if err != nil {
			return el, fmt.Errorf("orbit.ephemeris_file: the state at the epoch: %w", err)
		}
		el = orbit.OsculatingToMean(oel)
	} else if osc, ok := OsculatingState(s); ok {
		oel, err := orbit.ElementsFromState(osc)
		if err != nil {
			return el, fmt.Errorf("orbit: %w", err)
		}
		el = orbit.OsculatingToMean(oel)
	}
	if t := o.TLE; o.Kind == scenario.OrbitTLE && t != nil && !t.Epoch.Equal(s.Epoch) {
		// The element set holds at its own epoch: carry it to the run's
		// with the secular J2 rates (Warnings says when that is far).
		el = orbit.NewJ2Mean(el).MeanElementsAt(s.Epoch.Sub(t.Epoch).Seconds())
		el.RAAN, el.ArgPerigee, el.MeanAnomaly = wrap2π(el.RAAN), wrap2π(el.ArgPerigee), wrap2π(el.MeanAnomaly)
	}
	if err := el.Validate(); err != nil {
		return el, fmt.Errorf("orbit: %w", err)
	}
	return el, nil
}

// OsculatingState returns the osculating EME2000 state at the epoch of an
// orbit given as a state or as osculating elements (ok false for mean
// elements, sun-synchronous and TLE orbits).
func OsculatingState(s *scenario.Scenario) (orbit.State, bool) {
	o := s.Orbit
	switch {
	case o.Kind == scenario.OrbitState:
		return orbit.State{R: o.StatePositionKm, V: o.StateVelocityKmS}, true
	case o.Kind == scenario.OrbitKeplerian && o.Osculating:
		el := orbit.Elements{SemiMajorAxisKm: o.SemiMajorAxisKm, Eccentricity: o.Eccentricity,
			Inclination: o.InclinationRad, RAAN: o.RAANRad, ArgPerigee: o.ArgPerigeeRad, MeanAnomaly: o.MeanAnomalyRad}
		return el.State(), true
	}
	return orbit.State{}, false
}

// wrap2π returns x in [0, 2π).
func wrap2π(x float64) float64 {
	x = math.Mod(x, 2*math.Pi)
	if x < 0 {
		x += 2 * math.Pi
	}
	return x
}

// NewPropagator returns the factory of fresh propagators for the scenario's
// orbit and propagator choice.
func NewPropagator(s *scenario.Scenario) (func() orbit.Propagator, error) {
	el, err := MeanElements(s)
	if err != nil {
		return nil, err
	}
	p, err := orbit.LookupPropagator(s.Orbit.Propagator)
	if err != nil {
		return nil, fmt.Errorf("orbit.propagator: %w", err)
	}
	if p.FromTLE {
		return sgp4Factory(s)
	}
	if p.FromFile {
		if s.Orbit.Kind != scenario.OrbitFile {
			return nil, fmt.Errorf("orbit.propagator: %s interpolates orbit.ephemeris_file; allowed with an ephemeris file only", p.Name)
		}
		return oemFactory(s)
	}
	if osc, ok := OsculatingState(s); ok {
		f, err := p.NewFromState(osc)
		if err != nil {
			return nil, fmt.Errorf("orbit: %w", err)
		}
		return f, nil
	}
	f, err := p.New(el)
	if err != nil {
		return nil, fmt.Errorf("orbit.propagator: %w", err)
	}
	return f, nil
}

func buildAttitude(s *scenario.Scenario, a scenario.Attitude, path string) (attitude.Law, error) {
	if a.Name == scenario.LawSchedule {
		if a.InSunlight == nil || a.InEclipse == nil {
			return nil, fmt.Errorf("%s: a schedule needs in_sunlight and in_eclipse laws", path)
		}
		lit, err := buildLaw(s, *a.InSunlight, path+".in_sunlight")
		if err != nil {
			return nil, err
		}
		dark, err := buildLaw(s, *a.InEclipse, path+".in_eclipse")
		if err != nil {
			return nil, err
		}
		return attitude.Schedule{Sunlit: lit, Eclipse: dark}, nil
	}
	return buildLaw(s, a.Law, path)
}

func orientation(s *scenario.Scenario, l scenario.Law, path string) (r3.Rotation, error) {
	if l.EulerSequence != "" {
		seq, err := attitude.ParseEulerSequence(l.EulerSequence)
		if err != nil {
			return r3.Rotation{}, fmt.Errorf("%s.euler_sequence: %w", path, err)
		}
		return attitude.FromEuler(seq, l.EulerRad[0], l.EulerRad[1], l.EulerRad[2]), nil
	}
	if l.Orientation == (quat.Number{}) {
		return attitude.Identity, nil
	}
	return r3.Rotation(l.Orientation), nil
}

// lawBuilder builds one attitude law of the registry (orbit/attitude) from
// its resolved keys; seed is the scenario seed, or the unit's for the random
// laws.
type lawBuilder func(s *scenario.Scenario, l scenario.Law, seed uint64, path string) (attitude.Law, error)

// lawBuilders holds a builder for every registered law
// (TestEveryLawHasABuilder).
var lawBuilders = map[string]lawBuilder{
	attitude.NameNadir: func(_ *scenario.Scenario, l scenario.Law, _ uint64, _ string) (attitude.Law, error) {
		n := attitude.Nadir{NadirAxis: l.PointAxis, VelocityAxis: l.AlignAxis, YawToSun: l.AlignTo == scenario.AlignSun}
		if l.RollRad != 0 || l.PitchRad != 0 || l.YawRad != 0 {
			n.Offset = attitude.FromEuler(attitude.Seq321, l.YawRad, l.PitchRad, l.RollRad)
		}
		return n, nil
	},
	attitude.NameSun: func(_ *scenario.Scenario, l scenario.Law, _ uint64, _ string) (attitude.Law, error) {
		ref := attitude.TowardOrbitNormal
		switch l.AlignTo {
		case scenario.AlignNadir:
			ref = attitude.TowardNadir
		case scenario.AlignInertial:
			ref = attitude.TowardInertial
		}
		return attitude.Sun{SunAxis: l.PointAxis, SecondaryAxis: l.AlignAxis, Reference: ref, InertialDir: l.AlignInertial,
			SpinRate: l.RateRadS, Phase: l.ClockRad}, nil
	},
	attitude.NameInertial: func(s *scenario.Scenario, l scenario.Law, _ uint64, path string) (attitude.Law, error) {
		q, err := orientation(s, l, path)
		if err != nil {
			return nil, err
		}
		return attitude.Inertial{Q: q}, nil
	},
	attitude.NameSpin: func(s *scenario.Scenario, l scenario.Law, _ uint64, path string) (attitude.Law, error) {
		q, err := orientation(s, l, path)
		if err != nil {
			return nil, err
		}
		body := l.SpinAxis
		if body == (r3.Vec{}) {
			body = r3.Vec{Z: 1}
		}
		// The starting attitude is kept whole: the inertial spin axis is
		// where it puts the body spin axis, the phase its turn about it.
		return attitude.SpinFrom(q, body, l.RateRadS), nil
	},
	attitude.NameTumble: func(_ *scenario.Scenario, l scenario.Law, seed uint64, path string) (attitude.Law, error) {
		return tumbleLaw(seed, l, path)
	},
	attitude.NameDetumble: func(_ *scenario.Scenario, l scenario.Law, seed uint64, _ string) (attitude.Law, error) {
		return attitude.DrawDetumble(seed, l.MinRateRadS, l.MaxRateRadS, l.TimeConstantS), nil
	},
	attitude.NameIsotropic: func(_ *scenario.Scenario, _ scenario.Law, seed uint64, _ string) (attitude.Law, error) {
		return attitude.Isotropic{Seed: seed}, nil
	},
}

func buildLaw(s *scenario.Scenario, l scenario.Law, path string) (attitude.Law, error) {
	b, ok := lawBuilders[l.Name]
	if !ok {
		return nil, fmt.Errorf("%s.law: %q is not one of %s", path, l.Name, strings.Join(attitude.LawNames(), ", "))
	}
	return b(s, l, uint64(s.Seed), path)
}

// lawForUnit gives each Monte Carlo unit its own random attitude draw for
// the random laws (a tumble's tip-off attitude and rates, an isotropic
// sequence): unit 0 keeps the scenario seed, unit u uses seed + u. Other
// laws are the same for every unit (nil).
func lawForUnit(s *scenario.Scenario, att scenario.Attitude) func(u int) attitude.Law {
	info, err := attitude.LookupLaw(att.Name)
	if err != nil || !info.Random {
		return nil
	}
	l, b := att.Law, lawBuilders[att.Name]
	if l.Name == scenario.LawTumble && l.HasInertia {
		// One torque-free motion per unit, integrated once: each piece of
		// the run takes a clone that shares nothing mutable.
		var mu sync.Mutex
		free := map[int]*attitude.FreeTumble{}
		return func(u int) attitude.Law {
			mu.Lock()
			defer mu.Unlock()
			f, ok := free[u]
			if !ok {
				law, _ := tumbleLaw(uint64(s.Seed)+uint64(u), l, "attitude") // checked by buildLaw for unit 0
				f = law.(*attitude.FreeTumble)
				free[u] = f
			}
			return f.Clone()
		}
	}
	return func(u int) attitude.Law {
		law, _ := b(s, l, uint64(s.Seed)+uint64(u), "attitude")
		return law
	}
}

// tumbleLaw draws a tumble from seed: initial attitude uniform, rate
// magnitude uniform on [min, max], axis isotropic; with an inertia tensor
// the body then moves torque-free (Euler's equations), else it spins about
// the drawn axis at the drawn rate.
func tumbleLaw(seed uint64, l scenario.Law, path string) (attitude.Law, error) {
	d := attitude.DrawTumble(seed, l.MinRateRadS, l.MaxRateRadS)
	if !l.HasInertia {
		return d, nil
	}
	f, err := attitude.NewFreeTumble(d.Q0, d.Rate, attitude.Inertia(l.Inertia))
	if err != nil {
		return nil, fmt.Errorf("%s.inertia_kg_m2: %w", path, err)
	}
	return f, nil
}

// TumbleDraw is one unit's drawn tumble: the initial rate magnitude and
// body axis, and whether the body then moves torque-free (an inertia tensor
// is given) or spins about that fixed axis.
type TumbleDraw struct {
	Unit       int
	RateDegS   float64
	AxisBody   r3.Vec
	TorqueFree bool
}

// TumbleDraws returns the draws of units 0 … units−1 of a tumble attitude
// (nil for other laws), exactly as the run draws them.
func TumbleDraws(s *scenario.Scenario, att scenario.Attitude, units int) []TumbleDraw {
	if att.Name != scenario.LawTumble {
		return nil
	}
	out := make([]TumbleDraw, max(units, 1))
	for u := range out {
		d := attitude.DrawTumble(uint64(s.Seed)+uint64(u), att.MinRateRadS, att.MaxRateRadS)
		w := r3.Norm(d.Rate)
		out[u] = TumbleDraw{Unit: u, RateDegS: w * 180 / math.Pi, TorqueFree: att.HasInertia}
		if w > 0 {
			out[u].AxisBody = r3.Scale(1/w, d.Rate)
		}
	}
	return out
}

// BuildSensors turns sensor entries into a sensor array and, per sensor, the
// viewer (field of view and obstructions) and the albedo response.
func BuildSensors(s *scenario.Scenario, list []scenario.Sensor, path string) (*sensor.Array, []sky.Viewer, []albedo.Response, error) {
	var ss []sensor.Sensor
	var viewers []sky.Viewer
	var resp []albedo.Response
	obstacles := Obstacles(s)
	for i, sc := range list {
		p := fmt.Sprintf("%s[%d] (%s)", path, i, sc.Name)
		m, err := sensor.VectorMount(sc.Boresight, sc.RefAxis)
		if err != nil {
			return nil, nil, nil, fmt.Errorf("%s: mount: %w", p, err)
		}
		errs := sensor.Errors{MisalignSigma: sc.Errors.MisalignmentRad1Sigma, DarkSigma: sc.Errors.DarkOffset1Sigma,
			GainSigma: sc.Errors.Gain1Sigma, NoiseSigma: sc.Errors.Noise1Sigma, ADCBits: sc.ADCBits, FullScale: sc.FullScale}
		info, ok := sensor.LookupKind(sc.Kind)
		if !ok {
			return nil, nil, nil, fmt.Errorf("%s: kind %q is not one of %s", p, sc.Kind, strings.Join(sensor.KindNames(), ", "))
		}
		sn, err := info.Build(sensor.Common{Name: sc.Name, Mount: m, HalfAngle: sc.HalfAngleRad, Threshold: sc.Threshold,
			Errors: errs, OffsetSigma: sc.Errors.ApertureOffsetMM1Sigma}, sc.Params)
		if err != nil {
			return nil, nil, nil, fmt.Errorf("%s: %w", p, err)
		}
		r := albedo.Response{}
		if t, ok := sn.(sensor.ResponseTabler); ok {
			// The albedo integral uses the sensor's own measured response.
			if inc, rel := t.ResponseTable(); len(inc) > 0 {
				if r, err = albedo.NewTableResponse(inc, rel); err != nil {
					return nil, nil, nil, fmt.Errorf("%s: albedo response: %w", p, err)
				}
			}
		}
		ss = append(ss, sn)
		resp = append(resp, r)
		viewers = append(viewers, mounted(sensor.SunView{Sensor: sn}, sc, obstacles))
	}
	arr, err := sensor.NewArray(ss...)
	if err != nil {
		return nil, nil, nil, fmt.Errorf("%s: %w", path, err)
	}
	return arr, viewers, resp, nil
}

// mountNormals lists the outward normals of the surfaces the sensors sit on.
func mountNormals(list []scenario.Sensor) []r3.Vec {
	out := make([]r3.Vec, len(list))
	for i, sc := range list {
		out[i] = sc.MountNormal
	}
	return out
}

// mounted wraps a sensor's field of view with what its mount hides: the
// plane of the surface it sits on and every obstacle, traced from its
// position.
func mounted(v sky.Viewer, sc scenario.Sensor, obstacles []sky.Obstacle) *sky.Obstructed {
	return &sky.Obstructed{View: v, Position: sc.PositionM, Face: sc.MountNormal, Obstacles: obstacles}
}

// Obstacles returns the bus outline (a solid box, when the body has one)
// and the body's obstructions as sky shapes (body frame, m).
func Obstacles(s *scenario.Scenario) []sky.Obstacle {
	var out []sky.Obstacle
	if b := s.Body.SizeM; b != (r3.Vec{}) {
		out = append(out, sky.Box{Half: r3.Scale(0.5, b)})
	}
	for _, o := range s.Body.Obstructions {
		switch o.Shape {
		case scenario.ShapeRectangle:
			out = append(out, boxFaces(o.CentreM, o.HalfExtentsM)...)
		case scenario.ShapeCylinder:
			out = append(out, sky.Cylinder{A: o.FromM, B: o.ToM, Radius: o.RadiusM})
		}
	}
	return out
}

// boxFaces returns the faces of an axis-aligned box as rectangles; a box
// with one zero half extent is a single flat panel.
func boxFaces(c, h r3.Vec) []sky.Obstacle {
	ex, ey, ez := r3.Vec{X: h.X}, r3.Vec{Y: h.Y}, r3.Vec{Z: h.Z}
	var out []sky.Obstacle
	add := func(n r3.Vec, u, v r3.Vec) {
		if r3.Norm(u) == 0 || r3.Norm(v) == 0 {
			return
		}
		out = append(out, sky.Rectangle{Centre: r3.Add(c, n), HalfU: u, HalfV: v})
		if r3.Norm(n) > 0 {
			out = append(out, sky.Rectangle{Centre: r3.Sub(c, n), HalfU: u, HalfV: v})
		}
	}
	add(ex, ey, ez)
	add(ey, ex, ez)
	add(ez, ex, ey)
	return out
}

// AlbedoFactory returns the albedo model factory, nil for model "none".
func AlbedoFactory(s *scenario.Scenario) (func() (*albedo.Model, error), error) {
	return albedoFactory(s, s.Albedo, "albedo")
}

// OnboardFactory returns the factory of the on-board albedo model
// (albedo.onboard), nil without one. The on-board model "none" predicts no
// albedo (a uniform reflectance of 0), so its corrected figures equal the
// uncorrected ones and are still reported beside them.
func OnboardFactory(s *scenario.Scenario) (func() (*albedo.Model, error), error) {
	ob := s.Albedo.Onboard
	if ob == nil {
		return nil, nil
	}
	if ob.Model == scenario.AlbedoNone {
		zero := *ob
		zero.Model, zero.Value = scenario.AlbedoUniform, 0
		return albedoFactory(s, zero, "albedo.onboard")
	}
	return albedoFactory(s, *ob, "albedo.onboard")
}

// albedoFactory returns the factory of the albedo model a (the file's block
// at path), nil for model "none".
func albedoFactory(s *scenario.Scenario, a scenario.Albedo, path string) (func() (*albedo.Model, error), error) {
	m, err := albedo.LookupModel(a.Model)
	if err != nil {
		return nil, fmt.Errorf("%s.model: %w", path, err)
	}
	if m.Reflectance == nil {
		return nil, nil
	}
	refl, err := m.Reflectance(a.Value, a.GridFile)
	if err != nil {
		if m.TakesGrid {
			return nil, fmt.Errorf("%s.grid_file: %w", path, err)
		}
		return nil, fmt.Errorf("%s.value: %w", path, err)
	}
	cfg := albedo.Config{Reflectance: refl, Cells: a.Cells, AltitudeKm: s.Orbit.SemiMajorAxisKm - orbit.RadiusEarthKm}
	if s.Orbit.Eccentricity > 0 || s.Orbit.Kind == scenario.OrbitFile {
		cfg.AltitudeKm = 0 // built at the first call and rebuilt as the radius changes
	}
	if _, err := albedo.New(cfg); err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	if zonalTables(s, cfg) {
		if f, err := albedo.NewTableFactory(cfg); err == nil {
			return f, nil
		}
	}
	return func() (*albedo.Model, error) { return albedo.New(cfg) }, nil
}

// zonalTableMinSteps is the run length from which a zonal model reads its
// cones from shared tables (albedo.NewTableFactory): one table of a 60°
// cone builds in about 0.5 s of CPU (BenchmarkZonalBoresightTableBuild),
// the time of some 200 000 sensor integrals at ~2.5 µs each, so a run of
// six such sensors pays for it from about 35 000 steps (4 days at 10 s).
const zonalTableMinSteps = 50_000

// zonalTables reports whether the albedo model cfg of scenario s reads its
// cones from shared zonal tables: a zonal reflectance (the factory refuses
// one that leaves [0, 1]), a circular orbit whose radius stays put (not
// j2-numeric or sgp4, whose radius swings beyond the tables' 1 km slack)
// and a long enough run.
func zonalTables(s *scenario.Scenario, cfg albedo.Config) bool {
	if _, ok := cfg.Reflectance.(albedo.Zonal); !ok || !(cfg.AltitudeKm > 0) {
		return false
	}
	switch s.Orbit.Propagator {
	case "j2-mean", "two-body":
	default:
		return false
	}
	return s.Step.Seconds() > 0 && s.Duration.Seconds()/s.Step.Seconds() >= zonalTableMinSteps
}

// EstimatorList returns the scenario's estimators (the resolver fills the
// applicable ones, primary first, when the file lists none).
func EstimatorList(s *scenario.Scenario, list []scenario.Sensor) ([]sensor.Estimator, error) {
	if len(s.Estimators) == 0 {
		return nil, fmt.Errorf("estimators: none applies to the %d sensors listed; add cosine or two-axis sensors", len(list))
	}
	var out []sensor.Estimator
	for i, n := range s.Estimators {
		e, err := sensor.EstimatorByName(n)
		if err != nil {
			return nil, fmt.Errorf("estimators[%d]: %w", i, err)
		}
		if c, ok := e.(sensor.Combined); ok {
			// The cosine part of the combination passes the least-squares gate.
			c.CosineGate = Gate(s, sensor.LeastSquares{}.Name())
			e = c
		}
		out = append(out, e)
	}
	return out, nil
}

// Gate returns the validity gate of the named estimator: the scenario's,
// else the default.
func Gate(s *scenario.Scenario, estimator string) sensor.Gate {
	g, ok := s.Validity.Gates[estimator]
	if !ok {
		g = scenario.DefaultGate(estimator)
	}
	return sensor.Gate{MinSensors: g.MinSensors, MinSignal: g.MinTotalSignal, MaxResidual: g.MaxResidual}
}

// Gates returns the validity gates of a list of estimators, in order.
func Gates(s *scenario.Scenario, ests []sensor.Estimator) []sensor.Gate {
	out := make([]sensor.Gate, len(ests))
	for j, e := range ests {
		out[j] = Gate(s, e.Name())
	}
	return out
}

// Config builds the simulation of the scenario with its own sensors and
// attitude.
func Config(s *scenario.Scenario) (sim.Config, error) {
	return ConfigFor(s, s.Body.Sensors, s.Attitude)
}

// ConfigFor builds the simulation of the scenario with another sensor list
// (a layout or a subset of candidates) and attitude (a mode).
func ConfigFor(s *scenario.Scenario, sensors []scenario.Sensor, att scenario.Attitude) (sim.Config, error) {
	var cfg sim.Config
	newProp, err := NewPropagator(s)
	if err != nil {
		return cfg, err
	}
	sun, err := ephem.SunByName(s.SunModel)
	if err != nil {
		return cfg, fmt.Errorf("sun_model: %w", err)
	}
	if _, err := illum.LookupShadow(s.Shadow); err != nil {
		return cfg, fmt.Errorf("shadow: %w", err)
	}
	arr, viewers, resp, err := BuildSensors(s, sensors, "body.sensors")
	if err != nil {
		return cfg, err
	}
	var law attitude.Law
	if att.Name == scenario.LawTimeline {
		law, err = buildTimeline(s, newProp, sun, viewers)
	} else {
		law, err = buildAttitude(s, att, "attitude")
	}
	if err != nil {
		return cfg, err
	}
	alb, err := AlbedoFactory(s)
	if err != nil {
		return cfg, err
	}
	onboard, err := OnboardFactory(s)
	if err != nil {
		return cfg, err
	}
	ests, err := EstimatorList(s, sensors)
	if err != nil {
		return cfg, err
	}
	panels, err := Panels(s)
	if err != nil {
		return cfg, err
	}
	// The mounting plane and the obstacles cut each sensor's direct sunlight
	// and albedo in the time domain as they cut its view of the sky.
	var blocked []*sky.Obstructed
	obs := Obstacles(s)
	for _, sc := range sensors {
		blocked = append(blocked, mounted(nil, sc, obs))
	}
	cfg = sim.Config{
		Epoch: s.Epoch, Duration: s.Duration.Seconds(), Step: s.Step.Seconds(),
		NewPropagator: newProp, Sun: sun, Cylindrical: ShadowModel(s) == illum.Cylindrical, Law: law, LawForUnit: lawForUnit(s, att),
		Array: arr, Viewers: viewers, Blocked: blocked, NewAlbedo: alb, NewCorrection: onboard, AlbedoResponse: resp, Estimators: ests,
		Seed: uint64(s.Seed), Units: max(s.MonteCarlo.Units, 1), FalseSunBoundDeg: s.Validity.FalseSunBoundDeg, Gates: Gates(s, ests),
		MountNormals: mountNormals(sensors),
		Panels:       panels,
		PanelAlbedo:  s.Albedo.OnPanels,
		Filter:       FilterConfig(s),
	}
	if tl, ok := law.(*timeline.Timeline); ok && cfg.Filter != nil {
		cfg.Filter.SpanStarts = filterSpanStarts(tl.Spans, cfg.Steps(), cfg.Step)
	}
	return cfg, cfg.Validate()
}

// ShadowModel is the scenario's shadow geometry, used by the step loop, the
// eclipse search and the year view alike.
func ShadowModel(s *scenario.Scenario) illum.ShadowModel {
	m, err := illum.LookupShadow(s.Shadow)
	if err != nil {
		return illum.Conical // refused by the scenario's validation already
	}
	return m.Shadow
}
