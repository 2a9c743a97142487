package calc

import (
	"math"
	"math/cmplx"
	"strconv"
	"strings"
)

// Basis says whether phasor magnitudes are RMS or peak values.
type Basis uint8

const (
	RMS Basis = iota
	Peak
)

func (b Basis) String() string {
	if b == Peak {
		return "peak"
	}
	return "rms"
}

// Operand is a named value taking part in a step. Name is "" for a literal.
type Operand struct {
	Name  string
	Value Quantity
}

// Row is one line of a table carried by a step, such as an element of a
// solved network with its voltage, current and power.
type Row struct {
	Name   string
	Values []Operand // each Operand.Name is the column key, such as "v"
	// Key is the value the row stands for, when it stands for one (a sweep
	// point's frequency): Name shows it rounded, and a table written for
	// another program takes it whole from here. Key.Name is "" when none.
	Key Operand
	// Note says why a row has no values (a pole at a sweep point).
	Note string
}

// CheckOutcome is the verdict of a check statement.
type CheckOutcome struct {
	Pass      bool
	Got       Quantity
	Want      Quantity
	Diff      Quantity // Got − Want
	RelMag    float64  // |Got|/|Want| − 1, or 0 when Want is 0
	DegDiff   float64  // angle of Got minus angle of Want, in (−180, 180]
	Tolerance string   // the tolerance as written, for the report
	// MagOnly marks a comparison of magnitudes alone (a meter reading
	// against a range): no angle is compared or reported.
	MagOnly bool
	// Scalar marks a comparison of two signed reals (P, Q, X, a count) by
	// their values: no angle is compared or reported.
	Scalar bool
}

// Step is one recorded piece of work: the statement as typed, the rule
// applied in words and in symbols, the operands and the results. The same
// record feeds the command line, JSON output and the app's trail, and a
// step never changes once made: the trail is history.
type Step struct {
	Kind    string // "eval", "define", "setting", "recompute", "check", "series", ...
	Line    int    // worksheet line, 0 when not from a file
	Source  string // the statement as typed
	Rule    string // the operation in words
	Formula string // the formula in symbols
	Inputs  []Operand
	Results []Operand // the first is the main result
	Rows    []Row
	Basis   Basis
	Notes   []string // warnings and remarks
	// Cautions are the safety topics of the result, each shown whole the
	// first time in a session and in one line after.
	Cautions []StepCaution
	Check    *CheckOutcome
}

// Result returns the main result and whether there is one.
func (s *Step) Result() (Operand, bool) {
	if len(s.Results) == 0 {
		return Operand{}, false
	}
	return s.Results[0], true
}

// asciiReplacer turns the symbols in rule and formula text into ASCII.
var asciiReplacer = strings.NewReplacer(
	"°C", "degC", "(°)", "(deg)", "Ω", "ohm", "±", "+/-", "α", "alpha", "β", "beta", "η", "eta", "τ", "tau",
	"λ", "lambda", "ρ", "rho", "σ", "sigma", "ε", "eps", "δ", "delta", "≠", "!=", "ₖ", "k", "ₙ", "n", "₀", "0",
	"⁰", "^0", "¹", "^1", "⁴", "^4", "⁵", "^5", "⁶", "^6", "⁷", "^7", "⁸", "^8", "⁹", "^9", "ᶻ", "^z", "′", "'",
	"“", "\"", "”", "\"", "‘", "'", "’", "'", "•", "*", "…", "...", "µ", "u", "μ", "u", "∠", "@", "°", " deg", "·", "*", "×", "*", "÷", "/",
	"−", "-", "√", "sqrt", "π", "pi", "ω", "w", "φ", "phi", "θ", "theta", "‖", "||",
	"≈", "~", "≤", "<=", "≥", ">=", "²", "^2", "³", "^3", "₁", "1", "₂", "2", "₃", "3",
	"→", "->", "←", "<-", "Σ", "sum", "Δ", "D", "∞", "inf", "—", "-", "–", "-", "⁻¹", "^-1",
	"½", "1/2", "…", "...", "│", "|", "─", "-", "ₐ", "a", "ᵦ", "b", "✓", "ok", "✗", "x",
)

// ASCIIText returns s with the symbols argand uses replaced by ASCII; any
// other non-ASCII character becomes '?', so the result is ASCII whatever
// text a user or a function supplied.
func ASCIIText(s string) string {
	return ASCIIOnly(asciiReplacer.Replace(s))
}

// ASCIIOnly replaces each non-ASCII character by '?', one for one, so that
// a caret under the text stays in place.
func ASCIIOnly(s string) string {
	for i := 0; i < len(s); i++ {
		if s[i] >= 0x80 {
			var b strings.Builder
			for _, r := range s {
				if r < 0x80 {
					b.WriteRune(r)
				} else {
					b.WriteByte('?')
				}
			}
			return b.String()
		}
	}
	return s
}

// Text writes the step for a person, in the given format, as indented
// lines: the statement, the rule and formula, each operand and each result
// in both forms.
func (s *Step) Text(f Format, polarFirst bool) string {
	var b strings.Builder
	// text from input is made printable before the ASCII spelling, so
	// that a control or bidirectional character shows as its escape, not
	// as '?'
	tr := func(x string) string {
		x = Printable(x)
		if f.ASCII {
			return ASCIIText(x)
		}
		return x
	}
	head := s.Source
	rule := s.Rule
	if head == "" {
		// a part of a larger calculation: its rule is its heading
		head, rule = s.Rule, ""
		if rule == "" && s.Formula != "" {
			head = s.Formula
		}
	}
	if s.Line > 0 {
		head = strconv.Itoa(s.Line) + ": " + head
	}
	b.WriteString(tr(head) + "\n")
	if rule != "" {
		b.WriteString("    " + tr(rule))
		if s.Formula != "" {
			b.WriteString(":  " + tr(s.Formula))
		}
		b.WriteString("\n")
	} else if s.Formula != "" && head != strconv.Itoa(s.Line)+": "+s.Formula && head != s.Formula {
		b.WriteString("    " + tr(s.Formula) + "\n")
	}
	for _, o := range s.Inputs {
		b.WriteString("      " + tr(o.Name) + " = " + f.Both(o.Value, polarFirst) + "\n")
	}
	for _, o := range s.Results {
		b.WriteString("    → " + tr(o.Name) + " = " + f.Both(o.Value, polarFirst) + "\n")
	}
	for _, r := range s.Rows {
		b.WriteString("    " + tr(r.Name))
		if len(r.Values) > 0 {
			b.WriteString(":")
		}
		for _, v := range r.Values {
			b.WriteString("  " + v.Name + " = " + f.Short(v.Value))
		}
		b.WriteString("\n")
	}
	if c := s.Check; c != nil {
		verdict := "PASS"
		if !c.Pass {
			verdict = "FAIL"
		}
		if c.MagOnly {
			b.WriteString("    " + verdict + ": read " + f.Mag(cmplx.Abs(c.Got.V), c.Got.Dim, c.Got.Kind) + ", nominal " + f.Mag(cmplx.Abs(c.Want.V), c.Want.Dim, c.Want.Kind) + "\n")
		} else {
			b.WriteString("    " + verdict + ": got " + f.Both(c.Got, polarFirst) + ", expected " + f.Both(c.Want, polarFirst) + "\n")
		}
		if c.Scalar {
			b.WriteString("      difference " + f.Rect(c.Diff) + "; " + f.mark(f.sig(c.RelMag*100, 3)) + " % of the expected value; tolerance " + tr(c.Tolerance) + "\n")
		} else if c.MagOnly {
			b.WriteString("      outside the range by " + f.Mag(real(c.Diff.V), c.Diff.Dim, c.Diff.Kind) + "; " + f.mark(f.sig(c.RelMag*100, 3)) + " % from the nominal magnitude; " + tr(c.Tolerance) + "\n")
		} else {
			ang := "angle " + f.angle(c.DegDiff)
			if c.Got.V == 0 || c.Want.V == 0 {
				ang = "no angle to compare (a zero has none)"
			}
			b.WriteString("      difference " + f.Polar(c.Diff) + "; magnitude " + f.mark(f.sig(c.RelMag*100, 3)) + " %, " + ang + "; tolerance " + tr(c.Tolerance) + "\n")
		}
	}
	for _, n := range s.Notes {
		// a note of several lines (a plot) keeps its shape, indented
		n = strings.TrimRight(n, "\n")
		b.WriteString("    note: " + strings.ReplaceAll(tr(n), "\n", "\n      ") + "\n")
	}
	b.WriteString(s.cautionText(tr))
	out := Printable(b.String())
	if f.ASCII {
		out = strings.ReplaceAll(out, "→", "->")
	}
	return out
}

// jsonNum writes x in the shortest form that reads back to the same float64.
func jsonNum(x float64) string {
	if x == 0 {
		return "0"
	}
	return strconv.FormatFloat(x, 'g', -1, 64)
}

// jsonString writes a JSON string. strconv.Quote is close but escapes
// differently from JSON for some control characters, so write it here.
func jsonString(s string) string {
	var b strings.Builder
	b.WriteByte('"')
	for _, r := range s {
		switch {
		case r == '"':
			b.WriteString(`\"`)
		case r == '\\':
			b.WriteString(`\\`)
		case r == '\n':
			b.WriteString(`\n`)
		case r == '\t':
			b.WriteString(`\t`)
		case r < 0x20 || r == 0x7f || Printable(string(r)) != string(r):
			// C1 controls, bidirectional formatting characters and the
			// line separators too: JSON on a terminal is still text
			b.WriteString(hexEscape(`\u`, uint32(r), 4))
		default:
			b.WriteRune(r)
		}
	}
	b.WriteByte('"')
	return b.String()
}

// JSONValue writes the fields of one quantity, as shared DESIGN.md fixes
// them: name, re, im, mag, deg, unit, basis. Parts below 1e-12 of the
// magnitude are written as 0, as they are shown.
func JSONValue(name string, q Quantity, basis Basis) string {
	re, im := cleanParts(q.V)
	var b strings.Builder
	b.WriteString(`{"name":` + jsonString(name))
	writeValueFields(&b, q, re, im, basis)
	b.WriteByte('}')
	return b.String()
}

func writeValueFields(b *strings.Builder, q Quantity, re, im float64, basis Basis) {
	deg, unit := Deg(q.V), UnitSymbol(q.Dim, q.Kind, false)
	if q.Kind == KindAngle && q.Dim.IsDimensionless() && q.IsReal() {
		// an angle value: re holds it in radians, deg in degrees (not the
		// 0° or 180° that a positive or negative real number would have)
		deg, unit = real(q.V)*180/math.Pi, "rad"
	}
	b.WriteString(`,"re":` + jsonNum(re))
	b.WriteString(`,"im":` + jsonNum(im))
	b.WriteString(`,"mag":` + jsonNum(cmplx.Abs(q.V)))
	b.WriteString(`,"deg":` + jsonNum(deg))
	b.WriteString(`,"unit":` + jsonString(unit))
	b.WriteString(`,"quantity":` + jsonString(QuantityName(q)))
	b.WriteString(`,"basis":` + jsonString(basis.String()))
}

func jsonValueNoName(q Quantity, basis Basis) string {
	re, im := cleanParts(q.V)
	var b strings.Builder
	b.WriteByte('{')
	writeValueFields(&b, q, re, im, basis)
	b.WriteByte('}')
	out := b.String()
	return "{" + out[2:] // drop the comma before the first field
}

// JSON writes the step as one JSON object on one line. A step with a main
// result carries that result's fields at the top level, so a consumer that
// only wants values reads name, re, im, mag, deg, unit and basis directly.
func (s *Step) JSON() string {
	var b strings.Builder
	b.WriteString(`{"kind":` + jsonString(s.Kind))
	if r, ok := s.Result(); ok {
		b.WriteString(`,"name":` + jsonString(r.Name))
		re, im := cleanParts(r.Value.V)
		writeValueFields(&b, r.Value, re, im, s.Basis)
	} else {
		b.WriteString(`,"basis":` + jsonString(s.Basis.String()))
	}
	if s.Line > 0 {
		b.WriteString(`,"line":` + strconv.Itoa(s.Line))
	}
	b.WriteString(`,"source":` + jsonString(s.Source))
	if s.Rule != "" {
		b.WriteString(`,"rule":` + jsonString(s.Rule))
	}
	if s.Formula != "" {
		b.WriteString(`,"formula":` + jsonString(s.Formula))
	}
	writeList := func(key string, ops []Operand) {
		b.WriteString(`,"` + key + `":[`)
		for i, o := range ops {
			if i > 0 {
				b.WriteByte(',')
			}
			b.WriteString(JSONValue(o.Name, o.Value, s.Basis))
		}
		b.WriteByte(']')
	}
	if len(s.Inputs) > 0 {
		writeList("inputs", s.Inputs)
	}
	if len(s.Results) > 1 {
		writeList("results", s.Results)
	}
	if len(s.Rows) > 0 {
		b.WriteString(`,"rows":[`)
		for i, r := range s.Rows {
			if i > 0 {
				b.WriteByte(',')
			}
			b.WriteString(`{"name":` + jsonString(r.Name))
			for _, v := range r.Values {
				b.WriteString(`,` + jsonString(v.Name) + `:` + jsonValueNoName(v.Value, s.Basis))
			}
			b.WriteByte('}')
		}
		b.WriteByte(']')
	}
	if c := s.Check; c != nil {
		b.WriteString(`,"pass":` + strconv.FormatBool(c.Pass))
		b.WriteString(`,"expected":` + jsonValueNoName(c.Want, s.Basis))
		b.WriteString(`,"diff":` + jsonValueNoName(c.Diff, s.Basis))
		b.WriteString(`,"rel_mag":` + jsonNum(c.RelMag))
		b.WriteString(`,"deg_diff":` + jsonNum(c.DegDiff))
		b.WriteString(`,"tolerance":` + jsonString(c.Tolerance))
		compared := "magnitude and angle"
		switch {
		case c.Scalar:
			compared = "value"
		case c.MagOnly:
			compared = "magnitude"
		}
		b.WriteString(`,"compared":` + jsonString(compared))
	}
	if len(s.Cautions) > 0 {
		b.WriteString(`,"cautions":[`)
		for i, c := range s.Cautions {
			if i > 0 {
				b.WriteByte(',')
			}
			b.WriteString(`{"topic":` + jsonString(c.Topic.String()) + `,"text":` + jsonString(c.Shown()) + `}`)
		}
		b.WriteByte(']')
	}
	if len(s.Notes) > 0 {
		b.WriteString(`,"notes":[`)
		for i, n := range s.Notes {
			if i > 0 {
				b.WriteByte(',')
			}
			b.WriteString(jsonString(n))
		}
		b.WriteByte(']')
	}
	b.WriteByte('}')
	return b.String()
}

// ErrorJSON writes an error object: {"error":…, "line":…, "col":…}.
func ErrorJSON(msg string, line, col int) string {
	return `{"error":` + jsonString(msg) + `,"line":` + strconv.Itoa(line) + `,"col":` + strconv.Itoa(col) + `}`
}

// cautionText writes the step's cautions: each whole one on its own, the
// one-line ones together on one line, so that a result stays in view.
func (s *Step) cautionText(tr func(string) string) string {
	var b strings.Builder
	var lines []string
	for _, c := range s.Cautions {
		if c.Full {
			b.WriteString("    caution: " + tr(c.Topic.Text()) + "\n")
		} else {
			lines = append(lines, c.Topic.Line())
		}
	}
	if len(lines) > 0 {
		b.WriteString("    caution: " + tr(strings.Join(lines, "; ")) + "\n")
	}
	return b.String()
}
