package tui

import (
	"strings"

	"argand/calc"
	"argand/reduce/sheet"
)

// callAt finds the call the cursor is in: the innermost "name(" not yet
// closed before pos, the index of the argument being typed, and the
// parameter it names when written as "name = ". ok is false outside a
// call. It reads tokens only, so it works on a line still being typed.
// Under the decimal comma (comma set) ';' separates the arguments.
func callAt(src string, pos int, comma bool) (fun string, arg int, named string, ok bool) {
	type frame struct {
		fun   string
		arg   int
		named string
	}
	var stack []frame
	sc := calc.NewScannerComma(src[:pos], 0, comma)
	var prev calc.Item
	for n := 0; n < 10000; n++ {
		t := sc.Scan()
		if t.Tok == calc.TokEOF {
			break
		}
		if t.Tok == calc.TokOp {
			switch t.Text {
			case "(":
				f := frame{}
				if prev.Tok == calc.TokIdent {
					f.fun = prev.Text
				}
				stack = append(stack, f)
			case ")":
				if len(stack) > 0 {
					stack = stack[:len(stack)-1]
				}
			case ",":
				if len(stack) > 0 {
					stack[len(stack)-1].arg++
					stack[len(stack)-1].named = ""
				}
			case "=":
				if len(stack) > 0 && prev.Tok == calc.TokIdent {
					stack[len(stack)-1].named = prev.Text
				}
			}
		}
		prev = t
	}
	for i := len(stack) - 1; i >= 0; i-- {
		if stack[i].fun != "" {
			return stack[i].fun, stack[i].arg, stack[i].named, true
		}
	}
	return "", 0, "", false
}

// signature is the line shown under the entry line while the cursor is in
// a call: the function's parameters with the one being typed marked (by
// brackets, not by colour alone), and what that one takes.
func (m *Model) signature() string {
	if m.mode != modeLine {
		return ""
	}
	f := &m.line.f
	src := string(f.text[:f.pos])
	name, arg, named, ok := callAt(src, len(src), m.s.sh.Settings().Comma)
	if !ok {
		return ""
	}
	var fn *calc.Func
	for _, x := range sheet.Functions() {
		if x.Name == name {
			x := x
			fn = &x
			break
		}
	}
	if fn == nil || len(fn.Params) == 0 {
		if fn != nil {
			return m.tr(fn.Name + fn.ArgList())
		}
		return ""
	}
	cur := -1
	if named != "" {
		for i, p := range fn.Params {
			if p.Name == named {
				cur = i
			}
		}
	} else {
		cur = min(arg, len(fn.Params)-1)
		if arg >= len(fn.Params) && fn.Max >= 0 && fn.Max <= len(fn.Params) {
			cur = -1 // more arguments than it takes: none is marked
		}
	}
	open, closeMark := "«", "»"
	if m.opt.ASCII {
		open, closeMark = "<", ">"
	}
	parts := make([]string, len(fn.Params))
	for i, p := range fn.Params {
		s := p.Name
		if p.Optional {
			s = "[" + s + "]"
		}
		if i == cur {
			s = m.th.key.Render(m.tr(open + s + closeMark))
		} else {
			s = m.tr(s)
		}
		parts[i] = s
	}
	// the separator the user types: ';' under the decimal comma
	line := m.tr(fn.Name+"(") + strings.Join(parts, m.tr(m.sep()))
	if fn.Max < 0 || fn.Max > len(fn.Params) {
		line += m.tr(m.sep() + "...")
	}
	line += m.tr(")")
	if cur >= 0 {
		p := fn.Params[cur]
		what := p.Name
		if p.Kind != calc.ParamAny {
			what += ": " + p.Kind.String()
		}
		if p.Doc != "" {
			what += "; " + p.Doc
		}
		line += m.tr("   " + what)
	}
	return line
}
