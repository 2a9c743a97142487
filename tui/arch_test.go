package tui

import (
	"go/ast"
	"go/parser"
	"go/token"
	"io/fs"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// The app reaches the engine through the worksheet interpreter alone: no
// package of the app imports anything under reduce but reduce/sheet, so
// the screen never works out again what the engine knows.
func TestImportsOnlySheet(t *testing.T) {
	if _, err := exec.LookPath("go"); err != nil {
		t.Skip("go command not found:", err)
	}
	out, err := exec.Command("go", "list", "-f", "{{.ImportPath}}:{{join .Imports \" \"}}", "argand/tui/...").CombinedOutput()
	if err != nil {
		t.Fatalf("go list: %v\n%s", err, out)
	}
	pkgs := 0
	for _, l := range strings.Split(strings.TrimSpace(string(out)), "\n") {
		pkg, imps, _ := strings.Cut(l, ":")
		pkgs++
		for _, imp := range strings.Fields(imps) {
			if (imp == "argand/reduce" || strings.HasPrefix(imp, "argand/reduce/")) && imp != "argand/reduce/sheet" {
				t.Errorf("%s imports %s: the app goes through argand/reduce/sheet only", pkg, imp)
			}
		}
	}
	if pkgs < 5 {
		t.Errorf("go list found only %d packages under argand/tui", pkgs)
	}
}

// tables are functions that are one table of data (every binding with its
// keys and help), exempt from the length bound.
var tables = map[string]bool{"DefaultKeyMap": true, "rowActions": true}

// No function of the app is over 80 lines, tables apart: a long one is a
// part of the screen that wants to be a component of its own. Every
// package under tui is checked.
func TestFunctionsShort(t *testing.T) {
	var files []string
	err := filepath.WalkDir(".", func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() && d.Name() == "testdata" {
			return filepath.SkipDir
		}
		if !d.IsDir() && strings.HasSuffix(p, ".go") && !strings.HasSuffix(p, "_test.go") {
			files = append(files, p)
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	fset := token.NewFileSet()
	checked, dirs := 0, map[string]bool{}
	for _, name := range files {
		f, err := parser.ParseFile(fset, name, nil, 0)
		if err != nil {
			t.Fatal(err)
		}
		dirs[filepath.Dir(name)] = true
		for _, d := range f.Decls {
			fd, ok := d.(*ast.FuncDecl)
			if !ok || fd.Body == nil {
				continue
			}
			checked++
			n := fset.Position(fd.End()).Line - fset.Position(fd.Pos()).Line + 1
			if n > 80 && !tables[fd.Name.Name] {
				t.Errorf("%s: %s is %d lines (at most 80 outside tables)", name, fd.Name.Name, n)
			}
		}
	}
	for _, d := range []string{".", "cli", "sketch", "serve", "store", "clip", "termbg", "record", "internal/golden", "internal/controls"} {
		if !dirs[filepath.FromSlash(d)] {
			t.Errorf("package directory %s not checked", d)
		}
	}
	if checked < 300 {
		t.Errorf("only %d functions checked", checked)
	}
}

// The line mode drives the controller without a screen: nothing in
// plain.go names the app's Model or makes one.
func TestLineModeWithoutModel(t *testing.T) {
	fset := token.NewFileSet()
	f, err := parser.ParseFile(fset, "plain.go", nil, 0)
	if err != nil {
		t.Fatal(err)
	}
	idents := 0
	ast.Inspect(f, func(n ast.Node) bool {
		if id, ok := n.(*ast.Ident); ok {
			idents++
			if id.Name == "Model" || id.Name == "New" {
				t.Errorf("%s: the line mode uses %s", fset.Position(id.Pos()), id.Name)
			}
		}
		return true
	})
	if idents < 100 {
		t.Errorf("only %d identifiers in plain.go", idents)
	}
}

// components are the parts of the screen: each has Update and View, and
// none holds or takes the Model.
var components = []string{"entryLine", "questions", "tableView", "trailView", "sketchPane", "netView", "helpScreen", "lockScreen", "exportMenu"}

func TestComponentsWithoutModel(t *testing.T) {
	fset := token.NewFileSet()
	pkgs, err := parser.ParseDir(fset, ".", func(fi fs.FileInfo) bool { return !strings.HasSuffix(fi.Name(), "_test.go") }, 0)
	if err != nil {
		t.Fatal(err)
	}
	methods := map[string]map[string]bool{}
	namesModel := func(n ast.Node) (found bool) {
		ast.Inspect(n, func(n ast.Node) bool {
			if _, ok := n.(*ast.SelectorExpr); ok {
				return false // another package's Model, such as help.Model
			}
			if id, ok := n.(*ast.Ident); ok && id.Name == "Model" {
				found = true
			}
			return !found
		})
		return found
	}
	isComponent := map[string]bool{}
	for _, c := range components {
		isComponent[c] = true
		methods[c] = map[string]bool{}
	}
	for _, f := range pkgs["tui"].Files {
		for _, d := range f.Decls {
			switch d := d.(type) {
			case *ast.GenDecl:
				for _, sp := range d.Specs {
					if ts, ok := sp.(*ast.TypeSpec); ok && isComponent[ts.Name.Name] && namesModel(ts.Type) {
						t.Errorf("%s holds the Model", ts.Name.Name)
					}
				}
			case *ast.FuncDecl:
				if d.Recv == nil {
					continue
				}
				rt := d.Recv.List[0].Type
				if st, ok := rt.(*ast.StarExpr); ok {
					rt = st.X
				}
				if id, ok := rt.(*ast.Ident); ok && isComponent[id.Name] {
					methods[id.Name][d.Name.Name] = true
					if namesModel(d.Type) {
						t.Errorf("%s.%s takes the Model", id.Name, d.Name.Name)
					}
				}
			}
		}
	}
	for _, c := range components {
		if !methods[c]["View"] {
			t.Errorf("%s has no View", c)
		}
		if !methods[c]["Update"] && c != "sketchPane" {
			t.Errorf("%s has no Update", c)
		}
	}
}
