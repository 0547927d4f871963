package ephem

import (
	"fmt"
	"slices"
	"strings"
)

// SunModelInfo is the registry entry of one sun model: its name in the
// scenario file, what it models and its published source (the report's
// models table and check print both), and its builder.
type SunModelInfo struct {
	Name   string
	Model  string
	Source string
	New    func() Sun
}

// sunModels is the registry; "meeus" is added by meeus.go.
var sunModels = map[string]SunModelInfo{
	"low-precision": {Name: "low-precision",
		Model:  "low-precision formulas for the Sun of The Astronomical Almanac (stated 0.01°, 1950–2050), precessed to EME2000 with IAU 1976 precession",
		Source: "The Astronomical Almanac, section C, Low-precision formulas for the Sun (from memory); J. H. Lieske et al., A&A 58, 1, 1977; checked against IAU SOFA/ERFA to 0.0101°",
		New:    func() Sun { return LowPrecision{} }},
}

// SunModelNames returns the names SunByName accepts, sorted.
func SunModelNames() []string {
	names := make([]string, 0, len(sunModels))
	for n := range sunModels {
		names = append(names, n)
	}
	slices.Sort(names)
	return names
}

// LookupSunModel returns the registry entry of a sun model.
func LookupSunModel(name string) (SunModelInfo, error) {
	if m, ok := sunModels[name]; ok {
		return m, nil
	}
	return SunModelInfo{}, fmt.Errorf("ephem: unknown sun model %q (allowed: %s)", name, strings.Join(SunModelNames(), ", "))
}

// SunByName returns the sun model of that name: "low-precision"
// (LowPrecision) or "meeus" (Meeus).
func SunByName(name string) (Sun, error) {
	m, err := LookupSunModel(name)
	if err != nil {
		return nil, err
	}
	return m.New(), nil
}

// sunValidity is the span of years over which each model's stated accuracy
// holds: the Astronomical Almanac states 0.01° for its low-precision
// formulas over 1950–2050 (section C, from memory); soniakeys/meeus states
// 0.01° for solar.True2000 over 1900–2100 (v3/solar/solar.go, Meeus 1998
// ch. 25).
var sunValidity = map[string][2]int{
	"low-precision": {1950, 2050},
	"meeus":         {1900, 2100},
}

// SunModelValidity returns the first and last year (inclusive) of the span
// over which the named sun model's stated accuracy holds; ok is false for
// an unknown name.
func SunModelValidity(name string) (first, last int, ok bool) {
	v, ok := sunValidity[name]
	return v[0], v[1], ok
}
