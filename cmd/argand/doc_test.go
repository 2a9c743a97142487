package main

import (
	"go/ast"
	"go/parser"
	"go/token"
	"strconv"
	"strings"
	"testing"
)

// The command's doc comment is its usage: it names every flag parse
// reads, so a flag added to parse and not to the comment fails here.
func TestDocNamesEveryFlag(t *testing.T) {
	fs := token.NewFileSet()
	f, err := parser.ParseFile(fs, "main.go", nil, parser.ParseComments)
	if err != nil {
		t.Fatal(err)
	}
	doc := f.Doc.Text()
	var flags []string
	for _, d := range f.Decls {
		fd, ok := d.(*ast.FuncDecl)
		if !ok || fd.Name.Name != "parse" {
			continue
		}
		ast.Inspect(fd.Body, func(n ast.Node) bool {
			sw, ok := n.(*ast.SwitchStmt)
			if !ok {
				return true
			}
			if id, ok := sw.Tag.(*ast.Ident); !ok || id.Name != "name" {
				return true
			}
			for _, c := range sw.Body.List {
				for _, e := range c.(*ast.CaseClause).List {
					if lit, ok := e.(*ast.BasicLit); ok && lit.Kind == token.STRING {
						v, err := strconv.Unquote(lit.Value)
						if err != nil {
							t.Fatal(err)
						}
						flags = append(flags, "--"+v)
					}
				}
			}
			return false
		})
	}
	if len(flags) < 9 {
		t.Fatalf("found only %d flags in parse: %v", len(flags), flags)
	}
	for _, fl := range append(flags, "-h") {
		if !strings.Contains(doc, fl+" ") && !strings.Contains(doc, fl+",") && !strings.Contains(doc, fl+"\n") && !strings.Contains(doc, fl+")") && !strings.Contains(doc, fl+".") {
			t.Errorf("the command's doc comment does not name %s", fl)
		}
	}
}
