package scenario_test

import (
	"os"
	"path/filepath"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// checkVerdict is what `sunsight check` does: load, build every model run
// builds, derive the values it prints.
func checkVerdict(data []byte, dir string) error {
	s, err := scenario.Parse(data, dir)
	if err != nil {
		return err
	}
	p, err := study.Prepare(s)
	if err != nil {
		return err
	}
	_, err = study.Derive(s, p)
	return err
}

// runVerdict is what `sunsight run` does before it simulates.
func runVerdict(data []byte, dir string) error {
	s, err := scenario.Parse(data, dir)
	if err != nil {
		return err
	}
	_, err = study.Prepare(s)
	return err
}

// Every bad-input case, every file that loads but does not build
// (testdata/buildbad) and every bundled example gets the same verdict from
// check and run (cmd/sunsight's TestCheckAndRunAgree runs the commands
// themselves on the files).
func TestCheckAndRunSameVerdict(t *testing.T) {
	type input struct {
		name, dir string
		data      []byte
		bad       bool
	}
	var ins []input
	for _, c := range scenario.BadInputs() {
		ins = append(ins, input{name: c[0], data: []byte(c[1]), bad: true})
	}
	for _, pat := range []string{"testdata/buildbad/*.yaml", "../examples/*.yaml"} {
		files, _ := filepath.Glob(pat)
		for _, f := range files {
			b, err := os.ReadFile(f)
			if err != nil {
				t.Fatal(err)
			}
			abs, _ := filepath.Abs(filepath.Dir(f))
			ins = append(ins, input{name: f, dir: abs, data: b, bad: filepath.Dir(f) == "testdata/buildbad"})
		}
	}
	if len(ins) < 50 {
		t.Fatalf("only %d inputs", len(ins))
	}
	for _, in := range ins {
		ce, re := checkVerdict(in.data, in.dir), runVerdict(in.data, in.dir)
		if (ce == nil) != (re == nil) {
			t.Errorf("%s: check says %v, run says %v", in.name, ce, re)
		}
		if (ce != nil) != in.bad {
			t.Errorf("%s: check verdict %v, want bad = %v", in.name, ce, in.bad)
		}
	}
}
