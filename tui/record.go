package tui

import (
	"errors"
	"fmt"
	"io/fs"
	"path/filepath"
	"strings"
	"time"

	"argand/tui/record"
	"argand/tui/store"
)

// SavedWorksheet returns the session argand opens when started without a
// file, as a worksheet (its language line, decimal marker and statements),
// for argand export. dir "" is the state directory (store.Dir). A session
// with statements that no longer run is refused: the app restores it and
// keeps those statements aside, and the record would lack them.
func SavedWorksheet(dir string) (string, error) {
	if dir == "" {
		d, err := store.Dir()
		if err != nil {
			return "", err
		}
		dir = d
	}
	path := filepath.Join(dir, "session.json")
	data, err := store.Load(path)
	if errors.Is(err, fs.ErrNotExist) {
		return "", fmt.Errorf("no saved session at %s: open argand and work, or name a worksheet file", path)
	}
	if err != nil {
		return "", err
	}
	sh, _, left, err := decode(data, false)
	if err != nil {
		return "", fmt.Errorf("%s: %v", path, err)
	}
	if len(left) > 0 {
		return "", fmt.Errorf("%s: %d statement(s) of the saved session no longer run; open argand to restore it, then export", path, len(left))
	}
	return strings.Join(sh.Worksheet(), "\n") + "\n", nil
}

// recordHTML is the session's job record (package record), dated today:
// the steps of the session as the trail holds them and the session as a
// worksheet, which replays to them.
func (m *Model) recordHTML() string {
	var b strings.Builder
	// the sheet is the session's own, and Write only reads it
	_ = record.Write(&b, record.Job{Sheet: m.s.sh, Source: m.worksheetText(), Date: time.Now().Format("2006-01-02"), PolarFirst: m.s.v.PolarFirst})
	return b.String()
}
