package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"github.com/invopop/jsonschema"
	validator "github.com/santhosh-tekuri/jsonschema/v6"

	"codeberg.org/sunsight/sunsight/scenario/sim"
)

var regenSchema = flag.Bool("regen-schema", false, "rewrite docs/schema/run.schema.json from the Go types")

const runSchemaPath = "../../docs/schema/run.schema.json"

// nullableNumber is the schema of a figure that is null when undefined.
func nullableNumber() *jsonschema.Schema {
	return &jsonschema.Schema{AnyOf: []*jsonschema.Schema{{Type: "number"}, {Type: "null"}}}
}

// runSchema generates the JSON Schema of the run record from runRecord: num
// fields and the headline's floats are numbers or null.
func runSchema() ([]byte, error) {
	headline := (&jsonschema.Reflector{DoNotReference: true, Anonymous: true, Mapper: func(t reflect.Type) *jsonschema.Schema {
		if t.Kind() == reflect.Float64 {
			return nullableNumber()
		}
		return nil
	}}).Reflect(sim.Headline{})
	headline.Version = ""
	headline.Description = "The headline figures of the nominal unit and the primary estimator (sim.Headline)."
	r := jsonschema.Reflector{DoNotReference: true, Anonymous: true, Mapper: func(t reflect.Type) *jsonschema.Schema {
		switch t {
		case reflect.TypeOf(num(0)):
			return nullableNumber()
		case reflect.TypeOf(headlineRecord{}):
			return headline
		}
		return nil
	}}
	s := r.Reflect(runRecord{})
	s.ID = "https://codeberg.org/sunsight/sunsight/raw/branch/main/docs/schema/run.schema.json"
	s.Title = "sunsight run record"
	s.Description = "The JSON document of sunsight run --json and run.json (schema_version 1). Names and units: docs/data-dictionary.md."
	b, err := json.MarshalIndent(s, "", "  ")
	return append(b, '\n'), err
}

// The shipped run schema is the one the Go types give.
func TestRunSchemaUpToDate(t *testing.T) {
	want, err := runSchema()
	if err != nil {
		t.Fatal(err)
	}
	if *regenSchema {
		if err := os.WriteFile(runSchemaPath, want, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	got, err := os.ReadFile(runSchemaPath)
	if err != nil || !bytes.Equal(got, want) {
		t.Fatalf("%s is not what the Go types give (%v); run go test ./cmd/sunsight -run RunSchemaUpToDate -regen-schema", runSchemaPath, err)
	}
}

// compileSchema compiles a shipped schema file.
func compileSchema(t *testing.T, path string) *validator.Schema {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	doc, err := validator.UnmarshalJSON(f)
	if err != nil {
		t.Fatal(err)
	}
	c := validator.NewCompiler()
	if err := c.AddResource("file:///schema.json", doc); err != nil {
		t.Fatal(err)
	}
	s, err := c.Compile("file:///schema.json")
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// realRecords runs every bundled example briefly (with modes and Monte
// Carlo units where the example has them) and returns the JSON records.
func realRecords(t *testing.T) map[string][]byte {
	t.Helper()
	files, _ := filepath.Glob("../../examples/*.yaml")
	if len(files) == 0 {
		t.Fatal("no examples")
	}
	out := map[string][]byte{}
	for _, f := range files {
		var so, se bytes.Buffer
		code := runMain([]string{"run", f, "--json", "--quiet", "--duration", "2h", "--units", "2"}, &so, &se)
		if code != exitOK && code != exitTargetFailed {
			t.Fatalf("%s: exit %d: %s", f, code, se.String())
		}
		out[filepath.Base(f)] = so.Bytes()
	}
	// The single-failure study (targets.n_minus_1) adds its own record.
	var so, se bytes.Buffer
	if code := runMain([]string{"run", writeSingleFailureFile(t), "--json", "--quiet"}, &so, &se); code != exitOK && code != exitTargetFailed {
		t.Fatalf("single failure: exit %d: %s", code, se.String())
	}
	out["single-failure.yaml"] = so.Bytes()
	// The on-board albedo correction (albedo.onboard) adds its own records.
	var ob bytes.Buffer
	if code := runMain([]string{"run", onboardFile(t, "{model: uniform, value: 0.3}"), "--json", "--quiet"}, &ob, &se); code != exitOK {
		t.Fatalf("on-board albedo: exit %d: %s", code, se.String())
	}
	out["onboard.yaml"] = ob.Bytes()
	return out
}

// Real run records validate against the shipped schema, and a record with a
// wrong type or an unknown key does not (the schema can fail).
func TestRunRecordsValidate(t *testing.T) {
	s := compileSchema(t, runSchemaPath)
	for name, b := range realRecords(t) {
		doc, err := validator.UnmarshalJSON(bytes.NewReader(b))
		if err != nil {
			t.Fatal(err)
		}
		if err := s.Validate(doc); err != nil {
			t.Errorf("%s: %v", name, err)
		}
		bad := strings.Replace(string(b), `"schema_version": 1`, `"schema_version": "1"`, 1)
		doc, _ = validator.UnmarshalJSON(strings.NewReader(bad))
		if s.Validate(doc) == nil {
			t.Errorf("%s: a string schema_version validates", name)
		}
		bad = strings.Replace(string(b), `"schema_version": 1`, `"schema_version": 1, "extra_key": 2`, 1)
		doc, _ = validator.UnmarshalJSON(strings.NewReader(bad))
		if s.Validate(doc) == nil {
			t.Errorf("%s: an unknown key validates", name)
		}
	}
}
