package tui

import (
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"unicode/utf8"

	"argand/tui/internal/golden"

	"github.com/charmbracelet/bubbles/key"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
)

// narrowGoldens are the screens of the narrow layout kept as goldens:
// at the smallest size it takes, at a phone's usual 50×30, and at the
// widest narrow width. Keys as in TestGolden.
var narrowGoldens = []struct {
	name  string
	w, h  int
	ascii bool
	keys  []string
}{
	{"narrow-rows-40x20", 40, 20, false, []string{"home", " ", "down", " "}},
	{"narrow-trail-40x20", 40, 20, false, []string{"m"}},
	{"narrow-network-40x20", 40, 20, false, []string{"m", "m", "m", "right", "right", "down"}},
	{"narrow-help-40x20", 40, 20, false, []string{"?"}},
	{"narrow-rows-50x30", 50, 30, false, []string{"down", "down", "down", " ", "down", "down", " "}},
	{"narrow-sketch-50x30", 50, 30, false, []string{"down", "down", "down", " ", "down", "down", " ", "m", "m"}},
	{"narrow-rows-50x30-ascii", 50, 30, true, []string{"end", " ", "up", " "}},
	{"narrow-rows-59x24", 59, 24, false, []string{"end", "o"}},
	{"narrow-network-59x24", 59, 24, false, []string{"N", "tab", "right"}},
}

func TestNarrowGolden(t *testing.T) {
	for _, c := range narrowGoldens {
		t.Run(c.name, func(t *testing.T) {
			m := newModel(t, Options{ASCII: c.ascii})
			m.note(false, "")
			m.Update(tea.WindowSizeMsg{Width: c.w, Height: c.h})
			press(m, c.keys...)
			got := m.View()
			checkScreen(t, c.name, got, c.w, c.h)
			golden.Check(t, filepath.Join("testdata", c.name+".golden"), got)
		})
	}
}

// The goldens as kept on disk pass the same checks as the views that
// write them: no number cut at the right edge, nothing wider than the
// screen.
func TestNarrowGoldenFiles(t *testing.T) {
	for _, c := range narrowGoldens {
		b, err := os.ReadFile(filepath.Join("testdata", c.name+".golden"))
		if err != nil {
			t.Fatalf("%v (go test -update writes it)", err)
		}
		checkScreen(t, c.name, string(b), c.w, c.h)
	}
}

// cutAtEdge finds a number cut short at the right edge of a line: an
// ellipsis ("…", "~" in ASCII) straight after a digit or decimal mark,
// or a line that fills the width and ends in a digit or decimal mark
// whose last word is no word of the whole texts (whole, from the same
// session written without a width).
var cutAtEdge = regexp.MustCompile(`[0-9.,](…|~)\s*$`)

// checkScreen checks a screen of the narrow layout line by line: the
// height, no line wider than the width, no number cut at its right edge.
func checkScreen(t *testing.T, what, screen string, w, h int) {
	t.Helper()
	lines := strings.Split(screen, "\n")
	if len(lines) != h {
		t.Errorf("%s: %d lines, want %d", what, len(lines), h)
	}
	for i, l := range lines {
		plain := ansi.Strip(l)
		if lw := ansi.StringWidth(plain); lw > w {
			t.Errorf("%s: line %d is %d cells wide (screen %d): %q", what, i+1, lw, w, plain)
		}
		if cutAtEdge.MatchString(plain) {
			t.Errorf("%s: line %d ends in a number cut short: %q", what, i+1, plain)
		}
	}
}

// checkEdges is checkScreen with the second test for a cut number: a
// line filling the width that ends in a digit must end in a word found
// whole in the session's texts.
func checkEdges(t *testing.T, what, screen string, w, h int, whole map[string]bool) {
	t.Helper()
	checkScreen(t, what, screen, w, h)
	for i, l := range strings.Split(screen, "\n") {
		plain := ansi.Strip(l)
		r, _ := utf8.DecodeLastRuneInString(plain)
		if ansi.StringWidth(plain) < w || !numberRune(r) {
			continue
		}
		f := strings.Fields(plain)
		if last := f[len(f)-1]; !whole[last] {
			t.Errorf("%s: line %d fills the width and ends in %q, not a whole word: %q", what, i+1, last, plain)
		}
	}
}

// wholeWords are the words of a session's texts written without a width
// limit: the trail, every row in both forms, the help and the screen at
// a width where nothing is cut.
func wholeWords(m *Model) map[string]bool {
	w, h, mode := m.width, m.height, m.mode
	var texts []string
	texts = append(texts, m.trailText())
	f := m.format()
	for _, r := range m.s.rows() {
		q, _ := m.s.sh.Lookup(r)
		texts = append(texts, r, f.Rect(q), f.Polar(q), equivalent(f, q, m.s.sh.Context().Omega()))
	}
	m.width, m.height = 400, 400
	texts = append(texts, m.View(), strings.Join(m.helpScr.lines(), "\n"), m.msg, m.line.Signature())
	m.width, m.height, m.mode = w, h, mode
	out := map[string]bool{}
	for _, t := range texts {
		for _, f := range strings.Fields(ansi.Strip(m.tr(t))) {
			out[f] = true
		}
	}
	return out
}

// narrowStates put a model in each state a narrow screen shows, from the
// entries table: the panes, a network step by step, help and the trail
// in full scrolled through, a question, the export choice, an error
// being typed and a long outcome.
var narrowStates = []struct {
	name string
	keys []string
}{
	{"entries", nil},
	{"entries marked", []string{"home", " ", "down", " ", "end"}},
	{"polar first", []string{"o", "end"}},
	{"trail", []string{"m"}},
	{"trail back", []string{"m", "pgup", "pgup"}},
	{"sketch", []string{"down", "down", "down", " ", "down", "down", " ", "m", "m"}},
	{"power triangle", []string{"e", "S1 = 3+j4 kVA", "enter", "esc", "m", "m"}},
	{"network", []string{"m", "m", "m"}},
	{"network steps", []string{"N", "tab", "right", "right", "right", "down", "down"}},
	{"network end", []string{"N", "right", "right", "right", "right", "right", "right", "right", "right"}},
	{"help", []string{"?"}},
	{"trail in full", []string{"T"}},
	{"trail in full, first", []string{"T", "home"}},
	{"question", []string{"v"}},
	{"question asked twice", []string{"t", "enter"}},
	{"question with a long offer", []string{"e", "Zfeeder_section_one = 5 Ω", "enter", "Zfeeder_section_two = 7 Ω", "enter",
		"Zfeeder_section_three = 9 Ω", "enter", "esc", "home", " ", "down", " ", "down", " ", "c", "enter"}},
	{"sweep plot", []string{"e", "Zs = 10 Ω + 10 mH + 100 nF", "enter", "sweep Zs from 1 kHz to 20 kHz points 61 log", "enter", "esc", "m"}},
	{"sweep plot in full", []string{"e", "Zs = 10 Ω + 10 mH + 100 nF", "enter", "sweep Zs from 1 kHz to 20 kHz points 61 log", "enter", "esc", "T"}},
	{"export", []string{"x"}},
	{"error typed", []string{"e", "Zq = (12.5 + j7.25"}},
	{"call typed", []string{"e", "Vk = vdiv(230 V, 12.5 Ω"}},
	{"long outcome", []string{"e", "Zlong = 123.456789 + j987.654321 kΩ", "enter", "esc"}},
	{"more digits", []string{">", ">", ">", ">", ">", ">", "end"}},
	{"caution", []string{"e", "Qc = pfc(10 kW, 0.7, 0.95, 400 V, three)", "enter"}},
	{"17 digits", []string{"e", "digits 17", "enter", "Zfeeder_section_12 = 123.456789123+j987.654321987 kΩ", "enter",
		"Yshunt = 1/Zfeeder_section_12", "enter", "esc", "home", " ", "down", " "}},
	{"17 digits, network", []string{"e", "digits 17", "enter", "esc", "m", "m", "m", "right", "right"}},
	{"17 digits, trail", []string{"e", "digits 17", "enter", "Zw = 1.23456789+j9.87654321 Ω", "enter", "esc", "m"}},
}

// pressText sends keys; a key longer than one character that is no key
// name is typed as text.
func pressText(m *Model, keys ...string) {
	for _, k := range keys {
		if utf8.RuneCountInString(k) > 1 && keyMsg(k).Type == tea.KeyRunes {
			for _, r := range k {
				m.Update(keyMsg(string(r)))
			}
			continue
		}
		press(m, k)
	}
}

// Every state of the narrow layout at every width from 40 to 59, at a
// phone's heights: no line wider than the screen, no number cut at the
// right edge. Help and the trail in full are paged through to the end.
func TestNarrowNoNumberCut(t *testing.T) {
	for _, ascii := range []bool{false, true} {
		for _, st := range narrowStates {
			m := newModel(t, Options{ASCII: ascii})
			pressText(m, st.keys...)
			whole := wholeWords(m)
			for w := narrowWidth; w < minWidth; w++ {
				for _, h := range []int{narrowHeight, 30} {
					m.Update(tea.WindowSizeMsg{Width: w, Height: h})
					name := st.name + " " + sizeName(w, h, ascii)
					v := m.View()
					checkEdges(t, name, v, w, h, whole)
					if ascii && m.mode != modeHelp && m.mode != modeTrail {
						// written in ASCII, not made ASCII at the last
						// step, where a symbol becomes "?"
						// (the typed text apart, and "…", which the
						// screen writes "~")
						entry := m.entryView()
						for _, l := range m.narrowView() {
							if l != entry && strings.ContainsFunc(l, func(r rune) bool { return r >= utf8.RuneSelf && r != '…' }) {
								t.Errorf("%s: not ASCII before the screen: %q", name, l)
							}
						}
					}
					if m.mode != modeHelp && m.mode != modeTrail {
						continue
					}
					// paged through to the end and back to the start
					for i := 0; i < 200; i++ {
						press(m, "pgdown")
						next := m.View()
						if next == v {
							break
						}
						v = next
						checkEdges(t, name+" paged", v, w, h, whole)
					}
					for i := 0; i < 200 && m.helpScr.top > 0; i++ {
						press(m, "pgup")
					}
					if m.mode == modeTrail {
						press(m, "end")
					}
				}
			}
		}
	}
}

func sizeName(w, h int, ascii bool) string {
	s := fmt.Sprintf("%dx%d", w, h)
	if ascii {
		s += " ascii"
	}
	return s
}

// The pane key shows entries, trail, sketch and the network in turn on a
// narrow screen, and back to the entries; with no network it goes from
// the sketch to the entries and says why. On a wide screen it only says
// what it is for.
func TestNarrowPaneKey(t *testing.T) {
	m := newModel(t, Options{})
	m.Update(tea.WindowSizeMsg{Width: 40, Height: 20})
	for _, want := range []string{"── trail", "── sketch", "── network ladder", "── entries", "── trail"} {
		press(m, "m")
		if v := m.View(); !strings.Contains(v, want) {
			t.Errorf("after m: no %q:\n%s", want, v)
		}
	}
	// esc leaves the network view for the pane it was opened from
	press(m, "N", "esc")
	if v := m.View(); m.mode != modeRows || !strings.Contains(v, "── trail") {
		t.Errorf("esc from the network: mode %v\n%s", m.mode, v)
	}

	plain := filepath.Join(t.TempDir(), "plain.argand")
	if err := os.WriteFile(plain, []byte("Z1 = 5 Ω\n"), 0o600); err != nil {
		t.Fatal(err)
	}
	blank := newModel(t, Options{File: plain})
	blank.Update(tea.WindowSizeMsg{Width: 40, Height: 20})
	press(blank, "m", "m", "m")
	if v := blank.View(); !strings.Contains(v, "── entries") || !strings.Contains(v, "no network") {
		t.Errorf("no network: \n%s", v)
	}

	wide := newModel(t, Options{})
	press(wide, "m")
	if wide.mode != modeRows || !strings.Contains(wide.msg, "under 60 columns") {
		t.Errorf("m on a wide screen: mode %v, %q", wide.mode, wide.msg)
	}
	press(wide, "N", "m")
	if wide.mode != modeNet {
		t.Errorf("m closed the network view on a wide screen")
	}
}

// At 40×20 every key of every part is written in the help screen, which
// pages to its end; the keys that open it are on the hint line of each
// part that has one.
func TestNarrowHelpReachable(t *testing.T) {
	m := newModel(t, Options{})
	m.Update(tea.WindowSizeMsg{Width: narrowWidth, Height: narrowHeight})
	for _, md := range []mode{modeRows, modeLine, modePrompt, modeNet} {
		mm := modelIn(t, md)
		mm.Update(tea.WindowSizeMsg{Width: narrowWidth, Height: narrowHeight})
		lines := strings.Split(mm.View(), "\n")
		hint := lines[len(lines)-1]
		var k key.Binding
		switch md {
		case modeRows:
			k = mm.keys.Table.Help
		case modeLine:
			k = mm.keys.Line.Help
		case modeNet:
			k = mm.keys.Net.Help
		default:
			continue // a question is answered or cancelled first
		}
		first, _, _ := strings.Cut(k.Help().Key, "/")
		if !strings.Contains(hint, first+" help") {
			t.Errorf("%s: hint line %q does not offer %s help", md, hint, first)
		}
	}
	press(m, "?")
	var seen []string
	for i := 0; i < 100; i++ {
		lines := strings.Split(m.View(), "\n")
		seen = append(seen, lines[:len(lines)-1]...)
		if strings.Contains(lines[len(lines)-1], fmt.Sprintf("of %d lines", len(m.helpScr.lines()))) &&
			strings.Contains(lines[len(lines)-1], fmt.Sprintf("-%d of", len(m.helpScr.lines()))) {
			break
		}
		press(m, "pgdown")
	}
	// descriptions wrap in their column: read them with the lines joined
	all := strings.Join(strings.Fields(strings.Join(seen, " ")), " ")
	for _, md := range allModes {
		for _, b := range m.keys.Mode(md) {
			if !strings.Contains(all, b.Help().Key) || !strings.Contains(all, strings.Join(strings.Fields(b.Help().Desc), " ")) {
				t.Errorf("%s: %q %q not found paging through help at 40x20", md, b.Help().Key, b.Help().Desc)
			}
		}
	}
	press(m, "esc")
	if m.mode != modeRows {
		t.Errorf("esc left help in %v", m.mode)
	}
}

// A statement typed at 40×20 leaves its result readable whole: both
// forms in the outcome under the entry line and in the table, each value
// on a line with nothing of it cut. (40+j30)·50/(90+j30) = 25 + j8.333 Ω
// = 26.35 Ω ∠18.43°, product over sum (common practice).
func TestNarrowResultReadable(t *testing.T) {
	m := newModel(t, Options{})
	m.Update(tea.WindowSizeMsg{Width: narrowWidth, Height: narrowHeight})
	typeLine(t, m, "Zr = parallel(40+j30 Ω, 50 Ω)")
	v := m.View()
	for _, want := range []string{"25.00 + j8.333 Ω", "26.35 Ω ∠18.43°"} {
		n := 0
		for _, l := range strings.Split(v, "\n") {
			if strings.Contains(l, want) {
				n++
			}
		}
		if n < 2 {
			t.Errorf("%q on %d lines, want the outcome and the table:\n%s", want, n, v)
		}
	}
}

// A reduction step too long for its room keeps its result, then its
// first line, each line of text whole or not at all.
func TestKeepEnds(t *testing.T) {
	g := [][]string{{"a1", "a2"}, {"b1"}, {"c1", "c2"}, {"d1"}}
	tests := []struct {
		room int
		want string
	}{
		{6, "a1 a2 b1 c1 c2 d1"},
		{5, "a1 a2 c1 c2 d1"},
		{4, "a1 a2 d1"},
		{3, "a1 a2 d1"},
		{2, "d1"},
		{1, "d1"},
		{7, "a1 a2 b1 c1 c2 d1"},
		{0, ""},
	}
	for _, tt := range tests {
		if got := strings.Join(keepEnds(g, tt.room), " "); got != tt.want {
			t.Errorf("keepEnds(room %d) = %q, want %q", tt.room, got, tt.want)
		}
	}
}

// The README's narrow screen is the app's, at 40×20, on the plant room
// of its first worked example (invented example data).
func TestReadmeNarrowScreen(t *testing.T) {
	b, err := os.ReadFile("../README.md")
	if err != nil {
		t.Skip("README.md not found:", err)
	}
	readme := string(b)
	_, ex, ok := strings.Cut(readme, "Power and power-factor correction, a plant room")
	if !ok {
		t.Fatal("README has no plant room example")
	}
	_, ex, _ = strings.Cut(ex, "```\n")
	ex, _, _ = strings.Cut(ex, "```")
	_, shot, ok := strings.Cut(readme, "opened with `argand plant.argand` at 40×20:\n\n")
	if !ok {
		t.Fatal("README has no narrow screen")
	}
	var want []string
	for _, l := range strings.Split(shot, "\n") {
		if !strings.HasPrefix(l, "    ") {
			break
		}
		want = append(want, strings.TrimPrefix(l, "    "))
	}
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "plant.argand"), []byte(ex), 0o600); err != nil {
		t.Fatal(err)
	}
	// opened as the README says, from its directory
	t.Chdir(dir)
	m := newModel(t, Options{File: "plant.argand", Dir: filepath.Join(dir, "state")})
	m.Update(tea.WindowSizeMsg{Width: 40, Height: 20})
	got := strings.Split(m.View(), "\n")
	if len(got) != len(want) {
		t.Fatalf("README screen has %d lines, the app %d:\n%s", len(want), len(got), m.View())
	}
	for i := range got {
		g := strings.TrimRight(got[i], " ")
		if g != want[i] {
			t.Errorf("README screen line %d is %q, the app writes %q", i+1, want[i], g)
		}
	}
}
