package tui

import (
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
)

func TestWrapLine(t *testing.T) {
	tests := []struct {
		in     string
		width  int
		indent int
		want   []string
	}{
		{"short", 20, 2, []string{"short"}},
		// the polar value stays whole: the break comes before "="
		{"    → Is = 525.6 - j473.2 mA = 707.2 mA ∠-41.99°", 40, 6,
			[]string{"    → Is = 525.6 - j473.2 mA", "      = 707.2 mA ∠-41.99°"}},
		{"    note: Capacitor banks: a capacitor can hold a lethal charge", 30, 10,
			[]string{"    note: Capacitor banks: a", "          capacitor can hold a", "          lethal charge"}},
		// a word longer than the line is cut by cells
		{"abcdefghij", 4, 0, []string{"abcd", "efgh", "ij"}},
		// a rectangular value stays whole, its imaginary part with its
		// real part
		{"Zr = 25.00 + j8.333 Ω = 26.35 Ω ∠18.43°", 24, 2, []string{"Zr = 25.00 + j8.333 Ω", "  = 26.35 Ω ∠18.43°"}},
		// a value too long for a line breaks before its angle, its unit
		// kept with its number; not inside a number
		{"    995.34046362044476 kΩ ∠82.874983715379045°", 40, 6,
			[]string{"    995.34046362044476 kΩ", "      ∠82.874983715379045°"}},
		// a word longer than the line is cut before a number in it
		{"Zfeeder_12345", 10, 0, []string{"Zfeeder_", "12345"}},
	}
	for _, tt := range tests {
		got := wrapLine(tt.in, tt.width, tt.indent)
		if strings.Join(got, "|") != strings.Join(tt.want, "|") {
			t.Errorf("wrapLine(%q, %d, %d) = %q, want %q", tt.in, tt.width, tt.indent, got, tt.want)
		}
		for _, l := range got {
			if ansi.StringWidth(l) > tt.width {
				t.Errorf("wrapLine(%q): %q is wider than %d", tt.in, l, tt.width)
			}
		}
		if strings.Join(strings.Fields(strings.Join(got, " ")), "") != strings.Join(strings.Fields(tt.in), "") {
			t.Errorf("wrapLine(%q) lost text: %q", tt.in, got)
		}
	}
}

// The caution beside a power-factor correction reads whole in the trail
// at 80 columns, and T shows every step at full width.
func TestTrailWrapsCaution(t *testing.T) {
	m := newModel(t, Options{})
	typeLine(t, m, "corr = pfc(10 kW, 0.8, 0.95, 400 V, three)")
	m.View()
	_, _, sketchW := m.layout()
	paneW := m.width - sketchW - 1
	var all []string
	for _, l := range m.trail.lines() {
		if w := ansi.StringWidth(l.text); w > paneW && !l.pre {
			t.Errorf("trail line wider than the pane (%d > %d): %q", w, paneW, l.text)
		}
		all = append(all, strings.TrimSpace(l.text))
	}
	joined := strings.Join(all, " ")
	for _, w := range []string{"a capacitor can hold a lethal charge after disconnection", "licensed practice."} {
		if !strings.Contains(joined, w) {
			t.Errorf("trail lacks %q", w)
		}
	}
	// scrolling back reaches the caution on screen
	found := false
	for i := 0; i < 40 && !found; i++ {
		found = strings.Contains(m.View(), "lethal charge")
		press(m, "[")
	}
	if !found {
		t.Errorf("scrolling the trail never shows the caution")
	}
	press(m, "T")
	if m.mode != modeTrail {
		t.Fatalf("T: mode %s", m.mode)
	}
	v := m.View()
	if !strings.Contains(v, "trail in full") {
		t.Errorf("full trail view:\n%s", v)
	}
	press(m, "home")
	if !strings.Contains(m.View(), "lines 1-") {
		t.Errorf("g does not go to the first step:\n%s", m.View())
	}
	press(m, "esc")
	if m.mode != modeRows {
		t.Errorf("esc: mode %s", m.mode)
	}
}

// A long live error keeps its caret under the column of the error; the
// message moves to the line below when it does not fit beside the caret.
func TestCaretStaysUnderError(t *testing.T) {
	for _, width := range []int{60, 80, 120} {
		m := newModel(t, Options{})
		m.Update(tea.WindowSizeMsg{Width: width, Height: 24})
		press(m, "tab")
		src := "Zx = 1 Ω + 2 Ω + 3 Ω + 4 Ω + 5 Ω + 6 Ω + 7 Ω + 8 Ω + 9 Ω + 5 V"
		for _, r := range src {
			m.Update(keyMsg(string(r)))
		}
		lines := strings.Split(m.View(), "\n")
		entry, fb, hint := lines[len(lines)-3], lines[len(lines)-2], lines[len(lines)-1]
		col := ansi.StringWidth(fb[:strings.Index(fb, "^")])
		under := []rune(ansi.Strip(entry))
		if col >= len(under) || under[col] != '+' {
			t.Errorf("width %d: caret at cell %d is not under the last +:\n%s\n%s", width, col, entry, fb)
		}
		if !strings.Contains(fb+hint, "error: cannot combine") {
			t.Errorf("width %d: message not shown:\n%s\n%s", width, fb, hint)
		}
	}
}

// In ASCII mode the sheets the app makes draw their own text (a sweep's
// plot) in ASCII, so the plot keeps its shape rather than showing '?'.
func TestASCIISweepPlot(t *testing.T) {
	m := newModel(t, Options{ASCII: true})
	typeLine(t, m, "sweep 1/(j*w*1 uF) from 10 Hz to 10 kHz")
	if !m.s.sh.Context().Format.ASCII {
		t.Fatal("sheet format not in ASCII mode")
	}
	m.Update(tea.WindowSizeMsg{Width: 120, Height: 40})
	press(m, "T")
	m.View()
	pre := 0
	for _, l := range m.full.lines() {
		for _, r := range l.text {
			if r >= 0x80 {
				t.Errorf("not ASCII: %q", l.text)
				break
			}
		}
		if l.pre {
			pre++
		}
	}
	if pre < 5 {
		t.Errorf("no plot in the trail (%d plot lines)", pre)
	}
}

// Over a slow link esc and the next key can arrive in one read, as
// alt+key: in the entry line that leaves the line and acts on the key
// instead of typing it.
func TestAltKeyLeavesLine(t *testing.T) {
	m := newModel(t, Options{})
	press(m, "tab")
	for _, r := range "Zw = 2 Ω" {
		m.Update(keyMsg(string(r)))
	}
	m.Update(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("?"), Alt: true})
	if m.mode != modeHelp || m.line.f.String() != "Zw = 2 Ω" {
		t.Errorf("alt+? in the line: mode %s, line %q", m.mode, m.line.f.String())
	}
}

// cut looks at a bounded start of a long piece; it must give what
// truncating the whole piece gives, with wide runes, zero-width runes and
// escape sequences in it.
func TestCutMatchesTruncate(t *testing.T) {
	tests := []struct {
		name string
		s    string
		room int
	}{
		{name: "short", s: "1+1+1", room: 3},
		{name: "long digits", s: strings.Repeat("1+", 5000), room: 37},
		{name: "wide runes", s: strings.Repeat("∠Ω漢", 3000), room: 20},
		{name: "zero-width marks fill the start", s: "a" + strings.Repeat("\u0301", 2000) + strings.Repeat("b", 100), room: 10},
		{name: "escape sequences fill the start", s: strings.Repeat("\x1b[1m\x1b[0m", 200) + strings.Repeat("c", 100), room: 10},
		{name: "room 1", s: strings.Repeat("x", 1000), room: 1},
	}
	for _, tc := range tests {
		if got, want := cut(tc.s, tc.room), ansi.Truncate(tc.s, tc.room, ""); got != want {
			t.Errorf("%s: cut %q, want %q", tc.name, short(got, 40), short(want, 40))
		}
	}
}

// A long piece without spaces (a 60 KB sum) is cut into lines that keep
// every byte, in order, each within the width.
func TestWrapLongPiece(t *testing.T) {
	s := "Zp = 1" + strings.Repeat("+1", 30000)
	lines := wrapLine(s, 77, 4)
	var b strings.Builder
	for i, l := range lines {
		if w := ansi.StringWidth(l); w > 77 {
			t.Fatalf("line %d of %d cells", i, w)
		}
		if i > 0 {
			l = strings.TrimPrefix(l, "    ")
		}
		b.WriteString(l)
	}
	if got := strings.ReplaceAll(b.String(), " ", ""); got != strings.ReplaceAll(s, " ", "") {
		t.Errorf("the wrapped lines do not give back the piece (%d bytes, want %d)", len(got), len(s))
	}
}
