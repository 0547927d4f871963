package scenario

import (
	"fmt"
	"maps"
	"slices"
	"testing"

	"go.yaml.in/yaml/v3"

	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// Every registered attitude law has a reader of its keys, and no reader
// is left without a law.
func TestEveryLawHasAReader(t *testing.T) {
	names := attitude.LawNames()
	for _, n := range names {
		if lawResolvers[n] == nil {
			t.Errorf("law %q has no reader in lawResolvers", n)
		}
	}
	for n := range lawResolvers {
		if !slices.Contains(names, n) {
			t.Errorf("lawResolvers reads %q, which the registry does not list", n)
		}
	}
}

// The file's law block tells apart every key some law takes, and no other.
func TestFileLawKnowsEveryLawKey(t *testing.T) {
	got := slices.Sorted(maps.Keys((&fileLaw{}).given()))
	want := slices.Sorted(slices.Values(attitude.LawKeys()))
	if fmt.Sprint(got) != fmt.Sprint(want) {
		t.Errorf("fileLaw tells apart %v; the registry's keys are %v", got, want)
	}
}

// A law's keys left out take the defaults of its registry entry: the
// record of the resolved scenario writes them out.
func TestLawDefaultsComeFromTheRegistry(t *testing.T) {
	extra := map[string]string{
		attitude.NameInertial: ", euler_deg: [0, 0, 0]", attitude.NameSpin: ", euler_deg: [0, 0, 0]",
		attitude.NameDetumble: ", time_constant: 40m", attitude.NameReplay: ", file: history.aem",
	}
	checked := 0
	for _, info := range attitude.Laws() {
		text := minimal + "attitude: {law: " + info.Name + extra[info.Name] + "}\n"
		s, err := Parse([]byte(text), "/tmp")
		if err != nil {
			t.Fatalf("law %s: %v", info.Name, err)
		}
		var rec struct {
			Attitude map[string]any `yaml:"attitude"`
		}
		if err := yaml.Unmarshal(s.Record(), &rec); err != nil {
			t.Fatal(err)
		}
		keys := slices.Collect(maps.Keys(info.Defaults))
		for k := range info.Choices {
			keys = append(keys, k)
		}
		for _, k := range keys {
			var want any = info.Word(k)
			if _, ok := info.Defaults[k].(float64); ok {
				want = info.Number(k)
			}
			if got, ok := rec.Attitude[k]; !ok || fmt.Sprint(got) != fmt.Sprint(want) {
				t.Errorf("law %s: %s is %v in the record, the registry's default is %v", info.Name, k, got, want)
			}
			checked++
		}
	}
	if checked < 15 {
		t.Errorf("%d defaults checked: the registry lost its defaults", checked)
	}
}
