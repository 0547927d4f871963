package scenario

import (
	"strings"
	"testing"
)

// The loader's unknown-key message carries the suggestion.
func TestUnknownKeySuggests(t *testing.T) {
	src := "name: x\nepoch: \"2026-01-01T00:00:00Z\"\nduration: 1h\nstep: 10s\norbit: {altitud_km: 550, ltan: \"10:30\"}\nattitude: {law: nadir}\nbody:\n  sensors:\n    - {name: a, kind: cosine, face: \"+X\", half_angle: 60}\n"
	_, err := Parse([]byte(src), ".")
	if err == nil {
		t.Fatal("want an error")
	}
	for _, want := range []string{`"altitud_km" is unknown (did you mean "altitude_km"?)`, `"half_angle" is unknown (did you mean "half_angle_deg"?)`} {
		if !strings.Contains(err.Error(), want) {
			t.Errorf("error %q\nlacks %q", err, want)
		}
	}
}

// Unknown values of a name list (law, sensor kind, face) carry it too.
func TestUnknownValueSuggests(t *testing.T) {
	src := "name: x\nepoch: \"2026-01-01T00:00:00Z\"\nduration: 1h\nstep: 10s\norbit: {altitude_km: 550, ltan: \"10:30\"}\nattitude: {law: nadri}\nbody:\n  sensors:\n    - {name: a, kind: cosin, face: \"+x\"}\n"
	_, err := Parse([]byte(src), ".")
	if err == nil {
		t.Fatal("want an error")
	}
	for _, want := range []string{`"nadri" is unknown (did you mean "nadir"?)`, `"cosin" is unknown (did you mean "cosine"?)`} {
		if !strings.Contains(err.Error(), want) {
			t.Errorf("error %q\nlacks %q", err, want)
		}
	}
}
