package scenario

import (
	"embed"
	"fmt"
	"sort"
	"strings"
)

//go:embed templates/*.yaml
var templates embed.FS

// ExampleNames lists the bundled example scenarios, sorted.
func ExampleNames() []string {
	entries, _ := templates.ReadDir("templates")
	var names []string
	for _, e := range entries {
		names = append(names, strings.TrimSuffix(e.Name(), ".yaml"))
	}
	sort.Strings(names)
	return names
}

// ExampleText returns the commented text of a bundled example scenario.
func ExampleText(name string) ([]byte, error) {
	data, err := templates.ReadFile("templates/" + name + ".yaml")
	if err != nil {
		return nil, fmt.Errorf("scenario: example %q is unknown; allowed %s", name, strings.Join(ExampleNames(), ", "))
	}
	return data, nil
}

// SchemaURL is the JSON Schema of the scenario file (docs/schema/
// scenario.schema.json, generated from the file types by a test). sunsight
// init names it in the first line of the file it writes, so editors with a
// YAML language server validate and complete the keys.
const SchemaURL = "https://codeberg.org/sunsight/sunsight/raw/branch/main/docs/schema/scenario.schema.json"

// SchemaComment is the first line sunsight init writes.
const SchemaComment = "# yaml-language-server: $schema=" + SchemaURL + "\n"
