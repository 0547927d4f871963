package illum

import (
	"fmt"
	"strings"
)

// ShadowInfo is the registry entry of one shadow model: its name in the
// scenario file, what it models and its published source (the report's
// models table and check print both), and the geometry it selects.
type ShadowInfo struct {
	Name   string
	Model  string
	Source string
	Shadow ShadowModel
}

var shadows = []ShadowInfo{
	{Name: "conical", Model: "conical Earth shadow with umbra and penumbra", Shadow: Conical,
		Source: "O. Montenbruck and E. Gill, Satellite Orbits, 2000, §3.4"},
	{Name: "cylindrical", Model: "cylindrical Earth shadow (no penumbra)", Shadow: Cylindrical,
		Source: "O. Montenbruck and E. Gill, Satellite Orbits, 2000, §3.4"},
}

// ShadowNames lists the registered shadow model names.
func ShadowNames() []string {
	out := make([]string, len(shadows))
	for i, s := range shadows {
		out[i] = s.Name
	}
	return out
}

// LookupShadow returns the registry entry of a shadow model.
func LookupShadow(name string) (ShadowInfo, error) {
	for _, s := range shadows {
		if s.Name == name {
			return s, nil
		}
	}
	return ShadowInfo{}, fmt.Errorf("illum: shadow %q is not one of %s", name, strings.Join(ShadowNames(), ", "))
}
