package study

import (
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
)

// A zonal albedo model reads its cones from shared tables on a long run of
// a circular orbit whose radius stays put, and integrates every step on a
// short run, a j2-numeric orbit or with a uniform model (which the engine's
// own tables serve).
func TestZonalAlbedoTables(t *testing.T) {
	const base = `
epoch: "2027-01-01T00:00:00Z"
step: 10s
orbit: {altitude_km: 550, ltan: "10:30", propagator: %PROP%}
attitude: {law: inertial, quaternion: [1, 0, 0, 0]}
body:
  sensors:
    - {name: a, kind: cosine, face: "+X", half_angle_deg: 60}
    - {name: b, kind: cosine, face: "-X", half_angle_deg: 60}
`
	for _, c := range []struct {
		name, prop, duration, albedo string
		want                         bool
	}{
		{"long j2-mean zonal", "j2-mean", "30d", "zonal", true},
		{"long two-body zonal", "two-body", "6d", "zonal", true},
		{"short zonal", "j2-mean", "5d", "zonal", false},
		{"j2-numeric zonal", "j2-numeric", "30d", "zonal", false},
		{"uniform", "j2-mean", "30d", "uniform", false},
	} {
		text := strings.ReplaceAll(base, "%PROP%", c.prop) + "duration: " + c.duration + "\nalbedo: {model: " + c.albedo + "}\n"
		s, err := scenario.Parse([]byte(text), ".")
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		f, err := AlbedoFactory(s)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		m, err := f()
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if m.UsesTables() != c.want {
			t.Errorf("%s: tables %v, want %v", c.name, m.UsesTables(), c.want)
		}
	}
}
