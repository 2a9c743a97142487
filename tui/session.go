package tui

import (
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"time"

	"argand/calc"
	"argand/reduce/sheet"
	"argand/tui/store"
)

// sessionVersion is written into every session file so that a later
// format can tell an old file from a corrupt one.
const sessionVersion = 1

// view is the state of the screen that is not part of the worksheet:
// which rows are marked and in what order, the order of the rows, the rows
// put away, which form is shown first, and the selected row. It is saved
// beside the worksheet statements in the session file.
type view struct {
	Order      []string `json:"order"`  // row names, top first
	Marks      []string `json:"marks"`  // marked names in the order marked
	Hidden     []string `json:"hidden"` // names removed from the table
	PolarFirst bool     `json:"polar_first"`
	Selected   string   `json:"selected"`
}

func (v view) clone() view {
	v.Order = slices.Clone(v.Order)
	v.Marks = slices.Clone(v.Marks)
	v.Hidden = slices.Clone(v.Hidden)
	return v
}

// file is the session file's content: the worksheet as its accepted
// statements, which replay to the same values, and the view.
type file struct {
	Version   int    `json:"argand_session"`
	Worksheet string `json:"worksheet,omitempty"` // the file opened, if any
	// Dir is the absolute directory of Worksheet when it was opened:
	// relative file names in the statements are read from there however
	// argand is started later. Absent in files saved before it.
	Dir        string   `json:"dir,omitempty"`
	Statements []string `json:"statements"`
	View       view     `json:"view"`
	// Language is the version of the input language the statements were
	// accepted in (calc.Language when saved); 0 in files saved before it.
	Language int `json:"language,omitempty"`
}

// snapshot is one point of the undo history. Sheets are cloned, so a
// snapshot never changes after it is taken.
type snapshot struct {
	sh *sheet.Sheet
	v  view
}

// session is the worksheet being worked on, its view, the undo history and
// where it is kept on disk.
type session struct {
	sh        *sheet.Sheet
	v         view
	undo      []snapshot
	redo      []snapshot
	path      string // session file; "" keeps nothing on disk
	worksheet string // worksheet file opened, the default target of a save
	dir       string // its absolute directory when opened (see file.Dir)
	readOnly  bool
	ascii     bool   // sheets are made in ASCII mode
	holder    int    // process holding the session when read-only, if known
	roWhy     string // why the session is read-only when no one else holds it
	saveErr   error  // last failure to save, shown until a save succeeds
	// limits bound the worksheet (a server's sessions set them); the
	// zero value keeps the worksheet's defaults
	limits sheet.Limits
	// forgot is set once the undo history has dropped its oldest state
	// to stay within limits.Undo
	forgot bool

	opt    Options         // how the session was opened
	lock   *store.FileLock // the session lock, while held
	held   *heldSession    // held elsewhere: the user has to choose
	ways   ways            // how the user undoes, gets help, saves
	msg    string          // what the session last did, for the user
	msgErr bool            // msg is an error
}

func newSession(ascii bool) *session {
	return &session{sh: newSheet(ascii), ascii: ascii}
}

// newSheet returns a fresh worksheet. In ASCII mode its format says so,
// so that text the worksheet draws itself (a sweep's plot) is ASCII too.
func newSheet(ascii bool) *sheet.Sheet {
	sh := sheet.New()
	sh.Context().Format.ASCII = ascii
	return sh
}

// replay runs statements on a fresh sheet by the rules of a worksheet run:
// every statement that runs is restored, and the summary lists the others
// (those that fail, and those that read a name a failed one defined).
func replay(stmts []string, ascii bool, dir string) (*sheet.Sheet, sheet.Summary) {
	sh := newSheet(ascii)
	sh.SetDir(dir)
	return sh, sh.Replay(stmts)
}

func short(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

// decode reads a session file and replays it. Statements that do not
// replay are returned in left, each with its reason, so that nothing
// entered is lost.
func decode(data []byte, ascii bool) (*sheet.Sheet, file, []leftOut, error) {
	var f file
	if err := json.Unmarshal(data, &f); err != nil {
		return nil, f, nil, fmt.Errorf("not a session file: %v", err)
	}
	if f.Version != sessionVersion {
		return nil, f, nil, fmt.Errorf("session file version %d, expected %d", f.Version, sessionVersion)
	}
	stmts := f.Statements
	if f.Language > 0 && f.Language != calc.Language {
		// the statements were accepted under another reading of input:
		// the replay says which of them read differently now
		stmts = append([]string{fmt.Sprintf("language %d", f.Language)}, stmts...)
	}
	sh, sum := replay(stmts, ascii, f.dir())
	off := len(stmts) - len(f.Statements)
	var left []leftOut
	for _, p := range sum.Problems {
		k := p.Err.Line - 1 - off
		if k < 0 || k >= len(f.Statements) {
			continue
		}
		left = append(left, leftOut{n: k + 1, stmt: f.Statements[k], why: p.Err.Msg, comma: sheet.CommaAt(f.Statements, k)})
	}
	return sh, f, left, nil
}

// dir is the directory the statements' relative file names are read
// from: Dir, or for a file saved before it the directory of Worksheet as
// seen from here.
func (f file) dir() string {
	if f.Dir != "" || f.Worksheet == "" {
		return f.Dir
	}
	return worksheetDir(f.Worksheet)
}

// worksheetDir is the absolute directory of the worksheet file w.
func worksheetDir(w string) string {
	if abs, err := filepath.Abs(w); err == nil {
		return filepath.Dir(abs)
	}
	return filepath.Dir(w)
}

// leftOut is a statement of a session that did not replay.
type leftOut struct {
	n     int // its place among the session's statements
	stmt  string
	why   string
	comma bool // the decimal marker in force at it
}

// keepLeft writes the statements that did not replay to a file beside the
// session, as a worksheet with each reason as a comment, and returns its
// name. Nothing a user entered is dropped without a copy.
func keepLeft(path string, left []leftOut, now time.Time) (string, error) {
	var b strings.Builder
	b.WriteString(sheet.LanguageLine() + "\n")
	b.WriteString("# statements of the session that could not be restored, with the reason for each\n")
	written := ""
	for _, l := range left {
		// each statement under the decimal marker it was typed in
		if d := sheet.DecimalLine(l.comma); d != written {
			b.WriteString(d + "\n")
			written = d
		}
		fmt.Fprintf(&b, "# statement %d: %s\n%s\n", l.n, strings.ReplaceAll(l.why, "\n", " "), l.stmt)
	}
	name := strings.TrimSuffix(path, filepath.Ext(path)) + ".not-restored-" + now.UTC().Format("20060102-150405") + ".argand"
	return name, store.Save(name, []byte(b.String()))
}

// encode writes the session file's content.
func (s *session) encode() []byte {
	f := file{Version: sessionVersion, Worksheet: s.worksheet, Dir: s.dir, Statements: s.sh.Statements(), View: s.v, Language: calc.Language}
	if f.Statements == nil {
		f.Statements = []string{}
	}
	b, _ := json.MarshalIndent(f, "", " ") // plain strings and slices always marshal
	return append(b, '\n')
}

// save writes the session to its file, if it has one.
func (s *session) save() {
	if s.path == "" || s.readOnly {
		return
	}
	s.saveErr = store.Save(s.path, s.encode())
}

// loadFile restores a session from path. A missing file is not an error
// (ok is false); a corrupt one is moved aside and reported in note. A file
// that exists but cannot be read is left alone: unreadable is set and note
// names the file and the reason, and the caller must not save over it.
func (s *session) loadFile(path string) (ok bool, note string, unreadable bool) {
	var sh *sheet.Sheet
	var f file
	var left []leftOut
	_, err := store.LoadChecked(path, func(b []byte) error {
		var err error
		sh, f, left, err = decode(b, s.ascii)
		return err
	})
	if err != nil {
		var ce *store.CorruptError
		if errors.As(err, &ce) {
			// the name it was kept under comes first, so that it is read
			// whole on a narrow screen; the reason may be long
			return false, fmt.Sprintf("session file unusable, kept as %s; a fresh session started (%v)", filepath.Base(ce.MovedTo), ce.Err), false
		}
		if errors.Is(err, os.ErrNotExist) {
			return false, "", false
		}
		return false, fmt.Sprintf("the session file %v", err), true
	}
	s.sh, s.v, s.worksheet, s.dir = sh, f.View, f.Worksheet, f.dir()
	s.tidy()
	if len(left) > 0 {
		nums := make([]string, len(left))
		for i, l := range left {
			nums[i] = fmt.Sprint(l.n)
		}
		why := fmt.Sprintf("(%s: %s)", strings.Join(nums, ", "), short(left[0].why, 50))
		name, err := keepLeft(path, left, time.Now())
		if err != nil {
			// keep the session file as it is, so nothing is lost
			s.readOnly, s.roWhy = true, "the statements that could not be restored could not be kept aside ("+err.Error()+")"
			return true, fmt.Sprintf("%d statement(s) not restored %s and not kept aside, so the session is read-only", len(left), why), false
		}
		// the name first and short, so it is read whole at 80 columns: it
		// lies beside the session file, in the state directory
		note = fmt.Sprintf("%d statement(s) not restored, kept in %s %s", len(left), filepath.Base(name), why)
	}
	if ch := sh.Changed(); len(ch) > 0 {
		note = strings.TrimPrefix(note+fmt.Sprintf("; %d statement(s) read differently since the session was saved (see their notes)", len(ch)), "; ")
	}
	return true, note, false
}

// loadWorksheet runs a worksheet text into a fresh sheet by the rules of
// argand run: every line that runs is kept, and the error names each line
// that did not (the first with its reason).
func (s *session) loadWorksheet(text string, comma bool) error {
	sh := newSheet(s.ascii)
	sh.SetDir(s.fileDir())
	// a worksheet that states its marker reads by it; one that does not is
	// read as the user said to read numbers
	sh.SetDecimalComma(comma)
	sum, err := sh.Run(strings.NewReader(text), nil)
	s.sh = sh
	s.v = view{}
	s.tidy()
	if err != nil {
		return err
	}
	if len(sum.Problems) == 0 {
		return nil
	}
	first := sum.Problems[0].Err
	if len(sum.Problems) == 1 {
		return fmt.Errorf("line %d: %s; the other lines were kept", first.Line, first.Msg)
	}
	var ls []string
	for _, p := range sum.Problems[1:] {
		ls = append(ls, fmt.Sprint(p.Err.Line))
	}
	return fmt.Errorf("line %d: %s; lines %s did not run either (argand run FILE lists why); the other lines were kept", first.Line, first.Msg, strings.Join(ls, ", "))
}

// checkpoint records the state before a change, for undo.
func (s *session) checkpoint() {
	s.pushUndo(snapshot{sh: s.sh.Clone(), v: s.v.clone()})
	s.redo = nil
}

// pushUndo keeps a state for undo, dropping the oldest beyond the
// session's bound (limits.Undo): each state is a whole worksheet, so a
// server bounds how many a session holds.
func (s *session) pushUndo(sn snapshot) {
	s.undo = append(s.undo, sn)
	if n := s.limits.Undo; n > 0 && len(s.undo) > n {
		k := len(s.undo) - n
		clear(s.undo[:k]) // let the dropped worksheets go
		s.undo = s.undo[k:]
		s.forgot = true
	}
}

// nothingToUndo says why undo has nothing left.
func (s *session) nothingToUndo() string {
	if s.forgot {
		return fmt.Sprintf("nothing more to undo: the last %d changes are kept here", s.limits.Undo)
	}
	return "nothing to undo"
}

// readOnlyError refuses a change in a read-only session.
type readOnlyError struct {
	pid int
	why string // the reason when no other argand holds the session
}

func (e *readOnlyError) Error() string {
	if e.why != "" {
		return "read-only: " + e.why + "; nothing is saved"
	}
	who := "another argand"
	if e.pid > 0 {
		who = fmt.Sprintf("another argand (pid %d)", e.pid)
	}
	return "read-only: this session is open in " + who + "; nothing is saved"
}

func (s *session) errReadOnly() error { return &readOnlyError{pid: s.holder, why: s.roWhy} }

// exec runs statements as one change, all of them or none, stopping
// when job is done; a stopped change leaves the session as it was.
func (s *session) exec(job sheet.Job, stmts ...string) ([]calc.Step, []string, error) {
	if s.readOnly {
		return nil, nil, s.errReadOnly()
	}
	work := s.sh.Clone()
	steps, defined, err := runStatements(job, work, stmts)
	if err != nil {
		return nil, nil, err
	}
	s.commit(work)
	return steps, defined, nil
}

// commit makes work, a copy of the worksheet changed by statements, the
// session's worksheet; the worksheet before it goes to the undo history.
func (s *session) commit(work *sheet.Sheet) {
	s.pushUndo(snapshot{sh: s.sh, v: s.v.clone()})
	s.redo = nil
	s.sh = work
	s.tidy()
	s.save()
}

// change applies a change of the view alone as one undoable step.
func (s *session) change(f func(v *view)) error {
	if s.readOnly {
		return s.errReadOnly()
	}
	s.checkpoint()
	f(&s.v)
	s.tidy()
	s.save()
	return nil
}

// touch saves a change that is not worth an undo step (marks, selection).
func (s *session) touch(f func(v *view)) {
	f(&s.v)
	s.tidy()
	s.save()
}

func (s *session) doUndo() bool { return s.travel(&s.undo, &s.redo) }

func (s *session) doRedo() bool { return s.travel(&s.redo, &s.undo) }

// travel restores the latest snapshot of from, keeping the present state
// in to: undo and redo are the same move in opposite directions.
func (s *session) travel(from, to *[]snapshot) bool {
	if len(*from) == 0 || s.readOnly {
		return false
	}
	*to = append(*to, snapshot{sh: s.sh, v: s.v})
	last := (*from)[len(*from)-1]
	*from = (*from)[:len(*from)-1]
	s.sh, s.v = last.sh.Clone(), last.v.clone()
	s.tidy()
	s.save()
	return true
}

// fileDir is the directory of the worksheet file the session opened:
// relative file names in its statements (readings FILE, spectrum NAME from
// FILE) are read from there, as argand run reads them. "" without a file.
func (s *session) fileDir() string {
	if s.dir != "" || s.worksheet == "" {
		return s.dir
	}
	return worksheetDir(s.worksheet)
}

// tidy brings the view in line with the sheet: new entries go to the top
// of the order, names that no longer exist leave the order and the marks,
// and the selection stays on a visible row.
func (s *session) tidy() {
	// the worksheet in use carries the session's limits however it came
	// (replayed, restored, undone); a saved session beyond them is kept
	// whole, and only what would grow it further is refused
	if s.limits != (sheet.Limits{}) {
		s.sh.SetLimits(s.limits)
	}
	s.sh.SetDir(s.fileDir())
	ents := s.sh.Entries()
	exists := make(map[string]bool, len(ents))
	for _, e := range ents {
		exists[e.Name] = true
	}
	hidden := map[string]bool{}
	var keepHidden []string
	for _, h := range s.v.Hidden {
		if exists[h] && !hidden[h] {
			hidden[h] = true
			keepHidden = append(keepHidden, h)
		}
	}
	s.v.Hidden = keepHidden
	inOrder := map[string]bool{}
	var order []string
	for _, n := range s.v.Order {
		if exists[n] && !inOrder[n] {
			inOrder[n] = true
			order = append(order, n)
		}
	}
	var fresh []string
	for i := len(ents) - 1; i >= 0; i-- {
		if !inOrder[ents[i].Name] {
			fresh = append(fresh, ents[i].Name)
		}
	}
	s.v.Order = append(fresh, order...)
	var marks []string
	for _, m := range s.v.Marks {
		if exists[m] && !hidden[m] && !slices.Contains(marks, m) {
			marks = append(marks, m)
		}
	}
	s.v.Marks = marks
	if s.v.Selected == "" || !exists[s.v.Selected] || hidden[s.v.Selected] {
		s.v.Selected = ""
		if rows := s.rows(); len(rows) > 0 {
			s.v.Selected = rows[0]
		}
	}
}

// rows returns the names shown in the table, top first.
func (s *session) rows() []string {
	if len(s.v.Hidden) == 0 {
		return s.v.Order
	}
	out := make([]string, 0, len(s.v.Order))
	for _, n := range s.v.Order {
		if !slices.Contains(s.v.Hidden, n) {
			out = append(out, n)
		}
	}
	return out
}

// unhide shows a name again, when a statement defines it anew.
func (s *session) unhide(name string) {
	s.v.Hidden = slices.DeleteFunc(s.v.Hidden, func(h string) bool { return h == name })
}

// markIndex returns the position of name in the marks, or −1.
func (s *session) markIndex(name string) int { return slices.Index(s.v.Marks, name) }

// bringUp puts the names a change defined at the top of the table, the
// last defined on top and selected, shows any that were put away, and
// saves. It returns the last name still defined, or "".
func (s *session) bringUp(defined []string) string {
	defined = slices.DeleteFunc(slices.Clone(defined), func(n string) bool {
		_, ok := s.sh.Lookup(n)
		return !ok
	})
	if len(defined) == 0 {
		return ""
	}
	for _, d := range defined {
		s.unhide(d)
	}
	rest := slices.DeleteFunc(slices.Clone(s.v.Order), func(x string) bool { return slices.Contains(defined, x) })
	top := slices.Clone(defined)
	slices.Reverse(top)
	s.v.Order = append(top, rest...)
	s.v.Selected = defined[len(defined)-1]
	s.tidy()
	s.save()
	return s.v.Selected
}
