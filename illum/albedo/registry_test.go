package albedo

import (
	"strings"
	"testing"
)

// Every registered model says what it is in both forms the report prints
// (the models table and the figure captions), with its setting, and the
// lookup refuses a name it does not know, listing the known ones.
func TestRegisteredModelsDescribeThemselves(t *testing.T) {
	for _, m := range Models() {
		if m.Describe == nil || m.Brief == nil || m.Source == "" {
			t.Fatalf("model %q lacks a description, a brief or a source", m.Name)
		}
		if m.Describe(0.37, 500) == "" || m.Brief(0.37) == "" {
			t.Errorf("model %q: empty description", m.Name)
		}
		if m.TakesValue && !strings.Contains(m.Brief(0.37), "0.37") {
			t.Errorf("model %q takes albedo.value but its brief %q does not show it", m.Name, m.Brief(0.37))
		}
		if got, err := LookupModel(m.Name); err != nil || got.Name != m.Name {
			t.Errorf("lookup %q: %v", m.Name, err)
		}
	}
	if _, err := LookupModel("lambert"); err == nil || !strings.Contains(err.Error(), NameUniform) {
		t.Errorf("unknown model: error %v", err)
	}
}
