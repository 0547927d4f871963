package properties

import (
	"maps"
	"testing"

	"codeberg.org/sunsight/sunsight/internal/randscenario"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// lawKeyCase shows one key of one attitude law acting: the law's
// reference block (ref, with the law's name added), the key's changed
// value, and keys the change removes from the reference (a quaternion in
// place of Euler angles).
type lawKeyCase struct {
	ref   map[string]any
	value any
	drop  []string
}

var (
	eulerRef      = map[string]any{"euler_deg": []float64{10, 20, 30}}
	spinRef       = map[string]any{"euler_deg": []float64{10, 20, 30}, "rate_deg_s": 2.0}
	lawQuaternion = []float64{0.8, 0.2, 0.4, 0.4}
)

// lawKeyCases holds a case for every key of every law in the registry;
// a law or key missing here fails the test, so a new key needs a case.
var lawKeyCases = map[string]map[string]lawKeyCase{
	attitude.NameNadir: {
		"point_axis":       {value: "-Z"},
		"align_axis":       {value: "+Y"},
		"roll_offset_deg":  {value: 15.0},
		"pitch_offset_deg": {value: 15.0},
		"yaw_offset_deg":   {value: 15.0},
		"align_to":         {value: "sun"},
	},
	attitude.NameSun: {
		"point_axis": {value: "-Z"},
		"align_axis": {value: "+Y"},
		"clock_deg":  {value: 40.0},
		"align_to":   {value: "nadir"},
		// The inertial direction of align_to: inertial, moved.
		"align_inertial": {ref: map[string]any{"align_to": "inertial", "align_inertial": []float64{0, 0, 1}}, value: []float64{1, 0, 0}},
		"rate_deg_s":     {value: 1.0},
	},
	attitude.NameInertial: {
		"quaternion":     {ref: eulerRef, value: lawQuaternion, drop: []string{"euler_deg"}},
		"euler_deg":      {ref: eulerRef, value: []float64{40, -10, 70}},
		"euler_sequence": {ref: eulerRef, value: "313"},
	},
	attitude.NameSpin: {
		"quaternion":     {ref: spinRef, value: lawQuaternion, drop: []string{"euler_deg"}},
		"euler_deg":      {ref: spinRef, value: []float64{40, -10, 70}},
		"euler_sequence": {ref: spinRef, value: "313"},
		"spin_axis":      {ref: spinRef, value: "+X"},
		"rate_deg_s":     {ref: spinRef, value: 5.0},
	},
	attitude.NameTumble: {
		"min_rate_deg_s": {value: 5.0},
		"max_rate_deg_s": {value: 3.0},
		"inertia_kg_m2":  {value: []float64{0.02, 0.03, 0.01}},
	},
	attitude.NameDetumble: {
		"min_rate_deg_s": {ref: map[string]any{"time_constant": "20m"}, value: 5.0},
		"max_rate_deg_s": {ref: map[string]any{"time_constant": "20m"}, value: 3.0},
		"time_constant":  {ref: map[string]any{"time_constant": "20m"}, value: "5m"},
	},
	attitude.NameIsotropic: {},
}

// lawKeysElsewhere are keys shown to act by tests of their own: the replay
// law's file is read and interpolated in orbit/ccsds and scenario/study
// (TestReplay…), which needs an attitude file beside the scenario.
var lawKeysElsewhere = map[string]string{attitude.NameReplay + " file": "needs an AEM file; the ccsds and study replay tests"}

// Every key of every attitude law in the registry, changed on a run of
// that law, either is refused or moves a figure of the run.
func TestEveryLawKeyHasAnEffect(t *testing.T) {
	checked := 0
	for _, info := range attitude.Laws() {
		cases, ok := lawKeyCases[info.Name]
		for _, key := range info.Keys {
			if why, ok := lawKeysElsewhere[info.Name+" "+key]; ok {
				t.Logf("%s %s: %s", info.Name, key, why)
				continue
			}
			c, found := cases[key]
			if !ok || !found {
				t.Errorf("law %s key %s: no case in lawKeyCases; add one", info.Name, key)
				continue
			}
			t.Run(info.Name+" "+key, func(t *testing.T) {
				ref := keyBase()
				ref.Attitude = randscenario.Law{Law: info.Name, Keys: maps.Clone(c.ref)}
				want, ok := fingerprintOf(t, ref)
				if !ok {
					t.Fatalf("the reference %v is refused", c.ref)
				}
				keys := maps.Clone(c.ref)
				if keys == nil {
					keys = map[string]any{}
				}
				for _, k := range c.drop {
					delete(keys, k)
				}
				keys[key] = c.value
				f := keyBase()
				f.Attitude = randscenario.Law{Law: info.Name, Keys: keys}
				got, ok := fingerprintOf(t, f)
				if !ok {
					t.Errorf("%s %s: %v refused; choose a value the law accepts", info.Name, key, c.value)
					return
				}
				checked++
				if got == want {
					showOnFailure(t, f.YAML())
					t.Errorf("%s: %s: %v accepted and changed no figure of the run", info.Name, key, c.value)
				}
			})
		}
	}
	if checked < 20 {
		t.Errorf("only %d law keys checked", checked)
	}
}
