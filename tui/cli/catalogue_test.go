package cli

import (
	"bytes"
	"encoding/json"
	"fmt"
	"strings"
	"testing"
	"unicode/utf8"

	"argand/calc"
	"argand/reduce/sheet"
)

// catalogue is a list of malformed inputs. Each is the last line of a
// worksheet whose earlier lines are good (pre, then two fixed lines), so
// the test also sees that the work before the bad line was printed.
var catalogue = []struct {
	name string
	pre  []string // lines before the two fixed good lines, if the case needs them
	src  string   // the bad line
	msg  string   // substring of the message
	col  int
}{
	{"unclosed paren", nil, "(1+2", "'(' is never closed", 1},
	{"unopened paren", nil, "1+2)", "')' without a matching '('", 4},
	{"unclosed nested", nil, "((1)", "'(' is never closed", 1},
	{"unclosed call", nil, "mag(3+j4", "never closed", 4},
	{"empty parens", nil, "()", "empty parentheses", 2},
	{"dangling plus", nil, "1 +", "operand is missing", 4},
	{"leading times", nil, "* 2", "operand is missing", 1},
	{"two operators", nil, "1 * / 2", "operand is missing", 5},
	{"dangling parallel", nil, "1 ||", "operand is missing", 5},
	{"single bar", nil, "1 | 2", "write || for parallel", 3},
	{"unknown unit", nil, "3 xyz", "unexpected \"xyz\"", 3},
	{"unknown unit glued", nil, "3xyz", "unknown unit \"xyz\"", 2},
	{"unknown function", nil, "foo(2)", "unknown function \"foo\"", 1},
	{"prefix after a space", nil, "10 k", "prefix \"k\" must follow the number directly", 4},
	{"rare prefix glued", nil, "10E", "not read as a prefix", 3},
	{"rare prefix P glued", nil, "3P", "not read as a prefix", 2},
	{"upper-case K alone", nil, "4.7K", "K is no SI prefix", 4},
	{"milli or mega watts", nil, "2 mw", "milli or mega", 3},
	{"milli or mega volt-amperes", nil, "2 mva", "milli or mega", 3},
	{"milli or mega vars", nil, "2 mvar", "milli or mega", 3},
	{"milli or mega hertz", nil, "2 mhz", "milli or mega", 3},
	{"code letter after a decimal point", nil, "4.7R", "code letter for Ω", 4},
	{"zero-width space", nil, "3\u200b+ 4", "invisible character U+200B", 2},
	{"byte-order mark inside a line", nil, "3 +\ufeff4", "invisible character U+FEFF", 4},
	{"unit without number", nil, "mS", "unknown name \"mS\"", 1},
	{"ohm without number", nil, "Ω * 2", "unknown name \"Ω\"", 1},
	{"V plus ohm", nil, "1 V + 2 Ω", "cannot combine V + Ω", 5},
	{"A minus V", nil, "2 A - 1 V", "cannot combine A − V", 5},
	{"Hz times H", nil, "50 Hz * 10 mH", "use omega(f)", 7},
	{"Hz times F", nil, "1 / (50 Hz * 1 µF)", "Hz counts cycles", 12},
	{"division by zero", nil, "1/0", "division by zero", 2},
	{"reciprocal of zero", nil, "recip(0)", "division by zero", 1},
	{"polar without angle", nil, "5∠", "angle missing", 2},
	{"ascii polar without angle", nil, "5@", "angle missing", 2},
	{"second angle", nil, "5∠∠3", "operand is missing", 3},
	{"overflow", nil, "1e308*1e308", "overflow", 6},
	{"number too large", nil, "1e400", "number too large", 1},
	{"unknown name", nil, "nosuch + 1", "unknown name \"nosuch\"", 1},
	{"reserved statement word", nil, "language = 1", "\"language\" is reserved", 1},
	{"language too new", nil, "language 99", "use a newer argand", 10},
	{"language not a number", nil, "language two", "whole number", 10},
	{"reserved keyword", nil, "frequency = 2", "\"frequency\" is reserved", 1},
	{"reserved constant", nil, "pi = 3", "\"pi\" is reserved", 1},
	{"reserved function", nil, "sqrt = 3", "\"sqrt\" is reserved", 1},
	{"frequency zero", nil, "frequency 0 Hz", "greater than 0", 11},
	{"frequency negative", nil, "frequency -50 Hz", "greater than 0", 11},
	{"frequency wrong unit", nil, "frequency 10 Ω", "Hz or rad/s", 11},
	{"digits out of range", nil, "digits 99", "1 to 17", 8},
	{"basis unknown", nil, "basis wobble", "rms or peak", 7},
	{"too many arguments", nil, "mag(1, 2)", "takes 1 argument", 1},
	{"too few arguments", nil, "atan2(1)", "takes 2 argument", 1},
	{"root without unit", nil, "sqrt(1 V)", "no whole unit", 1},
	{"log of zero", nil, "ln(0)", "logarithm of 0", 1},
	{"tan at 90", nil, "tan(90)", "infinite", 1},
	{"stray character", nil, "3 $ 4", "unexpected character '$'", 3},
	{"two units on a phasor", nil, "1 V ∠30 Ω", "two units", 1},
	{"function without call", nil, "mag + 1", "is a function", 1},
	{"nothing after equals", nil, "x = ", "nothing after '='", 5},
	{"open circuit", nil, "j10 Ω || -j10 Ω", "open circuit", 7},
	{"inductor given ohms", nil, "zl(10 Ω)", "takes an inductance in H, got a resistance", 4}, // at the argument, naming both kinds
	{"unit with power", nil, "(10 Ω)^0.5", "no whole unit", 7},
	{"end without network", nil, "end", "without an open network", 1},
	{"resistor in volts", nil, "resistor R1 = 10 V", "in Ω", 15},
	{"check of unlike units", nil, "check 1 Ω is 1 V", "the units differ", 14},
	{"circular definition", []string{"p = 1", "q = p + 1"}, "p = q", "circular", 1},
	{"value called", []string{"r = 2"}, "r(3)", "is a value, not a function", 1},
	{"comma", nil, "1,2", "decimal comma? write 1.2, or set decimal comma", 1},
	{"comma alone", nil, "1,", "unexpected \",\"", 2},
	{"invalid UTF-8", nil, "1 + \xff2", "invalid UTF-8", 5},
	{"invalid UTF-8 after multibyte", nil, "Ω\xfe", "invalid UTF-8", 2},
	{"10 MB line", nil, "1+" + strings.Repeat(" ", 10<<20) + "1", "line too long", 1},
	{"100 000 nested parentheses", nil, strings.Repeat("(", 100000) + "1" + strings.Repeat(")", 100000), "line too long", 1},
	{"deep nesting within the line limit", nil, strings.Repeat("(", 30000) + "1" + strings.Repeat(")", 30000), "nested too deeply", 200},
	{"deep unary minus", nil, strings.Repeat("-", 30000) + "1", "nested too deeply", 200},
	// the decimal marker (SI Brochure 9th ed. §5.4.4: the point or the
	// comma on the line; digit groups written with a space)
	{"decimal comma under the point", nil, "L = 2,2 mH", "decimal comma? write 2.2 mH, or set decimal comma", 5},
	{"decimal comma in a call", nil, "max(2,2)", "(for two arguments write 2, 2)", 5},
	{"decimal comma in a function of parts", nil, "parallel(2,2 kΩ, 4,7 kΩ)", "decimal comma? write 2.2 kΩ, or set decimal comma", 10},
	{"comma and three digits", nil, "1,000 V", `"1,000 V" reads two ways: 1.000 V with a decimal comma, or 1 000 V with the , grouping digits`, 1},
	{"digit groups with commas", nil, "1,000,000 Ω", "digit groups are written with a space (SI Brochure §5.4.4): write 1 000 000 Ω", 1},
	{"semicolon under the point", nil, "max(2; 3)", "';' separates arguments only with the decimal comma set", 6},
	{"decimal point under the comma", []string{"decimal comma"}, "L = 2.2 mH", "decimal point? write 2,2 mH, or set decimal point", 5},
	{"point and three digits under the comma", []string{"decimal comma"}, "1.000 V", "1,000 V with a decimal point, or 1 000 V with the . grouping digits", 1},
	{"comma between arguments under the comma", []string{"decimal comma"}, "max(2, 3)", "separate arguments with ';'", 6},
	{"decimal setting misspelt", nil, "decimal dot", "decimal takes comma or point", 9},
}

// good are the two lines every catalogue worksheet starts with; their
// results must be printed before the error.
const good = "a_ok = 230 V\nb_ok = a_ok / (3+j4 Ω)\n"

func TestCatalogue(t *testing.T) {
	if len(catalogue) < 40 {
		t.Fatalf("catalogue has %d entries, want at least 40", len(catalogue))
	}
	for _, c := range catalogue {
		t.Run(c.name, func(t *testing.T) {
			pre := ""
			for _, l := range c.pre {
				pre += l + "\n"
			}
			line := len(c.pre) + 3
			ws := pre + good + c.src + "\n" + "c_after = 1 V\n"

			// the interpreter: message, line, column
			s := sheet.New()
			var got []calc.Step
			sum, err := s.Run(strings.NewReader(ws), func(st []calc.Step) { got = append(got, st...) })
			if err != nil {
				t.Fatalf("Run: %v", err)
			}
			e := sum.Err
			if e == nil {
				t.Fatalf("no error for %.60q", c.src)
			}
			if !strings.Contains(e.Msg, c.msg) {
				t.Errorf("message %q, want it to contain %q", e.Msg, c.msg)
			}
			if e.Line != line || e.Col != c.col {
				t.Errorf("at line %d col %d, want line %d col %d (%s)", e.Line, e.Col, line, c.col, e.Msg)
			}
			if n := utf8.RuneCountInString(c.src); e.Col < 1 || e.Col > n+1 {
				t.Errorf("column %d outside the line (1…%d)", e.Col, n+1)
			}
			var names []string
			for _, st := range got {
				if r, ok := st.Result(); ok {
					names = append(names, r.Name)
				}
			}
			// every line not depending on the bad one runs (issue 10)
			if !contains(names, "a_ok") || !contains(names, "b_ok") || !contains(names, "c_after") {
				t.Errorf("steps emitted for %v; want a_ok, b_ok and c_after", names)
			}

			// the caret sits under the marked character (a long line
			// is shown around it)
			if sum.ErrSrc != "" {
				caret := strings.Split(calc.Caret(sum.ErrSrc, e), "\n")
				src, shown := sum.ErrSrc, []rune(caret[0])
				off := len(strings.TrimRight(caret[len(caret)-1], "^"))
				ok := len(caret) == 2 && strings.HasSuffix(caret[1], "^") && off <= len(shown)
				i := 0 // the byte where column e.Col starts, an invalid byte a column
				for col := 1; col < e.Col && i < len(src); col++ {
					_, w := utf8.DecodeRuneInString(src[i:])
					i += w
				}
				if ok && i < len(src) && off < len(shown) {
					_, w := utf8.DecodeRuneInString(src[i:])
					ok = strings.HasPrefix(string(shown[off:]), calc.Printable(src[i:i+w]))
				}
				if !ok && !strings.Contains(src[:i], "\t") {
					t.Errorf("caret %q not under column %d of %q", caret[len(caret)-1], e.Col, caret[0])
				}
			}

			// the command line: steps before the bad line printed, exit 2,
			// the error located, no panic or stack trace
			var out, errb bytes.Buffer
			code := Run(strings.NewReader(ws), "cat.argand", &out, &errb, Options{})
			if code != ExitBadInput {
				t.Errorf("exit code %d, want %d", code, ExitBadInput)
			}
			if !strings.Contains(out.String(), "→ a_ok = 230.0 V") && !strings.Contains(out.String(), "→ a_ok = 230,0 V") || !strings.Contains(out.String(), "→ b_ok = ") {
				t.Errorf("results before the bad line missing from the output:\n%.400s", out.String())
			}
			if !strings.Contains(out.String(), "c_after") {
				t.Errorf("the line after the error was not run")
			}
			if !strings.Contains(out.String(), fmt.Sprintf("1 error: line %d", line)) {
				t.Errorf("no summary naming line %d:\n%.400s", line, out.String())
			}
			wantHead := fmt.Sprintf("error: cat.argand:%d:%d: ", line, c.col)
			if !strings.HasPrefix(errb.String(), wantHead) {
				t.Errorf("stderr starts %.80q, want %q", errb.String(), wantHead)
			}
			for _, bad := range []string{"panic", "goroutine", "runtime error", "NaN", "Inf"} {
				if strings.Contains(out.String()+errb.String(), bad) {
					t.Errorf("output contains %q", bad)
				}
			}
			if sum.ErrSrc != "" && utf8.ValidString(sum.ErrSrc) && len(sum.ErrSrc) < 200 {
				lines := strings.Split(strings.TrimRight(errb.String(), "\n"), "\n")
				wantCaret := "  " + strings.Repeat(" ", c.col-1) + "^"
				if len(lines) != 3 || !strings.HasPrefix(lines[2], wantCaret) {
					t.Errorf("caret lines %q, want the caret at column %d", lines, c.col)
				}
			}

			// JSON: one error object with error, line, col
			out.Reset()
			errb.Reset()
			code = Run(strings.NewReader(ws), "cat.argand", &out, &errb, Options{JSON: true})
			if code != ExitBadInput {
				t.Errorf("--json exit code %d", code)
			}
			outLines := strings.Split(strings.TrimRight(out.String(), "\n"), "\n")
			last := ""
			for _, l := range outLines {
				if strings.HasPrefix(l, `{"error"`) {
					last = l
				}
			}
			var je struct {
				Error     string
				Line, Col int
			}
			if err := json.Unmarshal([]byte(last), &je); err != nil || je.Error == "" || je.Line != line || je.Col != c.col {
				t.Errorf("JSON error line %.200q: %+v %v", last, je, err)
			}
		})
	}
}

func contains(xs []string, x string) bool {
	for _, y := range xs {
		if y == x {
			return true
		}
	}
	return false
}

// TestCatalogueEval: the same inputs as arguments of argand eval fail with
// exit code 2 and the error at column of the argument.
func TestCatalogueEval(t *testing.T) {
	for _, c := range catalogue {
		if c.pre != nil || len(c.src) > 1000 {
			continue
		}
		var out, errb bytes.Buffer
		code := Eval([]string{"1 V", c.src}, &out, &errb, Options{})
		if code != ExitBadInput {
			t.Errorf("%s: exit %d", c.name, code)
		}
		if want := fmt.Sprintf("argument:2:%d: ", c.col); !strings.Contains(errb.String(), want) {
			t.Errorf("%s: stderr %q, want %q", c.name, errb.String(), want)
		}
		if !strings.Contains(out.String(), "1.000 V") {
			t.Errorf("%s: first argument's result not printed", c.name)
		}
	}
}

// TestEmptyInput: an empty worksheet or a worksheet of comments runs and
// exits 0 with nothing to show; an empty expression to eval is an error.
func TestEmptyInput(t *testing.T) {
	for _, ws := range []string{"", "\n\n", "# only a comment\n", "   \t\n"} {
		var out, errb bytes.Buffer
		if code := Run(strings.NewReader(ws), "empty", &out, &errb, Options{}); code != ExitOK || errb.Len() != 0 {
			t.Errorf("%q: exit %d, stderr %q", ws, code, errb.String())
		}
	}
	_, err := calc.ParseExpr("", 1)
	if err == nil || !strings.Contains(err.Msg, "empty input") || err.Col != 1 {
		t.Errorf("ParseExpr(\"\") error %v, want empty input at col 1", err)
	}
}

// TestLongLineNotCut: a line just within argand's limit (64 KiB, the size
// at which a standard line scanner gives up) is read whole, and one beyond
// it is an error naming its length; nothing is cut short silently.
func TestLongLineNotCut(t *testing.T) {
	n := calc.MaxLine - 20
	long := "x_long = " + strings.Repeat("1+", n/2) + "1" // within the limit
	var out, errb bytes.Buffer
	code := Run(strings.NewReader(long+"\ncheck x_long is "+fmt.Sprint(n/2+1)+" within 0%\n"), "long", &out, &errb, Options{JSON: true})
	if code != ExitOK {
		t.Fatalf("exit %d: %s %s", code, errb.String(), out.String()[max(0, out.Len()-300):])
	}
	tooLong := "x = 1" + strings.Repeat(" ", calc.MaxLine) + "+1"
	out.Reset()
	code = Run(strings.NewReader("a_ok = 1\n"+tooLong+"\n"), "long", &out, &errb, Options{JSON: true})
	if code != ExitBadInput || !strings.Contains(out.String(), "line too long: "+fmt.Sprint(len(tooLong))+" bytes") {
		t.Errorf("exit %d: %.300s", code, out.String())
	}
}

// TestErrorOnEarlierLine: an error found at "end" but placed on the line
// of its network block names that line and draws the caret under it.
func TestErrorOnEarlierLine(t *testing.T) {
	ws := "network B\nresistor A0 = 10 Ω from x to y\nend\n"
	var out, errb bytes.Buffer
	code := Run(strings.NewReader(ws), "n", &out, &errb, Options{})
	if code != ExitBadInput {
		t.Fatalf("exit %d", code)
	}
	lines := strings.Split(strings.TrimSpace(errb.String()), "\n")
	if !strings.HasPrefix(lines[0], "error: n:1:1: network B") || len(lines) != 3 || lines[1] != "  network B" || lines[2] != "  ^^^^^^^" {
		t.Errorf("stderr %q, want line 1 named with the caret under it", errb.String())
	}
}
