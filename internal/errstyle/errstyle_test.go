// Package errstyle checks the error rule of DEVELOPERS.md on the source
// tree: every error text starts lower-case, and an error made in an
// exported function of a library package starts with its package name (or
// a scenario field path, or a wrapped error).
package errstyle

import (
	"go/ast"
	"go/parser"
	"go/token"
	"io/fs"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"unicode"
	"unicode/utf8"
)

// errorText is one error text made with errors.New or fmt.Errorf.
type errorText struct {
	pos      string
	pkg      string // package name
	dir      string // folder, relative to the module root
	exported bool   // made inside an exported function or method
	text     string
}

func errorTexts(t *testing.T) []errorText {
	t.Helper()
	root, err := filepath.Abs("../..")
	if err != nil {
		t.Fatal(err)
	}
	var out []errorText
	fset := token.NewFileSet()
	err = filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() {
			if name := d.Name(); path != root && (strings.HasPrefix(name, ".") || name == "testdata") {
				return filepath.SkipDir
			}
			return nil
		}
		if !strings.HasSuffix(path, ".go") || strings.HasSuffix(path, "_test.go") {
			return nil
		}
		f, err := parser.ParseFile(fset, path, nil, 0)
		if err != nil {
			return err
		}
		rel, _ := filepath.Rel(root, filepath.Dir(path))
		for _, decl := range f.Decls {
			exported := false
			if fd, ok := decl.(*ast.FuncDecl); ok {
				exported = fd.Name.IsExported()
			}
			// A text given as a field of a typed error (GridError{Err: …})
			// takes the prefix of that type's Error method.
			inField := map[ast.Node]bool{}
			ast.Inspect(decl, func(n ast.Node) bool {
				if kv, ok := n.(*ast.KeyValueExpr); ok {
					inField[kv.Value] = true
				}
				call, ok := n.(*ast.CallExpr)
				if !ok || len(call.Args) == 0 {
					return true
				}
				sel, ok := call.Fun.(*ast.SelectorExpr)
				if !ok {
					return true
				}
				x, ok := sel.X.(*ast.Ident)
				if !ok || !(x.Name == "errors" && sel.Sel.Name == "New" || x.Name == "fmt" && sel.Sel.Name == "Errorf") {
					return true
				}
				lit, ok := call.Args[0].(*ast.BasicLit)
				if !ok || lit.Kind != token.STRING || inField[call] {
					return true
				}
				s, err := strconv.Unquote(lit.Value)
				if err != nil {
					return true
				}
				out = append(out, errorText{pos: fset.Position(lit.Pos()).String(), pkg: f.Name.Name, dir: filepath.ToSlash(rel),
					exported: exported, text: s})
				return true
			})
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if len(out) < 100 {
		t.Fatalf("found %d error texts: the walk missed the tree", len(out))
	}
	return out
}

// Every error text starts lower-case (DEVELOPERS.md, rules of the house).
func TestErrorTextsStartLowerCase(t *testing.T) {
	for _, e := range errorTexts(t) {
		r, _ := utf8.DecodeRuneInString(e.text)
		if unicode.IsUpper(r) {
			t.Errorf("%s: error %q starts upper-case", e.pos, e.text)
		}
	}
}

// fieldPathOwners are the packages whose errors name the scenario field
// they are about first (orbit.tle: …, body.sensors[2]: …); the command line
// adds the file name before it.
var fieldPathOwners = map[string]bool{"scenario": true, "scenario/study": true, "scenario/season": true}

// An exported function's error text starts with its package name, or wraps
// (%w) an error that does.

func TestExportedErrorsNameTheirPackage(t *testing.T) {
	for _, e := range errorTexts(t) {
		if !e.exported || e.pkg == "main" || strings.HasPrefix(e.dir, "internal/") || fieldPathOwners[e.dir] {
			continue
		}
		if strings.HasPrefix(e.text, e.pkg+": ") || strings.HasPrefix(e.text, "%") || strings.Contains(e.text, "%w") {
			continue
		}
		t.Errorf("%s: error %q in an exported function of package %s does not start with %q", e.pos, e.text, e.pkg, e.pkg+": ")
	}
}
