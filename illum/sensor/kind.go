package sensor

import (
	"fmt"
	"maps"
	"slices"
)

// KindInfo is the registry entry of one sensor kind: everything the scenario
// file, the study builder and the error budget need to know about it. A new
// kind is a model in this package plus one Register call beside it; nothing
// outside this package names a kind.
type KindInfo struct {
	// Kind is the value of the file's kind key.
	Kind Kind
	// Doc says in one line what the kind is (check and the report print it).
	Doc string
	// Source is the published source of the model (or "common practice, no
	// source").
	Source string
	// HalfAngleDeg is the default field-of-view half angle (half_angle_deg).
	HalfAngleDeg float64
	// GeometricFOV says the field of view follows from the kind's own
	// geometry keys: half_angle_deg is refused (HalfAngleDeg unused).
	GeometricFOV bool
	// TwoAxis says a single sensor of the kind measures a direction
	// (Reading.Dir); the others give one signal and need an array.
	TwoAxis bool
	// Params are the kind's own file keys, in the order the run record
	// prints them.
	Params []Param
	// Sources are the error sources the kind offers the error budget.
	Sources []ErrorSource
	// Build makes a sensor from the common sensor keys and the kind's
	// resolved parameters (model units).
	Build func(c Common, p Params) (Sensor, error)
}

// ParamType is the value type of a kind parameter in the file.
type ParamType int

// The parameter types.
const (
	// Number is one number, given in the file unit and stored times Scale.
	Number ParamType = iota
	// Choice is one of the listed words.
	Choice
	// Table is a list of rows of two numbers.
	Table
)

// Param is one file key of a sensor kind.
type Param struct {
	Key  string
	Doc  string
	Type ParamType

	// Number: the default (file unit), the allowed range [Min, Max]
	// (MinOpen excludes Min; MaxKey, when set, names a number key of the
	// same kind whose value replaces Max), the allowed range as the error
	// message says it, and the factor from the file unit to the model unit
	// (0 means 1).
	Default  float64
	Min, Max float64
	MinOpen  bool
	MaxKey   string
	Allowed  string
	Scale    float64
	// ActsWith, when set, names a number key of the same kind without
	// which this one changes nothing (while that key is 0): the scenario
	// refuses this key given with that one at 0.
	ActsWith string

	// Choice: the allowed words, the first being the default.
	Choices []string

	// Table: the two columns. A table has no default (absent stays absent).
	Columns [2]Column
}

// Column is one column of a Table parameter.
type Column struct {
	Name       string  // as the error message names it, e.g. "angle_deg"
	Min, Max   float64 // allowed range, file unit
	Increasing bool    // values must strictly increase down the table
	Scale      float64 // file unit to model unit (0 means 1)
}

// ScaleOr1 returns a scale factor, 1 when unset.
func ScaleOr1(s float64) float64 {
	if s == 0 {
		return 1
	}
	return s
}

// Error sources a kind may offer the budget, by the name the budget table
// prints.
const (
	SourceDarkOffset     = "dark offset"
	SourceGain           = "gain mismatch"
	SourceNoise          = "noise"
	SourceQuantisation   = "quantisation"
	SourceMisalignment   = "misalignment"
	SourceApertureOffset = "aperture offset"
	SourceDigitalNoise   = "digital accuracy"
	SourceTwist          = "twist"
	SourceShadeSize      = "shade size"
	SourceTemperature    = "temperature"
	SourceCentroid       = "centroid noise"
	SourceMaskHeight     = "mask height"
)

// ErrorSource is one error source a kind offers the budget. Its 1σ is a
// field of the sensor's errors block, or, when Param is set, that number
// parameter of the kind (model unit).
type ErrorSource struct {
	Name  string
	Param string
}

// Common holds the keys every sensor kind has.
type Common struct {
	Name      string
	Mount     Mount
	HalfAngle float64 // rad
	Threshold float64 // fraction of the full-sun normal response
	Errors    Errors
	// OffsetSigma is the 1σ shade or aperture offset drawn per unit (mm).
	OffsetSigma float64
}

// Params holds a sensor's kind parameters, resolved and in model units.
type Params struct {
	Num   map[string]float64
	Text  map[string]string
	Table map[string][][2]float64
}

// WithNumber returns a copy of p with the number key set to v; p is
// unchanged.
func (p Params) WithNumber(key string, v float64) Params {
	q := p
	q.Num = maps.Clone(p.Num)
	if q.Num == nil {
		q.Num = map[string]float64{}
	}
	q.Num[key] = v
	return q
}

var registry = map[Kind]KindInfo{}

// Register adds a sensor kind. It panics on a programming error (a kind
// registered twice, a key of two types, a source without a name), so that
// the package's tests catch it.
func Register(k KindInfo) {
	if k.Kind == "" || k.Build == nil || (!k.GeometricFOV && !(k.HalfAngleDeg > 0 && k.HalfAngleDeg <= 90)) {
		panic(fmt.Sprintf("sensor: kind %q: needs a name, a builder and a default half angle in (0, 90]", k.Kind))
	}
	if _, dup := registry[k.Kind]; dup {
		panic(fmt.Sprintf("sensor: kind %q registered twice", k.Kind))
	}
	for _, p := range k.Params {
		if t, ok := paramTypes()[p.Key]; ok && t != p.Type {
			panic(fmt.Sprintf("sensor: kind %q: key %q has another type in another kind", k.Kind, p.Key))
		}
	}
	for _, s := range k.Sources {
		if s.Name == "" {
			panic(fmt.Sprintf("sensor: kind %q: an error source without a name", k.Kind))
		}
	}
	registry[k.Kind] = k
}

// LookupKind returns the registry entry of a kind.
func LookupKind(name string) (KindInfo, bool) {
	k, ok := registry[Kind(name)]
	return k, ok
}

// KindNames lists the registered kinds in alphabetical order.
func KindNames() []string {
	out := make([]string, 0, len(registry))
	for k := range registry {
		out = append(out, string(k))
	}
	slices.Sort(out)
	return out
}

// ParamKeys lists every kind parameter key with its type.
func ParamKeys() map[string]ParamType { return paramTypes() }

func paramTypes() map[string]ParamType {
	out := map[string]ParamType{}
	for _, k := range registry {
		for _, p := range k.Params {
			out[p.Key] = p.Type
		}
	}
	return out
}

// KindsWithKey lists, alphabetically, the kinds that have a parameter key.
func KindsWithKey(key string) []string {
	var out []string
	for _, name := range KindNames() {
		if _, ok := registry[Kind(name)].Param(key); ok {
			out = append(out, name)
		}
	}
	return out
}

// Param returns the kind's parameter of a key.
func (k KindInfo) Param(key string) (Param, bool) {
	for _, p := range k.Params {
		if p.Key == key {
			return p, true
		}
	}
	return Param{}, false
}

// IsTwoAxis reports whether a sensor's kind measures a direction on its
// own; an unregistered kind counts as a single-signal sensor.
func IsTwoAxis(s Sensor) bool { return registry[s.Kind()].TwoAxis }

// ResponseTabler is a sensor whose response to diffuse light is a measured
// table rather than the albedo model's cosine: the incidence angles (rad,
// increasing) and the relative response at each (1 at normal incidence).
// The study builder gives the albedo model that table.
type ResponseTabler interface {
	ResponseTable() (incidence, response []float64)
}
