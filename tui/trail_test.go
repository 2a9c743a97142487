package tui

import (
	"fmt"
	"reflect"
	"strings"
	"testing"

	"argand/calc"
	"argand/reduce/sheet"

	tea "github.com/charmbracelet/bubbletea"
)

func trailUpdate(t trailView, m tea.Msg) (trailView, tea.Msg) { return t.Update(m) }

// trailSteps runs n statements of example data on a fresh worksheet and
// returns it.
func trailSteps(t *testing.T, n int) *sheet.Sheet {
	t.Helper()
	sh := sheet.New()
	for i := 1; i <= n; i++ {
		if _, _, err := sh.Exec(fmt.Sprintf("Z%d = %d Ω", i, i)); err != nil {
			t.Fatal(err)
		}
	}
	return sh
}

// The trail pane shows the latest steps under a heading that names the
// key for the trail in full, and, scrolled back, how far and the key back.
func TestTrailPane(t *testing.T) {
	sh := trailSteps(t, 12)
	tv := newTrailView(DefaultKeyMap(), testTheme(false), false)
	tv.SetSize(40, 6)
	tv.SetSteps(sh, sh.Steps(), calc.Format{Digits: 4}, false)
	ls := strings.Split(tv.View(), "\n")
	if len(ls) != 6 || !strings.Contains(ls[0], "12 steps, T in full") || !strings.Contains(ls[5], "Z12") {
		t.Errorf("pane:\n%s", tv.View())
	}
	tv.ScrollBy(5)
	ls = strings.Split(tv.View(), "\n")
	if !strings.Contains(ls[0], "5 lines back (L: latest)") || strings.Contains(tv.View(), "Z12") {
		t.Errorf("scrolled back:\n%s", tv.View())
	}
	tv.ScrollBy(1000)
	if tv.back != len(tv.lines())-1 {
		t.Errorf("scrolled past the first line: back %d of %d lines", tv.back, len(tv.lines()))
	}
	tv.Latest()
	if !strings.Contains(tv.View(), "Z12") {
		t.Errorf("latest:\n%s", tv.View())
	}
	// a new worksheet with fewer steps is drawn anew
	sh2 := trailSteps(t, 1)
	tv.SetSteps(sh2, sh2.Steps(), calc.Format{Digits: 4}, false)
	if v := tv.View(); strings.Contains(v, "Z2") || !strings.Contains(v, "1 steps") {
		t.Errorf("another worksheet:\n%s", v)
	}
}

// The trail in full moves with its own keys, line and page, to the first
// and the latest step, and gives the keyboard back.
func TestTrailFullUpdate(t *testing.T) {
	sh := trailSteps(t, 30)
	page := 10 - 2
	tests := []struct {
		keys []string
		back int
		last tea.Msg
	}{
		{[]string{"up"}, 1, nil},
		{[]string{"up", "up", "down"}, 1, nil},
		{[]string{"down"}, 0, nil},
		{[]string{"pgup"}, page - 1, nil},
		{[]string{"pgup", "pgdown"}, 0, nil},
		{[]string{"home"}, -1, nil}, // the first line at the top
		{[]string{"home", "end"}, 0, nil},
		{[]string{"esc"}, 0, closeMsg{}},
		{[]string{"T"}, 0, closeMsg{}},
		{[]string{"ctrl+c"}, 0, quitMsg{}},
	}
	for _, tt := range tests {
		tv := newTrailView(DefaultKeyMap(), testTheme(false), true)
		tv.SetSize(60, 10)
		tv.SetSteps(sh, sh.Steps(), calc.Format{Digits: 4}, false)
		tv, msgs := drive(tv, trailUpdate, tt.keys...)
		want := tt.back
		if want < 0 {
			want = len(tv.lines()) - page
		}
		if tv.back != want || !reflect.DeepEqual(msgs[len(msgs)-1], tt.last) {
			t.Errorf("%v: back %d, message %#v; want %d, %#v", tt.keys, tv.back, msgs[len(msgs)-1], want, tt.last)
		}
	}
}

// The trail in full draws a heading with the lines shown, a page of
// steps and a footer of its keys from the bindings.
func TestTrailFullView(t *testing.T) {
	sh := trailSteps(t, 3)
	tv := newTrailView(DefaultKeyMap(), testTheme(false), true)
	tv.SetSize(60, 10)
	tv.SetSteps(sh, sh.Steps(), calc.Format{Digits: 4}, false)
	ls := strings.Split(tv.View(), "\n")
	n := len(tv.lines())
	if len(ls) != 10 || !strings.Contains(ls[0], fmt.Sprintf("3 steps, lines %d-%d of %d", max(1, n-8+1), n, n)) {
		t.Errorf("heading %q, %d lines", ls[0], len(ls))
	}
	if ls[9] != "esc back  ↓ line  pgdn page  home first  end latest" {
		t.Errorf("footer %q", ls[9])
	}
}
