package scenario

import (
	"bytes"
	"encoding"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"reflect"
	"slices"
	"sort"
	"strconv"
	"strings"

	"codeberg.org/sunsight/sunsight/internal/numtext"
	"codeberg.org/sunsight/sunsight/internal/suggest"
	"go.yaml.in/yaml/v3"
)

// FieldError is one problem in a scenario file.
type FieldError struct {
	Path      string // dotted key path, e.g. "body.sensors[2].half_angle_deg"
	Line, Col int    // 1-based; zero when the key is absent from the file
	Msg       string // "value V is …; allowed …"
	// Origin says where a value that is not a line of the file came from
	// (a tool that edits the file sets it, e.g. "set by --vary seed").
	Origin string
}

func (e *FieldError) Error() string {
	if e.Origin != "" {
		return fmt.Sprintf("%s (%s): %s", e.Path, e.Origin, e.Msg)
	}
	if e.Line > 0 {
		return fmt.Sprintf("%s (line %d, col %d): %s", e.Path, e.Line, e.Col, e.Msg)
	}
	return fmt.Sprintf("%s: %s", e.Path, e.Msg)
}

// Errors lists every problem found, in file order; it prints one per line.
type Errors []*FieldError

func (es Errors) Error() string {
	lines := make([]string, len(es))
	for i, e := range es {
		lines[i] = "scenario: " + e.Error()
	}
	return strings.Join(lines, "\n")
}

// Load reads, checks and resolves a scenario file.
func Load(path string) (*Scenario, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		if errors.Is(err, os.ErrNotExist) {
			return nil, fmt.Errorf("scenario: file %s does not exist; give the path of a scenario file (sunsight init writes one)", path)
		}
		return nil, fmt.Errorf("scenario: %w", err)
	}
	dir, err := filepath.Abs(filepath.Dir(path))
	if err != nil {
		return nil, fmt.Errorf("scenario: %w", err)
	}
	return Parse(data, dir)
}

// Parse checks and resolves scenario text; dir is the folder relative paths in
// it are taken from.
func Parse(data []byte, dir string) (*Scenario, error) {
	var doc yaml.Node
	if err := yaml.Unmarshal(data, &doc); err != nil {
		return nil, Errors{yamlSyntaxError(err)}
	}
	if doc.Kind == 0 || len(doc.Content) == 0 {
		return nil, Errors{{Path: "(file)", Msg: "value is empty; allowed a scenario mapping with at least orbit and body (sunsight init writes one)"}}
	}
	if fe := secondDocument(data); fe != nil {
		return nil, Errors{fe}
	}
	return ParseNode(doc.Content[0], dir)
}

// ParseNode checks and resolves a scenario given as its YAML node tree (the
// top mapping), as Parse does its text. Each problem carries the line and
// column of its node; a node made in code (line 0) gives none, so a tool
// that edits a user's file before the check reports the user's own lines.
func ParseNode(root *yaml.Node, dir string) (*Scenario, error) {
	w := walker{nodes: map[string]*yaml.Node{}, refused: map[*yaml.Node]bool{}, types: map[*yaml.Node]reflect.Type{}}
	w.check(root, reflect.TypeOf(fileScenario{}), "")
	if len(w.errs) > 0 {
		// Report the value problems of the keys that could be read in the
		// same round as the key and type problems; after a key given twice
		// the decoder reads nothing more, so those problems alone.
		// A section or a list given as something else leaves the rest
		// of the file to be judged without it (no sensors, no panels),
		// so those problems are reported alone too.
		if w.duplicate || w.structural {
			return nil, sortErrors(w.errs)
		}
		return nil, sortErrors(append(w.errs, valueErrors(root, dir, w)...))
	}
	var f fileScenario
	if err := root.Decode(&f); err != nil {
		// The walker has seen every key and scalar, so this is a safety net.
		return nil, Errors{{Path: "(file)", Msg: "value could not be read: " + cleanYAML(err.Error()) + "; allowed the keys and types shown by sunsight init"}}
	}
	r := resolver{nodes: w.nodes, dir: dir}
	s := r.resolve(&f)
	if len(r.errs) > 0 {
		sort.SliceStable(r.errs, func(i, j int) bool { return r.errs[i].Line < r.errs[j].Line && r.errs[i].Line > 0 })
		return nil, r.errs
	}
	rec, err := yaml.Marshal(&f)
	if err != nil {
		return nil, fmt.Errorf("scenario: writing the record: %w", err)
	}
	s.record = rec
	return s, nil
}

// valueErrors resolves a file whose keys or types the walker refused, as
// far as it can be read, and returns the value problems of the other keys.
// The file is read with each refused value taken out (its key absent, a
// refused list entry kept as an empty one, so lists keep their length and
// their indexes), and a problem that may follow from a refused value is
// left out: one at, under or above a refused key (a section or list that
// holds it looks incomplete without it), one in the same list entry, or
// one whose message names it.
func valueErrors(root *yaml.Node, dir string, w walker) (out Errors) {
	var f fileScenario
	if err := w.pruned(root).Decode(&f); err != nil {
		var te *yaml.TypeError
		if !errors.As(err, &te) {
			return nil
		}
	}
	defer func() {
		// A half-read file may hold a combination the resolver never meets
		// in a valid one; the key and type problems are then reported alone.
		if recover() != nil {
			out = nil
		}
	}()
	r := resolver{nodes: w.nodes, dir: dir}
	r.resolve(&f)
	for _, e := range r.errs {
		covered := false
		for _, p := range w.refusedPaths() {
			if follows(e, p) {
				covered = true
				break
			}
		}
		if !covered {
			out = append(out, e)
		}
	}
	return out
}

// refusedPaths lists the paths of the problems found and of the keys
// misspelt ones were meant to be.
func (w *walker) refusedPaths() []string {
	out := slices.Clone(w.meant)
	for _, e := range w.errs {
		out = append(out, e.Path)
	}
	return out
}

// follows reports whether problem e may be a consequence of the refused
// value at path refused.
func follows(e *FieldError, refused string) bool {
	if under(e.Path, refused) || under(refused, e.Path) {
		return true
	}
	// The keys of one list entry (a sensor, a panel, a phase) are judged
	// together: kind and its keys, face and tilt, area and size.
	if i := strings.Index(refused, "]"); i >= 0 && under(e.Path, refused[:i+1]) {
		return true
	}
	// The message names the refused key, or a section holding it (a
	// cross-check such as "needs monte_carlo.units ≥ 2").
	for p := refused; strings.Contains(p, "."); p = parentPath(p) {
		if namesKey(e.Msg, p) {
			return true
		}
	}
	// A key of the same mapping named by its own name ("given without
	// ltan", "longer than the duration").
	leaf := refused[strings.LastIndex(refused, ".")+1:]
	return !strings.Contains(leaf, "[") && parentPath(e.Path) == parentPath(refused) && namesKey(e.Msg, leaf)
}

// under reports whether path p is at or under path top.
func under(p, top string) bool {
	return top != "" && (p == top || strings.HasPrefix(p, top+".") || strings.HasPrefix(p, top+"["))
}

// parentPath is the path of the mapping or list holding p ("" at the top).
func parentPath(p string) string {
	if i := strings.LastIndexAny(p, ".["); i >= 0 {
		return p[:i]
	}
	return ""
}

// namesKey reports whether msg holds key as a whole word (not as part of a
// longer key or path).
func namesKey(msg, key string) bool {
	word := func(c byte) bool {
		return c == '_' || c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9'
	}
	for i := 0; ; {
		j := strings.Index(msg[i:], key)
		if j < 0 {
			return false
		}
		a, b := i+j, i+j+len(key)
		before := a == 0 || !(word(msg[a-1]) || msg[a-1] == '.')
		after := b == len(msg) || !(word(msg[b]) || (msg[b] == '.' || msg[b] == '[') && b+1 < len(msg) && word(msg[b+1]))
		if before && after {
			return true
		}
		i = a + 1
	}
}

// pruned copies the node tree without the values the walker refused: a
// refused value of a mapping is left out with its key, a refused list entry
// is replaced by the empty value of the list's type.
func (w *walker) pruned(n *yaml.Node) *yaml.Node {
	c := *n
	if len(n.Content) == 0 {
		return &c
	}
	c.Content = make([]*yaml.Node, 0, len(n.Content))
	switch n.Kind {
	case yaml.MappingNode:
		for i := 0; i+1 < len(n.Content); i += 2 {
			k, v := n.Content[i], n.Content[i+1]
			if w.refused[k] || w.refused[v] {
				continue
			}
			c.Content = append(c.Content, w.pruned(k), w.pruned(v))
		}
	case yaml.SequenceNode:
		for _, v := range n.Content {
			if w.refused[v] {
				c.Content = append(c.Content, emptyNode(w.types[v]))
				continue
			}
			c.Content = append(c.Content, w.pruned(v))
		}
	default:
		for _, v := range n.Content {
			c.Content = append(c.Content, w.pruned(v))
		}
	}
	return &c
}

// emptyNode is a node that decodes to the zero value of t (an empty mapping
// for a section or an entry).
func emptyNode(t reflect.Type) *yaml.Node {
	for t != nil && t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if t == nil || t.Kind() == reflect.Struct {
		return &yaml.Node{Kind: yaml.MappingNode, Tag: "!!map"}
	}
	var n yaml.Node
	if err := n.Encode(reflect.Zero(t).Interface()); err != nil {
		return &yaml.Node{Kind: yaml.MappingNode, Tag: "!!map"}
	}
	return &n
}

// sortErrors orders problems by line and column, those without a line last.
func sortErrors(es Errors) Errors {
	sort.SliceStable(es, func(i, j int) bool {
		a, b := es[i].Line, es[j].Line
		if a == 0 || b == 0 {
			return a != 0 && b == 0
		}
		if a == b {
			return es[i].Col < es[j].Col
		}
		return a < b
	})
	return es
}

// secondDocument returns an error when the text holds more than one YAML
// document (a second one after "---" would otherwise be ignored).
func secondDocument(data []byte) *FieldError {
	dec := yaml.NewDecoder(bytes.NewReader(data))
	var first, second yaml.Node
	if dec.Decode(&first) != nil {
		return nil
	}
	if err := dec.Decode(&second); err != nil {
		// io.EOF: one document. A syntax error in a later document is
		// reported as such.
		if err == io.EOF {
			return nil
		}
		return yamlSyntaxError(err)
	}
	fe := &FieldError{Path: "(file)", Msg: "value holds more than one YAML document (a second one starts after \"---\"); allowed one scenario per file: remove the \"---\" line and what follows, or split it into its own file"}
	if len(second.Content) > 0 {
		fe.Line, fe.Col = second.Content[0].Line, second.Content[0].Column
	} else if second.Line > 0 {
		fe.Line, fe.Col = second.Line, second.Column
	}
	return fe
}

func yamlSyntaxError(err error) *FieldError {
	msg := cleanYAML(err.Error())
	fe := &FieldError{Path: "(file)", Msg: "value is not valid YAML: " + msg + "; allowed YAML text (check indentation and quotes)"}
	if m := lineNumberIn(msg); m != "" {
		fe.Line, _ = strconv.Atoi(m)
		fe.Col = 1
	}
	return fe
}

// lineNumberIn returns the digits after the first "line " in s, or "".
func lineNumberIn(s string) string {
	i := strings.Index(s, "line ")
	if i < 0 {
		return ""
	}
	j := i + 5
	k := j
	for k < len(s) && s[k] >= '0' && s[k] <= '9' {
		k++
	}
	return s[j:k]
}

func cleanYAML(s string) string {
	s = strings.TrimPrefix(s, "yaml: ")
	s = strings.ReplaceAll(s, "\n", " ")
	return strings.ToLower(s)
}

// walker checks the node tree against the file types before decoding, so that
// every error carries a key path, a line and a column, and no Go type name
// reaches the user.
type walker struct {
	nodes map[string]*yaml.Node
	errs  Errors
	// duplicate: some mapping gives a key twice. The YAML decoder then
	// stops filling the file's values, so the other values cannot be
	// judged (they would look missing).
	duplicate bool
	// structural: a section, or a list under a key, is not a mapping or a
	// list. The other values would be judged as if it were absent.
	structural bool
	// refused: the nodes of the problems found (a value, or the key of an
	// unknown key); types: the file type each node was checked against.
	refused map[*yaml.Node]bool
	types   map[*yaml.Node]reflect.Type
	// meant: the paths of the keys misspelt ones were probably meant to be.
	meant []string
}

func (w *walker) fail(n *yaml.Node, path, format string, a ...any) {
	w.errs = append(w.errs, &FieldError{Path: path, Line: n.Line, Col: n.Column, Msg: fmt.Sprintf(format, numtext.Clean(a)...)})
	w.refused[n] = true
}

// keyLister is a file type whose keys are not its fields (a sensor entry
// takes the keys of the registered sensor kinds).
type keyLister interface {
	yamlKeys() map[string]reflect.Type
}

var keyListerType = reflect.TypeOf((*keyLister)(nil)).Elem()

var textUnmarshaler = reflect.TypeOf((*encoding.TextUnmarshaler)(nil)).Elem()

// yamlFields lists a struct type's keys, flattening inline fields.
func yamlFields(t reflect.Type) map[string]reflect.Type {
	if t.Implements(keyListerType) {
		return reflect.Zero(t).Interface().(keyLister).yamlKeys()
	}
	out := map[string]reflect.Type{}
	for i := 0; i < t.NumField(); i++ {
		f := t.Field(i)
		tag := f.Tag.Get("yaml")
		name, opts, _ := strings.Cut(tag, ",")
		if opts == "inline" || strings.Contains(opts, "inline") {
			for k, v := range yamlFields(f.Type) {
				out[k] = v
			}
			continue
		}
		if name == "" || name == "-" {
			continue
		}
		out[name] = f.Type
	}
	return out
}

func join(path, key string) string {
	if path == "" {
		return key
	}
	return path + "." + key
}

func shown(n *yaml.Node) string {
	switch n.Kind {
	case yaml.MappingNode:
		return "a mapping"
	case yaml.SequenceNode:
		return "a list"
	case yaml.AliasNode:
		return "an alias"
	}
	v := n.Value
	if len(v) > 40 {
		v = v[:40] + "…"
	}
	return strconv.Quote(v)
}

func (w *walker) check(n *yaml.Node, t reflect.Type, path string) {
	w.types[n] = t
	if n.Kind == yaml.AliasNode {
		w.fail(n, path, "value is a yaml alias; allowed plain values (aliases are not supported)")
		return
	}
	if path != "" {
		w.nodes[path] = n
	}
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if n.Kind == yaml.ScalarNode && n.Tag == "!!null" {
		if t.Kind() == reflect.Struct && t != reflect.TypeOf(Span(0)) {
			return // an empty section keeps its defaults
		}
		w.fail(n, path, "value is empty; allowed %s", describe(t))
		return
	}
	if reflect.PointerTo(t).Implements(textUnmarshaler) {
		if n.Kind != yaml.ScalarNode {
			w.fail(n, path, "value %s is not %s; allowed %s", shown(n), describe(t), describe(t))
			return
		}
		v := reflect.New(t).Interface().(encoding.TextUnmarshaler)
		if err := v.UnmarshalText([]byte(n.Value)); err != nil {
			w.fail(n, path, "value %s", err.Error())
		}
		return
	}
	switch t.Kind() {
	case reflect.Struct:
		if n.Kind != yaml.MappingNode {
			w.fail(n, path, "value %s is not a mapping; allowed a mapping of keys", shown(n))
			w.structural = w.structural || !strings.HasSuffix(path, "]")
			return
		}
		fields := yamlFields(t)
		seen := map[string]*yaml.Node{}
		for i := 0; i+1 < len(n.Content); i += 2 {
			k, v := n.Content[i], n.Content[i+1]
			kp := join(path, k.Value)
			if first, dup := seen[k.Value]; dup {
				w.fail(k, kp, "key %q is given twice (first at line %d); allowed each key once", k.Value, first.Line)
				w.duplicate = true
				continue
			}
			seen[k.Value] = k
			ft, ok := fields[k.Value]
			if !ok {
				keys := make([]string, 0, len(fields))
				for name := range fields {
					keys = append(keys, name)
				}
				sort.Strings(keys)
				w.fail(k, kp, "key %q is unknown%s; allowed %s", k.Value, suggest.Hint(k.Value, keys), strings.Join(keys, ", "))
				w.misspelt(n, path, suggest.Closest(k.Value, keys), fields)
				continue
			}
			w.check(v, ft, kp)
		}
	case reflect.Slice:
		if n.Kind != yaml.SequenceNode {
			w.fail(n, path, "value %s is not a list; allowed %s", shown(n), describe(t))
			w.structural = w.structural || !strings.HasSuffix(path, "]")
			return
		}
		for i, c := range n.Content {
			w.check(c, t.Elem(), fmt.Sprintf("%s[%d]", path, i))
		}
	case reflect.String:
		if n.Kind != yaml.ScalarNode {
			w.fail(n, path, "value %s is not text; allowed a single value", shown(n))
		}
	case reflect.Float64:
		if n.Kind != yaml.ScalarNode || (n.Tag != "!!int" && n.Tag != "!!float") {
			w.fail(n, path, "value %s is not a number; allowed a number such as 12.5", shown(n))
			return
		}
		var v float64
		if err := n.Decode(&v); err != nil || v != v || v > 1e300 || v < -1e300 {
			w.fail(n, path, "value %s is not a finite number; allowed a number such as 12.5", shown(n))
		}
	case reflect.Int, reflect.Int64:
		if n.Kind != yaml.ScalarNode || n.Tag != "!!int" {
			w.fail(n, path, "value %s is not a whole number; allowed a whole number such as 3", shown(n))
			return
		}
		var out int64
		if err := n.Decode(&out); err != nil {
			w.fail(n, path, "value %s is out of range; allowed a whole number such as 3", shown(n))
		}
	case reflect.Bool:
		if n.Kind != yaml.ScalarNode || n.Tag != "!!bool" {
			w.fail(n, path, "value %s is not true or false; allowed true or false", shown(n))
		}
	}
}

// misspelt notes the key an unknown key of mapping n was probably meant to
// be, when the mapping lacks it: what the file then says without that key
// follows from the misspelling. A section or a list misspelt leaves the
// rest to be judged without it, as a refused one does.
func (w *walker) misspelt(n *yaml.Node, path, meant string, fields map[string]reflect.Type) {
	if meant == "" {
		return
	}
	for i := 0; i < len(n.Content); i += 2 {
		if n.Content[i].Value == meant {
			return
		}
	}
	w.meant = append(w.meant, join(path, meant))
	t := fields[meant]
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if (t.Kind() == reflect.Struct || t.Kind() == reflect.Slice) && !reflect.PointerTo(t).Implements(textUnmarshaler) {
		w.structural = true
	}
}

func describe(t reflect.Type) string {
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	switch {
	case t == reflect.TypeOf(Span(0)):
		return "a length of time such as 90m, 1d12h or 30d"
	case t.Kind() == reflect.Struct:
		return "a mapping of keys"
	case t.Kind() == reflect.Slice:
		return "a list of " + strings.TrimPrefix(strings.TrimPrefix(describe(t.Elem()), "a "), "an ")
	case t.Kind() == reflect.String:
		return "a text value"
	case t.Kind() == reflect.Float64:
		return "a number"
	case t.Kind() == reflect.Int, t.Kind() == reflect.Int64:
		return "a whole number"
	case t.Kind() == reflect.Bool:
		return "true or false"
	}
	return "a value"
}
