package scenario

import (
	"errors"
	"strings"
	"testing"
)

// Key and type problems and value problems come in one round: a file with an
// unknown key, a wrong type and two out-of-range values lists all four, in
// file order, and a refused key is not reported twice.
func TestErrorsInOneRound(t *testing.T) {
	text := `name: one round
epoch: "2026-03-20T00:00:00Z"
duration: 1d
step: 10s
orbit: {altitude_km: high, inclination_deg: 97.5, propagator: j2-mean}
attitude: {law: nadir}
body:
  sensors:
    - {name: a, kind: cosine, face: "+X", half_angl_deg: 60}
    - {name: b, kind: cosine, face: "-X", threshold: 7, tilt_deg: 400}
`
	_, err := Parse([]byte(text), t.TempDir())
	var es Errors
	if !errors.As(err, &es) {
		t.Fatalf("error %v, want Errors", err)
	}
	var paths []string
	for _, e := range es {
		paths = append(paths, e.Path)
	}
	want := "orbit.altitude_km body.sensors[0].half_angl_deg body.sensors[1].threshold body.sensors[1].tilt_deg"
	if got := strings.Join(paths, " "); got != want {
		t.Errorf("problems %s\nwant     %s", got, want)
	}
}
