package tui

import (
	"argand/tui/internal/golden"
	"math"
	"time"

	"bytes"
	"math/cmplx"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"argand/calc"
	"argand/tui/store"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"
)

func TestMain(m *testing.M) {
	// Plain text views: goldens must not depend on the terminal running
	// the tests.
	lipgloss.SetColorProfile(termenv.Ascii)
	if os.Getenv(childEnv) != "" {
		os.Exit(durabilityChild())
	}
	os.Exit(m.Run())
}

const benchSheet = "testdata/bench.argand"

// newModel opens the test worksheet in a fresh state directory.
func newModel(t testing.TB, o Options) *Model {
	t.Helper()
	if o.Dir == "" {
		o.Dir = t.TempDir()
	}
	if o.File == "" {
		o.File = benchSheet
	}
	o.Getenv = func(string) string { return "" }
	if o.Wait == 0 {
		// a statement moves off the update loop only after a stall
		o.Wait = time.Minute
	}
	m := New(o)
	t.Cleanup(m.Close)
	m.Update(tea.WindowSizeMsg{Width: 80, Height: 24})
	return m
}

// keyMsg turns a key name as bubbletea writes it into a message.
func keyMsg(k string) tea.KeyMsg {
	names := map[string]tea.KeyType{
		"enter": tea.KeyEnter, "esc": tea.KeyEscape, "tab": tea.KeyTab, "up": tea.KeyUp, "down": tea.KeyDown,
		"left": tea.KeyLeft, "right": tea.KeyRight, "home": tea.KeyHome, "end": tea.KeyEnd,
		"backspace": tea.KeyBackspace, "delete": tea.KeyDelete, "pgup": tea.KeyPgUp, "pgdown": tea.KeyPgDown,
		"ctrl+c": tea.KeyCtrlC, "ctrl+u": tea.KeyCtrlU, "ctrl+k": tea.KeyCtrlK, "ctrl+a": tea.KeyCtrlA,
		"ctrl+e": tea.KeyCtrlE, "ctrl+b": tea.KeyCtrlB, "ctrl+f": tea.KeyCtrlF, "ctrl+d": tea.KeyCtrlD,
		"ctrl+z": tea.KeyCtrlZ, "ctrl+o": tea.KeyCtrlO, "ctrl+t": tea.KeyCtrlT, "ctrl+y": tea.KeyCtrlY, " ": tea.KeySpace, "f1": tea.KeyF1,
		"shift+up": tea.KeyShiftUp, "shift+down": tea.KeyShiftDown,
	}
	if t, ok := names[k]; ok {
		return tea.KeyMsg{Type: t}
	}
	return tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune(k)}
}

// press sends keys one by one and returns the last command.
func press(m *Model, keys ...string) tea.Cmd {
	var cmd tea.Cmd
	for _, k := range keys {
		_, cmd = m.Update(keyMsg(k))
	}
	return cmd
}

// typeLine types a statement into the entry line and runs it.
func typeLine(t *testing.T, m *Model, src string) {
	t.Helper()
	if m.mode != modeLine {
		press(m, "tab")
	}
	for _, r := range src {
		m.Update(keyMsg(string(r)))
	}
	press(m, "enter")
	if m.msgErr {
		t.Fatalf("%s: %s", src, m.msg)
	}
	press(m, "esc")
}

func value(t *testing.T, m *Model, name string) complex128 {
	t.Helper()
	q, ok := m.s.sh.Lookup(name)
	if !ok {
		t.Fatalf("no value %s; rows %v", name, m.s.rows())
	}
	return q.V
}

func near(a, b complex128) bool {
	return cmplx.Abs(a-b) <= 1e-9*cmplx.Abs(b)+1e-300
}

func TestOperations(t *testing.T) {
	za, zb := complex(3, 4), complex(10, 0)
	// Reference values are the standard circuit formulas (common practice):
	// series Z = Z1 + Z2, parallel product over sum, divider V·Zk/ΣZ,
	// current divider I·Zother/ΣZ for two branches, Thevenin V·Z2/(Z1+Z2).
	tests := []struct {
		keys []string
		want complex128
		stmt string
	}{
		{[]string{"+"}, za + zb, "Za + Zb"},
		{[]string{"-"}, za - zb, "Za - Zb"},
		{[]string{"*"}, za * zb, "Za * Zb"},
		{[]string{"/"}, za / zb, "Za / Zb"},
		{[]string{"s"}, za + zb, "series(Za, Zb)"},
		{[]string{"p"}, za * zb / (za + zb), "Za || Zb"},
		{[]string{"r"}, 1 / zb, "recip(Zb)"},
		{[]string{"~"}, cmplx.Conj(zb), "conj(Zb)"},
		{[]string{"n"}, -zb, "-Zb"},
	}
	for _, tc := range tests {
		m := newModel(t, Options{})
		typeLine(t, m, "Za = 3+j4 Ω")
		typeLine(t, m, "Zb = 10 Ω")
		press(m, tc.keys...)
		if m.msgErr {
			t.Fatalf("%v: %s", tc.keys, m.msg)
		}
		got := value(t, m, m.s.v.Selected)
		if !near(got, tc.want) {
			t.Errorf("%v: got %v, want %v", tc.keys, got, tc.want)
		}
		stmts := m.s.sh.Statements()
		if last := stmts[len(stmts)-1]; !strings.HasSuffix(last, "= "+tc.stmt) {
			t.Errorf("%v: statement %q, want … = %s", tc.keys, last, tc.stmt)
		}
	}
}

func TestMarkOrder(t *testing.T) {
	m := newModel(t, Options{})
	typeLine(t, m, "Za = 3+j4 Ω")
	typeLine(t, m, "Zb = 10 Ω")
	// the newest two, older first
	if h := m.hintView(); !strings.Contains(h, "on Za, Zb") {
		t.Errorf("hint does not show the order: %q", h)
	}
	// mark Zb first, then Za: Zb − Za
	press(m, "home", " ", "down", " ")
	if got := m.s.v.Marks; len(got) != 2 || got[0] != "Zb" || got[1] != "Za" {
		t.Fatalf("marks %v", got)
	}
	if v := m.View(); !strings.Contains(v, "◆1 Zb") || !strings.Contains(v, "◆2 Za") {
		t.Errorf("mark order not shown:\n%s", v)
	}
	press(m, "-")
	if got, want := value(t, m, m.s.v.Selected), complex(7, -4); !near(got, want) {
		t.Errorf("Zb − Za = %v, want %v", got, want)
	}
	if !strings.Contains(m.msg, "first Zb, second Za") {
		t.Errorf("message does not say the order: %q", m.msg)
	}
}

func TestRoles(t *testing.T) {
	m := newModel(t, Options{})
	typeLine(t, m, "V1 = 100 V")
	typeLine(t, m, "Zs = 3+j4 Ω")
	typeLine(t, m, "Zh = 10 Ω")
	// defaults: newest voltage, newest impedance, next impedance
	press(m, "v")
	if m.mode != modePrompt || !strings.Contains(m.entryView(), "[V1]") {
		t.Fatalf("divider does not ask for the source with a default: %q", m.entryView())
	}
	press(m, "enter", "enter", "enter")
	got := value(t, m, m.s.v.Selected)
	if want := 100 * complex(10, 0) / complex(13, 4); !near(got, want) {
		t.Errorf("vdiv = %v, want %v", got, want)
	}
	// Thevenin with names typed for each role
	press(m, "t")
	for _, ans := range []string{"V1", "Zs", "Zh"} {
		for _, r := range ans {
			m.Update(keyMsg(string(r)))
		}
		press(m, "enter")
	}
	got = value(t, m, m.s.v.Selected)
	if want := 100 * complex(10, 0) / complex(13, 4); !near(got, want) {
		t.Errorf("Thevenin V = %v, want %v", got, want)
	}
	// a role naming no row is refused and asked again
	press(m, "c")
	for _, r := range "nothing" {
		m.Update(keyMsg(string(r)))
	}
	press(m, "enter")
	if m.mode != modePrompt || !m.msgErr {
		t.Errorf("unknown name accepted")
	}
	press(m, "esc")
	if m.mode != modeRows {
		t.Errorf("esc does not cancel the question")
	}
}

func TestDeltaWye(t *testing.T) {
	m := newModel(t, Options{})
	for _, s := range []string{"Zab = 30 Ω", "Zbc = 30 Ω", "Zca = 30 Ω"} {
		typeLine(t, m, s)
	}
	press(m, "w")
	// balanced Δ of 30 Ω is a Y of 10 Ω (common practice: Z_Y = Z_Δ/3)
	if got := value(t, m, m.s.v.Selected); !near(got, 10) {
		t.Errorf("Δ→Y arm %v, want 10", got)
	}
	press(m, "esc")
	m.s.v.Marks = []string{"Zab", "Zbc", "Zca"}
	press(m, "W")
	if got := value(t, m, m.s.v.Selected); !near(got, 90) {
		t.Errorf("Y→Δ side %v, want 90", got)
	}
}

func TestUndoRedo(t *testing.T) {
	m := newModel(t, Options{})
	n0 := len(m.s.sh.Statements())
	typeLine(t, m, "Za = 3+j4 Ω")
	typeLine(t, m, "Zb = 10 Ω")
	press(m, "p", "d", "shift+down", "B", ">")
	press(m, "z", "z", "z", "z", "z", "z", "z")
	if got := len(m.s.sh.Statements()); got != n0 {
		t.Fatalf("after undoing all: %d statements, want %d", got, n0)
	}
	press(m, "Z", "Z", "Z")
	if _, ok := m.s.sh.Lookup("Z3"); !ok {
		t.Errorf("redo did not bring the parallel back: rows %v", m.s.rows())
	}
	// a new change after undo drops the redo history
	press(m, "z")
	typeLine(t, m, "Zc = 1 Ω")
	press(m, "Z")
	if m.msg != "nothing to redo" {
		t.Errorf("redo after a new change: %q", m.msg)
	}
}

func TestRowEditing(t *testing.T) {
	m := newModel(t, Options{})
	typeLine(t, m, "Za = 3+j4 Ω")
	// rename
	press(m, "R")
	for _, r := range "Zload" {
		m.Update(keyMsg(string(r)))
	}
	press(m, "enter")
	if rows := m.s.rows(); rows[0] != "Zload" || contains(rows, "Za") {
		t.Errorf("rename: rows %v", rows)
	}
	// copy under the offered name
	press(m, "C", "enter")
	if rows := m.s.rows(); len(rows) < 2 || !near(value(t, m, rows[0]), complex(3, 4)) {
		t.Errorf("copy: rows %v", rows)
	}
	// reorder and put away
	top := m.s.rows()[0]
	press(m, "shift+down")
	if m.s.rows()[1] != top {
		t.Errorf("lower: rows %v", m.s.rows())
	}
	press(m, "d")
	if contains(m.s.rows(), top) {
		t.Errorf("put away: %s still shown", top)
	}
	press(m, "z")
	if !contains(m.s.rows(), top) {
		t.Errorf("undo of put away: %s not back", top)
	}
	// recall puts the defining statement in the line
	press(m, "home", "enter")
	if m.mode != modeLine || !strings.Contains(m.line.f.String(), "=") {
		t.Errorf("recall: mode %v, line %q", m.mode, m.line.f.String())
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

func TestSettings(t *testing.T) {
	m := newModel(t, Options{})
	press(m, "f")
	for _, r := range "60" {
		m.Update(keyMsg(string(r)))
	}
	press(m, "enter")
	if f := m.s.sh.Settings().Freq; f != 60 {
		t.Fatalf("frequency %v", f)
	}
	// an inductor's impedance follows: X = 2π·60·31.83 mH (common practice)
	if got, want := imag(value(t, m, "L1")), 2*3.141592653589793*60*31.83e-3; !near(complex(got, 0), complex(want, 0)) {
		t.Errorf("X_L at 60 Hz = %v, want %v", got, want)
	}
	v := m.View()
	if !strings.Contains(v, "60.00 Hz") || !strings.Contains(v, "377.0 rad/s") {
		t.Errorf("status does not show 60 Hz and ω:\n%s", v)
	}
	press(m, "B", "a", "<", "o")
	st := m.s.sh.Settings()
	if st.Basis != calc.Peak || !st.Radians || st.Digits != 3 || !m.s.v.PolarFirst {
		t.Errorf("settings %+v polar %v", st, m.s.v.PolarFirst)
	}
	if v := m.View(); !strings.Contains(v, "peak") || !strings.Contains(v, "radians") || !strings.Contains(v, "polar first") {
		t.Errorf("status line:\n%s", strings.SplitN(v, "\n", 2)[0])
	}
}

func TestLiveFeedback(t *testing.T) {
	m := newModel(t, Options{})
	press(m, "tab")
	for _, r := range "Zq = 3 + * 4" {
		m.Update(keyMsg(string(r)))
	}
	v := m.View()
	lines := strings.Split(v, "\n")
	fb := lines[len(lines)-2]
	if !strings.Contains(fb, "error:") || !strings.Contains(fb, "^") {
		t.Fatalf("no live error with caret:\n%s", v)
	}
	// the caret sits under the offending '*'
	entry := lines[len(lines)-3]
	col := strings.Index(fb, "^")
	if col < 0 || col >= len([]rune(entry)) || []rune(entry)[col] != '*' {
		t.Errorf("caret at %d not under '*':\n%s\n%s", col, entry, fb)
	}
	press(m, "enter")
	if _, ok := m.s.sh.Lookup("Zq"); ok || !m.msgErr {
		t.Errorf("a bad statement was accepted")
	}
}

func TestPaste(t *testing.T) {
	m := newModel(t, Options{})
	press(m, "tab")
	// a statement of 10 000 characters, longer than the field's bound
	// once was, is kept whole and runs whole: 5000 ones
	long := "pz = " + strings.Repeat("1+", 4997) + "1"
	m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune(long), Paste: true})
	if got := m.line.f.String(); got != long {
		t.Fatalf("paste of %d bytes kept %d", len(long), len(got))
	}
	press(m, "enter")
	if got := value(t, m, "pz"); got != 4998 {
		t.Errorf("pz = %v, want 4998", got)
	}
	// past the worksheet's line limit: refused whole, said so, and the
	// text already in the line is kept
	press(m, "tab")
	m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("kept = 1"), Paste: true})
	huge := strings.Repeat("1+", calc.MaxLine/2) + "1"
	m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune(huge), Paste: true})
	if got := m.line.f.String(); got != "kept = 1" {
		t.Errorf("over-long paste changed the line to %d bytes", len(got))
	}
	if !m.msgErr || !strings.Contains(m.msg, "at most 65536") {
		t.Errorf("over-long paste: message %q", m.msg)
	}
	if v := m.View(); !strings.Contains(v, "not inserted") {
		t.Errorf("over-long paste: no message on screen:\n%s", v)
	}
	press(m, "ctrl+u")
	m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("Zp = 5 Ω\nZq = Zp * 2\n"), Paste: true})
	if got := value(t, m, "Zq"); got != 10 {
		t.Errorf("pasted lines: Zq = %v", got)
	}
}

func TestSmallAndResize(t *testing.T) {
	m := newModel(t, Options{})
	sizes := [][2]int{{40, 12}, {0, 0}, {1, 1}, {59, 30}, {200, 15}, {80, 24}, {300, 100}, {60, 16},
		{39, 20}, {40, 19}, {40, 20}, {59, 19}, {59, 20}, {60, 15}}
	for _, sz := range sizes {
		m.Update(tea.WindowSizeMsg{Width: sz[0], Height: sz[1]})
		v := m.View()
		wide := sz[0] >= minWidth && sz[1] >= minHeight
		narrow := sz[0] >= narrowWidth && sz[1] >= narrowHeight
		if !wide && !narrow {
			if sz[1] >= 1 && sz[0] >= 20 && !strings.Contains(v, "too small") {
				t.Errorf("%v: no too-small notice:\n%s", sz, v)
			}
			continue
		}
		lines := strings.Split(v, "\n")
		if len(lines) != sz[1] {
			t.Errorf("%v: %d lines", sz, len(lines))
		}
		for _, l := range lines {
			if w := lipgloss.Width(l); w > sz[0] {
				t.Errorf("%v: line of %d cells: %q", sz, w, l)
			}
		}
	}
	// every mode at the smallest full size
	m.Update(tea.WindowSizeMsg{Width: minWidth, Height: minHeight})
	press(m, "?")
	_ = m.View()
	press(m, "esc", "N")
	_ = m.View()
}

func TestRestoreAndCorrupt(t *testing.T) {
	dir := t.TempDir()
	m := newModel(t, Options{Dir: dir})
	typeLine(t, m, "Zkeep = 7 Ω")
	press(m, " ", "o")
	m.Close()
	m2 := newModel(t, Options{Dir: dir})
	if got := value(t, m2, "Zkeep"); got != 7 {
		t.Errorf("restored Zkeep = %v", got)
	}
	if !m2.s.v.PolarFirst || len(m2.s.v.Marks) != 1 {
		t.Errorf("view not restored: %+v", m2.s.v)
	}
	path := m2.s.path
	m2.Close()
	if err := os.WriteFile(path, []byte("{not json"), 0o600); err != nil {
		t.Fatal(err)
	}
	m3 := newModel(t, Options{Dir: dir})
	if _, ok := m3.s.sh.Lookup("R1"); !ok {
		t.Errorf("app did not start afresh from the worksheet")
	}
	moved, _ := filepath.Glob(path + ".corrupt-*")
	if len(moved) != 1 {
		t.Fatalf("corrupt file not kept aside: %v", moved)
	}
	// where the file went is on the screen whole at 80 columns, though
	// the name of a worksheet's session is long
	name := filepath.Base(moved[0])
	if !m3.msgErr || !strings.Contains(m3.msg, "kept as "+name) {
		t.Errorf("corrupt file: message %q", m3.msg)
	}
	if v := m3.View(); !strings.Contains(v, name) {
		t.Errorf("%s not shown:\n%s", name, v)
	}
}

func TestLocked(t *testing.T) {
	dir := t.TempDir()
	first := newModel(t, Options{Dir: dir})
	typeLine(t, first, "Zmine = 1 Ω")
	second := newModel(t, Options{Dir: dir})
	if second.mode != modeLocked || !strings.Contains(second.View(), "already open") {
		t.Fatalf("second instance not told:\n%s", second.View())
	}
	press(second, "r")
	if !second.s.readOnly || !strings.Contains(second.View(), "READ-ONLY") {
		t.Fatalf("read-only not shown")
	}
	if _, ok := second.s.sh.Lookup("Zmine"); !ok {
		t.Errorf("read-only view does not show the session")
	}
	press(second, "p")
	if !second.msgErr {
		t.Errorf("read-only accepted a change")
	}
	// a typed statement is refused in plain words, with no empty location
	press(second, "tab")
	for _, r := range "Zro = 5 Ω" {
		second.Update(keyMsg(string(r)))
	}
	press(second, "enter")
	fb := second.feedbackView()
	if !strings.HasPrefix(fb, "read-only: this session is open in another argand (pid ") || strings.Contains(fb, ": :") {
		t.Errorf("read-only refusal reads %q", fb)
	}
	third := newModel(t, Options{Dir: dir})
	press(third, "s")
	if third.s.readOnly || third.s.path == first.s.path {
		t.Errorf("separate session uses %s", third.s.path)
	}
	typeLine(t, third, "Zother = 2 Ω")
	data, _ := store.Load(first.s.path)
	if bytes.Contains(data, []byte("Zother")) {
		t.Errorf("separate session wrote into the first")
	}
}

func TestNetworkView(t *testing.T) {
	m := newModel(t, Options{})
	press(m, "N")
	if m.mode != modeNet {
		t.Fatalf("no network view: %s", m.msg)
	}
	// N opens the newest network; tab goes on to the others in turn
	if m.net.name != "ladder" {
		t.Errorf("N opened %s, not the newest network (ladder)", m.net.name)
	}
	press(m, "tab")
	v := m.View()
	for _, want := range []string{"network bench", "Ra", "Cb", "gnd", "0 of"} {
		if !strings.Contains(v, want) {
			t.Errorf("network view lacks %q:\n%s", want, v)
		}
	}
	press(m, "right")
	v = m.View()
	if !strings.Contains(v, "»") || !strings.Contains(v, "step 1 of") {
		t.Errorf("step 1 not highlighted by a marker:\n%s", v)
	}
	press(m, "left")
	if m.net.step != 0 {
		t.Errorf("step back")
	}
	// take the current of the selected element as a row
	press(m, "down", "i", "enter")
	if m.msgErr {
		t.Fatalf("take: %s", m.msg)
	}
	name := m.s.v.Selected
	e := m.net.v.Elements[1]
	if want := value(t, m, "bench."+e.Name+".i"); value(t, m, name) != want {
		t.Errorf("row %s differs from the branch current", name)
	}
	// Thevenin between b and gnd: check against the loaded network by
	// hand (common practice): V_th = V·Zb/(Ra+Zb), Zb = La‖Rb, Cb across
	// the ideal source drops out.
	press(m, "t", "ctrl+u")
	for _, a := range []string{"b", "gnd", "Tb"} {
		for _, r := range a {
			m.Update(keyMsg(string(r)))
		}
		press(m, "enter")
	}
	if m.msgErr {
		t.Fatalf("thevenin: %s", m.msg)
	}
	zl := complex(0, 2*3.141592653589793*50*31.83e-3)
	zb := zl * 20 / (zl + 20)
	if got, want := value(t, m, "Tb"), 230*zb/(10+zb); !near(got, want) {
		t.Errorf("V_th = %v, want %v", got, want)
	}
	if got, want := value(t, m, "ZTb"), 10*zb/(10+zb); !near(got, want) {
		t.Errorf("Z_th = %v, want %v", got, want)
	}
	press(m, "tab")
	if m.net.name != "ladder" {
		t.Errorf("tab: network %s", m.net.name)
	}
	press(m, "esc")
	if m.mode != modeRows {
		t.Errorf("esc leaves the network view")
	}
}

func TestExportAndClipboard(t *testing.T) {
	m := newModel(t, Options{})
	var out bytes.Buffer
	m.opt.Out = &out
	typeLine(t, m, "Za = 3+j4 Ω")
	press(m, "p")
	dir := t.TempDir()
	for _, c := range []struct{ key, file, want string }{
		{"m", "t.md", "# argand trail"},
		{"t", "t.txt", "Za = 3+j4"},
		{"w", "s.argand", "network bench reference gnd"},
		{"r", "r.html", `<pre id="argand-worksheet" class="source">`},
		{"c", "t.csv", "\r\nname,re v (V),im v (V),|v| (V),arg v (°),"},
	} {
		press(m, "x", c.key, "ctrl+u")
		for _, r := range filepath.Join(dir, c.file) {
			m.Update(keyMsg(string(r)))
		}
		press(m, "enter")
		b, err := os.ReadFile(filepath.Join(dir, c.file))
		if err != nil || !strings.Contains(string(b), c.want) {
			t.Errorf("%s: %v %q", c.file, err, short(string(b), 200))
		}
	}
	// the saved worksheet replays to the same values
	b, _ := os.ReadFile(filepath.Join(dir, "s.argand"))
	sh, sum := replay(strings.Split(strings.TrimSpace(string(b)), "\n"), false, "")
	if len(sum.Problems) != 0 {
		t.Fatal(sum.Problems[0].Err)
	}
	for _, e := range m.s.sh.Entries() {
		q, ok := sh.Lookup(e.Name)
		if !ok || q.V != e.Value.V {
			t.Errorf("replayed %s = %v, want %v", e.Name, q.V, e.Value.V)
		}
	}
	cmd := press(m, "ctrl+o")
	if cmd == nil {
		t.Fatal("no clipboard command")
	}
	m.Update(cmd())
	if !strings.HasPrefix(out.String(), "\x1b]52;c;") || !strings.Contains(m.msg, "sent "+m.s.v.Selected+" to the terminal clipboard (OSC 52)") {
		t.Errorf("OSC 52 not written: %q, %q", out.String(), m.msg)
	}
}

func TestASCII(t *testing.T) {
	m := newModel(t, Options{ASCII: true})
	press(m, " ", "down", " ")
	for _, v := range []string{m.View(), func() string { press(m, "?"); return m.View() }(), func() string { press(m, "esc", "N", "right"); return m.View() }()} {
		for i := 0; i < len(v); i++ {
			if v[i] >= 0x80 {
				t.Fatalf("non-ASCII byte in ASCII mode:\n%s", v)
			}
		}
	}
}

func TestGolden(t *testing.T) {
	for _, c := range []struct {
		name  string
		w, h  int
		ascii bool
		keys  []string
	}{
		{"rows-80x24", 80, 24, false, []string{"home", " ", "down", " "}},
		{"rows-120x40", 120, 40, false, []string{"home", " ", "down", " ", "p"}},
		{"rows-80x24-ascii", 80, 24, true, []string{"home", " ", "down", " "}},
		{"network-80x24", 80, 24, false, []string{"N", "tab", "right", "right"}},
		{"network-120x40", 120, 40, false, []string{"N", "tab", "right"}},
		{"network-80x24-ascii", 80, 24, true, []string{"N", "tab", "right"}},
		{"help-80x24", 80, 24, false, []string{"?"}},
		{"small-40x12", 40, 12, false, nil},
	} {
		t.Run(c.name, func(t *testing.T) {
			m := newModel(t, Options{ASCII: c.ascii})
			m.note(false, "")
			m.Update(tea.WindowSizeMsg{Width: c.w, Height: c.h})
			press(m, c.keys...)
			got := m.View()
			golden.Check(t, filepath.Join("testdata", c.name+".golden"), got)
		})
	}
}

// A reactive power Q is the imaginary part of S = P + jQ (shared
// DESIGN.md: S = V·I*, Q > 0 inductive), so it is drawn on the j axis;
// an active power P lies on the real axis.
func TestSketchPowerKinds(t *testing.T) {
	tests := []struct {
		q    calc.Quantity
		want complex128
	}{
		{calc.Quantity{V: 86.96, Dim: calc.DimPower, Kind: calc.KindReactive}, complex(0, 86.96)},
		{calc.Quantity{V: -40, Dim: calc.DimPower, Kind: calc.KindReactive}, complex(0, -40)},
		{calc.Quantity{V: 120, Dim: calc.DimPower, Kind: calc.KindActive}, 120},
		{calc.Quantity{V: complex(120, 90), Dim: calc.DimPower, Kind: calc.KindApparent}, complex(120, 90)},
		{calc.Quantity{V: 230, Dim: calc.DimVoltage}, 230},
	}
	for _, tt := range tests {
		if got := sketchValue(tt.q); got != tt.want {
			t.Errorf("sketchValue(%v) = %v, want %v", tt.q, got, tt.want)
		}
	}
}

// A real number of a kind that is real by meaning has no angle (shared
// DESIGN.md, quantity kinds): an active or reactive power, a resistance or a
// magnitude is listed as not drawn rather than drawn as an arrow along an
// axis, and a power that is drawn is scaled in its own unit word. A zero
// phasor has no angle either (issue 9).
func TestSketchScalarsNotDrawn(t *testing.T) {
	tests := []struct {
		name      string
		lines     []string
		marks     []string
		skipped   string // names listed as "no angle, not drawn", "" for none
		scale     string // expected "+ = …" legend text, "" for none
		notInView string
	}{
		{"active and reactive", []string{"Px = 60 W", "Qx = 80 var"}, []string{"Px", "Qx"}, "Px, Qx: no angle, not drawn", "", "+ = "},
		{"active power alone", []string{"Pq = mag(230 V)^2/(50 Ω)"}, []string{"Pq"}, "Pq: no angle, not drawn", "", "kVA"},
		{"resistance", []string{"Zc = 7 Ω", "V1 = 230 V"}, []string{"Zc", "V1"}, "Zc: no angle, not drawn", "+ = 250 V", "Ω"},
		{"magnitude", []string{"Mq = mag(3+j4 Ω)"}, []string{"Mq"}, "Mq: no angle, not drawn", "", "+ = "},
		{"reactive on the j axis", []string{"Qc = j80 var"}, []string{"Qc"}, "", "+ = 80.0 var", "VA"},
		{"impedance drawn", []string{"Z1 = 3+j4 Ω"}, []string{"Z1"}, "", "+ = 5.00 Ω", "not drawn"},
		// a zero phasor has no direction: listed, never an arrow at 0°
		{"zero phasor", []string{"V0 = 1 V - 1 V"}, []string{"V0"}, "V0: no angle, not drawn", "", "+ = "},
		{"zero beside a phasor", []string{"Vz = 0 V", "V2 = 230 V"}, []string{"Vz", "V2"}, "Vz: no angle, not drawn", "+ = 250 V", "∠"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			m := newModel(t, Options{})
			for _, l := range tt.lines {
				typeLine(t, m, l)
			}
			m.s.v.Marks = tt.marks
			// the sketch pane is right of the last bar on each line
			var sk []string
			for _, l := range strings.Split(m.View(), "\n") {
				if i := strings.LastIndex(l, "│"); i >= 0 {
					sk = append(sk, l[i+len("│"):])
				}
			}
			v := strings.Join(sk, "\n")
			if tt.skipped != "" && !strings.Contains(v, tt.skipped) {
				t.Errorf("want %q in the sketch:\n%s", tt.skipped, v)
			}
			if tt.scale != "" && !strings.Contains(v, tt.scale) {
				t.Errorf("want scale %q:\n%s", tt.scale, v)
			}
			if strings.Contains(v, tt.notInView) {
				t.Errorf("%q should not be in the sketch:\n%s", tt.notInView, v)
			}
		})
	}
}

// TestFirstStartLocked: the session is locked from the very first start,
// when the state directory does not exist yet, so that a second instance
// is asked what to do rather than sharing the file.
func TestFirstStartLocked(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "state", "argand")
	first := newModel(t, Options{Dir: dir})
	if first.s.lock == nil || first.mode == modeLocked {
		t.Fatalf("first start holds no lock: %q", first.msg)
	}
	typeLine(t, first, "Zfirst = 1 Ω")
	second := newModel(t, Options{Dir: dir})
	if second.mode != modeLocked {
		t.Errorf("second instance not asked; it says %q", second.msg)
	}
}

// TestOutcomeFollowsTheLine: an error stays only while the line that
// caused it is unchanged; editing the line clears it.
func TestOutcomeFollowsTheLine(t *testing.T) {
	m := newModel(t, Options{})
	press(m, "tab")
	for _, r := range "bad = fromvip(230 V, 4 A, 990 W, lagging)" {
		m.Update(keyMsg(string(r)))
	}
	press(m, "enter")
	if !m.msgErr {
		t.Fatalf("no error for inconsistent V, I, P: %q", m.msg)
	}
	press(m, "ctrl+u")
	for _, r := range "Zok = 5 Ω" {
		m.Update(keyMsg(string(r)))
	}
	if fb := m.feedbackView(); strings.Contains(fb, "error") || m.msgErr {
		t.Errorf("stale error under a new line: %q", fb)
	}
	press(m, "enter")
	if m.msgErr || !strings.Contains(m.feedbackView(), "Zok") {
		t.Errorf("outcome of the new line: %q", m.feedbackView())
	}
}

// TestCautionShown: a statement whose steps carry a caution shows it on
// the feedback line at 80×24, whole or cut with the way to read it.
func TestCautionShown(t *testing.T) {
	tests := []struct {
		stmt, want string
	}{
		// power-factor correction carries the capacitor caution
		{"Qc = pfc(10 kW, 0.7, 0.95, 400 V, three)", "caution: " + calc.CautionCapacitor.Line()},
		// a plain impedance carries none
		{"Zplain = 5 Ω", ""},
	}
	for _, tt := range tests {
		m := newModel(t, Options{})
		typeLine(t, m, tt.stmt)
		fb := m.feedbackView()
		if tt.want == "" {
			if strings.Contains(fb, "caution") {
				t.Errorf("%s: caution shown: %q", tt.stmt, fb)
			}
			continue
		}
		if !strings.HasPrefix(fb, tt.want) || !strings.HasSuffix(fb, m.cautionSuffix()) || lipgloss.Width(fb) > m.width {
			t.Errorf("%s: feedback %q", tt.stmt, fb)
		}
		if !strings.Contains(m.View(), m.cautionSuffix()) {
			t.Errorf("%s: caution not on the screen", tt.stmt)
		}
		// the next action's outcome takes its place
		press(m, "o")
		if strings.Contains(m.feedbackView(), "caution") {
			t.Errorf("%s: caution outlived the next action", tt.stmt)
		}
	}
}

// TestCautionOf picks the particular caution before the general one.
func TestCautionOf(t *testing.T) {
	tests := []struct {
		topics []calc.Caution
		want   calc.Caution
	}{
		{nil, 0},
		{[]calc.Caution{calc.CautionMains}, calc.CautionMains},
		{[]calc.Caution{calc.CautionMains, calc.CautionCable}, calc.CautionCable},
		{[]calc.Caution{calc.CautionFault, calc.CautionMains}, calc.CautionFault},
	}
	for _, tt := range tests {
		st := calc.Step{Notes: []string{"largest KCL residual is small"}, Cautions: calc.CautionsOf(tt.topics...)}
		if got := cautionOf([]calc.Step{st}); got != tt.want {
			t.Errorf("cautionOf(%v) = %v, want %v", tt.topics, got, tt.want)
		}
	}
}

// A caution's whole text is in the trail once per session for each topic;
// later steps of that topic carry its one line, so the results stay in
// the trail pane (they were pushed out by two paragraphs on every step).
func TestCautionWholeOnce(t *testing.T) {
	m := newModel(t, Options{})
	m.Update(tea.WindowSizeMsg{Width: 80, Height: 24})
	whole := "Adding capacitance can create a harmonic resonance"
	count := func() int {
		n := 0
		for _, st := range m.s.sh.Steps() {
			n += strings.Count(st.Text(calc.Format{Digits: 4}, false), whole)
		}
		return n
	}
	typeLine(t, m, "Qa = pfc(10 kW, 0.7, 0.95, 400 V, three)")
	if count() != 1 {
		t.Fatalf("first correction: the whole capacitor caution appears %d times", count())
	}
	before := len(m.s.sh.Steps())
	typeLine(t, m, "Qb = pfc(12 kW, 0.75, 0.95, 400 V, three)")
	if count() != 1 {
		t.Errorf("second correction repeated the whole caution (%d times)", count())
	}
	last := ""
	for _, st := range m.s.sh.Steps()[before:] {
		last += st.Text(calc.Format{Digits: 4}, false)
	}
	if !strings.Contains(last, calc.CautionCapacitor.Line()) {
		t.Errorf("second correction lacks the one-line caution:\n%s", last)
	}
	if !strings.Contains(m.View(), "Qb") {
		t.Errorf("result pushed out of view:\n%s", m.View())
	}
}

// TestPasteInRows: a paste while the table has the keyboard goes to the
// entry line.
func TestPasteInRows(t *testing.T) {
	m := newModel(t, Options{})
	if m.mode != modeRows {
		t.Fatalf("mode %v", m.mode)
	}
	m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("Zpaste = 4 Ω"), Paste: true})
	if m.mode != modeLine || m.line.f.String() != "Zpaste = 4 Ω" {
		t.Errorf("paste in rows: mode %v, line %q", m.mode, m.line.f.String())
	}
	press(m, "esc")
	m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("Zp2 = 2 Ω\n"), Paste: true})
	if _, ok := m.s.sh.Lookup("Zp2"); !ok {
		t.Errorf("pasted lines in rows not run: %q", m.msg)
	}
}

// TestRestorePartial: a session whose statements do not all replay (here
// written by hand with two bad ones and one that reads a bad one) is
// restored with every statement that runs; the others are kept in a file
// beside it, as a worksheet with each reason, and the note says where.
func TestRestorePartial(t *testing.T) {
	dir := t.TempDir()
	m := newModel(t, Options{Dir: dir})
	path := m.s.path
	m.Close()
	data := `{"argand_session":1,"statements":["Za = 3+j4 Ω","Zb = Za / 0","Zc = Zb * 2","Zd = 10 Ω","nosuch + 1","Ze = Zd || Za"],"view":{}}`
	if err := os.WriteFile(path, []byte(data), 0o600); err != nil {
		t.Fatal(err)
	}
	m2 := newModel(t, Options{Dir: dir})
	defer m2.Close()
	for _, n := range []string{"Za", "Zd", "Ze"} {
		if _, ok := m2.s.sh.Lookup(n); !ok {
			t.Errorf("%s not restored", n)
		}
	}
	if _, ok := m2.s.sh.Lookup("R1"); ok {
		t.Errorf("the example was started instead of the session")
	}
	kept, _ := filepath.Glob(strings.TrimSuffix(path, filepath.Ext(path)) + ".not-restored-*.argand")
	if len(kept) != 1 {
		t.Fatalf("kept files %v, want one", kept)
	}
	b, _ := os.ReadFile(kept[0])
	for _, want := range []string{"language ", "Zb = Za / 0", "Zc = Zb * 2", "nosuch + 1", "division by zero", "skipped: depends on line 2"} {
		if !strings.Contains(string(b), want) {
			t.Errorf("kept file lacks %q:\n%s", want, b)
		}
	}
	if strings.Contains(string(b), "Zd = 10 Ω") {
		t.Errorf("kept file holds a restored statement:\n%s", b)
	}
	if !strings.Contains(m2.msg, "3 statement(s) not restored, kept in "+filepath.Base(kept[0])+" (2, 3, 5: division by zero)") {
		t.Errorf("note %q does not list them and the file", m2.msg)
	}
	// the session file now holds what was restored, in the current language
	b, _ = os.ReadFile(path)
	if !strings.Contains(string(b), `"language": `) || strings.Contains(string(b), "nosuch") {
		t.Errorf("session file after restore:\n%s", b)
	}
}

// N on a compact network shows its elements and its reduction (it once
// said the network had no elements), and opens the newest network.
func TestNetworkViewCompact(t *testing.T) {
	m := newModel(t, Options{})
	for _, l := range []string{"resistor R1 = 10 Ω", "inductor L1 = 10 mH", "resistor R2 = 4.7 Ω", "capacitor C1 = 100 µF",
		"network ckt = R1 + (L1 || (R2 + C1)) fed by 24 V"} {
		typeLine(t, m, l)
	}
	m.Update(tea.WindowSizeMsg{Width: 80, Height: 24})
	press(m, "N")
	if m.mode != modeNet || m.net.name != "ckt" {
		t.Fatalf("N: mode %s, message %q", m.mode, m.msg)
	}
	v := m.View()
	for _, want := range []string{"compact form", "R1", "L1", "R2", "C1", "source", "0 of"} {
		if !strings.Contains(v, want) {
			t.Errorf("compact network view lacks %q:\n%s", want, v)
		}
	}
	if strings.Contains(v, "no elements") {
		t.Errorf("compact network said to have no elements:\n%s", v)
	}
	press(m, "right")
	if !strings.Contains(m.View(), "Zeq1") {
		t.Errorf("first step names no equivalent:\n%s", m.View())
	}
}

// While the terminal is too small only the notice shows: keys other than
// quit must not touch the session, the entry line or the mode.
func TestSmallIgnoresKeys(t *testing.T) {
	tests := []struct {
		name  string
		keys  []string
		quits bool
	}{
		{name: "delete a row", keys: []string{"d"}},
		{name: "type a statement", keys: []string{"tab", "Z", "x", " ", "=", " ", "5", "enter"}},
		{name: "paste lines", keys: []string{"Zy = 1\n"}},
		{name: "undo", keys: []string{"ctrl+z", "u"}},
		{name: "help", keys: []string{"?"}},
		{name: "quit with q", keys: []string{"q"}, quits: true},
		{name: "quit with ctrl+c", keys: []string{"ctrl+c"}, quits: true},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := newModel(t, Options{})
			typeLine(t, m, "Za = 3 Ω")
			before := len(m.s.sh.Statements())
			mode := m.mode
			m.Update(tea.WindowSizeMsg{Width: narrowWidth - 1, Height: narrowHeight})
			var cmd tea.Cmd
			for _, k := range tc.keys {
				msg := keyMsg(k)
				if strings.Contains(k, "\n") {
					msg = tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune(k), Paste: true}
				}
				_, cmd = m.Update(msg)
			}
			if got := len(m.s.sh.Statements()); got != before {
				t.Errorf("statements %d, want %d", got, before)
			}
			if m.mode != mode {
				t.Errorf("mode %v, want %v", m.mode, mode)
			}
			if m.quitting != tc.quits || (cmd != nil) != tc.quits {
				t.Errorf("quitting %v (cmd %v), want %v", m.quitting, cmd != nil, tc.quits)
			}
			if !tc.quits {
				// back at a usable size the session is as it was
				m.Update(tea.WindowSizeMsg{Width: 80, Height: 24})
				if got := value(t, m, "Za"); got != 3 {
					t.Errorf("Za = %v after resize", got)
				}
			}
		})
	}
}

// TestEquivalentNotForSizes: the element column says what an impedance is
// at the working frequency (Z = R + jωL, common practice); a magnitude
// |Z| or a signed real is no element, so it gets no R, L or C there.
func TestEquivalentNotForSizes(t *testing.T) {
	omega := 2 * math.Pi * 50
	tests := []struct {
		q    calc.Quantity
		want string
	}{
		{calc.Quantity{V: 5, Dim: calc.DimImpedance, Kind: calc.KindMagnitude}, ""},
		{calc.Quantity{V: -3, Dim: calc.DimImpedance, Kind: calc.KindSigned}, ""},
		{calc.Quantity{V: 5, Dim: calc.DimImpedance, Kind: calc.KindResistive}, "R 5.000 Ω"},
		{calc.Quantity{V: 5, Dim: calc.DimImpedance}, "R 5.000 Ω"},
	}
	for _, tt := range tests {
		if got := equivalent(calc.Format{}, tt.q, omega); got != tt.want {
			t.Errorf("equivalent(%v, kind %d) = %q, want %q", tt.q.V, tt.q.Kind, got, tt.want)
		}
	}
}
