package tui

import (
	"go/ast"
	"go/parser"
	"go/token"
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
// part of the screen that wants to be a component of its own.
func TestFunctionsShort(t *testing.T) {
	files, err := filepath.Glob("*.go")
	if err != nil {
		t.Fatal(err)
	}
	fs := token.NewFileSet()
	checked := 0
	for _, name := range files {
		if strings.HasSuffix(name, "_test.go") {
			continue
		}
		f, err := parser.ParseFile(fs, name, nil, 0)
		if err != nil {
			t.Fatal(err)
		}
		for _, d := range f.Decls {
			fd, ok := d.(*ast.FuncDecl)
			if !ok || fd.Body == nil {
				continue
			}
			checked++
			n := fs.Position(fd.End()).Line - fs.Position(fd.Pos()).Line + 1
			if n > 80 && !tables[fd.Name.Name] {
				t.Errorf("%s: %s is %d lines (at most 80 outside tables)", name, fd.Name.Name, n)
			}
		}
	}
	if checked < 100 {
		t.Errorf("only %d functions checked", checked)
	}
}
