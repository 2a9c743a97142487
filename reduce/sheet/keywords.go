package sheet

import (
	"strings"

	"argand/calc"
)

// keyword is one statement of the worksheet language, known by its first
// word. The one table below feeds the dispatcher (exec), the reserved
// words, the lines allowed inside a network block and the help, so that a
// statement added to it is reserved, run and documented at once.
type keyword struct {
	word string
	// second, when set, is the word that must follow (voltage source):
	// the first word alone stays free for names.
	second string
	// where says where the statement may stand.
	where place
	// help lists the statement's forms for the help text, each "form" and
	// "what it does" (a continuation line has an empty form). Statements
	// documented in the networks topic have topic "networks".
	help  [][2]string
	topic string
	run   func(s *Sheet, p *calc.Parser) error
}

// place says where a statement may stand.
type place uint8

const (
	outside place = 1 << iota // a line of the worksheet
	inBlock                   // a line inside network … end
)

// keywords is the statement table, in the order help lists it. It is
// filled once by init and never written again: the statements it names
// check new names against it, a cycle a plain initialiser cannot hold.
var keywords []keyword

func init() { keywords = keywordTable() }

// keywordTable is the table itself, one entry a statement; the length
// bound on functions does not apply to it.
func keywordTable() []keyword {
	return []keyword{
		{word: "frequency", where: outside, run: (*Sheet).stmtFrequency,
			help: [][2]string{{"frequency 60 Hz", "working frequency (or rad/s); dependent values follow"}}},
		{word: "basis", where: outside, run: (*Sheet).stmtBasis,
			help: [][2]string{{"basis rms | peak", "phasor basis (S = V·I* for RMS, ½·V·I* for peak)"}}},
		{word: "angles", where: outside, run: (*Sheet).stmtAngles,
			help: [][2]string{{"angles deg | rad", "angle unit shown and read"}}},
		{word: "digits", where: outside, run: (*Sheet).stmtDigits,
			help: [][2]string{{"digits N", "significant figures shown"}}},
		{word: "sequence", where: outside, run: (*Sheet).stmtSequence,
			help: [][2]string{{"sequence abc | acb", "phase sequence"}}},
		{word: "decimal", where: outside, run: (*Sheet).stmtDecimal,
			help: [][2]string{{"decimal comma | point", "decimal marker typed and shown from here on"}}},
		{word: "resistor", where: outside | inBlock, run: runElement,
			help: [][2]string{{"resistor R1 = 10 Ω", "element values that remember their kind:"}}},
		{word: "inductor", where: outside | inBlock, run: runElement,
			help: [][2]string{{"inductor L1 = 10 mH", "  an inductor's or capacitor's impedance follows"}}},
		{word: "capacitor", where: outside | inBlock, run: runElement,
			help: [][2]string{{"capacitor C1 = 1 µF", "  the working frequency"}}},
		{word: "impedance", where: outside | inBlock, run: runElement,
			help: [][2]string{{"impedance Z1 = 3+j4 Ω", ""}}},
		{word: "check", where: outside, run: (*Sheet).stmtCheck,
			help: [][2]string{
				{"check EXPR is EXPR [within 1% [and 0.5°]]", "compare with a hand calculation"},
				{"check EXPR is EXPR within 0.01 A", "absolute tolerance"}}},
		{word: "tolerance", where: outside, run: (*Sheet).stmtTolerance,
			help: [][2]string{{"tolerance R1 5%", "a part may lie within ±5 %"}}},
		{word: "spread", where: outside, run: (*Sheet).stmtSpread,
			help: [][2]string{
				{"spread [NAME =] EXPR", "range of EXPR over the tolerances (sampled)"},
				{"check EXPR reads 98.2 Ω within 1% + 2 digits of 0.1 Ω", ""},
				{"", "does a meter reading fit what the parts allow?"}}},
		{word: "sweep", where: outside, run: (*Sheet).stmtSweep,
			help: [][2]string{
				{"sweep EXPR from 10 Hz to 10 kHz [points N] [log|linear] [db [ref R]]", ""},
				{"", "table, plot, and what it found: smallest and largest"},
				{"", "|x|, resonances (angle crosses 0), half-power bands"},
				{"", "(peak/√2; √2·minimum at a dip); db: 20·log10(|x|/|R|),"},
				{"", "R = 1 for a ratio, stated for a value with a unit"}}},
		{word: "budget", where: outside, run: (*Sheet).stmtBudget,
			help: [][2]string{
				{"budget 60 s", "bound on a sweep's, spread's or reading check's"},
				{"", "  estimated work (10 s until set); past it the"},
				{"", "  statement is refused with the estimate"}}},
		{word: "spectrum", where: outside, run: (*Sheet).stmtSpectrum,
			help: [][2]string{
				{"spectrum I h1 100 A ∠ -20, h5 22 % ∠ 170, h7 12 %", ""},
				{"", "a harmonic spectrum: the RMS value of each order"},
				{"", "(a unit, or % of h1) and its angle where known;"},
				{"", "table, RMS, THD and a bar plot. Read by hrms thd"},
				{"", "tdd crest fhl kfactor avgmeter hpower bankcheck"},
				{"spectrum I from FILE", "the same from lines of: order, value, angle in"},
				{"", "degrees (such as 5, 22 %, 170); # starts a comment"}}},
		{word: "readings", where: outside, run: (*Sheet).stmtReadings,
			help: [][2]string{
				{"readings FILE", "measured values from a CSV file of rows name,value,unit"},
				{"", "  (V_R1,229.6,V; a header row name,value,unit optional;"},
				{"", "  # starts a comment); each becomes a name for check …"},
				{"", "  is and check … reads: check N.R1.v is V_R1 within 2%;"},
				{"", "  a relative FILE lies beside the worksheet"}}},
		{word: "language", where: outside, run: (*Sheet).stmtLanguage,
			help: [][2]string{
				{"language 3", "the input language a worksheet was written in; saved"},
				{"", "  worksheets begin with it, and lines that read"},
				{"", "  differently now are noted and listed"}}},
		{word: "title", where: outside, run: (*Sheet).stmtTitle,
			help: [][2]string{
				{"title Bay 3, feeder B", "the job's title: the rest of the line"},
				{"", "  (it heads the record of argand export --html)"}}},
		{word: "forget", where: outside, run: (*Sheet).stmtForget,
			help: [][2]string{{"forget NAME", "remove a value nothing else reads"}}},
		{word: "rename", where: outside, run: (*Sheet).stmtRename,
			help: [][2]string{{"rename OLD to NEW", "give a value a new name (nothing may read it)"}}},
		{word: "network", where: outside, run: (*Sheet).stmtNetwork, topic: "networks",
			help: [][2]string{
				{"network NAME reference NODE", "a node block: elements one a line, then end"},
				{"network NAME = R1 + (L1 || C1) fed by 12 V", "a compact series-parallel network"}}},
		{word: "voltage", second: "source", where: outside | inBlock, run: runElement, topic: "networks",
			help: [][2]string{{"voltage source Vs = 230∠0 V from gnd to a", "inside a network block"}}},
		{word: "current", second: "source", where: outside | inBlock, run: runElement, topic: "networks",
			help: [][2]string{{"current source Is = 1 A from gnd to b", "inside a network block"}}},
		{word: "end", where: outside | inBlock, run: (*Sheet).closeBlock, topic: "networks",
			help: [][2]string{{"end", "closes a network block and solves it"}}},
		{word: "thevenin", where: outside, run: (*Sheet).stmtThevenin, topic: "networks",
			help: [][2]string{{"thevenin T = NET between NODE and NODE", "Thevenin equivalent: T, T.vth, T.zth, T.in"}}},
		{word: "deltay", where: outside, run: (*Sheet).stmtDeltaY, topic: "networks",
			help: [][2]string{{"deltay NET2 = NET triangle R1 R2 R3", "a new network with the triangle as Y arms"}}},
	}
}

// runElement runs an element statement, inside the open network block
// when there is one.
func runElement(s *Sheet, p *calc.Parser) error { return s.stmtElement(p, s.open) }

// lookupKeyword returns the statement the parser's first tokens start, or
// nil for an expression or a definition. A word followed by '(' is a call
// of the function of that name and a word followed by '=' a definition (so
// that frequency = 2 is refused as a name, with the reason); both are told
// by the next token, without reading the line again.
func lookupKeyword(p *calc.Parser) *keyword {
	first := p.Peek()
	if first.Tok != calc.TokIdent {
		return nil
	}
	for i := range keywords {
		k := &keywords[i]
		if k.word != first.Text {
			continue
		}
		next := p.PeekNext()
		if k.second != "" {
			if next.Tok == calc.TokIdent && next.Text == k.second {
				return k
			}
			return nil
		}
		if next.Tok == calc.TokOp && (next.Text == "(" || next.Text == "=") {
			return nil
		}
		return k
	}
	return nil
}

// blockForms lists what may stand inside a network block, for its error.
func blockForms() string {
	var words []string
	for _, k := range keywords {
		if k.where&inBlock != 0 && k.word != "end" {
			w := k.word
			if k.second != "" {
				w += " " + k.second
			}
			words = append(words, w)
		}
	}
	return strings.Join(words, ", ")
}

// StatementHelp is one line of the statements' help: a form and what it
// does; a continuation line has an empty Form.
type StatementHelp struct {
	Word string // the statement's keyword
	Form string
	Doc  string
}

// StatementsHelp returns the help lines of the statements documented under
// topic ("" for the language topic, "networks"), in the table's order.
func StatementsHelp(topic string) []StatementHelp {
	var out []StatementHelp
	for _, k := range keywords {
		if k.topic != topic {
			continue
		}
		for _, h := range k.help {
			out = append(out, StatementHelp{Word: k.word, Form: h[0], Doc: h[1]})
		}
	}
	return out
}

// Keywords returns every statement keyword, in the table's order.
func Keywords() []string {
	out := make([]string, len(keywords))
	for i, k := range keywords {
		out[i] = k.word
	}
	return out
}
