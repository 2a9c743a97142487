package tui

import (
	"fmt"
	"os"
	"slices"
	"strings"
	"testing"

	"argand/tui/store"

	"github.com/charmbracelet/bubbles/key"
)

func TestKeysUniquePerMode(t *testing.T) {
	km := DefaultKeyMap()
	for _, md := range allModes {
		seen := map[string]string{}
		for _, b := range km.Mode(md) {
			if len(b.Keys()) == 0 || b.Help().Desc == "" {
				t.Errorf("%s: binding %v without keys or help", md, b.Help())
			}
			for _, k := range b.Keys() {
				if other, ok := seen[k]; ok {
					t.Errorf("%s: key %q bound to %q and %q", md, k, other, b.Help().Desc)
				}
				seen[k] = b.Help().Desc
			}
		}
	}
}

func TestHelpListsEveryBinding(t *testing.T) {
	m := newModel(t, Options{})
	help := strings.Join(m.helpScr.lines(), "\n")
	for _, md := range allModes {
		for _, b := range m.keys.Mode(md) {
			if !strings.Contains(help, b.Help().Key) || !strings.Contains(help, b.Help().Desc) {
				t.Errorf("%s: help lacks %q %q", md, b.Help().Key, b.Help().Desc)
			}
		}
	}
	if !strings.Contains(help, "lethal charge") || !strings.Contains(help, "qualified") {
		t.Errorf("help lacks the safety caution")
	}
}

// modelIn returns a model in mode md, in a state where every binding of
// the mode has something to act on.
func modelIn(t *testing.T, md mode) *Model {
	dir := t.TempDir()
	if md == modeLocked {
		first := newModel(t, Options{Dir: dir})
		_ = first
		m := newModel(t, Options{Dir: dir})
		if m.mode != modeLocked {
			t.Fatal("not locked")
		}
		return m
	}
	m := newModel(t, Options{Dir: dir})
	typeLine(t, m, "Za = 3+j4 Ω")
	typeLine(t, m, "Zb = 10 Ω")
	typeLine(t, m, "Zc = 5 Ω")
	m.s.v.Selected = m.s.rows()[1]
	m.s.v.Marks = []string{"Zb"}
	m.sync()
	m.trail.ScrollBy(5)
	m.line.history = []string{"Zx = 1 Ω", "Zy = 2 Ω"}
	m.line.hpos = 1
	m.line.f.set("Zq = 12")
	m.line.f.pos = 3
	switch md {
	case modeLine:
		press(m, "tab")
	case modePrompt:
		press(m, "R")
		m.ask.f.set("abc")
		m.ask.f.pos = 1
	case modeNet:
		press(m, "N", "right", "down")
	case modeExport:
		press(m, "x")
	case modeHelp:
		press(m, "?", "down")
	case modeTrail:
		press(m, "T", "up", "up")
	}
	if m.mode != md {
		t.Fatalf("setting up %s: in %s", md, m.mode)
	}
	return m
}

// state is what a key can change: the view and the model's own fields.
func state(m *Model) string {
	net := ""
	if m.net != nil {
		net = fmt.Sprint(m.net.name, m.net.step, m.net.sel)
	}
	ask := ""
	if m.ask != nil {
		ask = fmt.Sprint(m.ask.i, m.ask.f.String(), m.ask.f.pos)
	}
	return fmt.Sprint(m.View(), m.mode, m.msg, m.s.v, m.line.f.String(), m.line.f.pos, m.trail.back, m.full.back,
		len(m.s.sh.Statements()), m.helpScr.top, net, ask, m.quitting)
}

func TestEveryBindingActs(t *testing.T) {
	km := DefaultKeyMap()
	for _, md := range allModes {
		for _, b := range km.Mode(md) {
			for _, k := range b.Keys() {
				m := modelIn(t, md)
				before := state(m)
				cmd := press(m, k)
				if cmd == nil && state(m) == before {
					t.Errorf("%s: key %q (%s) changes nothing", md, k, b.Help().Desc)
				}
			}
		}
	}
	_ = key.NewBinding
	_ = store.Dir
}

// readmeKeyRows are the rows of the README's key table, written from the
// entries table's bindings: one row per group of its full help.
func readmeKeyRows(k TableKeys) []string {
	var rows []string
	for _, g := range k.FullHelp() {
		var keys, what []string
		for _, b := range g {
			keys = append(keys, "`"+b.Help().Key+"`")
			what = append(what, b.Help().Desc)
		}
		rows = append(rows, "| "+strings.Join(keys, " ")+" | "+strings.Join(what, "; ")+" |")
	}
	return rows
}

// The README's key table is the entries table's bindings, row for row.
func TestReadmeKeyTable(t *testing.T) {
	b, err := os.ReadFile("../README.md")
	if err != nil {
		t.Skip("README.md not found:", err)
	}
	_, rest, ok := strings.Cut(string(b), "| keys | what they do |\n| --- | --- |\n")
	if !ok {
		t.Fatal("README.md has no key table")
	}
	var got []string
	for _, l := range strings.Split(rest, "\n") {
		if !strings.HasPrefix(l, "|") {
			break
		}
		got = append(got, l)
	}
	want := readmeKeyRows(DefaultKeyMap().Table)
	if strings.Join(got, "\n") != strings.Join(want, "\n") {
		t.Errorf("README key table differs from the bindings; it should read:\n%s", strings.Join(want, "\n"))
	}
}

// Moving, copying and undoing use keys of argand's own: arrows,
// Home/End and PgUp/PgDn move, and no binding anywhere takes the letters
// a modal editor or a pager moves, copies or undoes with.
func TestKeysOwnScheme(t *testing.T) {
	km := DefaultKeyMap()
	banned := map[string]bool{"j": true, "k": true, "g": true, "G": true, "J": true, "K": true,
		"h": true, "l": true, "y": true, "Y": true, "u": true, "U": true}
	for _, md := range allModes {
		for _, b := range km.Mode(md) {
			for _, k := range b.Keys() {
				if banned[k] {
					t.Errorf("%s: %q is bound (%s)", md, k, b.Help().Desc)
				}
			}
		}
	}
	for _, c := range []struct {
		b    key.Binding
		keys []string
	}{
		{km.Table.Up, []string{"up"}}, {km.Table.Down, []string{"down"}},
		{km.Table.Top, []string{"home"}}, {km.Table.Bottom, []string{"end"}},
		{km.Table.TrailBack, []string{"pgup"}}, {km.Table.TrailOn, []string{"pgdown"}},
		{km.Full.Top, []string{"home"}}, {km.Full.End, []string{"end"}},
		{km.Full.PageUp, []string{"pgup"}}, {km.Full.PageDown, []string{"pgdown"}},
	} {
		for _, k := range c.keys {
			if !slices.Contains(c.b.Keys(), k) {
				t.Errorf("%q does not %s", k, c.b.Help().Desc)
			}
		}
	}
}

// The editing keys are bound once and act alike in the entry line and in
// a question: ctrl+b, ctrl+f, ctrl+d and ctrl+k included.
func TestEditingKeysInQuestions(t *testing.T) {
	for _, md := range []mode{modeLine, modePrompt} {
		m := modelIn(t, md)
		f := &m.line.f
		if md == modePrompt {
			f = &m.ask.f
		}
		f.set("abcdef")
		press(m, "ctrl+a", "ctrl+f", "ctrl+f", "ctrl+d", "ctrl+b", "ctrl+k")
		if got := f.String(); got != "a" {
			t.Errorf("%s: editing gave %q, want %q", md, got, "a")
		}
		f.set("xyz")
		press(m, "ctrl+u")
		if got := f.String(); got != "" {
			t.Errorf("%s: ctrl+u left %q", md, got)
		}
	}
}
