package scenario

import (
	"bytes"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"reflect"
	"sort"
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
				if k, ok := s.Properties.Get("kind"); ok {
					for _, n := range sensor.KindNames() {
						k.Enum = append(k.Enum, n)
					}
				}
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
					ps.Description = "kinds: " + strings.Join(sensor.KindsWithKey(k), ", ")
					s.Properties.Set(k, ps)
				}
				return s
			}
			return nil
		}}
	s := r.Reflect(fileScenario{})
	s.ID = jsonschema.ID(SchemaURL)
	s.Title = "sunsight scenario file"
	s.Description = "Keys of a sunsight scenario (YAML). sunsight check FILE reports every problem with its line; this schema is for editors (completion, first checks)."
	b, err := json.MarshalIndent(s, "", "  ")
	return append(b, '\n'), err
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
	for _, bad := range []string{"orbit:\n  altitude_km: 500\n  inclination_deg: 30\nbodyy: {}\n", "orbit: {altitude_km: high}\n"} {
		if s.Validate(yamlAsJSON(t, []byte(bad))) == nil {
			t.Errorf("%q validates", bad)
		}
	}
}
