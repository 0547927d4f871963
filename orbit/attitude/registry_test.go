package attitude

import (
	"slices"
	"testing"
)

// A law's defaults and choices are for keys it takes: a number default is a
// float64, an axis or word a string, and a choice key lists its default
// first and at least one other word.
func TestLawDefaultsAreItsKeys(t *testing.T) {
	for _, l := range Laws() {
		for k, v := range l.Defaults {
			if !slices.Contains(l.Keys, k) {
				t.Errorf("law %s: default for %q, a key it does not take", l.Name, k)
			}
			switch v.(type) {
			case float64, string:
			default:
				t.Errorf("law %s: default %q is a %T; want float64 or string", l.Name, k, v)
			}
		}
		for k, c := range l.Choices {
			if !slices.Contains(l.Keys, k) || len(c) < 2 {
				t.Errorf("law %s: choices %v for %q", l.Name, c, k)
			}
			if _, both := l.Defaults[k]; both {
				t.Errorf("law %s: %q has both a default and choices", l.Name, k)
			}
		}
	}
	tumble, err := LookupLaw(NameTumble)
	if err != nil {
		t.Fatal(err)
	}
	if tumble.Number("max_rate_deg_s") != tipOffMaxRateDegS || tumble.Word("max_rate_deg_s") != "" || tumble.Number("file") != 0 {
		t.Errorf("tumble defaults: %v", tumble.Defaults)
	}
}
