package scenario

import (
	"bytes"
	"encoding/json"
	"flag"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"slices"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/invopop/jsonschema"
	validator "github.com/santhosh-tekuri/jsonschema/v6"
	"go.yaml.in/yaml/v3"

	"codeberg.org/sunsight/sunsight/illum/sensor"
)

var regenSchema = flag.Bool("regen-schema", false, "rewrite docs/schema/scenario.schema.json from the Go types")

const scenarioSchemaPath = "../docs/schema/scenario.schema.json"

// scenarioSchema generates the JSON Schema of the scenario file from the
// file* types (YAML names), the sensor kinds' own keys from the sensor
// registry.
func scenarioSchema() ([]byte, error) {
	var r *jsonschema.Reflector
	r = &jsonschema.Reflector{DoNotReference: true, Anonymous: true, FieldNameTag: "yaml", RequiredFromJSONSchemaTags: true,
		Mapper: func(t reflect.Type) *jsonschema.Schema {
			switch t {
			case reflect.TypeOf(Span(0)):
				return &jsonschema.Schema{Type: "string", Description: "a span of time: 90m, 12h, 1d12h, 10s", Pattern: `^[0-9.]+[a-zµ]+([0-9.]+[a-zµ]+)*$`}
			case reflect.TypeOf(fileSensor{}):
				s := r.Reflect(sensorKeys{})
				s.Version = ""
				s.Properties.Set("errors", r.Reflect(fileErrors{}))
				keys := sensor.ParamKeys()
				names := make([]string, 0, len(keys))
				for k := range keys {
					names = append(names, k)
				}
				sort.Strings(names)
				for _, k := range names {
					ps := r.ReflectFromType(paramGoType(keys[k]))
					ps.Version = ""
					kinds := sensor.KindsWithKey(k)
					ps.Description = "kinds: " + strings.Join(kinds, ", ")
					if info, ok := sensor.LookupKind(kinds[0]); ok {
						if p, ok := info.Param(k); ok && p.Doc != "" {
							ps.Description += ". " + p.Doc
						}
					}
					applyRule(ps, kindParamRule(k))
					s.Properties.Set(k, ps)
				}
				return s
			}
			return nil
		}}
	s := r.Reflect(fileScenario{})
	applyRules(s, reflect.TypeOf(fileScenario{}), KeyRules())
	s.ID = jsonschema.ID(SchemaURL)
	s.Title = "sunsight scenario file"
	s.Description = "Keys of a sunsight scenario (YAML). sunsight check FILE reports every problem with its line; this schema is for editors (completion, first checks)."
	b, err := json.MarshalIndent(s, "", "  ")
	return append(b, '\n'), err
}

// applyRules states the loader's words and ranges (KeyRules) on the schema
// s of file type t and of everything under it.
func applyRules(s *jsonschema.Schema, t reflect.Type, rules map[reflect.Type]map[string]KeyRule) {
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if s == nil {
		return
	}
	switch t.Kind() {
	case reflect.Slice:
		applyRules(s.Items, t.Elem(), rules)
	case reflect.Map:
		applyRules(s.AdditionalProperties, t.Elem(), rules)
	case reflect.Struct:
		if t == reflect.TypeOf(fileSensor{}) {
			// The common keys and the errors block; the kind keys are
			// stated where the mapper adds them.
			applyFields(s, reflect.TypeOf(sensorKeys{}), rules)
			if e, ok := s.Properties.Get("errors"); ok {
				applyRules(e, reflect.TypeOf(fileErrors{}), rules)
			}
			return
		}
		applyFields(s, t, rules)
	}
}

// applyFields applies the rules of struct type t's keys, an inline field's
// keys by the rules of the type that declares them.
func applyFields(s *jsonschema.Schema, t reflect.Type, rules map[reflect.Type]map[string]KeyRule) {
	for i := 0; i < t.NumField(); i++ {
		f := t.Field(i)
		name, opts, _ := strings.Cut(f.Tag.Get("yaml"), ",")
		if strings.Contains(opts, "inline") {
			applyFields(s, f.Type, rules)
			continue
		}
		if name == "" || name == "-" || s.Properties == nil {
			continue
		}
		p, ok := s.Properties.Get(name)
		if !ok {
			continue
		}
		if rule, ok := rules[t][name]; ok {
			applyRule(p, rule)
		}
		applyRules(p, f.Type, rules)
	}
}

// applyRule states one key's words or range (on each item of a list).
func applyRule(p *jsonschema.Schema, rule KeyRule) {
	if p.Type == "array" && p.Items != nil {
		p = p.Items
	}
	for _, w := range rule.Words {
		p.Enum = append(p.Enum, w)
	}
	if iv := rule.Range; iv != nil {
		num := func(v float64) json.Number { return json.Number(strconv.FormatFloat(v, 'g', -1, 64)) }
		switch {
		case math.IsInf(iv.Lo, -1):
		case iv.LoOpen:
			p.ExclusiveMinimum = num(iv.Lo)
		default:
			p.Minimum = num(iv.Lo)
		}
		switch {
		case math.IsInf(iv.Hi, 1):
		case iv.HiOpen:
			p.ExclusiveMaximum = num(iv.Hi)
		default:
			p.Maximum = num(iv.Hi)
		}
	}
}

// kindParamRule is what the sensor registry allows for a kind key, over
// every kind that has it: the union of the words, the widest range (a
// bound another key sets, MaxKey, leaves the top open).
func kindParamRule(key string) KeyRule {
	var rule KeyRule
	var iv *Interval
	for _, kind := range sensor.KindsWithKey(key) {
		info, _ := sensor.LookupKind(kind)
		for _, p := range info.Params {
			if p.Key != key {
				continue
			}
			switch p.Type {
			case sensor.Choice:
				for _, c := range p.Choices {
					if !slices.Contains(rule.Words, c) {
						rule.Words = append(rule.Words, c)
					}
				}
			case sensor.Number:
				hi := p.Max
				if p.MaxKey != "" {
					hi = math.Inf(1)
				}
				if iv == nil {
					iv = &Interval{Lo: p.Min, Hi: hi, LoOpen: p.MinOpen}
					continue
				}
				if p.Min < iv.Lo || p.Min == iv.Lo && !p.MinOpen {
					iv.Lo, iv.LoOpen = p.Min, p.MinOpen
				}
				iv.Hi = math.Max(iv.Hi, hi)
			}
		}
	}
	rule.Range = iv
	return rule
}

// Every rule names a key of its file type.
func TestKeyRulesNameRealKeys(t *testing.T) {
	for ft, keys := range KeyRules() {
		fields := yamlFields(ft)
		if ft == reflect.TypeOf(sensorKeys{}) {
			fields = yamlFields(reflect.TypeOf(struct{ sensorKeys }{}).Field(0).Type)
		}
		for k, rule := range keys {
			if _, ok := fields[k]; !ok {
				t.Errorf("%s has no key %q", ft, k)
			}
			if (len(rule.Words) > 0) == (rule.Range != nil) {
				t.Errorf("%s.%s: want words or a range", ft, k)
			}
		}
	}
}

// The shipped scenario schema is the one the Go types give.
func TestScenarioSchemaUpToDate(t *testing.T) {
	want, err := scenarioSchema()
	if err != nil {
		t.Fatal(err)
	}
	if *regenSchema {
		if err := os.WriteFile(scenarioSchemaPath, want, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	got, err := os.ReadFile(scenarioSchemaPath)
	if err != nil || !bytes.Equal(got, want) {
		t.Fatalf("%s is not what the Go types give (%v); run go test ./scenario -run ScenarioSchemaUpToDate -regen-schema", scenarioSchemaPath, err)
	}
}

// yamlAsJSON reads YAML text as the JSON document an editor validates.
func yamlAsJSON(t *testing.T, text []byte) any {
	t.Helper()
	var v any
	if err := yaml.Unmarshal(text, &v); err != nil {
		t.Fatal(err)
	}
	b, err := json.Marshal(v)
	if err != nil {
		t.Fatal(err)
	}
	doc, err := validator.UnmarshalJSON(bytes.NewReader(b))
	if err != nil {
		t.Fatal(err)
	}
	return doc
}

// Every bundled example validates against the scenario schema; a misspelt
// key and a wrong type do not.
func TestExamplesValidateAgainstScenarioSchema(t *testing.T) {
	f, err := os.Open(scenarioSchemaPath)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	doc, err := validator.UnmarshalJSON(f)
	if err != nil {
		t.Fatal(err)
	}
	c := validator.NewCompiler()
	if err := c.AddResource("file:///scenario.schema.json", doc); err != nil {
		t.Fatal(err)
	}
	s, err := c.Compile("file:///scenario.schema.json")
	if err != nil {
		t.Fatal(err)
	}
	files, _ := filepath.Glob("../examples/*.yaml")
	if len(files) == 0 {
		t.Fatal("no examples")
	}
	for _, p := range files {
		text, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		if err := s.Validate(yamlAsJSON(t, text)); err != nil {
			t.Errorf("%s: %v", p, err)
		}
	}
	// A word no registry holds and a number outside the loader's range are
	// refused too, as sunsight check refuses them.
	for _, bad := range []string{"orbit:\n  altitude_km: 500\n  inclination_deg: 30\nbodyy: {}\n", "orbit: {altitude_km: high}\n",
		"attitude: {law: nadri}\n", "body: {sensors: [{name: a, kind: cosine, face: \"+W\"}]}\n", "albedo: {value: 1.5}\n",
		"body: {sensors: [{name: a, kind: cosine, face: \"+X\", half_angle_deg: 0}]}\n", "orbit: {altitude_km: 50}\n",
		"modes: [{name: m, law: sun, point_axis: \"+Q\"}]\n", "body: {sensors: [{name: a, kind: quadrant-wall, face: \"+X\", dead_zone: maybe}]}\n",
		"shadow: umbral\n", "orbit: {altitude_km: 500, inclination_deg: 97, propagator: sgp5}\n", "output: {figures: [skymap]}\n",
		"validity: {false_sun_bound_deg: 180}\n", "body: {panels: [{name: p, face: \"+X\", area_m2: 0.01, efficiency: 1.2}]}\n"} {
		if s.Validate(yamlAsJSON(t, []byte(bad))) == nil {
			t.Errorf("%q validates", bad)
		}
	}
}
