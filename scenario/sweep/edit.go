package sweep

import (
	"fmt"
	"strconv"
	"strings"

	"go.yaml.in/yaml/v3"
)

// Special keys.
const (
	KeyLayout = "layout" // a name from body.layouts, replacing body.sensors
	KeyMode   = "mode"   // a name from modes, replacing attitude
)

type step struct {
	key   string
	index int // −1 for a mapping key
}

// splitPath reads "body.sensors[2].half_angle_deg".
func splitPath(path string) ([]step, error) {
	var out []step
	for _, part := range strings.Split(path, ".") {
		name, rest, _ := strings.Cut(part, "[")
		if name == "" {
			return nil, fmt.Errorf("key path %q has an empty part; write keys as orbit.altitude_km or body.sensors[2].half_angle_deg", path)
		}
		out = append(out, step{key: name, index: -1})
		for rest != "" {
			num, after, ok := strings.Cut(rest, "]")
			i, err := strconv.Atoi(num)
			if !ok || err != nil || i < 0 {
				return nil, fmt.Errorf("key path %q has a bad index [%s; write a list index as [0], [1], …", path, rest)
			}
			out = append(out, step{index: i})
			rest = strings.TrimPrefix(after, "[")
			if after != "" && !strings.HasPrefix(after, "[") {
				return nil, fmt.Errorf("key path %q: unexpected %q after an index", path, after)
			}
		}
	}
	return out, nil
}

func mapValue(m *yaml.Node, key string) *yaml.Node {
	if m == nil || m.Kind != yaml.MappingNode {
		return nil
	}
	for i := 0; i+1 < len(m.Content); i += 2 {
		if m.Content[i].Value == key {
			return m.Content[i+1]
		}
	}
	return nil
}

func setMapValue(m *yaml.Node, key string, v *yaml.Node) {
	for i := 0; i+1 < len(m.Content); i += 2 {
		if m.Content[i].Value == key {
			m.Content[i+1] = v
			return
		}
	}
	m.Content = append(m.Content, &yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: key}, v)
}

// scalar makes a node for value text: numbers and booleans plain, anything
// else a double-quoted string (so an epoch stays text, not a timestamp).
func scalar(v string) *yaml.Node {
	n := &yaml.Node{Kind: yaml.ScalarNode, Value: v}
	if _, err := strconv.ParseFloat(v, 64); err == nil {
		n.Tag = "!!float"
		if _, err := strconv.ParseInt(v, 10, 64); err == nil {
			n.Tag = "!!int"
		}
		return n
	}
	if v == "true" || v == "false" {
		n.Tag = "!!bool"
		return n
	}
	n.Tag, n.Style = "!!str", yaml.DoubleQuotedStyle
	return n
}

// set puts value at path in the mapping root, creating missing mapping keys
// (the scenario check then names any key the schema does not know).
func set(root *yaml.Node, path, value string) error {
	switch path {
	case KeyLayout:
		return setLayout(root, value)
	case KeyMode:
		return setMode(root, value)
	}
	steps, err := splitPath(path)
	if err != nil {
		return err
	}
	n := root
	for i, s := range steps {
		last := i == len(steps)-1
		where := pathUpTo(steps, i)
		if s.index >= 0 {
			if n.Kind != yaml.SequenceNode {
				return fmt.Errorf("%s is not a list; drop the [%d]", pathUpTo(steps, i-1), s.index)
			}
			if s.index >= len(n.Content) {
				return fmt.Errorf("%s is out of range: the list has %d entries (indices 0 to %d)", where, len(n.Content), len(n.Content)-1)
			}
			if last {
				n.Content[s.index] = scalar(value)
				return nil
			}
			n = n.Content[s.index]
			continue
		}
		if n.Kind != yaml.MappingNode {
			return fmt.Errorf("%s is not a mapping, so it has no key %q", pathUpTo(steps, i-1), s.key)
		}
		if last {
			setMapValue(n, s.key, scalar(value))
			return nil
		}
		next := mapValue(n, s.key)
		if next == nil {
			if steps[i+1].index >= 0 {
				return fmt.Errorf("%s is not in the file, so it has no entry [%d]", where, steps[i+1].index)
			}
			next = &yaml.Node{Kind: yaml.MappingNode, Tag: "!!map"}
			setMapValue(n, s.key, next)
		}
		n = next
	}
	return nil
}

func pathUpTo(steps []step, i int) string {
	var b strings.Builder
	for _, s := range steps[:i+1] {
		if s.index >= 0 {
			fmt.Fprintf(&b, "[%d]", s.index)
			continue
		}
		if b.Len() > 0 {
			b.WriteByte('.')
		}
		b.WriteString(s.key)
	}
	if b.Len() == 0 {
		return "(file)"
	}
	return b.String()
}

// named finds the entry called name in the list at key of parent.
func named(list *yaml.Node, listPath, name string) (*yaml.Node, error) {
	var names []string
	if list != nil && list.Kind == yaml.SequenceNode {
		for _, e := range list.Content {
			if v := mapValue(e, "name"); v != nil {
				if v.Value == name {
					return e, nil
				}
				names = append(names, v.Value)
			}
		}
	}
	if len(names) == 0 {
		return nil, fmt.Errorf("%s has no entries; add %s to the scenario file", listPath, listPath)
	}
	return nil, fmt.Errorf("%s has no entry named %q; names: %s", listPath, name, strings.Join(names, ", "))
}

func setLayout(root *yaml.Node, name string) error {
	body := mapValue(root, "body")
	e, err := named(mapValue(body, "layouts"), "body.layouts", name)
	if err != nil {
		return err
	}
	sensors := mapValue(e, "sensors")
	if sensors == nil {
		return fmt.Errorf("body.layouts entry %q has no sensors", name)
	}
	setMapValue(body, "sensors", sensors)
	return nil
}

func setMode(root *yaml.Node, name string) error {
	e, err := named(mapValue(root, "modes"), "modes", name)
	if err != nil {
		return err
	}
	att := &yaml.Node{Kind: yaml.MappingNode, Tag: "!!map"}
	for i := 0; i+1 < len(e.Content); i += 2 {
		if e.Content[i].Value != "name" {
			att.Content = append(att.Content, e.Content[i], e.Content[i+1])
		}
	}
	setMapValue(root, "attitude", att)
	return nil
}
