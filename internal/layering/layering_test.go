// Package layering checks the package map of DEVELOPERS.md on the source
// tree: the physics packages are bottom layers, and the scenario file
// package reads only model registries.
package layering

import (
	"go/build"
	"io/fs"
	"path/filepath"
	"strings"
	"testing"
)

const module = "codeberg.org/sunsight/sunsight"

// imports maps each package of the module (import path) to its non-test
// imports of the module, read with go/build from the source tree.
func imports(t *testing.T) map[string][]string {
	t.Helper()
	root, err := filepath.Abs("../..")
	if err != nil {
		t.Fatal(err)
	}
	out := map[string][]string{}
	err = filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if !d.IsDir() {
			return nil
		}
		if name := d.Name(); path != root && (strings.HasPrefix(name, ".") || name == "testdata") {
			return filepath.SkipDir
		}
		p, err := build.ImportDir(path, 0)
		if err != nil {
			return nil // no Go files (or only tests)
		}
		rel, _ := filepath.Rel(root, path)
		var own []string
		for _, imp := range p.Imports {
			if strings.HasPrefix(imp, module+"/") {
				own = append(own, strings.TrimPrefix(imp, module+"/"))
			}
		}
		out[filepath.ToSlash(rel)] = own
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	return out
}

func under(pkg, top string) bool { return pkg == top || strings.HasPrefix(pkg, top+"/") }

// No package under orbit/, ephem/ or illum/ imports scenario/ or plots/.
func TestPhysicsPackagesAreBottomLayers(t *testing.T) {
	pkgs := imports(t)
	if len(pkgs) < 20 {
		t.Fatalf("found %d packages; is the tree readable?", len(pkgs))
	}
	for pkg, imps := range pkgs {
		if !under(pkg, "orbit") && !under(pkg, "ephem") && !under(pkg, "illum") {
			continue
		}
		for _, imp := range imps {
			if under(imp, "scenario") || under(imp, "plots") || under(imp, "cmd") {
				t.Errorf("%s imports %s", pkg, imp)
			}
		}
	}
}

// The scenario file package imports no engine package: only the model
// packages whose registries give the names it validates, the figure
// catalogue and internal helpers.
func TestScenarioRootImportsNoEngine(t *testing.T) {
	imps, ok := imports(t)["scenario"]
	if !ok {
		t.Fatal("no scenario package found")
	}
	for _, imp := range imps {
		if !(under(imp, "orbit") || under(imp, "ephem") || under(imp, "illum") || imp == "plots/figures" || under(imp, "internal")) {
			t.Errorf("scenario imports %s", imp)
		}
	}
}
