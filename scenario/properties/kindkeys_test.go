package properties

import (
	"maps"
	"testing"

	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/internal/randscenario"
)

// kindKeyCase is how one key of the sensor-kind registry is shown to act:
// the value set (nil: one derived from the registry entry) and the keys
// set with it on the same sensor so that it can act at all (a temperature
// key needs a temperature coefficient, a dead-zone key a geometry with a
// dead zone).
type kindKeyCase struct {
	value any
	with  map[string]any
}

// kindKeyCases are the keys that need a value or companions to act; every
// other key of the registry is set to a value derived from its entry.
var kindKeyCases = map[string]kindKeyCase{
	"roll_off": {value: [][2]float64{{0, 1}, {60, 0.8}, {85, 0.2}, {90, 0}}},
	// Temperatures act through a gain coefficient or a dark signal (a file
	// with orbit temperatures and neither is refused, as is the reverse);
	// the eclipse temperature through the dark signal alone (no sun to
	// gain on).
	"temperature_sunlit_c":       {value: 70.0, with: map[string]any{"gain_tempco_pct_per_c": 0.5, "temperature_eclipse_c": 0.0}},
	"temperature_eclipse_c":      {value: 70.0, with: map[string]any{"dark_signal_at_calibration": 0.01, "temperature_sunlit_c": 30.0}},
	"calibration_temperature_c":  {value: -20.0, with: map[string]any{"gain_tempco_pct_per_c": 0.5, "temperature_sunlit_c": 70.0}},
	"dark_signal_at_calibration": {value: 0.01, with: map[string]any{"gain_tempco_pct_per_c": 0.5, "temperature_sunlit_c": 70.0}},
	"dark_doubling_c":            {value: 5.0, with: map[string]any{"dark_signal_at_calibration": 0.01, "temperature_sunlit_c": 70.0}},
	"gain_tempco_pct_per_c":      {value: 0.5, with: map[string]any{"dark_signal_at_calibration": 0.01, "temperature_sunlit_c": 70.0}},
	// The blinding rules: the key base's Moon is thin (near new at its
	// epoch) and its digital cone 50° wide, so the rules are shown where
	// they can fire: any Moon in view, the lit Earth 10° inside the cone.
	"moon_blind_lit_fraction":   {value: 0.0},
	"lit_earth_blind_depth_deg": {value: 10.0},
	// The key base's albedo never reaches the default 0.3 of full sun on
	// a detector: a low level lets it count.
	"albedo_ignore_below": {value: 0.01},
	// Drawn per unit: the key base's two units draw them.
	"shade_size_mm_1sigma": {value: 0.1},
	"twist_deg_1sigma":     {value: 2.0},
	// The aperture array: a count and the array's side act together (one
	// aperture spans no array, several need a side); the mask-height
	// tolerance stays below a third of the height.
	"apertures":             {value: 9.0, with: map[string]any{"apertures": 4.0, "array_size_mm": 1.0}},
	"array_size_mm":         {value: 2.0, with: map[string]any{"apertures": 4.0, "array_size_mm": 1.0}},
	"mask_height_mm_1sigma": {value: 0.05},
}

// kindKeyDeadZone are the keys that act only inside a dead zone: an
// aperture quadrant has one only when its aperture is wider than the
// detector (2c + g), so they are shown on a 5 mm aperture over 2 mm cells.
var kindKeyDeadZone = map[string]bool{"dead_zone_imbalance": true, "dead_zone": true}

// changedValue is a value of the key other than its default, inside its
// allowed range: for a number halfway from the default toward the far end
// of the range (the maximum; the minimum when the default is the maximum;
// 2·default + 1 when the range is open above), for a choice another choice.
func changedValue(p sensor.Param) (any, bool) {
	switch p.Type {
	case sensor.Choice:
		for _, c := range p.Choices {
			if c != p.Choices[0] {
				return c, true
			}
		}
		return nil, false
	case sensor.Number:
		switch {
		case p.Max > p.Default:
			return p.Default + (p.Max-p.Default)/2, true
		case p.Max == p.Default && p.Min < p.Default: // the default is the top: go down
			return p.Default - (p.Default-p.Min)/2, true
		}
		return 2*p.Default + 1, true // no upper bound
	}
	return nil, false
}

// Every key of every sensor kind in the registry, set away from its
// default on a sensor of that kind, either is refused or moves a figure of
// the run (the property "any key accepted changes some output"). The
// registry drives the list, so a key added to a kind without an effect
// fails here.
func TestEveryKindKeyHasAnEffect(t *testing.T) {
	// One sensor of each kind: the key base's cosine c1, quadrant q and
	// digital d, and a wall quadrant w and an aperture array aa added here.
	names := map[string]string{string(sensor.KindCosine): "c1", string(sensor.KindQuadrant): "q", string(sensor.KindDigital): "d",
		string(sensor.KindQuadrantWall): "w", string(sensor.KindApertureArray): "aa"}
	base := func() *randscenario.File {
		f := keyBase()
		f.Body.Sensors = append(f.Body.Sensors, randscenario.Sensor{Name: "w", Kind: "quadrant-wall", Face: "-Z",
			Errors: &randscenario.Errors{DarkOffset1Sigma: 0.002, Gain1Sigma: 0.01, Noise1Sigma: 0.001}},
			randscenario.Sensor{Name: "aa", Kind: "aperture-array", Face: "-Y",
				Errors: &randscenario.Errors{MisalignmentDeg1Sigma: 0.1, ApertureOffsetMM1Sigma: 0.01}})
		return f
	}
	set := func(f *randscenario.File, name string, keys map[string]any) {
		for i := range f.Body.Sensors {
			if s := &f.Body.Sensors[i]; s.Name == name {
				if s.Keys == nil {
					s.Keys = map[string]any{}
				}
				maps.Copy(s.Keys, keys)
			}
		}
	}
	checked := 0
	for _, kind := range sensor.KindNames() {
		name, ok := names[kind]
		if !ok {
			t.Errorf("kind %s: no sensor of it in the key base; add one", kind)
			continue
		}
		info, _ := sensor.LookupKind(kind)
		for _, p := range info.Params {
			t.Run(kind+" "+p.Key, func(t *testing.T) {
				c := kindKeyCases[p.Key]
				v := c.value
				if v == nil {
					var ok bool
					if v, ok = changedValue(p); !ok {
						t.Fatalf("no changed value for %s (type %v): give one in kindKeyCases", p.Key, p.Type)
					}
				}
				// The reference: the companions alone; then the key too.
				ref := base()
				with := map[string]any{}
				for k, x := range c.with {
					with[k] = x
				}
				if kind == string(sensor.KindQuadrant) && kindKeyDeadZone[p.Key] {
					with["aperture_mm"] = 5.0
				}
				set(ref, name, with)
				want, ok := fingerprintOf(t, ref)
				if !ok {
					t.Fatalf("the reference with %v is refused", with)
				}
				f := ref.Clone()
				set(f, name, map[string]any{p.Key: v})
				got, ok := fingerprintOf(t, f)
				if !ok {
					return
				}
				checked++
				if got == want {
					showOnFailure(t, f.YAML())
					t.Errorf("%s: %s: %v accepted and changed no figure of the run (with %v)", kind, p.Key, v, with)
				}
			})
		}
	}
	if checked < 30 {
		t.Errorf("only %d kind keys checked", checked)
	}
}

// fingerprintOf runs a file and returns its fingerprint; false when the
// file is refused (said in the log).
func fingerprintOf(t *testing.T, f *randscenario.File) (string, bool) {
	t.Helper()
	b, err := build(f)
	if err != nil {
		t.Logf("refused: %v", err)
		return "", false
	}
	r, err := run(b.cfg)
	if err != nil {
		t.Fatalf("check accepted, run failed: %v", err)
	}
	return fingerprint(r), true
}
