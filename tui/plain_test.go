package tui

import (
	"bytes"
	"errors"
	"io"
	"math/cmplx"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"argand/calc"
	"argand/tui/cli"
	"argand/tui/store"
)

// plainRun runs the line mode on input with the state directory taken
// from XDG_STATE_HOME, as on the command line, and returns its output.
func plainRun(t *testing.T, input string) string {
	t.Helper()
	var out bytes.Buffer
	if code := Plain(Options{Getenv: func(string) string { return "" }}, strings.NewReader(input), &out); code != 0 {
		t.Fatalf("exit %d:\n%s", code, out.String())
	}
	return out.String()
}

// listed returns the names the list command printed.
func listed(out, after string) []string {
	_, rest, _ := strings.Cut(out, after)
	var names []string
	for _, l := range strings.Split(rest, "\n") {
		l = strings.TrimPrefix(l, "> ")
		if !strings.HasPrefix(l, "  ") {
			if len(names) > 0 {
				break
			}
			continue
		}
		names = append(names, strings.Fields(l)[0])
	}
	return names
}

func TestPlainKeepsTheSession(t *testing.T) {
	state := t.TempDir()
	t.Setenv("XDG_STATE_HOME", state)
	session := filepath.Join(state, "argand", "session.json")

	// first start: the built-in example, and where the session is kept
	out := plainRun(t, "list\nZq = 3+j4 Ω\nZr = Zq || 10 Ω\nquit\n")
	for _, want := range []string{"first start", "example", "saved after every change, in " + session, "Zload", "→ Zr = "} {
		if !strings.Contains(out, want) {
			t.Errorf("first run lacks %q:\n%s", want, out)
		}
	}
	if _, err := os.Stat(session); err != nil {
		t.Fatalf("no session file: %v", err)
	}

	// restart: restored, newest first; an undo is kept too
	out = plainRun(t, "list\nZs = 1 Ω\nundo\nlist\nquit\n")
	if !strings.Contains(out, "session restored") {
		t.Errorf("second run not restored:\n%s", out)
	}
	if got := listed(out, "session"); len(got) < 2 || got[0] != "Zr" || got[1] != "Zq" {
		t.Errorf("restored rows start %v, want Zr Zq", got)
	}
	_, afterUndo, _ := strings.Cut(out, "undone")
	if got := listed(afterUndo, "\n"); len(got) == 0 || got[0] != "Zr" {
		t.Errorf("after undo rows start %v, want Zr", got)
	}

	// a third start finds the undo, and save FILE writes a worksheet
	// that argand run replays to the same values
	ws := filepath.Join(t.TempDir(), "job.argand")
	out = plainRun(t, "list\nsave "+ws+"\n")
	if got := listed(out, "session"); len(got) == 0 || got[0] != "Zr" || strings.Contains(out, "Zs") {
		t.Errorf("third run rows start %v, want Zr and no Zs", got)
	}
	if !strings.Contains(out, "saved "+ws) {
		t.Errorf("save not reported:\n%s", out)
	}
	f, err := os.Open(ws)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var run, errb bytes.Buffer
	if code := cli.Run(f, ws, &run, &errb, cli.Options{}); code != cli.ExitOK {
		t.Fatalf("argand run on the saved worksheet: exit %d\n%s", code, errb.String())
	}
	if !strings.Contains(run.String(), "→ Zr = 2.973 + j2.162 Ω = 3.676 Ω ∠36.03°") || strings.Contains(run.String(), "Zs") {
		t.Errorf("saved worksheet replays to:\n%s", run.String())
	}
}

func TestPlainErrorsAndLock(t *testing.T) {
	state := t.TempDir()
	t.Setenv("XDG_STATE_HOME", state)
	out := plainRun(t, "Zb = 3 Ω + 5 V\n")
	if !strings.Contains(out, "error: ") || !strings.Contains(out, "^") {
		t.Errorf("no located error:\n%s", out)
	}

	// a second instance while the app holds the session is asked
	held := New(Options{Getenv: func(string) string { return "" }})
	defer held.Close()
	out = plainRun(t, "r\nZz = 1 Ω\nundo\nquit\n")
	if !strings.Contains(out, "already open") || !strings.Contains(out, "read-only: this session is open in another argand (pid ") {
		t.Errorf("read-only choice:\n%s", out)
	}
	if strings.Contains(out, "→ Zz") {
		t.Errorf("read-only session took a change:\n%s", out)
	}
	out = plainRun(t, "s\nZsep = 2 Ω\nquit\n")
	if !strings.Contains(out, "→ Zsep") || !strings.Contains(out, "session-2.json") {
		t.Errorf("separate session:\n%s", out)
	}
	out = plainRun(t, "q\n")
	if strings.Contains(out, "line mode:") {
		t.Errorf("q did not quit:\n%s", out)
	}
	_ = io.Discard
}

// lockProbe is line-mode input that, on the first read, tries to lock the
// session the line mode should be holding.
type lockProbe struct {
	path string
	err  error
	in   io.Reader
	done bool
}

func (p *lockProbe) Read(b []byte) (int, error) {
	if !p.done {
		p.done = true
		lk, err := store.Lock(p.path)
		if err == nil {
			lk.Unlock()
		}
		p.err = err
	}
	return p.in.Read(b)
}

// TestPlainFirstStartLocked: the line mode locks the session on the very
// first start, with a state directory that does not exist yet.
func TestPlainFirstStartLocked(t *testing.T) {
	state := filepath.Join(t.TempDir(), "fresh")
	t.Setenv("XDG_STATE_HOME", state)
	probe := &lockProbe{path: filepath.Join(state, "argand", "session.json"), in: strings.NewReader("Zp = 1 Ω\nquit\n")}
	var out bytes.Buffer
	if code := Plain(Options{Getenv: func(string) string { return "" }}, probe, &out); code != 0 {
		t.Fatalf("exit %d:\n%s", code, out.String())
	}
	if !errors.Is(probe.err, store.ErrLocked) {
		t.Errorf("while the line mode ran, Lock gave %v, want ErrLocked\n%s", probe.err, out.String())
	}
}

// The line mode wraps a step's long lines between words at COLUMNS (80
// when unset), so that no word or value is broken by the terminal.
func TestPlainWrapsBetweenWords(t *testing.T) {
	t.Setenv("XDG_STATE_HOME", t.TempDir())
	var out bytes.Buffer
	env := func(k string) string {
		if k == "COLUMNS" {
			return "60"
		}
		return ""
	}
	in := "Qw = pfc(10 kW, 0.7, 0.95, 400 V, three)\nquit\n"
	if code := Plain(Options{Getenv: env}, strings.NewReader(in), &out); code != 0 {
		t.Fatalf("exit %d:\n%s", code, out.String())
	}
	_, steps, _ := strings.Cut(out.String(), "Qw = pfc")
	long := 0
	words := map[string]bool{}
	for _, w := range strings.Fields(strings.ReplaceAll(calc.CautionCapacitor.Text(), "\n", " ")) {
		words[w] = true
	}
	for _, l := range strings.Split(steps, "\n") {
		if n := len([]rune(l)); n > 60 {
			t.Errorf("line of %d characters past 60 columns: %q", n, l)
		}
		if len([]rune(l)) > 40 {
			long++
		}
		// the last word of each line is whole: it is a word of the text
		// or the line ends where the text has a space
		f := strings.Fields(l)
		if len(f) > 0 && strings.Contains(l, "Capacitor banks") && !words[f[len(f)-1]] {
			t.Errorf("a word broken at the line's end: %q", l)
		}
	}
	if long < 5 {
		t.Errorf("too little output to judge:\n%s", steps)
	}
}

// The app and the line mode drive the one controller: the same statements
// typed in the app and in the line mode leave the same rows, in the same
// order, with the same values. Example data; the parallel impedance is
// Z₁·Z₂/(Z₁+Z₂) (common practice): (6+j8)·10/(16+j8) = 5+j2.5 Ω.
func TestSameSession(t *testing.T) {
	stmts := []string{"Za = 3+j4 Ω", "Zb = 10 Ω", "Zp = Za || Zb", "Za = 6+j8 Ω", "rename Zp to Zq", "Zc = Zq * 2"}
	app := newModel(t, Options{})
	for _, s := range stmts {
		typeLine(t, app, s)
	}

	dir := t.TempDir()
	opt := Options{Dir: dir, File: benchSheet, Getenv: func(string) string { return "" }}
	var out bytes.Buffer
	if code := Plain(opt, strings.NewReader(strings.Join(stmts, "\n")+"\n"), &out); code != 0 {
		t.Fatalf("line mode: exit %d\n%s", code, out.String())
	}
	line := openSession(opt, lineWays())
	defer line.close()
	if line.msgErr {
		t.Fatalf("reopening the line mode's session: %s", line.msg)
	}

	f := calc.Format{Digits: calc.MaxDigits}
	if a, l := strings.Join(app.s.rows(), " "), strings.Join(line.rows(), " "); a != l {
		t.Fatalf("rows differ:\napp  %s\nline %s", a, l)
	}
	for _, n := range app.s.rows() {
		qa, _ := app.s.sh.Lookup(n)
		ql, _ := line.sh.Lookup(n)
		if f.Both(qa, false) != f.Both(ql, false) {
			t.Errorf("%s: app %s, line mode %s", n, f.Both(qa, false), f.Both(ql, false))
		}
	}
	if got := app.s.rows()[:2]; got[0] != "Zc" || got[1] != "Zq" {
		t.Errorf("the names defined are not on top: %v", got)
	}
	q, _ := line.sh.Lookup("Zq")
	if want := complex(5, 2.5); cmplx.Abs(q.V-want) > 1e-9*cmplx.Abs(want) {
		t.Errorf("Zq = %v, want %v", q.V, want)
	}
}
