package cli

import (
	"fmt"
	"io"
	"strings"

	"argand/calc"
	"argand/reduce/sheet"
)

// Safety returns the safety text for help, wrapped for a terminal, and
// the whole caution of each particular topic after it.
func Safety() string {
	text := strings.Join(wrap(calc.SafetyText, 76), "\n") + "\n"
	for _, c := range calc.Cautions() {
		if c == calc.CautionMains {
			continue
		}
		text += "\n" + c.String() + "\n  " + strings.Join(wrap(c.Text(), 74), "\n  ") + "\n"
	}
	return text
}

const usage = `argand: AC circuit work with phasors, step by step.

usage:
  argand                 open the app (last session, or the example at first)
  argand FILE            open a worksheet in the app
  argand eval EXPR...    evaluate each argument in turn, print every step;
                         the first bad one stops it (exit 2)
  argand run FILE        run a worksheet (- for standard input), every step
  argand help [TOPIC]    topics: language, functions, networks, safety, or a
                         function or statement name (argand help acos)
  argand serve [FLAGS]   serve the app over SSH (127.0.0.1:2222; serve --help)
  argand export --html OUT.html [--date YYYY-MM-DD] [WORKSHEET]
                         write a job record: one HTML file, no script, no
                         outside resources; every step in both forms,
                         diagrams, checks, cautions and the worksheet itself
                         (default: the saved session; - for standard input;
                         the date is today unless given)
  argand export --source RECORD.html
                         print the worksheet a record holds (argand run
                         replays it)
  argand --version

flags:
  --json       one JSON object per line (same in every locale)
  --csv        tables and results as CSV (RFC 4180, units in the headers,
               numbers exact with a point; checks' summary on stderr)
  --digits N   significant figures shown (1 to 17, default 4)
  --ascii      ASCII only: ohm, u, @, deg (automatic in a non-UTF-8 locale)
  --polar      show the polar form first
  --plain      line-by-line mode instead of the full-screen app (also TERM=dumb)
  --new        start a new, empty session; the last one is kept as a worksheet
               file beside the session file, and the app says where
  --decimal-comma  numbers typed and shown as 2,2 mH, ';' between arguments
               (a worksheet's own decimal statement rules; JSON is unchanged)

exit codes: 0 ok, 1 a check failed, 2 bad input or usage, 130 interrupted (ctrl+c).
`

const language = `worksheet language (one statement a line, # starts a comment)

numbers and units
  4.7 kΩ   4.7 kohm   10 mH   100 nF   230 V   2.5 A   1.2 kW   300 var   5 kVA
  prefixes f p n µ (or u) m k M G T
  units Ω ohm S H F V A W var VA J C Hz s m rad deg ° % hp hp_metric
  hp is 745.7 W (550 ft·lbf/s), hp_metric 735.5 W (75 kgf·m/s)
  a word after a number is read, in this order, as
    1 an exact unit               10 m is ten metres, 1 ms a millisecond
    2 an exact prefix and unit    1 mS a millisiemens, 5 mW
    3 a letter-and-digit code     (IEC 60062) the letter is the decimal sign:
        R K M G T give Ω          47R  0R1  4R7  4K7  47K  2M2  1G5
        p n µ m give F            4n7  6p8  2µ2  1m5
        also 4k7 and 2u2 (common practice)
    4 a prefix alone, only f p n u µ m k M G T, straight after the number:
        4.7k || 10k, 330n * 2, 1M are plain numbers; one takes the unit its
        parameter expects (zc(100n) is 100 nF) and Ω beside an impedance in
        + − || series (4k7 || 10k); a note says which reading was taken
        (read "4.7k" as 4.7×10^3, a plain number); 1.2k ohm is 1.2 kΩ
    5 a unit in another case, the prefix keeping its case, with a note:
        230 v  6.2 a  50 hz  1.2 kw  5 kva  300 VAr  kVAr  Ohm  kOhm  10 uf
        mh mv ma are milli; K before a unit is read as k (4.7 KΩ);
        mw mva mvar mhz are refused: write mW or MW (milli or mega?)
  a z y r q E P Z Y R Q alone are never prefixes: write 3e15, not 3P
  10 µF || 4.7 kΩ, 4.7 kΩ + 10 mH, series(22 mH, 150 Ω): a part value beside
  an impedance is its impedance at the working frequency (a step line says)
  Ω may be typed as U+2126, µ as U+00B5; no-break, narrow and thin spaces are
  spaces; a lone CR ends a line; a byte-order mark starting a file is ignored
  A unit only follows a number, so a name may be a unit symbol: S = 230 V *
  6.2 A, capacitor C = 22 µF, m = 3 (a note says so the first time).
  Reserved: constants, function names, statement keywords, f, w and ω.
decimal marker: the point or the comma (SI Brochure 9th ed., §5.4.4)
  decimal point (the default): 2.2 mH, parallel(2.2 kΩ, 4.7 kΩ); 2,2 is
    refused with the exact fix (write 2.2, or 2, 2 for two arguments)
  decimal comma (statement, --decimal-comma, or the key , in the app):
    2,2 mH, 0,95, parallel(2,2 kΩ; 4,7 kΩ); 2.2 is refused likewise
  1,000 (or 1.000 under the comma) is refused with both readings listed;
    digit groups are written with a space: 1 000 000 V, 12 345,6 Ω
  The setting is saved in the session and in worksheets (after the language
  line), so they replay the same anywhere; JSON output never changes.
complex values
  3+j4 Ω      rectangular; the unit applies to both parts
  3-j4 kΩ     (and 3+4j, 3+i4 are the same forms); written without spaces
              it is one number; after - * / ^ write it in parentheses
  230∠-30° V  polar; @ is the ASCII stand-in (230@-30 V needs no quoting)
  a bare angle is in degrees (or radians after: angles rad)
operators, loosest first
  + -   then ||  (parallel: a + b || c is a + (b || c))   then * / · × ÷
  then unary -   then ∠   then ^ (principal value)
constants: pi (π), e, j; read-only names f (working Hz) and w (ω, rad/s)
`

const networks = `networks

node block: each element named, its kind a word, joining two named nodes
  network bench reference gnd
    voltage source Vs = 230∠0 V from gnd to a    # V(a) − V(gnd) = 230∠0 V
    current source Is = 1 A from gnd to b        # drives 1 A into b
    resistor R1 = 10 Ω from a to b
    inductor L1 = 50 mH from b to gnd
  end
  The network is solved at end and stays live: a new frequency or element
  value (R1 = 12 Ω) re-solves it. A series-parallel network with one source
  is reduced one combination at a time and worked back; any other network is
  solved by modified nodal analysis, with the KCL residual and power balance.
  Results: bench.R1.v, bench.R1.i, bench.R1.s, and node voltages bench.a.v.
  Element voltage is V(from) − V(to); current flows from → to through it.

compact series-parallel form over elements already defined
  network ladder = R1 + (L1 || (C1 + R2)) fed by 12 V
  Results: ladder.z, ladder.R1.v, ...

equivalents
  thevenin T = bench between a and gnd      # T, T.vth, T.zth, T.in

Δ–Y of a triangle (named in order around it), to step a bridge
  deltay bench2 = bench triangle R1 R2 R3   # new network, Y arms Y_node
`

// statements lists the statements of the language from the worksheet's
// keyword table, after the two forms that have no keyword.
func statements() string {
	return "statements\n" + statementLines(append([]sheet.StatementHelp{
		{Form: "NAME = EXPR", Doc: "define or redefine a named quantity"},
		{Form: "EXPR", Doc: "evaluate; the result gets a name such as Z3 or V2"}},
		append(sheet.StatementsHelp(""),
			// not statements: marks on a three-phase voltage, and a word of
			// the app and the line mode
			sheet.StatementHelp{Form: "l2l(400 V)  l2n(230 V)", Doc: "mark a three-phase voltage line-to-line or"},
			sheet.StatementHelp{Doc: "line-to-neutral: each three-phase function names"},
			sheet.StatementHelp{Doc: "which it takes (VLL, VLN), converts a value marked"},
			sheet.StatementHelp{Doc: "the other way with a note, and shows both forms"},
			sheet.StatementHelp{Form: "new session", Doc: "(app and line mode) a new, empty session; the old"},
			sheet.StatementHelp{Doc: "  one is kept as a worksheet file, said where"})...))
}

// statementLines writes statement forms with what they do beside them,
// a form too long for its column on a line of its own.
func statementLines(hs []sheet.StatementHelp) string {
	var b strings.Builder
	for _, h := range hs {
		n := len([]rune(h.Form))
		switch {
		case h.Doc == "":
			b.WriteString("  " + h.Form + "\n")
		case n > 22:
			b.WriteString("  " + h.Form + "\n" + strings.Repeat(" ", 25) + h.Doc + "\n")
		default:
			b.WriteString("  " + h.Form + strings.Repeat(" ", 23-n) + h.Doc + "\n")
		}
	}
	return b.String()
}

// Help prints help on a topic.
func Help(args []string, w, ew io.Writer, o Options) int {
	lang := language + statements()
	nets := networks + "\nnetwork statements\n" + statementLines(sheet.StatementsHelp("networks"))
	text := usage + "\n" + lang + "\n" + nets + "\nfunctions: argand help functions\n\nsafety\n" + Safety() + "\n"
	if len(args) > 0 {
		switch args[0] {
		case "language":
			text = lang
		case "networks":
			text = nets
		case "safety":
			text = Safety() + "\n"
		case "functions":
			text = FunctionList()
		default:
			t, ok := Topic(args[0])
			if !ok {
				fmt.Fprintf(ew, "argand: no help on %s; topics: language, functions, networks, safety, or a function or statement name\n", calc.Quoted(args[0]))
				return ExitBadInput
			}
			text = t
		}
	}
	if o.ASCII {
		text = calc.ASCIIText(text)
	}
	fmt.Fprint(w, text)
	return ExitOK
}

// Fields are the names of extra results (NAME.field) whose meaning is the
// same in every function that gives them: .s is always the complex power
// S = P + jQ and .sa always the apparent power |S| (IEC 60050-131, IEEE Std
// 1459-2010). A test holds every function to this list.
var Fields = [][2]string{
	{"p", "active power P in W"},
	{"q", "reactive power Q in var (> 0 lagging, inductive)"},
	{"s", "complex power S = P + jQ in VA"},
	{"sa", "apparent power |S| in VA"},
	{"pf", "power factor P/|S|, a plain number"},
	{"i", "current in A (a phasor where the angle is known, else |I|)"},
	{"z", "impedance in Ω"},
	{"y", "admittance in S"},
	{"rs", "series resistance in Ω"},
	{"xs", "series reactance in Ω (signed)"},
	{"rp", "parallel resistance in Ω"},
	{"xp", "parallel reactance in Ω (signed)"},
}

// Topic returns help on one name: a function (its parameters, what it
// computes and its formula) or a statement keyword (the lines of the
// language help that show it). ok is false when the name is neither.
func Topic(name string) (text string, ok bool) {
	name = strings.TrimSpace(name)
	for _, f := range sheet.Functions() {
		if f.Name != name {
			continue
		}
		var b strings.Builder
		b.WriteString(f.Name + f.ArgList() + "\n")
		for _, l := range wrap(f.Doc, 80-4) {
			b.WriteString("    " + l + "\n")
		}
		for _, p := range f.Params {
			line := p.Name
			if p.Kind != calc.ParamAny {
				line += ": " + p.Kind.String()
			}
			if p.Optional {
				line += " (optional)"
			}
			if p.Doc != "" {
				line += "; " + p.Doc
			}
			for i, l := range wrap(line, 80-6) {
				if i == 0 {
					b.WriteString("    " + l + "\n")
				} else {
					b.WriteString("      " + l + "\n")
				}
			}
		}
		if f.Formula != "" {
			b.WriteString("    formula: " + f.Formula + "\n")
		}
		if len(f.Words) > 0 {
			b.WriteString("    words it takes: " + strings.Join(f.Words, ", ") + "\n")
		}
		return b.String(), true
	}
	if name == "decimal" {
		// the setting has a paragraph of its own, given whole
		i := strings.Index(language, "decimal marker:")
		j := strings.Index(language, "complex values")
		return "statement decimal comma | decimal point\n" + language[i:j], true
	}
	var lines []string
	helpText := language + statements() + "\n" + networks + "\nnetwork statements\n" + statementLines(sheet.StatementsHelp("networks"))
	more := false // the lines of a form's help that follow it
	for _, l := range strings.Split(helpText, "\n") {
		f := strings.Fields(l)
		switch {
		case len(f) > 0 && (f[0] == name || len(f) > 1 && f[0]+" "+f[1] == name):
			lines, more = append(lines, strings.TrimSpace(l)), true
		case more && strings.HasPrefix(l, strings.Repeat(" ", 25)):
			lines = append(lines, "  "+strings.TrimSpace(l))
		default:
			more = false
		}
	}
	if len(lines) > 0 {
		return "statement " + name + "\n    " + strings.Join(lines, "\n    ") + "\n", true
	}
	return "", false
}

// FunctionList lists every function with its arguments and what it does,
// wrapped to 80 columns for a terminal of that width.
func FunctionList() string {
	var b strings.Builder
	b.WriteString("functions\n")
	b.WriteString("  arguments go in order, or by name after any in order: xfmr(S = 500 kVA,\n")
	b.WriteString("  V1 = 11 kV, V2 = 400 V, z = 4.5%, xr = 6); a parameter refuses a value of\n")
	b.WriteString("  the wrong kind (an active power in W is not an apparent power in VA); an\n")
	b.WriteString("  optional one may be left out by naming a later one: zcable(Rlen = 0.1 mΩ/m,\n")
	b.WriteString("  Xlen = 0.08 mΩ/m, length = 50 m, thetae = 70) takes n as not given\n\n")
	b.WriteString("fields of a result, one meaning in every function\n")
	for _, fl := range Fields {
		b.WriteString("  ." + fl[0] + strings.Repeat(" ", max(1, 6-len(fl[0]))) + fl[1] + "\n")
	}
	b.WriteString("\n")
	for _, f := range sheet.Functions() {
		fn := f
		b.WriteString("  " + f.Name + fn.ArgList() + "\n")
		for _, l := range wrap(f.Doc, 80-6) {
			b.WriteString("      " + l + "\n")
		}
		var ps []string
		for _, p := range f.Params {
			if p.Kind == calc.ParamWord || p.Kind == calc.ParamAny {
				continue
			}
			d := p.Name + ": " + p.Kind.String()
			if p.Doc != "" {
				d += ", " + p.Doc // such as "line-to-line voltage V_ab"
			}
			ps = append(ps, d)
		}
		if len(ps) > 0 {
			for _, l := range wrap(strings.Join(ps, "; "), 80-6) {
				b.WriteString("      " + l + "\n")
			}
		}
	}
	return b.String()
}

// wrap breaks text into lines of at most width characters at spaces.
func wrap(text string, width int) []string {
	var lines []string
	line := ""
	for _, w := range strings.Fields(text) {
		switch {
		case line == "":
			line = w
		case len([]rune(line))+1+len([]rune(w)) <= width:
			line += " " + w
		default:
			lines = append(lines, line)
			line = w
		}
	}
	if line != "" {
		lines = append(lines, line)
	}
	return lines
}

// UTF8Locale reports whether the locale variables ask for UTF-8. The first
// of LC_ALL, LC_CTYPE and LANG that is set decides, as in POSIX; none set
// is the C locale, which is ASCII.
func UTF8Locale(getenv func(string) string) bool {
	for _, k := range []string{"LC_ALL", "LC_CTYPE", "LANG"} {
		if v := getenv(k); v != "" {
			v = strings.ToLower(v)
			return strings.Contains(v, "utf-8") || strings.Contains(v, "utf8")
		}
	}
	return false
}
