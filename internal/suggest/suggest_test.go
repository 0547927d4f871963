package suggest

import (
	"strings"
	"testing"
)

func TestHint(t *testing.T) {
	keys := []string{"altitude_km", "half_angle_deg", "tilt_deg", "tilt_toward", "face", "kind", "name", "noise_1sigma", "gain_1sigma"}
	for _, c := range []struct{ in, want string }{
		{"half_angle", "half_angle_deg"}, // unit suffix missing
		{"altitude", "altitude_km"},      // unit suffix missing
		{"tilt_degrees", "tilt_deg"},     // unit spelt out
		{"nosie_1sigma", "noise_1sigma"}, // two letters swapped
		{"Face", "face"},                 // case
		{"fase", "face"},                 // one letter
		{"colour", ""},                   // nothing close
		{"tilt", ""},                     // tilt_deg and tilt_toward alike: no guess
		{"gain_sigma", "gain_1sigma"},    // one letter missing
		{"knd", "kind"},                  // one letter missing in a short name
		{"xy", ""},                       // short and far
	} {
		got := Hint(c.in, keys)
		if c.want == "" {
			if got != "" {
				t.Errorf("Hint(%q) = %q, want none", c.in, got)
			}
			continue
		}
		if want := `(did you mean "` + c.want + `"?)`; !strings.Contains(got, want) {
			t.Errorf("Hint(%q) = %q, want %q", c.in, got, want)
		}
	}
}
