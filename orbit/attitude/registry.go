package attitude

import (
	"fmt"
	"strings"
)

// Attitude law names in the scenario file.
const (
	NameNadir     = "nadir"
	NameSun       = "sun"
	NameInertial  = "inertial"
	NameSpin      = "spin"
	NameTumble    = "tumble"
	NameIsotropic = "isotropic"
	NameReplay    = "replay"
	NameDetumble  = "detumble"
	// NameSchedule is one law in sunlight and another in eclipse; it is
	// written with in_sunlight and in_eclipse rather than with law.
	NameSchedule = "schedule"
)

// LawInfo is the registry entry of one attitude law: its name in the
// scenario file, what it models and its source (the report's models table
// and check print both), the file keys it takes with their defaults and
// choices, and whether each Monte Carlo unit draws its own attitude.
type LawInfo struct {
	Name   string
	Model  string
	Source string
	Keys   []string
	// Defaults are the file values of keys left out: a float64 for a
	// number (in the file unit, e.g. deg/s), a string for an axis or a
	// word. A key without one is required or has no default.
	Defaults map[string]any
	// Choices lists the words a choice key allows, its default first.
	Choices map[string][]string
	Random  bool
}

// Number is the default of a number key (0 when it has none).
func (l LawInfo) Number(key string) float64 {
	v, _ := l.Defaults[key].(float64)
	return v
}

// Word is the default of an axis or word key: a choice key's first choice,
// else its entry in Defaults ("" when it has none).
func (l LawInfo) Word(key string) string {
	if c := l.Choices[key]; len(c) > 0 {
		return c[0]
	}
	v, _ := l.Defaults[key].(string)
	return v
}

// tipOffMaxRateDegS is the default upper bound of a tumble's initial rate:
// a typical post-deployment tip-off bound (common practice, no source).
const tipOffMaxRateDegS = 10.0

var laws = []LawInfo{
	{Name: NameNadir, Model: "LVLH pointing with an optional fixed 3-2-1 offset; align_to: sun steers yaw to keep the sun in the plane of the two axes",
		Source:   "TRIAD (H. D. Black, AIAA J. 2(7), 1964; from memory)",
		Keys:     []string{"point_axis", "align_axis", "roll_offset_deg", "pitch_offset_deg", "yaw_offset_deg", "align_to"},
		Defaults: map[string]any{"point_axis": "+Z", "align_axis": "+X", "roll_offset_deg": 0.0, "pitch_offset_deg": 0.0, "yaw_offset_deg": 0.0},
		Choices:  map[string][]string{"align_to": {"velocity", "sun"}}},
	{Name: NameSun, Model: "a body axis to the sun, a second toward the orbit normal, nadir or an inertial direction, optional spin about the sun line",
		Source:   "TRIAD (H. D. Black, AIAA J. 2(7), 1964; from memory)",
		Keys:     []string{"point_axis", "align_axis", "clock_deg", "align_to", "align_inertial", "rate_deg_s"},
		Defaults: map[string]any{"point_axis": "+Z", "align_axis": "+X", "clock_deg": 0.0, "rate_deg_s": 0.0},
		Choices:  map[string][]string{"align_to": {"orbit-normal", "nadir", "inertial"}}},
	{Name: NameInertial, Model: "a fixed attitude, as a quaternion or Euler angles",
		Source:   "H. Schaub and J. L. Junkins, Analytical Mechanics of Space Systems, 4th ed., 2018, §3.2 (from memory)",
		Keys:     []string{"quaternion", "euler_deg", "euler_sequence"},
		Defaults: map[string]any{"euler_sequence": "321"}},
	{Name: NameSpin, Model: "a body axis held on an inertial axis, turning at a constant rate",
		Source:   "closed form (rotation about a fixed axis)",
		Keys:     []string{"quaternion", "euler_deg", "euler_sequence", "spin_axis", "rate_deg_s"},
		Defaults: map[string]any{"euler_sequence": "321", "spin_axis": "+Z", "rate_deg_s": 1.0}},
	{Name: NameTumble, Model: "a seeded random start attitude, an initial rate of magnitude uniform in [min, max] about an isotropic axis; torque-free motion of a given inertia tensor (Euler's equations, RK4), else a fixed-axis spin",
		Source:   "K. Shoemake, Uniform random rotations, Graphics Gems III, 1992; Euler's equations: J. R. Wertz (ed.), Spacecraft Attitude Determination and Control, 1978, §16.1; F. L. Markley and J. L. Crassidis, Fundamentals of Spacecraft Attitude Determination and Control, 2014, §3.3 (all from memory)",
		Keys:     []string{"min_rate_deg_s", "max_rate_deg_s", "inertia_kg_m2"},
		Defaults: map[string]any{"min_rate_deg_s": 0.0, "max_rate_deg_s": tipOffMaxRateDegS}, Random: true},
	{Name: NameDetumble, Model: "a seeded random start attitude and rate (as tumble), the rate decaying exponentially with a stated time constant about a fixed body axis (the linear regime of a B-dot controller); in a timeline after a tumble it starts from the tumble's attitude and rate",
		Source:   "closed form; exponential decay of B-dot detumbling: W. J. Stickler and K. T. Alfriend, J. Spacecraft 13(5), 1976; M. Avanzini and F. Giulietti, J. Guid. Control Dyn. 35(4), 2012 (both from memory)",
		Keys:     []string{"min_rate_deg_s", "max_rate_deg_s", "time_constant"},
		Defaults: map[string]any{"min_rate_deg_s": 0.0, "max_rate_deg_s": tipOffMaxRateDegS}, Random: true},
	{Name: NameIsotropic, Model: "an independent uniform random attitude at each step",
		Source: "K. Shoemake, Uniform random rotations, Graphics Gems III, 1992 (from memory)",
		Random: true},
	{Name: NameReplay, Model: "a sampled attitude history (CCSDS AEM quaternions or a time,quaternion table) played back, slerp between samples",
		Source: "CCSDS 504.0-B-1 Attitude Data Messages; K. Shoemake, Animating rotation with quaternion curves, SIGGRAPH 1985 (from memory)",
		Keys:   []string{"file"}},
}

// Laws lists the registered attitude laws (not the schedule, which combines
// two of them).
func Laws() []LawInfo { return append([]LawInfo(nil), laws...) }

// LawNames lists the registered law names.
func LawNames() []string {
	out := make([]string, len(laws))
	for i, l := range laws {
		out[i] = l.Name
	}
	return out
}

// LookupLaw returns the registry entry of an attitude law.
func LookupLaw(name string) (LawInfo, error) {
	for _, l := range laws {
		if l.Name == name {
			return l, nil
		}
	}
	return LawInfo{}, fmt.Errorf("attitude: law %q is not one of %s", name, strings.Join(LawNames(), ", "))
}

// LawKeys lists every key some law takes, in registry order without repeats.
func LawKeys() []string {
	var out []string
	seen := map[string]bool{}
	for _, l := range laws {
		for _, k := range l.Keys {
			if !seen[k] {
				seen[k] = true
				out = append(out, k)
			}
		}
	}
	return out
}
