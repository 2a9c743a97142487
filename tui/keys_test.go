package tui

import (
	"fmt"
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
	help := strings.Join(m.helpLines(), "\n")
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
	m.trail.scroll(m, 5)
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
		len(m.s.sh.Statements()), m.helpTop, net, ask, m.quitting)
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
