package tui

import (
	"errors"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"argand/calc"
	"argand/reduce/sheet"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
)

// operands returns the rows an operation of n operands takes: the marked
// rows in the order they were marked, else the n newest rows with the
// older first, so that − and ÷ read as the rows are listed bottom up.
// n < 0 takes every mark (at least two).
func (m *Model) operands(n int) []string {
	if len(m.s.v.Marks) > 0 {
		if n < 0 || len(m.s.v.Marks) >= n {
			if n < 0 {
				return slices.Clone(m.s.v.Marks)
			}
			return slices.Clone(m.s.v.Marks[:n])
		}
	}
	if n < 0 {
		n = 2
	}
	rows := m.s.rows()
	if len(rows) < n {
		return nil
	}
	out := make([]string, n)
	for i := 0; i < n; i++ {
		out[i] = rows[n-1-i]
	}
	return out
}

// single is the operand of a one-operand operation: the selected row.
func (m *Model) single() string { return m.s.v.Selected }

// run executes statements as one change and reports whether it was
// taken at once; a change still running off the update loop reports
// false (see startJob).
func (m *Model) run(what string, stmts ...string) bool {
	return m.startJob(what, nil, stmts...)
}

// runThen executes statements as one change and runs then once it is
// taken, at once or when its job finishes.
func (m *Model) runThen(what string, then func(), stmts ...string) {
	m.startJob(what, then, stmts...)
}

// apply executes statements as one change on the update loop, brings the
// names they define to the top of the table and notes the outcome. It
// returns the steps, or the error also noted. The line mode uses it,
// stopping the statement when job is done.
func (m *Model) apply(job sheet.Job, what string, stmts ...string) ([]calc.Step, error) {
	steps, defined, err := m.s.exec(job, stmts...)
	if err != nil {
		m.failed(what, err)
		return nil, err
	}
	m.applied(what, steps, defined)
	return steps, nil
}

// failed notes the error of a change.
func (m *Model) failed(what string, err error) {
	var ro *readOnlyError
	switch {
	case errors.As(err, &ro), what == "":
		m.note(true, errText(err))
	default:
		m.note(true, strings.TrimSuffix(what, ":")+": "+errText(err))
	}
}

// applied brings the names a change defined to the top of the table and
// notes its outcome. The worksheet says which names the statements
// defined (not those re-evaluated because they read one): the newest row
// is the top row.
func (m *Model) applied(what string, steps []calc.Step, defined []string) {
	res := ""
	if last := m.s.bringUp(defined); last != "" {
		q, _ := m.s.sh.Lookup(last)
		res = last + " = " + m.format().Both(q, m.s.v.PolarFirst)
	}
	if res == "" && what == "" && len(steps) > 0 {
		// a statement that defines no name (a sweep, a setting): say what
		// it did, so the line under the entry is never blank after a run
		res = doneText(steps)
	}
	m.trail.Latest()
	m.note(false, strings.TrimSpace(what+"  "+res))
	m.caution = cautionOf(steps)
}

// doneText sums up steps that defined no name: the first step's rule,
// and where the rest of it is.
func doneText(steps []calc.Step) string {
	rule, _, _ := strings.Cut(steps[0].Rule, ":")
	rule = strings.TrimSpace(calc.Printable(rule))
	if rule == "" {
		rule = "done"
	}
	if len(steps) == 1 {
		return rule + ": one step in the trail"
	}
	return fmt.Sprintf("%s: %d steps in the trail", rule, len(steps))
}

// cautionOf returns the caution topic the steps carry, one particular to
// the work (capacitors, cables, faults) before the general one, or 0.
func cautionOf(steps []calc.Step) calc.Caution {
	var general calc.Caution
	for _, st := range steps {
		for _, c := range st.Cautions {
			if c.Topic != calc.CautionMains {
				return c.Topic
			}
			general = c.Topic
		}
	}
	return general
}

func errText(err error) string {
	if e, ok := err.(*calc.Error); ok {
		return e.Msg
	}
	return err.Error()
}

// newName returns the name the worksheet would give the value of expr,
// found by evaluating it on a copy of the sheet.
func (m *Model) newName(expr string) (string, error) {
	c := m.s.sh.Clone()
	before := len(c.Entries())
	if _, _, err := c.Exec(expr); err != nil {
		return "", err
	}
	ents := c.Entries()
	if len(ents) <= before {
		return "", fmt.Errorf("%s gave no value", expr)
	}
	return ents[len(ents)-1].Name, nil
}

// define runs "NAME = expr" with a name the worksheet chooses.
func (m *Model) define(what, expr string) {
	if m.s.readOnly {
		m.note(true, m.s.errReadOnly().Error())
		return
	}
	name, err := m.newName(expr)
	if err != nil {
		m.note(true, what+" "+expr+": "+errText(err))
		return
	}
	m.run(what, name+" = "+expr)
}

// binary applies an operator to the first two operands.
func (m *Model) binary(what, op string) {
	ops := m.operands(2)
	if ops == nil {
		m.note(true, what+" needs two rows")
		return
	}
	m.define(what+" (first "+ops[0]+", second "+ops[1]+"):", ops[0]+" "+op+" "+ops[1])
}

// unary applies a function to the selected row.
func (m *Model) unary(what, fn string) {
	n := m.single()
	if n == "" {
		m.note(true, what+" needs a row")
		return
	}
	m.define(what+":", fn+"("+n+")")
}

// combine calls a function of two or more impedances: the marks, or the
// two newest rows.
func (m *Model) combine(what, fn string) {
	ops := m.operands(-1)
	if ops == nil {
		m.note(true, what+" needs two rows")
		return
	}
	if len(ops) == 1 {
		m.note(true, what+" needs two or more rows: mark another, or clear the mark ("+firstKey(m.keys.Table.Unmark)+")")
		return
	}
	expr := fn + "(" + strings.Join(ops, m.sep()) + ")"
	if len(ops) == 2 && fn == "parallel" {
		expr = ops[0] + " || " + ops[1]
	}
	m.define(what+" of "+strings.Join(ops, ", ")+":", expr)
}

// newest returns the newest rows whose quantity has dimension d, skipping
// the names in skip.
func (m *Model) newest(d calc.Dim, n int, skip ...string) []string {
	var out []string
	for _, r := range m.s.rows() {
		if slices.Contains(skip, r) {
			continue
		}
		if q, ok := m.s.sh.Lookup(r); ok && q.Dim == d {
			out = append(out, r)
			if len(out) == n {
				break
			}
		}
	}
	return out
}

// roleDefaults offers names for roles: the marks in order when there are
// enough, else the newest rows of each role's dimension.
func (m *Model) roleDefaults(dims []calc.Dim, listLast bool) []string {
	out := make([]string, len(dims))
	if len(m.s.v.Marks) >= len(dims) {
		copy(out, m.s.v.Marks)
		if listLast {
			out[len(dims)-1] = strings.Join(m.s.v.Marks[len(dims)-1:], ", ")
		}
		return out
	}
	var used []string
	for i, d := range dims {
		if c := m.newest(d, 1, used...); len(c) > 0 {
			out[i] = c[0]
			used = append(used, c[0])
		}
	}
	return out
}

// roles asks for each role of a divider or Thevenin operation by name,
// then runs "NAME = fn(answers...)".
func (m *Model) roles(title, fn string, names []string, dims []calc.Dim, listLast bool) {
	defs := m.roleDefaults(dims, listLast)
	qs := make([]question, len(names))
	for i := range names {
		qs[i] = question{label: names[i], def: defs[i], names: true, list: listLast && i == len(names)-1}
	}
	m.startAsk(title, qs, func(ans []string) {
		for i, a := range ans {
			if strings.TrimSpace(a) == "" {
				m.note(true, title+": no "+names[i]+" given")
				return
			}
		}
		for i := range ans {
			// a list of names answered with commas or semicolons
			ans[i] = strings.Join(splitNames(ans[i]), m.sep())
		}
		m.define(title+":", fn+"("+strings.Join(ans, m.sep())+")")
	})
}

// threeOf converts a Δ or a Y: the marks, or the three newest rows, in
// the order shown.
func (m *Model) threeOf(what, fn string, roles string) {
	ops := m.operands(3)
	if ops == nil {
		m.note(true, what+" needs three rows ("+roles+")")
		return
	}
	m.define(what+" ("+roles+" = "+strings.Join(ops, ", ")+"):", fn+"("+strings.Join(ops, m.sep())+")")
}

// sep is the separator of a function's arguments in the statements the
// keys write: ", ", or "; " under the decimal comma.
func (m *Model) sep() string {
	if m.s.sh.Settings().Comma {
		return "; "
	}
	return ", "
}

// splitNames splits a list of names typed with commas or semicolons.
func splitNames(a string) []string {
	f := strings.FieldsFunc(a, func(r rune) bool { return r == ',' || r == ';' })
	for i := range f {
		f[i] = strings.TrimSpace(f[i])
	}
	return f
}

// rowAction is what a key of the entries table does.
type rowAction struct {
	b  key.Binding
	do func(m *Model) tea.Cmd
}

// rowActions pairs each binding of the entries table with its action;
// the table moves its selection itself.
func (m *Model) rowActions() []rowAction {
	k := m.keys.Table
	act := func(f func(m *Model)) func(m *Model) tea.Cmd {
		return func(m *Model) tea.Cmd { f(m); return nil }
	}
	return []rowAction{
		{k.Mark, act((*Model).toggleMark)},
		{k.Unmark, act((*Model).clearMarks)},
		{k.Focus, act(func(m *Model) { m.mode = modeLine })},
		{k.Recall, act((*Model).recall)},
		{k.Add, act(func(m *Model) { m.binary("add", "+") })},
		{k.Sub, act(func(m *Model) { m.binary("subtract", "-") })},
		{k.Mul, act(func(m *Model) { m.binary("multiply", "*") })},
		{k.Div, act(func(m *Model) { m.binary("divide", "/") })},
		{k.Recip, act(func(m *Model) { m.unary("reciprocal", "recip") })},
		{k.Conj, act(func(m *Model) { m.unary("conjugate", "conj") })},
		{k.Neg, act((*Model).negate)},
		{k.Series, act(func(m *Model) { m.combine("series", "series") })},
		{k.Parallel, act(func(m *Model) { m.combine("parallel", "parallel") })},
		{k.VDiv, act(func(m *Model) {
			m.roles("voltage divider V_k = V·Z_k/ΣZ", "vdiv", []string{"source voltage", "impedance across which", "rest of the string"},
				[]calc.Dim{calc.DimVoltage, calc.DimImpedance, calc.DimImpedance}, true)
		})},
		{k.IDiv, act(func(m *Model) {
			m.roles("current divider I_k = I·Y_k/ΣY", "idiv", []string{"source current", "branch", "other branches"},
				[]calc.Dim{calc.DimCurrent, calc.DimImpedance, calc.DimImpedance}, true)
		})},
		{k.Thevenin, act(func(m *Model) {
			m.roles("Thevenin equivalent across the shunt", "thevenin", []string{"source voltage", "series impedance", "shunt impedance"},
				[]calc.Dim{calc.DimVoltage, calc.DimImpedance, calc.DimImpedance}, false)
		})},
		{k.DeltaY, act(func(m *Model) { m.threeOf("Δ → Y", "delta2y", "Zab, Zbc, Zca") })},
		{k.YDelta, act(func(m *Model) { m.threeOf("Y → Δ", "y2delta", "Za, Zb, Zc") })},
		{k.Rename, act((*Model).askRename)},
		{k.Copy, act((*Model).askCopy)},
		{k.Delete, act((*Model).deleteRow)},
		{k.Raise, act(func(m *Model) { m.reorder(true) })},
		{k.Lower, act(func(m *Model) { m.reorder(false) })},
		{k.Freq, act((*Model).askFreq)},
		{k.Form, act((*Model).switchForm)},
		{k.Fewer, act(func(m *Model) { m.digits(-1) })},
		{k.More, act(func(m *Model) { m.digits(1) })},
		{k.Basis, act((*Model).switchBasis)},
		{k.Angles, act((*Model).switchAngles)},
		{k.Decimal, act((*Model).switchDecimal)},
		{k.Blank, act(func(m *Model) { m.blankStart() })},
		{k.Undo, act((*Model).undo)},
		{k.Redo, act((*Model).redo)},
		{k.Networks, act(func(m *Model) { m.openNet("") })},
		{k.Export, act((*Model).openExport)},
		{k.Clip, (*Model).clipRow},
		{k.ClipTrail, func(m *Model) tea.Cmd { return m.copyCmd("the trail", m.trailText()) }},
		{k.TrailBack, act(func(m *Model) { m.trail.ScrollBy(5) })},
		{k.TrailOn, act(func(m *Model) { m.trail.ScrollBy(-5) })},
		{k.TrailLast, act(func(m *Model) { m.trail.Latest(); m.note(false, "trail at the latest step") })},
		{k.TrailFull, act((*Model).openFull)},
		{k.Help, act(func(m *Model) { m.openHelp("") })},
		{k.Quit, func(m *Model) tea.Cmd { m.quitting = true; return tea.Quit }},
	}
}

// undoKey names the undo key, for messages that offer it.
func (m *Model) undoKey() string { return m.keys.Table.Undo.Help().Key }

func (m *Model) toggleMark() {
	n := m.s.v.Selected
	if n == "" {
		m.note(true, "no row to mark")
		return
	}
	m.s.touch(func(v *view) {
		if i := slices.Index(v.Marks, n); i >= 0 {
			v.Marks = slices.Delete(v.Marks, i, i+1)
		} else {
			v.Marks = append(v.Marks, n)
		}
	})
	if len(m.s.v.Marks) > 0 {
		m.note(false, "marked, in order: "+strings.Join(m.s.v.Marks, ", "))
	} else {
		m.note(false, "no rows marked: operations take the two newest, named on the hint line")
	}
}

func (m *Model) clearMarks() {
	if len(m.s.v.Marks) == 0 {
		m.note(false, "no marks to clear")
		return
	}
	m.s.touch(func(v *view) { v.Marks = nil })
	m.note(false, "marks cleared: operations take the two newest rows, named on the hint line")
}

func (m *Model) recall() {
	n := m.s.v.Selected
	if n == "" {
		m.note(true, "no row to recall")
		return
	}
	m.line.SetValue(m.recallText(n))
	m.mode = modeLine
	m.note(false, "recalled "+n+": edit and press enter to redefine it (what depends on it follows)")
}

func (m *Model) negate() {
	n := m.single()
	if n == "" {
		m.note(true, "negate needs a row")
		return
	}
	m.define("negate:", "-"+n)
}

// deleteRow takes the selected row out: a value nothing depends on leaves
// the worksheet; one that others read is only put away from the table,
// since they still need it.
func (m *Model) deleteRow() {
	rows := m.s.rows()
	n := m.s.v.Selected
	if n == "" {
		m.note(true, "no row to put away")
		return
	}
	next := ""
	if i := slices.Index(rows, n); i+1 < len(rows) {
		next = rows[i+1]
	} else if i > 0 {
		next = rows[i-1]
	}
	if m.s.sh.Validate("forget "+n) == nil {
		m.runThen("delete "+n, func() {
			m.s.v.Selected = next
			m.s.tidy()
			m.s.save()
			m.note(false, n+" deleted ("+m.undoKey()+" brings it back)")
		}, "forget "+n)
		return
	}
	if err := m.s.change(func(v *view) {
		v.Hidden = append(v.Hidden, n)
		v.Selected = next
	}); err != nil {
		m.note(true, err.Error())
		return
	}
	m.note(false, n+" put away: other values depend on it, so it stays in the worksheet ("+m.undoKey()+" brings it back)")
}

func (m *Model) askFreq() {
	f := m.format().Mag(m.s.sh.Settings().Freq, calc.DimFrequency, 0)
	m.startAsk("working frequency, in Hz or rad/s (inductors and capacitors follow it)", []question{{label: "frequency", def: f}}, func(a []string) {
		v := strings.TrimSpace(a[0])
		if _, err := strconv.ParseFloat(strings.Replace(v, ",", ".", 1), 64); err == nil {
			v += " Hz"
		}
		m.run("frequency", "frequency "+v)
	})
}

func (m *Model) switchForm() {
	m.s.touch(func(v *view) { v.PolarFirst = !v.PolarFirst })
	if m.s.v.PolarFirst {
		m.note(false, "polar form first")
	} else {
		m.note(false, "rectangular form first")
	}
}

// digits shows d significant figures more (or fewer).
func (m *Model) digits(d int) {
	n := m.s.sh.Settings().Digits + d
	if n < 1 || n > calc.MaxDigits {
		m.note(true, fmt.Sprintf("digits stay between 1 and %d", calc.MaxDigits))
		return
	}
	m.run("digits", "digits "+strconv.Itoa(n))
}

func (m *Model) switchBasis() {
	b := "peak"
	if m.s.sh.Settings().Basis == calc.Peak {
		b = "rms"
	}
	m.run("basis (S = V·I* for RMS, ½·V·I* for peak)", "basis "+b)
}

func (m *Model) switchAngles() {
	a := "rad"
	if m.s.sh.Settings().Radians {
		a = "deg"
	}
	m.run("angles", "angles "+a)
}

func (m *Model) switchDecimal() {
	d := "decimal comma"
	if m.s.sh.Settings().Comma {
		d = "decimal point"
	}
	m.run(d, d)
}

func (m *Model) undo() {
	switch {
	case m.s.doUndo():
		m.trail.Latest()
		m.note(false, fmt.Sprintf("undone (%d more to undo, %s redoes)", len(m.s.undo), m.keys.Table.Redo.Help().Key))
	case m.s.readOnly:
		m.note(true, m.s.errReadOnly().Error())
	default:
		m.note(false, m.s.nothingToUndo())
	}
}

func (m *Model) redo() {
	if m.s.doRedo() {
		m.note(false, "redone")
	} else {
		m.note(false, "nothing to redo")
	}
}

// clipRow sends the selected value to the terminal clipboard.
func (m *Model) clipRow() tea.Cmd {
	n := m.s.v.Selected
	if n == "" {
		m.note(true, "no row to copy")
		return nil
	}
	q, _ := m.s.sh.Lookup(n)
	return m.copyCmd(n, n+" = "+m.format().Both(q, m.s.v.PolarFirst))
}

// recallText is the statement that defines name, for editing.
func (m *Model) recallText(name string) string {
	for _, e := range m.s.sh.Entries() {
		if e.Name == name {
			src := strings.TrimSpace(e.Source)
			if i := strings.IndexByte(src, '#'); i >= 0 {
				src = strings.TrimSpace(src[:i])
			}
			if strings.HasPrefix(src, name) || e.Kind != "value" {
				return src
			}
			return name + " = " + src
		}
	}
	q, _ := m.s.sh.Lookup(name)
	f := m.format()
	f.Digits = calc.MaxDigits
	return name + " = " + f.Rect(q)
}

func (m *Model) reorder(up bool) {
	rows := m.s.rows()
	i := slices.Index(rows, m.s.v.Selected)
	j := i + 1
	if up {
		j = i - 1
	}
	if i < 0 || j < 0 || j >= len(rows) {
		m.note(false, "already at the end")
		return
	}
	a, b := rows[i], rows[j]
	if err := m.s.change(func(v *view) {
		ia, ib := slices.Index(v.Order, a), slices.Index(v.Order, b)
		v.Order[ia], v.Order[ib] = v.Order[ib], v.Order[ia]
	}); err != nil {
		m.note(true, err.Error())
		return
	}
	m.note(false, "moved "+a)
}

func (m *Model) askRename() {
	n := m.s.v.Selected
	if n == "" {
		m.note(true, "no row to rename")
		return
	}
	m.startAsk("rename "+n+" (the worksheet records: rename "+n+" to NEW)", []question{{label: "new name"}}, func(a []string) {
		nn := strings.TrimSpace(a[0])
		if nn == "" || nn == n {
			m.note(false, "not renamed")
			return
		}
		rows := m.s.rows()
		pos := slices.Index(rows, n)
		m.runThen("rename "+n+" to "+nn, func() { m.renamed(n, nn, pos) }, "rename "+n+" to "+nn)
	})
}

// renamed keeps a renamed row in its place, with its marks.
func (m *Model) renamed(n, nn string, pos int) {
	// the same row under its new name, in the same place
	m.s.v.Order = slices.DeleteFunc(m.s.v.Order, func(x string) bool { return x == nn })
	at := slices.Index(m.s.v.Order, n)
	if at < 0 {
		at = min(pos, len(m.s.v.Order))
	}
	m.s.v.Order = slices.Insert(m.s.v.Order, at, nn)
	for i, mk := range m.s.v.Marks {
		if mk == n {
			m.s.v.Marks[i] = nn
		}
	}
	m.s.v.Selected = nn
	m.s.tidy()
	m.s.save()
}

func (m *Model) askCopy() {
	n := m.s.v.Selected
	if n == "" {
		m.note(true, "no row to copy")
		return
	}
	def, _ := m.newName(n)
	m.startAsk("copy "+n+" under a new name", []question{{label: "name", def: def}}, func(a []string) {
		nn := strings.TrimSpace(a[0])
		if nn == "" {
			return
		}
		m.run("copy of "+n, nn+" = "+n)
	})
}

// trailText is the whole trail as plain text.
func (m *Model) trailText() string { return m.s.trailText() }

// trailMarkdown is the whole trail as Markdown.
func (m *Model) trailMarkdown() string { return m.s.trailMarkdown() }

// trailCSV is the trail's tables and results as CSV.
func (m *Model) trailCSV() string { return m.s.trailCSV() }

// worksheetText is the session as a worksheet.
func (m *Model) worksheetText() string { return m.s.worksheetText() }
