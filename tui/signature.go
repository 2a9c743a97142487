package tui

import (
	"argand/calc"
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
