package ephem

import (
	"fmt"
	"slices"
	"strings"
)

// sunModels maps each model name to its constructor. "meeus" is added by
// meeus.go.
var sunModels = map[string]func() Sun{
	"low-precision": func() Sun { return LowPrecision{} },
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

// SunByName returns the sun model of that name: "low-precision"
// (LowPrecision) or "meeus" (Meeus, when built in).
func SunByName(name string) (Sun, error) {
	if f, ok := sunModels[name]; ok {
		return f(), nil
	}
	return nil, fmt.Errorf("ephem: unknown sun model %q (allowed: %s)", name, strings.Join(SunModelNames(), ", "))
}
