package randscenario

import (
	"fmt"
	"maps"
	"math"
	"math/rand/v2"
	"slices"
	"time"

	"go.yaml.in/yaml/v3"
)

// File is one scenario file as drawn; nil and empty fields are left out.
type File struct {
	Name       string      `yaml:"name"`
	Epoch      string      `yaml:"epoch,omitempty"`
	Duration   string      `yaml:"duration"`
	Step       string      `yaml:"step"`
	Seed       int64       `yaml:"seed"`
	Orbit      Orbit       `yaml:"orbit"`
	SunModel   string      `yaml:"sun_model"`
	Shadow     string      `yaml:"shadow"`
	Attitude   Law         `yaml:"attitude"`
	Body       Body        `yaml:"body"`
	Estimators []string    `yaml:"estimators,omitempty"`
	Albedo     Albedo      `yaml:"albedo"`
	MonteCarlo *MonteCarlo `yaml:"monte_carlo,omitempty"`
	Budget     *Budget     `yaml:"budget,omitempty"`
	GyroFilter *GyroFilter `yaml:"gyro_filter,omitempty"`
}

// GyroFilter is the gyro-aided filter block (nil keys: the defaults).
type GyroFilter struct {
	AngleRandomWalkDegRtH *float64 `yaml:"angle_random_walk_deg_rt_h,omitempty"`
	BiasInstabilityDegH   *float64 `yaml:"bias_instability_deg_h,omitempty"`
	BiasTimeS             *float64 `yaml:"bias_time_s,omitempty"`
	HoldBoundDeg          *float64 `yaml:"hold_bound_deg,omitempty"`
}

// Budget is the error budget block: residuals after calibration (for
// every kind) and the pointing-knowledge tolerance.
type Budget struct {
	Calibrated   Errors  `yaml:"calibrated"`
	ToleranceDeg float64 `yaml:"tolerance_deg"`
}

// Orbit is the orbit block.
type Orbit struct {
	AltitudeKm      *float64 `yaml:"altitude_km,omitempty"`
	LTAN            string   `yaml:"ltan,omitempty"`
	SemiMajorAxisKm *float64 `yaml:"semi_major_axis_km,omitempty"`
	Eccentricity    *float64 `yaml:"eccentricity,omitempty"`
	InclinationDeg  *float64 `yaml:"inclination_deg,omitempty"`
	RAANDeg         *float64 `yaml:"raan_deg,omitempty"`
	ArgPerigeeDeg   *float64 `yaml:"arg_perigee_deg,omitempty"`
	MeanAnomalyDeg  *float64 `yaml:"mean_anomaly_deg,omitempty"`
	TLE             []string `yaml:"tle,omitempty"`
	Propagator      string   `yaml:"propagator"`
}

// Law is an attitude law; a schedule sets InSunlight and InEclipse instead
// of Law.
type Law struct {
	Law            string    `yaml:"law,omitempty"`
	PointAxis      string    `yaml:"point_axis,omitempty"`
	AlignAxis      string    `yaml:"align_axis,omitempty"`
	AlignTo        string    `yaml:"align_to,omitempty"`
	AlignInertial  []float64 `yaml:"align_inertial,omitempty,flow"`
	RollOffsetDeg  *float64  `yaml:"roll_offset_deg,omitempty"`
	PitchOffsetDeg *float64  `yaml:"pitch_offset_deg,omitempty"`
	YawOffsetDeg   *float64  `yaml:"yaw_offset_deg,omitempty"`
	ClockDeg       *float64  `yaml:"clock_deg,omitempty"`
	Quaternion     []float64 `yaml:"quaternion,omitempty,flow"`
	EulerDeg       []float64 `yaml:"euler_deg,omitempty,flow"`
	EulerSequence  string    `yaml:"euler_sequence,omitempty"`
	SpinAxis       string    `yaml:"spin_axis,omitempty"`
	RateDegS       *float64  `yaml:"rate_deg_s,omitempty"`
	MaxRateDegS    *float64  `yaml:"max_rate_deg_s,omitempty"`
	TimeConstant   string    `yaml:"time_constant,omitempty"`
	InSunlight     *Law      `yaml:"in_sunlight,omitempty"`
	InEclipse      *Law      `yaml:"in_eclipse,omitempty"`
	// Keys holds further law keys by name (tests set any key of the law
	// registry through it); a key of Keys replaces a field of the same
	// name when the file is written.
	Keys map[string]any `yaml:",inline"`
}

// Errors is a sensor's error model (one-sigma values).
type Errors struct {
	DarkOffset1Sigma       float64 `yaml:"dark_offset_1sigma,omitempty"`
	Gain1Sigma             float64 `yaml:"gain_1sigma,omitempty"`
	Noise1Sigma            float64 `yaml:"noise_1sigma,omitempty"`
	MisalignmentDeg1Sigma  float64 `yaml:"misalignment_deg_1sigma,omitempty"`
	ApertureOffsetMM1Sigma float64 `yaml:"aperture_offset_mm_1sigma,omitempty"`
}

// Sensor is one sensor entry.
type Sensor struct {
	Name              string    `yaml:"name"`
	Kind              string    `yaml:"kind"`
	Face              string    `yaml:"face,omitempty"`
	TiltDeg           *float64  `yaml:"tilt_deg,omitempty"`
	TiltToward        string    `yaml:"tilt_toward,omitempty"`
	ClockDeg          *float64  `yaml:"clock_deg,omitempty"`
	Boresight         []float64 `yaml:"boresight,omitempty,flow"`
	PositionM         []float64 `yaml:"position_m,omitempty,flow"`
	HalfAngleDeg      *float64  `yaml:"half_angle_deg,omitempty"`
	Threshold         *float64  `yaml:"threshold,omitempty"`
	FullScale         *float64  `yaml:"full_scale,omitempty"`
	ADCBits           *int      `yaml:"adc_bits,omitempty"`
	ShadeHeightMM     *float64  `yaml:"shade_height_mm,omitempty"`
	CellSizeMM        *float64  `yaml:"cell_size_mm,omitempty"`
	GapMM             *float64  `yaml:"gap_mm,omitempty"`
	AccuracyDeg1Sigma *float64  `yaml:"accuracy_deg_1sigma,omitempty"`
	FOVShape          string    `yaml:"fov_shape,omitempty"`
	// The digital kind's blinding thresholds (nil: the defaults, off).
	MoonBlindLitFraction  *float64 `yaml:"moon_blind_lit_fraction,omitempty"`
	LitEarthBlindDepthDeg *float64 `yaml:"lit_earth_blind_depth_deg,omitempty"`
	Errors                *Errors  `yaml:"errors,omitempty"`
	// Keys holds further kind keys by name (tests set any key of the
	// sensor-kind registry through it); a key of Keys replaces a field of
	// the same name when the file is written.
	Keys map[string]any `yaml:",inline"`
}

// MarshalYAML writes the sensor's fields, then Keys (see withKeys).
func (s Sensor) MarshalYAML() (any, error) {
	type plain Sensor
	p := plain(s)
	p.Keys = nil
	return withKeys(p, s.Keys)
}

// MarshalYAML writes the law's fields, then Keys (see withKeys).
func (l Law) MarshalYAML() (any, error) {
	type plain Law
	p := plain(l)
	p.Keys = nil
	return withKeys(p, l.Keys)
}

// withKeys encodes v, a struct, as a YAML mapping, then adds keys in name
// order, a key of keys in place of a field of the same name.
func withKeys(v any, keys map[string]any) (*yaml.Node, error) {
	var n yaml.Node
	if err := n.Encode(v); err != nil {
		return nil, err
	}
	for _, k := range slices.Sorted(maps.Keys(keys)) {
		var v yaml.Node
		if err := v.Encode(keys[k]); err != nil {
			return nil, err
		}
		replaced := false
		for i := 0; i+1 < len(n.Content); i += 2 {
			if n.Content[i].Value == k {
				n.Content[i+1], replaced = &v, true
			}
		}
		if !replaced {
			n.Content = append(n.Content, &yaml.Node{Kind: yaml.ScalarNode, Value: k}, &v)
		}
	}
	return &n, nil
}

// Obstruction is a body part in the way of the sensors.
type Obstruction struct {
	Name         string    `yaml:"name"`
	Shape        string    `yaml:"shape"`
	CentreM      []float64 `yaml:"centre_m,omitempty,flow"`
	HalfExtentsM []float64 `yaml:"half_extents_m,omitempty,flow"`
	FromM        []float64 `yaml:"from_m,omitempty,flow"`
	ToM          []float64 `yaml:"to_m,omitempty,flow"`
	RadiusM      *float64  `yaml:"radius_m,omitempty"`
}

// Body holds the sensors and obstructions.
type Body struct {
	FormFactor   string        `yaml:"form_factor,omitempty"`
	SizeM        []float64     `yaml:"size_m,omitempty,flow"`
	Sensors      []Sensor      `yaml:"sensors"`
	Obstructions []Obstruction `yaml:"obstructions,omitempty"`
}

// Albedo is the albedo block.
type Albedo struct {
	Model    string   `yaml:"model"`
	Value    *float64 `yaml:"value,omitempty"`
	GridFile string   `yaml:"grid_file,omitempty"`
	Cells    int      `yaml:"cells,omitempty"`
	// Onboard is the on-board albedo model (never drawn: the tests set it).
	Onboard *OnboardAlbedo `yaml:"onboard,omitempty"`
}

// OnboardAlbedo is the albedo.onboard block.
type OnboardAlbedo struct {
	Model    string   `yaml:"model"`
	Value    *float64 `yaml:"value,omitempty"`
	GridFile string   `yaml:"grid_file,omitempty"`
	Cells    int      `yaml:"cells,omitempty"`
}

// MonteCarlo is the Monte Carlo block.
type MonteCarlo struct {
	Units int `yaml:"units"`
}

// YAML returns the file as scenario YAML text.
func (f *File) YAML() []byte {
	b, err := yaml.Marshal(f)
	if err != nil {
		panic(err) // plain structs of numbers and strings always marshal
	}
	return b
}

// Clone returns a deep copy (through YAML, the file's own form).
func (f *File) Clone() *File {
	var g File
	if err := yaml.Unmarshal(f.YAML(), &g); err != nil {
		panic(err)
	}
	return &g
}

// Options tune a draw.
type Options struct {
	// GridFile is the path of a reflectance grid for the grid albedo model;
	// empty leaves the grid model out.
	GridFile string
}

// Faces are the body faces, in the file's spelling.
var Faces = []string{"+X", "-X", "+Y", "-Y", "+Z", "-Z"}

const (
	earthRadiusKm = 6378.137    // WGS 84 equatorial radius (NIMA TR8350.2, 2000)
	muEarth       = 398600.4418 // km³/s², EGM96 (from memory)
	geoAltitudeKm = 35786.0     // geostationary altitude (from memory)
	secondsPerDay = 86400.0     // TLE mean motion is in revolutions per day
	minSteps      = 400         // a short run
	maxSteps      = 1500
)

// drawer wraps one case's random stream.
type drawer struct{ r *rand.Rand }

func (d drawer) u(lo, hi float64) float64 { return lo + (hi-lo)*d.r.Float64() }
func (d drawer) p(prob float64) bool      { return d.r.Float64() < prob }
func (d drawer) pick(list ...string) string {
	return list[d.r.IntN(len(list))]
}
func (d drawer) round(v float64, digits int) float64 {
	s := math.Pow(10, float64(digits))
	return math.Round(v*s) / s
}
func (d drawer) ptr(lo, hi float64, digits int) *float64 {
	v := d.round(d.u(lo, hi), digits)
	return &v
}
func val(v float64) *float64 { return &v }

// face returns a random face; perpTo returns a random face perpendicular to f.
func (d drawer) face() string { return Faces[d.r.IntN(6)] }
func (d drawer) perpTo(f string) string {
	var out []string
	for _, g := range Faces {
		if g[1] != f[1] {
			out = append(out, g)
		}
	}
	return out[d.r.IntN(len(out))]
}

// unitVec draws an isotropic unit vector, rounded to 6 digits.
func (d drawer) unitVec() []float64 {
	z := d.u(-1, 1)
	phi := d.u(0, 2*math.Pi)
	s := math.Sqrt(1 - z*z)
	return []float64{d.round(s*math.Cos(phi), 6), d.round(s*math.Sin(phi), 6), d.round(z, 6)}
}

// quaternion draws a uniformly random unit quaternion (Shoemake 1992,
// Graphics Gems III, from memory), rounded and renormalised to 9 digits.
func (d drawer) quaternion() []float64 {
	u1, u2, u3 := d.r.Float64(), d.r.Float64(), d.r.Float64()
	a, b := math.Sqrt(1-u1), math.Sqrt(u1)
	q := []float64{a * math.Sin(2*math.Pi*u2), a * math.Cos(2*math.Pi*u2), b * math.Sin(2*math.Pi*u3), b * math.Cos(2*math.Pi*u3)}
	for i := range q {
		q[i] = d.round(q[i], 9)
	}
	return q
}

// New draws case i of the suite seeded by seed.
func New(seed uint64, i int, opt Options) *File {
	d := drawer{rand.New(rand.NewPCG(seed, uint64(i)))}
	f := &File{Name: fmt.Sprintf("property case %d (seed %d)", i, seed), Seed: int64(d.r.IntN(1000))}
	ep := time.Date(2024, 1, 1, 0, 0, 0, 0, time.UTC).Add(time.Duration(d.u(0, 5*365*24)) * time.Hour)
	f.Epoch = ep.Format(time.RFC3339)
	aKm := d.orbit(f, ep)
	period := 2 * math.Pi * math.Sqrt(aKm*aKm*aKm/muEarth)
	dur := math.Round(period * d.u(0.5, 2.2))
	steps := d.u(minSteps, maxSteps)
	step := max(1, math.Round(dur/steps))
	f.Duration, f.Step = fmt.Sprintf("%.0fs", dur), fmt.Sprintf("%.0fs", step)
	f.SunModel = d.pick("low-precision", "meeus")
	f.Shadow = d.pick("conical", "cylindrical")
	f.Attitude = d.law(true)
	d.body(f)
	d.albedo(f, opt)
	if d.p(0.4) {
		f.MonteCarlo = &MonteCarlo{Units: 1 + d.r.IntN(3)}
	}
	// Drawn last, so the earlier draws of a case do not move.
	if d.p(0.3) {
		f.GyroFilter = &GyroFilter{AngleRandomWalkDegRtH: d.ptr(0, 3, 3), BiasInstabilityDegH: d.ptr(0, 100, 2),
			BiasTimeS: d.ptr(10, 5000, 0), HoldBoundDeg: d.ptr(1, 30, 1)}
	}
	return f
}

// orbit fills the orbit block and returns the semi-major axis (km).
func (d drawer) orbit(f *File, ep time.Time) float64 {
	o := &f.Orbit
	o.Propagator = d.pick("two-body", "j2-mean", "j2-mean", "two-body", "j2-numeric")
	alt := func() float64 {
		switch x := d.r.Float64(); {
		case x < 0.65:
			return d.round(d.u(300, 2000), 1)
		case x < 0.85:
			return d.round(d.u(2000, 20200), 1)
		default:
			return d.round(d.u(20200, geoAltitudeKm), 1)
		}
	}
	switch d.pick("circular", "circular", "sso", "keplerian", "tle") {
	case "circular":
		h := alt()
		o.AltitudeKm = &h
		o.InclinationDeg = d.ptr(0, 180, 3)
		o.RAANDeg = d.ptr(0, 360, 3)
		if d.p(0.5) {
			o.MeanAnomalyDeg = d.ptr(0, 360, 3)
		}
		return earthRadiusKm + h
	case "sso":
		h := d.round(d.u(300, 1500), 1)
		o.AltitudeKm = &h
		m := d.r.IntN(24 * 60)
		o.LTAN = fmt.Sprintf("%02d:%02d", m/60, m%60)
		return earthRadiusKm + h
	case "keplerian":
		hp := d.round(d.u(300, 2000), 1)
		ha := hp + d.round(d.u(0, 38000), 1)
		rp, ra := earthRadiusKm+hp, earthRadiusKm+ha
		a := d.round((rp+ra)/2, 3)
		e := d.round((ra-rp)/(ra+rp), 6)
		if a*(1-e) < earthRadiusKm+300 {
			e = d.round(1-(earthRadiusKm+300)/a, 6)
		}
		o.SemiMajorAxisKm, o.Eccentricity = &a, &e
		o.InclinationDeg = d.ptr(0, 180, 3)
		o.RAANDeg = d.ptr(0, 360, 3)
		o.ArgPerigeeDeg = d.ptr(0, 360, 3)
		o.MeanAnomalyDeg = d.ptr(0, 360, 3)
		return a
	default:
		// A TLE carries its own epoch: the file gives none.
		f.Epoch = ""
		h := d.round(d.u(300, 2000), 1)
		if d.p(0.2) {
			h = alt()
		}
		a := earthRadiusKm + h
		n := secondsPerDay / (2 * math.Pi * math.Sqrt(a*a*a/muEarth))
		e := d.round(d.u(0, 0.02), 7)
		if a*(1-e) < earthRadiusKm+300 {
			e = 0
		}
		o.TLE = tle(d.r.IntN(99999), ep, d.u(0, 180), d.u(0, 360), e, d.u(0, 360), d.u(0, 360), n)
		return a
	}
}

// tle formats a two-line element set (Spacetrack Report No. 3 columns) with
// a zero drag term.
func tle(catalog int, ep time.Time, inc, raan, e, argp, m, nRevDay float64) []string {
	yy := ep.Year() % 100
	doy := float64(ep.YearDay()) + float64(ep.Sub(ep.Truncate(24*time.Hour)))/float64(24*time.Hour)
	l1 := fmt.Sprintf("1 %05dU 26001A   %02d%012.8f  .00000000  00000-0  00000-0 0  999", catalog, yy, doy)
	l2 := fmt.Sprintf("2 %05d %8.4f %8.4f %07d %8.4f %8.4f %11.8f%5d", catalog, inc, raan, int(math.Round(e*1e7)), argp, m, nRevDay, 1)
	return []string{l1 + fmt.Sprint(Checksum(l1)), l2 + fmt.Sprint(Checksum(l2))}
}

// Checksum is the TLE line checksum: the digits of the line plus one per
// minus sign, modulo 10 (Spacetrack Report No. 3).
func Checksum(line string) int {
	s := 0
	for _, c := range line {
		switch {
		case c >= '0' && c <= '9':
			s += int(c - '0')
		case c == '-':
			s++
		}
	}
	return s % 10
}

// law draws an attitude law; schedule only at the top level.
func (d drawer) law(top bool) Law {
	names := []string{"nadir", "sun", "inertial", "spin", "tumble", "isotropic", "detumble"}
	if top {
		names = append(names, "schedule")
	}
	var l Law
	switch name := names[d.r.IntN(len(names))]; name {
	case "nadir":
		l.Law = name
		l.PointAxis = d.face()
		l.AlignAxis = d.perpTo(l.PointAxis)
		if d.p(0.3) {
			l.RollOffsetDeg, l.PitchOffsetDeg, l.YawOffsetDeg = d.ptr(-30, 30, 2), d.ptr(-30, 30, 2), d.ptr(-30, 30, 2)
		}
		if d.p(0.3) {
			l.AlignTo = "sun" // yaw steering
		}
	case "sun":
		l.Law = name
		l.PointAxis = d.face()
		l.AlignAxis = d.perpTo(l.PointAxis)
		l.AlignTo = d.pick("orbit-normal", "nadir", "inertial")
		if l.AlignTo == "inertial" {
			l.AlignInertial = d.unitVec()
		}
		if d.p(0.3) {
			l.ClockDeg = d.ptr(-180, 180, 2)
		}
		if d.p(0.3) {
			l.RateDegS = d.ptr(-2, 2, 3)
		}
	case "inertial":
		l.Law = name
		d.orientation(&l)
	case "spin":
		l.Law = name
		d.orientation(&l)
		l.SpinAxis = d.face()
		l.RateDegS = d.ptr(-10, 10, 3)
	case "tumble":
		l.Law = name
		l.MaxRateDegS = d.ptr(0.5, 20, 2)
	case "isotropic":
		l.Law = name
	case "detumble":
		l.Law = name
		l.MaxRateDegS = d.ptr(0.5, 20, 2)
		l.TimeConstant = fmt.Sprintf("%dm", 5+d.r.IntN(120))
	case "schedule":
		sun := d.law(false)
		ecl := d.law(false)
		l.InSunlight, l.InEclipse = &sun, &ecl
	}
	return l
}

func (d drawer) orientation(l *Law) {
	if d.p(0.3) {
		l.EulerDeg = []float64{d.round(d.u(-180, 180), 3), d.round(d.u(-90, 90), 3), d.round(d.u(-180, 180), 3)}
		l.EulerSequence = d.pick("321", "313", "123", "231", "121", "323")
		return
	}
	l.Quaternion = d.quaternion()
}

// body draws a layout: a six-face cube of one kind, or 1–8 random sensors,
// and sometimes an obstruction.
func (d drawer) body(f *File) {
	b := &f.Body
	if d.p(0.3) {
		kind := d.pick("cosine", "cosine", "quadrant", "digital")
		errs := d.p(0.5)
		half := d.ptr(55, 90, 1)
		for i, face := range Faces {
			s := d.sensor(fmt.Sprintf("s%d", i), kind, errs)
			s.Face, s.Boresight = face, nil
			s.TiltDeg, s.TiltToward, s.ClockDeg = nil, "", nil
			if kind == "cosine" {
				s.HalfAngleDeg = half
			}
			b.Sensors = append(b.Sensors, s)
		}
	} else {
		n := 1 + d.r.IntN(8)
		for i := range n {
			kind := d.pick("cosine", "cosine", "cosine", "quadrant", "digital", "aperture-array")
			b.Sensors = append(b.Sensors, d.sensor(fmt.Sprintf("s%d", i), kind, d.p(0.5)))
		}
	}
	outline := d.p(0.5)
	if outline {
		// Sensors are placed on the outline's faces: no position of their own.
		if d.p(0.5) {
			b.FormFactor = d.pick("1U", "3U", "6U", "12U")
		} else {
			b.SizeM = []float64{d.round(d.u(0.05, 0.5), 3), d.round(d.u(0.05, 0.5), 3), d.round(d.u(0.05, 0.5), 3)}
		}
		for i := range b.Sensors {
			b.Sensors[i].PositionM = nil
		}
	}
	if d.p(0.2) {
		if !outline {
			// Obstructions are traced from each sensor's position.
			for i := range b.Sensors {
				if b.Sensors[i].PositionM == nil {
					b.Sensors[i].PositionM = []float64{d.round(d.u(-0.1, 0.1), 3), d.round(d.u(-0.1, 0.1), 3), d.round(d.u(-0.1, 0.1), 3)}
				}
			}
		}
		// A deployed panel beside the bus, or a boom.
		if d.p(0.6) {
			c := []float64{d.round(d.u(-0.3, 0.3), 3), d.round(d.u(-0.3, 0.3), 3), d.round(d.u(0.3, 0.5), 3)}
			h := []float64{d.round(d.u(0.05, 0.2), 3), d.round(d.u(0.05, 0.2), 3), 0}
			b.Obstructions = append(b.Obstructions, Obstruction{Name: "panel", Shape: "rectangle", CentreM: c, HalfExtentsM: h})
		} else {
			b.Obstructions = append(b.Obstructions, Obstruction{Name: "boom", Shape: "cylinder",
				FromM: []float64{0, 0, 0.3}, ToM: []float64{d.round(d.u(-0.5, 0.5), 3), d.round(d.u(-0.5, 0.5), 3), 0.5}, RadiusM: val(0.01)})
		}
	}
}

func (d drawer) sensor(name, kind string, withErrors bool) Sensor {
	s := Sensor{Name: name, Kind: kind}
	if d.p(0.8) {
		s.Face = d.face()
		if d.p(0.4) {
			s.TiltDeg = d.ptr(0, 60, 1)
			s.TiltToward = d.perpTo(s.Face)
		}
		if d.p(0.3) {
			s.ClockDeg = d.ptr(-180, 180, 1)
		}
	} else {
		s.Boresight = d.unitVec()
	}
	if d.p(0.5) {
		s.PositionM = []float64{d.round(d.u(-0.1, 0.1), 3), d.round(d.u(-0.1, 0.1), 3), d.round(d.u(-0.1, 0.1), 3)}
	}
	var e Errors
	switch kind {
	case "cosine":
		if d.p(0.7) {
			s.HalfAngleDeg = d.ptr(30, 90, 1)
		}
		if d.p(0.5) {
			s.Threshold = d.ptr(0.01, 0.1, 3)
		}
		if d.p(0.2) {
			s.ADCBits = new(int)
			*s.ADCBits = d.pick2(0, 8, 10, 12, 16)
		}
		e = Errors{DarkOffset1Sigma: d.round(d.u(0, 0.01), 4), Gain1Sigma: d.round(d.u(0, 0.03), 4),
			Noise1Sigma: d.round(d.u(0, 0.005), 4), MisalignmentDeg1Sigma: d.round(d.u(0, 1), 3)}
	case "quadrant":
		s.ShadeHeightMM = d.ptr(0.5, 3, 2)
		s.CellSizeMM = d.ptr(1, 5, 2)
		s.GapMM = d.ptr(0, 0.3**s.CellSizeMM, 2)
		e = Errors{DarkOffset1Sigma: d.round(d.u(0, 0.005), 4), Gain1Sigma: d.round(d.u(0, 0.02), 4),
			Noise1Sigma: d.round(d.u(0, 0.003), 4), MisalignmentDeg1Sigma: d.round(d.u(0, 0.5), 3),
			ApertureOffsetMM1Sigma: d.round(d.u(0, 0.05), 4)}
	case "digital":
		if d.p(0.3) {
			s.FOVShape = "square"
			s.HalfAngleDeg = d.ptr(20, 60, 1)
		} else {
			s.FOVShape = "cone"
			s.HalfAngleDeg = d.ptr(20, 70, 1)
		}
		s.AccuracyDeg1Sigma = d.ptr(0.05, 1, 3)
		e = Errors{MisalignmentDeg1Sigma: d.round(d.u(0, 0.3), 3)}
	case "aperture-array":
		det := d.round(d.u(3, 8), 2)
		s.Keys = map[string]any{"mask_height_mm": d.round(d.u(0.5, 3), 2), "detector_size_mm": det}
		if n := d.pick2(1, 1, 4, 9); n > 1 {
			s.Keys["apertures"] = n
			s.Keys["array_size_mm"] = d.round(d.u(0.2, 0.6)*det, 2)
		}
		if withErrors && d.p(0.5) {
			s.Keys["twist_deg_1sigma"] = d.round(d.u(0, 2), 2)
			s.Keys["mask_height_mm_1sigma"] = d.round(d.u(0, 0.03), 3)
		}
		e = Errors{MisalignmentDeg1Sigma: d.round(d.u(0, 0.3), 3), ApertureOffsetMM1Sigma: d.round(d.u(0, 0.03), 4)}
	}
	if withErrors {
		s.Errors = &e
	}
	return s
}

func (d drawer) pick2(list ...int) int { return list[d.r.IntN(len(list))] }

func (d drawer) albedo(f *File, opt Options) {
	models := []string{"none", "uniform", "zonal"}
	if opt.GridFile != "" {
		models = append(models, "grid")
	}
	a := Albedo{Model: models[d.r.IntN(len(models))], Cells: 100 + d.r.IntN(500)}
	switch a.Model {
	case "uniform":
		a.Value = d.ptr(0.05, 0.6, 3)
	case "grid":
		a.GridFile = opt.GridFile
	}
	f.Albedo = a
}
