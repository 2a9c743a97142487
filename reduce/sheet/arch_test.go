package sheet

import (
	"go/ast"
	"go/parser"
	"go/token"
	"io/fs"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"argand/calc"
)

// sourceFiles parses the non-test Go files under dir (recursively when
// deep is set), with their paths.
func sourceFiles(t *testing.T, dir string, deep bool) (*token.FileSet, map[string]*ast.File) {
	t.Helper()
	fset := token.NewFileSet()
	files := map[string]*ast.File{}
	err := filepath.WalkDir(dir, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() {
			if path != dir && (!deep || d.Name() == "testdata") {
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
		files[path] = f
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	return fset, files
}

// tables are functions that are one table of data (the statements with
// their forms and help), exempt from the length bound.
var tables = map[string]bool{"keywordTable": true}

// No function of the interpreter is over 80 lines, tables apart: a longer
// one reads a line, evaluates and builds a step all at once, and wants
// splitting into parts that each say why.
func TestFunctionsShort(t *testing.T) {
	fset, files := sourceFiles(t, ".", false)
	checked := 0
	for name, f := range files {
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
	if checked < 150 {
		t.Errorf("only %d functions checked", checked)
	}
}

// ω = 2π·f is worked out in one place, calc.Context.Omega, so that every
// reactance and every ω shown agree to the last bit. A product of 2, π and
// anything else anywhere else in calc or reduce fails here (2·π/n, an
// angle step, is no frequency and passes), and so does π written out as
// digits.
func TestOmegaOnlyThroughContext(t *testing.T) {
	files := 0
	for _, dir := range []string{"../../calc", "../../reduce"} {
		fset, fs := sourceFiles(t, dir, true)
		files += len(fs)
		for path, f := range fs {
			for _, d := range f.Decls {
				fd, ok := d.(*ast.FuncDecl)
				if !ok || fd.Body == nil {
					continue
				}
				if fd.Name.Name == "Omega" && fd.Recv != nil && filepath.Base(filepath.Dir(path)) == "calc" {
					continue
				}
				for _, at := range twoPiProducts(fd.Body) {
					t.Errorf("%s: %s works out 2π times a value: take ω from calc.Context.Omega", fset.Position(at), fd.Name.Name)
				}
				ast.Inspect(fd.Body, func(n ast.Node) bool {
					if l, ok := n.(*ast.BasicLit); ok && isPi(l) {
						t.Errorf("%s: %s writes π as %s: use math.Pi", fset.Position(l.Pos()), fd.Name.Name, l.Value)
					}
					return true
				})
			}
		}
	}
	if files < 50 {
		t.Errorf("only %d files read", files)
	}
}

// twoPiProducts returns where a product has the factors 2, π (math.Pi or
// a literal 3.14159…) and at least one more.
func twoPiProducts(body ast.Node) []token.Pos {
	var out []token.Pos
	inner := map[ast.Node]bool{}
	ast.Inspect(body, func(n ast.Node) bool {
		b, ok := n.(*ast.BinaryExpr)
		if !ok || b.Op != token.MUL || inner[b] {
			return true
		}
		var factors []ast.Expr
		var flatten func(e ast.Expr)
		flatten = func(e ast.Expr) {
			if p, ok := e.(*ast.ParenExpr); ok {
				flatten(p.X)
				return
			}
			if m, ok := e.(*ast.BinaryExpr); ok && m.Op == token.MUL {
				inner[m] = true
				flatten(m.X)
				flatten(m.Y)
				return
			}
			factors = append(factors, e)
		}
		flatten(b)
		two, pi := false, false
		for _, x := range factors {
			switch {
			case isLitValue(x, "2", "2.0"):
				two = true
			case isPi(x):
				pi = true
			}
		}
		if two && pi && len(factors) > 2 {
			out = append(out, b.Pos())
		}
		return true
	})
	return out
}

// isLitValue reports a number literal written as one of vals.
func isLitValue(e ast.Expr, vals ...string) bool {
	l, ok := e.(*ast.BasicLit)
	if !ok {
		return false
	}
	for _, v := range vals {
		if l.Value == v {
			return true
		}
	}
	return false
}

// isPi reports math.Pi or π written as a literal.
func isPi(e ast.Expr) bool {
	if s, ok := e.(*ast.SelectorExpr); ok {
		id, ok := s.X.(*ast.Ident)
		return ok && id.Name == "math" && s.Sel.Name == "Pi"
	}
	l, ok := e.(*ast.BasicLit)
	return ok && l.Kind == token.FLOAT && strings.HasPrefix(l.Value, "3.14159")
}

// The rule of TestOmegaOnlyThroughContext, tried on code that breaks it
// and code that keeps it, so that it cannot pass by finding nothing.
func TestTwoPiProducts(t *testing.T) {
	for src, want := range map[string]int{
		"w := 2 * math.Pi * f":                   1,
		"w := 2*math.Pi*f":                       1,
		"w := math.Pi * 2 * f":                   1,
		"w := 2 * (math.Pi * f)":                 1,
		"w := 2 * 3.141592653589793 * hz":        1,
		"x := l * (2 * math.Pi * f)":             1,
		"step := 2 * math.Pi / float64(n)":       0,
		"f := w / (2 * math.Pi)":                 0,
		"b := 2*math.Pi + z[0]":                  0,
		"r := d * math.Pi / 180":                 0,
		"w := calc.Context{Freq: f}.Omega()":     0,
		"w := 2 * math.Pi * f; v := 2*math.Pi*g": 2,
	} {
		f, err := parser.ParseFile(token.NewFileSet(), "x.go", "package x\nfunc _() {"+src+"}", 0)
		if err != nil {
			t.Fatal(err)
		}
		if got := len(twoPiProducts(f)); got != want {
			t.Errorf("%s: %d products of 2π found, want %d", src, got, want)
		}
	}
}

// A line is parsed once: the only parser of the interpreter is made in
// Sheet.parser, called from exec alone (not in a loop), which ExecLine,
// Validate and execErr call; no statement reads its line again with
// another parser or scanner. Run's lines go through ExecLine.
func TestOneParsePerLine(t *testing.T) {
	_, files := sourceFiles(t, ".", false)
	makers := map[string]bool{"NewParser": true, "NewParserComma": true, "ParseExpr": true, "ParseExprComma": true, "NewScanner": true, "NewScannerComma": true}
	calls := map[string][]string{} // callee → the functions calling it
	for _, f := range files {
		for _, d := range f.Decls {
			fd, ok := d.(*ast.FuncDecl)
			if !ok || fd.Body == nil {
				continue
			}
			var loops []ast.Node
			ast.Inspect(fd.Body, func(n ast.Node) bool {
				if n == nil {
					return true
				}
				switch n.(type) {
				case *ast.ForStmt, *ast.RangeStmt, *ast.FuncLit:
					loops = append(loops, n)
				}
				c, ok := n.(*ast.CallExpr)
				if !ok {
					return true
				}
				sel, ok := c.Fun.(*ast.SelectorExpr)
				if !ok {
					return true
				}
				callee := sel.Sel.Name
				if id, ok := sel.X.(*ast.Ident); ok && id.Name == "calc" && makers[callee] {
					callee = "calc." + callee
				} else if callee != "parser" && callee != "exec" {
					return true
				}
				for _, l := range loops {
					if c.Pos() >= l.Pos() && c.End() <= l.End() {
						t.Errorf("%s calls %s inside a loop or function literal", fd.Name.Name, callee)
					}
				}
				calls[callee] = append(calls[callee], fd.Name.Name)
				return true
			})
		}
	}
	made := 0
	for callee, by := range calls {
		if strings.HasPrefix(callee, "calc.") {
			for _, f := range by {
				if f == "parser" {
					made++
				}
			}
			for _, f := range by {
				// namesOf scans the tokens of a line the runner skips or
				// that failed (see runner.run), never a line that runs
				if f != "parser" && f != "namesOf" {
					t.Errorf("%s called by %s: only Sheet.parser makes the parser of a line", callee, f)
				}
			}
		}
	}
	if made != 1 {
		t.Errorf("the line's parser is made in %d places, want 1 (Sheet.parser)", made)
	}
	if by := calls["parser"]; len(by) != 1 || by[0] != "exec" {
		t.Errorf("Sheet.parser called by %v, want exec once", by)
	}
	for _, by := range calls["exec"] {
		if by != "ExecLine" && by != "Validate" && by != "execErr" {
			t.Errorf("exec called by %s: a line runs through ExecLine (or Validate on a copy)", by)
		}
	}
	if len(calls["exec"]) == 0 {
		t.Error("no call of exec found")
	}
}

// The keyword table is the one list of statements: each entry is what the
// dispatcher finds for its word, is reserved (the first word of a two-word
// statement stays free for names), is allowed inside a network block
// exactly when the table says so, and documents its own form first.
func TestKeywordTableFeedsAll(t *testing.T) {
	s := New()
	for _, src := range []string{"resistor R9 = 1 Ω", "network blk reference gnd"} {
		if _, _, err := s.Exec(src); err != nil {
			t.Fatal(err)
		}
	}
	forms := blockForms()
	for i := range keywords {
		k := &keywords[i]
		words := k.word
		if k.second != "" {
			words += " " + k.second
		}
		if got := lookupKeyword(calc.NewParser(words+" x", 1)); got != k {
			t.Errorf("%q: the dispatcher found %v, not the table's entry", words, got)
		}
		why := s.Reserved(k.word)
		if k.second == "" && why != "a statement keyword" {
			t.Errorf("%s: reserved as %q, want a statement keyword", k.word, why)
		}
		if k.second != "" && why == "a statement keyword" {
			t.Errorf("%s: reserved as a statement keyword, but the statement is %s", k.word, words)
		}
		if len(k.help) == 0 || !strings.HasPrefix(k.help[0][0]+" ", words+" ") {
			t.Errorf("%s: the help does not begin with its form (%q)", words, k.help)
		}
		found := false
		for _, h := range StatementsHelp(k.topic) {
			found = found || h.Word == k.word && h.Form == k.help[0][0]
		}
		if !found {
			t.Errorf("%s: not in the help of topic %q", words, k.topic)
		}
		inBlockForms := strings.Contains(", "+forms+", ", ", "+words+", ")
		if k.where&inBlock != 0 && k.word != "end" && !inBlockForms || k.where&inBlock == 0 && inBlockForms {
			t.Errorf("%s: block forms %q disagree with the table", words, forms)
		}
		// inside the open block, a statement the table keeps outside is
		// refused for that reason, and one it allows is not
		err := s.Validate(words + " x")
		refused := err != nil && strings.Contains(err.Msg, "inside network blk a line is")
		if refused == (k.where&inBlock != 0) {
			t.Errorf("%s inside a network block: %v (table: allowed %v)", words, err, k.where&inBlock != 0)
		}
		if k.run == nil {
			t.Errorf("%s: nothing runs it", words)
		}
		if reflect.ValueOf(k.run).Pointer() == reflect.ValueOf(runElement).Pointer() {
			if kind, ok := elementKind(k.word); !ok || kind.String() != words {
				t.Errorf("%s: runs an element, of kind %v (%v)", words, kind, ok)
			}
		}
	}
	if len(keywords) < 20 {
		t.Errorf("only %d keywords", len(keywords))
	}
}

// No other list of statement words: outside keywords.go no switch case
// and no table (slice or map literal) names two or more statement
// keywords, which would be a second list to keep in step.
func TestNoSecondKeywordList(t *testing.T) {
	words := map[string]bool{}
	for _, k := range keywords {
		words[k.word] = true
	}
	fset, files := sourceFiles(t, ".", false)
	for name, f := range files {
		if filepath.Base(name) == "keywords.go" {
			continue
		}
		ast.Inspect(f, func(n ast.Node) bool {
			var elts []ast.Expr
			switch x := n.(type) {
			case *ast.CaseClause:
				elts = x.List
			case *ast.CompositeLit:
				for _, e := range x.Elts {
					if kv, ok := e.(*ast.KeyValueExpr); ok {
						elts = append(elts, kv.Key, kv.Value)
					} else {
						elts = append(elts, e)
					}
				}
			default:
				return true
			}
			var named []string
			for _, e := range elts {
				if l, ok := e.(*ast.BasicLit); ok && l.Kind == token.STRING && words[strings.Trim(l.Value, "\"`")] {
					named = append(named, l.Value)
				}
			}
			if len(named) >= 2 {
				t.Errorf("%s: a list of statement keywords %v outside the keyword table", fset.Position(n.Pos()), named)
			}
			return true
		})
	}
}

// describe lists the operands of an evaluation with the values the
// evaluation met: each call in a line is evaluated once, never again for
// the step. The counting function returns its argument, so the step's
// inputs show 2 and 3 and the value 6 (by hand).
func TestDescribeEvaluatesOnce(t *testing.T) {
	s := New()
	calls := 0
	s.funcTable()["tally"] = &calc.Func{Name: "tally", Args: "(x)", Doc: "returns x, counting its calls", Min: 1, Max: 1,
		Call: func(_ *calc.Context, args []calc.Arg) (calc.Result, error) {
			calls++
			return calc.Result{Value: args[0].Q}, nil
		}}
	steps, _, err := s.Exec("x = tally(2) * tally(3)")
	if err != nil {
		t.Fatal(err)
	}
	if calls != 2 {
		t.Errorf("tally called %d times for two calls in the line", calls)
	}
	st := steps[len(steps)-1]
	if len(st.Inputs) != 2 || st.Inputs[0].Value.V != 2 || st.Inputs[1].Value.V != 3 {
		t.Errorf("inputs %v, want tally(2) = 2 and tally(3) = 3", st.Inputs)
	}
	if len(st.Results) == 0 || st.Results[0].Value.V != 6 {
		t.Errorf("results %v, want x = 6", st.Results)
	}
	calls = 0
	if _, _, err := s.Exec("y = mag(tally(3 + j4))"); err != nil {
		t.Fatal(err)
	}
	if calls != 1 {
		t.Errorf("tally called %d times for one call nested in another", calls)
	}
}
