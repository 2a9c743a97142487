package tui

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"time"

	"argand/reduce/sheet"
	"argand/tui/cli"
	"argand/tui/store"
)

// heldSession is a session another argand holds, or one that could not
// be locked: the user chooses what to do (session.choose).
type heldSession struct {
	path string
	pid  int   // the process holding it, when known
	err  error // why the lock could not be taken, when no one holds it
}

// ways say how the user does a thing where they are, for the messages
// that offer it: a key in the app, a word in the line mode.
type ways struct {
	undo, help, save string
}

// lineWays are the line mode's words.
func lineWays() ways { return ways{undo: "undo", help: "?", save: "save FILE"} }

// openSession opens the session for opt, as the app and the line mode
// both do, offering the ways w in its messages. What it did is in the
// session's msg; a session held elsewhere is in held.
func openSession(opt Options, w ways) *session {
	s := newSession(opt.ASCII)
	s.opt, s.ways = opt, w
	s.v.PolarFirst = opt.PolarFirst
	s.limits = opt.Limits
	s.start()
	return s
}

// say keeps what the session did, for the user.
func (s *session) say(isErr bool, msg string) { s.msg, s.msgErr = msg, isErr }

// sessionPath returns the session file for opt: one for the last session,
// and one per worksheet file opened.
func (s *session) sessionPath(suffix string) (string, error) {
	dir := s.opt.Dir
	if dir == "" {
		d, err := store.Dir()
		if err != nil {
			return "", err
		}
		dir = d
	}
	name := "session"
	if s.opt.File != "" {
		abs, err := filepath.Abs(s.opt.File)
		if err != nil {
			abs = s.opt.File
		}
		name = "worksheet-" + fileKey(abs)
	}
	return filepath.Join(dir, name+suffix+".json"), nil
}

// fileKey names a worksheet's session file: its base name (safe
// characters only) and a hash of its full path (FNV-1a, 32 bits).
func fileKey(abs string) string {
	h := uint32(2166136261)
	for i := 0; i < len(abs); i++ {
		h ^= uint32(abs[i])
		h *= 16777619
	}
	base := filepath.Base(abs)
	var b strings.Builder
	for _, r := range base {
		if r < 0x80 && (r == '-' || r == '_' || r == '.' || r >= '0' && r <= '9' || r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z') {
			b.WriteRune(r)
		}
		if b.Len() >= 32 {
			break
		}
	}
	return fmt.Sprintf("%s-%08x", b.String(), h)
}

// start takes the session lock and restores the last session (or opens
// opt.File, or the built-in example on first start). A session held by
// another argand, or one that cannot be locked, is left in held for the
// user to choose a read-only view or a separate session (choose).
func (s *session) start() {
	path, err := s.sessionPath("")
	if err != nil {
		s.say(true, "no place to keep the session ("+err.Error()+"): changes are not saved")
		s.fresh()
		s.decimalFlag()
		return
	}
	lk, err := store.Lock(path)
	if err != nil {
		// never two writers: a session that is held elsewhere, or that
		// cannot be locked at all, is not saved to; the user chooses a
		// read-only view or a separate session
		s.held = &heldSession{path: path}
		if pid, locked := lockedBy(err); locked {
			s.held.pid = pid
		} else {
			s.held.err = err
		}
		return
	}
	s.lock = lk
	s.path = path
	s.restore()
}

// restore loads the session file, or starts afresh when there is none.
// What taking the lock changed (a directory made private) is added to the
// outcome, never replaced by it.
func (s *session) restore() {
	ok, note, unreadable := s.loadFile(s.path)
	switch {
	case unreadable:
		// the file may be fine, only out of reach: keep it as it is, and
		// save nothing over it
		s.readOnly = true
		s.roWhy = "the session file cannot be read"
		s.lock.Unlock()
		s.lock = nil
		s.fresh()
		s.say(true, "read-only: "+note+"; showing a fresh worksheet, nothing is saved")
	case ok && s.opt.New:
		if note != "" {
			note += "; "
		}
		said, _ := s.blankStart()
		msg := note + said
		if s.opt.File != "" {
			s.fresh()
			s.save()
		}
		s.say(false, msg)
	case s.opt.New:
		s.loadWorksheet("", s.opt.Comma)
		if s.opt.File != "" {
			s.fresh()
		}
		s.say(false, "a new, empty session")
		s.save()
	case ok:
		if s.opt.File != "" {
			s.say(note != "", "restored your session on "+s.opt.File+" (the file itself is unchanged until you save with "+s.ways.save+")")
		} else {
			s.say(note != "", fmt.Sprintf("session restored: %d rows, %d steps", len(s.rows()), len(s.sh.Steps())))
		}
		if note != "" {
			s.msg += "; " + note
		}
		s.save()
	default:
		s.fresh()
		if note != "" {
			s.say(true, note)
		}
		s.save()
	}
	s.decimalFlag()
	if notes := s.lock.Notes(); len(notes) > 0 {
		s.msg += "; " + strings.Join(notes, "; ")
	}
}

// decimalFlag applies --decimal-comma: at once to an empty session, and
// to one with statements by the statement decimal comma, which the
// session keeps, so that what was typed before still reads as typed.
func (s *session) decimalFlag() {
	if !s.opt.Comma || s.sh.Settings().Comma || s.readOnly {
		return
	}
	if !s.sh.SetDecimalComma(true) {
		if _, _, err := s.exec(sheet.Job{}, "decimal comma"); err != nil {
			s.say(true, "decimal comma not set: "+err.Error())
			return
		}
	}
	s.save()
}

// blankStart starts a new, empty session: the one in use is kept as a
// worksheet file beside the session file (argand FILE opens it) and is one
// undo away. It returns what to tell the user, and whether it started
// one.
func (s *session) blankStart() (string, bool) {
	if s.readOnly {
		return s.errReadOnly().Error(), false
	}
	kept := ""
	if len(s.sh.Statements()) > 0 && s.path != "" {
		name := strings.TrimSuffix(s.path, filepath.Ext(s.path)) + ".before-new-" + time.Now().UTC().Format("20060102-150405") + ".argand"
		if err := store.Save(name, []byte(s.worksheetText())); err != nil {
			return "no new session: the one in use could not be kept as a file (" + err.Error() + ")", false
		}
		kept = name
	}
	s.checkpoint()
	pf := s.v.PolarFirst
	comma := s.sh.Settings().Comma
	s.sh, s.v, s.worksheet, s.dir = newSheet(s.ascii), view{PolarFirst: pf}, "", ""
	// the decimal marker is how the user writes numbers: a new session
	// keeps it
	s.sh.SetDecimalComma(comma)
	s.tidy()
	s.save()
	msg := "a new, empty session"
	switch {
	case kept != "":
		msg += " (" + s.ways.undo + " brings the old one back); the old one is kept in " + kept
	case len(s.undo) > 0 && len(s.undo[len(s.undo)-1].sh.Statements()) > 0:
		msg += "; undo brings the previous one back (it is not kept as a file: no place to keep it)"
	}
	s.say(false, msg)
	return msg, true
}

// fresh opens the worksheet file or the built-in example.
func (s *session) fresh() {
	pf := s.v.PolarFirst
	if s.opt.File != "" {
		s.worksheet, s.dir = s.opt.File, worksheetDir(s.opt.File)
		b, err := os.ReadFile(s.opt.File)
		switch {
		case err != nil:
			s.loadWorksheet("", s.opt.Comma)
			s.say(true, "could not open "+s.opt.File+": "+err.Error())
		default:
			if err := s.loadWorksheet(string(b), s.opt.Comma); err != nil {
				s.say(true, s.opt.File+": "+err.Error())
			} else {
				s.say(false, "opened "+s.opt.File)
			}
			if ch := s.sh.Changed(); len(ch) > 0 {
				// written for an older reading of input: say which lines
				// read differently now (each has a note in the trail)
				ls := make([]string, len(ch))
				for i, l := range ch {
					ls[i] = fmt.Sprint(l)
				}
				s.msg += fmt.Sprintf("; written in language %d, lines %s read differently now (see their notes)", s.sh.Language(), strings.Join(ls, ", "))
			}
		}
	} else {
		s.loadWorksheet(cli.ExampleIn(s.opt.Comma), s.opt.Comma)
		s.say(false, "first start: the built-in example worksheet (invented example data). "+s.ways.help+" for help")
	}
	s.v.PolarFirst = pf
	if s.opt.Digits > 0 && s.sh.Settings().Digits != s.opt.Digits {
		s.sh.Exec(fmt.Sprintf("digits %d", s.opt.Digits))
	}
	s.tidy()
}

// close releases the session lock.
func (s *session) close() {
	s.lock.Unlock()
	s.lock = nil
}

// choose acts on the answer to a session held elsewhere: a read-only
// view of it, or a separate session.
func (s *session) choose(readOnly bool) {
	h := s.held
	s.held = nil
	if readOnly {
		s.path = h.path
		s.readOnly = true
		s.holder = h.pid
		whose := "the session of the other argand"
		if h.err != nil {
			s.roWhy = "the session could not be locked"
			whose = "the session, not locked"
		}
		data, err := store.Load(h.path)
		if err == nil {
			var sh *sheet.Sheet
			var f file
			var left []leftOut
			if sh, f, left, err = decode(data, s.ascii); err == nil {
				s.sh, s.v, s.worksheet, s.dir = sh, f.View, f.Worksheet, f.dir()
				s.tidy()
				s.say(false, "read-only: "+whose+"; nothing you do here is kept")
				if len(left) > 0 {
					s.msg += fmt.Sprintf("; %d statement(s) of it could not be shown", len(left))
				}
				return
			}
		}
		s.fresh()
		if errors.Is(err, os.ErrNotExist) {
			s.say(false, "read-only: no session saved yet; a fresh worksheet, nothing you do here is kept")
			return
		}
		s.say(true, "read-only, but the session file could not be read ("+err.Error()+"); showing a fresh worksheet")
		return
	}
	for n := 2; n < 100; n++ {
		path, err := s.sessionPath(fmt.Sprintf("-%d", n))
		if err != nil {
			break
		}
		lk, err := store.Lock(path)
		if err != nil {
			continue
		}
		s.lock = lk
		s.path = path
		s.restore()
		s.say(false, "separate session in "+path)
		return
	}
	s.fresh()
	s.say(true, "no separate session could be locked; changes are not saved")
}
