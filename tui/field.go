package tui

import (
	"fmt"
	"strings"

	"argand/calc"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/x/ansi"
)

// maxField bounds the text of one field, in bytes: the worksheet's line
// limit, so that the field holds any statement the worksheet can run and
// nothing that it must refuse.
const maxField = calc.MaxLine

// field is a one-line text editor: the entry line and the answers to
// questions both use it. It keeps no terminal state and never blinks, so
// a keystroke redraws one line and nothing else.
type field struct {
	text []rune
	pos  int
}

func (f *field) String() string { return string(f.text) }

// set replaces the text whole; it is never cut.
func (f *field) set(s string) {
	f.text = []rune(s)
	f.pos = len(f.text)
}

// tooLongError refuses an insert that would make the text longer than
// maxField: nothing of it is inserted, so nothing is cut silently.
type tooLongError struct{ size int }

func (e *tooLongError) Error() string {
	return fmt.Sprintf("not inserted: the line would be %d bytes, and a statement holds at most %d; the line is as it was", e.size, maxField)
}

// insert puts runes at the cursor. Control characters are dropped and
// line breaks become spaces; the caller deals with pasted lines before.
// Text that would pass maxField is refused whole, with a *tooLongError.
func (f *field) insert(rs []rune) (bool, error) {
	clean := make([]rune, 0, len(rs))
	for _, r := range rs {
		switch {
		case r == '\n' || r == '\r' || r == '\t':
			clean = append(clean, ' ')
		case r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0):
		default:
			clean = append(clean, r)
		}
	}
	if len(clean) == 0 {
		return false, nil
	}
	if n := len(string(f.text)) + len(string(clean)); n > maxField {
		return false, &tooLongError{size: n}
	}
	f.text = append(f.text[:f.pos], append(clean, f.text[f.pos:]...)...)
	f.pos += len(clean)
	return true, nil
}

// cell is a character as the field draws it: a character a terminal
// would act on (a bidirectional override, say) as its visible escape.
func cell(r rune) string { return calc.PrintableRune(r) }

// cellWidth is the width of a character as the field draws it.
func cellWidth(r rune) int {
	if r >= 0x20 && r < 0x7f {
		return 1
	}
	return ansi.StringWidth(cell(r))
}

func (f *field) left() bool {
	if f.pos == 0 {
		return false
	}
	f.pos--
	return true
}

func (f *field) right() bool {
	if f.pos >= len(f.text) {
		return false
	}
	f.pos++
	return true
}

func (f *field) home() bool { p := f.pos; f.pos = 0; return p != 0 }
func (f *field) end() bool  { p := f.pos; f.pos = len(f.text); return p != f.pos }

func (f *field) backspace() bool {
	if f.pos == 0 {
		return false
	}
	f.text = append(f.text[:f.pos-1], f.text[f.pos:]...)
	f.pos--
	return true
}

func (f *field) del() bool {
	if f.pos >= len(f.text) {
		return false
	}
	f.text = append(f.text[:f.pos], f.text[f.pos+1:]...)
	return true
}

func (f *field) kill() bool {
	if f.pos >= len(f.text) {
		return false
	}
	f.text = f.text[:f.pos]
	return true
}

func (f *field) clear() bool {
	if len(f.text) == 0 {
		return false
	}
	f.text, f.pos = nil, 0
	return true
}

// window returns the part of the text that fits in width cells with the
// cursor visible, the offset (in runes) of its first rune, and the cursor
// cell within it. Long text scrolls sideways; "…" is not used because a
// caret under the text must stay aligned.
func (f *field) window(width int) (start int) {
	if width < 2 {
		return f.pos
	}
	w := 0
	start = f.pos
	for start > 0 {
		rw := cellWidth(f.text[start-1])
		if w+rw > width-1 {
			break
		}
		w += rw
		start--
	}
	// show as much before the cursor as fits, but start at 0 when all fits
	total := 0
	for _, r := range f.text {
		total += cellWidth(r)
		if total >= width {
			return start
		}
	}
	return 0
}

// render draws the field in width cells with the cursor shown by cursor
// (a function styling the cell under the cursor). It returns the line and
// the rune offset of its first character.
func (f *field) render(width int, cursor func(string) string) (string, int) {
	start := f.window(width)
	var b strings.Builder
	w := 0
	for i := start; i <= len(f.text); i++ {
		ch := " "
		if i < len(f.text) {
			ch = cell(f.text[i])
		}
		cw := ansi.StringWidth(ch)
		if w+cw > width {
			break
		}
		if i == f.pos {
			b.WriteString(cursor(ch))
		} else {
			b.WriteString(ch)
		}
		w += cw
	}
	return b.String(), start
}

// edit applies an editing key of km to the field and reports whether k
// was one: the entry line and questions edit alike.
func (f *field) edit(k tea.KeyMsg, km EditKeys) bool {
	switch {
	case key.Matches(k, km.Left):
		f.left()
	case key.Matches(k, km.Right):
		f.right()
	case key.Matches(k, km.Home):
		f.home()
	case key.Matches(k, km.End):
		f.end()
	case key.Matches(k, km.Back):
		f.backspace()
	case key.Matches(k, km.Del):
		f.del()
	case key.Matches(k, km.Kill):
		f.kill()
	case key.Matches(k, km.Clear):
		f.clear()
	default:
		return false
	}
	return true
}
