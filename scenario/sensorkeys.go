package scenario

import (
	"fmt"
	"reflect"
	"slices"

	"go.yaml.in/yaml/v3"

	"codeberg.org/sunsight/sunsight/illum/sensor"
)

// The kind keys of a sensor entry come from the sensor-kind registry, so a
// new kind needs no change here.

// paramGoType is the file type of a kind parameter.
func paramGoType(t sensor.ParamType) reflect.Type {
	switch t {
	case sensor.Choice:
		return reflect.TypeOf("")
	case sensor.Table:
		return reflect.TypeOf([][]float64(nil))
	}
	return reflect.TypeOf(0.0)
}

// yamlKeys lists the keys a sensor entry accepts, with their types, for the
// walker.
func (fileSensor) yamlKeys() map[string]reflect.Type {
	out := yamlFields(reflect.TypeOf(sensorKeys{}))
	out["errors"] = reflect.TypeOf(&fileErrors{})
	for k, t := range sensor.ParamKeys() {
		out[k] = paramGoType(t)
	}
	return out
}

// UnmarshalYAML decodes the common keys, the errors block and, by their
// registered types, the kind keys. The walker has checked every key and type
// before.
func (f *fileSensor) UnmarshalYAML(n *yaml.Node) error {
	var head struct {
		sensorKeys `yaml:",inline"`
		Errors     *fileErrors `yaml:"errors,omitempty"`
	}
	if err := n.Decode(&head); err != nil {
		return err
	}
	f.sensorKeys, f.Errors = head.sensorKeys, head.Errors
	types := sensor.ParamKeys()
	for i := 0; i+1 < len(n.Content); i += 2 {
		key := n.Content[i].Value
		t, ok := types[key]
		if !ok {
			continue
		}
		v := reflect.New(paramGoType(t))
		if err := n.Content[i+1].Decode(v.Interface()); err != nil {
			return fmt.Errorf("%s: %w", key, err)
		}
		if f.Params == nil {
			f.Params = map[string]any{}
		}
		f.Params[key] = v.Elem().Interface()
	}
	return nil
}

// MarshalYAML writes the common keys, then the kind keys in the order of the
// kind's registry entry, then the errors block.
func (f fileSensor) MarshalYAML() (any, error) {
	var n yaml.Node
	if err := n.Encode(f.sensorKeys); err != nil {
		return nil, err
	}
	var keys []string
	if k, ok := sensor.LookupKind(f.Kind); ok {
		for _, p := range k.Params {
			keys = append(keys, p.Key)
		}
	}
	var rest []string
	for k := range f.Params {
		if !slices.Contains(keys, k) {
			rest = append(rest, k)
		}
	}
	slices.Sort(rest)
	keys = append(keys, rest...)
	for _, k := range keys {
		v, ok := f.Params[k]
		if !ok {
			continue
		}
		var kv yaml.Node
		if err := kv.Encode(map[string]any{k: v}); err != nil {
			return nil, err
		}
		n.Content = append(n.Content, kv.Content...)
	}
	if f.Errors != nil {
		var kv yaml.Node
		if err := kv.Encode(map[string]any{"errors": f.Errors}); err != nil {
			return nil, err
		}
		// Only the errors the kind's model draws: the others are refused
		// when set, so the record does not offer them.
		if k, ok := sensor.LookupKind(f.Kind); ok && len(kv.Content) == 2 && kv.Content[1].Kind == yaml.MappingNode {
			m := kv.Content[1]
			var kept []*yaml.Node
			for i := 0; i+1 < len(m.Content); i += 2 {
				if errorKeyApplies(k, m.Content[i].Value) {
					kept = append(kept, m.Content[i], m.Content[i+1])
				}
			}
			m.Content = kept
		}
		n.Content = append(n.Content, kv.Content...)
	}
	return &n, nil
}
