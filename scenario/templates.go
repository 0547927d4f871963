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
